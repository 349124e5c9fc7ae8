import { beforeEach, describe, expect, it } from "vitest";
import { createHash } from "node:crypto";
import { deliverOutbox, startTestMailCatcher, testStorage } from "../helpers/app";
import { countRows, truncateAll } from "../helpers/db";
import { pdfText, squash } from "../helpers/pdf-text";
import { approvedQuoteWorld, binary, homeowner, sendQuote } from "../helpers/proposal-world";
import { AuditEvent, Job, Proposal, Quote, QuoteRevision } from "../../server/models/index";
import { OutboxMessage } from "../../server/models/mail.models";
import { hashProposalToken, newProposalToken, readAll } from "../../server/services/proposals.service";
import { PUBLIC_WRITES_PER_IP } from "../../server/routes/public-proposals.routes";

beforeEach(async () => {
  await truncateAll();
  await (await startTestMailCatcher()).clear();
});

const UA = "Mozilla/5.0 (X11; Linux x86_64) TestBrowser/1.0";

async function sentWorld() {
  const w = await approvedQuoteWorld();
  const { token } = await sendQuote(w);
  return { ...w, token };
}

const accept = (w: Awaited<ReturnType<typeof sentWorld>>, body: Record<string, unknown>) =>
  homeowner(w.app).post(`/api/proposals/${w.token}/accept`).set("User-Agent", UA).send(body);

describe("GET /api/proposals/:token", () => {
  it("shows the proposal without a session or CSRF token; the first view is recorded once", async () => {
    const w = await sentWorld();
    const res = await homeowner(w.app).get(`/api/proposals/${w.token}`);
    expect(res.status).toBe(200);
    expect(res.headers["cache-control"]).toBe("no-store");
    const d = res.body.data;
    expect(d).toMatchObject({ status: "active", accepted: null, declined: null, deposit: null, expiresAt: expect.any(String) });
    expect(d.options).toHaveLength(2);
    w.quote.revision.options.forEach((o, i) => {
      expect(d.options[i]).toEqual({
        id: o.id,
        label: o.label,
        totalCents: o.totals.totalCents,
        depositCents: o.totals.depositCents,
        priceCents: o.totals.priceCents,
        taxCents: o.totals.taxCents,
      });
    });
    expect(d.doc.proposalNumber).toBe(w.quote.number);
    expect(d.doc.acceptUrl).toContain(`/p/${w.token}`);
    expect(JSON.stringify(d)).not.toMatch(/costCents|marginPct/); // nothing of the office's margins

    const first = (await Proposal.findOne())!.viewedAt!;
    await new Promise((r) => setTimeout(r, 1_100));
    await homeowner(w.app).get(`/api/proposals/${w.token}`).expect(200);
    const row = (await Proposal.findOne())!;
    expect(row.viewedAt!.getTime()).toBe(first.getTime());
    expect(row.lastViewedAt!.getTime()).toBeGreaterThan(first.getTime());
  });

  it("answers an unknown, a malformed, a revoked and an expired token with the same 404 body", async () => {
    const w = await sentWorld();
    const revokedToken = w.token;
    const { token: live } = await sendQuote(w); // revokes the first
    const unknown = await homeowner(w.app).get(`/api/proposals/${newProposalToken()}`);
    const malformed = await homeowner(w.app).get(`/api/proposals/abc`);
    const revoked = await homeowner(w.app).get(`/api/proposals/${revokedToken}`);
    await Proposal.update({ expiresAt: new Date(Date.now() - 1_000) }, { where: { tokenHash: hashProposalToken(live) } });
    const expired = await homeowner(w.app).get(`/api/proposals/${live}`);
    for (const r of [unknown, malformed, revoked, expired]) {
      expect(r.status).toBe(404);
      expect(r.body).toEqual(unknown.body);
    }
    expect(unknown.body).toEqual({ error: { code: "not_found", message: "Proposal not found" } });
    // The same for the PDF and the writes.
    expect((await homeowner(w.app).get(`/api/proposals/${revokedToken}/pdf`)).status).toBe(404);
    const acc = await homeowner(w.app).post(`/api/proposals/${live}/accept`).send({ optionId: 1, signerName: "A B", consent: true });
    expect(acc.status).toBe(404);
    expect(acc.body).toEqual(unknown.body);
  });

  it("serves the sent PDF at /pdf", async () => {
    const w = await sentWorld();
    const res = await homeowner(w.app).get(`/api/proposals/${w.token}/pdf`).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toBe("application/pdf");
    const row = (await Proposal.findOne())!;
    expect(createHash("sha256").update(res.body as Buffer).digest("hex")).toBe(row.pdfSha256);
  });
});

