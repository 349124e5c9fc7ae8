import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { deliverOutbox, startTestMailCatcher } from "../helpers/app";
import { countRows, truncateAll } from "../helpers/db";
import { signedInAgent } from "../helpers/auth";
import { buildCompany } from "../helpers/factories";
import { pdfText, squash } from "../helpers/pdf-text";
import { createQuote, post, quoteInReview } from "../helpers/quote-factories";
import { approvedQuoteWorld, binary, homeowner, latestToken, sendQuote } from "../helpers/proposal-world";
import { AuditEvent, Job, Proposal, Quote, QuoteRevision } from "../../server/models/index";
import { OutboxMessage } from "../../server/models/mail.models";
import { hashProposalToken } from "../../server/services/proposals.service";
import { formatMoney } from "../../shared/schemas/proposal";

beforeEach(async () => {
  await truncateAll();
  await (await startTestMailCatcher()).clear();
});

describe("POST /api/quotes/:id/send", () => {
  it("refuses a draft and a quote in review with 409 invalid_transition and the current status", async () => {
    const w = await approvedQuoteWorld();
    const draft = await createQuote(w.estimator, w.job.id);
    const res = await post(w.estimator, `/api/quotes/${draft.body.data.id}/send`, {});
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ error: { code: "invalid_transition" }, currentStatus: "draft" });

    const review = await quoteInReview(w);
    const res2 = await post(w.estimator, `/api/quotes/${review.id}/send`, {});
    expect(res2.status).toBe(409);
    expect(res2.body).toMatchObject({ error: { code: "invalid_transition" }, currentStatus: "in_review" });
    expect(await countRows("proposals")).toBe(0);
    expect(await countRows("outbox_messages")).toBe(0);
  });

  it("is refused to the signed out (401), crew (404) and another company's owner (404) before anything changes", async () => {
    const w = await approvedQuoteWorld();
    const anon = await request(w.app).post(`/api/quotes/${w.quoteId}/send`).send({});
    expect([401, 403]).toContain(anon.status); // no session: the CSRF check refuses first
    const crew = await post(w.crew, `/api/quotes/${w.quoteId}/send`, {});
    expect(crew.status).toBe(404);
    const other = await signedInAgent({ role: "owner", companyId: (await buildCompany()).id }, w.app);
    const res = await post(other, `/api/quotes/${w.quoteId}/send`, {});
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe("not_found");
    expect(await countRows("proposals")).toBe(0);
    expect((await Quote.findByPk(w.quoteId))!.status).toBe("approved");
  });

  it("sends an approved quote: 201 with the proposal, quote → sent, job → proposed, the token stored only as its hash, one outbox e-mail", async () => {
    const w = await approvedQuoteWorld();
    const res = await post(w.estimator, `/api/quotes/${w.quoteId}/send`, { copyToMe: true, message: "Thanks for having us out." });
    expect(res.status).toBe(201);
    const customerEmail = (await Job.findByPk(w.job.id, { include: ["customer"] }))!.customer!.email;
    expect(res.body.data).toMatchObject({
      id: expect.any(Number),
      quoteId: w.quoteId,
      revisionNo: 1,
      status: "active",
      sentTo: customerEmail,
      viewedAt: null,
      acceptedAt: null,
      declinedAt: null,
      deposit: null,
    });
    // Validity from the company settings (the demo price book: 30 days).
    const days = (Date.parse(res.body.data.expiresAt) - Date.parse(res.body.data.sentAt)) / 86_400_000;
    expect(days).toBeCloseTo(30, 3);

    expect((await Quote.findByPk(w.quoteId))!.status).toBe("sent");
    const rev = (await QuoteRevision.findOne({ where: { quoteId: w.quoteId } }))!;
    expect(rev.status).toBe("sent");
    expect(rev.sentAt).not.toBeNull();
    expect((await Job.findByPk(w.job.id))!.status).toBe("proposed");

    const token = await latestToken();
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/); // 32 random bytes, URL-safe
    const row = (await Proposal.findByPk(res.body.data.id))!;
    expect(row.tokenHash).toBe(hashProposalToken(token));
    expect(row.tokenHash).not.toContain(token);
    expect(row.pdfKey).toBeTruthy();
    expect(row.pdfSha256).toMatch(/^[0-9a-f]{64}$/);

    const mails = await OutboxMessage.findAll({ where: { kind: "proposal" } });
    expect(mails).toHaveLength(1);
    expect(mails[0].toAddresses).toEqual([customerEmail]);
    expect(mails[0].cc).toEqual([w.estimator.user.email]); // "send a copy to me"
    expect(mails[0].text).toContain("Thanks for having us out.");
    expect(mails[0].html).toContain(`/p/${token}`);
    expect(mails[0].attachments).toHaveLength(1);
    const audit = await AuditEvent.findOne({ where: { entityType: "quote", entityId: String(w.quoteId), action: "sent" } });
    expect(audit).not.toBeNull();
  });

  it("the e-mail arrives in the real local catcher with the PDF attached, and the PDF shows the totals and the link", async () => {
    const w = await approvedQuoteWorld();
    const { token } = await sendQuote(w);
    const run = await deliverOutbox();
    expect(run.sent).toBe(1);
    const catcher = await startTestMailCatcher();
    const msg = await catcher.waitFor((m) => m.kind === "proposal", 5_000);
    expect(msg.subject).toContain(w.quote.number);
    expect(msg.text).toContain(`http://localhost:3000/p/${token}`.replace("http://localhost:3000", testPublicUrl()));
    expect(msg.attachments).toHaveLength(1);
    expect(msg.attachments[0]).toMatchObject({ contentType: "application/pdf", filename: `proposal-${w.quote.number}.pdf` });
    const att = await catcher.attachment(msg.id, 0);
    expect(att!.content.subarray(0, 5).toString()).toBe("%PDF-");
    // Byte-identical to the stored copy.
    const row = (await Proposal.findOne({ where: { tokenHash: hashProposalToken(token) } }))!;
    const { createHash } = await import("node:crypto");
    expect(createHash("sha256").update(att!.content).digest("hex")).toBe(row.pdfSha256);
    const text = squash(await pdfText(att!.content));
    for (const o of w.quote.revision.options) {
      expect(text).toContain(o.label);
      expect(text).toContain(formatMoney(o.totals.totalCents));
    }
    expect(text.replace(/\s/g, "")).toContain(`/p/${token}`);
  });

  it("resending issues a new link and revokes the old one (old token → 404, new one → 200)", async () => {
    const w = await approvedQuoteWorld();
    const first = await sendQuote(w);
    const second = await sendQuote(w);
    expect(second.token).not.toBe(first.token);
    expect(second.res.status).toBe(201);
    const old = await homeowner(w.app).get(`/api/proposals/${first.token}`);
    expect(old.status).toBe(404);
    const fresh = await homeowner(w.app).get(`/api/proposals/${second.token}`);
    expect(fresh.status).toBe(200);
    const rows = await Proposal.findAll({ order: [["id", "ASC"]] });
    expect(rows.map((r) => r.status)).toEqual(["revoked", "active"]);
    expect(await AuditEvent.count({ where: { action: "resent" } })).toBe(1);
    expect(await OutboxMessage.count({ where: { kind: "proposal" } })).toBe(2);
  });

  it("a customer without an e-mail needs `to` (400 field), and `to` overrides the address", async () => {
    const w = await approvedQuoteWorld();
    const job = (await Job.findByPk(w.job.id, { include: ["customer"] }))!;
    await job.customer!.update({ email: null });
    const res = await post(w.estimator, `/api/quotes/${w.quoteId}/send`, {});
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("to");
    const bad = await post(w.estimator, `/api/quotes/${w.quoteId}/send`, { to: "not-an-address" });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty("to");
    const ok = await post(w.estimator, `/api/quotes/${w.quoteId}/send`, { to: "other-home@example.com" });
    expect(ok.status).toBe(201);
    expect(ok.body.data.sentTo).toBe("other-home@example.com");
  });
});

