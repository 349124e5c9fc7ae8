/**
 * Wind zones and the fasteners they drive.
 *
 * Edge distance (ASCE 7-10 Fig. 30.4-1 notes; the same `a` for roofs steeper than 7° in ASCE 7-16/7-22):
 *   a = min(0.1 · L, 0.4 · h), but not less than 0.04 · L nor 3 ft
 * (L the least horizontal dimension, h the mean roof height). Fallbacks: L missing → the short side of
 * the smallest axis-aligned rectangle around all outlines; h missing → a = max(0.1 · L, 3 ft) with an
 * info advisory.
 *
 * Zone model for roofs steeper than 7° (a simplification of the ASCE 7-16 figures, which subdivide edges
 * further): zone 3 within a of two roof edges (eave, rake, ridge, hip) that meet at a corner, zone 2 within
 * a of one, zone 1 elsewhere; on hip roofs at 25° or less zone 3 is treated as zone 2 (ASCE 7-02/05
 * low-rise figure notes). Distances are in plan; lengths along a clip line are multiplied by k.
 * For θ ≤ 7° (p ≤ 1.47) ASCE 7-16 Fig. 30.3-2A uses widths in h: zone 2 band 0.6h, zone 3 corners
 * 0.6h × 0.2h, zone 1 from 0.6h to 1.2h, zone 1' beyond.
 * The panel maker's uplift schedule and a design professional govern.
 */
import type { PlaneGeometry } from "../roof/geometry";
import type { EdgePiece } from "../roof/edges";
import type { PanelLayout } from "../roof/panels";
import { sortPrefix, type Pt } from "../roof/polygon";

export type WindZone = "1'" | "1" | "2" | "3";
export const WIND_ZONES: readonly WindZone[] = ["1'", "1", "2", "3"];
/** Pitch at θ = 7°: 12·tan 7° ≈ 1.47. */
export const LOW_SLOPE_MAX_PITCH = 12 * Math.tan((7 * Math.PI) / 180);
/** Pitch at θ = 25°. */
export const HIP_ZONE3_MAX_PITCH = 12 * Math.tan((25 * Math.PI) / 180);
/** Above 45° (12/12) the figures do not apply. */
export const WIND_FIGURES_MAX_PITCH = 12;

/** The term of ASCE 7's edge distance that governs: 10 % of the least dimension, 40 % of the height, or a floor. */
export const EDGE_DISTANCE_TERMS = ["0.1L", "0.4h", "0.04L", "3 ft"] as const;
export type EdgeDistanceTerm = (typeof EDGE_DISTANCE_TERMS)[number];

export interface EdgeDistance {
  aFt: number;
  leastHorizontalDimensionFt: number;
  meanRoofHeightFt: number | null;
  /** Which term governs. */
  governs: EdgeDistanceTerm;
  heightMissing: boolean;
}

/** Edge distance a, ASCE 7-10 Fig. 30.4-1 note (see the module comment). */
export function edgeDistance(leastHorizontalDimensionFt: number, meanRoofHeightFt?: number | null): EdgeDistance {
  const L = leastHorizontalDimensionFt;
  const h = meanRoofHeightFt ?? null;
  if (h === null || !(h > 0)) {
    const a = Math.max(0.1 * L, 3);
    return { aFt: a, leastHorizontalDimensionFt: L, meanRoofHeightFt: null, governs: a === 3 ? "3 ft" : "0.1L", heightMissing: true };
  }
  const cands: [number, EdgeDistanceTerm][] = [[0.1 * L, "0.1L"], [0.4 * h, "0.4h"]];
  let [a, governs] = cands[0][0] <= cands[1][0] ? cands[0] : cands[1];
  const floor = Math.max(0.04 * L, 3);
  if (a < floor) {
    a = floor;
    governs = floor === 3 ? "3 ft" : "0.04L";
  }
  return { aFt: a, leastHorizontalDimensionFt: L, meanRoofHeightFt: h, governs, heightMissing: false };
}

/** Short side of the smallest axis-aligned rectangle around all outlines (the fallback for L). */
export function leastDimensionOfOutlines(outlines: readonly (readonly Pt[])[]): number {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const o of outlines)
    for (const [x, y] of o) {
      x0 = Math.min(x0, x);
      y0 = Math.min(y0, y);
      x1 = Math.max(x1, x);
      y1 = Math.max(y1, y);
    }
  return Math.min(x1 - x0, y1 - y0);
}

/**
 * Interval of t ∈ ℝ along the line p0 + t·d (d unit) where the distance to segment ab is ≤ r.
 * The set is the line's intersection with a stadium (convex), so the union of the line's intervals in
 * the two end disks and the middle rectangle is one interval.
 */
export function withinDistanceInterval(p0: Pt, d: Pt, a: Pt, b: Pt, r: number): [number, number] | null {
  const out = INTERVAL_SCRATCH;
  prepareEdge(ONE_EDGE, 0, a[0], a[1], b[0], b[1], d[0], d[1]);
  return intervalPrepared(p0[0], p0[1], d[0], d[1], ONE_EDGE, 0, r, out, 0) ? [out[0], out[1]] : null;
}

const INTERVAL_SCRATCH = new Float64Array(2);

export interface ZoneModel {
  kind: "steep" | "low-slope";
  aFt: number;
  /** Low-slope widths (ft, plan) when kind is "low-slope". */
  h?: number;
  /** Zone 3 is treated as zone 2 (hip roof at 25° or less). */
  zone3AsZone2: boolean;
}

interface RoofEdge {
  a: Pt;
  b: Pt;
  dir: Pt;
}

/**
 * A plane's roof edges as seen from a family of parallel lines (direction dx, dy), worked out once for all
 * the lines of a plane. Per edge, PREP numbers: a (0, 1), b (2, 3), the unit vector u along the edge (4, 5;
 * zero for a zero-length edge), its length L (6), the line direction's components along and across u
 * (7, 8), and the edge's extent across the lines (9, 10: min and max of the cross product p × d over its
 * two ends).
 */
