import { beforeEach, describe, expect, it, vi } from "vitest";
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import { formatMoney } from "@shared/schemas/proposal";
import type { PublicProposalDto } from "@shared/schemas/proposal-api";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { ProposalPublicRoute } from "@/app/routes/proposal-public";
import { leaveForPayment } from "@/features/proposal-public/components/deposit-panel";
import { json, stubApi } from "./fetch-stub";
import { proposalDoc } from "./proposal-fixtures";

const TOKEN = "tok_Xb3kQ9vT2mW7rY4pL8sN1cF6hJ0dG5aZ";
const BASE = `/api/proposals/${TOKEN}`;

const open = (extra: Partial<PublicProposalDto> = {}): PublicProposalDto => ({
  status: "active",
  expiresAt: "2026-04-05T06:59:59.000Z",
  doc: proposalDoc,
  options: proposalDoc.options.map((o) => ({
    id: Number(o.id),
    label: o.label,
    totalCents: o.totalCents,
    depositCents: o.depositCents,
    priceCents: o.priceCents,
    taxCents: o.taxCents,
  })),
  accepted: null,
  declined: null,
  deposit: null,
  ...extra,
});

const acceptedState = (deposit: PublicProposalDto["deposit"] = null): PublicProposalDto =>
  open({
    status: "accepted",
    accepted: { at: "2026-03-09T18:22:00.000Z", optionId: 102, optionLabel: "Mesh mat with foil", signerName: "Marisol Vantongeren" },
    deposit,
    doc: {
      ...proposalDoc,
      status: "accepted",
      acceptance: { signerName: "Marisol Vantongeren", acceptedAt: "2026-03-09T18:22:00.000Z", optionId: "102", optionLabel: "Mesh mat with foil" },
    },
  });

