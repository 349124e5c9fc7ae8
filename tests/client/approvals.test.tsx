import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import type { UserDto } from "@shared/schemas/auth";
import type { ApprovalQueueItem } from "@shared/schemas/quote";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { createAppRoutes } from "@/app/router";
import { json, stubApi } from "./fetch-stub";
import { option, quote, revision } from "./quote-fixtures";

const owner: UserDto = { id: 1, email: "owner@example.com", name: "Dana Example", role: "owner", companyId: 1 };

const entry = (extra: Partial<ApprovalQueueItem> & Pick<ApprovalQueueItem, "quoteId" | "number" | "submittedAt">): ApprovalQueueItem => ({
  jobId: 9,
  customerName: "Avery Sample",
  siteAddress: "12 Example Lane",
  revisionNo: 1,
  submittedBy: { id: 2, name: "Sam Example" },
  estimator: { id: 2, name: "Sam Example" },
  options: [{ label: "As designed", totalCents: 2_275_244, marginPct: 31.2 }],
  lowestMarginPct: 31.2,
  minMarginPct: 20,
  belowMinMargin: false,
  overridesCount: 0,
  notes: null,
  ...extra,
});

function renderAt(path: string) {
  const qc = makeAppQueryClient();
  const router = createMemoryRouter(createAppRoutes(qc), { initialEntries: [path] });
  render(
    <QueryClientProvider client={qc}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return router;
}

/** A submitted quote whose second option is below the minimum margin and has an override. */
const inReview = (needsApprovalReason: boolean) =>
  quote(
    revision({
      status: "in_review",
      version: 5,
      notes: "Homeowner wants the mesh option; supplier price is firm until May.",
      submittedAt: "2025-03-02T09:00:00.000Z",
      submittedBy: { id: 2, name: "Sam Example" },
      needsApprovalReason,
      overrides: needsApprovalReason ? [{ optionId: 72, key: "spacer-mesh", unitCostCents: 24_000, reason: "Quoted price from supplier" }] : [],
      options: needsApprovalReason
        ? revision().options.map((o) =>
            o.id === 72
              ? { ...o, hasOverrides: true, lines: o.lines.map((l) => ({ ...l, unitCostCents: 24_000, overrideReason: "Quoted price from supplier" })) }
              : o,
          )
        : [option({ id: 71, label: "As designed", totals: { costCents: 100_000, priceCents: 150_000, taxCents: 0, totalCents: 150_000, marginPct: 33.3, depositCents: 45_000 } })],
    }),
  );

beforeEach(() => resetCsrfToken());

describe("approvals queue", () => {
  it("lists the quotes in review oldest submitted first, with totals, lowest margin and overrides", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/approvals": () =>
        json(200, {
          data: [
            entry({ quoteId: 3, number: "QSS-1010", submittedAt: "2025-03-05T09:00:00.000Z", customerName: "Newest Sample" }),
            entry({
              quoteId: 1,
              number: "QSS-1002",
              submittedAt: "2025-03-01T09:00:00.000Z",
              customerName: "Oldest Sample",
              lowestMarginPct: 14.5,
              belowMinMargin: true,
              overridesCount: 2,
            }),
            entry({ quoteId: 2, number: "QSS-1006", submittedAt: "2025-03-03T09:00:00.000Z", customerName: "Middle Sample" }),
          ],
        }),
    });
    renderAt("/approvals");

    const table = await screen.findByRole("table", { name: "Quotes waiting for approval" }, { timeout: 5000 });
    const rows = within(table).getAllByRole("row").slice(1);
    expect(rows.map((r) => within(r).getByRole("link").textContent)).toEqual(["QSS-1002", "QSS-1006", "QSS-1010"]);
    expect(rows[0]).toHaveTextContent("Oldest Sample");
    expect(rows[0]).toHaveTextContent("14.5%below 20% min");
    expect(within(rows[0]!).getAllByRole("cell").at(-1)).toHaveTextContent("2");
    expect(rows[1]).toHaveTextContent("$22,752");
    expect(within(rows[0]!).getByRole("link")).toHaveAttribute("href", "/approvals/1");
  });

  it("shows an empty queue plainly", async () => {
    stubApi({ "GET /api/auth/me": () => json(200, { user: owner }), "GET /api/approvals": () => json(200, { data: [] }) });
    renderAt("/approvals");
    expect(await screen.findByText("Nothing waiting for review")).toBeInTheDocument();
  });
});

