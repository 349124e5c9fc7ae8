/**
 * Quotes, revisions, options and the owner's approval: the bodies of every quote route and the DTOs they
 * return. Money is integer cents, percentages plain numbers (35.5), dates ISO strings.
 *
 * - POST /api/jobs/:jobId/quotes     quoteCreateSchema        → 201 { data: QuoteDetail }
 * - GET  /api/jobs/:jobId/quotes                              → { data: QuoteSummary[] }
 * - GET  /api/quotes/:id                                      → { data: QuoteDetail }
 * - GET  /api/quotes/:id/revisions/:revisionNo                → { data: RevisionDetail }
 * - PATCH /api/quotes/:id            quotePatchSchema         → { data: QuoteDetail } (draft only)
 * - POST /api/quotes/:id/recalculate quoteRecalculateSchema   → { data: QuoteDetail } (draft only)
 * - POST /api/quotes/:id/submit      quoteSubmitSchema        draft → in_review
 * - POST /api/quotes/:id/approve     quoteApproveSchema       in_review → approved (owner)
 * - POST /api/quotes/:id/return      quoteReturnSchema        in_review → draft (owner)
 * - POST /api/quotes/:id/revise                               approved|sent|declined|expired → new draft revision
 * - POST /api/quotes/:id/archive, /restore
 * - GET  /api/approvals                                       → { data: ApprovalQueueItem[] } (owner)
 */
import { z } from "zod";
import { applySpacerAndFoil } from "../engine/stack-options";
import type { StackInput } from "./takeoff";

export const QUOTE_STATUSES = ["draft", "in_review", "approved", "sent", "accepted", "declined", "expired"] as const;
export type QuoteStatus = (typeof QUOTE_STATUSES)[number];

/** States a new draft revision can be made from (POST /revise). */
export const REVISABLE_STATUSES: readonly QuoteStatus[] = ["approved", "sent", "declined", "expired"];

export const QUOTE_LINE_KINDS = ["material", "labor", "tearoff", "deck", "manual", "discount"] as const;
export type QuoteLineKind = (typeof QUOTE_LINE_KINDS)[number];

export const APPROVAL_DECISIONS = ["approved", "returned"] as const;
export type ApprovalDecision = (typeof APPROVAL_DECISIONS)[number];

export const MAX_QUOTE_OPTIONS = 5;
export const MAX_MANUAL_LINES = 50;
export const MAX_OVERRIDES = 100;
/** Largest amount a manual line, override or discount may carry (one million dollars). */
export const MAX_LINE_CENTS = 100_000_000;

/** The spacer choices of an option (the gap study's five). */
export const QUOTE_SPACERS = ["none", "battens", "counter-battens", "mesh", "dimpled"] as const;
export type QuoteSpacer = (typeof QUOTE_SPACERS)[number];

const cents = (what = "Amount") =>
  z
    .number({ error: "Enter an amount in cents" })
    .int(`${what} must be whole cents`)
    .min(0, "Must be 0 or more")
    .max(MAX_LINE_CENTS, `At most ${MAX_LINE_CENTS} cents`);

const version = z.number({ error: "Required" }).int("Must be a whole number").min(1, "Must be 1 or more");

const notes = z.string().trim().max(4000, "Use at most 4000 characters");

/**
 * What one option changes in the roof's assemblies, applied to every plane's stack:
 * `stackId` puts every plane on that assembly, `spacer` swaps the spacer (as the gap study does),
 * `foil` adds (true) or removes (false) the foil radiant barrier. An empty spec is the roof as designed.
 */
export const optionSpecSchema = z.strictObject({
  spacer: z.enum(QUOTE_SPACERS, { error: `Pick one of ${QUOTE_SPACERS.join(", ")}` }).optional(),
  foil: z.boolean({ error: "Must be true or false" }).optional(),
  stackId: z.string().trim().min(1, "Required").max(60, "Use at most 60 characters").optional(),
});
export type OptionSpec = z.output<typeof optionSpecSchema>;

export const optionInputSchema = z.object({
  /** An existing option of this revision (PATCH keeps its id); left out for a new option. */
  id: z.number().int().positive().optional(),
  label: z.string({ error: "Required" }).trim().min(1, "Required").max(80, "Use at most 80 characters"),
  spec: optionSpecSchema.default({}),
});
export type OptionInput = z.output<typeof optionInputSchema>;

