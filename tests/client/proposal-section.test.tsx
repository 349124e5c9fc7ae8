import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import type { ProposalDto } from "@shared/schemas/proposal-api";
import type { QuoteStatus, QuoteSummary } from "@shared/schemas/quote";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { Toaster } from "@/components/ui/toast";
import { ProposalSection } from "@/features/proposals/components/proposal-section";
import { json, stubApi } from "./fetch-stub";
import { estimator, jobDetail } from "./jobs-fixtures";

const quote = (status: QuoteStatus, extra: Partial<QuoteSummary> = {}): QuoteSummary => ({
  id: 41,
  number: "QSS-1042",
  status,
  revisionNo: 2,
  options: [
    { id: 101, label: "As designed", totalCents: 4_186_450 },
    { id: 102, label: "Mesh mat with foil", totalCents: 3_912_075 },
  ],
  totalCents: 4_186_450,
  marginPct: 30,
  updatedAt: "2026-03-05T12:00:00.000Z",
  archived: false,
  ...extra,
});

const proposal = (extra: Partial<ProposalDto> = {}): ProposalDto => ({
  id: 7,
  quoteId: 41,
  revisionNo: 2,
  status: "accepted",
  sentTo: "customer9@example.com",
  sentAt: "2026-03-05T12:00:00.000Z",
  expiresAt: "2026-04-05T06:59:59.000Z",
  viewedAt: "2026-03-06T09:30:00.000Z",
  acceptedAt: "2026-03-07T18:22:00.000Z",
  acceptedOptionId: 102,
  acceptedOptionLabel: "Mesh mat with foil",
  signerName: "Marisol Vantongeren",
  declinedAt: null,
  declineReason: null,
  deposit: { status: "paid", amountCents: 1_173_600, paidAt: "2026-03-07T18:30:00.000Z" },
  ...extra,
});

function renderSection() {
  const qc = makeAppQueryClient();
  const router = createMemoryRouter([{ path: "/jobs/:jobId/proposal", element: <ProposalSection jobId={9} /> }], {
    initialEntries: ["/jobs/9/proposal"],
  });
  render(
    <QueryClientProvider client={qc}>
      <RouterProvider router={router} />
      <Toaster />
    </QueryClientProvider>,
  );
}

const routes = (q: QuoteSummary, proposals: ProposalDto[] = []) => ({
  "GET /api/auth/me": () => json(200, { user: estimator }),
  "GET /api/auth/csrf": () => json(200, { token: "csrf-1" }),
  "GET /api/jobs/9": () => json(200, { data: jobDetail(9) }),
  "GET /api/jobs/9/quotes": () => json(200, { data: [q] }),
  "GET /api/jobs/9/proposals": () => json(200, { data: proposals }),
});

beforeEach(() => resetCsrfToken());

