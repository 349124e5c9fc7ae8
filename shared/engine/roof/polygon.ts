/**
 * Plane-polygon helpers: shoelace area, winding, simple-polygon test, point-in-polygon, and the
 * slicing used for panels, battens and clip lines. Points are [x, y] in feet (see ../units.ts).
 */

export type Pt = readonly [number, number];

/**
 * Sorts the first n numbers of a typed scratch array in place, ascending, by insertion (a handful of cuts or
 * corners, no allocation); stable, so equal values such as 0 and −0 keep their order.
 */
export function sortPrefix(a: Float64Array, n: number): void {
  for (let i = 1; i < n; i++) {
    const x = a[i];
    let j = i - 1;
    while (j >= 0 && a[j] > x) {
      a[j + 1] = a[j];
      j--;
    }
    a[j + 1] = x;
  }
}

/** Signed area by the shoelace formula: positive for counter-clockwise winding. */
export function signedArea(poly: readonly Pt[]): number {
  let a = 0;
  const n = poly.length;
  for (let i = 0; i < n; i++) {
    const p = poly[i];
    const q = poly[(i + 1) % n];
    a += p[0] * q[1] - q[0] * p[1];
  }
  return a / 2;
}

export const polygonArea = (poly: readonly Pt[]): number => Math.abs(signedArea(poly));

/** "ccw" for positive signed area, "cw" for negative, null for (near) zero. */
export function orientation(poly: readonly Pt[], eps = 1e-12): "ccw" | "cw" | null {
  const a = signedArea(poly);
  return a > eps ? "ccw" : a < -eps ? "cw" : null;
}

const cross = (o: Pt, a: Pt, b: Pt) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);

/** `cross` on plain coordinates: (a − o) × (b − o), the same expression. */
function crossXY(ox: number, oy: number, ax: number, ay: number, bx: number, by: number): number {
  return (ax - ox) * (by - oy) - (ay - oy) * (bx - ox);
}

/** Is p inside the box of segment ab, widened by eps? */
function onSegmentXY(px: number, py: number, ax: number, ay: number, bx: number, by: number, eps: number): boolean {
  return Math.min(ax, bx) - eps <= px && px <= Math.max(ax, bx) + eps && Math.min(ay, by) - eps <= py && py <= Math.max(ay, by) + eps;
}

/** segmentsIntersect on plain coordinates (no point arrays). */
function segmentsIntersectXY(
  ax: number,
  ay: number,
  bx: number,
  by: number,
  cx: number,
  cy: number,
  dx: number,
  dy: number,
  eps: number,
): boolean {
  const d1 = crossXY(cx, cy, dx, dy, ax, ay);
  const d2 = crossXY(cx, cy, dx, dy, bx, by);
  const d3 = crossXY(ax, ay, bx, by, cx, cy);
  const d4 = crossXY(ax, ay, bx, by, dx, dy);
  // A proper crossing: each segment's ends strictly on both sides of the other's line.
  if (((d1 > eps && d2 < -eps) || (d1 < -eps && d2 > eps)) && ((d3 > eps && d4 < -eps) || (d3 < -eps && d4 > eps))) return true;
  // Touching: an end on (or within eps of) the other segment.
  if (Math.abs(d1) <= eps && onSegmentXY(ax, ay, cx, cy, dx, dy, eps)) return true;
  if (Math.abs(d2) <= eps && onSegmentXY(bx, by, cx, cy, dx, dy, eps)) return true;
  if (Math.abs(d3) <= eps && onSegmentXY(cx, cy, ax, ay, bx, by, eps)) return true;
  if (Math.abs(d4) <= eps && onSegmentXY(dx, dy, ax, ay, bx, by, eps)) return true;
  return false;
}

/** Do segments ab and cd touch or cross (closed segments)? */
export function segmentsIntersect(a: Pt, b: Pt, c: Pt, d: Pt, eps = 1e-9): boolean {
  return segmentsIntersectXY(a[0], a[1], b[0], b[1], c[0], c[1], d[0], d[1], eps);
}

// The corners of the polygon being checked by selfIntersection, read once.
let SI_X = new Float64Array(16);
let SI_Y = new Float64Array(16);