describe("approval review", () => {
  it("requires a reason to approve when the quote needs one, says why, and sends it", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/approvals": () => json(200, { data: [entry({ quoteId: 41, number: "QSS-1007", submittedAt: "2025-03-02T09:00:00.000Z" })] }),
      "GET /api/quotes/41": () => json(200, { data: inReview(true) }),
      "POST /api/quotes/41/approve": () => json(200, { data: quote(revision({ status: "approved" })) }),
    });
    const router = renderAt("/approvals/41");

    expect(await screen.findByRole("heading", { name: /Review QSS-1007/ })).toBeInTheDocument();
    // why a reason is needed
    expect(screen.getByText("A reason is required because:")).toBeInTheDocument();
    expect(screen.getByText("“Mesh and foil” has a 17.5% margin, below the 20% minimum.")).toBeInTheDocument();
    expect(screen.getByText("“Mesh and foil” has a line priced by a manual override.")).toBeInTheDocument();
    // the review shows the override's reason and the estimator's notes
    expect(screen.getByText("Reason: Quoted price from supplier")).toBeInTheDocument();
    expect(screen.getByText(/Homeowner wants the mesh option/)).toBeInTheDocument();

    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "Approve QSS-1007" }));
    expect(await screen.findByText("Write why you approve it anyway (at least 3 characters)")).toBeInTheDocument();
    expect(api.callsTo("POST /api/quotes/41/approve")).toHaveLength(0);

    await user.type(screen.getByLabelText("Reason for approving (required)"), "Repeat customer; mesh price is firm");
    await user.click(screen.getByRole("button", { name: "Approve QSS-1007" }));
    await waitFor(() => expect(api.callsTo("POST /api/quotes/41/approve")).toHaveLength(1));
    expect(api.callsTo("POST /api/quotes/41/approve")[0]!.body).toEqual({ reason: "Repeat customer; mesh price is firm" });
    await waitFor(() => expect(router.state.location.pathname).toBe("/approvals"));
  });

  it("approves without a reason when none is needed", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/approvals": () => json(200, { data: [] }),
      "GET /api/quotes/41": () => json(200, { data: inReview(false) }),
      "POST /api/quotes/41/approve": () => json(200, { data: quote(revision({ status: "approved" })) }),
    });
    renderAt("/approvals/41");
    const user = userEvent.setup();
    expect(await screen.findByLabelText("Reason (optional)")).toBeInTheDocument();
    expect(screen.queryByText("A reason is required because:")).not.toBeInTheDocument();
    await user.click(screen.getByRole("button", { name: "Approve QSS-1007" }));
    await waitFor(() => expect(api.callsTo("POST /api/quotes/41/approve")).toHaveLength(1));
    expect(api.callsTo("POST /api/quotes/41/approve")[0]!.body).toEqual({});
  });

  it("puts the server's reason error on the field when it still asks for one", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/approvals": () => json(200, { data: [] }),
      "GET /api/quotes/41": () => json(200, { data: inReview(false) }),
      "POST /api/quotes/41/approve": () =>
        json(400, { error: { code: "bad_request", message: "Please check", fields: { reason: "A reason is required: option below the minimum margin" } } }),
    });
    renderAt("/approvals/41");
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Approve QSS-1007" }));
    expect(await screen.findByText("A reason is required: option below the minimum margin")).toBeInTheDocument();
  });

  it("requires a comment to return the quote, then sends it", async () => {
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "t" }),
      "GET /api/approvals": () => json(200, { data: [] }),
      "GET /api/quotes/41": () => json(200, { data: inReview(true) }),
      "POST /api/quotes/41/return": () => json(200, { data: quote(revision({ status: "draft", returnComment: "x" })) }),
    });
    renderAt("/approvals/41");
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Return with comment" }));
    expect(await screen.findByText("Tell the estimator what to change (at least 3 characters)")).toBeInTheDocument();
    expect(api.callsTo("POST /api/quotes/41/return")).toHaveLength(0);

    await user.type(screen.getByLabelText("What should change? (required)"), "Price the mesh from the new supplier");
    await user.click(screen.getByRole("button", { name: "Return with comment" }));
    await waitFor(() => expect(api.callsTo("POST /api/quotes/41/return")).toHaveLength(1));
    expect(api.callsTo("POST /api/quotes/41/return")[0]!.body).toEqual({ comment: "Price the mesh from the new supplier" });
  });
});