describe("Proposal section", () => {
  it.each(["draft", "in_review", "accepted", "declined"] as const)("does not offer sending a %s quote, and says why", async (status) => {
    stubApi(routes(quote(status)));
    renderSection();
    const send = await screen.findByRole("button", { name: /Send to homeowner/ });
    expect(send).toBeDisabled();
    expect(screen.getByText(/Pricing tab|approve|accepted this quote/)).toBeInTheDocument();
    expect(screen.getByRole("link", { name: /Preview PDF/ })).toHaveAttribute("href", "/api/quotes/41/pdf");
    expect(screen.getByRole("link", { name: /Preview PDF/ })).toHaveAttribute("target", "_blank");
  });

  it("sends an approved quote to the customer's e-mail with a copy to me and a note", async () => {
    const sent = proposal({ status: "active", viewedAt: null, acceptedAt: null, acceptedOptionId: null, acceptedOptionLabel: null, signerName: null, deposit: null });
    const api = stubApi({
      ...routes(quote("approved")),
      "POST /api/quotes/41/send": () => json(201, { data: sent }),
    });
    const user = userEvent.setup();
    renderSection();
    await user.click(await screen.findByRole("button", { name: "Send to homeowner…" }));
    const dialog = screen.getByRole("dialog", { name: "Send QSS-1042 to the homeowner" });
    expect(within(dialog).getByLabelText("To")).toHaveValue("customer9@example.com");
    expect(within(dialog).queryByText("The earlier link stops working")).not.toBeInTheDocument();
    await user.click(within(dialog).getByRole("checkbox", { name: "Send a copy to me" }));
    await user.type(within(dialog).getByLabelText("Message (optional)"), "Here is the proposal we talked about.");
    await user.click(within(dialog).getByRole("button", { name: "Send proposal" }));

    await waitFor(() => expect(api.callsTo("POST /api/quotes/41/send")).toHaveLength(1));
    const call = api.callsTo("POST /api/quotes/41/send")[0]!;
    expect(call.body).toEqual({ to: "customer9@example.com", copyToMe: true, message: "Here is the proposal we talked about." });
    expect(call.headers["x-csrf-token"]).toBe("csrf-1");
    expect(await screen.findByText("Proposal QSS-1042 sent to customer9@example.com.")).toBeInTheDocument();
    await waitFor(() => expect(screen.queryByRole("dialog")).not.toBeInTheDocument());
    expect(api.callsTo("GET /api/jobs/9/proposals").length).toBeGreaterThanOrEqual(2); // the list refreshed
  });

  it("warns before a resend that the old link stops working, and shows a 409 in the dialog", async () => {
    const api = stubApi({
      ...routes(quote("sent"), [proposal({ status: "active", acceptedAt: null, signerName: null, acceptedOptionLabel: null, deposit: null })]),
      "POST /api/quotes/41/send": () =>
        json(409, { error: { code: "invalid_transition", message: "A quote that is accepted cannot be sent; only an approved quote can" } }),
    });
    const user = userEvent.setup();
    renderSection();
    await user.click(await screen.findByRole("button", { name: "Send again…" }));
    const dialog = screen.getByRole("dialog", { name: "Send QSS-1042 again" });
    expect(within(dialog).getByText("The earlier link stops working")).toBeInTheDocument();
    await user.click(within(dialog).getByRole("button", { name: "Send new link" }));
    expect(await within(dialog).findByRole("alert")).toHaveTextContent("A quote that is accepted cannot be sent");
    expect(api.callsTo("POST /api/quotes/41/send")[0]!.body).toEqual({ to: "customer9@example.com", copyToMe: false });
  });

  it("refuses an empty address before calling the server", async () => {
    const api = stubApi({ ...routes(quote("approved")), "GET /api/jobs/9": () => json(200, { data: jobDetail(9, { customer: { ...jobDetail(9).customer, email: null } }) }) });
    const user = userEvent.setup();
    renderSection();
    await user.click(await screen.findByRole("button", { name: "Send to homeowner…" }));
    const dialog = screen.getByRole("dialog");
    await user.click(within(dialog).getByRole("button", { name: "Send proposal" }));
    expect(await within(dialog).findByText("Enter the homeowner's e-mail")).toBeInTheDocument();
    expect(api.callsTo("POST /api/quotes/41/send")).toHaveLength(0);
  });

  it("lists the sent proposals with their sent, viewed, accepted and deposit steps, and a decline with its reason", async () => {
    stubApi(
      routes(quote("accepted"), [
        proposal(),
        proposal({
          id: 6,
          revisionNo: 1,
          status: "declined",
          acceptedAt: null,
          acceptedOptionLabel: null,
          signerName: null,
          declinedAt: "2026-02-20T10:00:00.000Z",
          declineReason: "Too expensive this year",
          deposit: null,
        }),
      ]),
    );
    renderSection();
    const list = await screen.findByRole("region", { name: "Sent proposals" });
    const items = await within(list).findAllByRole("listitem", { name: /^Proposal, revision/ });
    expect(items).toHaveLength(2);
    const [accepted, declined] = items as [HTMLElement, HTMLElement];
    expect(accepted).toHaveTextContent("Revision 2");
    expect(accepted).toHaveTextContent("Accepted");
    expect(within(accepted).getByRole("list", { name: "Progress" })).toHaveTextContent(/Sent.*Viewed.*Accepted.*Deposit: Paid.*\$11,736\.00/);
    expect(accepted).toHaveTextContent("Signed by Marisol Vantongeren for Mesh mat with foil.");
    expect(declined).toHaveTextContent("Declined");
    expect(declined).toHaveTextContent("Too expensive this year");
    expect(within(declined).getByRole("list", { name: "Progress" })).not.toHaveTextContent("Deposit");
  });
});
