/**
 * The proposal document: what the homeowner receives. The PDF (server/pdf/proposal-pdf.ts) and the
 * homeowner's web page (/p/:token) both render this one DTO, so they show the same content.
 *
 * Money is integer cents, dates ISO strings, plan coordinates feet (x east, y north), pitch rise per 12.
 * The formatters at the end of this file are the ones both renderers use.
 */
import { z } from "zod";

const text = z.string();
const nullableText = z.string().nullable();

export const PROPOSAL_STATUSES = ["draft", "in_review", "approved", "sent", "accepted", "declined", "expired"] as const;

export const proposalCompanySchema = z.object({
  name: text,
  legalName: nullableText,
  licenceNumber: nullableText,
  /** Street, then "City, Region Postal" (empty lines left out). */
  addressLines: z.array(text),
  phone: nullableText,
  email: nullableText,
  website: nullableText,
  /** A PNG or JPEG as a data: URL; null → the renderer draws its own mark from the initials. */
  logoDataUrl: nullableText,
});
export type ProposalCompany = z.infer<typeof proposalCompanySchema>;

export const proposalPersonSchema = z.object({
  name: text,
  email: nullableText,
  phone: nullableText,
  addressLines: z.array(text),
});

export const proposalPlaneRefSchema = z.object({
  id: text,
  /** 1-based number used in the plan drawing and the lists. */
  number: z.number().int(),
  name: text,
  pitch: z.number(),
  squares: z.number(),
});
export type ProposalPlaneRef = z.infer<typeof proposalPlaneRefSchema>;

/** One sentence group of the layer stack, from the deck up. */
export const scopeLayerSchema = z.object({
  /** Short heading: "Roof deck", "Underlayment", "Air gap", … */
  title: text,
  /** Plain-language sentences a homeowner understands. */
  sentences: z.array(text),
});
export type ScopeLayer = z.infer<typeof scopeLayerSchema>;

export const scopeAreaSchema = z.object({
  stackId: text,
  title: text,
  planes: z.array(proposalPlaneRefSchema),
  squares: z.number(),
  layers: z.array(scopeLayerSchema),
});
export type ScopeArea = z.infer<typeof scopeAreaSchema>;

export const planPlaneSchema = z.object({
  id: text,
  number: z.number().int(),
  name: text,
  pitch: z.number(),
  outline: z.array(z.tuple([z.number(), z.number()])),
  /** Edge i runs from outline[i] to outline[i + 1]. */
  eaveEdge: z.number().int(),
});
export type PlanPlane = z.infer<typeof planPlaneSchema>;

export const proposalOptionSchema = z.object({
  id: text,
  label: text,
  /** Plain-language list of what differs from the first option (the first lists what it is). */
  differences: z.array(text),
  priceCents: z.number().int(),
  taxCents: z.number().int(),
  totalCents: z.number().int(),
  depositCents: z.number().int(),
});
export type ProposalOption = z.infer<typeof proposalOptionSchema>;

export const proposalAcceptanceSchema = z.object({
  signerName: text,
  acceptedAt: text,
  optionId: text,
  optionLabel: text,
});

export const proposalDocSchema = z.object({
  company: proposalCompanySchema,
  proposalNumber: text,
  revisionNo: z.number().int(),
  /** Date of issue and the last day the prices hold (ISO dates, YYYY-MM-DD). */
  date: text,
  validUntil: text,
  homeowner: proposalPersonSchema,
  siteAddressLines: z.array(text),
  /** Opening paragraph. */
  introduction: text,
  scope: z.object({
    /** Work done before the layers (tear-off) and general notes, plain language. */
    preparation: z.array(text),
    areas: z.array(scopeAreaSchema),
    totalSquares: z.number(),
  }),
  plan: z.object({ planes: z.array(planPlaneSchema) }),
  options: z.array(proposalOptionSchema).min(1),
  depositPct: z.number(),
  paymentTerms: z.array(text),
  exclusions: z.array(text),
  warranty: z.array(text),
  cautions: z.object({
    items: z.array(z.object({ title: text, text })),
    governs: text,
  }),
  acceptUrl: text,
  status: z.enum(PROPOSAL_STATUSES),
  acceptance: proposalAcceptanceSchema.nullable(),
});
export type ProposalDocDto = z.infer<typeof proposalDocSchema>;

// ---------------------------------------------------------------------------------------------------
// formatting (the trade's conventions; no locale dependence so server and browser print the same)
// ---------------------------------------------------------------------------------------------------

const groups = (digits: string) => digits.replace(/\B(?=(\d{3})+(?!\d))/g, ",");

/** 1234567 → "$12,345.67"; negative amounts "-$12.00". */
export function formatMoney(cents: number): string {
  const c = Math.round(cents);
  const abs = Math.abs(c);
  const dollars = Math.floor(abs / 100);
  const rest = String(abs % 100).padStart(2, "0");
  return `${c < 0 ? "-" : ""}$${groups(String(dollars))}.${rest}`;
}

/** Whole dollars when there are no cents: "$3,700"; otherwise formatMoney. */
export function formatMoneyShort(cents: number): string {
  return Math.round(cents) % 100 === 0 ? formatMoney(cents).slice(0, -3) : formatMoney(cents);
}

/** Feet-inches to the nearest inch: 12.5 → 12' 6"; 0.25 → 3"; 7 → 7' 0". */
export function formatFeetInches(feet: number): string {
  const totalIn = Math.round(feet * 12);
  const neg = totalIn < 0;
  const a = Math.abs(totalIn);
  const ft = Math.floor(a / 12);
  const inch = a % 12;
  const s = ft === 0 ? `${inch}"` : `${groups(String(ft))}' ${inch}"`;
  return neg ? `-${s}` : s;
}

/** Whole inches as feet-inches: 281 → 23' 5". */
export const formatInchesAsFeet = (inches: number) => formatFeetInches(inches / 12);

/** Squares (100 ft² of roof) to one decimal: 24.63 → "24.6", 1234.56 → "1,234.6". */
export function formatSquares(sq: number): string {
  const [int, dec] = (Math.round(sq * 10) / 10).toFixed(1).split(".");
  return `${int.startsWith("-") ? "-" + groups(int.slice(1)) : groups(int)}.${dec}`;
}

/** Pitch as rise per 12: 6 → "6/12", 4.5 → "4.5/12". */
export const formatPitch = (p: number) => `${Number(p.toFixed(2))}/12`;

/** Percent without trailing zeros: 30 → "30%", 33.5 → "33.5%". */
export const formatPercent = (p: number) => `${Number(p.toFixed(2))}%`;

const MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

/** "2026-03-05" or a full ISO time → "March 5, 2026" (the calendar date as written, no time-zone shift). */
export function formatDate(iso: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})/.exec(iso);
  if (!m) return iso;
  return `${MONTHS[Number(m[2]) - 1]} ${Number(m[3])}, ${m[1]}`;
}

/** An ISO time → "March 5, 2026, 14:07 UTC". */
export function formatDateTimeUtc(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  const hh = String(d.getUTCHours()).padStart(2, "0");
  const mm = String(d.getUTCMinutes()).padStart(2, "0");
  return `${formatDate(d.toISOString())}, ${hh}:${mm} UTC`;
}
