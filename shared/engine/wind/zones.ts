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
import type { Pt } from "../roof/polygon";

export type WindZone = "1'" | "1" | "2" | "3";
export const WIND_ZONES: readonly WindZone[] = ["1'", "1", "2", "3"];
/** Pitch at θ = 7°: 12·tan 7° ≈ 1.47. */
export const LOW_SLOPE_MAX_PITCH = 12 * Math.tan((7 * Math.PI) / 180);
/** Pitch at θ = 25°. */
export const HIP_ZONE3_MAX_PITCH = 12 * Math.tan((25 * Math.PI) / 180);
/** Above 45° (12/12) the figures do not apply. */
export const WIND_FIGURES_MAX_PITCH = 12;

export const ROOF_EDGE_TYPES = new Set(["eave", "rake", "ridge", "hip"]);

export interface EdgeDistance {
  aFt: number;
  leastHorizontalDimensionFt: number;
  meanRoofHeightFt: number | null;
  /** Which term governs: "0.1L", "0.4h", "0.04L", "3 ft". */
  governs: string;
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
  const cands: [number, string][] = [[0.1 * L, "0.1L"], [0.4 * h, "0.4h"]];
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
  const v = prepare({ edges: [{ a, b, dir: [0, 0] }], corners: [] }, d[0], d[1]);
  return intervalPrepared(p0[0], p0[1], d[0], d[1], v, 0, r, out, 0) ? [out[0], out[1]] : null;
}

const INTERVAL_SCRATCH = new Float64Array(2);

/** Slab clip of t for q0 + t·dq within [min, max], narrowing [lo, hi] held in out[i], out[i+1]. */
function clipSlab(q0: number, dq: number, min: number, max: number, out: Float64Array, i: number): void {
  if (Math.abs(dq) < 1e-15) {
    if (q0 < min || q0 > max) {
      out[i] = Infinity;
      out[i + 1] = -Infinity;
    }
    return;
  }
  let ta = (min - q0) / dq;
  let tb = (max - q0) / dq;
  if (ta > tb) {
    const x = ta;
    ta = tb;
    tb = x;
  }
  if (ta > out[i]) out[i] = ta;
  if (tb < out[i + 1]) out[i + 1] = tb;
}

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
 * the lines of a plane. Per edge, PREP numbers: a, b, the unit vector u along the edge, its length L, the
 * line direction's components along and across u, and the edge's extent across the lines.
 */
const PREP = 11;
interface RoofEdges {
  edges: RoofEdge[];
  corners: [number, number][];
  prepared?: { dx: number; dy: number; v: Float64Array };
}

function prepare(roof: RoofEdges, dx: number, dy: number): Float64Array {
  const p = roof.prepared;
  if (p && p.dx === dx && p.dy === dy) return p.v;
  const v = new Float64Array(roof.edges.length * PREP);
  roof.edges.forEach((ed, e) => {
    const o = e * PREP;
    const ax = ed.a[0], ay = ed.a[1], bx = ed.b[0], by = ed.b[1];
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
    }
    const pa = ax * dy - ay * dx;
    const pb = bx * dy - by * dx;
    v[o + 9] = Math.min(pa, pb);
    v[o + 10] = Math.max(pa, pb);
  });
  roof.prepared = { dx, dy, v };
  return v;
}

/**
 * Interval of t along the line p + t·d within distance r of a prepared edge (offset o in v), written into
 * out[i], out[i+1]; returns whether it is non-empty. Allocation-free: the union of the line's intervals in
 * the two end disks and the middle rectangle (u along the edge in [0, L], across it in [−r, r]).
 */
