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

/** Width across the slope above which IRC R903.2.2 asks for a cricket, inches. */
export const CRICKET_MIN_WIDTH_IN = 30;

/** The runs of one edge type, counted for the takeoff (see tallyTrim). */
export interface TrimTypeTally {
  type: EdgeType;
  /** Runs of this type, and Σ pieces over them. */
  runs: number;
  pieces: number;
  /** The distinct run lengths (ft), in the order of their first run, with the runs of each and its pieces per run. */
  lengthsFt: number[];
  runsOfLength: number[];
  piecesOfLength: number[];
}

export interface TrimTally {
  /** Σ fasteners and Σ laps (pieces − 1 per run) over every run. */
  fasteners: number;
  laps: number;
  /** One entry per edge type with runs, in TRIM_TYPE_ORDER. */
  byType: TrimTypeTally[];
}

/** The order trim is listed in, by edge type. */
export const TRIM_TYPE_ORDER: readonly EdgeType[] = ["eave", "rake", "ridge", "hip", "valley", "sidewall", "headwall", "transition"];

/** Index of an edge type in TRIM_TYPE_ORDER, −1 for none (a switch on the few type names: no lookup per run). */
function trimTypeIndex(t: EdgeType): number {
  switch (t) {
    case "eave":
      return 0;
    case "rake":
      return 1;
    case "ridge":
      return 2;
    case "hip":
      return 3;
    case "valley":
      return 4;
    case "sidewall":
      return 5;
    case "headwall":
      return 6;
    case "transition":
      return 7;
    default:
      return -1;
  }
}

/** Equal as Map keys are (SameValueZero): NaN equals NaN. */
const sameKey = (a: number, b: number) => a === b || (a !== a && b !== b);

/**
 * The trim runs counted: pieces, fasteners and laps per run (trimPieces, trimFastenersForRun), summed by edge
 * type with the equal run lengths of each type grouped, without a record per run. A type's distinct
 * lengths are found by a scan of the few seen so far; past LINEAR_MAX of them a Map takes over (same result).
 */
export function tallyTrim(runs: readonly EdgeRun[], stockLengthFt: number, endLapIn: number, fastenerSpacingIn: number): TrimTally {
  const LINEAR_MAX = 16;
  const slots: (TrimTypeTally | undefined)[] = [undefined, undefined, undefined, undefined, undefined, undefined, undefined, undefined];
  const index: (Map<number, number> | undefined)[] = [undefined, undefined, undefined, undefined, undefined, undefined, undefined, undefined];
  let fasteners = 0;
  let laps = 0;
  for (let r = 0; r < runs.length; r++) {
    const run = runs[r];
    const len = run.lengthFt;
    const pieces = trimPieces(len, stockLengthFt, endLapIn);
    fasteners += trimFastenersForRun(len, fastenerSpacingIn);
    laps += Math.max(0, pieces - 1);
    const ti = trimTypeIndex(run.type);
    if (ti < 0) continue; // not a trim type: its fasteners and laps count, no trim line
    let t = slots[ti];
    if (!t) {
      t = { type: run.type, runs: 0, pieces: 0, lengthsFt: [], runsOfLength: [], piecesOfLength: [] };
      slots[ti] = t;
    }
    t.runs++;
    t.pieces += pieces;
    const lengths = t.lengthsFt;
    let at = -1;
    const map = index[ti];
    if (map) at = map.get(len) ?? -1;
    else {
      for (let j = 0; j < lengths.length; j++) {
        if (sameKey(lengths[j], len)) {
          at = j;
          break;
        }
      }
    }
    if (at >= 0) {
      t.runsOfLength[at]++;
      continue;
    }
    lengths.push(len);
    t.runsOfLength.push(1);
    t.piecesOfLength.push(pieces);
    if (map) map.set(len, lengths.length - 1);
    else if (lengths.length > LINEAR_MAX) {
      const m = new Map<number, number>();
      for (let j = 0; j < lengths.length; j++) m.set(lengths[j], j);
      index[ti] = m;
    }
  }
  const byType: TrimTypeTally[] = [];
  for (let ti = 0; ti < slots.length; ti++) {
    const t = slots[ti];
    if (t) byType.push(t);
  }
  return { fasteners, laps, byType };
}
