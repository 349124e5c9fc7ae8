/** Money on screen: integer cents in, "$1,234.50" out; dollars typed by a person in, integer cents out. */

const usd = new Intl.NumberFormat("en-US", { style: "currency", currency: "USD" });
const usdWhole = new Intl.NumberFormat("en-US", { style: "currency", currency: "USD", maximumFractionDigits: 0 });

export function formatCents(cents: number | null | undefined, opts: { whole?: boolean } = {}): string {
  if (cents === null || cents === undefined || !Number.isFinite(cents)) return "—";
  return (opts.whole ? usdWhole : usd).format(cents / 100);
}

/** Cents as a plain dollar string for an input ("12.5" → "12.50"), "" for null. */
export function centsToInput(cents: number | null | undefined): string {
  if (cents === null || cents === undefined) return "";
  return (cents / 100).toFixed(2);
}

/**
 * "12.50", "$1,250", "0.5" → cents; null for blank; NaN for anything else (so a zod number check refuses it
 * with its own message).
 */
export function dollarsToCents(raw: unknown): number | null {
  if (typeof raw === "number") return Math.round(raw * 100);
  if (typeof raw !== "string") return null;
  const s = raw.trim().replace(/^\$/, "").replace(/,/g, "");
  if (s === "") return null;
  if (!/^-?(\d+(\.\d*)?|\.\d+)$/.test(s)) return Number.NaN;
  return Math.round(Number(s) * 100);
}

/** A number typed in an input: null for blank, NaN for garbage. */
export function parseNumber(raw: unknown): number | null {
  if (typeof raw === "number") return raw;
  if (typeof raw !== "string") return null;
  const s = raw.trim().replace(/,/g, "");
  if (s === "") return null;
  return /^-?(\d+(\.\d*)?|\.\d+)$/.test(s) ? Number(s) : Number.NaN;
}

export const formatPct = (p: number | null | undefined, digits = 1) =>
  p === null || p === undefined || !Number.isFinite(p) ? "—" : `${p.toFixed(digits)}%`;

export const formatDate = (iso: string | null | undefined) =>
  iso ? new Date(iso).toLocaleDateString("en-US", { year: "numeric", month: "short", day: "numeric" }) : "—";

export const formatDateTime = (iso: string | null | undefined) =>
  iso
    ? new Date(iso).toLocaleString("en-US", { month: "short", day: "numeric", year: "numeric", hour: "numeric", minute: "2-digit" })
    : "—";