const options = z
  .array(optionInputSchema, { error: "Required" })
  .min(1, "Add at least one option")
  .max(MAX_QUOTE_OPTIONS, `At most ${MAX_QUOTE_OPTIONS} options`)
  .superRefine((opts, ctx) => {
    const seen = new Set<number>();
    opts.forEach((o, i) => {
      if (o.id === undefined) return;
      if (seen.has(o.id)) ctx.addIssue({ code: "custom", message: "This option is listed twice", path: [i, "id"] });
      seen.add(o.id);
    });
  });

export const manualLineSchema = z.object({
  /** The option the line belongs to; null or left out: every option. */
  optionId: z.number().int().positive().nullable().default(null),
  description: z.string({ error: "Required" }).trim().min(1, "Required").max(200, "Use at most 200 characters"),
  quantity: z.number({ error: "Enter a number" }).positive("Must be more than 0").max(100_000, "At most 100000"),
  unitPriceCents: cents("The price"),
  unitCostCents: cents("The cost").optional(),
  taxable: z.boolean().default(false),
});
export type ManualLineInput = z.output<typeof manualLineSchema>;

export const overrideSchema = z
  .object({
    /** The option it applies to; null or left out: every option. */
    optionId: z.number().int().positive().nullable().default(null),
    /** The line's key: a material key ("panel-standing-seam"), "labor:<band id>", "tearoff" or "deck". */
    key: z.string({ error: "Required" }).trim().min(1, "Required").max(80, "Use at most 80 characters"),
    unitCostCents: cents("The cost").optional(),
    quantity: z.number({ error: "Enter a number" }).min(0, "Must be 0 or more").max(1_000_000, "At most 1000000").optional(),
    reason: z.string({ error: "Say why" }).trim().min(3, "Say why (at least 3 characters)").max(500, "Use at most 500 characters"),
  })
  .refine((o) => o.unitCostCents !== undefined || o.quantity !== undefined, {
    message: "Change the unit cost, the quantity or both",
    path: ["unitCostCents"],
  });
export type OverrideInput = z.output<typeof overrideSchema>;

export const discountSchema = z.object({
  amountCents: cents("The discount").min(1, "Must be more than 0"),
  reason: z.string({ error: "Say why" }).trim().min(3, "Say why (at least 3 characters)").max(200, "Use at most 200 characters"),
});
export type DiscountInput = z.output<typeof discountSchema>;

const duplicateOverrides = (list: OverrideInput[] | undefined, ctx: z.RefinementCtx) => {
  const seen = new Set<string>();
  (list ?? []).forEach((o, i) => {
    const k = `${o.optionId ?? "all"}|${o.key}`;
    if (seen.has(k)) ctx.addIssue({ code: "custom", message: "This line already has an override", path: ["overrides", i, "key"] });
    seen.add(k);
  });
};

/** POST /api/jobs/:jobId/quotes. No options: one option "As designed" with spec {}. */
export const quoteCreateSchema = z.object({
  options: options.optional(),
  notes: notes.optional(),
});
export type QuoteCreateInput = z.output<typeof quoteCreateSchema>;

/** PATCH /api/quotes/:id (draft only): every field but `version` optional; left out = unchanged. */
export const quotePatchSchema = z
  .object({
    version,
    notes: notes.nullable().optional(),
    options: options.optional(),
    manualLines: z.array(manualLineSchema).max(MAX_MANUAL_LINES, `At most ${MAX_MANUAL_LINES} manual lines`).optional(),
    overrides: z.array(overrideSchema).max(MAX_OVERRIDES, `At most ${MAX_OVERRIDES} overrides`).optional(),
    discount: discountSchema.nullable().optional(),
  })
  .superRefine((v, ctx) => duplicateOverrides(v.overrides, ctx));
export type QuotePatchInput = z.output<typeof quotePatchSchema>;
export type QuotePatchValues = z.input<typeof quotePatchSchema>;

export const quoteSubmitSchema = z.object({ version, notes: notes.optional() });
export type QuoteSubmitInput = z.output<typeof quoteSubmitSchema>;

export const quoteRecalculateSchema = z.object({ version });
export type QuoteRecalculateInput = z.output<typeof quoteRecalculateSchema>;

/** The reason is required (3+ characters) when any option is below the minimum margin or has overrides. */
export const quoteApproveSchema = z.object({
  reason: z.string().trim().max(1000, "Use at most 1000 characters").optional(),
});
export type QuoteApproveInput = z.output<typeof quoteApproveSchema>;
export const APPROVAL_REASON_MIN = 3;

export const quoteReturnSchema = z.object({
  comment: z
    .string({ error: "Tell the estimator what to change" })
    .trim()
    .min(3, "Tell the estimator what to change (at least 3 characters)")
    .max(2000, "Use at most 2000 characters"),
});
export type QuoteReturnInput = z.output<typeof quoteReturnSchema>;