function intervalPrepared(px: number, py: number, dx: number, dy: number, v: Float64Array, o: number, r: number, out: Float64Array, i: number): boolean {
  let lo = Infinity;
  let hi = -Infinity;
  for (let e = 0; e < 2; e++) {
    const fx = px - v[o + 2 * e];
    const fy = py - v[o + 2 * e + 1];
    const B = dx * fx + dy * fy;
    const disc = B * B - (fx * fx + fy * fy - r * r);
    if (disc >= 0) {
      const sq = Math.sqrt(disc);
      if (-B - sq < lo) lo = -B - sq;
      if (-B + sq > hi) hi = -B + sq;
    }
  }
  const L = v[o + 6];
  if (L > 0) {
    const ax = v[o];
    const ay = v[o + 1];
    const ux = v[o + 4];
    const uy = v[o + 5];
    const u0 = (px - ax) * ux + (py - ay) * uy;
    const w0 = -(px - ax) * uy + (py - ay) * ux;
    out[i] = -Infinity;
    out[i + 1] = Infinity;
    clipSlab(u0, v[o + 7], 0, L, out, i);
    clipSlab(w0, v[o + 8], -r, r, out, i);
    if (out[i] <= out[i + 1]) {
      if (out[i] < lo) lo = out[i];
      if (out[i + 1] > hi) hi = out[i + 1];
    }
  }
  out[i] = lo;
  out[i + 1] = hi;
  return lo <= hi;
}

/** Two ends within 0.01 ft of each other meet. */
const near = (p: Pt, q: Pt) => (p[0] - q[0]) * (p[0] - q[0]) + (p[1] - q[1]) * (p[1] - q[1]) <= 0.01 * 0.01;

