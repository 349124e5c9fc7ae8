/**
 * Quotes of a job, their revisions and options, and the owner's approval.
 *
 * - A quote has revisions; the current one carries the quote's status. A revision freezes what it was
 *   priced from (roof, site, the price book's items, labour and settings, the engine's rules) and each
 *   option's takeoff, lines and totals. Once it leaves `draft` it never changes again.
 * - Edits of a draft (PATCH, recalculate, submit) carry the revision's `version`: another version is 409
 *   `stale_version` with `currentVersion`. Edits of anything but a draft are 409 `not_draft`; a move the
 *   state machine does not allow is 409 `invalid_transition`; both carry `currentStatus`.
 * - PATCH re-prices with the revision's own frozen price book (a price change in the catalog leaves the
 *   revision's totals alone); `recalculate` and `revise` take the job's current roof and price book.
 * - Every write runs in one transaction with its audit row (jobId set). The job row is locked first, then
 *   the quote, so two writers of one job queue instead of deadlocking. jobs.quote_total_cents follows the
 *   job's latest live quote.
 */
import { Op, type Sequelize, type Transaction } from "sequelize";
import type { TakeoffResult } from "../../shared/engine/takeoff";
import type { JobSite } from "../../shared/schemas/job";
import {
  APPROVAL_REASON_MIN,
  REVISABLE_STATUSES,
  type ApprovalQueueItem,
  type OptionInput,
  type OptionSpec,
  type QuoteApproveInput,
  type QuoteCreateInput,
  type QuoteListQuery,
  type QuotePatchInput,
  type QuoteRecalculateInput,
  type QuoteReturnInput,
  type QuoteStatus,
  type QuoteSubmitInput,
} from "../../shared/schemas/quote";
import type { RoofDocument } from "../../shared/schemas/roof";
import { Approval, Customer, Job, Quote, QuoteLine, QuoteOption, QuoteRevision, Roof, User } from "../models/index";
import { badRequest, conflict, notFound } from "../errors";
import { parseJsonColumn } from "../presenters/job.presenter";
import { recordAudit } from "./audit.service";
import { allocateProposalNumber } from "./company.service";
import { JobsService } from "./jobs.service";
import { priceBookForCompany, rulesForCompany } from "./price-book-rules";
import { EMPTY_INPUTS, optionTakeoff, priceOptions, type FrozenPriceBook, type RevisionInputs, type RoofSnapshot } from "./quote-pricing";

type Actor = Express.User;

const num = (v: string | number | bigint | null | undefined) => (v === null || v === undefined ? 0 : Number(v));
const round3 = (x: number) => Math.round(x * 1000) / 1000;

const stale = (currentVersion: number) =>
  conflict("stale_version", "Someone changed this quote after you opened it; reload to see their changes, then apply yours", { currentVersion });
const notDraft = (currentStatus: QuoteStatus) =>
  conflict("not_draft", `This revision is ${currentStatus.replace("_", " ")}; only a draft can be edited (revise it to make changes)`, { currentStatus });
const invalidTransition = (currentStatus: QuoteStatus, action: string) =>
  conflict("invalid_transition", `A quote that is ${currentStatus.replace("_", " ")} cannot be ${action}`, { currentStatus });
const archivedQuote = () => conflict("archived", "This quote is archived; restore it to make changes");

/** The locked quote and its current revision, inside a write transaction. */
interface Locked {
  quote: Quote;
  rev: QuoteRevision;
  job: Job;
}

/** The pricing context of a revision: roof, site and price book (frozen or current). */
interface PricingContext {
  roof: RoofSnapshot;
  roofVersion: number;
  site: JobSite;
  book: FrozenPriceBook;
}

interface OptionState {
  row?: QuoteOption;
  label: string;
  spec: OptionSpec;
  takeoff: TakeoffResult;
}

export const revisionIncludes = [
  { model: QuoteOption, as: "options", include: [{ model: QuoteLine, as: "lines" }] },
  { model: User, as: "creator", attributes: ["id", "name"] },
  { model: User, as: "submitter", attributes: ["id", "name"] },
  { model: User, as: "approver", attributes: ["id", "name"] },
  { model: User, as: "returner", attributes: ["id", "name"] },
];

export class QuotesService {
  private readonly jobs: JobsService;

  constructor(private readonly sequelize: Sequelize) {
    this.jobs = new JobsService(sequelize);
  }