const PREP = 11;
interface RoofEdges {
  edges: RoofEdge[];
  corners: [number, number][];
  prepared?: { dx: number; dy: number; v: Float64Array };
}

/** Scratch for withinDistanceInterval's single edge. */
const ONE_EDGE = new Float64Array(PREP);

/** Writes one edge's PREP numbers at offset o of v (see PREP). */
function prepareEdge(v: Float64Array, o: number, ax: number, ay: number, bx: number, by: number, dx: number, dy: number): void {
  v[o] = ax;
  v[o + 1] = ay;
  v[o + 2] = bx;
  v[o + 3] = by;
  const L = Math.sqrt((bx - ax) * (bx - ax) + (by - ay) * (by - ay));
  v[o + 6] = L;
  if (L > 0) {
    const ux = (bx - ax) / L;
    const uy = (by - ay) / L;
    v[o + 4] = ux;
    v[o + 5] = uy;
    v[o + 7] = dx * ux + dy * uy;
    v[o + 8] = -dx * uy + dy * ux;
  } else {
    v[o + 4] = 0;
    v[o + 5] = 0;
    v[o + 7] = 0;
    v[o + 8] = 0;
  }
  const pa = ax * dy - ay * dx;
  const pb = bx * dy - by * dx;
  v[o + 9] = Math.min(pa, pb);
  v[o + 10] = Math.max(pa, pb);
}

function prepare(roof: RoofEdges, dx: number, dy: number): Float64Array {
  const p = roof.prepared;
  if (p && p.dx === dx && p.dy === dy) return p.v;
  const edges = roof.edges;
  const v = new Float64Array(edges.length * PREP);
  for (let e = 0; e < edges.length; e++) {
    const ed = edges[e];
    prepareEdge(v, e * PREP, ed.a[0], ed.a[1], ed.b[0], ed.b[1], dx, dy);
  }
  roof.prepared = { dx, dy, v };
  return v;
}

/**
 * Interval of t along the line p + t·d within distance r of a prepared edge (offset o in v), written into
 * out[i], out[i+1]; returns whether it is non-empty. Allocation-free: the union of the line's intervals in
 * the two end disks and the middle rectangle (u along the edge in [0, L], across it in [−r, r]). The
 * rectangle is a slab clip: t where u0 + t·du stays in [0, L] and w0 + t·dw in [−r, r] (a line parallel to
 * a slab, |du| or |dw| < 1e-15, is inside it entirely or not at all). The common case (below) is kept
 * small so that it can be inlined into the per-line loops; the rest is in intervalFull.
 */
function intervalPrepared(px: number, py: number, dx: number, dy: number, v: Float64Array, o: number, r: number, out: Float64Array, i: number): boolean {
  // Fast case: the line crosses the band |w| ≤ r well inside the edge's ends. Then the answer is the
  // band slab alone, bit for bit, and the end disks and the u slab need not be worked out. Why: let P be
  // where the line meets w = ±r (the band slab's ends ta, tb) and m = 0.2·r. If m ≤ u ≤ L − m at both P
  // (u is linear along the line, so between them too), then
  //  - the u slab's ends lie at least m / |du| ≥ m beyond ta and tb along the line (t is arc length);
  //  - a point Q of the line in an end disk is inside the band, so between the two P; and where the line
  //    meets the disk's circle (|Q − end| = r) it is at least |P − end| − r ≥ √(m² + r²) − r ≈ 0.0198·r
  //    from either P, as |P − end| ≥ √(m² + r²).
  // So the original min/max over the disks and slabs picks ta and tb unless rounding moves a value by
  // about 0.02·r. The guards keep every rounding far smaller (≤ 3e-4·r, over 60 times less; m was 0.49·r,
  // a margin of 0.11·r, until clip lines 1.3 ft from an edge's end, common at 16 in panels and a = 3 ft,
  // were seen to take the full path needlessly): |dw| ≥ 0.01 (the line is not nearly
  // parallel to the edge, so ta and tb carry a relative error of a few 1e-16 over 0.01), and
  // r ≥ 1e-4 · (|u0| + |w0| + L), which bounds the distance from p to either end by 1e4·r; the worst
  // rounding is in a near-tangent disk, √(a few ε) ≈ 3e-8 of that distance, i.e. ≤ 3e-4·r.
  // The values returned are the very ta, tb the full path would compute (same expressions).
  const L0 = v[o + 6];
  const dw0 = v[o + 8];
  if (L0 > 0 && (dw0 >= 0.01 || dw0 <= -0.01)) {
    const fx0 = px - v[o];
    const fy0 = py - v[o + 1];
    const ux = v[o + 4];
    const uy = v[o + 5];
    const u0 = fx0 * ux + fy0 * uy;
    const w0 = -fx0 * uy + fy0 * ux;
    if (r >= 1e-4 * (Math.abs(u0) + Math.abs(w0) + L0)) {
      let ta = (-r - w0) / dw0;
      let tb = (r - w0) / dw0;
      if (ta > tb) {
        const x = ta;
        ta = tb;
        tb = x;
      }
      const du = v[o + 7];
      const ua = u0 + du * ta;
      const ub = u0 + du * tb;
      const m = 0.2 * r;
      if (ua >= m && ua <= L0 - m && ub >= m && ub <= L0 - m) {
        out[i] = ta;
        out[i + 1] = tb;
        return true;
      }
    }
  }
  const q = FULL_ARGS;
  q[0] = px;
  q[1] = py;
  q[2] = dx;
  q[3] = dy;
  q[4] = r;
  return intervalFull(q, v, o, out, i);
}

/**
 * intervalFull's number arguments px, py, dx, dy, r, passed in this scratch array: V8 does not inline
 * intervalFull, and a double passed to a call that is not inlined is boxed (a heap number each).
 */
const FULL_ARGS = new Float64Array(5);