describe("POST /api/proposals/:token/accept", () => {
  it("records the signer, IP and user agent, freezes the signed PDF (its SHA-256 matches the stored file), quote → accepted, job → won", async () => {
    const w = await sentWorld();
    const option = w.quote.revision.options[1];
    const res = await accept(w, { optionId: option.id, signerName: "Renée Åkesson-Øvergård", consent: true });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      status: "accepted",
      accepted: { optionId: option.id, optionLabel: option.label, signerName: "Renée Åkesson-Øvergård", at: expect.any(String) },
    });

    const p = (await Proposal.findOne())!;
    expect(p).toMatchObject({ status: "accepted", acceptedOptionId: option.id, signerName: "Renée Åkesson-Øvergård", signerUserAgent: UA });
    expect(p.signerIp).toMatch(/127\.0\.0\.1|::1|::ffff:127\.0\.0\.1/);
    expect(p.acceptedAt).not.toBeNull();
    const stored = await readAll(testStorage(), p.signedPdfKey!);
    expect(createHash("sha256").update(stored).digest("hex")).toBe(p.signedPdfSha256);
    expect(p.signedPdfKey).not.toBe(p.pdfKey);
    const text = squash(await pdfText(stored));
    expect(text).toContain("Renée Åkesson-Øvergård");
    expect(text).toContain(option.label);

    // The homeowner's PDF is now the signed copy.
    const pdf = await homeowner(w.app).get(`/api/proposals/${w.token}/pdf`).buffer(true).parse(binary);
    expect(createHash("sha256").update(pdf.body as Buffer).digest("hex")).toBe(p.signedPdfSha256);

    expect((await Quote.findByPk(w.quoteId))!.status).toBe("accepted");
    expect((await QuoteRevision.findOne({ where: { quoteId: w.quoteId } }))!.status).toBe("accepted");
    expect((await Job.findByPk(w.job.id))!.status).toBe("won");
    // The board's quote total is now the accepted option's (the second one here), not the first option's.
    expect(Number((await Job.findByPk(w.job.id))!.quoteTotalCents)).toBe(option.totals.totalCents);
    expect(option.totals.totalCents).not.toBe(w.quote.revision.options[0].totals.totalCents);
    expect(await AuditEvent.count({ where: { entityType: "quote", action: "accepted", actorId: null } })).toBe(1);
    expect(await AuditEvent.count({ where: { entityType: "job", action: "status_changed", jobId: w.job.id } })).toBe(2); // proposed, won
  });

  it("e-mails the signed copy to the homeowner and the estimator (through the real catcher)", async () => {
    const w = await sentWorld();
    await deliverOutbox();
    const option = w.quote.revision.options[0];
    await accept(w, { optionId: option.id, signerName: "Mara Quillfeather", consent: true }).expect(200);
    const run = await deliverOutbox();
    expect(run.sent).toBe(2);
    const catcher = await startTestMailCatcher();
    const toHome = await catcher.waitFor((m) => m.kind === "proposal_signed");
    const toOffice = await catcher.waitFor((m) => m.kind === "proposal_accepted");
    const p = (await Proposal.findOne())!;
    expect(toHome.to).toEqual([p.sentTo]);
    expect(toOffice.to).toEqual([w.estimator.user.email]);
    for (const m of [toHome, toOffice]) {
      expect(m.attachments).toHaveLength(1);
      const att = await catcher.attachment(m.id, 0);
      expect(createHash("sha256").update(att!.content).digest("hex")).toBe(p.signedPdfSha256);
    }
    expect(toHome.text).toContain("Mara Quillfeather");
  });

  it("checks the body: consent must be true, a name is needed, the option must be in this proposal (400, nothing changes)", async () => {
    const w = await sentWorld();
    const option = w.quote.revision.options[0];
    const noConsent = await accept(w, { optionId: option.id, signerName: "Mara Quillfeather", consent: false });
    expect(noConsent.status).toBe(400);
    expect(noConsent.body.error.fields).toHaveProperty("consent");
    const noName = await accept(w, { optionId: option.id, signerName: " ", consent: true });
    expect(noName.body.error.fields).toHaveProperty("signerName");
    const wrong = await accept(w, { optionId: 999_999, signerName: "Mara Quillfeather", consent: true });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields).toHaveProperty("optionId");
    expect((await Proposal.findOne())!.status).toBe("active");
    expect(await countRows("outbox_messages")).toBe(1);
  });

  it("accepting twice is 409 and changes nothing", async () => {
    const w = await sentWorld();
    const option = w.quote.revision.options[0];
    await accept(w, { optionId: option.id, signerName: "Mara Quillfeather", consent: true }).expect(200);
    const sha = (await Proposal.findOne())!.signedPdfSha256;
    const again = await accept(w, { optionId: w.quote.revision.options[1].id, signerName: "Someone Else", consent: true });
    expect(again.status).toBe(409);
    expect(again.body).toMatchObject({ error: { code: "already_decided" }, currentStatus: "accepted" });
    const p = (await Proposal.findOne())!;
    expect(p.signerName).toBe("Mara Quillfeather");
    expect(p.signedPdfSha256).toBe(sha);
  });
});