  // ---- reads -----------------------------------------------------------------------------------------

  /** A quote of the actor's company, or 404. */
  async find(id: number, actor: Actor, transaction?: Transaction): Promise<Quote> {
    const quote = await Quote.findOne({ where: { id, companyId: actor.companyId }, transaction });
    if (!quote) throw notFound("Quote");
    return quote;
  }

  /** 404 unless the job is the actor's company's. */
  async assertJob(jobId: number, actor: Actor): Promise<void> {
    await this.jobs.get(jobId, actor);
  }

  /** The job's quotes (live ones unless asked), newest first, each with its current revision and options. */
  async listForJob(jobId: number, query: QuoteListQuery, actor: Actor) {
    await this.jobs.get(jobId, actor);
    const where: Record<string | symbol, unknown> = { companyId: actor.companyId, jobId };
    if (query.archived === "0") where.archivedAt = null;
    else if (query.archived === "1") where.archivedAt = { [Op.ne]: null };
    const quotes = await Quote.findAll({ where, order: [["createdAt", "DESC"], ["id", "DESC"]] });
    const revIds = quotes.map((q) => q.currentRevisionId).filter((x): x is number => x !== null);
    const revs = revIds.length
      ? await QuoteRevision.findAll({
          where: { id: revIds },
          attributes: ["id", "revisionNo", "totalCents", "marginPct", "updatedAt"],
          include: [{ model: QuoteOption, as: "options", attributes: ["id", "position", "label", "totalCents"] }],
        })
      : [];
    const byId = new Map(revs.map((r) => [r.id, r]));
    return quotes.map((q) => ({ quote: q, rev: byId.get(q.currentRevisionId!)! }));
  }

  /** The quote with its current revision (options, lines, people) and the list of its revisions. */
  async detail(id: number, actor: Actor) {
    const quote = await this.find(id, actor);
    const [rev, revisions] = await Promise.all([
      QuoteRevision.findOne({ where: { id: quote.currentRevisionId! }, include: revisionIncludes }),
      QuoteRevision.findAll({
        where: { quoteId: quote.id },
        attributes: ["id", "revisionNo", "status", "totalCents", "createdAt"],
        order: [["revisionNo", "ASC"]],
      }),
    ]);
    if (!rev) throw notFound("Quote");
    return { quote, rev, revisions };
  }

  /** One revision of the quote by its number, or 404. */
  async revision(id: number, revisionNo: number, actor: Actor) {
    const quote = await this.find(id, actor);
    const rev = await QuoteRevision.findOne({ where: { quoteId: quote.id, revisionNo }, include: revisionIncludes });
    if (!rev) throw notFound("Revision");
    return rev;
  }

  /** Quotes in review for the owner: oldest submitted first, with margins, overrides and the estimator. */
  async approvalsQueue(actor: Actor): Promise<ApprovalQueueItem[]> {
    const revs = await QuoteRevision.findAll({
      where: { companyId: actor.companyId, status: "in_review" },
      attributes: ["id", "quoteId", "revisionNo", "submittedAt", "notes", "minMarginPct"],
      include: [
        { model: QuoteOption, as: "options", attributes: ["id", "position", "label", "totalCents", "marginPct", "belowMinMargin"] },
        { model: User, as: "submitter", attributes: ["id", "name"] },
      ],
      order: [["submittedAt", "ASC"], ["id", "ASC"]],
    });
    if (revs.length === 0) return [];
    const quotes = await Quote.findAll({ where: { id: revs.map((r) => r.quoteId), archivedAt: null }, attributes: ["id", "number", "jobId", "currentRevisionId"] });
    const quoteById = new Map(quotes.map((q) => [q.id, q]));
    const jobs = await Job.findAll({
      where: { id: [...new Set(quotes.map((q) => q.jobId))] },
      attributes: ["id", "siteAddressLine1", "siteCity", "estimatorId", "customerId"],
      include: [
        { model: Customer, as: "customer", attributes: ["id", "name"] },
        { model: User, as: "estimator", attributes: ["id", "name"] },
      ],
    });
    const jobById = new Map(jobs.map((j) => [j.id, j]));
    const optionIds = revs.flatMap((r) => (r.options ?? []).map((o) => o.id));
    const overridden = optionIds.length
      ? await QuoteLine.findAll({ where: { optionId: optionIds, overrideReason: { [Op.ne]: null } }, attributes: ["id", "optionId"] })
      : [];
    const overridesByOption = new Map<number, number>();
    for (const l of overridden) overridesByOption.set(l.optionId, (overridesByOption.get(l.optionId) ?? 0) + 1);

    const out: ApprovalQueueItem[] = [];
    for (const r of revs) {
      const q = quoteById.get(r.quoteId);
      if (!q || q.currentRevisionId !== r.id) continue;
      const job = jobById.get(q.jobId);
      const options = [...(r.options ?? [])].sort((a, b) => a.position - b.position);
      const margins = options.map((o) => round3(num(o.marginPct)));
      out.push({
        quoteId: q.id,
        number: q.number,
        jobId: q.jobId,
        customerName: job?.customer?.name ?? "",
        siteAddress: [job?.siteAddressLine1, job?.siteCity].filter(Boolean).join(", "),
        revisionNo: r.revisionNo,
        submittedAt: r.submittedAt!.toISOString(),
        submittedBy: r.submitter ? { id: r.submitter.id, name: r.submitter.name } : null,
        estimator: job?.estimator ? { id: job.estimator.id, name: job.estimator.name } : null,
        options: options.map((o, i) => ({ label: o.label, totalCents: num(o.totalCents), marginPct: margins[i] })),
        lowestMarginPct: margins.length ? Math.min(...margins) : 0,
        minMarginPct: num(r.minMarginPct),
        belowMinMargin: options.some((o) => o.belowMinMargin),
        overridesCount: options.reduce((s, o) => s + (overridesByOption.get(o.id) ?? 0), 0),
        notes: r.notes,
      });
    }
    return out;
  }