/** intervalPrepared without its fast case: the disks and the two slabs, always (numbers in q, see FULL_ARGS). */
function intervalFull(q: Float64Array, v: Float64Array, o: number, out: Float64Array, i: number): boolean {
  const px = q[0];
  const py = q[1];
  const dx = q[2];
  const dy = q[3];
  const r = q[4];
  let lo = Infinity;
  let hi = -Infinity;
  // End disks: |p + t·d − end|² = r², a quadratic in t with half-coefficient B (d is a unit vector).
  const ax = v[o];
  const ay = v[o + 1];
  let fx = px - ax;
  let fy = py - ay;
  let B = dx * fx + dy * fy;
  let disc = B * B - (fx * fx + fy * fy - r * r);
  if (disc >= 0) {
    const sq = Math.sqrt(disc);
    lo = -B - sq;
    hi = -B + sq;
  }
  fx = px - v[o + 2];
  fy = py - v[o + 3];
  B = dx * fx + dy * fy;
  disc = B * B - (fx * fx + fy * fy - r * r);
  if (disc >= 0) {
    const sq = Math.sqrt(disc);
    if (-B - sq < lo) lo = -B - sq;
    if (-B + sq > hi) hi = -B + sq;
  }
  const L = v[o + 6];
  if (L > 0) {
    const ux = v[o + 4];
    const uy = v[o + 5];
    const u0 = (px - ax) * ux + (py - ay) * uy;
    const w0 = -(px - ax) * uy + (py - ay) * ux;
    let s0 = -Infinity;
    let s1 = Infinity;
    // Slab 0 ≤ u ≤ L along the edge.
    const du = v[o + 7];
    if (Math.abs(du) < 1e-15) {
      if (u0 < 0 || u0 > L) {
        s0 = Infinity;
        s1 = -Infinity;
      }
    } else {
      let ta = (0 - u0) / du;
      let tb = (L - u0) / du;
      if (ta > tb) {
        const x = ta;
        ta = tb;
        tb = x;
      }
      if (ta > s0) s0 = ta;
      if (tb < s1) s1 = tb;
    }
    // Slab −r ≤ w ≤ r across it.
    const dw = v[o + 8];
    if (Math.abs(dw) < 1e-15) {
      if (w0 < -r || w0 > r) {
        s0 = Infinity;
        s1 = -Infinity;
      }
    } else {
      let ta = (-r - w0) / dw;
      let tb = (r - w0) / dw;
      if (ta > tb) {
        const x = ta;
        ta = tb;
        tb = x;
      }
      if (ta > s0) s0 = ta;
      if (tb < s1) s1 = tb;
    }
    if (s0 <= s1) {
      if (s0 < lo) lo = s0;
      if (s1 > hi) hi = s1;
    }
  }
  out[i] = lo;
  out[i + 1] = hi;
  return lo <= hi;
}

/** Two ends within 0.01 ft of each other meet. */
const near = (p: Pt, q: Pt) => (p[0] - q[0]) * (p[0] - q[0]) + (p[1] - q[1]) * (p[1] - q[1]) <= 0.01 * 0.01;

/** Same as near() on raw coordinates. */
const nearXY = (px: number, py: number, qx: number, qy: number) => (px - qx) * (px - qx) + (py - qy) * (py - qy) <= 0.01 * 0.01;

/** Whether an edge bounds the roof for the wind zones: eave, rake, ridge or hip (plain comparisons, no lookup). */
const isRoofEdgeType = (t: string) => t === "eave" || t === "rake" || t === "ridge" || t === "hip";

/** The roof edges of a plane and its corner pairs (two roof edges meeting at a corner, not in line). */
export function planeRoofEdges(pieces: EdgePiece[]): RoofEdges {
  const edges: RoofEdge[] = [];
  for (const pc of pieces) {
    if (!isRoofEdgeType(pc.type)) continue;
    const dx = pc.to[0] - pc.from[0];
    const dy = pc.to[1] - pc.from[1];
    const l = Math.sqrt(dx * dx + dy * dy) || 1;
    edges.push({ a: pc.from, b: pc.to, dir: [dx / l, dy / l] });
  }
  const corners: [number, number][] = [];
  for (let i = 0; i < edges.length; i++)
    for (let j = i + 1; j < edges.length; j++) {
      const e = edges[i];
      const f = edges[j];
      const meet = near(e.a, f.a) || near(e.a, f.b) || near(e.b, f.a) || near(e.b, f.b);
      if (!meet) continue;
      if (Math.abs(e.dir[0] * f.dir[1] - e.dir[1] * f.dir[0]) <= 1e-3) continue; // in line: not a corner
      corners.push([i, j]);
    }
  return { edges, corners };
}

/**
 * The roof edges of one plane in flat form for the segment core: `ne` edges prepared for one line
 * direction (PREP numbers each) and `nq` corners as pairs of edge indices.
 */
interface FlatRoof {
  prep: Float64Array;
  ne: number;
  corners: Int32Array;
  nq: number;
}

// Reused across calls (the engine is synchronous and single-threaded): the plane planeFasteners is on,
// and the roof zoneSegmentsAlong was given.
const PLANE_ROOF: FlatRoof = { prep: new Float64Array(8 * PREP), ne: 0, corners: new Int32Array(16), nq: 0 };
const ALONG_ROOF: FlatRoof = { prep: new Float64Array(0), ne: 0, corners: new Int32Array(16), nq: 0 };

/**
 * planeRoofEdges and prepare in one pass with no object per edge: the same edges (roof edge types, in
 * piece order) and corners (same tests, same order) written into PLANE_ROOF, prepared for direction
 * (dx, dy). The edge's unit vector u (PREP 4, 5) is planeRoofEdges' `dir`: both are (b − a) / |b − a|, and
 * zero for a zero-length edge, which then never makes a corner.
 */
