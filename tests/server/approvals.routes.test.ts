import { beforeEach, describe, expect, it } from "vitest";
import { truncateAll, testSequelize } from "../helpers/db";
import { buildJob, saveRoofFor } from "../helpers/job-factories";
import { signedInAgent } from "../helpers/auth";
import { createQuote, patch, post, quoteInReview, quoteWorld } from "../helpers/quote-factories";
import { Approval, AuditEvent, Customer } from "../../server/models/index";

beforeEach(truncateAll);

/** A discount large enough to pull the margin under the demo book's 25 % minimum (35 % target). */
const BIG_DISCOUNT = { amountCents: 400_000, reason: "Storm-damage special" };

describe("POST /api/quotes/:id/approve", () => {
  it("an owner approves an estimator's quote: approved, with who and when, an approvals row and an audit row", async () => {
    const w = await quoteWorld();
    const q = await quoteInReview(w);
    expect(q.revision.needsApprovalReason).toBe(false);
    const res = await post(w.owner, `/api/quotes/${q.id}/approve`, {});
    expect(res.status).toBe(200);
    expect(res.body.data.status).toBe("approved");
    expect(res.body.data.revision).toMatchObject({
      status: "approved",
      approvedBy: { id: w.owner.user.id, name: w.owner.user.name },
      approvedAt: expect.any(String),
      approvalReason: null,
    });
    const rows = await Approval.findAll({ where: { revisionId: q.revision.id } });
    expect(rows.map((r) => [r.decision, r.ownerId, r.reasonOrComment])).toEqual([["approved", w.owner.user.id, null]]);
    expect(Number(rows[0].marginPct)).toBeCloseTo(q.revision.options[0].totals.marginPct, 3);
    const events = await AuditEvent.findAll({ where: { jobId: w.job.id, entityType: "quote" }, order: [["id", "ASC"]] });
    expect(events.map((e) => e.action)).toEqual(["created", "submitted", "approved"]);
  });

  it("approving works without a body at all (no reason needed)", async () => {
    const w = await quoteWorld();
    const q = await quoteInReview(w);
    const res = await w.owner.agent.post(`/api/quotes/${q.id}/approve`).set("X-CSRF-Token", w.owner.token);
    expect(res.status).toBe(200);
  });

  it("an estimator never approves (403), even their own quote, and crew get 403", async () => {
    const w = await quoteWorld();
    const q = await quoteInReview(w);
    for (const a of [w.estimator, w.crew]) {
      const res = await post(a, `/api/quotes/${q.id}/approve`, { reason: "looks fine" });
      expect(res.status).toBe(403);
    }
    expect((await w.owner.agent.get(`/api/quotes/${q.id}`)).body.data.status).toBe("in_review");
    expect(await Approval.count()).toBe(0);
  });

  it("an owner may approve a quote they wrote themselves", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.owner, w.job.id)).body.data;
    await post(w.owner, `/api/quotes/${q.id}/submit`, { version: 1 }).expect(200);
    const res = await post(w.owner, `/api/quotes/${q.id}/approve`, {});
    expect(res.status).toBe(200);
    expect(res.body.data.revision).toMatchObject({ createdBy: { id: w.owner.user.id }, submittedBy: { id: w.owner.user.id }, approvedBy: { id: w.owner.user.id } });
  });

  it("below the company's minimum margin: 400 fields.reason without a reason (or a too-short one), approved with one", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    const edited = await patch(w.estimator, `/api/quotes/${q.id}`, { version: 1, discount: BIG_DISCOUNT });
    const opt = edited.body.data.revision.options[0];
    expect(opt.totals.marginPct).toBeLessThan(25);
    expect(opt.belowMinMargin).toBe(true);
    expect(opt.hasOverrides).toBe(false);
    expect(edited.body.data.revision.needsApprovalReason).toBe(true);
    await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: 2 }).expect(200);

    const none = await post(w.owner, `/api/quotes/${q.id}/approve`, {});
    expect(none.status).toBe(400);
    expect(none.body.error.fields.reason).toMatch(/below the 25 % minimum margin/);
    const short = await post(w.owner, `/api/quotes/${q.id}/approve`, { reason: " ok " });
    expect(short.status).toBe(400);
    expect(short.body.error.fields).toHaveProperty("reason");
    expect((await w.owner.agent.get(`/api/quotes/${q.id}`)).body.data.status).toBe("in_review");

    const ok = await post(w.owner, `/api/quotes/${q.id}/approve`, { reason: "Keeps the crew busy in a slow month" });
    expect(ok.status).toBe(200);
    expect(ok.body.data.revision.approvalReason).toBe("Keeps the crew busy in a slow month");
    expect((await Approval.findOne())!.reasonOrComment).toBe("Keeps the crew busy in a slow month");
  });

  it("with an override: a reason is required even when the margin is fine", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    const edited = await patch(w.estimator, `/api/quotes/${q.id}`, {
      version: 1,
      overrides: [{ key: "underlayment-synthetic", quantity: 3, reason: "Extra roll for the porch tie-in" }],
    });
    const opt = edited.body.data.revision.options[0];
    expect(opt.belowMinMargin).toBe(false);
    expect(opt.hasOverrides).toBe(true);
    await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: 2 }).expect(200);
    const none = await post(w.owner, `/api/quotes/${q.id}/approve`, {});
    expect(none.status).toBe(400);
    expect(none.body.error.fields.reason).toMatch(/overridden/);
    expect((await post(w.owner, `/api/quotes/${q.id}/approve`, { reason: "Checked the porch on site" })).status).toBe(200);
  });

  it("answers 400 for a reason that is not text", async () => {
    const w = await quoteWorld();
    const q = await quoteInReview(w);
    const res = await post(w.owner, `/api/quotes/${q.id}/approve`, { reason: 42 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("reason");
  });
});