/**
 * Simple-polygon test: no repeated consecutive vertex, no edge touching a non-adjacent edge, and no
 * adjacent edges folding back on each other. Returns the first offending edge pair, or null when simple.
 * O(n²) in the vertex count of one plane (planes have a handful of vertices).
 */
export function selfIntersection(poly: readonly Pt[], minEdge = 1e-9): { i: number; j: number } | null {
  const n = poly.length;
  if (SI_X.length < n) {
    SI_X = new Float64Array(2 * n);
    SI_Y = new Float64Array(2 * n);
  }
  const xs = SI_X;
  const ys = SI_Y;
  for (let i = 0; i < n; i++) {
    xs[i] = poly[i][0];
    ys[i] = poly[i][1];
  }
  for (let i = 0; i < n; i++) {
    const k = i + 1 < n ? i + 1 : 0;
    if (Math.sqrt((xs[k] - xs[i]) ** 2 + (ys[k] - ys[i]) ** 2) <= minEdge) return { i, j: i };
  }
  for (let i = 0; i < n; i++) {
    // Edge i runs from a to b.
    const i1 = i + 1 < n ? i + 1 : 0;
    const ax = xs[i];
    const ay = ys[i];
    const bx = xs[i1];
    const by = ys[i1];
    for (let j = i + 1; j < n; j++) {
      // Edge j runs from c to d.
      const j1 = j + 1 < n ? j + 1 : 0;
      const cx = xs[j];
      const cy = ys[j];
      const dx = xs[j1];
      const dy = ys[j1];
      if (j === i + 1) {
        // Adjacent edges share one vertex (b = c); they must not overlap beyond it (a fold-back).
        const cr = crossXY(bx, by, ax, ay, dx, dy);
        const dot = (ax - bx) * (dx - bx) + (ay - by) * (dy - by);
        if (Math.abs(cr) <= 1e-9 && dot > 0) return { i, j };
        continue;
      }
      if (i === 0 && j === n - 1) {
        // The last edge ends where the first begins (d = a).
        const cr = crossXY(ax, ay, bx, by, cx, cy);
        const dot = (bx - ax) * (cx - ax) + (by - ay) * (cy - ay);
        if (Math.abs(cr) <= 1e-9 && dot > 0) return { i, j };
        continue;
      }
      if (segmentsIntersectXY(ax, ay, bx, by, cx, cy, dx, dy, 1e-9)) return { i, j };
    }
  }
  return null;
}

/** Even-odd point-in-polygon test (points on the boundary may go either way). */
export function pointInPolygon(p: Pt, poly: readonly Pt[]): boolean {
  let inside = false;
  const n = poly.length;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const a = poly[i];
    const b = poly[j];
    if (a[1] > p[1] !== b[1] > p[1]) {
      const x = a[0] + ((p[1] - a[1]) * (b[0] - a[0])) / (b[1] - a[1]);
      if (p[0] < x) inside = !inside;
    }
  }
  return inside;
}

/** One connected piece of a polygon clipped to a strip a ≤ s ≤ b. */
export interface StripComponent {
  sMin: number;
  sMax: number;
  vMin: number;
  vMax: number;
  /** Index of the polygon edge bounding the piece from below / above at the strip's middle. */
  bottomEdge: number;
  topEdge: number;
  /** The s at which bottomEdge/topEdge were read (inside the piece). */
  sProbe: number;
}

const newComponent = (): StripComponent => ({ sMin: 0, sMax: 0, vMin: 0, vMax: 0, bottomEdge: 0, topEdge: 0, sProbe: 0 });

// Scratch space for StripSlicer.slice (the engine is synchronous and single-threaded, and a slice is finished
// before the next begins): the cut lines and slab starts of one strip, the crossings of one slab and the
// trapezoids of one strip, by column, grown on demand.
let CUT = new Float64Array(16);
let SLAB_START = new Int32Array(16);
let X_VM = new Float64Array(32);
let X_V0 = new Float64Array(32);
let X_V1 = new Float64Array(32);
let X_E = new Int32Array(32);
let T_S0 = new Float64Array(64);
let T_S1 = new Float64Array(64);
let T_LO0 = new Float64Array(64);
let T_LO1 = new Float64Array(64);
let T_HI0 = new Float64Array(64);
let T_HI1 = new Float64Array(64);
let T_LOE = new Int32Array(64);
let T_HIE = new Int32Array(64);
let T_PARENT = new Int32Array(64);
let G_S0 = new Float64Array(64);
let G_S1 = new Float64Array(64);
let G_V0 = new Float64Array(64);
let G_V1 = new Float64Array(64);
let G_BOT = new Int32Array(64);
let G_TOP = new Int32Array(64);
let G_COL = new Uint8Array(64);

