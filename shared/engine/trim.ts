/**
 * Trim, caps, flashings, closures, sealants and penetrations.
 * - Pieces for an edge run of length L from stock S with end lap o: n = ceil((L − o) / (S − o)), per run
 *   (one eave line, one ridge line), not per total (common practice; drip edge laps at least 2 in:
 *   IRC R905.2.8.5). Defaults S = 10 ft, o = 3 in.
 * - Trim fasteners at 12 in o.c. along each run: ceil(L / spacing) + 1 (common practice).
 * - Closures: one per panel at the eave, one per panel end at a ridge or hip; vented closures where the
 *   gap under the panels is ventilated (common practice).
 * - Valleys get a 36 in membrane strip under the pan (common practice).
 * - A chimney or penetration more than 30 in wide across the slope needs a cricket (IRC R903.2.2).
 */
import type { EdgeType } from "./roof/edge-types";
import type { EdgeRun } from "./roof/edges";
import { ceilTol } from "./format";
import type { MaterialKey } from "./materials";

/** Stock pieces for one run: ceil((L − o) / (S − o)); at least one piece for any length. */
export function trimPieces(lengthFt: number, stockLengthFt = 10, endLapIn = 3): number {
  if (!(lengthFt > 0)) return 0;
  const o = endLapIn / 12;
  if (!(stockLengthFt - o > 0)) throw new RangeError("The stock length must be longer than the end lap");
  return Math.max(1, ceilTol((lengthFt - o) / (stockLengthFt - o)));
}

/** Fasteners along a run at the spacing: ceil(L / spacing) + 1. */
export const trimFastenersForRun = (lengthFt: number, spacingIn = 12): number => (lengthFt > 0 ? ceilTol((lengthFt * 12) / spacingIn) + 1 : 0);

/** The material each edge type's trim is bought as. */
export const TRIM_KEY_BY_EDGE: Record<EdgeType, MaterialKey> = {
  eave: "trim-eave",
  rake: "trim-rake",
  ridge: "ridge-cap",
  hip: "hip-cap",
  valley: "valley-pan",
  sidewall: "flashing-sidewall",
  headwall: "flashing-headwall",
  transition: "flashing-transition",
};

export interface TrimRunCount {
  type: EdgeType;
  lengthFt: number;
  pieces: number;
  fasteners: number;
  laps: number;
}

export function countTrimRuns(runs: EdgeRun[], stockLengthFt: number, endLapIn: number, fastenerSpacingIn: number): TrimRunCount[] {
  // A loop, not runs.map(): arrays that map() built, read again in the takeoff's optimized code, failed V8's
  // hidden-class check on every run there (a deoptimization loop, seen with node --trace-deopt).
  const out: TrimRunCount[] = [];
  for (const r of runs) {
    const pieces = trimPieces(r.lengthFt, stockLengthFt, endLapIn);
    out.push({ type: r.type, lengthFt: r.lengthFt, pieces, fasteners: trimFastenersForRun(r.lengthFt, fastenerSpacingIn), laps: Math.max(0, pieces - 1) });
  }
  return out;
}

/** Width across the slope above which IRC R903.2.2 asks for a cricket, inches. */
export const CRICKET_MIN_WIDTH_IN = 30;