  // ---- writes (each public method runs one transaction; the *In methods take the caller's) ------------

  async create(jobId: number, input: QuoteCreateInput, actor: Actor): Promise<number> {
    return this.sequelize.transaction((t) => this.createIn(jobId, input, actor, t));
  }

  /** A new quote with revision 1 (a draft) priced from the job's roof and the current price book. */
  async createIn(jobId: number, input: QuoteCreateInput, actor: Actor, t: Transaction): Promise<number> {
    const job = await this.jobs.get(jobId, actor, t); // locks the job row
    if (job.archivedAt) throw conflict("archived", "This job is archived; restore it to make changes");
    const ctx = await this.currentContext(job, t);
    const options = input.options ?? [{ label: "As designed", spec: {} }];
    const number = await allocateProposalNumber(actor.companyId, t);
    const quote = await Quote.create(
      { companyId: actor.companyId, jobId, number, status: "draft", currentRevisionId: null, createdBy: actor.id },
      { transaction: t },
    );
    const rev = await this.newRevision(quote, 1, ctx, EMPTY_INPUTS, input.notes ?? null, actor, t);
    const states = options.map((o, i) => ({ label: o.label, spec: o.spec, takeoff: optionTakeoff(ctx.roof, ctx.site, ctx.book.rules, o.spec, `options.${i}.spec`) }));
    await this.writeOptions(rev, states, EMPTY_INPUTS, ctx, t);
    await quote.update({ currentRevisionId: rev.id }, { transaction: t });
    await this.audit(actor, quote, "created", { number, revisionNo: 1, options: options.map((o) => o.label), totalCents: num(rev.totalCents) }, t);
    await this.refreshJobTotal(jobId, t);
    return quote.id;
  }

  async patch(id: number, input: QuotePatchInput, actor: Actor): Promise<void> {
    await this.sequelize.transaction((t) => this.patchIn(id, input, actor, t));
  }

