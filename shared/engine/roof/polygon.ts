/**
 * Plane-polygon helpers: shoelace area, winding, simple-polygon test, point-in-polygon, and the
 * slicing used for panels, battens and clip lines. Points are [x, y] in feet (see ../units.ts).
 */
import type { PlanPoint } from "../units";

export type Pt = readonly [number, number];

/** In-place insertion sort, ascending: the arrays here hold a handful of numbers (no allocation). */
export function sortSmall(a: number[]): number[] {
  for (let i = 1; i < a.length; i++) {
    const x = a[i];
    let j = i - 1;
    while (j >= 0 && a[j] > x) {
      a[j + 1] = a[j];
      j--;
    }
    a[j + 1] = x;
  }
  return a;
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

function onSegment(p: Pt, a: Pt, b: Pt, eps: number): boolean {
  return (
    Math.min(a[0], b[0]) - eps <= p[0] &&
    p[0] <= Math.max(a[0], b[0]) + eps &&
    Math.min(a[1], b[1]) - eps <= p[1] &&
    p[1] <= Math.max(a[1], b[1]) + eps
  );
}

/** Do segments ab and cd touch or cross (closed segments)? */
export function segmentsIntersect(a: Pt, b: Pt, c: Pt, d: Pt, eps = 1e-9): boolean {
  const d1 = cross(c, d, a);
  const d2 = cross(c, d, b);
  const d3 = cross(a, b, c);
  const d4 = cross(a, b, d);
  if (((d1 > eps && d2 < -eps) || (d1 < -eps && d2 > eps)) && ((d3 > eps && d4 < -eps) || (d3 < -eps && d4 > eps))) return true;
  if (Math.abs(d1) <= eps && onSegment(a, c, d, eps)) return true;
  if (Math.abs(d2) <= eps && onSegment(b, c, d, eps)) return true;
  if (Math.abs(d3) <= eps && onSegment(c, a, b, eps)) return true;
  if (Math.abs(d4) <= eps && onSegment(d, a, b, eps)) return true;
  return false;
}

/**
 * Simple-polygon test: no repeated consecutive vertex, no edge touching a non-adjacent edge, and no
 * adjacent edges folding back on each other. Returns the first offending edge pair, or null when simple.
 * O(n²) in the vertex count of one plane (planes have a handful of vertices).
 */
export function selfIntersection(poly: readonly Pt[], minEdge = 1e-9): { i: number; j: number } | null {
  const n = poly.length;
  for (let i = 0; i < n; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % n];
    if (Math.sqrt((b[0] - a[0]) ** 2 + (b[1] - a[1]) ** 2) <= minEdge) return { i, j: i };
  }
  for (let i = 0; i < n; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % n];
    for (let j = i + 1; j < n; j++) {
      const c = poly[j];
      const d = poly[(j + 1) % n];
      const adjacent = j === i + 1 || (i === 0 && j === n - 1);
      if (adjacent) {
        // Adjacent edges share one vertex; they must not overlap beyond it (a fold-back).
        const shared = j === i + 1 ? b : a;
        const other1 = j === i + 1 ? a : b;
        const other2 = j === i + 1 ? d : c;
        const cr = cross(shared, other1, other2);
        const dot = (other1[0] - shared[0]) * (other2[0] - shared[0]) + (other1[1] - shared[1]) * (other2[1] - shared[1]);
        if (Math.abs(cr) <= 1e-9 && dot > 0) return { i, j };
        continue;
      }
      if (segmentsIntersect(a, b, c, d)) return { i, j };
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

/** Axis-aligned bounding box [minX, minY, maxX, maxY]. */
export function bbox(poly: readonly Pt[]): [number, number, number, number] {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const [x, y] of poly) {
    if (x < x0) x0 = x;
    if (y < y0) y0 = y;
    if (x > x1) x1 = x;
    if (y > y1) y1 = y;
  }
  return [x0, y0, x1, y1];
}

/**
 * Cross-section of a polygon (in local (s, v) coordinates) along the line v = c: the intervals of s
 * inside the polygon, sorted. Uses the half-open crossing rule, so a line through a vertex or along a
 * horizontal edge is counted once.
 */
export function intervalsAtV(poly: readonly Pt[], c: number): [number, number][] {
  const xs: number[] = [];
  const n = poly.length;
  for (let i = 0; i < n; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % n];
    if (a[1] > c !== b[1] > c) xs.push(a[0] + ((c - a[1]) * (b[0] - a[0])) / (b[1] - a[1]));
  }
  sortSmall(xs);
  const out: [number, number][] = [];
  for (let i = 0; i + 1 < xs.length; i += 2) out.push([xs[i], xs[i + 1]]);
  return out;
}

