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
import { StripSlicer } from "./polygon";

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
    return this.add(p.stripS0, p.stripS1, p.sMin, p.sMax, p.vMin, p.vMax, p.slopeLengthFt, p.lengthIn, p.bottomEdge, p.topEdge, p.sProbe, p.clipLineS);
  }

  /** Appends one panel given field by field (no record object); returns its index. */
  add(
    stripS0: number,
    stripS1: number,
    sMin: number,
    sMax: number,
    vMin: number,
    vMax: number,
    slopeLengthFt: number,
    lengthIn: number,
    bottomEdge: number,
    topEdge: number,
    sProbe: number,
    clipLineS: number,
  ): number {
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
    f[o] = stripS0;
    f[o + 1] = stripS1;
    f[o + 2] = sMin;
    f[o + 3] = sMax;
    f[o + 4] = vMin;
    f[o + 5] = vMax;
    f[o + 6] = slopeLengthFt;
    f[o + 7] = sProbe;
    f[o + 8] = clipLineS;
    const m = i * NI;
    const nn = this.n;
    nn[m] = lengthIn;
    nn[m + 1] = bottomEdge;
    nn[m + 2] = topEdge;
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

// Strip starts of the plane being laid out (see fillStripStarts), grown on demand.
let STARTS = new Float64Array(64);

/**
 * Writes the strip start positions (local s, ft) covering [sMin, sMax], in laying order, into STARTS and
 * returns their count (no array per plane).
 */
function fillStripStarts(sMin: number, sMax: number, w: number, start: PanelStart): number {
  let out: Float64Array = STARTS;
  let n = 0;
  // The loops start from `sMin * 1` and `sMax * 1`: the same number (× 1 is exact for every double, −0 and
  // NaN included), but a product, so V8 keeps the loop variable an unboxed double. Started from the parameter
  // itself it stayed a boxed number, one allocated per strip.
  if (start === "left") {
    for (let a = sMin * 1, j = 0; a < sMax - TOL; a = sMin + ++j * w) {
      if (n === out.length) out = growStarts();
      out[n++] = a;
    }
  } else if (start === "right") {
    for (let b = sMax * 1, j = 0; b > sMin + TOL; b = sMax - ++j * w) {
      if (n === out.length) out = growStarts();
      out[n++] = b - w;
    }
  } else {
    const c = (sMin + sMax) / 2 - w / 2;
    const j0 = Math.floor((sMin - c) / w);
    for (let j = j0; c + j * w < sMax - TOL; j++) {
      if (!(c + (j + 1) * w > sMin + TOL)) continue;
      if (n === out.length) out = growStarts();
      out[n++] = c + j * w;
    }
  }
  return n;
}

/** Doubles STARTS, keeping its contents; returns the new array. */
function growStarts(): Float64Array {
  const grown = new Float64Array(2 * STARTS.length);
  grown.set(STARTS);
  STARTS = grown;
  return grown;
}

/** Strip start positions (local s, ft) covering [sMin, sMax] in laying order. */
export function stripStarts(sMin: number, sMax: number, w: number, start: PanelStart): number[] {
  const n = fillStripStarts(sMin, sMax, w, start);
  const out: number[] = [];
  for (let i = 0; i < n; i++) out.push(STARTS[i]);
  return out;
}

// Per-layout scratch (the engine is synchronous): the plane cut into strips, and the counts and distinct
// values of the cut list.
const SLICER = new StripSlicer();
let LENGTH_COUNT = new Int32Array(256);
let DISTINCT = new Int32Array(64);
/**
 * The plane's panel lengths and cut-list entries as they are found, copied out with slice() at their exact
 * count: pushed into fresh arrays they grew their stores two or three times per plane (an allocation each).
 * The copies are packed arrays of the same kinds as before. LENGTHS holds plain numbers; ENTRIES is emptied
 * after each copy so that it keeps no result alive.
 */
const LENGTHS: number[] = [];
const ENTRIES: CutListEntry[] = [];

/** Appends the panel of strip a…b over the piece sMin…sMax × vMin…vMax; returns its ordered length. */
function addPiece(
  pieces: PanelPieces,
  a: number,
  b: number,
  sMin: number,
  sMax: number,
  vMin: number,
  vMax: number,
  bottomEdge: number,
  topEdge: number,
  sProbe: number,
  k: number,
  hem: number,
  right: boolean,
): number {
  const slopeLengthFt = k * (vMax - vMin);
  const seam = right ? b : a;
  const lengthIn = Math.ceil(12 * slopeLengthFt + hem - 1e-6);
  pieces.add(a, b, sMin, sMax, vMin, vMax, slopeLengthFt, lengthIn, bottomEdge, topEdge, sProbe, Math.min(Math.max(seam, sMin), sMax));
  return lengthIn;
}

/**
 * Cut list: equal lengths grouped, longest first. The lengths are whole inches in a narrow range, so they
 * are counted by value (no sort of the lengths): the first time a length is seen it is noted, and the few
 * distinct lengths are then put in order by insertion (a plane has a handful; with more than 32 the count
 * array is walked from the longest length down instead, which gives the same list). An unusual list (a
 * range over 4,096 in, or a value that is not a 32-bit integer) takes the sorted path, which groups the
 * values as Int32Array stores them.
 */
function cutListOf(lengthsIn: number[], minIn: number, maxIn: number): CutListEntry[] {
  const n = lengthsIn.length;
  if (n === 0) return [];
  const cutList = ENTRIES;
  const range = maxIn - minIn + 1;
  let plain = range <= 4096 && (minIn | 0) === minIn && (maxIn | 0) === maxIn;
  for (let i = 0; plain && i < n; i++) if ((lengthsIn[i] | 0) !== lengthsIn[i]) plain = false;
  if (plain) {
    if (LENGTH_COUNT.length < range) LENGTH_COUNT = new Int32Array(Math.max(range, LENGTH_COUNT.length * 2));
    const cnt = LENGTH_COUNT;
    if (DISTINCT.length < n) DISTINCT = new Int32Array(Math.max(n, DISTINCT.length * 2));
    const distinct = DISTINCT;
    let d = 0;
    for (let i = 0; i < n; i++) {
      const l = lengthsIn[i];
      if (cnt[l - minIn]++ === 0) distinct[d++] = l;
    }
    if (d <= 32) {
      // Longest first: insertion sort, descending (the values are distinct).
      for (let i = 1; i < d; i++) {
        const x = distinct[i];
        let j = i - 1;
        while (j >= 0 && distinct[j] < x) {
          distinct[j + 1] = distinct[j];
          j--;
        }
        distinct[j + 1] = x;
      }
      for (let i = 0; i < d; i++) {
        const l = distinct[i];
        cutList[i] = { lengthIn: l, count: cnt[l - minIn] };
        cnt[l - minIn] = 0; // leave the scratch zeroed for the next plane
      }
      return takeEntries(d);
    }
    let e = 0;
    for (let l = maxIn; l >= minIn; l--) {
      const c = cnt[l - minIn];
      if (c === 0) continue;
      cutList[e++] = { lengthIn: l, count: c };
      cnt[l - minIn] = 0;
    }
    return takeEntries(e);
  }
  const sorted = Int32Array.from(lengthsIn).sort();
  let e = 0;
  for (let i = n - 1; i >= 0; ) {
    const l = sorted[i];
    let j = i;
    while (j >= 0 && sorted[j] === l) j--;
    cutList[e++] = { lengthIn: l, count: i - j };
    i = j;
  }
  return takeEntries(e);
}

/** ENTRIES[0 … count − 1] as a new array; ENTRIES is then emptied (its store kept for the next plane). */
function takeEntries(count: number): CutListEntry[] {
  const out = ENTRIES.slice(0, count);
  // Overwritten rather than truncated: a shorter length could give the store back and grow it again.
  for (let i = 0; i < count; i++) (ENTRIES as unknown[])[i] = undefined;
  return out;
}

export function layoutPanels(g: PlaneGeometry, opts: PanelOptions): PanelLayout {
  const wIn = opts.coverageWidthIn;
  const w = wIn / 12;
  const start = opts.start ?? "left";
  const hem = opts.hemAllowanceIn ?? 0;
  const k = g.slopeFactor;
  const nStrips = fillStripStarts(g.sMin, g.sMax, w, start);
  const starts = STARTS;
  const pieces = opts.into ?? new PanelPieces(nStrips);
  pieces.count = 0;
  // The plane's edges are read once; each strip is then cut from typed arrays without allocating.
  const slicer = SLICER.load(g.local);
  const lengths = LENGTHS;
  let nl = 0;
  const right = start === "right";
  if (slicer.isConvex()) {
    // A convex plane has at most one piece per strip: all strips are cut in one pass.
    slicer.convexStrips(starts, nStrips, w);
    const { stripSMin, stripSMax, stripVMin, stripVMax, stripBottom, stripTop, stripProbe } = slicer;
    for (let s = 0; s < nStrips; s++) {
      // A piece TOL wide or less is no panel.
      if (stripBottom[s] < 0 || stripSMax[s] - stripSMin[s] <= TOL) continue;
      const a = starts[s];
      const b = a + w;
      lengths[nl++] = addPiece(pieces, a, b, stripSMin[s], stripSMax[s], stripVMin[s], stripVMax[s], stripBottom[s], stripTop[s], stripProbe[s], k, hem, right);
    }
  } else {
    // Any other plane may have several pieces in a strip (a notch).
    for (let s = 0; s < nStrips; s++) {
      const a = starts[s];
      const b = a + w;
      const m = slicer.slice(a, b);
      for (let q = 0; q < m; q++) {
        const c = slicer.pieces[q];
        if (c.sMax - c.sMin <= TOL) continue;
        lengths[nl++] = addPiece(pieces, a, b, c.sMin, c.sMax, c.vMin, c.vMax, c.bottomEdge, c.topEdge, c.sProbe, k, hem, right);
      }
    }
  }
  const lengthsIn = lengths.slice(0, nl);
  let totalIn = 0;
  let longestIn = 0;
  let shortestIn = Infinity;
  for (let i = 0; i < lengthsIn.length; i++) {
    const l = lengthsIn[i];
    totalIn += l;
    if (l > longestIn) longestIn = l;
    if (l < shortestIn) shortestIn = l;
  }
  const n = pieces.count;
  const cutList = cutListOf(lengthsIn, shortestIn, longestIn);
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
