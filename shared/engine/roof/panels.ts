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

/** Number slots per panel: 9 floats and 3 integers (see PanelPieces). */
const NF = 9;
const NI = 3;

/**
 * The panels of one plane, packed into two typed arrays (9 floats and 3 integers per panel, no object per
 * panel: a large roof has thousands of panels and the takeoff reads only a few numbers of each). Read with
 * the accessors; `at(i)` and iteration give PanelPiece objects.
 */
export class PanelPieces implements Iterable<PanelPiece> {
  count = 0;
  private f: Float64Array;
  private n: Int32Array;

  constructor(capacity = 16) {
    const c = Math.max(1, capacity);
    this.f = new Float64Array(c * NF);
    this.n = new Int32Array(c * NI);
  }

  /** Appends one panel; returns its index. */
  push(p: PanelPiece): number {
    if (this.count * NI === this.n.length) {
      const f = new Float64Array(this.f.length * 2);
      f.set(this.f);
      this.f = f;
      const n = new Int32Array(this.n.length * 2);
      n.set(this.n);
      this.n = n;
    }
    const i = this.count++;
    const o = i * NF;
    const f = this.f;
    f[o] = p.stripS0;
    f[o + 1] = p.stripS1;
    f[o + 2] = p.sMin;
    f[o + 3] = p.sMax;
    f[o + 4] = p.vMin;
    f[o + 5] = p.vMax;
    f[o + 6] = p.slopeLengthFt;
    f[o + 7] = p.sProbe;
    f[o + 8] = p.clipLineS;
    const m = i * NI;
    this.n[m] = p.lengthIn;
    this.n[m + 1] = p.bottomEdge;
    this.n[m + 2] = p.topEdge;
    return i;
  }

  stripS0(i: number): number {
    return this.f[i * NF];
  }
  stripS1(i: number): number {
    return this.f[i * NF + 1];
  }
  sMin(i: number): number {
    return this.f[i * NF + 2];
  }
  sMax(i: number): number {
    return this.f[i * NF + 3];
  }
  vMin(i: number): number {
    return this.f[i * NF + 4];
  }
  vMax(i: number): number {
    return this.f[i * NF + 5];
  }
  slopeLengthFt(i: number): number {
    return this.f[i * NF + 6];
  }
  sProbe(i: number): number {
    return this.f[i * NF + 7];
  }
  clipLineS(i: number): number {
    return this.f[i * NF + 8];
  }
  lengthIn(i: number): number {
    return this.n[i * NI];
  }
  bottomEdge(i: number): number {
    return this.n[i * NI + 1];
  }
  topEdge(i: number): number {
    return this.n[i * NI + 2];
  }

  at(i: number): PanelPiece {
    if (!(i >= 0 && i < this.count)) throw new RangeError(`no panel ${i} (of ${this.count})`);
    return {
      stripS0: this.stripS0(i),
      stripS1: this.stripS1(i),
      sMin: this.sMin(i),
      sMax: this.sMax(i),
      vMin: this.vMin(i),
      vMax: this.vMax(i),
      slopeLengthFt: this.slopeLengthFt(i),
      lengthIn: this.lengthIn(i),
      bottomEdge: this.bottomEdge(i),
      topEdge: this.topEdge(i),
      sProbe: this.sProbe(i),
      clipLineS: this.clipLineS(i),
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
  /**
   * Store the pieces here (emptied first) instead of in a new PanelPieces: a caller that lays out plane
   * after plane and is done with each before the next passes one and saves an allocation per plane.
   */
  into?: PanelPieces;
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

/** The panel of strip a…b over piece c, written into `rec`; false when the piece is TOL wide or less. */
function fillPiece(rec: PanelPiece, c: StripComponent, a: number, b: number, k: number, hem: number, right: boolean): boolean {
  if (c.sMax - c.sMin <= TOL) return false;
  const slopeLengthFt = k * (c.vMax - c.vMin);
  const seam = right ? b : a;
  rec.stripS0 = a;
  rec.stripS1 = b;
  rec.sMin = c.sMin;
  rec.sMax = c.sMax;
  rec.vMin = c.vMin;
  rec.vMax = c.vMax;
  rec.slopeLengthFt = slopeLengthFt;
  rec.lengthIn = Math.ceil(12 * slopeLengthFt + hem - 1e-6);
  rec.bottomEdge = c.bottomEdge;
  rec.topEdge = c.topEdge;
  rec.sProbe = c.sProbe;
  rec.clipLineS = Math.min(Math.max(seam, c.sMin), c.sMax);
  return true;
}

export function layoutPanels(g: PlaneGeometry, opts: PanelOptions): PanelLayout {
  const wIn = opts.coverageWidthIn;
  const w = wIn / 12;
  const start = opts.start ?? "left";
  const hem = opts.hemAllowanceIn ?? 0;
  const k = g.slopeFactor;
  const starts = stripStarts(g.sMin, g.sMax, w, start);
  const pieces = opts.into ?? new PanelPieces(starts.length);
  pieces.count = 0;
  const convex = isConvex(g.local);
  const scratch: StripComponent = { sMin: 0, sMax: 0, vMin: 0, vMax: 0, bottomEdge: 0, topEdge: 0, sProbe: 0 };
  let totalIn = 0;
  let longestIn = 0;
  // One reusable record: push copies it into the packed arrays.
  const rec: PanelPiece = { stripS0: 0, stripS1: 0, sMin: 0, sMax: 0, vMin: 0, vMax: 0, slopeLengthFt: 0, lengthIn: 0, bottomEdge: 0, topEdge: 0, sProbe: 0, clipLineS: 0 };
  const lengthsIn: number[] = [];
  const right = start === "right";
  for (const a of starts) {
    const b = a + w;
    const pieceList = convex ? null : stripComponents(g.local, a, b);
    const m = pieceList ? pieceList.length : 1;
    for (let q = 0; q < m; q++) {
      const c = pieceList ? pieceList[q] : convexStripComponent(g.local, a, b, scratch);
      if (!c || !fillPiece(rec, c, a, b, k, hem, right)) continue;
      pieces.push(rec);
      lengthsIn.push(rec.lengthIn);
      totalIn += rec.lengthIn;
      if (rec.lengthIn > longestIn) longestIn = rec.lengthIn;
    }
  }
  const n = pieces.count;
  // Cut list: equal lengths grouped, longest first (a sorted copy, counted in one pass).
  const sorted = Int32Array.from(lengthsIn).sort();
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
