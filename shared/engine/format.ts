/** Number formatting for `basis` strings: fixed decimals, thousands separators, no locale dependence. */

const POW10 = [1, 10, 100, 1000, 10000];

/**
 * x.toFixed(digits), the same text, for x ≥ 0 and digits 0 … 4, mostly without the call (toFixed runs in the
 * engine's runtime and is slow next to plain arithmetic; the takeoff's `basis` texts call it a few hundred
 * times).
 *
 * toFixed (ECMA-262 Number.prototype.toFixed) writes the integer N nearest to the exact P = x · 10^digits, the
 * larger of two equally near, with a point inserted. Here m = x · 10^digits is P rounded to a double, and its
 * fraction r = m − ⌊m⌋ is exact (m < 2^50). Rounding is monotonic and ⌊m⌋ + ½ is a double, so m lies on the
 * same side of ⌊m⌋ + ½ as P, or on it; near an integer either side of it rounds to that integer. So
 * N = r < ½ ? ⌊m⌋ : ⌊m⌋ + 1 whenever r ≠ ½. For margin, toFixed itself answers whenever r is within
 * m · 2^-50 + 2^-40 of ½ (eight times the rounding error of m and more), for m ≥ 2^50, and for NaN,
 * infinities, negative x and other digits. N's digits are then split at the point by integer arithmetic
 * (exact below 2^53). tests/shared/format.test.ts checks it against toFixed on random, half-way and
 * next-to-half-way numbers.
 */
export function toFixedFast(x: number, digits: number): string {
  if (!(x >= 0 && x < 1e15) || !(digits >= 0 && digits <= 4) || (digits | 0) !== digits) return x.toFixed(digits);
  const p = POW10[digits];
  const m = x * p;
  if (!(m < 1125899906842624)) return x.toFixed(digits); // 2^50
  const f = Math.floor(m);
  const r = m - f;
  const half = r - 0.5;
  if (Math.abs(half) <= m * 8.881784197001252e-16 + 9.094947017729282e-13) return x.toFixed(digits); // m·2^-50 + 2^-40
  const n = half < 0 ? f : f + 1;
  if (digits === 0) return String(n);
  const frac = n % p;
  const int = (n - frac) / p;
  // The fraction's digits with their leading zeros: p + frac has digits + 1 digits, the first a 1.
  return `${int}.${String(p + frac).slice(1)}`;
}

/** Fixed decimals with thousands separators: fmt(1234.56) → "1,234.6", fmt(-0.5, 2) → "-0.50". */
export function fmt(n: number, digits = 1): string {
  const a = Math.abs(n);
  const s = toFixedFast(a, digits);
  const dot = s.indexOf(".");
  const intLen = dot < 0 ? s.length : dot;
  let body = s;
  // Most figures are under 1,000: no separator to insert.
  if (intLen > 3) {
    // Below 10^21 the integer part is all digits: a comma before each group of three from the right. Else
    // (an exponent, NaN, Infinity) the general rule, which then inserts none.
    if (a < 1e21) {
      const head = intLen % 3 || 3;
      body = s.slice(0, head);
      for (let i = head; i < intLen; i += 3) body += "," + s.slice(i, i + 3);
      body += s.slice(intLen);
    } else body = s.slice(0, intLen).replace(/\B(?=(\d{3})+(?!\d))/g, ",") + s.slice(intLen);
  }
  return n < 0 ? "-" + body : body;
}

/** Up to `digits` decimals, trailing zeros dropped (12 → "12", 3.5 → "3.5"). */
export function num(n: number, digits = 2): string {
  // Whole numbers under 1,000 (most rule values: 3 in, 10 ft, 48 in) are their own shortest text; toFixed
  // would round nothing off them.
  if (Number.isInteger(n) && n < 1000 && n > -1000) return String(n);
  const r = Number(toFixedFast(n, digits));
  // Under 1,000 the shortest form is already the text (no separator, no exponent after rounding).
  if (Math.abs(r) < 1000) return String(r);
  return fmt(r, (r.toString().split(".")[1] ?? "").length);
}

/** Waste multiplier as text: 10 → "1.10". */
export const wasteText = (pct: number) => toFixedFast(1 + pct / 100, 2);

export const plural = (n: number, one: string, many = `${one}s`) => (n === 1 ? one : many);

/** Round up with a small tolerance so float noise (3.0000000001) does not buy one more. */
export const ceilTol = (x: number) => Math.max(0, Math.ceil(x - 1e-9));

/**
 * The last step of a quantity's basis, in words: "0.81, rounded up to 1 roll" (n = ceilTol(exact)), or just
 * "2 rolls" when the exact figure is already whole. `one` / `many` name the unit.
 */
export function roundedUp(exact: number, n: number, one: string, many = `${one}s`): string {
  const unit = plural(n, one, many);
  return Math.abs(exact - n) <= 1e-9 ? `${n} ${unit}` : `${fmt(exact, 2)}, rounded up to ${n} ${unit}`;
}

/** Wind zones in words, lowest first: "zone 3", "zones 2 and 3", "zones 1, 2 and 3". */
export function zoneListText(zones: readonly string[]): string {
  const z = [...zones].sort();
  if (z.length === 1) return `zone ${z[0]}`;
  return `zones ${z.slice(0, -1).join(", ")} and ${z[z.length - 1]}`;
}