/** One strip's sides, for StripSlicer.convex. */
const ONE_A = new Float64Array(1);
const ONE_B = new Float64Array(1);

function ensureTraps(n: number): void {
  if (T_S0.length >= n) return;
  const m = Math.max(n, T_S0.length * 2);
  // The trapezoids written so far are kept.
  const grow = <T extends Float64Array | Int32Array>(a: T): T => {
    const b = (a instanceof Float64Array ? new Float64Array(m) : new Int32Array(m)) as T;
    b.set(a);
    return b;
  };
  T_S0 = grow(T_S0);
  T_S1 = grow(T_S1);
  T_LO0 = grow(T_LO0);
  T_LO1 = grow(T_LO1);
  T_HI0 = grow(T_HI0);
  T_HI1 = grow(T_HI1);
  T_LOE = grow(T_LOE);
  T_HIE = grow(T_HIE);
  T_PARENT = grow(T_PARENT);
  G_S0 = new Float64Array(m);
  G_S1 = new Float64Array(m);
  G_V0 = new Float64Array(m);
  G_V1 = new Float64Array(m);
  G_BOT = new Int32Array(m);
  G_TOP = new Int32Array(m);
  G_COL = new Uint8Array(m);
}

/**
 * A polygon (local (s, v)) prepared for cutting into many strips a ≤ s ≤ b, as a panel layout does with each
 * plane. `load` reads the corners once into typed arrays: each edge's start and end, its slope dv/ds and its s
 * range, and the corners' s in ascending order; each strip is then cut without reading the nested point
 * arrays, without a modulo per edge and without allocating (the pieces are reused objects). Every value is
 * computed by the same floating-point operations, in the same order, as from the points themselves, so the
 * results are bit-identical to cutting the point arrays directly.
 */
export class StripSlicer {
  /** Corner count of the loaded polygon. */
  n = 0;
  /** Least and greatest s of the corners. */
  sMin = Infinity;
  sMax = -Infinity;
  /** The pieces found by the last `slice`, entries 0 … count − 1 (the objects are reused by the next slice). */
  readonly pieces: StripComponent[] = [];
  // Edge i runs from corner i (ps, pv) to corner i + 1 (qs, qv).
  private ps = new Float64Array(8);
  private pv = new Float64Array(8);
  private qs = new Float64Array(8);
  private qv = new Float64Array(8);
  /** Edge slope dv/ds ((qv − pv) / (qs − ps), ±Infinity or NaN for an edge at constant s: never read then). */
  private m = new Float64Array(8);
  /** Edge s range widened by 1e-12 for the convex cut; empty (+∞, −∞) for an edge less than 1e-12 long in s. */
  private lo = new Float64Array(8);
  private hi = new Float64Array(8);
  /** Corner s in ascending order (equal values in corner order). */
  private sorted = new Float64Array(8);
  /**
   * The pieces found by the last `convexStrips`, slot i for strip i (the fields of StripComponent); a strip
   * without a piece has stripBottom −1.
   */
  stripSMin = new Float64Array(64);
  stripSMax = new Float64Array(64);
  stripVMin = new Float64Array(64);
  stripVMax = new Float64Array(64);
  stripProbe = new Float64Array(64);
  stripBottom = new Int32Array(64);
  stripTop = new Int32Array(64);
  /** Gaps between corners for the convex cut (see prepareGaps). */
  private gapLo = new Float64Array(8);
  private gapHi = new Float64Array(8);
  private gapFirst = new Int32Array(9);
  private gapEdges = new Int32Array(64);