function planeRoofInto(pieces: EdgePiece[], dx: number, dy: number): FlatRoof {
  const roof = PLANE_ROOF;
  let ne = 0;
  for (let i = 0; i < pieces.length; i++) if (isRoofEdgeType(pieces[i].type)) ne++;
  if (roof.prep.length < ne * PREP) roof.prep = new Float64Array(ne * 2 * PREP);
  const v = roof.prep;
  let e = 0;
  for (let i = 0; i < pieces.length; i++) {
    const pc = pieces[i];
    if (!isRoofEdgeType(pc.type)) continue;
    prepareEdge(v, e * PREP, pc.from[0], pc.from[1], pc.to[0], pc.to[1], dx, dy);
    e++;
  }
  let nq = 0;
  for (let i = 0; i < ne; i++) {
    const oi = i * PREP;
    const eax = v[oi], eay = v[oi + 1], ebx = v[oi + 2], eby = v[oi + 3];
    for (let j = i + 1; j < ne; j++) {
      const oj = j * PREP;
      const fax = v[oj], fay = v[oj + 1], fbx = v[oj + 2], fby = v[oj + 3];
      const meet = nearXY(eax, eay, fax, fay) || nearXY(eax, eay, fbx, fby) || nearXY(ebx, eby, fax, fay) || nearXY(ebx, eby, fbx, fby);
      if (!meet) continue;
      if (Math.abs(v[oi + 4] * v[oj + 5] - v[oi + 5] * v[oj + 4]) <= 1e-3) continue; // in line: not a corner
      if (roof.corners.length < 2 * nq + 2) {
        const c = new Int32Array(roof.corners.length * 2);
        c.set(roof.corners);
        roof.corners = c;
      }
      roof.corners[2 * nq] = i;
      roof.corners[2 * nq + 1] = j;
      nq++;
    }
  }
  roof.ne = ne;
  roof.nq = nq;
  return roof;
}

export interface ZoneSegment {
  zone: WindZone;
  /** Plan length along the line, ft. */
  planFt: number;
}

/**
 * Zones along the plan segment p0 → p0 + len·d. Breakpoints are where the distance to a roof edge
 * crosses a zone width; each piece between breakpoints is classified at its midpoint.
 */
export function zoneSegmentsAlong(
  p0: Pt,
  d: Pt,
  len: number,
  roof: RoofEdges,
  model: ZoneModel,
): ZoneSegment[] {
  const flat = ALONG_ROOF;
  flat.prep = prepare(roof, d[0], d[1]);
  flat.ne = roof.edges.length;
  flat.nq = roof.corners.length;
  if (flat.corners.length < 2 * flat.nq) flat.corners = new Int32Array(4 * flat.nq);
  for (let q = 0; q < flat.nq; q++) {
    flat.corners[2 * q] = roof.corners[q][0];
    flat.corners[2 * q + 1] = roof.corners[q][1];
  }
  ensureScratch(flat);
  const line = LINE;
  line[0] = p0[0];
  line[1] = p0[1];
  line[2] = d[0];
  line[3] = d[1];
  line[4] = len;
  const n = segmentInto(line, flat, model);
  const out: ZoneSegment[] = [];
  for (let i = 0; i < n; i++) out.push({ zone: ZONE_BY_CODE[SEG_ZONE[i]], planFt: SEG_LEN[i] });
  return out;
}

const ZONE_BY_CODE: WindZone[] = ["1'", "1", "2", "3"];
// Scratch buffers reused across calls (the engine is synchronous and single-threaded).
let IV = new Float64Array(64);
let CUTS = new Float64Array(64);
let SEG_ZONE = new Int8Array(64);
let SEG_LEN = new Float64Array(64);
let ACTIVE_CORNERS = new Int32Array(16);
let REACH = new Int32Array(16);

/**
 * Appends one classified piece to segZone / segLen (SEG_ZONE / SEG_LEN, ns pieces so far), merging it into
 * the previous piece when that has the same zone; returns the new count.
 */
function pushSegment(segZone: Int8Array, segLen: Float64Array, ns: number, zone: number, seg: number): number {
  if (ns > 0 && segZone[ns - 1] === zone) {
    segLen[ns - 1] += seg;
    return ns;
  }
  segZone[ns] = zone;
  segLen[ns] = seg;
  return ns + 1;
}

/** Grows the scratch buffers for a roof (once per roof, so the per-line code need not check). */
function ensureScratch(roof: FlatRoof): void {
  const ne = roof.ne;
  if (IV.length < ne * 6) IV = new Float64Array(ne * 12);
  if (CUTS.length < ne * 6 + 2) {
    CUTS = new Float64Array(ne * 12 + 4);
    SEG_ZONE = new Int8Array(ne * 12 + 4);
    SEG_LEN = new Float64Array(ne * 12 + 4);
  }
  if (ACTIVE_CORNERS.length < roof.nq * 2) ACTIVE_CORNERS = new Int32Array(roof.nq * 4);
  if (REACH.length < ne) REACH = new Int32Array(ne * 2);
}

/**
 * The line segmentInto works on: p (0, 1), the unit direction d (2, 3) and the length len (4). Passed in
 * this scratch array rather than as number arguments: a double passed to a call that V8 does not inline
 * is boxed (a heap number each), and that was about 20 bytes of garbage per clip line.
 */
const LINE = new Float64Array(5);

/**
 * Allocation-free core of zoneSegmentsAlong for the line p + t·d, 0 ≤ t ≤ len (read from `line`, see
 * LINE): writes merged segments into SEG_ZONE / SEG_LEN (zone codes 0..3 for 1', 1, 2, 3) and returns how
 * many there are. The scratch must have been grown for this roof (ensureScratch).
 */
function segmentInto(line: Float64Array, roof: FlatRoof, model: ZoneModel): number {
  if (!(line[4] > 0)) return 0;
  return model.kind === "steep" ? steepSegmentsInto(line, roof, model) : lowSlopeSegmentsInto(line, roof, model);
}

/**
 * Steep roofs: one width a for zones 2 and 3, so one interval per edge (IV[2e], IV[2e+1]; empty as
 * +∞, −∞): zone 3 where the intervals of a corner's two edges overlap, zone 2 where any interval is,
 * zone 1 elsewhere. Zone 3 lies inside zone 2, so the corners are looked at only where zone 2 is, and not
 * at all when zone 3 counts as zone 2.
 */
