/** How jobs show on screen: squares, money, dates and the site's address. */

const squaresFmt = new Intl.NumberFormat("en-US", { minimumFractionDigits: 1, maximumFractionDigits: 1 });
const usd = new Intl.NumberFormat("en-US", { style: "currency", currency: "USD", maximumFractionDigits: 0 });
const usdCents = new Intl.NumberFormat("en-US", { style: "currency", currency: "USD" });
const dateTime = new Intl.DateTimeFormat("en-US", { dateStyle: "medium", timeStyle: "short" });
const dateOnly = new Intl.DateTimeFormat("en-US", { month: "short", day: "numeric", year: "numeric" });
const timeOnly = new Intl.DateTimeFormat("en-US", { hour: "numeric", minute: "2-digit" });

export const DASH = "—";

/** 28.4 → "28.4"; null (no saved roof yet) → "—". */
export function formatSquares(sq: number | null | undefined): string {
  return sq === null || sq === undefined || !Number.isFinite(sq) ? DASH : squaresFmt.format(sq);
}

/** Whole dollars for the board ($18,450); with `cents` the exact amount. */
export function formatMoney(cents: number | null | undefined, opts: { cents?: boolean } = {}): string {
  if (cents === null || cents === undefined || !Number.isFinite(cents)) return DASH;
  return (opts.cents ? usdCents : usd).format(cents / 100);
}

export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return DASH;
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? DASH : dateTime.format(d);
}

/**
 * A short "last change" for dense tables: the time today, "Yesterday", otherwise the date.
 * `now` is a parameter so the output is testable.
 */
export function formatShortDate(iso: string | null | undefined, now: Date = new Date()): string {
  if (!iso) return DASH;
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return DASH;
  const startOfDay = (x: Date) => new Date(x.getFullYear(), x.getMonth(), x.getDate()).getTime();
  const days = Math.round((startOfDay(now) - startOfDay(d)) / 86_400_000);
  if (days === 0) return `Today ${timeOnly.format(d)}`;
  if (days === 1) return "Yesterday";
  return dateOnly.format(d);
}

type Address = {
  siteAddressLine1?: string | null;
  siteAddressLine2?: string | null;
  siteCity?: string | null;
  siteRegion?: string | null;
  sitePostalCode?: string | null;
};

/** "14 Quarry Lane, Millbrook" (street and city), or "" when none is recorded. */
export function shortSite(a: Address): string {
  return [a.siteAddressLine1, a.siteCity].filter(Boolean).join(", ");
}

/** The full address on one line. */
export function fullSite(a: Address): string {
  const cityLine = [a.siteCity, [a.siteRegion, a.sitePostalCode].filter(Boolean).join(" ")].filter(Boolean).join(", ");
  return [a.siteAddressLine1, a.siteAddressLine2, cityLine].filter(Boolean).join(", ");
}