/** The roof edges of a plane and its corner pairs (two roof edges meeting at a corner, not in line). */
export function planeRoofEdges(pieces: EdgePiece[]): RoofEdges {
  const edges: RoofEdge[] = [];
  for (const pc of pieces) {
    if (!ROOF_EDGE_TYPES.has(pc.type)) continue;
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
  const n = segmentInto(p0[0], p0[1], d, len, roof, model);
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

/**
 * Allocation-free core of zoneSegmentsAlong: writes merged segments into SEG_ZONE / SEG_LEN and returns
 * how many there are.
 */
function segmentInto(px: number, py: number, d: Pt, len: number, roof: RoofEdges, model: ZoneModel): number {
  if (!(len > 0)) return 0;
  const steep = model.kind === "steep";
  const r2 = steep ? model.aFt : 0.6 * model.h!;
  const r3 = steep ? model.aFt : 0.2 * model.h!;
  const r1 = steep ? 0 : 1.2 * model.h!;
  const ne = roof.edges.length;
  if (IV.length < ne * 6) IV = new Float64Array(ne * 12);
  if (CUTS.length < ne * 6 + 2) {
    CUTS = new Float64Array(ne * 12 + 4);
    SEG_ZONE = new Int8Array(ne * 12 + 4);
    SEG_LEN = new Float64Array(ne * 12 + 4);
  }
  const iv = IV;
  let nc = 0;
  CUTS[nc++] = 0;
  CUTS[nc++] = len;
  const dx = d[0];
  const dy = d[1];
  const rMax = Math.max(r1, r2, r3);
  const across = px * dy - py * dx; // the line's position across its direction
  const prep = prepare(roof, dx, dy);
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
    // I2 (zone 2 width), I3 (zone 3 short side, low-slope only), I1 (zone 1 width, low-slope only).
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
      if (iv[ok] > 0 && iv[ok] < len) CUTS[nc++] = iv[ok];
      if (iv[ok + 1] > 0 && iv[ok + 1] < len) CUTS[nc++] = iv[ok + 1];
    }
  }
  // Insertion sort in place: a handful of cuts per line.
  const cuts = CUTS;
  for (let i = 1; i < nc; i++) {
    const x = cuts[i];
    let j = i - 1;
    while (j >= 0 && cuts[j] > x) {
      cuts[j + 1] = cuts[j];
      j--;
    }
    cuts[j + 1] = x;
  }
  // Only corners whose two edges both come within reach of this line can put any of it in zone 3.
  const corners = roof.corners;
  if (ACTIVE_CORNERS.length < corners.length * 2) ACTIVE_CORNERS = new Int32Array(corners.length * 4);
  let na = 0;
  for (let q = 0; q < corners.length; q++) {
    const i = corners[q][0] * 6;
    const j = corners[q][1] * 6;
    if ((iv[i] <= iv[i + 1] || iv[i + 2] <= iv[i + 3]) && (iv[j] <= iv[j + 1] || iv[j + 2] <= iv[j + 3])) {
      ACTIVE_CORNERS[na++] = i;
      ACTIVE_CORNERS[na++] = j;
    }
  }
  let ns = 0;
  for (let c = 0; c + 1 < nc; c++) {
    const seg = cuts[c + 1] - cuts[c];
    if (seg <= 1e-9) continue;
    const t = (cuts[c] + cuts[c + 1]) / 2;
    let in3 = false;
    for (let q = 0; q < na && !in3; q += 2) {
      const i = ACTIVE_CORNERS[q];
      const j = ACTIVE_CORNERS[q + 1];
      const i2 = iv[i] <= t && t <= iv[i + 1];
      const i3 = iv[i + 2] <= t && t <= iv[i + 3];
      const j2 = iv[j] <= t && t <= iv[j + 1];
      const j3 = iv[j + 2] <= t && t <= iv[j + 3];
      in3 = (i3 && j2) || (i2 && j3);
    }
    let zone: number;
    if (in3) zone = model.zone3AsZone2 ? 2 : 3;
    else {
      let in2 = false;
      let in1 = false;
      for (let e = 0; e < ne; e++) {
        const o = e * 6;
        if (iv[o] <= t && t <= iv[o + 1]) in2 = true;
        if (iv[o + 4] <= t && t <= iv[o + 5]) in1 = true;
      }
      zone = in2 ? 2 : steep ? 1 : in1 ? 1 : 0;
    }
    if (ns > 0 && SEG_ZONE[ns - 1] === zone) SEG_LEN[ns - 1] += seg;
    else {
      SEG_ZONE[ns] = zone;
      SEG_LEN[ns] = seg;
      ns++;
    }
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

const ceilTol = (x: number) => Math.ceil(x - 1e-9);

/** Share c clips of one run (segments i0..i1) among its zones in proportion to length (largest remainder). */
function distribute(c: number, i0: number, i1: number, total: number, zones: ZoneCounts[]) {
  if (c === 0 || !(total > 0)) return;
  const exact = [0, 0, 0, 0];
  for (let i = i0; i <= i1; i++) exact[SEG_ZONE[i]] += (c * SEG_LEN[i]) / total;
  let given = 0;
  for (let z = 0; z < 4; z++) {
    const f = Math.floor(exact[z] + 1e-9);
    zones[z].clips += f;
    given += f;
    exact[z] -= f;
  }
  while (given < c) {
    let best = 0;
    for (let z = 1; z < 4; z++) if (exact[z] > exact[best]) best = z;
    zones[best].clips += 1;
    exact[best] = -1;
    given++;
  }
}

/** Clip spacing usable over battens: a whole multiple of the batten spacing, never closer than it. */
export function spacingOverBattens(requiredIn: number, battenSpacingIn: number | null): number {
  if (!battenSpacingIn) return requiredIn;
  return battenSpacingIn * Math.max(1, Math.floor(requiredIn / battenSpacingIn + 1e-9));
}

/**
 * Clips and exposed-fastener screws of one plane by zone. One clip line per panel (at its seam on the
 * starting side; the last panel's free edge is held by the rake cleat, counted with trim). Along a line
 * n = 1 + Σ ceil(segment / zone spacing); the extra clip goes to the zone at the line's eave end.
 * Exposed-fastener screws: panel area by zone (panel width × zone length along the panel's centre line)
 * × screws per square.
 */
export function planeFasteners(g: PlaneGeometry, pieces: EdgePiece[], panels: PanelLayout, opts: PlaneFastenerOptions): PlaneWindZones {
  // Every line runs up the slope: the edges are prepared for that direction once (see `prepare`).
  const roof = planeRoofEdges(pieces);
  const k = g.slopeFactor;
  const w = panels.coverageWidthIn / 12;
  const zones: Record<WindZone, ZoneCounts> = {
    "1'": { clips: 0, lineFt: 0, areaSqFt: 0, panelScrews: 0 },
    "1": { clips: 0, lineFt: 0, areaSqFt: 0, panelScrews: 0 },
    "2": { clips: 0, lineFt: 0, areaSqFt: 0, panelScrews: 0 },
    "3": { clips: 0, lineFt: 0, areaSqFt: 0, panelScrews: 0 },
  };
  const spacing: ZoneSpacing = {
    field: spacingOverBattens(opts.clipSpacingIn.field, opts.battenSpacingIn),
    edge: spacingOverBattens(opts.clipSpacingIn.edge, opts.battenSpacingIn),
    corner: spacingOverBattens(opts.clipSpacingIn.corner, opts.battenSpacingIn),
  };
  const limited = new Set<WindZone>();
  const clipsPerPanel: number[] = [];
  let clips = 0;
  let panelScrews = 0;
  const zoneList = [zones["1'"], zones["1"], zones["2"], zones["3"]];
  const keyOf = ["field", "field", "edge", "corner"] as const;
  // By zone code (1', 1, 2, 3): the spacing used, the spacing asked for, exposed-fastener screws per square.
  const spacingOf = keyOf.map((key) => spacing[key]);
  const limitedOf = keyOf.map((key) => opts.battenSpacingIn !== null && opts.battenSpacingIn > 0 && opts.clipSpacingIn[key] < opts.battenSpacingIn - 1e-9);
  const screwsOf = keyOf.map((key) => opts.screwsPerSquare[key]);
  const up = g.up;
  const pp = panels.pieces;
  for (let pi = 0; pi < pp.count; pi++) {
    const vMin = pp.vMin(pi);
    const len = pp.vMax(pi) - vMin;
    if (opts.system === "standing-seam") {
      const ns = segmentInto(
        g.origin[0] + pp.clipLineS(pi) * g.right[0] + vMin * up[0],
        g.origin[1] + pp.clipLineS(pi) * g.right[1] + vMin * up[1],
        up,
        len,
        roof,
        opts.model,
      );
      let n = ns ? 1 : 0;
      if (ns) zoneList[SEG_ZONE[0]].clips += 1;
      // Neighbouring zones with the same spacing are one run of the clip schedule.
      let runStart = 0;
      for (let i = 0; i < ns; i++) {
        const z = SEG_ZONE[i];
        if (limitedOf[z]) limited.add(ZONE_BY_CODE[z]);
        zoneList[z].lineFt += SEG_LEN[i] * k;
        const last = i === ns - 1 || Math.abs(spacingOf[SEG_ZONE[i + 1]] - spacingOf[z]) >= 1e-9;
        if (!last) continue;
        let runFt = 0;
        for (let j = runStart; j <= i; j++) runFt += SEG_LEN[j];
        const c = ceilTol((runFt * k * 12) / spacingOf[z]);
        n += c;
        if (runStart === i) zoneList[z].clips += c;
        else distribute(c, runStart, i, runFt, zoneList);
        runStart = i + 1;
      }
      clipsPerPanel.push(n);
      clips += n;
    } else {
      const sc = (pp.sMin(pi) + pp.sMax(pi)) / 2;
      const ns = segmentInto(g.origin[0] + sc * g.right[0] + vMin * up[0], g.origin[1] + sc * g.right[1] + vMin * up[1], up, len, roof, opts.model);
      for (let i = 0; i < ns; i++) {
        const z = SEG_ZONE[i];
        const area = w * SEG_LEN[i] * k;
        const screws = (area / 100) * screwsOf[z];
        zoneList[z].areaSqFt += area;
        zoneList[z].lineFt += SEG_LEN[i] * k;
        zoneList[z].panelScrews += screws;
        panelScrews += screws;
      }
    }
  }
  const m = opts.model;
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
    spacingLimitedByBattens: [...limited],
  };
}