function steepSegmentsInto(line: Float64Array, roof: FlatRoof, model: ZoneModel): number {
  const px = line[0];
  const py = line[1];
  const dx = line[2];
  const dy = line[3];
  const len = line[4];
  const a = model.aFt;
  const zone3AsZone2 = model.zone3AsZone2;
  const prep = roof.prep;
  const ne = roof.ne;
  const iv = IV;
  const cuts = CUTS;
  const active = ACTIVE_CORNERS;
  const reach = REACH;
  const segZone = SEG_ZONE;
  const segLen = SEG_LEN;
  // The cut 0 goes first and len last (after the sort): every other cut lies strictly between them, so len
  // need not be sorted in, and the sorted list is the same.
  cuts[0] = 0;
  let nc = 1;
  // reach[0..nr) lists (by IV offset) the intervals that meet the open segment (0, len): only those can
  // hold a piece's midpoint, which lies strictly inside it (pieces are longer than 1e-9).
  let nr = 0;
  const rMax = Math.max(0, a);
  const across = px * dy - py * dx; // the line's position across its direction
  for (let e = 0; e < ne; e++) {
    const o = e * 2;
    const po = e * PREP;
    if (
      across < prep[po + 9] - rMax ||
      across > prep[po + 10] + rMax || // farther than the zone width from this edge, measured across the line
      !(a > 0) ||
      !intervalPrepared(px, py, dx, dy, prep, po, a, iv, o)
    ) {
      iv[o] = Infinity;
      iv[o + 1] = -Infinity;
      continue;
    }
    const lo = iv[o];
    const hi = iv[o + 1];
    if (lo > 0 && lo < len) cuts[nc++] = lo;
    if (hi > 0 && hi < len) cuts[nc++] = hi;
    if (lo < len && hi > 0) reach[nr++] = o;
  }
  sortPrefix(cuts, nc);
  cuts[nc++] = len;
  // Only corners whose two edges both come within reach of this line can put any of it in zone 3.
  // (A corner also needs both its intervals to meet (0, len), where the midpoints are: with fewer than two
  // such intervals no corner can, and the list stays empty.)
  let na = 0;
  if (!zone3AsZone2 && nr >= 2) {
    const corners = roof.corners;
    for (let q = 0; q < roof.nq; q++) {
      const i = corners[2 * q] * 2;
      const j = corners[2 * q + 1] * 2;
      if (iv[i] <= iv[i + 1] && iv[j] <= iv[j + 1]) {
        active[na++] = i;
        active[na++] = j;
      }
    }
  }
  let ns = 0;
  for (let c = 0; c + 1 < nc; c++) {
    const seg = cuts[c + 1] - cuts[c];
    if (seg <= 1e-9) continue;
    const t = (cuts[c] + cuts[c + 1]) / 2;
    let zone = 1;
    for (let x = 0; x < nr; x++) {
      const o = reach[x];
      if (iv[o] <= t && t <= iv[o + 1]) {
        zone = 2;
        break;
      }
    }
    if (zone === 2)
      for (let q = 0; q < na; q += 2) {
        const i = active[q];
        const j = active[q + 1];
        if (iv[i] <= t && t <= iv[i + 1] && iv[j] <= t && t <= iv[j + 1]) {
          zone = 3;
          break;
        }
      }
    ns = pushSegment(segZone, segLen, ns, zone, seg);
  }
  return ns;
}

/**
 * Low-slope roofs (widths in h): per edge three intervals at IV[6e..6e+6): I2 (zone 2 band 0.6h),
 * I3 (zone 3 short side 0.2h), I1 (zone 1 band 1.2h). Zone 3 (or 2 when zone 3 counts as zone 2) where
 * one edge of a corner has I3 and the other I2; else zone 2 in any I2, zone 1 in any I1, zone 1' elsewhere.
 */
function lowSlopeSegmentsInto(line: Float64Array, roof: FlatRoof, model: ZoneModel): number {
  const px = line[0];
  const py = line[1];
  const dx = line[2];
  const dy = line[3];
  const len = line[4];
  const h = model.h!;
  const zone3AsZone2 = model.zone3AsZone2;
  const r2 = 0.6 * h;
  const r3 = 0.2 * h;
  const r1 = 1.2 * h;
  const prep = roof.prep;
  const ne = roof.ne;
  const iv = IV;
  const cuts = CUTS;
  const active = ACTIVE_CORNERS;
  const segZone = SEG_ZONE;
  const segLen = SEG_LEN;
  // The cut 0 goes first and len last (after the sort): every other cut lies strictly between them, so len
  // need not be sorted in, and the sorted list is the same.
  cuts[0] = 0;
  let nc = 1;
  const rMax = Math.max(r1, r2, r3);
  const across = px * dy - py * dx; // the line's position across its direction
  for (let e = 0; e < ne; e++) {
    const o = e * 6;
    const po = e * PREP;
    if (across < prep[po + 9] - rMax || across > prep[po + 10] + rMax) {
      // farther than any zone width from this edge, measured across the line
      for (let k = 0; k < 6; k += 2) {
        iv[o + k] = Infinity;
        iv[o + k + 1] = -Infinity;
      }
      continue;
    }
    for (let k = 0; k < 3; k++) {
      const r = k === 0 ? r2 : k === 1 ? r3 : r1;
      const ok = o + k * 2;
      if (k === 1 && r3 === r2) {
        iv[ok] = iv[o];
        iv[ok + 1] = iv[o + 1];
        continue;
      }
      if (!(r > 0) || !intervalPrepared(px, py, dx, dy, prep, po, r, iv, ok)) {
        iv[ok] = Infinity;
        iv[ok + 1] = -Infinity;
        continue;
      }
      if (iv[ok] > 0 && iv[ok] < len) cuts[nc++] = iv[ok];
      if (iv[ok + 1] > 0 && iv[ok + 1] < len) cuts[nc++] = iv[ok + 1];
    }
  }
  sortPrefix(cuts, nc);
  cuts[nc++] = len;
  // Only corners whose two edges both come within reach of this line can put any of it in zone 3.
  const corners = roof.corners;
  let na = 0;
  for (let q = 0; q < roof.nq; q++) {
    const i = corners[2 * q] * 6;
    const j = corners[2 * q + 1] * 6;
    if ((iv[i] <= iv[i + 1] || iv[i + 2] <= iv[i + 3]) && (iv[j] <= iv[j + 1] || iv[j + 2] <= iv[j + 3])) {
      active[na++] = i;
      active[na++] = j;
    }
  }
  let ns = 0;
  for (let c = 0; c + 1 < nc; c++) {
    const seg = cuts[c + 1] - cuts[c];
    if (seg <= 1e-9) continue;
    const t = (cuts[c] + cuts[c + 1]) / 2;
    let in3 = false;
    for (let q = 0; q < na && !in3; q += 2) {
      const i = active[q];
      const j = active[q + 1];
      const i2 = iv[i] <= t && t <= iv[i + 1];
      const i3 = iv[i + 2] <= t && t <= iv[i + 3];
      const j2 = iv[j] <= t && t <= iv[j + 1];
      const j3 = iv[j + 2] <= t && t <= iv[j + 3];
      in3 = (i3 && j2) || (i2 && j3);
    }
    let zone: number;
    if (in3) zone = zone3AsZone2 ? 2 : 3;
    else {
      let in2 = false;
      let in1 = false;
      for (let e = 0; e < ne; e++) {
        const o = e * 6;
        if (iv[o] <= t && t <= iv[o + 1]) in2 = true;
        if (iv[o + 4] <= t && t <= iv[o + 5]) in1 = true;
      }
      zone = in2 ? 2 : in1 ? 1 : 0;
    }
    ns = pushSegment(segZone, segLen, ns, zone, seg);
  }
  return ns;
}

