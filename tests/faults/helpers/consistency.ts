/**
 * "No half-written rows" checks, read straight from the database after a drill: every stored roof is one
 * complete version (document, takeoff, jobs.squares and its audit trail agree), every quote has its
 * revision, options and lines and its audit row.
 */
import { isDeepStrictEqual } from "node:util";
import { Op } from "sequelize";
import { AuditEvent, Job, Quote, QuoteLine, QuoteOption, QuoteRevision, Roof } from "../../../server/models/index";
import { parseJsonColumn } from "../../../server/presenters/job.presenter";
import { computeStoredTakeoff, takeoffSquares, type StoredTakeoff } from "../../../server/services/roof-takeoff";
import type { RoofDocument } from "../../../shared/schemas/roof";
import type { JobSite } from "../../../shared/schemas/job";

export interface RoofState {
  jobId: number;
  version: number;
  planes: number;
  /** The roof's audit rows' `version.to`, oldest first. */
  auditVersions: number[];
}

/** Problems with one job's stored roof (an empty list when it is one complete version). */
export async function roofProblems(jobId: number): Promise<{ problems: string[]; state: RoofState | null }> {
  const problems: string[] = [];
  const job = await Job.findByPk(jobId);
  if (!job) return { problems: [`job ${jobId} is missing`], state: null };
  const roof = await Roof.findOne({ where: { jobId } });
  const audits = await AuditEvent.findAll({ where: { entityType: "roof", jobId }, order: [["id", "ASC"]] });
  const auditVersions = audits.map((a) => Number((parseJsonColumn<{ version?: { to?: number } }>(a.changes) ?? {}).version?.to));
  if (!roof) {
    if (audits.length) problems.push(`job ${jobId}: ${audits.length} roof audit row(s) but no roof`);
    return { problems, state: null };
  }
  const doc = parseJsonColumn<RoofDocument>(roof.document);
  const stored = parseJsonColumn<StoredTakeoff>(roof.takeoff);
  const expected = await computeStoredTakeoff(doc, parseJsonColumn<JobSite>(job.site), job.companyId);
  if (!isDeepStrictEqual(JSON.parse(JSON.stringify(expected)), stored)) {
    problems.push(`job ${jobId}: the stored takeoff is not the engine's result for the stored planes (version ${roof.version})`);
  }
  const squares = takeoffSquares(stored);
  if (job.squares !== null && squares !== null && Math.abs(Number(job.squares) - squares) > 0.005) {
    problems.push(`job ${jobId}: jobs.squares ${job.squares} but the stored takeoff says ${squares}`);
  }
  const want = Array.from({ length: roof.version }, (_, i) => i + 1);
  if (!isDeepStrictEqual(auditVersions, want)) {
    problems.push(`job ${jobId}: roof version ${roof.version} but the audit rows record versions [${auditVersions.join(", ")}]`);
  }
  return { problems, state: { jobId, version: roof.version, planes: doc.planes.length, auditVersions } };
}

/** Problems with a company's quotes: each one whole (revision → options → lines) and audited once. */
export async function quoteProblems(companyId: number): Promise<{ problems: string[]; quotes: number }> {
  const problems: string[] = [];
  const quotes = await Quote.findAll({ where: { companyId } });
  for (const q of quotes) {
    const revs = await QuoteRevision.findAll({ where: { quoteId: q.id } });
    if (!revs.length || !q.currentRevisionId || !revs.some((r) => r.id === q.currentRevisionId)) {
      problems.push(`quote ${q.id}: no current revision`);
      continue;
    }
    const options = await QuoteOption.findAll({ where: { revisionId: { [Op.in]: revs.map((r) => r.id) } } });
    if (!options.length) problems.push(`quote ${q.id}: a revision without options`);
    for (const o of options) {
      if ((await QuoteLine.count({ where: { optionId: o.id } })) === 0) problems.push(`quote ${q.id}: option ${o.id} without lines`);
    }
    const created = await AuditEvent.count({ where: { entityType: "quote", entityId: String(q.id), action: "created" } });
    if (created !== 1) problems.push(`quote ${q.id}: ${created} "created" audit rows`);
  }
  const audited = await AuditEvent.count({ where: { companyId, entityType: "quote", action: "created" } });
  if (audited !== quotes.length) problems.push(`${audited} quote "created" audit rows for ${quotes.length} quotes`);
  const orphanRevs = await QuoteRevision.count({ where: { companyId, quoteId: { [Op.notIn]: quotes.length ? quotes.map((q) => q.id) : [0] } } });
  if (orphanRevs) problems.push(`${orphanRevs} revision(s) without their quote`);
  return { problems, quotes: quotes.length };
}