function renderPage(search = "") {
  const qc = makeAppQueryClient();
  const router = createMemoryRouter([{ path: "/p/:token", element: <ProposalPublicRoute /> }], {
    initialEntries: [`/p/${TOKEN}${search}`],
  });
  render(
    <QueryClientProvider client={qc}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
}

beforeEach(() => resetCsrfToken());

describe("The homeowner's proposal page", () => {
  it("shows the proposal like the PDF: company, homeowner, scope, plan, options with prices, terms, cautions and the acceptance form", async () => {
    const api = stubApi({ [`GET ${BASE}`]: () => json(200, { data: open() }) });
    renderPage();

    expect(await screen.findByRole("heading", { name: "Metal roof proposal" })).toBeInTheDocument();
    expect(screen.getAllByText("Quarry Slope Steelworks").length).toBeGreaterThan(0);
    expect(screen.getByText("Licence RC-204518")).toBeInTheDocument();
    expect(screen.getByText("Marisol Vantongeren")).toBeInTheDocument();
    expect(screen.getByText("QSS-1042")).toBeInTheDocument();
    expect(screen.getAllByText("April 4, 2026").length).toBeGreaterThan(0); // valid until

    // scope per area, from the deck up, in the document's own words
    const scope = screen.getByRole("region", { name: "Scope of work" });
    for (const area of proposalDoc.scope.areas) expect(within(scope).getByRole("heading", { name: new RegExp(area.title) })).toBeInTheDocument();
    expect(scope).toHaveTextContent("shiny side facing up, toward the air gap");

    // the plan drawing names every plane with its pitch
    const plan = screen.getByRole("img", { name: /Roof plan, north up/ });
    for (const p of proposalDoc.plan.planes) expect(plan).toHaveAccessibleName(expect.stringContaining(`plane ${p.number}, ${p.name}`));

    // options: labels, what differs, price, tax, total, deposit
    const options = screen.getByRole("region", { name: "Your options and prices" });
    for (const o of proposalDoc.options) {
      expect(options).toHaveTextContent(o.label);
      for (const d of o.differences) expect(options).toHaveTextContent(d);
      for (const cents of [o.priceCents, o.taxCents, o.totalCents, o.depositCents]) expect(options).toHaveTextContent(formatMoney(cents));
    }
    expect(screen.getByRole("region", { name: "Deposit and payment" })).toHaveTextContent("Deposit due on acceptance: 30% of the option you choose");
    for (const t of [...proposalDoc.exclusions, ...proposalDoc.warranty]) expect(screen.getByText(t)).toBeInTheDocument();

    // the safety box, set off on its own
    const cautions = screen.getByRole("complementary", { name: "Safety and codes" });
    for (const c of proposalDoc.cautions.items) expect(cautions).toHaveTextContent(c.title);
    expect(cautions).toHaveTextContent(proposalDoc.cautions.governs);

    // the acceptance form: one radio card per option, name, consent
    const form = screen.getByRole("form", { name: "Accept this proposal" });
    expect(within(form).getAllByRole("radio")).toHaveLength(3);
    expect(within(form).getByRole("radio", { name: /Mesh mat with foil/ })).toBeInTheDocument();
    expect(within(form).getByLabelText("2. Type your full name")).toBeInTheDocument();
    expect(within(form).getByRole("checkbox", { name: /I agree to this proposal/ })).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Download PDF" })).toHaveAttribute("href", `${BASE}/pdf`);

    // public: no session, no CSRF token
    expect(api.callsTo("GET /api/auth/csrf")).toHaveLength(0);
    expect(api.callsTo(`GET ${BASE}`)[0]!.credentials).toBe("omit");
  });

  it("accepts only with an option, the full name and the consent ticked, then offers the deposit", async () => {
    const api = stubApi({
      [`GET ${BASE}`]: [() => json(200, { data: open() }), () => json(200, { data: acceptedState() })],
      [`POST ${BASE}/accept`]: () => json(200, { data: acceptedState() }),
    });
    const user = userEvent.setup();
    renderPage();
    const form = await screen.findByRole("form", { name: "Accept this proposal" });

    await user.click(within(form).getByRole("button", { name: "Accept proposal" }));
    expect(within(form).getByText("Choose one of the options.")).toBeInTheDocument();
    expect(within(form).getByText("Type your full name.")).toBeInTheDocument();
    expect(within(form).getByText("Tick the box to agree before you accept.")).toBeInTheDocument();

    await user.click(within(form).getByRole("radio", { name: /Mesh mat with foil/ }));
    await user.type(within(form).getByLabelText("2. Type your full name"), "Marisol Vantongeren");
    await user.click(within(form).getByRole("button", { name: "Accept proposal" }));
    expect(within(form).getByText("Tick the box to agree before you accept.")).toBeInTheDocument();
    expect(api.callsTo(`POST ${BASE}/accept`)).toHaveLength(0);

    const consent = within(form).getByRole("checkbox", { name: /I agree to this proposal/ });
    expect(consent).toHaveAccessibleName(expect.stringContaining("Mesh mat with foil"));
    await user.click(consent);
    await user.click(within(form).getByRole("button", { name: "Accept proposal" }));

    await waitFor(() => expect(api.callsTo(`POST ${BASE}/accept`)).toHaveLength(1));
    const call = api.callsTo(`POST ${BASE}/accept`)[0]!;
    expect(call.body).toEqual({ optionId: 102, signerName: "Marisol Vantongeren", consent: true });
    expect(call.headers["x-csrf-token"]).toBeUndefined();

    expect(await screen.findByText("Proposal accepted — thank you")).toBeInTheDocument();
    expect(screen.getByText("Mesh mat with foil", { selector: "dd" })).toBeInTheDocument();
    expect(screen.getByRole("button", { name: "Pay the deposit" })).toBeInTheDocument();
    expect(screen.queryByRole("form", { name: "Accept this proposal" })).not.toBeInTheDocument();
  });

  it("shows the server's refusal when the proposal was already answered", async () => {
    stubApi({
      [`GET ${BASE}`]: () => json(200, { data: open() }),
      [`POST ${BASE}/accept`]: () => json(409, { error: { code: "already_decided", message: "This proposal was already declined" } }),
    });
    const user = userEvent.setup();
    renderPage();
    const form = await screen.findByRole("form", { name: "Accept this proposal" });
    await user.click(within(form).getByRole("radio", { name: /No spacer, no foil/ }));
    await user.type(within(form).getByLabelText("2. Type your full name"), "Marisol Vantongeren");
    await user.click(within(form).getByRole("checkbox", { name: /I agree/ }));
    await user.click(within(form).getByRole("button", { name: "Accept proposal" }));
    expect(await within(form).findByRole("alert")).toHaveTextContent("This proposal was already declined");
  });

  it("declines only with a reason", async () => {
    const declined = open({ status: "declined", declined: { at: "2026-03-08T10:00:00.000Z", reason: "We are selling the house." } });
    const api = stubApi({
      [`GET ${BASE}`]: [() => json(200, { data: open() }), () => json(200, { data: declined })],
      [`POST ${BASE}/decline`]: () => json(200, { data: declined }),
    });
    const user = userEvent.setup();
    renderPage();
    await user.click(await screen.findByRole("button", { name: /Decline this proposal/ }));
    const form = screen.getByRole("form", { name: "Decline this proposal" });
    await user.click(within(form).getByRole("button", { name: "Decline proposal" }));
    expect(within(form).getByText("Tell us briefly why, so your contractor knows.")).toBeInTheDocument();
    expect(api.callsTo(`POST ${BASE}/decline`)).toHaveLength(0);

    await user.type(within(form).getByLabelText("Why are you declining?"), "We are selling the house.");
    await user.click(within(form).getByRole("button", { name: "Decline proposal" }));
    await waitFor(() => expect(api.callsTo(`POST ${BASE}/decline`)).toHaveLength(1));
    expect(api.callsTo(`POST ${BASE}/decline`)[0]!.body).toEqual({ reason: "We are selling the house." });
    expect(await screen.findByText(/You declined this proposal on March 8, 2026/)).toBeInTheDocument();
    expect(screen.getByText("Your reason: “We are selling the house.”")).toBeInTheDocument();
  });

  it("shows one plain page for an unknown or expired link, with nothing from any proposal", async () => {
    stubApi({ [`GET ${BASE}`]: () => json(404, { error: { code: "not_found", message: "Proposal not found" } }) });
    renderPage();
    expect(await screen.findByRole("heading", { name: "This link is no longer valid." })).toBeInTheDocument();
    expect(screen.getByText(/Please contact your contractor/)).toBeInTheDocument();
    expect(screen.queryByText(/Quarry Slope/)).not.toBeInTheDocument();
    expect(screen.queryByRole("form")).not.toBeInTheDocument();
  });

  it("treats a malformed token as an invalid link without asking the server", async () => {
    const api = stubApi({});
    const qc = makeAppQueryClient();
    const router = createMemoryRouter([{ path: "/p/:token", element: <ProposalPublicRoute /> }], { initialEntries: ["/p/short"] });
    render(
      <QueryClientProvider client={qc}>
        <RouterProvider router={router} />
      </QueryClientProvider>,
    );
    expect(await screen.findByRole("heading", { name: "This link is no longer valid." })).toBeInTheDocument();
    expect(api.calls).toHaveLength(0);
  });

  it("sends the homeowner to the payment page returned by the deposit call", async () => {
    const go = vi.spyOn(leaveForPayment, "go").mockImplementation(() => {});
    stubApi({
      [`GET ${BASE}`]: () => json(200, { data: acceptedState() }),
      [`POST ${BASE}/deposit`]: () => json(200, { url: "http://127.0.0.1:4999/pay/cs_test_1" }),
    });
    const user = userEvent.setup();
    renderPage();
    const pay = await screen.findByRole("button", { name: "Pay the deposit" });
    expect(screen.getByText(/\$11,736\.00, paid securely by card/)).toBeInTheDocument(); // the chosen option's deposit
    await user.click(pay);
    await waitFor(() => expect(go).toHaveBeenCalledWith("http://127.0.0.1:4999/pay/cs_test_1"));
  });

  it("back from the payment page: processing, polling until the webhook marked the deposit paid", async () => {
    const api = stubApi({
      [`GET ${BASE}`]: [
        () => json(200, { data: acceptedState({ status: "pending", amountCents: 1_173_600 }) }),
        () => json(200, { data: acceptedState({ status: "paid", amountCents: 1_173_600 }) }),
      ],
    });
    renderPage("?deposit=processing");
    expect(await screen.findByText("Processing your payment…")).toBeInTheDocument();
    expect(screen.queryByRole("button", { name: "Pay the deposit" })).not.toBeInTheDocument();
    expect(await screen.findByText("Deposit received — thank you", {}, { timeout: 6000 })).toBeInTheDocument();
    expect(api.callsTo(`GET ${BASE}`).length).toBeGreaterThanOrEqual(2);
  });

  it("back from a cancelled payment: a calm message and the pay button again", async () => {
    stubApi({ [`GET ${BASE}`]: () => json(200, { data: acceptedState({ status: "pending", amountCents: 1_173_600 }) }) });
    renderPage("?deposit=cancelled");
    expect(await screen.findByText("The payment was not completed")).toBeInTheDocument();
    expect(screen.getByText(/Nothing was charged/)).toBeInTheDocument();
    expect(screen.getByRole("button", { name: "Pay the deposit" })).toBeEnabled();
  });
});