describe("POST /api/quotes/:id/return", () => {
  it("returns the revision to draft with the owner's comment (version + 1); the estimator edits and resubmits", async () => {
    const w = await quoteWorld();
    const q = await quoteInReview(w);
    const missing = await post(w.owner, `/api/quotes/${q.id}/return`, {});
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields).toHaveProperty("comment");
    expect((await post(w.estimator, `/api/quotes/${q.id}/return`, { comment: "Please recheck" })).status).toBe(403);

    const res = await post(w.owner, `/api/quotes/${q.id}/return`, { comment: "Add the snow guards we discussed." });
    expect(res.status).toBe(200);
    expect(res.body.data.status).toBe("draft");
    const rev = res.body.data.revision;
    expect(rev).toMatchObject({
      revisionNo: 1,
      status: "draft",
      version: q.revision.version + 1,
      returnComment: "Add the snow guards we discussed.",
      returnedBy: { id: w.owner.user.id },
      returnedAt: expect.any(String),
    });
    // The estimator sees the comment and edits the same revision.
    const seen = (await w.estimator.agent.get(`/api/quotes/${q.id}`)).body.data.revision;
    expect(seen.returnComment).toBe("Add the snow guards we discussed.");
    const edited = await patch(w.estimator, `/api/quotes/${q.id}`, {
      version: rev.version,
      manualLines: [{ description: "Snow guards, clamp-on", quantity: 12, unitPriceCents: 2500, unitCostCents: 1150, taxable: true }],
    });
    expect(edited.status).toBe(200);
    const again = await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: edited.body.data.revision.version });
    expect(again.status).toBe(200);
    expect(again.body.data.revision.revisionNo).toBe(1);
    const rows = await Approval.findAll({ order: [["id", "ASC"]] });
    expect(rows.map((r) => [r.decision, r.reasonOrComment])).toEqual([["returned", "Add the snow guards we discussed."]]);
    const events = await AuditEvent.findAll({ where: { jobId: w.job.id, entityType: "quote" }, order: [["id", "ASC"]] });
    expect(events.map((e) => e.action)).toEqual(["created", "submitted", "returned", "updated", "submitted"]);
  });
});