  /**
   * Edits a draft: notes, options (kept by id, new ones added, missing ones removed), manual lines,
   * overrides and discount; re-priced with the revision's own frozen price book. Options whose spec
   * changed (and new ones) get a new takeoff from the revision's frozen roof.
   */
  async patchIn(id: number, input: QuotePatchInput, actor: Actor, t: Transaction): Promise<void> {
    const { quote, rev } = await this.lockForEdit(id, actor, t);
    if (input.version !== rev.version) throw stale(rev.version);
    const ctx = this.frozenContext(rev);
    const existing = await QuoteOption.findAll({ where: { revisionId: rev.id }, order: [["position", "ASC"]], transaction: t });
    const byId = new Map(existing.map((o) => [o.id, o]));
    const changes: Record<string, unknown> = {};

    let states: OptionState[] = existing.map((o) => ({
      row: o,
      label: o.label,
      spec: parseJsonColumn<OptionSpec>(o.spec),
      takeoff: parseJsonColumn<TakeoffResult>(o.takeoff),
    }));
    if (input.options) {
      const fields: Record<string, string> = {};
      input.options.forEach((o, i) => {
        if (o.id !== undefined && !byId.has(o.id)) fields[`options.${i}.id`] = "This option is not on this revision";
      });
      if (Object.keys(fields).length) throw badRequest("Please check the highlighted fields", fields);
      states = input.options.map((o: OptionInput, i) => {
        const row = o.id !== undefined ? byId.get(o.id) : undefined;
        const before = row ? parseJsonColumn<OptionSpec>(row.spec) : null;
        const same = row && JSON.stringify(sortKeys(before)) === JSON.stringify(sortKeys(o.spec));
        return {
          row,
          label: o.label,
          spec: o.spec,
          takeoff: same ? parseJsonColumn<TakeoffResult>(row!.takeoff) : optionTakeoff(ctx.roof, ctx.site, ctx.book.rules, o.spec, `options.${i}.spec`),
        };
      });
      changes.options = { from: existing.map((o) => o.label), to: input.options.map((o) => o.label) };
    }

    const before = parseJsonColumn<RevisionInputs>(rev.inputs) ?? EMPTY_INPUTS;
    const inputs: RevisionInputs = {
      manualLines: input.manualLines ?? before.manualLines,
      overrides: input.overrides ?? before.overrides,
      discount: input.discount === undefined ? before.discount : input.discount,
    };
    // Lines and overrides for one option must name an option that stays on the revision.
    const kept = new Set(states.filter((s) => s.row).map((s) => s.row!.id));
    const fields: Record<string, string> = {};
    inputs.manualLines.forEach((m, i) => {
      if (m.optionId !== null && !kept.has(m.optionId)) fields[`manualLines.${i}.optionId`] = "This option is not on this revision";
    });
    inputs.overrides.forEach((o, i) => {
      if (o.optionId !== null && !kept.has(o.optionId)) fields[`overrides.${i}.optionId`] = "This option is not on this revision";
    });
    if (Object.keys(fields).length) throw badRequest("Please check the highlighted fields", fields);
    if (input.manualLines) changes.manualLines = { from: before.manualLines.length, to: inputs.manualLines.length };
    if (input.overrides) changes.overrides = { from: before.overrides.length, to: inputs.overrides.length };
    if (input.discount !== undefined) changes.discount = { from: before.discount, to: inputs.discount };
    if (input.notes !== undefined && (input.notes ?? null) !== rev.notes) changes.notes = { changed: true };

    const totalBefore = num(rev.totalCents);
    await this.writeOptions(rev, states, inputs, ctx, t);
    await rev.update(
      { version: rev.version + 1, inputs, ...(input.notes !== undefined ? { notes: input.notes || null } : {}) },
      { transaction: t },
    );
    quote.changed("updatedAt", true);
    await quote.save({ transaction: t });
    await this.audit(actor, quote, "updated", { revisionNo: rev.revisionNo, ...changes, totalCents: { from: totalBefore, to: num(rev.totalCents) } }, t);
    await this.refreshJobTotal(quote.jobId, t);
  }

  async recalculate(id: number, input: QuoteRecalculateInput, actor: Actor): Promise<void> {
    await this.sequelize.transaction(async (t) => {
      const { quote, rev, job } = await this.lockForEdit(id, actor, t);
      if (input.version !== rev.version) throw stale(rev.version);
      const ctx = await this.currentContext(job, t);
      const existing = await QuoteOption.findAll({ where: { revisionId: rev.id }, order: [["position", "ASC"]], transaction: t });
      const states = existing.map((o, i) => {
        const spec = parseJsonColumn<OptionSpec>(o.spec);
        return { row: o, label: o.label, spec, takeoff: optionTakeoff(ctx.roof, ctx.site, ctx.book.rules, spec, `options.${i}.spec`) };
      });
      const inputs = parseJsonColumn<RevisionInputs>(rev.inputs) ?? EMPTY_INPUTS;
      const totalBefore = num(rev.totalCents);
      this.applyContext(rev, ctx);
      await this.writeOptions(rev, states, inputs, ctx, t);
      await rev.update({ version: rev.version + 1 }, { transaction: t });
      quote.changed("updatedAt", true);
      await quote.save({ transaction: t });
      await this.audit(
        actor,
        quote,
        "recalculated",
        { revisionNo: rev.revisionNo, roofVersion: ctx.roofVersion, priceBookVersion: ctx.book.snapshot.priceBookVersion, totalCents: { from: totalBefore, to: num(rev.totalCents) } },
        t,
      );
      await this.refreshJobTotal(quote.jobId, t);
    });
  }

