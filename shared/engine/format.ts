/** Number formatting for `basis` strings: fixed decimals, thousands separators, no locale dependence. */
export function fmt(n: number, digits = 1): string {
  const s = Math.abs(n).toFixed(digits);
  const dot = s.indexOf(".");
  const intLen = dot < 0 ? s.length : dot;
  // Most figures are under 1,000: no separator to insert.
  const body = intLen <= 3 ? s : s.slice(0, intLen).replace(/\B(?=(\d{3})+(?!\d))/g, ",") + s.slice(intLen);
  return n < 0 ? "-" + body : body;
}

/** Up to `digits` decimals, trailing zeros dropped (12 → "12", 3.5 → "3.5"). */
export function num(n: number, digits = 2): string {
  // Whole numbers under 1,000 (most rule values: 3 in, 10 ft, 48 in) are their own shortest text; toFixed
  // would round nothing off them.
  if (Number.isInteger(n) && n < 1000 && n > -1000) return String(n);
  const r = Number(n.toFixed(digits));
  // Under 1,000 the shortest form is already the text (no separator, no exponent after rounding).
  if (Math.abs(r) < 1000) return String(r);
  return fmt(r, (r.toString().split(".")[1] ?? "").length);
}

/** Waste multiplier as text: 10 → "1.10". */
export const wasteText = (pct: number) => (1 + pct / 100).toFixed(2);

export const plural = (n: number, one: string, many = `${one}s`) => (n === 1 ? one : many);

/** Round up with a small tolerance so float noise (3.0000000001) does not buy one more. */
export const ceilTol = (x: number) => Math.max(0, Math.ceil(x - 1e-9));
