import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import type { UserDto } from "@shared/schemas/auth";
import type { QuoteSummary } from "@shared/schemas/quote";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { PricingSection } from "@/features/quotes/components/pricing-section";
import { json, stubApi } from "./fetch-stub";
import { quote, revision } from "./quote-fixtures";

const estimator: UserDto = { id: 2, email: "estimator@example.com", name: "Sam Example", role: "estimator", companyId: 1 };

const summary: QuoteSummary = {
  id: 41,
  number: "QSS-1007",
  status: "draft",
  revisionNo: 1,
  options: [
    { id: 71, label: "As designed", totalCents: 2_275_244 },
    { id: 72, label: "Mesh and foil", totalCents: 2_470_000 },
  ],
  totalCents: 2_275_244,
  marginPct: 31.2,
  updatedAt: "2025-03-01T14:00:00.000Z",
  archived: false,
};

function renderSection() {
  const qc = makeAppQueryClient();
  const router = createMemoryRouter([{ path: "/jobs/:jobId/pricing", element: <PricingSection jobId={9} /> }], {
    initialEntries: ["/jobs/9/pricing"],
  });
  render(
    <QueryClientProvider client={qc}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
}

const baseRoutes = {
  "GET /api/auth/me": () => json(200, { user: estimator }),
  "GET /api/auth/csrf": () => json(200, { token: "t" }),
  "GET /api/jobs/9/quotes": () => json(200, { data: [summary] }),
};

beforeEach(() => resetCsrfToken());

describe("Pricing section", () => {
  it("shows the options side by side with cost, price, margin against the minimum, tax, total and deposit", async () => {
    stubApi({ ...baseRoutes, "GET /api/quotes/41": () => json(200, { data: quote() }) });
    renderSection();

    const table = await screen.findByRole("table", { name: "Options compared" }, { timeout: 5000 });
    const rowOf = (name: string) =>
      within(within(table).getByRole("rowheader", { name }).closest("tr")!)
        .getAllByRole("cell")
        .map((c) => c.textContent);
    expect(within(table).getAllByRole("columnheader").map((h) => h.textContent)).toEqual([
      "Figure",
      "Option AAs designedAs designed",
      "Option BMesh and foil3D mesh mat, with foil",
    ]);
    expect(rowOf("Cost")).toEqual(["$15,234.00", "$19,800.00"]);
    expect(rowOf("Price before tax")).toEqual(["$22,142.44", "$24,000.00"]);
    expect(rowOf("Tax")).toEqual(["$610.00", "$700.00"]);
    expect(rowOf("Total")).toEqual(["$22,752.44", "$24,700.00"]);
    expect(rowOf("Deposit")).toEqual(["$6,826.00", "$7,410.00"]);
    // the margin says in words whether it meets the company minimum (colour is not the only signal)
    expect(rowOf("Margin")).toEqual(["●31.2%≥ 20% min", "▼17.5%below 20% min"]);
    // line items of each option
    expect(screen.getByRole("table", { name: "Lines of option A" })).toHaveTextContent("Standing-seam panel, 24 ga");
    expect(screen.getByRole("button", { name: /QSS-1007/ })).toHaveAttribute("aria-current", "true");
  });

  it("refuses an override without a reason, then saves it with the version once a reason is given", async () => {
    const api = stubApi({
      ...baseRoutes,
      "GET /api/quotes/41": () => json(200, { data: quote() }),
      "PATCH /api/quotes/41": () =>
        json(200, {
          data: quote(
            revision({
              version: 5,
              overrides: [{ optionId: null, key: "panel-standing-seam", unitCostCents: 510, reason: "Supplier promo price" }],
            }),
          ),
        }),
    });
    renderSection();
    const user = userEvent.setup();

    await user.click(await screen.findByRole("button", { name: "Add override" }));
    await user.selectOptions(screen.getByLabelText("Line"), "panel-standing-seam");
    await user.type(screen.getByLabelText("Unit cost ($)"), "5.10");
    await user.click(screen.getByRole("button", { name: "Save draft" }));

    expect(await screen.findByText("Say why (at least 3 characters)")).toBeInTheDocument();
    expect(screen.getByLabelText("Reason (required)")).toHaveAttribute("aria-invalid", "true");
    expect(api.callsTo("PATCH /api/quotes/41")).toHaveLength(0);

    await user.type(screen.getByLabelText("Reason (required)"), "Supplier promo price");
    await user.click(screen.getByRole("button", { name: "Save draft" }));
    await waitFor(() => expect(api.callsTo("PATCH /api/quotes/41")).toHaveLength(1));
    const body = api.callsTo("PATCH /api/quotes/41")[0]!.body as Record<string, unknown>;
    expect(body.version).toBe(4);
    expect(body.overrides).toEqual([{ optionId: null, key: "panel-standing-seam", unitCostCents: 510, reason: "Supplier promo price" }]);
    expect(body.options).toEqual([
      { id: 71, label: "As designed", spec: {} },
      { id: 72, label: "Mesh and foil", spec: { spacer: "mesh", foil: true } },
    ]);
    expect(body.discount).toBeNull();
  });

  it("a stale version keeps what was typed and offers to load the latest version", async () => {
    const api = stubApi({
      ...baseRoutes,
      "GET /api/quotes/41": [() => json(200, { data: quote() }), () => json(200, { data: quote(revision({ version: 6 })) })],
      "PATCH /api/quotes/41": [
        () => json(409, { error: { code: "stale_version", message: "Reload" }, currentVersion: 6 }),
        () => json(200, { data: quote(revision({ version: 7, notes: "Check the chimney cricket" })) }),
      ],
    });
    renderSection();
    const user = userEvent.setup();
    const notes = await screen.findByLabelText("Notes to the owner");
    await user.type(notes, "Check the chimney cricket");
    await user.click(screen.getByRole("button", { name: "Save draft" }));

    await waitFor(() => expect(api.callsTo("PATCH /api/quotes/41")).toHaveLength(1));
    expect(await screen.findByText("Changed by someone else: not saved")).toBeInTheDocument();
    expect(screen.getByLabelText("Notes to the owner")).toHaveValue("Check the chimney cricket");

    await user.click(screen.getByRole("button", { name: "Load the latest version" }));
    await waitFor(() => expect(api.callsTo("GET /api/quotes/41")).toHaveLength(2));
    expect(screen.getByLabelText("Notes to the owner")).toHaveValue("Check the chimney cricket");
    await user.click(screen.getByRole("button", { name: "Save draft" }));
    await waitFor(() => expect(api.callsTo("PATCH /api/quotes/41")).toHaveLength(2));
    expect(api.callsTo("PATCH /api/quotes/41")[1]!.body).toMatchObject({ version: 6, notes: "Check the chimney cricket" });
  });

  it("submits the draft for approval with its version and then shows it waiting for review", async () => {
    const api = stubApi({
      ...baseRoutes,
      "GET /api/quotes/41": () => json(200, { data: quote() }),
      "POST /api/quotes/41/submit": () =>
        json(200, {
          data: quote(revision({ status: "in_review", version: 5, submittedAt: "2025-03-02T09:00:00.000Z", submittedBy: { id: 2, name: "Sam Example" } })),
        }),
    });
    renderSection();
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Submit for approval" }));

    await waitFor(() => expect(api.callsTo("POST /api/quotes/41/submit")).toHaveLength(1));
    expect(api.callsTo("POST /api/quotes/41/submit")[0]!.body).toEqual({ version: 4 });
    expect(await screen.findByText("Waiting for the owner's review")).toBeInTheDocument();
    expect(screen.queryByRole("form", { name: "Edit draft" })).not.toBeInTheDocument();
  });

  it("shows the owner's comment on a returned draft", async () => {
    stubApi({
      ...baseRoutes,
      "GET /api/quotes/41": () =>
        json(200, {
          data: quote(
            revision({
              returnComment: "Price the ridge vent from the new supplier",
              returnedAt: "2025-03-02T10:00:00.000Z",
              returnedBy: { id: 1, name: "Dana Example" },
            }),
          ),
        }),
    });
    renderSection();
    expect(await screen.findByText("“Price the ridge vent from the new supplier”")).toBeInTheDocument();
    expect(screen.getByText(/Returned by Dana Example/)).toBeInTheDocument();
  });
});
