import type { TakeoffResult } from "../../shared/engine/takeoff";
import type {
  OptionSpec,
  QuoteDetail,
  QuoteLineDto,
  QuoteOptionDto,
  QuoteSummary,
  RevisionDetail,
  RevisionListItem,
} from "../../shared/schemas/quote";
import type { Quote, QuoteLine, QuoteOption, QuoteRevision, User } from "../models/index";
import type { FrozenPriceBook, RevisionInputs } from "../services/quote-pricing";
import { EMPTY_INPUTS, takeoffSummary } from "../services/quote-pricing";
import { parseJsonColumn } from "./job.presenter";

const n = (v: string | number | bigint | null | undefined) => (v === null || v === undefined ? 0 : Number(v));
const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);
const person = (u: User | null | undefined) => (u ? { id: u.id, name: u.name } : null);
const byPosition = <T extends { position: number; id: number }>(xs: T[] | undefined) =>
  [...(xs ?? [])].sort((a, b) => a.position - b.position || a.id - b.id);

export function presentLine(l: QuoteLine): QuoteLineDto {
  return {
    id: l.id,
    position: l.position,
    kind: l.kind,
    key: l.key,
    description: l.description,
    quantity: n(l.quantity),
    unit: l.unit,
    unitCostCents: n(l.unitCostCents),
    costCents: n(l.costCents),
    priceCents: n(l.priceCents),
    taxable: Boolean(l.taxable),
    overrideReason: l.overrideReason,
  };
}

export function presentOption(o: QuoteOption): QuoteOptionDto {
  return {
    id: o.id,
    position: o.position,
    label: o.label,
    spec: parseJsonColumn<OptionSpec>(o.spec) ?? {},
    totals: {
      costCents: n(o.costCents),
      priceCents: n(o.priceCents),
      taxCents: n(o.taxCents),
      totalCents: n(o.totalCents),
      marginPct: n(o.marginPct),
      depositCents: n(o.depositCents),
    },
    belowMinMargin: Boolean(o.belowMinMargin),
    hasOverrides: Boolean(o.hasOverrides),
    missingItems: parseJsonColumn<string[]>(o.missingItems) ?? [],
    unmatchedOverrides: parseJsonColumn<string[]>(o.unmatchedOverrides) ?? [],
    takeoffSummary: takeoffSummary(parseJsonColumn<TakeoffResult>(o.takeoff)),
    lines: byPosition(o.lines).map(presentLine),
  };
}

/** A revision loaded with revisionIncludes (options with lines, and the people). */
export function presentRevision(r: QuoteRevision): RevisionDetail {
  const options = byPosition(r.options).map(presentOption);
  const inputs = parseJsonColumn<RevisionInputs>(r.inputs) ?? EMPTY_INPUTS;
  const book = parseJsonColumn<FrozenPriceBook>(r.priceBookSnapshot);
  return {
    id: r.id,
    revisionNo: r.revisionNo,
    status: r.status,
    version: r.version,
    notes: r.notes,
    roofVersion: r.roofVersion,
    createdBy: person(r.creator),
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
    submittedAt: iso(r.submittedAt),
    submittedBy: person(r.submitter),
    approvedAt: iso(r.approvedAt),
    approvedBy: person(r.approver),
    approvalReason: r.approvalReason ?? null,
    returnedAt: iso(r.returnedAt),
    returnedBy: person(r.returner),
    returnComment: r.returnComment ?? null,
    priceBookVersion: book?.snapshot?.priceBookVersion ?? null,
    options,
    manualLines: inputs.manualLines,
    overrides: inputs.overrides,
    discount: inputs.discount,
    minMarginPct: n(r.minMarginPct),
    needsApprovalReason: options.some((o) => o.belowMinMargin || o.hasOverrides),
  };
}

export function presentQuoteDetail(q: Quote, rev: QuoteRevision, revisions: QuoteRevision[]): QuoteDetail {
  return {
    id: q.id,
    number: q.number,
    jobId: q.jobId,
    status: q.status,
    archived: q.archivedAt !== null && q.archivedAt !== undefined,
    createdAt: q.createdAt.toISOString(),
    updatedAt: q.updatedAt.toISOString(),
    revision: presentRevision(rev),
    revisions: revisions.map(
      (r): RevisionListItem => ({ id: r.id, revisionNo: r.revisionNo, status: r.status, totalCents: n(r.totalCents), createdAt: r.createdAt.toISOString() }),
    ),
  };
}

/** A quote with its current revision (options loaded). */
export function presentQuoteSummary(q: Quote, rev: QuoteRevision): QuoteSummary {
  return {
    id: q.id,
    number: q.number,
    status: q.status,
    revisionNo: rev.revisionNo,
    options: byPosition(rev.options).map((o) => ({ id: o.id, label: o.label, totalCents: n(o.totalCents) })),
    totalCents: n(rev.totalCents),
    marginPct: n(rev.marginPct),
    updatedAt: q.updatedAt.toISOString(),
    archived: q.archivedAt !== null && q.archivedAt !== undefined,
  };
}