  /** Reads the polygon's corners; returns this. */
  load(poly: readonly Pt[]): this {
    const n = poly.length;
    if (this.ps.length < n) {
      const c = Math.max(n, this.ps.length * 2);
      this.ps = new Float64Array(c);
      this.pv = new Float64Array(c);
      this.qs = new Float64Array(c);
      this.qv = new Float64Array(c);
      this.m = new Float64Array(c);
      this.lo = new Float64Array(c);
      this.hi = new Float64Array(c);
      this.sorted = new Float64Array(c);
    }
    const { ps, pv, qs, qv, m, lo, hi, sorted } = this;
    this.n = n;
    let sMin = Infinity;
    let sMax = -Infinity;
    for (let i = 0; i < n; i++) {
      const s = poly[i][0];
      ps[i] = s;
      pv[i] = poly[i][1];
      if (s < sMin) sMin = s;
      if (s > sMax) sMax = s;
    }
    this.sMin = sMin;
    this.sMax = sMax;
    for (let i = 0; i < n; i++) {
      const j = i + 1 < n ? i + 1 : 0;
      const p0 = ps[i];
      const q0 = ps[j];
      qs[i] = q0;
      qv[i] = pv[j];
      m[i] = (pv[j] - pv[i]) / (q0 - p0);
      const l = p0 < q0 ? p0 : q0;
      const h = p0 < q0 ? q0 : p0;
      if (h - l < 1e-12) {
        lo[i] = Infinity;
        hi[i] = -Infinity;
      } else {
        lo[i] = l - 1e-12;
        hi[i] = h + 1e-12;
      }
    }
    // The corners' s, sorted.
    for (let i = 0; i < n; i++) sorted[i] = ps[i];
    sortPrefix(sorted, n);
    return this;
  }

  /** True when the loaded polygon is convex (collinear corners allowed): every turn the same way, or none. */
  isConvex(): boolean {
    const { n, ps, pv } = this;
    let sign = 0;
    for (let i = 0; i < n; i++) {
      const j = i + 1 < n ? i + 1 : i + 1 - n;
      const k = i + 2 < n ? i + 2 : i + 2 - n;
      // cross(corner i, corner j, corner k), the same expression as `cross`.
      const c = (ps[j] - ps[i]) * (pv[k] - pv[i]) - (pv[j] - pv[i]) * (ps[k] - ps[i]);
      if (Math.abs(c) <= 1e-12) continue;
      const s = c > 0 ? 1 : -1;
      if (sign === 0) sign = s;
      else if (s !== sign) return false;
    }
    return true;
  }

  /**
   * The strip's piece of the loaded polygon when it is convex (at most one); see cutConvex. Written into
   * `into` when given, else a new object.
   */
  convex(a: number, b: number, into?: StripComponent): StripComponent | null {
    ONE_A[0] = a;
    ONE_B[0] = b;
    this.cutConvex(ONE_A, ONE_B, 1, 0);
    if (this.stripBottom[0] < 0) return null;
    const c = into ?? newComponent();
    c.sMin = this.stripSMin[0];
    c.sMax = this.stripSMax[0];
    c.vMin = this.stripVMin[0];
    c.vMax = this.stripVMax[0];
    c.bottomEdge = this.stripBottom[0];
    c.topEdge = this.stripTop[0];
    c.sProbe = this.stripProbe[0];
    return c;
  }

  /**
   * `convex` for many strips of the loaded (convex) polygon at once, strip i running from starts[i] to
   * starts[i] + w (i < count): strip i's piece is written to slot i of the strip arrays (stripSMin …), and a
   * strip without a piece gets stripBottom[i] = −1. A panel layout cuts dozens of strips per plane; this
   * saves a call and a record per strip.
   */
  convexStrips(starts: Float64Array, count: number, w: number): void {
    this.cutConvex(starts, null, count, w);
  }

