/**
 * Battens and counter-battens (common practice, no published source):
 * - battens: rows across the slope at the spacing measured along the slope, the first at the eave and the
 *   last at the top; each row as long as the plane is wide at that height;
 *   fasteners per row = ceil(row length / 24 in) + 1;
 * - counter-battens: runs up the slope at 24 in o.c. (across the slope, so plan = true spacing), the first
 *   at the plane's starting side and the last at the far side; each as long as the plane is at that line;
 * - stock pieces = ceil(LF × (1 + waste) / stock length), rounded once for the job.
 * Lumber sizes are dressed sizes (NIST PS 20), see ../lumber.ts.
 */
import { TOL } from "../constants";
import type { PlaneGeometry } from "../roof/geometry";
import { crossingsInto } from "../roof/polygon";
import { ceilTol } from "../format";

export interface BattenRow {
  /** Plan distance from the eave line, ft. */
  vFt: number;
  lengthFt: number;
  fasteners: number;
}

export interface BattenLayout {
  rows: BattenRow[];
  lf: number;
  fasteners: number;
}

const nudge = 1e-6;

/** Rows (or runs), total length and fasteners of one plane's battens or counter-battens. */
export interface BattenTotals {
  rows: number;
  lf: number;
  fasteners: number;
}

const CROSSINGS: number[] = [];

/** One line at `at` (clamped just inside lo … hi): its pieces added to `t` (and to `rows` when given). */
function layLine(g: PlaneGeometry, axis: 0 | 1, at: number, lo: number, hi: number, k: number, fastenerSpacingIn: number, t: BattenTotals, rows?: BattenRow[]): void {
  const xs = crossingsInto(g.local, axis, Math.min(Math.max(at, lo + nudge), hi - nudge), CROSSINGS);
  for (let i = 0; i + 1 < xs.length; i += 2) {
    const len = (xs[i + 1] - xs[i]) * k;
    if (!(len > TOL)) continue;
    const fasteners = ceilTol((len * 12) / fastenerSpacingIn) + 1;
    t.rows++;
    t.lf += len;
    t.fasteners += fasteners;
    rows?.push({ vFt: at, lengthFt: len, fasteners });
  }
}

/**
 * The lines of one layer: along v (axis 1, battens across the slope) or along s (axis 0, counter-battens up
 * the slope), placed from lo to hi at `step` (plan ft), the first at lo and the last at hi (none doubled near
 * hi), each line's pieces measured on the polygon and multiplied by `k` to true length. Adds each row to
 * `rows` when given.
 */
function layLines(g: PlaneGeometry, axis: 0 | 1, lo: number, hi: number, step: number, k: number, fastenerSpacingIn: number, rows?: BattenRow[]): BattenTotals {
  const t: BattenTotals = { rows: 0, lf: 0, fasteners: 0 };
  if (!(step > 0) || hi - lo <= TOL) {
    layLine(g, axis, lo, lo, hi, k, fastenerSpacingIn, t, rows);
    if (hi - lo > 0) layLine(g, axis, hi, lo, hi, k, fastenerSpacingIn, t, rows);
    return t;
  }
  for (let x = lo, j = 0; x < hi - TOL; x = lo + ++j * step) layLine(g, axis, x, lo, hi, k, fastenerSpacingIn, t, rows);
  layLine(g, axis, hi, lo, hi, k, fastenerSpacingIn, t, rows);
  return t;
}

/** Battens: rows across the slope at `spacingIn` along the slope. */
export function battenTotals(g: PlaneGeometry, spacingIn: number, fastenerSpacingIn = 24, rows?: BattenRow[]): BattenTotals {
  return layLines(g, 1, 0, g.vMax, spacingIn / 12 / g.slopeFactor, 1, fastenerSpacingIn, rows);
}

/** Counter-battens: runs up the slope at `spacingIn` across it. */
export function counterBattenTotals(g: PlaneGeometry, spacingIn: number, fastenerSpacingIn = 24, rows?: BattenRow[]): BattenTotals {
  return layLines(g, 0, g.sMin, g.sMax, spacingIn / 12, g.slopeFactor, fastenerSpacingIn, rows);
}

/** Battens with each row listed. */
export function battenRows(g: PlaneGeometry, spacingIn: number, fastenerSpacingIn = 24): BattenLayout {
  const rows: BattenRow[] = [];
  const t = battenTotals(g, spacingIn, fastenerSpacingIn, rows);
  return { rows, lf: t.lf, fasteners: t.fasteners };
}

/** Counter-battens with each run listed. */
export function counterBattenRuns(g: PlaneGeometry, spacingIn: number, fastenerSpacingIn = 24): BattenLayout {
  const rows: BattenRow[] = [];
  const t = counterBattenTotals(g, spacingIn, fastenerSpacingIn, rows);
  return { rows, lf: t.lf, fasteners: t.fasteners };
}

/** Stock pieces for a batten run total. */
export const battenPieces = (lf: number, wastePct: number, stockLengthFt: number): number => ceilTol((lf * (1 + wastePct / 100)) / stockLengthFt);
