import { beforeEach, describe, expect, it } from "vitest";
import { render, screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClientProvider } from "@tanstack/react-query";
import { createMemoryRouter, RouterProvider } from "react-router-dom";
import { resetCsrfToken } from "@/lib/api-client";
import { makeAppQueryClient } from "@/app/provider";
import { DevMailScreen } from "@/features/dev-mail/components/dev-mail-screen";
import { json, stubApi } from "./fetch-stub";

const proposalMail = {
  id: "1764625200000-0a1b2c3d",
  from: "Quarry Slope Steelworks <office@quarryslope.example.com>",
  to: ["homeowner@example.com"],
  cc: ["estimator@example.com"],
  subject: "Your roofing proposal QSS-1042",
  text: "Hello Marisol,\nyour proposal is ready: http://localhost/p/tok",
  html: '<p>Hello Marisol,</p><p><a href="http://localhost/p/tok">Open your proposal</a></p><script>window.parent.hacked = true</script>',
  date: "2026-03-05T12:00:05.000Z",
  kind: "proposal",
  attachments: [{ filename: "Proposal QSS-1042.pdf", contentType: "application/pdf", size: 48_213 }],
};
const resetMail = {
  id: "1764625100000-99aa88bb",
  from: "Ridgewright <no-reply@example.com>",
  to: ["estimator@example.com"],
  cc: [],
  subject: "Reset your password",
  text: "Use this link to set a new password.",
  html: null,
  date: "2026-03-05T11:58:00.000Z",
  kind: "password_reset",
  attachments: [],
};

function renderInbox() {
  const qc = makeAppQueryClient();
  const router = createMemoryRouter([{ path: "/dev/mail", element: <DevMailScreen /> }], { initialEntries: ["/dev/mail"] });
  render(
    <QueryClientProvider client={qc}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
}

beforeEach(() => resetCsrfToken());

describe("Test inbox (/dev/mail)", () => {
  it("lists the caught e-mails newest first with recipient, subject and attachments", async () => {
    stubApi({ "GET /api/dev/mail": () => json(200, { data: [resetMail, proposalMail] }) });
    renderInbox();
    const nav = await screen.findByRole("navigation", { name: "Caught e-mails" });
    const rows = within(nav).getAllByRole("button");
    expect(rows).toHaveLength(2);
    expect(rows[0]).toHaveTextContent("homeowner@example.com");
    expect(rows[0]).toHaveTextContent("Your roofing proposal QSS-1042");
    expect(rows[0]).toHaveTextContent("Proposal QSS-1042.pdf");
    expect(rows[0]).toHaveAttribute("aria-current", "true");
    expect(rows[1]).toHaveTextContent("Reset your password");
  });

  it("shows the HTML in a sandboxed frame, the text view, and attachment downloads", async () => {
    stubApi({ "GET /api/dev/mail": () => json(200, { data: [proposalMail, resetMail] }) });
    const user = userEvent.setup();
    renderInbox();
    const mail = await screen.findByRole("article", { name: "E-mail: Your roofing proposal QSS-1042" });
    expect(mail).toHaveTextContent("estimator@example.com"); // cc
    const frame = within(mail).getByTitle("HTML view of the e-mail");
    expect(frame.tagName).toBe("IFRAME");
    expect(frame).toHaveAttribute("sandbox", ""); // no scripts, no same origin
    expect(frame.getAttribute("srcdoc")).toContain("Open your proposal");
    const download = within(mail).getByRole("link", { name: /Proposal QSS-1042\.pdf/ });
    expect(download).toHaveAttribute("href", `/api/dev/mail/${proposalMail.id}/attachments/0`);
    expect(download).toHaveAttribute("download", "Proposal QSS-1042.pdf");

    await user.click(within(mail).getByRole("tab", { name: "Text" }));
    expect(within(mail).getByText(/your proposal is ready: http:\/\/localhost\/p\/tok/)).toBeInTheDocument();
    expect(within(mail).queryByTitle("HTML view of the e-mail")).not.toBeInTheDocument();

    // a text-only message opens on its text, the HTML tab disabled
    await user.click(screen.getByRole("button", { name: /Reset your password/ }));
    const reset = await screen.findByRole("article", { name: "E-mail: Reset your password" });
    expect(within(reset).getByRole("tab", { name: "HTML" })).toBeDisabled();
    expect(within(reset).getByText("Use this link to set a new password.")).toBeInTheDocument();
  });

  it("says there is no local inbox when the API answers 404 (a real SMTP server is set)", async () => {
    stubApi({ "GET /api/dev/mail": () => json(404, { error: { code: "not_found", message: "Not found" } }) });
    renderInbox();
    expect(await screen.findByText("E-mail goes to a real server (SMTP_URL is set); there is no local inbox.")).toBeInTheDocument();
    expect(screen.queryByRole("navigation", { name: "Caught e-mails" })).not.toBeInTheDocument();
  });

  it("says so when nothing has been caught yet", async () => {
    stubApi({ "GET /api/dev/mail": () => json(200, { data: [] }) });
    renderInbox();
    expect(await screen.findByText("No e-mail yet")).toBeInTheDocument();
  });
});