  /**
   * The convex cut of strips k = 0 … count − 1, from starts[k] to ends[k] (or starts[k] + w without ends),
   * into slot k of the strip arrays. A convex polygon has at most one piece in a strip: its s range is the
   * strip's overlap with the polygon's, its v range is reached at the strip's sides or at corners inside the
   * strip, and its bottom and top edges are the lowest and highest at the strip's middle.
   *
   * The reference rule visits every corner, then every edge in index order, testing whether each strip side
   * and the middle lie in the edge's tolerant s range. Most strips lie well between two corners (see
   * prepareGaps): there no corner is inside the strip and every edge either spans the whole gap (all three
   * tests pass) or misses it (all fail), so only the spanning edges are visited, in the same order and with
   * the same arithmetic, which gives bit-identical results. Other strips take the full loops.
   */
  private cutConvex(starts: Float64Array, ends: Float64Array | null, count: number, w: number): void {
    if (this.stripSMin.length < count) this.growStrips(count);
    const nGaps = this.prepareGaps();
    const { n, ps, pv, m, lo, hi, sMin, sMax, gapLo, gapHi, gapFirst, gapEdges } = this;
    const { stripSMin, stripSMax, stripVMin, stripVMax, stripBottom, stripTop, stripProbe } = this;
    let g = 0; // the gap of the last strip (strips usually come in order of s, either way)
    for (let k = 0; k < count; k++) {
      const a = starts[k];
      const b = ends ? ends[k] : a + w;
      const s0 = Math.max(a, sMin);
      const s1 = Math.min(b, sMax);
      if (!(s1 - s0 > 1e-12)) {
        stripBottom[k] = -1;
        continue;
      }
      const sMid = (s0 + s1) / 2;
      let vMin = Infinity;
      let vMax = -Infinity;
      let bottomEdge = -1;
      let topEdge = -1;
      let vb = Infinity;
      let vt = -Infinity;
      // The gap holding s0, if any: the gaps are disjoint and in ascending order.
      if (nGaps > 0) {
        while (g + 1 < nGaps && gapHi[g] <= s0) g++;
        while (g > 0 && gapLo[g] >= s0) g--;
      }
      if (nGaps > 0 && gapLo[g] < s0 && s1 < gapHi[g]) {
        // Inside one gap: no corner in the strip; the spanning edges only, in index order.
        for (let e = gapFirst[g]; e < gapFirst[g + 1]; e++) {
          const i = gapEdges[e];
          const mi = m[i];
          const p0 = ps[i];
          const p1 = pv[i];
          const v0 = p1 + (s0 - p0) * mi;
          if (v0 < vMin) vMin = v0;
          if (v0 > vMax) vMax = v0;
          const v1 = p1 + (s1 - p0) * mi;
          if (v1 < vMin) vMin = v1;
          if (v1 > vMax) vMax = v1;
          const v = p1 + (sMid - p0) * mi;
          if (v < vb) {
            vb = v;
            bottomEdge = i;
          }
          if (v > vt) {
            vt = v;
            topEdge = i;
          }
        }
      } else {
        for (let i = 0; i < n; i++) {
          const s = ps[i];
          if (s >= s0 && s <= s1) {
            const v = pv[i];
            if (v < vMin) vMin = v;
            if (v > vMax) vMax = v;
          }
        }
        for (let i = 0; i < n; i++) {
          const l = lo[i];
          const h = hi[i];
          // An edge at constant s has the empty range and is skipped by every test below.
          const mi = m[i];
          const p0 = ps[i];
          const p1 = pv[i];
          // The edge's v at the strip sides it spans (tolerant ends).
          if (s0 >= l && s0 <= h) {
            const v = p1 + (s0 - p0) * mi;
            if (v < vMin) vMin = v;
            if (v > vMax) vMax = v;
          }
          if (s1 >= l && s1 <= h) {
            const v = p1 + (s1 - p0) * mi;
            if (v < vMin) vMin = v;
            if (v > vMax) vMax = v;
          }
          // Inclusive: at a corner both edges meeting there give the same v; the first one is kept.
          if (sMid >= l && sMid <= h) {
            const v = p1 + (sMid - p0) * mi;
            if (v < vb) {
              vb = v;
              bottomEdge = i;
            }
            if (v > vt) {
              vt = v;
              topEdge = i;
            }
          }
        }
      }
      // (Bottom and top are found together: both or neither.)
      if (bottomEdge < 0) {
        stripBottom[k] = -1;
        continue;
      }
      stripSMin[k] = s0;
      stripSMax[k] = s1;
      stripVMin[k] = vMin;
      stripVMax[k] = vMax;
      stripBottom[k] = bottomEdge;
      stripTop[k] = topEdge;
      stripProbe[k] = sMid;
    }
  }