  async submit(id: number, input: QuoteSubmitInput, actor: Actor): Promise<void> {
    await this.sequelize.transaction((t) => this.submitIn(id, input, actor, t));
  }

  /** draft → in_review (owner or estimator), with optional notes to the owner. */
  async submitIn(id: number, input: QuoteSubmitInput, actor: Actor, t: Transaction): Promise<void> {
    const { quote, rev } = await this.lock(id, actor, t);
    if (rev.status !== "draft") throw invalidTransition(rev.status, "submitted for review");
    if (input.version !== rev.version) throw stale(rev.version);
    await rev.update(
      {
        status: "in_review",
        version: rev.version + 1,
        submittedAt: new Date(),
        submittedBy: actor.id,
        ...(input.notes !== undefined ? { notes: input.notes || null } : {}),
      },
      { transaction: t },
    );
    await quote.update({ status: "in_review" }, { transaction: t });
    await this.audit(actor, quote, "submitted", { revisionNo: rev.revisionNo, status: { from: "draft", to: "in_review" } }, t);
  }

  async approve(id: number, input: QuoteApproveInput, actor: Actor): Promise<void> {
    await this.sequelize.transaction((t) => this.approveIn(id, input, actor, t));
  }

  /**
   * in_review → approved, by an owner (their own quote too). A reason of 3+ characters is required when any
   * option is below the company's minimum margin or has overrides.
   */
  async approveIn(id: number, input: QuoteApproveInput, actor: Actor, t: Transaction): Promise<void> {
    const { quote, rev } = await this.lock(id, actor, t);
    if (rev.status !== "in_review") throw invalidTransition(rev.status, "approved");
    const options = await QuoteOption.findAll({ where: { revisionId: rev.id }, transaction: t });
    const below = options.some((o) => o.belowMinMargin);
    const overridden = options.some((o) => o.hasOverrides);
    const reason = input.reason?.trim() || null;
    if ((below || overridden) && (!reason || reason.length < APPROVAL_REASON_MIN)) {
      const why = [below ? `an option is below the ${num(rev.minMarginPct)} % minimum margin` : null, overridden ? "prices or quantities were overridden" : null]
        .filter(Boolean)
        .join(" and ");
      throw badRequest("Please check the highlighted fields", { reason: `Give a reason to approve: ${why} (at least ${APPROVAL_REASON_MIN} characters)` });
    }
    await rev.update({ status: "approved", version: rev.version + 1, approvedAt: new Date(), approvedBy: actor.id, approvalReason: reason }, { transaction: t });
    await quote.update({ status: "approved" }, { transaction: t });
    await Approval.create(
      { revisionId: rev.id, companyId: actor.companyId, ownerId: actor.id, decision: "approved", reasonOrComment: reason, marginPct: num(rev.marginPct) },
      { transaction: t },
    );
    await this.audit(
      actor,
      quote,
      "approved",
      { revisionNo: rev.revisionNo, status: { from: "in_review", to: "approved" }, reason, belowMinMargin: below, hasOverrides: overridden },
      t,
    );
  }

  async returnToDraft(id: number, input: QuoteReturnInput, actor: Actor): Promise<void> {
    await this.sequelize.transaction((t) => this.returnIn(id, input, actor, t));
  }

  /** in_review → draft (same revision, version + 1) with the owner's comment for the estimator. */
  async returnIn(id: number, input: QuoteReturnInput, actor: Actor, t: Transaction): Promise<void> {
    const { quote, rev } = await this.lock(id, actor, t);
    if (rev.status !== "in_review") throw invalidTransition(rev.status, "returned");
    await rev.update(
      { status: "draft", version: rev.version + 1, returnedAt: new Date(), returnedBy: actor.id, returnComment: input.comment },
      { transaction: t },
    );
    await quote.update({ status: "draft" }, { transaction: t });
    await Approval.create(
      { revisionId: rev.id, companyId: actor.companyId, ownerId: actor.id, decision: "returned", reasonOrComment: input.comment, marginPct: num(rev.marginPct) },
      { transaction: t },
    );
    await this.audit(actor, quote, "returned", { revisionNo: rev.revisionNo, status: { from: "in_review", to: "draft" }, comment: input.comment }, t);
  }