export const quoteListQuerySchema = z.object({
  archived: z.enum(["0", "1", "all"]).default("0"),
});
export type QuoteListQuery = z.output<typeof quoteListQuerySchema>;

// ---- applying an option's spec to the roof's assemblies -----------------------------------------------

/** The stack with the option's spacer (as the gap study swaps it) and foil applied. */
export function applySpecToStack(stack: StackInput, spec: OptionSpec): StackInput {
  return applySpacerAndFoil(stack, spec);
}

/**
 * The roof with the option applied: every plane on `spec.stackId` when given, and every stack (the ones
 * the planes use) with the spacer and foil of the spec. Returns an error message when the stack is unknown.
 */
export function applySpecToRoof<P extends { stackId?: string }>(
  roof: { planes: P[]; stacks: StackInput[]; defaultStackId: string },
  spec: OptionSpec,
): { planes: P[]; stacks: StackInput[]; defaultStackId: string } | { error: string } {
  let { planes, defaultStackId } = roof;
  if (spec.stackId !== undefined) {
    if (!roof.stacks.some((s) => s.id === spec.stackId)) return { error: `The roof has no assembly "${spec.stackId}"` };
    planes = planes.map((p) => ({ ...p, stackId: spec.stackId }));
    defaultStackId = spec.stackId;
  }
  return { planes, stacks: roof.stacks.map((s) => applySpecToStack(s, spec)), defaultStackId };
}

// ---- DTOs -------------------------------------------------------------------------------------------

export interface Person {
  id: number;
  name: string;
}

export interface QuoteLineDto {
  id: number;
  position: number;
  kind: QuoteLineKind;
  key: string | null;
  description: string;
  quantity: number;
  unit: string;
  unitCostCents: number;
  costCents: number;
  priceCents: number;
  taxable: boolean;
  overrideReason: string | null;
}

export interface OptionTotals {
  costCents: number;
  priceCents: number;
  taxCents: number;
  totalCents: number;
  marginPct: number;
  depositCents: number;
}

export interface TakeoffSummary {
  squares: number;
  panelCount: number;
  advisories: { error: number; warning: number; info: number };
}

export interface QuoteOptionDto {
  id: number;
  position: number;
  label: string;
  spec: OptionSpec;
  totals: OptionTotals;
  belowMinMargin: boolean;
  hasOverrides: boolean;
  missingItems: string[];
  /** Overrides that matched no line of this option (kept, but they change nothing). */
  unmatchedOverrides: string[];
  takeoffSummary: TakeoffSummary;
  lines: QuoteLineDto[];
}

export interface RevisionDetail {
  id: number;
  revisionNo: number;
  status: QuoteStatus;
  version: number;
  notes: string | null;
  roofVersion: number;
  createdBy: Person | null;
  createdAt: string;
  updatedAt: string;
  submittedAt: string | null;
  submittedBy: Person | null;
  approvedAt: string | null;
  approvedBy: Person | null;
  approvalReason: string | null;
  returnedAt: string | null;
  returnedBy: Person | null;
  returnComment: string | null;
  /** The price-book version the revision was priced with. */
  priceBookVersion: number | null;
  options: QuoteOptionDto[];
  manualLines: ManualLineInput[];
  overrides: OverrideInput[];
  discount: DiscountInput | null;
  minMarginPct: number;
  needsApprovalReason: boolean;
}

export interface RevisionListItem {
  id: number;
  revisionNo: number;
  status: QuoteStatus;
  totalCents: number;
  createdAt: string;
}

export interface QuoteDetail {
  id: number;
  number: string;
  jobId: number;
  status: QuoteStatus;
  archived: boolean;
  createdAt: string;
  updatedAt: string;
  revision: RevisionDetail;
  revisions: RevisionListItem[];
}

export interface QuoteSummary {
  id: number;
  number: string;
  status: QuoteStatus;
  revisionNo: number;
  options: Array<{ id: number; label: string; totalCents: number }>;
  totalCents: number;
  marginPct: number;
  updatedAt: string;
  archived: boolean;
}

export interface ApprovalQueueItem {
  quoteId: number;
  number: string;
  jobId: number;
  customerName: string;
  siteAddress: string;
  revisionNo: number;
  submittedAt: string;
  submittedBy: Person | null;
  estimator: Person | null;
  options: Array<{ label: string; totalCents: number; marginPct: number }>;
  lowestMarginPct: number;
  minMarginPct: number;
  belowMinMargin: boolean;
  overridesCount: number;
  notes: string | null;
}
