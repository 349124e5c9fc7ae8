import { beforeEach, describe, expect, it } from "vitest";
import { testStorage } from "../helpers/app";
import { testSequelize, truncateAll } from "../helpers/db";
import { approvedQuoteWorld, homeowner, sendQuote } from "../helpers/proposal-world";
import { AuditEvent, Job, Proposal, Quote, QuoteRevision } from "../../server/models/index";
import { OutboxMessage } from "../../server/models/mail.models";
import { runSchedulerOnce, type SchedulerContext } from "../../server/services/proposal-scheduler";

beforeEach(truncateAll);

const DAY = 86_400_000;
const ctx = (): SchedulerContext => ({ sequelize: testSequelize(), storage: testStorage(), reminderDaysBefore: 3 });

async function sent() {
  const w = await approvedQuoteWorld();
  const { token } = await sendQuote(w);
  const p = (await Proposal.findOne())!;
  return { ...w, token, p };
}

describe("runSchedulerOnce", () => {
  it("sends one reminder within REMINDER_DAYS_BEFORE days of expiry, with the PDF; a second run sends none", async () => {
    const w = await sent();
    const early = new Date(w.p.expiresAt.getTime() - 5 * DAY);
    expect(await runSchedulerOnce(ctx(), early)).toEqual({ expired: 0, reminded: 0 });
    const due = new Date(w.p.expiresAt.getTime() - 2 * DAY);
    expect(await runSchedulerOnce(ctx(), due)).toEqual({ expired: 0, reminded: 1 });
    expect(await runSchedulerOnce(ctx(), new Date(due.getTime() + 60_000))).toEqual({ expired: 0, reminded: 0 });
    const mails = await OutboxMessage.findAll({ where: { kind: "proposal_reminder" } });
    expect(mails).toHaveLength(1);
    expect(mails[0].toAddresses).toEqual([w.p.sentTo]);
    expect(mails[0].subject).toContain(w.quote.number);
    expect(mails[0].attachments).toHaveLength(1);
    expect((await Proposal.findByPk(w.p.id))!.reminderSentAt).not.toBeNull();
  });

  it("expires a proposal past its date: link 404, quote → expired, job → lost; a second run changes nothing", async () => {
    const w = await sent();
    const after = new Date(w.p.expiresAt.getTime() + 60_000);
    expect(await runSchedulerOnce(ctx(), after)).toEqual({ expired: 1, reminded: 0 });
    expect(await runSchedulerOnce(ctx(), after)).toEqual({ expired: 0, reminded: 0 });
    expect((await Proposal.findByPk(w.p.id))!.status).toBe("expired");
    expect((await Quote.findByPk(w.quoteId))!.status).toBe("expired");
    expect((await QuoteRevision.findByPk(w.p.revisionId))!.status).toBe("expired");
    expect((await Job.findByPk(w.job.id))!.status).toBe("lost");
    expect(await AuditEvent.count({ where: { action: "expired" } })).toBe(1);
    expect((await homeowner(w.app).get(`/api/proposals/${w.token}`)).status).toBe(404);
    expect(await OutboxMessage.count({ where: { kind: "proposal_reminder" } })).toBe(0); // expired: no reminder
  });

  it("leaves the job alone when a newer revision of the quote exists", async () => {
    const w = await sent();
    const res = await w.estimator.agent.post(`/api/quotes/${w.quoteId}/revise`).set("X-CSRF-Token", w.estimator.token);
    expect(res.status).toBe(201);
    await runSchedulerOnce(ctx(), new Date(w.p.expiresAt.getTime() + 60_000));
    expect((await Proposal.findByPk(w.p.id))!.status).toBe("expired");
    expect((await Quote.findByPk(w.quoteId))!.status).toBe("draft");
    expect((await Job.findByPk(w.job.id))!.status).toBe("proposed");
  });

  it("two schedulers at once make each change once", async () => {
    const w = await sent();
    const w2 = await approvedQuoteWorld({ app: w.app });
    await sendQuote(w2);
    const second = (await Proposal.findOne({ where: { quoteId: w2.quoteId } }))!;
    // One proposal due for a reminder, the other past its expiry.
    await second.update({ expiresAt: new Date(w.p.expiresAt.getTime() - 10 * DAY) });
    const now = new Date(w.p.expiresAt.getTime() - 2 * DAY);
    const results = await Promise.all([runSchedulerOnce(ctx(), now), runSchedulerOnce(ctx(), now), runSchedulerOnce(ctx(), now)]);
    expect(results.reduce((s, r) => s + r.reminded, 0)).toBe(1);
    expect(results.reduce((s, r) => s + r.expired, 0)).toBe(1);
    expect(await OutboxMessage.count({ where: { kind: "proposal_reminder" } })).toBe(1);
    expect(await AuditEvent.count({ where: { action: "expired" } })).toBe(1);
    expect(await AuditEvent.count({ where: { action: "reminder_sent" } })).toBe(1);
  });
});