describe("POST /api/proposals/:token/decline", () => {
  it("declines with a reason: quote → declined, job → lost; the link then refuses accept with 409", async () => {
    const w = await sentWorld();
    const res = await homeowner(w.app).post(`/api/proposals/${w.token}/decline`).send({ reason: "We chose to wait a year." });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ status: "declined", declined: { reason: "We chose to wait a year.", at: expect.any(String) } });
    expect((await Quote.findByPk(w.quoteId))!.status).toBe("declined");
    expect((await Job.findByPk(w.job.id))!.status).toBe("lost");

    const reuse = await accept(w, { optionId: w.quote.revision.options[0].id, signerName: "Mara Quillfeather", consent: true });
    expect(reuse.status).toBe(409);
    expect(reuse.body).toMatchObject({ error: { code: "already_decided" }, currentStatus: "declined" });
    const again = await homeowner(w.app).post(`/api/proposals/${w.token}/decline`).send({ reason: "again" });
    expect(again.status).toBe(409);
    expect((await Proposal.findOne())!.declineReason).toBe("We chose to wait a year.");
    expect((await Job.findByPk(w.job.id))!.status).toBe("lost");
  });
});

describe("rate limit", () => {
  it(`refuses more than ${PUBLIC_WRITES_PER_IP} writes per IP in the window with 429`, async () => {
    const w = await sentWorld();
    const statuses: number[] = [];
    for (let i = 0; i < PUBLIC_WRITES_PER_IP + 1; i++) {
      statuses.push((await homeowner(w.app).post(`/api/proposals/${newProposalToken()}/decline`).send({})).status);
    }
    expect(statuses.slice(0, PUBLIC_WRITES_PER_IP).every((s) => s === 404)).toBe(true);
    expect(statuses[PUBLIC_WRITES_PER_IP]).toBe(429);
    expect(await OutboxMessage.count()).toBe(1);
  });
});