  async revise(id: number, actor: Actor): Promise<void> {
    await this.sequelize.transaction((t) => this.reviseIn(id, actor, t));
  }

  /**
   * A new draft revision from an approved, sent, declined or expired one: its options, manual lines,
   * overrides and discount copied, re-priced from the job's current roof and price book. The old revision
   * is left as it was. A lost job whose declined or expired quote is revised is estimating again.
   */
  async reviseIn(id: number, actor: Actor, t: Transaction): Promise<number> {
    const { quote, rev, job } = await this.lock(id, actor, t);
    if (!REVISABLE_STATUSES.includes(rev.status)) throw invalidTransition(rev.status, "revised");
    const ctx = await this.currentContext(job, t);
    const oldOptions = await QuoteOption.findAll({ where: { revisionId: rev.id }, order: [["position", "ASC"]], transaction: t });
    const oldInputs = parseJsonColumn<RevisionInputs>(rev.inputs) ?? EMPTY_INPUTS;
    const next = await this.newRevision(quote, rev.revisionNo + 1, ctx, EMPTY_INPUTS, null, actor, t);
    // Options first (their new ids), then the inputs with option ids mapped to the new rows.
    const states: OptionState[] = oldOptions.map((o, i) => {
      const spec = parseJsonColumn<OptionSpec>(o.spec);
      return { label: o.label, spec, takeoff: optionTakeoff(ctx.roof, ctx.site, ctx.book.rules, spec, `options.${i}.spec`) };
    });
    const rows = await this.createOptionRows(next, states, t);
    const idMap = new Map(oldOptions.map((o, i) => [o.id, rows[i].id]));
    const mapId = (x: number | null) => (x === null ? null : (idMap.get(x) ?? null));
    const inputs: RevisionInputs = {
      manualLines: oldInputs.manualLines.map((m) => ({ ...m, optionId: mapId(m.optionId) })),
      overrides: oldInputs.overrides.map((o) => ({ ...o, optionId: mapId(o.optionId) })),
      discount: oldInputs.discount,
    };
    await this.writeOptions(next, states.map((s, i) => ({ ...s, row: rows[i] })), inputs, ctx, t);
    await next.update({ inputs }, { transaction: t });
    await quote.update({ status: "draft", currentRevisionId: next.id }, { transaction: t });
    await this.audit(actor, quote, "revised", { fromRevisionNo: rev.revisionNo, fromStatus: rev.status, revisionNo: next.revisionNo, totalCents: num(next.totalCents) }, t);
    if (job.status === "lost" && (rev.status === "declined" || rev.status === "expired")) {
      await this.jobs.applyStatus(job, "estimating", `quote ${quote.number} revised`, actor, t);
    }
    await this.refreshJobTotal(quote.jobId, t);
    return next.id;
  }

  /** Archives or restores a quote; doing it twice changes nothing. */
  async setArchived(id: number, archived: boolean, actor: Actor): Promise<void> {
    await this.sequelize.transaction(async (t) => {
      const { quote } = await this.lock(id, actor, t, { allowArchived: true });
      if (Boolean(quote.archivedAt) === archived) return;
      await quote.update({ archivedAt: archived ? new Date() : null }, { transaction: t });
      await this.audit(actor, quote, archived ? "archived" : "restored", { number: quote.number }, t);
      await this.refreshJobTotal(quote.jobId, t);
    });
  }

  // ---- internals -----------------------------------------------------------------------------------

  /** Locks the job row, then the quote and its current revision. Archived quotes refuse writes. */
  private async lock(id: number, actor: Actor, t: Transaction, opts: { allowArchived?: boolean } = {}): Promise<Locked> {
    const found = await Quote.findOne({ where: { id, companyId: actor.companyId }, attributes: ["id", "jobId"], transaction: t });
    if (!found) throw notFound("Quote");
    const job = await Job.findOne({ where: { id: found.jobId, companyId: actor.companyId }, transaction: t, lock: t.LOCK.UPDATE });
    const quote = await Quote.findOne({ where: { id }, transaction: t, lock: t.LOCK.UPDATE });
    if (!job || !quote) throw notFound("Quote");
    if (quote.archivedAt && !opts.allowArchived) throw archivedQuote();
    const rev = await QuoteRevision.findOne({ where: { id: quote.currentRevisionId! }, transaction: t, lock: t.LOCK.UPDATE });
    if (!rev) throw notFound("Quote");
    return { quote, rev, job };
  }

