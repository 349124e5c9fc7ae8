/** Number formatting for `basis` strings: fixed decimals, thousands separators, no locale dependence. */
export function fmt(n: number, digits = 1): string {
  const neg = n < 0;
  const s = Math.abs(n).toFixed(digits);
  const [int, dec] = s.split(".");
  const withSep = int.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  const trimmed = dec ? `${withSep}.${dec}` : withSep;
  return (neg ? "-" : "") + trimmed;
}

/** Up to `digits` decimals, trailing zeros dropped (12 → "12", 3.5 → "3.5"). */
export function num(n: number, digits = 2): string {
  const r = Number(n.toFixed(digits));
  return fmt(r, (r.toString().split(".")[1] ?? "").length);
}

/** Waste multiplier as text: 10 → "1.10". */
export const wasteText = (pct: number) => (1 + pct / 100).toFixed(2);

export const plural = (n: number, one: string, many = `${one}s`) => (n === 1 ? one : many);

/** Round up with a small tolerance so float noise (3.0000000001) does not buy one more. */
export const ceilTol = (x: number) => Math.max(0, Math.ceil(x - 1e-9));
