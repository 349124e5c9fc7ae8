import { beforeEach, describe, expect, it } from "vitest";
import { seedDemo, DEMO_USERS, SECOND_COMPANY_USERS } from "../../server/db/seeders/demo";
import { seedDemoQuotes } from "../../server/db/seeders/demo-quotes";
import { Approval, Job, Payment, Proposal, Quote, QuoteOption, QuoteRevision, User } from "../../server/models/index";
import { QUOTE_STATUSES, type QuoteStatus } from "../../shared/schemas/quote";
import { testSequelize, truncateAll } from "../helpers/db";

beforeEach(truncateAll);

/** Job statuses a quote's current status fits. */
const FITS: Record<QuoteStatus, string[]> = {
  draft: ["estimating", "proposed"],
  in_review: ["estimating", "proposed"],
  approved: ["estimating", "proposed"],
  sent: ["proposed"],
  accepted: ["won", "scheduled", "installed"],
  declined: ["lost"],
  expired: ["lost"],
};

describe("demo quotes", () => {
  it("seeds quotes in every state over the demo jobs, consistent with each job's status", async () => {
    const sequelize = testSequelize();
    expect(await seedDemo(sequelize, { bcryptRounds: 4 })).toBe(true);
    const owner = (await User.findOne({ where: { email: DEMO_USERS[0].email } }))!;
    const quotes = await Quote.findAll({ where: { companyId: owner.companyId } });
    const byStatus = (s: QuoteStatus) => quotes.filter((q) => q.status === s);
    expect(new Set(quotes.map((q) => q.status))).toEqual(new Set(QUOTE_STATUSES));
    expect(byStatus("approved").length).toBeGreaterThanOrEqual(3);
    expect(byStatus("in_review").length).toBeGreaterThanOrEqual(2);
    expect(byStatus("draft").length).toBeGreaterThanOrEqual(2);
    for (const s of ["sent", "accepted", "declined", "expired"] as const) expect(byStatus(s).length).toBeGreaterThanOrEqual(1);

    const jobs = new Map((await Job.findAll({ where: { companyId: owner.companyId } })).map((j) => [j.id, j]));
    for (const q of quotes) {
      const job = jobs.get(q.jobId)!;
      expect(FITS[q.status as QuoteStatus], `${q.number} ${q.status} on a ${job.status} job`).toContain(job.status);
      const rev = (await QuoteRevision.findByPk(q.currentRevisionId!))!;
      expect(rev.status).toBe(q.status);
    }

    // One quote was returned with a comment and then edited by the estimator: created (1), submitted (2),
    // returned (3), edited (4); still revision 1, a draft.
    const returned = await QuoteRevision.findAll({ where: { companyId: owner.companyId, status: "draft" } });
    const edited = returned.find((r) => r.returnComment);
    expect(edited?.returnComment).toMatch(/gutter apron/);
    expect(edited!.version).toBe(4);
    expect(edited!.revisionNo).toBe(1);
    expect(await Approval.count({ where: { decision: "returned" } })).toBe(1);

    // Several quotes have two or three options, with the spacer choices.
    const options = await QuoteOption.findAll({ where: { revisionId: quotes.map((q) => q.currentRevisionId!) } });
    const perRevision = new Map<number, string[]>();
    for (const o of options) perRevision.set(o.revisionId, [...(perRevision.get(o.revisionId) ?? []), o.label]);
    expect([...perRevision.values()].filter((labels) => labels.length >= 2).length).toBeGreaterThanOrEqual(3);
    expect(options.map((o) => o.label)).toEqual(expect.arrayContaining(["Battens + foil", "Mesh + foil", "No spacer"]));
    expect(options.every((o) => Number(o.totalCents) > 0)).toBe(true);

    // A quote revised after it was sent keeps its sent revision 1.
    const revs = await QuoteRevision.findAll({ where: { companyId: owner.companyId, revisionNo: 2 } });
    expect(revs).toHaveLength(1);
    const first = await QuoteRevision.findOne({ where: { quoteId: revs[0].quoteId, revisionNo: 1 } });
    expect(first!.status).toBe("sent");

    // The board's total is set on every job that has a quote; the second company has none.
    for (const job of jobs.values()) {
      const has = quotes.some((q) => q.jobId === job.id);
      expect(job.quoteTotalCents === null, `job ${job.id}`).toBe(!has);
    }
    const second = (await User.findOne({ where: { email: SECOND_COMPANY_USERS[0].email } }))!;
    expect(await Quote.count({ where: { companyId: second.companyId } })).toBe(0);

    // The approvals queue has an order: distinct submission times.
    const inReview = await QuoteRevision.findAll({ where: { companyId: owner.companyId, status: "in_review" } });
    expect(new Set(inReview.map((r) => r.submittedAt!.getTime())).size).toBe(inReview.length);

    // Every revision the homeowner received has its proposal record, with the progress the board shows: the
    // current revision of each sent, accepted, declined or expired quote, and the sent revision 1 of the quote
    // revised afterwards (its link still live: nothing newer was sent).
    const received = await Quote.findAll({ where: { companyId: owner.companyId, status: ["sent", "accepted", "declined", "expired"] } });
    const proposals = await Proposal.findAll({ where: { companyId: owner.companyId } });
    const sentRevisions = [...received.map((q) => q.currentRevisionId!), first!.id];
    expect(proposals.map((p) => p.revisionId).sort()).toEqual(sentRevisions.sort());
    for (const p of proposals) {
      const q = quotes.find((x) => x.id === p.quoteId)!;
      expect(p.status).toBe(q.status === "sent" || p.revisionId !== q.currentRevisionId ? "active" : q.status);
      expect(p.viewedAt).not.toBeNull();
      if (p.status === "accepted") expect([p.acceptedAt, p.acceptedOptionId, p.signerName].every(Boolean)).toBe(true);
    }
    // So every proposed job has a link out with the homeowner.
    const proposed = [...jobs.values()].filter((j) => j.status === "proposed");
    expect(proposed.length).toBeGreaterThanOrEqual(2);
    for (const j of proposed) expect(proposals.some((p) => p.jobId === j.id && p.status === "active"), `job ${j.id}`).toBe(true);
    // Scheduled and installed jobs have their deposit paid.
    const done = await Job.findAll({ where: { companyId: owner.companyId, status: ["scheduled", "installed"] } });
    const paid = await Payment.findAll({ where: { companyId: owner.companyId, status: "paid" } });
    expect(done.length).toBeGreaterThan(0);
    for (const j of done) expect(paid.some((p) => p.jobId === j.id)).toBe(true);
  });

  it("is safe to call twice", async () => {
    const sequelize = testSequelize();
    await seedDemo(sequelize, { bcryptRounds: 4 });
    const owner = (await User.findOne({ where: { email: DEMO_USERS[0].email } }))!;
    const n = await Quote.count();
    const again = await sequelize.transaction((t) =>
      seedDemoQuotes(sequelize, owner.companyId, [{ id: owner.id, email: owner.email, name: owner.name, role: "owner" }], t),
    );
    expect(again).toBe(false);
    expect(await Quote.count()).toBe(n);
  });
});