  /**
   * The gaps between the loaded polygon's corners for cutConvex; returns their count. Gap g is the open s
   * range gapLo[g] … gapHi[g] between two neighbouring corner values, narrowed until every edge's tolerant
   * range [lo, hi] either contains it (the edge spans the gap) or lies outside it (hi ≤ gapLo or lo ≥ gapHi):
   * in effect the corners' s ± 1e-12. A gap that cannot be narrowed so is left empty (gapLo = gapHi). The
   * spanning edges of gap g, ascending, are gapEdges[gapFirst[g] … gapFirst[g + 1] − 1].
   */
  private prepareGaps(): number {
    const { n, lo, hi, sorted } = this;
    if (this.gapLo.length < n) {
      this.gapLo = new Float64Array(2 * n);
      this.gapHi = new Float64Array(2 * n);
      this.gapFirst = new Int32Array(2 * n + 1);
    }
    if (this.gapEdges.length < n * n) this.gapEdges = new Int32Array(2 * n * n);
    const { gapLo, gapHi, gapFirst, gapEdges } = this;
    let nGaps = 0;
    let ne = 0;
    for (let c = 0; c + 1 < n; c++) {
      const x0 = sorted[c];
      const x1 = sorted[c + 1];
      if (!(x1 > x0)) continue; // equal corner values: no gap
      let gl = x0;
      let gh = x1;
      gapFirst[nGaps] = ne;
      for (let i = 0; i < n; i++) {
        const l = lo[i];
        const h = hi[i];
        if (l <= gl && h >= gh) gapEdges[ne++] = i; // spans
        else if (h <= gl || l >= gh) continue; // outside
        else if (l <= gl) gl = h; // ends inside the gap: the gap now starts at its end
        else if (h >= gh) gh = l; // starts inside the gap: the gap now ends at its start
        else gh = gl; // wholly inside: no fast gap
        if (!(gl < gh)) {
          gh = gl;
          break;
        }
      }
      if (!(gl < gh)) ne = gapFirst[nGaps]; // empty: no spanning edges kept
      gapLo[nGaps] = gl;
      gapHi[nGaps] = gh;
      nGaps++;
    }
    gapFirst[nGaps] = ne;
    return nGaps;
  }

  /** Makes room for `count` strips in the strip arrays (their contents are not kept). */
  private growStrips(count: number): void {
    const c = Math.max(count, this.stripSMin.length * 2);
    this.stripSMin = new Float64Array(c);
    this.stripSMax = new Float64Array(c);
    this.stripVMin = new Float64Array(c);
    this.stripVMax = new Float64Array(c);
    this.stripProbe = new Float64Array(c);
    this.stripBottom = new Int32Array(c);
    this.stripTop = new Int32Array(c);
  }