/** Cross-section along s = c: the intervals of v inside the polygon, sorted. */
export function intervalsAtS(poly: readonly Pt[], c: number): [number, number][] {
  const vs: number[] = [];
  const n = poly.length;
  for (let i = 0; i < n; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % n];
    if (a[0] > c !== b[0] > c) vs.push(a[1] + ((c - a[0]) * (b[1] - a[1])) / (b[0] - a[0]));
  }
  sortSmall(vs);
  const out: [number, number][] = [];
  for (let i = 0; i + 1 < vs.length; i += 2) out.push([vs[i], vs[i + 1]]);
  return out;
}

const CROSS: number[] = [];

/**
 * Lengths of the cross-section of a polygon (local (s, v)) along v = c (axis 1) or s = c (axis 0):
 * calls `each(length)` for each inside interval, without allocating. Same crossing rule as intervalsAtV/S.
 */
export function eachCrossSection(poly: readonly Pt[], axis: 0 | 1, c: number, each: (length: number) => void): void {
  const o = axis === 1 ? 0 : 1; // the coordinate measured along the line
  const n = poly.length;
  CROSS.length = 0;
  for (let i = 0; i < n; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % n];
    if (a[axis] > c !== b[axis] > c) CROSS.push(a[o] + ((c - a[axis]) * (b[o] - a[o])) / (b[axis] - a[axis]));
  }
  sortSmall(CROSS);
  for (let i = 0; i + 1 < CROSS.length; i += 2) each(CROSS[i + 1] - CROSS[i]);
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

function rootOf(parent: Int32Array, i: number): number {
  while (parent[i] !== i) i = parent[i];
  return i;
}

interface Trap {
  s0: number;
  s1: number;
  lo0: number;
  lo1: number;
  hi0: number;
  hi1: number;
  loEdge: number;
  hiEdge: number;
}

/**
 * Connected pieces of the polygon inside the strip a ≤ s ≤ b (local (s, v) coordinates).
 * The strip is cut into slabs at every vertex s; in a slab the edges crossing it do not cross each
 * other (simple polygon), so the polygon is a stack of trapezoids, paired bottom/top in v order.
 * Trapezoids of neighbouring slabs whose v intervals overlap on the shared line are one piece.
 */
export function stripComponents(poly: readonly Pt[], a: number, b: number, convex = false): StripComponent[] {
  if (convex) {
    const c = convexStripComponent(poly, a, b);
    return c ? [c] : [];
  }
  const n = poly.length;
  const cuts = [a, b];
  for (const p of poly) if (p[0] > a && p[0] < b) cuts.push(p[0]);
  sortSmall(cuts);
  const slabs: Trap[][] = [];
  for (let k = 0; k + 1 < cuts.length; k++) {
    const s0 = cuts[k];
    const s1 = cuts[k + 1];
    if (s1 - s0 <= 1e-12) continue;
    const sm = (s0 + s1) / 2;
    const xs: { vm: number; v0: number; v1: number; e: number }[] = [];
    for (let i = 0; i < n; i++) {
      const p = poly[i];
      const q = poly[(i + 1) % n];
      if (p[0] > sm !== q[0] > sm) {
        const m = (q[1] - p[1]) / (q[0] - p[0]);
        xs.push({ vm: p[1] + (sm - p[0]) * m, v0: p[1] + (s0 - p[0]) * m, v1: p[1] + (s1 - p[0]) * m, e: i });
      }
    }
    for (let i = 1; i < xs.length; i++) {
      const x = xs[i];
      let j = i - 1;
      while (j >= 0 && xs[j].vm > x.vm) {
        xs[j + 1] = xs[j];
        j--;
      }
      xs[j + 1] = x;
    }
    const traps: Trap[] = [];
    for (let i = 0; i + 1 < xs.length; i += 2) {
      const lo = xs[i];
      const hi = xs[i + 1];
      traps.push({ s0, s1, lo0: lo.v0, lo1: lo.v1, hi0: hi.v0, hi1: hi.v1, loEdge: lo.e, hiEdge: hi.e });
    }
    slabs.push(traps);
  }
  // Union-find over trapezoids (no closures: this runs once per strip).
  const all: Trap[] = [];
  const slabStart: number[] = [];
  for (const sl of slabs) {
    slabStart.push(all.length);
    for (const t of sl) all.push(t);
  }
  const parent = new Int32Array(all.length);
  for (let i = 0; i < all.length; i++) parent[i] = i;
  for (let k = 0; k + 1 < slabs.length; k++) {
    const left = slabs[k];
    const right = slabs[k + 1];
    if (left.length === 0 || right.length === 0) continue;
    if (Math.abs(left[0].s1 - right[0].s0) > 1e-12) continue;
    for (let i = 0; i < left.length; i++) {
      for (let j = 0; j < right.length; j++) {
        const L = left[i];
        const R = right[j];
        if (Math.max(L.lo1, R.lo0) < Math.min(L.hi1, R.hi0) - 1e-9) {
          let x = slabStart[k] + i;
          while (parent[x] !== x) x = parent[x];
          let y = slabStart[k + 1] + j;
          while (parent[y] !== y) y = parent[y];
          parent[x] = y;
        }
      }
    }
  }
  const find = rootOf;
  const groups = new Map<number, Trap[]>();
  for (let i = 0; i < all.length; i++) {
    const r = find(parent, i);
    const g = groups.get(r);
    if (g) g.push(all[i]);
    else groups.set(r, [all[i]]);
  }
  const out: StripComponent[] = [];
  for (const traps of groups.values()) {
    let sMin = Infinity, sMax = -Infinity, vMin = Infinity, vMax = -Infinity;
    for (const t of traps) {
      sMin = Math.min(sMin, t.s0);
      sMax = Math.max(sMax, t.s1);
      vMin = Math.min(vMin, t.lo0, t.lo1);
      vMax = Math.max(vMax, t.hi0, t.hi1);
    }
    // Probe edges at the piece's middle: the widest trapezoid column containing the centre.
    const sMid = (sMin + sMax) / 2;
    const col: Trap[] = [];
    for (const t of traps) if (t.s0 <= sMid && sMid <= t.s1) col.push(t);
    const use = col.length ? col : traps;
    let bottom = use[0];
    let top = use[0];
    for (const t of use) {
      if (t.lo0 + t.lo1 < bottom.lo0 + bottom.lo1) bottom = t;
      if (t.hi0 + t.hi1 > top.hi0 + top.hi1) top = t;
    }
    const sProbe = Math.min(Math.max(sMid, bottom.s0), bottom.s1);
    out.push({ sMin, sMax, vMin, vMax, bottomEdge: bottom.loEdge, topEdge: top.hiEdge, sProbe });
  }
  out.sort((p, q) => p.vMin - q.vMin || p.sMin - q.sMin);
  return out;
}