export type ZoneSpacing = Record<"field" | "edge" | "corner", number>;
export const zoneKey = (z: WindZone): "field" | "edge" | "corner" => (z === "3" ? "corner" : z === "2" ? "edge" : "field");

export interface ZoneCounts {
  clips: number;
  /** Clip-line length by zone, true (along the slope), ft. */
  lineFt: number;
  /** Panel area by zone along the slope, ft² (exposed-fastener screws are counted per square of it). */
  areaSqFt: number;
  /** Exposed-fastener screws (unrounded: a rate per square). */
  panelScrews: number;
}

export interface PlaneWindZones {
  model: "steep" | "low-slope";
  aFt: number;
  /** Zone widths measured in plan and along the slope (plan × k), ft. */
  widths: {
    zone2PlanFt: number;
    zone2SlopeFt: number;
    zone3PlanFt: [number, number];
    zone3SlopeFt: [number, number];
    zone1PlanFt?: number;
    zone1SlopeFt?: number;
  };
  zone3AsZone2: boolean;
  /** Spacing actually used per zone along the clip lines (in), after the batten limit. */
  clipSpacingIn: ZoneSpacing;
  zones: Record<WindZone, ZoneCounts>;
  clips: number;
  clipsPerPanel: number[];
  panelScrews: number;
  /** Zones whose required spacing is closer than the battens allow. */
  spacingLimitedByBattens: WindZone[];
}

export interface PlaneFastenerOptions {
  system: "standing-seam" | "exposed-fastener";
  model: ZoneModel;
  clipSpacingIn: ZoneSpacing;
  screwsPerSquare: ZoneSpacing;
  /** Horizontal batten spacing along the slope when clips can land only on battens, in. */
  battenSpacingIn: number | null;
}

// Per-zone tallies of the plane planeFasteners is on, by zone code (1', 1, 2, 3): clips, line ft, area,
// screws. Reused across calls (the engine is synchronous and single-threaded).
const Z_CLIPS = new Float64Array(4);
const Z_LINE = new Float64Array(4);
const Z_AREA = new Float64Array(4);
const Z_SCREWS = new Float64Array(4);
const SPACING_OF = new Float64Array(4);
const SCREWS_OF = new Float64Array(4);

/**
 * Share c clips of one run (segments i0..i1) among its zones in proportion to length (largest remainder):
 * each zone gets the whole part of its exact share c · length / total (with 1e-9 of slack), and the clips
 * left over go one each to the largest remainders (the lowest zone code first on a tie). The four exact
 * shares are kept in locals e0..e3 (registers, not a scratch array), summed in segment order as before.
 */
function distribute(c: number, i0: number, i1: number, total: number, segZone: Int8Array, segLen: Float64Array, clipsByZone: Float64Array) {
  if (c === 0 || !(total > 0)) return;
  let e0 = 0;
  let e1 = 0;
  let e2 = 0;
  let e3 = 0;
  for (let i = i0; i <= i1; i++) {
    const x = (c * segLen[i]) / total;
    const z = segZone[i];
    if (z === 2) e2 += x;
    else if (z === 1) e1 += x;
    else if (z === 3) e3 += x;
    else e0 += x;
  }
  const f0 = Math.floor(e0 + 1e-9);
  const f1 = Math.floor(e1 + 1e-9);
  const f2 = Math.floor(e2 + 1e-9);
  const f3 = Math.floor(e3 + 1e-9);
  clipsByZone[0] += f0;
  clipsByZone[1] += f1;
  clipsByZone[2] += f2;
  clipsByZone[3] += f3;
  let given = f0 + f1 + f2 + f3;
  e0 -= f0;
  e1 -= f1;
  e2 -= f2;
  e3 -= f3;
  while (given < c) {
    // The largest remainder, the first in zone order on a tie; a zone served is set to −1.
    let best = 0;
    let bv = e0;
    if (e1 > bv) {
      best = 1;
      bv = e1;
    }
    if (e2 > bv) {
      best = 2;
      bv = e2;
    }
    if (e3 > bv) best = 3;
    clipsByZone[best] += 1;
    if (best === 0) e0 = -1;
    else if (best === 1) e1 = -1;
    else if (best === 2) e2 = -1;
    else e3 = -1;
    given++;
  }
}