  /** lock() for an edit of the draft's content: anything but a draft is 409 not_draft. */
  private async lockForEdit(id: number, actor: Actor, t: Transaction): Promise<Locked> {
    const locked = await this.lock(id, actor, t);
    if (locked.rev.status !== "draft") throw notDraft(locked.rev.status);
    return locked;
  }

  /** The job's stored roof (409 no_roof without one), its site and the company's current price book. */
  private async currentContext(job: Job, t: Transaction): Promise<PricingContext> {
    const roof = await Roof.findOne({ where: { jobId: job.id }, transaction: t });
    if (!roof) throw conflict("no_roof", "Measure the roof first: a quote is priced from the job's saved roof");
    const doc = parseJsonColumn<RoofDocument>(roof.document);
    const [pb, rules] = await Promise.all([priceBookForCompany(job.companyId, t), rulesForCompany(job.companyId, t)]);
    return {
      roof: { planes: doc.planes, stacks: doc.stacks, defaultStackId: doc.defaultStackId },
      roofVersion: roof.version,
      site: parseJsonColumn<JobSite>(job.site),
      book: { priceBook: pb.priceBook, rules, snapshot: pb.snapshot, unmappedKeys: pb.unmappedKeys, missingLabor: pb.missingLabor },
    };
  }

  /** What the revision was priced from. */
  private frozenContext(rev: QuoteRevision): PricingContext {
    return {
      roof: parseJsonColumn<RoofSnapshot>(rev.roofSnapshot),
      roofVersion: rev.roofVersion,
      site: parseJsonColumn<JobSite>(rev.siteSnapshot),
      book: parseJsonColumn<FrozenPriceBook>(rev.priceBookSnapshot),
    };
  }

  private applyContext(rev: QuoteRevision, ctx: PricingContext) {
    rev.roofVersion = ctx.roofVersion;
    rev.roofSnapshot = ctx.roof;
    rev.siteSnapshot = ctx.site;
    rev.priceBookSnapshot = ctx.book;
    rev.minMarginPct = ctx.book.priceBook.settings.minMarginPct;
  }

  private newRevision(quote: Quote, revisionNo: number, ctx: PricingContext, inputs: RevisionInputs, notes: string | null, actor: Actor, t: Transaction) {
    return QuoteRevision.create(
      {
        quoteId: quote.id,
        companyId: quote.companyId,
        revisionNo,
        status: "draft",
        version: 1,
        notes,
        roofVersion: ctx.roofVersion,
        roofSnapshot: ctx.roof,
        siteSnapshot: ctx.site,
        priceBookSnapshot: ctx.book,
        inputs,
        minMarginPct: ctx.book.priceBook.settings.minMarginPct,
        createdBy: actor.id,
      },
      { transaction: t },
    );
  }

  private createOptionRows(rev: QuoteRevision, states: OptionState[], t: Transaction): Promise<QuoteOption[]> {
    return Promise.all(
      states.map((s, i) =>
        QuoteOption.create(
          {
            revisionId: rev.id,
            position: i,
            label: s.label,
            spec: s.spec,
            takeoff: s.takeoff,
            costCents: 0,
            priceCents: 0,
            taxCents: 0,
            totalCents: 0,
            marginPct: 0,
            depositCents: 0,
            belowMinMargin: false,
            hasOverrides: false,
            missingItems: [],
            unmatchedOverrides: [],
          },
          { transaction: t },
        ),
      ),
    );
  }