describe("GET /api/approvals", () => {
  it("lists the company's quotes in review, oldest submitted first, with margins, overrides and the estimator", async () => {
    const w = await quoteWorld();
    const second = await buildJob({ companyId: w.company.id, status: "estimating", estimatorId: w.estimator.user.id });
    await saveRoofFor(second);
    const newer = await quoteInReview(w, { options: [{ label: "Battens + foil", spec: { spacer: "battens", foil: true } }, { label: "No spacer", spec: { spacer: "none" } }] });
    const olderDraft = (await createQuote(w.estimator, second.id)).body.data;
    await patch(w.estimator, `/api/quotes/${olderDraft.id}`, {
      version: 1,
      notes: "Porch flashing priced by hand.",
      overrides: [{ key: "flashing-headwall", unitCostCents: 4200, reason: "Custom bend" }],
    }).expect(200);
    const older = (await post(w.estimator, `/api/quotes/${olderDraft.id}/submit`, { version: 2 })).body.data;
    await testSequelize().query("UPDATE quote_revisions SET submitted_at = NOW() - INTERVAL 2 DAY WHERE id = ?", { replacements: [older.revision.id] });
    // Not in the queue: a draft, an approved quote, an archived one and another company's.
    await createQuote(w.estimator, w.job.id);
    const done = await quoteInReview(w);
    await post(w.owner, `/api/quotes/${done.id}/approve`, {}).expect(200);
    const hidden = await quoteInReview(w);
    await post(w.owner, `/api/quotes/${hidden.id}/archive`).expect(200);
    const other = await quoteWorld();
    await quoteInReview(other);

    const res = await w.owner.agent.get("/api/approvals");
    expect(res.status).toBe(200);
    expect(res.body.data.map((i: { quoteId: number }) => i.quoteId)).toEqual([older.id, newer.id]);
    const customer = (await Customer.findByPk(second.customerId))!;
    const [first, next] = res.body.data;
    expect(first).toEqual({
      quoteId: older.id,
      number: older.number,
      jobId: second.id,
      customerName: customer.name,
      siteAddress: "12 Larkspur Lane, Fenwick Hollow",
      revisionNo: 1,
      submittedAt: expect.any(String),
      submittedBy: { id: w.estimator.user.id, name: w.estimator.user.name },
      estimator: { id: w.estimator.user.id, name: w.estimator.user.name },
      options: [{ label: "As designed", totalCents: older.revision.options[0].totals.totalCents, marginPct: older.revision.options[0].totals.marginPct }],
      lowestMarginPct: older.revision.options[0].totals.marginPct,
      minMarginPct: 25,
      belowMinMargin: false,
      overridesCount: 1,
      notes: "Porch flashing priced by hand.",
    });
    expect(new Date(first.submittedAt).getTime()).toBeLessThan(new Date(next.submittedAt).getTime());
    expect(next.options.map((o: { label: string }) => o.label)).toEqual(["Battens + foil", "No spacer"]);
    expect(next.lowestMarginPct).toBe(Math.min(...newer.revision.options.map((o: { totals: { marginPct: number } }) => o.totals.marginPct)));
    expect(next.overridesCount).toBe(0);
  });

  it("is for owners only: estimators and crew get 403", async () => {
    const w = await quoteWorld();
    await quoteInReview(w);
    expect((await w.estimator.agent.get("/api/approvals")).status).toBe(403);
    expect((await w.crew.agent.get("/api/approvals")).status).toBe(403);
    const lone = await signedInAgent({ role: "owner" });
    expect((await lone.agent.get("/api/approvals")).body).toEqual({ data: [] });
  });
});
