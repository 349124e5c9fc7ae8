/**
 * Panel layout on one plane. Panels run eave to ridge in strips of the coverage width w, perpendicular to
 * the eave. Strips start at the plane's extreme extent across the slope (an eave can be shorter than the
 * plane is wide), from the left seen from the eave looking up-slope by default, or from the right, or
 * centred (a panel's centre on the plane's centreline). A strip counts only where it overlaps the polygon
 * by more than TOL of width; each connected piece of the polygon inside a strip is one panel (a notch can
 * split a strip in two). A panel's length is the true slope length of its piece, the longer side where the
 * strip is cut at an angle, plus hem allowances, rounded up to the inch (panels are ordered to the inch:
 * common practice, no published source):
 *   lengthIn = ceil(12 · k · (vMax − vMin) + hems − 1e-6).
 */
import { TOL } from "../constants";
import type { PlaneGeometry } from "./geometry";
import { convexStripComponent, isConvex, stripComponents, type StripComponent } from "./polygon";

export type PanelStart = "left" | "right" | "centred";

export interface PanelPiece {
  /** Strip edges across the slope (local s, ft). */
  stripS0: number;
  stripS1: number;
  /** The piece's extent inside the strip (local s and v, ft). */
  sMin: number;
  sMax: number;
  vMin: number;
  vMax: number;
  /** Unrounded true slope length of the piece, ft. */
  slopeLengthFt: number;
  /** Ordered length, whole inches. */
  lengthIn: number;
  /** Outline edges under the panel's bottom and top ends (at the piece's middle). */
  bottomEdge: number;
  topEdge: number;
  sProbe: number;
  /** Local s of this panel's clip line (its seam on the starting side, kept inside the piece). */
  clipLineS: number;
}

const FLOAT_COLUMNS = ["stripS0", "stripS1", "sMin", "sMax", "vMin", "vMax", "slopeLengthFt", "sProbe", "clipLineS"] as const;
const INT_COLUMNS = ["lengthIn", "bottomEdge", "topEdge"] as const;

/**
 * The panels of one plane, stored by column (typed arrays, no object per panel: a large roof has thousands
 * of panels and the takeoff reads only a few numbers of each). `at(i)` and iteration give PanelPiece objects.
 */
export class PanelPieces implements Iterable<PanelPiece> {
  count = 0;
  stripS0: Float64Array;
  stripS1: Float64Array;
  sMin: Float64Array;
  sMax: Float64Array;
  vMin: Float64Array;
  vMax: Float64Array;
  slopeLengthFt: Float64Array;
  sProbe: Float64Array;
  clipLineS: Float64Array;
  lengthIn: Int32Array;
  bottomEdge: Int32Array;
  topEdge: Int32Array;

  constructor(capacity = 16) {
    const n = Math.max(1, capacity);
    this.stripS0 = new Float64Array(n);
    this.stripS1 = new Float64Array(n);
    this.sMin = new Float64Array(n);
    this.sMax = new Float64Array(n);
    this.vMin = new Float64Array(n);
    this.vMax = new Float64Array(n);
    this.slopeLengthFt = new Float64Array(n);
    this.sProbe = new Float64Array(n);
    this.clipLineS = new Float64Array(n);
    this.lengthIn = new Int32Array(n);
    this.bottomEdge = new Int32Array(n);
    this.topEdge = new Int32Array(n);
  }

  /** Room for one more piece; returns its index. */
  add(): number {
    if (this.count === this.lengthIn.length) {
      const n = this.count * 2;
      for (const c of FLOAT_COLUMNS) {
        const a = new Float64Array(n);
        a.set(this[c]);
        this[c] = a;
      }
      for (const c of INT_COLUMNS) {
        const a = new Int32Array(n);
        a.set(this[c]);
        this[c] = a;
      }
    }
    return this.count++;
  }

  at(i: number): PanelPiece {
    if (i < 0 || i >= this.count) throw new RangeError(`no panel ${i} (of ${this.count})`);
    return {
      stripS0: this.stripS0[i],
      stripS1: this.stripS1[i],
      sMin: this.sMin[i],
      sMax: this.sMax[i],
      vMin: this.vMin[i],
      vMax: this.vMax[i],
      slopeLengthFt: this.slopeLengthFt[i],
      lengthIn: this.lengthIn[i],
      bottomEdge: this.bottomEdge[i],
      topEdge: this.topEdge[i],
      sProbe: this.sProbe[i],
      clipLineS: this.clipLineS[i],
    };
  }

  *[Symbol.iterator](): Iterator<PanelPiece> {
    for (let i = 0; i < this.count; i++) yield this.at(i);
  }
}

export interface CutListEntry {
  lengthIn: number;
  count: number;
}