  /**
   * Writes the revision's options (updating kept rows, creating new ones, deleting the others), prices
   * them with the context's price book and replaces their lines; the revision gets the first option's
   * total and margin and the context's minimum margin (saved here).
   */
  private async writeOptions(rev: QuoteRevision, states: OptionState[], inputs: RevisionInputs, ctx: PricingContext, t: Transaction) {
    const keepIds = states.filter((s) => s.row).map((s) => s.row!.id);
    const stale = await QuoteOption.findAll({ where: { revisionId: rev.id }, attributes: ["id"], transaction: t });
    const drop = stale.map((o) => o.id).filter((x) => !keepIds.includes(x));
    if (drop.length) {
      await QuoteLine.destroy({ where: { optionId: drop }, transaction: t });
      await QuoteOption.destroy({ where: { id: drop }, transaction: t });
    }
    const fresh = await this.createOptionRows(rev, states.filter((s) => !s.row), t);
    let k = 0;
    const rows = states.map((s) => s.row ?? fresh[k++]);
    const priced = priceOptions(
      rows.map((r, i) => ({ id: r.id, label: states[i].label, takeoff: states[i].takeoff })),
      ctx.site,
      inputs,
      ctx.book.priceBook,
    );
    await QuoteLine.destroy({ where: { optionId: rows.map((r) => r.id) }, transaction: t });
    const lines = priced.flatMap((p, i) =>
      p.lines.map((l, position) => ({
        optionId: rows[i].id,
        position,
        kind: l.kind,
        key: l.key ?? null,
        description: l.description.slice(0, 255),
        quantity: Math.round(l.quantity * 10_000) / 10_000,
        unit: l.unit,
        unitCostCents: l.unitCostCents,
        costCents: l.costCents,
        priceCents: l.priceCents,
        taxable: l.taxable,
        overrideReason: l.override?.reason ?? null,
      })),
    );
    if (lines.length) await QuoteLine.bulkCreate(lines, { transaction: t });
    for (const [i, row] of rows.entries()) {
      const p = priced[i];
      await row.update(
        {
          position: i,
          label: states[i].label,
          spec: states[i].spec,
          takeoff: states[i].takeoff,
          costCents: p.costCents,
          priceCents: p.priceCents,
          taxCents: p.taxCents,
          totalCents: p.totalCents,
          marginPct: round3(p.marginPct),
          depositCents: p.depositCents,
          belowMinMargin: p.belowMinMargin,
          hasOverrides: p.hasOverrides,
          missingItems: p.missingItems,
          unmatchedOverrides: p.unmatchedOverrides,
        },
        { transaction: t },
      );
    }
    rev.totalCents = priced[0]?.totalCents ?? 0;
    rev.marginPct = round3(priced[0]?.marginPct ?? 0);
    rev.minMarginPct = ctx.book.priceBook.settings.minMarginPct;
    await rev.save({ transaction: t });
  }

  async refreshJobTotal(jobId: number, t: Transaction) {
    await refreshJobQuoteTotal(this.sequelize, jobId, t);
  }

  private audit(actor: Actor, quote: Quote, action: string, changes: Record<string, unknown>, t: Transaction) {
    return recordAudit(
      { companyId: quote.companyId, actorId: actor.id, entityType: "quote", entityId: quote.id, jobId: quote.jobId, action, changes: { number: quote.number, ...changes } },
      t,
    );
  }
}

/** A spec with its keys in one order and undefined left out, to compare two specs. */
function sortKeys(spec: OptionSpec | null): Record<string, unknown> {
  return Object.fromEntries(Object.entries(spec ?? {}).filter(([, v]) => v !== undefined).sort(([a], [b]) => a.localeCompare(b)));
}

/**
 * jobs.quote_total_cents ← the option the homeowner accepted, when a proposal of the job was accepted;
 * else the job's latest live quote's current total; null without one.
 */
export async function refreshJobQuoteTotal(sequelize: Sequelize, jobId: number, t: Transaction): Promise<void> {
  const [accepted] = await sequelize.query(
    `SELECT o.total_cents AS total FROM proposals p JOIN quote_options o ON o.id = p.accepted_option_id
      WHERE p.job_id = ? AND p.status = 'accepted' ORDER BY p.accepted_at DESC, p.id DESC LIMIT 1`,
    { replacements: [jobId], transaction: t },
  );
  let total = (accepted as Array<{ total: string | number }>)[0]?.total;
  if (total === undefined) {
    const [rows] = await sequelize.query(
      `SELECT r.total_cents AS total FROM quotes q JOIN quote_revisions r ON r.id = q.current_revision_id
        WHERE q.job_id = ? AND q.archived_at IS NULL ORDER BY q.created_at DESC, q.id DESC LIMIT 1`,
      { replacements: [jobId], transaction: t },
    );
    total = (rows as Array<{ total: string | number }>)[0]?.total;
  }
  await Job.update({ quoteTotalCents: total === undefined ? null : Number(total) }, { where: { id: jobId }, transaction: t, silent: true });
}
