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

// One plane's edges for the lines of one layer (the engine is synchronous; a layer is laid before the next):
// for edge i, its start's coordinate across the lines (E_AX) and along them (E_O), and the differences to its
// end (E_DAX, E_DO); the end's coordinate across the lines (E_BAX). Read once per layer instead of once per
// line from the nested point arrays. X holds one line's crossings.
let E_AX = new Float64Array(16);
let E_O = new Float64Array(16);
let E_BAX = new Float64Array(16);
let E_DAX = new Float64Array(16);
let E_DO = new Float64Array(16);
let X = new Float64Array(16);
/** The line positions of the layer being laid (see linePositions). */
let AT = new Float64Array(64);

function loadEdges(poly: PlaneGeometry["local"], axis: 0 | 1): number {
  const n = poly.length;
  if (E_AX.length < n) {
    E_AX = new Float64Array(2 * n);
    E_O = new Float64Array(2 * n);
    E_BAX = new Float64Array(2 * n);
    E_DAX = new Float64Array(2 * n);
    E_DO = new Float64Array(2 * n);
    X = new Float64Array(2 * n);
  }
  const o = axis === 1 ? 0 : 1; // the coordinate measured along the line
  for (let i = 0; i < n; i++) {
    const p = poly[i];
    const q = poly[i + 1 < n ? i + 1 : 0];
    E_AX[i] = p[axis];
    E_O[i] = p[o];
    E_BAX[i] = q[axis];
    E_DAX[i] = q[axis] - p[axis];
    E_DO[i] = q[o] - p[o];
  }
  return n;
}

/**
 * One line at `at` (clamped just inside lo … hi) across the n edges loaded by loadEdges: its pieces added to
 * `t` (and to `rows` when given). The line's crossings with the edges, by the half-open rule (an edge counts
 * when its ends lie on either side of c, one of them possibly on it, so a line through a corner or along an
 * edge is counted once): x = a + (c − a⊥)·Δ / Δ⊥, sorted along the line; the inside lies between pairs.
 */
function layLine(n: number, at: number, lo: number, hi: number, k: number, fastenerSpacingIn: number, t: BattenTotals, rows?: BattenRow[]): void {
  const c = Math.min(Math.max(at, lo + nudge), hi - nudge);
  let nx = 0;
  for (let i = 0; i < n; i++) {
    const a = E_AX[i];
    if (a > c !== E_BAX[i] > c) {
      const x = E_O[i] + ((c - a) * E_DO[i]) / E_DAX[i];
      // insertion in order along the line (a handful of crossings)
      let j = nx - 1;
      while (j >= 0 && X[j] > x) {
        X[j + 1] = X[j];
        j--;
      }
      X[j + 1] = x;
      nx++;
    }
  }
  for (let i = 0; i + 1 < nx; i += 2) {
    const len = (X[i + 1] - X[i]) * k;
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
  const n = loadEdges(g.local, axis);
  // The positions first, then one call site for every line (V8 inlines it there, so no number is boxed per line).
  const m = linePositions(lo, hi, step);
  for (let q = 0; q < m; q++) layLine(n, AT[q], lo, hi, k, fastenerSpacingIn, t, rows);
  return t;
}

/**
 * The positions of one layer's lines into AT, in order; returns their count: lo, lo + step, … while below
 * hi − TOL, then hi; with no room for a step, lo and (when hi > lo) hi.
 */
function linePositions(lo: number, hi: number, step: number): number {
  if (!(step > 0) || hi - lo <= TOL) {
    AT[0] = lo;
    if (!(hi - lo > 0)) return 1;
    AT[1] = hi;
    return 2;
  }
  let m = 0;
  // `lo * 1` is lo exactly; as a product it keeps the loop variable an unboxed double in V8 (see fillStripStarts
  // in ../roof/panels).
  for (let x = lo * 1, j = 0; x < hi - TOL; x = lo + ++j * step) {
    if (m + 1 >= AT.length) {
      const grown = new Float64Array(2 * AT.length);
      grown.set(AT);
      AT = grown;
    }
    AT[m++] = x;
  }
  AT[m++] = hi;
  return m;
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