/** Whether battens spaced battenSpacingIn force a clip spacing wider than the askedIn. */
function limitedByBattens(askedIn: number, battenSpacingIn: number | null): boolean {
  return battenSpacingIn !== null && battenSpacingIn > 0 && askedIn < battenSpacingIn - 1e-9;
}

/** The n zones whose codes are packed 2 bits each in order (see planeFasteners), as a new array of n. */
function limitedList(order: number, n: number): WindZone[] {
  const z = ZONE_BY_CODE;
  const a = z[order & 3];
  if (n === 1) return [a];
  const b = z[(order >> 2) & 3];
  if (n === 2) return [a, b];
  const c = z[(order >> 4) & 3];
  if (n === 3) return [a, b, c];
  return [a, b, c, z[(order >> 6) & 3]];
}

/** The tallies of zone code z (see Z_CLIPS) as a ZoneCounts. */
function zoneTally(z: number): ZoneCounts {
  return { clips: Z_CLIPS[z], lineFt: Z_LINE[z], areaSqFt: Z_AREA[z], panelScrews: Z_SCREWS[z] };
}

/** Clip spacing usable over battens: a whole multiple of the batten spacing, never closer than it. */
export function spacingOverBattens(requiredIn: number, battenSpacingIn: number | null): number {
  if (!battenSpacingIn) return requiredIn;
  return battenSpacingIn * Math.max(1, Math.floor(requiredIn / battenSpacingIn + 1e-9));
}

/** What planeFasteners gives with detail "totals": the plane's counts, none of its drawing detail. */
export type PlaneFastenerTotals = Pick<PlaneWindZones, "clips" | "panelScrews" | "zones" | "spacingLimitedByBattens">;

/**
 * How much planeFasteners returns: "full" (the default) a new PlaneWindZones; "totals" only the counts
 * (PlaneFastenerTotals) in ONE object that every "totals" call reuses and overwrites (its `zones` and their
 * ZoneCounts too), so it allocates nothing per plane: read it before the next call and keep none of it
 * except `spacingLimitedByBattens`, which is a new array when not empty (a shared frozen one when empty).
 */
export type PlaneFastenerDetail = "full" | "totals";

// The one PlaneFastenerTotals that "totals" calls fill in. Its number fields start as NaN, a double, so
// that they hold doubles from the start (no change of object shape when first written).
const newZoneCounts = (): ZoneCounts => ({ clips: NaN, lineFt: NaN, areaSqFt: NaN, panelScrews: NaN });
const TOTALS_ZONES: Record<WindZone, ZoneCounts> = { "1'": newZoneCounts(), "1": newZoneCounts(), "2": newZoneCounts(), "3": newZoneCounts() };
const NONE_LIMITED: WindZone[] = Object.freeze([]) as unknown as WindZone[];
const NO_CLIPS: number[] = Object.freeze([]) as unknown as number[];
const TOTALS: PlaneFastenerTotals = { clips: NaN, panelScrews: NaN, zones: TOTALS_ZONES, spacingLimitedByBattens: NONE_LIMITED };

/** Writes the tallies of zone code z (see Z_CLIPS) into c. */
function setZoneTally(c: ZoneCounts, z: number): void {
  c.clips = Z_CLIPS[z];
  c.lineFt = Z_LINE[z];
  c.areaSqFt = Z_AREA[z];
  c.panelScrews = Z_SCREWS[z];
}

/**
 * Clips and exposed-fastener screws of one plane by zone. One clip line per panel (at its seam on the
 * starting side; the last panel's free edge is held by the rake cleat, counted with trim). Along a line
 * n = 1 + Σ ceil(segment / zone spacing); the extra clip goes to the zone at the line's eave end.
 * Exposed-fastener screws: panel area by zone (panel width × zone length along the panel's centre line)
 * × screws per square. With detail "totals" only the counts come back, in a reused object (see
 * PlaneFastenerDetail); the counts are the same either way.
 */