describe("GET /api/quotes/:id/pdf", () => {
  it("gives owners and estimators the PDF; crew and another company get 404; signed out 401", async () => {
    const w = await approvedQuoteWorld();
    const res = await w.estimator.agent.get(`/api/quotes/${w.quoteId}/pdf`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toBe("application/pdf");
    expect((res.body as Buffer).subarray(0, 5).toString()).toBe("%PDF-");
    const text = squash(await pdfText(res.body as Buffer));
    expect(text).toContain(w.quote.number);
    expect(text).toContain(formatMoney(w.quote.revision.options[0].totals.totalCents));

    expect((await w.owner.agent.get(`/api/quotes/${w.quoteId}/pdf`)).status).toBe(200);
    expect((await w.crew.agent.get(`/api/quotes/${w.quoteId}/pdf`)).status).toBe(404);
    const other = await signedInAgent({ role: "owner", companyId: (await buildCompany()).id }, w.app);
    expect((await other.agent.get(`/api/quotes/${w.quoteId}/pdf`)).status).toBe(404);
    expect((await request(w.app).get(`/api/quotes/${w.quoteId}/pdf`)).status).toBe(401);
  });

  it("renders an approved revision once and keeps it (same bytes, one stored copy); a draft renders fresh, marked draft", async () => {
    const w = await approvedQuoteWorld();
    const a = await w.owner.agent.get(`/api/quotes/${w.quoteId}/pdf`).buffer(true).parse(binary);
    const b = await w.owner.agent.get(`/api/quotes/${w.quoteId}/pdf`).buffer(true).parse(binary);
    expect(Buffer.compare(a.body as Buffer, b.body as Buffer)).toBe(0);
    expect(await countRows("revision_pdfs")).toBe(1);

    const draft = await createQuote(w.estimator, w.job.id);
    const d = await w.estimator.agent.get(`/api/quotes/${draft.body.data.id}/pdf`).buffer(true).parse(binary);
    expect(d.status).toBe(200);
    expect(squash(await pdfText(d.body as Buffer))).toMatch(/draft/i);
    expect(await countRows("revision_pdfs")).toBe(1);
  });

  it("after sending, gives the copy the homeowner received", async () => {
    const w = await approvedQuoteWorld();
    const { token } = await sendQuote(w);
    const res = await w.owner.agent.get(`/api/quotes/${w.quoteId}/pdf`).buffer(true).parse(binary);
    const { createHash } = await import("node:crypto");
    const row = (await Proposal.findOne({ where: { tokenHash: hashProposalToken(token) } }))!;
    expect(createHash("sha256").update(res.body as Buffer).digest("hex")).toBe(row.pdfSha256);
  });
});

describe("GET /api/jobs/:id/proposals and the job's progress", () => {
  it("lists the job's proposals newest first; the board and the job detail carry the latest one's progress", async () => {
    const w = await approvedQuoteWorld();
    const before = await w.estimator.agent.get(`/api/jobs/${w.job.id}`);
    expect(before.body.data.proposal).toBeNull();
    await sendQuote(w);
    const { token } = await sendQuote(w);
    await homeowner(w.app).get(`/api/proposals/${token}`).expect(200);

    const list = await w.estimator.agent.get(`/api/jobs/${w.job.id}/proposals`);
    expect(list.status).toBe(200);
    expect(list.body.data.map((p: { status: string }) => p.status)).toEqual(["active", "revoked"]);
    expect(list.body.data[0].viewedAt).not.toBeNull();

    const detail = await w.estimator.agent.get(`/api/jobs/${w.job.id}`);
    expect(detail.body.data.status).toBe("proposed");
    expect(detail.body.data.proposal).toMatchObject({ status: "active", viewedAt: expect.any(String), acceptedAt: null, declinedAt: null, depositStatus: null });
    const board = await w.estimator.agent.get(`/api/jobs`);
    const row = board.body.data.find((j: { id: number }) => j.id === w.job.id);
    expect(row.proposal).toMatchObject({ status: "active", sentAt: expect.any(String) });
    expect(row.proposal).toEqual(detail.body.data.proposal);

    expect((await w.crew.agent.get(`/api/jobs/${w.job.id}/proposals`)).status).toBe(404);
    const other = await signedInAgent({ role: "owner", companyId: (await buildCompany()).id }, w.app);
    expect((await other.agent.get(`/api/jobs/${w.job.id}/proposals`)).status).toBe(404);
  });
});

function testPublicUrl() {
  return (process.env.PUBLIC_URL ?? `http://localhost:${process.env.PORT ?? 3000}`).replace(/\/+$/, "");
}