  /**
   * Connected pieces of the loaded polygon (any simple polygon) inside the strip a ≤ s ≤ b, into
   * `pieces[0 … count − 1]` sorted by vMin then sMin; returns the count.
   * The strip is cut into slabs at every corner s; in a slab the edges crossing it do not cross each
   * other (simple polygon), so the polygon is a stack of trapezoids, paired bottom/top in v order.
   * Trapezoids of neighbouring slabs whose v intervals overlap on the shared line are one piece.
   * Each piece's bottom and top edges are read in the middle of the piece, on the trapezoid there with the
   * lowest bottom (and the one with the highest top).
   */
  slice(a: number, b: number): number {
    const { n, ps, pv, qs, m, sorted } = this;
    if (X_VM.length < n) {
      X_VM = new Float64Array(2 * n);
      X_V0 = new Float64Array(2 * n);
      X_V1 = new Float64Array(2 * n);
      X_E = new Int32Array(2 * n);
    }
    if (CUT.length < n + 2) {
      CUT = new Float64Array(2 * n + 2);
      SLAB_START = new Int32Array(2 * n + 2);
    }
    // Cut lines: a, the corners strictly inside the strip in ascending s, b.
    const cuts = CUT;
    let nc = 0;
    cuts[nc++] = a;
    for (let i = 0; i < n; i++) if (sorted[i] > a && sorted[i] < b) cuts[nc++] = sorted[i];
    cuts[nc++] = b;
    // Trapezoids, slab by slab (a slab's trapezoids are consecutive; SLAB_START marks where each begins).
    let nt = 0;
    const slabStart = SLAB_START;
    let ns = 0;
    for (let k = 0; k + 1 < nc; k++) {
      const s0 = cuts[k];
      const s1 = cuts[k + 1];
      if (s1 - s0 <= 1e-12) continue;
      const sm = (s0 + s1) / 2;
      let nx = 0;
      for (let i = 0; i < n; i++) {
        const p0 = ps[i];
        if (p0 > sm !== qs[i] > sm) {
          const p1 = pv[i];
          const mi = m[i];
          const vm = p1 + (sm - p0) * mi;
          const v0 = p1 + (s0 - p0) * mi;
          const v1 = p1 + (s1 - p0) * mi;
          // insertion by vm (a handful of crossings)
          let j = nx - 1;
          while (j >= 0 && X_VM[j] > vm) {
            X_VM[j + 1] = X_VM[j];
            X_V0[j + 1] = X_V0[j];
            X_V1[j + 1] = X_V1[j];
            X_E[j + 1] = X_E[j];
            j--;
          }
          X_VM[j + 1] = vm;
          X_V0[j + 1] = v0;
          X_V1[j + 1] = v1;
          X_E[j + 1] = i;
          nx++;
        }
      }
      slabStart[ns++] = nt;
      ensureTraps(nt + (nx >> 1) + 1);
      for (let i = 0; i + 1 < nx; i += 2) {
        T_S0[nt] = s0;
        T_S1[nt] = s1;
        T_LO0[nt] = X_V0[i];
        T_LO1[nt] = X_V1[i];
        T_HI0[nt] = X_V0[i + 1];
        T_HI1[nt] = X_V1[i + 1];
        T_LOE[nt] = X_E[i];
        T_HIE[nt] = X_E[i + 1];
        T_PARENT[nt] = nt;
        nt++;
      }
    }
    slabStart[ns] = nt;
    if (ns <= 1) {
      // One slab (no corner strictly inside the strip): each trapezoid is a piece of its own, its own bottom
      // and top. The general steps below would find just that; their values are written directly, by the
      // same comparisons (extents grown from ±Infinity, the probe clamped to the trapezoid).
      for (let i = 0; i < nt; i++) {
        const s0 = T_S0[i] < Infinity ? T_S0[i] : Infinity;
        const s1 = T_S1[i] > -Infinity ? T_S1[i] : -Infinity;
        const lo = T_LO0[i] < T_LO1[i] ? T_LO0[i] : T_LO1[i];
        const hi = T_HI0[i] > T_HI1[i] ? T_HI0[i] : T_HI1[i];
        const sMid = (s0 + s1) / 2;
        this.addPiece(i, s0, s1, lo < Infinity ? lo : Infinity, hi > -Infinity ? hi : -Infinity, T_LOE[i], T_HIE[i], Math.min(Math.max(sMid, T_S0[i]), T_S1[i]));
      }
      return nt;
    }
    // Union-find over trapezoids of neighbouring slabs that touch along their shared line.
    for (let k = 0; k + 1 < ns; k++) {
      const l0 = slabStart[k];
      const l1 = slabStart[k + 1];
      const r1 = slabStart[k + 2];
      if (l0 === l1 || l1 === r1) continue;
      if (Math.abs(T_S1[l0] - T_S0[l1]) > 1e-12) continue;
      for (let i = l0; i < l1; i++) {
        for (let j = l1; j < r1; j++) {
          if (Math.max(T_LO1[i], T_LO0[j]) < Math.min(T_HI1[i], T_HI0[j]) - 1e-9) {
            let x = i;
            while (T_PARENT[x] !== x) x = T_PARENT[x];
            let y = j;
            while (T_PARENT[y] !== y) y = T_PARENT[y];
            T_PARENT[x] = y;
          }
        }
      }
    }
    // Each piece's extent, by its root.
    for (let i = 0; i < nt; i++) {
      let r = i;
      while (T_PARENT[r] !== r) r = T_PARENT[r];
      T_PARENT[i] = r;
    }
    for (let i = 0; i < nt; i++) {
      if (T_PARENT[i] !== i) continue;
      G_S0[i] = Infinity;
      G_S1[i] = -Infinity;
      G_V0[i] = Infinity;
      G_V1[i] = -Infinity;
      G_BOT[i] = -1;
      G_TOP[i] = -1;
      G_COL[i] = 0;
    }
    for (let i = 0; i < nt; i++) {
      const r = T_PARENT[i];
      if (T_S0[i] < G_S0[r]) G_S0[r] = T_S0[i];
      if (T_S1[i] > G_S1[r]) G_S1[r] = T_S1[i];
      const lo = T_LO0[i] < T_LO1[i] ? T_LO0[i] : T_LO1[i];
      const hi = T_HI0[i] > T_HI1[i] ? T_HI0[i] : T_HI1[i];
      if (lo < G_V0[r]) G_V0[r] = lo;
      if (hi > G_V1[r]) G_V1[r] = hi;
    }
    // The probe column: trapezoids containing the piece's middle (or all of the piece when none does).
    for (let i = 0; i < nt; i++) {
      const r = T_PARENT[i];
      const sMid = (G_S0[r] + G_S1[r]) / 2;
      if (T_S0[i] <= sMid && sMid <= T_S1[i]) G_COL[r] = 1;
    }
    for (let i = 0; i < nt; i++) {
      const r = T_PARENT[i];
      if (G_COL[r]) {
        const sMid = (G_S0[r] + G_S1[r]) / 2;
        if (!(T_S0[i] <= sMid && sMid <= T_S1[i])) continue;
      }
      const bot = G_BOT[r];
      if (bot < 0 || T_LO0[i] + T_LO1[i] < T_LO0[bot] + T_LO1[bot]) G_BOT[r] = i;
      const top = G_TOP[r];
      if (top < 0 || T_HI0[i] + T_HI1[i] > T_HI0[top] + T_HI1[top]) G_TOP[r] = i;
    }
    // One piece per root, in root order (see addPiece).
    let count = 0;
    for (let i = 0; i < nt; i++) {
      if (T_PARENT[i] !== i) continue;
      const bottom = G_BOT[i];
      const sMid = (G_S0[i] + G_S1[i]) / 2;
      this.addPiece(count++, G_S0[i], G_S1[i], G_V0[i], G_V1[i], T_LOE[bottom], T_HIE[G_TOP[i]], Math.min(Math.max(sMid, T_S0[bottom]), T_S1[bottom]));
    }
    return count;
  }