/** True when the polygon is convex (collinear corners allowed). */
export function isConvex(poly: readonly Pt[]): boolean {
  const n = poly.length;
  let sign = 0;
  for (let i = 0; i < n; i++) {
    const c = cross(poly[i], poly[(i + 1) % n], poly[(i + 2) % n]);
    if (Math.abs(c) <= 1e-12) continue;
    const s = c > 0 ? 1 : -1;
    if (sign === 0) sign = s;
    else if (s !== sign) return false;
  }
  return true;
}

/**
 * The strip's piece of a convex polygon (at most one): its v range is reached at the strip's sides or at
 * corners inside the strip. The same result as the general slab method, without its allocations.
 */
export function convexStripComponent(poly: readonly Pt[], a: number, b: number, into?: StripComponent): StripComponent | null {
  const n = poly.length;
  let sMinP = Infinity;
  let sMaxP = -Infinity;
  for (let i = 0; i < n; i++) {
    if (poly[i][0] < sMinP) sMinP = poly[i][0];
    if (poly[i][0] > sMaxP) sMaxP = poly[i][0];
  }
  const s0 = Math.max(a, sMinP);
  const s1 = Math.min(b, sMaxP);
  if (!(s1 - s0 > 1e-12)) return null;
  let vMin = Infinity;
  let vMax = -Infinity;
  for (let i = 0; i < n; i++) {
    const p = poly[i];
    if (p[0] >= s0 && p[0] <= s1) {
      if (p[1] < vMin) vMin = p[1];
      if (p[1] > vMax) vMax = p[1];
    }
  }
  const sMid = (s0 + s1) / 2;
  let bottomEdge = -1;
  let topEdge = -1;
  let vb = Infinity;
  let vt = -Infinity;
  for (let i = 0; i < n; i++) {
    const p = poly[i];
    const q = poly[(i + 1) % n];
    const lo = p[0] < q[0] ? p[0] : q[0];
    const hi = p[0] < q[0] ? q[0] : p[0];
    if (hi - lo < 1e-12) continue;
    const m = (q[1] - p[1]) / (q[0] - p[0]);
    // The edge's v at the strip sides it spans.
    for (let k = 0; k < 2; k++) {
      const s = k ? s1 : s0;
      if (s >= lo - 1e-12 && s <= hi + 1e-12) {
        const v = p[1] + (s - p[0]) * m;
        if (v < vMin) vMin = v;
        if (v > vMax) vMax = v;
      }
    }
    // Inclusive: at a corner both edges meeting there give the same v; the first one is kept.
    if (sMid >= lo - 1e-12 && sMid <= hi + 1e-12) {
      const v = p[1] + (sMid - p[0]) * m;
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
  if (bottomEdge < 0 || topEdge < 0) return null;
  if (into) {
    into.sMin = s0;
    into.sMax = s1;
    into.vMin = vMin;
    into.vMax = vMax;
    into.bottomEdge = bottomEdge;
    into.topEdge = topEdge;
    into.sProbe = sMid;
    return into;
  }
  return { sMin: s0, sMax: s1, vMin, vMax, bottomEdge, topEdge, sProbe: sMid };
}

/** Bounding box of plan points as [minX, minY, maxX, maxY]: alias kept for PlanPoint callers. */
export const planBbox = (pts: readonly PlanPoint[]) => bbox(pts);