export interface PanelLayout {
  coverageWidthIn: number;
  count: number;
  /** One entry per panel, in laying order. */
  lengthsIn: number[];
  /** Equal lengths grouped, longest first. */
  cutList: CutListEntry[];
  /** Σ (w × ordered length) − sloped area, ft² (hip and valley offcuts are reported, not reused). */
  offcutSqFt: number;
  /** Σ ordered lengths, ft. */
  totalLengthFt: number;
  /** Coverage area of the panels ordered, ft². */
  orderedAreaSqFt: number;
  longestIn: number;
  pieces: PanelPieces;
}

export interface PanelOptions {
  coverageWidthIn: number;
  start?: PanelStart;
  /** Added to every panel's length (eave hem + top hem), inches. Default 0. */
  hemAllowanceIn?: number;
}

/** Strip start positions (local s, ft) covering [sMin, sMax] in laying order. */
export function stripStarts(sMin: number, sMax: number, w: number, start: PanelStart): number[] {
  const out: number[] = [];
  if (start === "left") {
    for (let a = sMin, j = 0; a < sMax - TOL; a = sMin + ++j * w) out.push(a);
  } else if (start === "right") {
    for (let b = sMax, j = 0; b > sMin + TOL; b = sMax - ++j * w) out.push(b - w);
  } else {
    const c = (sMin + sMax) / 2 - w / 2;
    const j0 = Math.floor((sMin - c) / w);
    for (let j = j0; c + j * w < sMax - TOL; j++) if (c + (j + 1) * w > sMin + TOL) out.push(c + j * w);
  }
  return out;
}

export function layoutPanels(g: PlaneGeometry, opts: PanelOptions): PanelLayout {
  const wIn = opts.coverageWidthIn;
  const w = wIn / 12;
  const start = opts.start ?? "left";
  const hem = opts.hemAllowanceIn ?? 0;
  const k = g.slopeFactor;
  const starts = stripStarts(g.sMin, g.sMax, w, start);
  const pieces = new PanelPieces(starts.length);
  const convex = isConvex(g.local);
  const scratch: StripComponent = { sMin: 0, sMax: 0, vMin: 0, vMax: 0, bottomEdge: 0, topEdge: 0, sProbe: 0 };
  let totalIn = 0;
  let longestIn = 0;
  const add = (c: StripComponent, a: number, b: number) => {
    if (c.sMax - c.sMin <= TOL) return;
    const slopeLengthFt = k * (c.vMax - c.vMin);
    const seam = start === "right" ? b : a;
    const lengthIn = Math.ceil(12 * slopeLengthFt + hem - 1e-6);
    const i = pieces.add();
    pieces.stripS0[i] = a;
    pieces.stripS1[i] = b;
    pieces.sMin[i] = c.sMin;
    pieces.sMax[i] = c.sMax;
    pieces.vMin[i] = c.vMin;
    pieces.vMax[i] = c.vMax;
    pieces.slopeLengthFt[i] = slopeLengthFt;
    pieces.lengthIn[i] = lengthIn;
    pieces.bottomEdge[i] = c.bottomEdge;
    pieces.topEdge[i] = c.topEdge;
    pieces.sProbe[i] = c.sProbe;
    pieces.clipLineS[i] = Math.min(Math.max(seam, c.sMin), c.sMax);
    totalIn += lengthIn;
    if (lengthIn > longestIn) longestIn = lengthIn;
  };
  for (const a of starts) {
    const b = a + w;
    if (convex) {
      const c = convexStripComponent(g.local, a, b, scratch);
      if (c) add(c, a, b);
    } else for (const c of stripComponents(g.local, a, b)) add(c, a, b);
  }
  const n = pieces.count;
  const lengthsIn: number[] = new Array(n);
  for (let i = 0; i < n; i++) lengthsIn[i] = pieces.lengthIn[i];
  // Cut list: equal lengths grouped, longest first (a sorted copy, counted in one pass).
  const sorted = pieces.lengthIn.slice(0, n).sort();
  const cutList: CutListEntry[] = [];
  for (let i = n - 1; i >= 0; ) {
    const l = sorted[i];
    let j = i;
    while (j >= 0 && sorted[j] === l) j--;
    cutList.push({ lengthIn: l, count: i - j });
    i = j;
  }
  const totalLengthFt = totalIn / 12;
  const orderedAreaSqFt = w * totalLengthFt;
  return {
    coverageWidthIn: wIn,
    count: n,
    lengthsIn,
    cutList,
    offcutSqFt: orderedAreaSqFt - g.slopedAreaSqFt,
    totalLengthFt,
    orderedAreaSqFt,
    longestIn,
    pieces,
  };
}