  /**
   * Writes piece number `count` into `pieces` and moves it to its place by (vMin, sMin) with a stable
   * insertion sort: pieces added in root order end up in the order of a stable Array.prototype.sort with
   * that comparator.
   */
  private addPiece(count: number, sMin: number, sMax: number, vMin: number, vMax: number, bottomEdge: number, topEdge: number, sProbe: number): void {
    const out = this.pieces;
    if (count === out.length) out.push(newComponent());
    const c = out[count];
    c.sMin = sMin;
    c.sMax = sMax;
    c.vMin = vMin;
    c.vMax = vMax;
    c.bottomEdge = bottomEdge;
    c.topEdge = topEdge;
    c.sProbe = sProbe;
    let j = count - 1;
    while (j >= 0 && (out[j].vMin - c.vMin || out[j].sMin - c.sMin) > 0) {
      out[j + 1] = out[j];
      j--;
    }
    out[j + 1] = c;
  }
}

/** The slicer behind stripComponents (each call loads the polygon afresh). */
const ONE_STRIP = new StripSlicer();

/**
 * Connected pieces of the polygon inside the strip a ≤ s ≤ b (local (s, v) coordinates), sorted by vMin then
 * sMin; see StripSlicer.slice. With `convex` the polygon is taken to be convex (StripSlicer.convex).
 * New objects each call: a caller cutting many strips of one polygon should use a StripSlicer.
 */
export function stripComponents(poly: readonly Pt[], a: number, b: number, convex = false): StripComponent[] {
  const s = ONE_STRIP.load(poly);
  if (convex) {
    const c = s.convex(a, b);
    return c ? [c] : [];
  }
  const count = s.slice(a, b);
  const out: StripComponent[] = [];
  for (let i = 0; i < count; i++) {
    const p = s.pieces[i];
    out.push({ sMin: p.sMin, sMax: p.sMax, vMin: p.vMin, vMax: p.vMax, bottomEdge: p.bottomEdge, topEdge: p.topEdge, sProbe: p.sProbe });
  }
  return out;
}