export function planeFasteners(g: PlaneGeometry, pieces: EdgePiece[], panels: PanelLayout, opts: PlaneFastenerOptions, detail?: "full"): PlaneWindZones;
export function planeFasteners(g: PlaneGeometry, pieces: EdgePiece[], panels: PanelLayout, opts: PlaneFastenerOptions, detail: "totals"): PlaneFastenerTotals;
export function planeFasteners(
  g: PlaneGeometry,
  pieces: EdgePiece[],
  panels: PanelLayout,
  opts: PlaneFastenerOptions,
  detail: PlaneFastenerDetail = "full",
): PlaneWindZones | PlaneFastenerTotals {
  const full = detail !== "totals";
  // Every line runs up the slope: the edges are prepared for that direction once (see planeRoofInto).
  const upX = g.up[0];
  const upY = g.up[1];
  const roof = planeRoofInto(pieces, upX, upY);
  ensureScratch(roof);
  const segZone = SEG_ZONE;
  const segLen = SEG_LEN;
  const ox = g.origin[0];
  const oy = g.origin[1];
  const rx = g.right[0];
  const ry = g.right[1];
  const k = g.slopeFactor;
  const w = panels.coverageWidthIn / 12;
  const model = opts.model;
  // By zone code (1', 1, 2, 3): the spacing used and exposed-fastener screws per square (scratch arrays),
  // and the zones the battens force wider than asked, listed in the order first met (limitedNew has a bit
  // per such zone code not yet listed).
  const bs = opts.battenSpacingIn;
  const spacingOf = SPACING_OF;
  spacingOf[0] = spacingOverBattens(opts.clipSpacingIn.field, bs);
  spacingOf[1] = spacingOf[0];
  spacingOf[2] = spacingOverBattens(opts.clipSpacingIn.edge, bs);
  spacingOf[3] = spacingOverBattens(opts.clipSpacingIn.corner, bs);
  const screwsOf = SCREWS_OF;
  screwsOf[0] = opts.screwsPerSquare.field;
  screwsOf[1] = opts.screwsPerSquare.field;
  screwsOf[2] = opts.screwsPerSquare.edge;
  screwsOf[3] = opts.screwsPerSquare.corner;
  // The zone codes listed so far, 2 bits each in the order met (nLimited of them): the list is made once,
  // at the end, at its final size (an array grown by push reserves room for 17 entries).
  let limitedOrder = 0;
  let nLimited = 0;
  let limitedNew = 0;
  if (limitedByBattens(opts.clipSpacingIn.field, bs)) limitedNew |= 0b0011;
  if (limitedByBattens(opts.clipSpacingIn.edge, bs)) limitedNew |= 0b0100;
  if (limitedByBattens(opts.clipSpacingIn.corner, bs)) limitedNew |= 0b1000;
  // Bit 4·z + z2 is set when zone codes z and z2 have the same spacing (so one run of the clip schedule).
  let sameRun = 0;
  for (let z = 0; z < 4; z++) for (let z2 = 0; z2 < 4; z2++) if (!(Math.abs(spacingOf[z2] - spacingOf[z]) >= 1e-9)) sameRun |= 1 << (4 * z + z2);
  for (let z = 0; z < 4; z++) {
    Z_CLIPS[z] = 0;
    Z_LINE[z] = 0;
    Z_AREA[z] = 0;
    Z_SCREWS[z] = 0;
  }
  const clipsPerPanel: number[] = full ? [] : NO_CLIPS; // not made for "totals"
  let clips = 0;
  let panelScrews = 0;
  const pp = panels.pieces;
  const count = pp.count;
  const line = LINE; // every line runs up the slope (see LINE)
  line[2] = upX;
  line[3] = upY;
  if (opts.system === "standing-seam") {
    for (let pi = 0; pi < count; pi++) {
      const vMin = pp.vMin(pi);
      const len = pp.vMax(pi) - vMin;
      const s = pp.clipLineS(pi);
      line[0] = ox + s * rx + vMin * upX;
      line[1] = oy + s * ry + vMin * upY;
      line[4] = len;
      const ns = segmentInto(line, roof, model);
      let n = ns ? 1 : 0;
      if (ns) Z_CLIPS[segZone[0]] += 1;
      // Neighbouring zones with the same spacing are one run of the clip schedule; runFt sums the run's
      // segments in order as they are met (the same additions as summing them at the run's end).
      let runStart = 0;
      let runFt = 0;
      for (let i = 0; i < ns; i++) {
        const z = segZone[i];
        if (limitedNew & (1 << z)) {
          limitedNew &= ~(1 << z);
          limitedOrder |= z << (2 * nLimited);
          nLimited++;
        }
        const sl = segLen[i];
        Z_LINE[z] += sl * k;
        runFt += sl;
        if (i !== ns - 1 && sameRun & (1 << (4 * z + segZone[i + 1]))) continue;
        const c = Math.ceil((runFt * k * 12) / spacingOf[z] - 1e-9); // whole clips, 1e-9 of slack
        n += c;
        if (runStart === i) Z_CLIPS[z] += c;
        else distribute(c, runStart, i, runFt, segZone, segLen, Z_CLIPS);
        runStart = i + 1;
        runFt = 0;
      }
      if (full) clipsPerPanel.push(n);
      clips += n;
    }
  } else {
    for (let pi = 0; pi < count; pi++) {
      const vMin = pp.vMin(pi);
      const len = pp.vMax(pi) - vMin;
      const sc = (pp.sMin(pi) + pp.sMax(pi)) / 2;
      line[0] = ox + sc * rx + vMin * upX;
      line[1] = oy + sc * ry + vMin * upY;
      line[4] = len;
      const ns = segmentInto(line, roof, model);
      for (let i = 0; i < ns; i++) {
        const z = segZone[i];
        const area = w * segLen[i] * k;
        const screws = (area / 100) * screwsOf[z];
        Z_AREA[z] += area;
        Z_LINE[z] += segLen[i] * k;
        Z_SCREWS[z] += screws;
        panelScrews += screws;
      }
    }
  }
  if (!full) {
    const t = TOTALS;
    t.clips = clips;
    t.panelScrews = panelScrews;
    setZoneTally(TOTALS_ZONES["1'"], 0);
    setZoneTally(TOTALS_ZONES["1"], 1);
    setZoneTally(TOTALS_ZONES["2"], 2);
    setZoneTally(TOTALS_ZONES["3"], 3);
    t.spacingLimitedByBattens = nLimited ? limitedList(limitedOrder, nLimited) : NONE_LIMITED;
    return t;
  }
  const spacing: ZoneSpacing = { field: spacingOf[0], edge: spacingOf[2], corner: spacingOf[3] };
  const zones: Record<WindZone, ZoneCounts> = { "1'": zoneTally(0), "1": zoneTally(1), "2": zoneTally(2), "3": zoneTally(3) };
  const m = model;
  const widths: PlaneWindZones["widths"] =
    m.kind === "steep"
      ? { zone2PlanFt: m.aFt, zone2SlopeFt: m.aFt * k, zone3PlanFt: [m.aFt, m.aFt], zone3SlopeFt: [m.aFt * k, m.aFt * k] }
      : {
          zone2PlanFt: 0.6 * m.h!,
          zone2SlopeFt: 0.6 * m.h! * k,
          zone3PlanFt: [0.6 * m.h!, 0.2 * m.h!],
          zone3SlopeFt: [0.6 * m.h! * k, 0.2 * m.h! * k],
          zone1PlanFt: 1.2 * m.h!,
          zone1SlopeFt: 1.2 * m.h! * k,
        };
  return {
    model: m.kind,
    aFt: m.aFt,
    widths,
    zone3AsZone2: m.zone3AsZone2,
    clipSpacingIn: spacing,
    zones,
    clips,
    clipsPerPanel,
    panelScrews,
    spacingLimitedByBattens: nLimited ? limitedList(limitedOrder, nLimited) : [],
  };
}
