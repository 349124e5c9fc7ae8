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
import { eachCrossSection } from "../roof/polygon";
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

/** Sample positions from lo to hi at `step`, the first at lo and the last at hi (no duplicate near hi). */
function positions(lo: number, hi: number, step: number): number[] {
  const out: number[] = [];
  if (!(step > 0) || hi - lo <= TOL) return hi - lo > 0 ? [lo, hi] : [lo];
  for (let x = lo, j = 0; x < hi - TOL; x = lo + ++j * step) out.push(x);
  out.push(hi);
  return out;
}

export function battenRows(g: PlaneGeometry, spacingIn: number, fastenerSpacingIn = 24): BattenLayout {
  const stepPlan = spacingIn / 12 / g.slopeFactor;
  const rows: BattenRow[] = [];
  for (const v of positions(0, g.vMax, stepPlan)) {
    const c = Math.min(Math.max(v, nudge), g.vMax - nudge);
    eachCrossSection(g.local, 1, c, (len) => {
      if (len > TOL) rows.push({ vFt: v, lengthFt: len, fasteners: ceilTol((len * 12) / fastenerSpacingIn) + 1 });
    });
  }
  return { rows, lf: rows.reduce((t, r) => t + r.lengthFt, 0), fasteners: rows.reduce((t, r) => t + r.fasteners, 0) };
}

export function counterBattenRuns(g: PlaneGeometry, spacingIn: number, fastenerSpacingIn = 24): BattenLayout {
  const rows: BattenRow[] = [];
  const k = g.slopeFactor;
  for (const s of positions(g.sMin, g.sMax, spacingIn / 12)) {
    const c = Math.min(Math.max(s, g.sMin + nudge), g.sMax - nudge);
    eachCrossSection(g.local, 0, c, (planLen) => {
      const len = planLen * k;
      if (len > TOL) rows.push({ vFt: s, lengthFt: len, fasteners: ceilTol((len * 12) / fastenerSpacingIn) + 1 });
    });
  }
  return { rows, lf: rows.reduce((t, r) => t + r.lengthFt, 0), fasteners: rows.reduce((t, r) => t + r.fasteners, 0) };
}

/** Stock pieces for a batten run total. */
export const battenPieces = (lf: number, wastePct: number, stockLengthFt: number): number => ceilTol((lf * (1 + wastePct / 100)) / stockLengthFt);
