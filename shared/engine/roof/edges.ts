/**
 * Shared edges and edge types.
 *
 * Two plane edges are shared where their plan segments are collinear (within TOL) and overlap by more
 * than TOL; the edges are split at the ends of the overlap, so a long eave that is half against another
 * plane becomes two pieces. Each piece is typed from the 3D geometry:
 * - shared, horizontal: the top of both planes → ridge; top of one, bottom of the other → transition
 *   (a change of slope, IRC R903.2.1 asks for flashing there); the bottom of both (a level trough) →
 *   valley (not covered by the rules above; a trough collects water like a valley).
 * - shared, sloped: probe 0.1 ft into each plane, perpendicular to the edge from its midpoint; both lower
 *   than the edge → hip, both higher → valley, one of each → transition.
 * - unshared, horizontal: the plane rises away → eave; falls away → headwall; a level plane → eave.
 * - unshared, sloped → rake. Sidewall only by the user's override.
 * A shared piece is counted once in the totals (on the plane that comes first in the input).
 *
 * Pairing is a sweep over edges sorted by bounding box, so only edges whose boxes overlap are compared.
 */
import { TOL } from "../constants";
import type { Advisory } from "../advisory";
import { advisory } from "../advisory";
import type { EdgeType } from "./edge-types";
import { heightAt, type PlaneGeometry } from "./geometry";
import type { Pt } from "./polygon";

/** Probe distance into each plane for the hip/valley test, ft. */
export const EDGE_PROBE_FT = 0.1;
/** Heights of two planes along a shared edge may differ by this much before a warning, ft. */
export const HEIGHT_MISMATCH_FT = 0.05;

export interface EdgePiece {
  planeIdx: number;
  planeId: string;
  edgeIndex: number;
  part: number;
  from: Pt;
  to: Pt;
  planLengthFt: number;
  trueLengthFt: number;
  z0: number;
  z1: number;
  horizontal: boolean;
  shared: boolean;
  partner: { planeIdx: number; planeId: string; edgeIndex: number } | null;
  computedType: EdgeType;
  type: EdgeType;
  overridden: boolean;
  /** True on exactly one side of a shared piece (and on every unshared piece): the one counted in totals. */
  counted: boolean;
}

export interface EdgeTotals {
  eaveLf: number;
  rakeLf: number;
  ridgeLf: number;
  hipLf: number;
  valleyLf: number;
  transitionLf: number;
  sidewallLf: number;
  headwallLf: number;
}

/** The EdgeTotals field of each edge type. */
const TOTAL_KEY: Record<EdgeType, keyof EdgeTotals> = {
  eave: "eaveLf",
  rake: "rakeLf",
  ridge: "ridgeLf",
  hip: "hipLf",
  valley: "valleyLf",
  transition: "transitionLf",
  sidewall: "sidewallLf",
  headwall: "headwallLf",
};

/** True length per edge type over the counted pieces (each shared piece once). */
export function edgeTotalsOf(byPlane: EdgePiece[][]): EdgeTotals {
  const totals: EdgeTotals = { eaveLf: 0, rakeLf: 0, ridgeLf: 0, hipLf: 0, valleyLf: 0, transitionLf: 0, sidewallLf: 0, headwallLf: 0 };
  for (const pieces of byPlane) for (const pc of pieces) if (pc.counted) totals[TOTAL_KEY[pc.type]] += pc.trueLengthFt;
  return totals;
}

/** A run: counted pieces of one type joined end to end along one straight line (one ridge, one eave …). */
export interface EdgeRun {
  type: EdgeType;
  lengthFt: number;
  planLengthFt: number;
  planeIds: string[];
  pieces: EdgePiece[];
}

interface Overlap {
  t0: number;
  t1: number;
  planeIdx: number;
  edgeIndex: number;
}

type Overrides = (planeIdx: number, edgeIndex: number) => EdgeType | undefined;

/** Distance from point p to the infinite line through a, b (b ≠ a). */
function lineDistance(p: Pt, a: Pt, b: Pt): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len = Math.hypot(dx, dy);
  return Math.abs((p[0] - a[0]) * dy - (p[1] - a[1]) * dx) / len;
}

const param = (p: Pt, a: Pt, b: Pt) => {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len = Math.hypot(dx, dy);
  return ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len;
};

const lerp = (a: Pt, b: Pt, t: number, len: number): Pt => [a[0] + ((b[0] - a[0]) * t) / len, a[1] + ((b[1] - a[1]) * t) / len];

/** Find collinear overlaps between edges of different planes (bounding-box sweep, not all pairs). */
/** Key of a plane's edge in the overlap map. */
const edgeKey = (p: number, e: number) => p * 4096 + e;

function findOverlaps(planes: PlaneGeometry[]): Map<number, Overlap[]> {
  interface E { p: number; e: number; a: Pt; b: Pt; x0: number; x1: number; y0: number; y1: number }
  const list: E[] = [];
  planes.forEach((g, p) =>
    g.edges.forEach((ed) =>
      list.push({
        p,
        e: ed.index,
        a: ed.from,
        b: ed.to,
        x0: Math.min(ed.from[0], ed.to[0]) - TOL,
        x1: Math.max(ed.from[0], ed.to[0]) + TOL,
        y0: Math.min(ed.from[1], ed.to[1]) - TOL,
        y1: Math.max(ed.from[1], ed.to[1]) + TOL,
      }),
    ),
  );
  // By x0 (a comparator over a typed array of keys is cheaper than over the objects).
  const x0s = new Float64Array(list.length);
  for (let i = 0; i < list.length; i++) x0s[i] = list[i].x0;
  const byX = Array.from(list.keys()).sort((i, j) => x0s[i] - x0s[j]);
  const sorted = byX.map((i) => list[i]);
  const out = new Map<number, Overlap[]>();
  const add = (p: number, e: number, o: Overlap) => {
    const key = edgeKey(p, e);
    const l = out.get(key);
    if (l) l.push(o);
    else out.set(key, [o]);
  };
  const active: E[] = [];
  for (const cur of sorted) {
    // Drop edges that end before this one starts.
    let w = 0;
    for (let r = 0; r < active.length; r++) if (active[r].x1 >= cur.x0) active[w++] = active[r];
    active.length = w;
    for (const o of active) {
      if (o.p === cur.p) continue;
      if (o.y1 < cur.y0 || cur.y1 < o.y0) continue;
      const lenA = Math.sqrt((cur.b[0] - cur.a[0]) ** 2 + (cur.b[1] - cur.a[1]) ** 2);
      const lenB = Math.sqrt((o.b[0] - o.a[0]) ** 2 + (o.b[1] - o.a[1]) ** 2);
      if (lenA <= TOL || lenB <= TOL) continue;
      if (lineDistance(o.a, cur.a, cur.b) > TOL || lineDistance(o.b, cur.a, cur.b) > TOL) continue;
      if (lineDistance(cur.a, o.a, o.b) > TOL || lineDistance(cur.b, o.a, o.b) > TOL) continue;
      const u0 = param(o.a, cur.a, cur.b);
      const u1 = param(o.b, cur.a, cur.b);
      const lo = Math.max(0, Math.min(u0, u1));
      const hi = Math.min(lenA, Math.max(u0, u1));
      if (hi - lo <= TOL) continue;
      add(cur.p, cur.e, { t0: lo, t1: hi, planeIdx: o.p, edgeIndex: o.e });
      const pa = lerp(cur.a, cur.b, lo, lenA);
      const pb = lerp(cur.a, cur.b, hi, lenA);
      const w0 = param(pa, o.a, o.b);
      const w1 = param(pb, o.a, o.b);
      add(o.p, o.e, { t0: Math.max(0, Math.min(w0, w1)), t1: Math.min(lenB, Math.max(w0, w1)), planeIdx: cur.p, edgeIndex: cur.e });
    }
    active.push(cur);
  }
  return out;
}

const NO_OVERLAPS: Overlap[] = [];

type Side = "falls" | "rises" | "level";

/**
 * Does the plane rise or fall from an edge? The height of a point 0.1 ft into the plane (perpendicular to
 * the edge, from its midpoint) against the edge's: on a planar surface that is (probe · up) × p/12.
 */
function side(g: PlaneGeometry, edgeFrom: Pt, edgeTo: Pt): Side {
  const ex = edgeTo[0] - edgeFrom[0];
  const ey = edgeTo[1] - edgeFrom[1];
  const len = Math.sqrt(ex * ex + ey * ey) || 1;
  const dx = (edgeTo[0] - edgeFrom[0]) / len;
  const dy = (edgeTo[1] - edgeFrom[1]) / len;
  // inward normal: left of the edge for a counter-clockwise outline, right for clockwise
  const nx = g.winding === "ccw" ? -dy : dy;
  const ny = g.winding === "ccw" ? dx : -dx;
  // Height change over the probe distance along the inward normal: (probe · up) × p/12.
  const dz = (EDGE_PROBE_FT * (nx * g.up[0] + ny * g.up[1]) * g.pitch) / 12;
  return dz < -1e-9 ? "falls" : dz > 1e-9 ? "rises" : "level";
}

function typeShared(horizontal: boolean, a: Side, b: Side): EdgeType {
  if (horizontal) {
    if (a === "falls" && b === "falls") return "ridge";
    if (a === "rises" && b === "rises") return "valley";
    return "transition";
  }
  if (a === "falls" && b === "falls") return "hip";
  if (a === "rises" && b === "rises") return "valley";
  return "transition";
}

function typeUnshared(horizontal: boolean, s: Side): EdgeType {
  if (!horizontal) return "rake";
  return s === "falls" ? "headwall" : "eave";
}

export interface EdgeAnalysis {
  /** Pieces per plane, in edge order. */
  byPlane: EdgePiece[][];
  totals: EdgeTotals;
  runs: EdgeRun[];
  advisories: Advisory[];
}

/**
 * Split and type the edges of all planes. `overrides(planeIdx, edgeIndex)` gives the user's type for an
 * edge, if any; on a shared piece the override of the plane that comes first wins, then the other's.
 */
export function analyseEdges(planes: PlaneGeometry[], overrides: Overrides = () => undefined): EdgeAnalysis {
  const overlaps = findOverlaps(planes);
  const byPlane: EdgePiece[][] = planes.map(() => []);
  const advisories: Advisory[] = [];
  const mismatch = new Set<string>();

  planes.forEach((g, p) => {
    for (const ed of g.edges) {
      const len = ed.planLengthFt;
      const ov = overlaps.get(edgeKey(p, ed.index)) ?? NO_OVERLAPS;
      if (!ov.length) {
        byPlane[p].push({
          planeIdx: p,
          planeId: g.id,
          edgeIndex: ed.index,
          part: 0,
          from: ed.from,
          to: ed.to,
          planLengthFt: len,
          trueLengthFt: ed.trueLengthFt,
          z0: ed.z0,
          z1: ed.z1,
          horizontal: Math.abs(ed.z1 - ed.z0) <= TOL,
          shared: false,
          partner: null,
          computedType: "rake",
          type: "rake",
          overridden: false,
          counted: true,
        });
        continue;
      }
      const cuts = [0, len];
      for (const o of ov) cuts.push(o.t0, o.t1);
      cuts.sort((x, y) => x - y);
      const uniq: number[] = [];
      for (const c of cuts) if (!uniq.length || c - uniq[uniq.length - 1] > TOL) uniq.push(c);
      if (len - uniq[uniq.length - 1] > 0) uniq[uniq.length - 1] = len;
      uniq[0] = 0;
      let part = 0;
      for (let i = 0; i + 1 < uniq.length; i++) {
        const t0 = uniq[i];
        const t1 = uniq[i + 1];
        const tm = (t0 + t1) / 2;
        let partner: Overlap | null = null;
        for (let k = 0; k < ov.length && !partner; k++) if (ov[k].t0 - 1e-9 <= tm && tm <= ov[k].t1 + 1e-9) partner = ov[k];
        const from = lerp(ed.from, ed.to, t0, len);
        const to = lerp(ed.from, ed.to, t1, len);
        const z0 = heightAt(g, from);
        const z1 = heightAt(g, to);
        const plan = t1 - t0;
        byPlane[p].push({
          planeIdx: p,
          planeId: g.id,
          edgeIndex: ed.index,
          part: part++,
          from,
          to,
          planLengthFt: plan,
          trueLengthFt: Math.hypot(plan, z1 - z0),
          z0,
          z1,
          horizontal: Math.abs(z1 - z0) <= TOL,
          shared: partner !== null,
          partner: partner ? { planeIdx: partner.planeIdx, planeId: planes[partner.planeIdx].id, edgeIndex: partner.edgeIndex } : null,
          computedType: "rake",
          type: "rake",
          overridden: false,
          counted: partner === null || p < partner.planeIdx,
        });
      }
    }
  });

  for (const pieces of byPlane) {
    for (const pc of pieces) {
      const g = planes[pc.planeIdx];
      const origEdge = g.edges[pc.edgeIndex];
      const mine = side(g, origEdge.from, origEdge.to);
      if (pc.partner) {
        const q = planes[pc.partner.planeIdx];
        const qEdge = q.edges[pc.partner.edgeIndex];
        const theirs = side(q, qEdge.from, qEdge.to);
        // Type from the first plane's view of horizontality so both sides agree.
        const first = pc.planeIdx < pc.partner.planeIdx ? pc : null;
        const horizontal = first ? pc.horizontal : Math.abs(heightAt(q, pc.from) - heightAt(q, pc.to)) <= TOL;
        pc.computedType = typeShared(horizontal, mine, theirs);
        const ovA = overrides(Math.min(pc.planeIdx, pc.partner.planeIdx), pc.planeIdx < pc.partner.planeIdx ? pc.edgeIndex : pc.partner.edgeIndex);
        const ovB = overrides(Math.max(pc.planeIdx, pc.partner.planeIdx), pc.planeIdx < pc.partner.planeIdx ? pc.partner.edgeIndex : pc.edgeIndex);
        const ov = ovA ?? ovB;
        pc.type = ov ?? pc.computedType;
        pc.overridden = ov !== undefined;
        if (pc.counted) {
          const d0 = Math.abs(heightAt(q, pc.from) - pc.z0);
          const d1 = Math.abs(heightAt(q, pc.to) - pc.z1);
          const key = `${Math.min(pc.planeIdx, pc.partner.planeIdx)}:${Math.max(pc.planeIdx, pc.partner.planeIdx)}`;
          if (Math.max(d0, d1) > HEIGHT_MISMATCH_FT && !mismatch.has(key)) {
            mismatch.add(key);
            advisories.push(
              advisory(
                "shared-edge-height-mismatch",
                "warning",
                `Planes "${g.id}" and "${q.id}" meet along an edge but their heights there differ by up to ${Math.max(d0, d1).toFixed(2)} ft. Check the pitches, eave edges and base elevations: the edge type and lengths may be wrong.`,
                "common practice",
                [g.id, q.id],
              ),
            );
          }
        }
      } else {
        pc.computedType = typeUnshared(pc.horizontal, mine);
        const ov = overrides(pc.planeIdx, pc.edgeIndex);
        pc.type = ov ?? pc.computedType;
        pc.overridden = ov !== undefined;
      }
    }
  }

  return { byPlane, totals: edgeTotalsOf(byPlane), runs: buildRuns(byPlane), advisories };
}

/**
 * Join counted pieces of the same type that meet end to end on one straight line into runs (one ridge
 * line, one eave). Endpoints are matched through a grid hash, so this is linear in the piece count.
 */
export function buildRuns(byPlane: EdgePiece[][]): EdgeRun[] {
  const pieces: EdgePiece[] = [];
  for (const ps of byPlane) for (const p of ps) if (p.counted) pieces.push(p);
  const n = pieces.length;
  const parent = new Int32Array(n);
  for (let i = 0; i < n; i++) parent[i] = i;
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
    return i;
  };
  // Cells at least 4 × TOL wide (so touching ends are in neighbouring cells), and few enough that the
  // key stays a small integer (fast Map keys).
  let maxAbs = 0;
  for (const p of pieces) maxAbs = Math.max(maxAbs, Math.abs(p.from[0]), Math.abs(p.from[1]), Math.abs(p.to[0]), Math.abs(p.to[1]));
  const size = Math.max(4 * TOL, maxAbs / 4000);
  const key = (cx: number, cy: number) => (cx + 8192) * 16384 + (cy + 8192);
  const grid = new Map<number, number[]>();
  // 3D directions: two rakes meeting at a gable's apex are parallel in plan but not one straight line.
  const dir = new Float64Array(n * 3);
  for (let i = 0; i < n; i++) {
    const p = pieces[i];
    const dx = p.to[0] - p.from[0];
    const dy = p.to[1] - p.from[1];
    const dz = p.z1 - p.z0;
    const l = Math.sqrt(dx * dx + dy * dy + dz * dz) || 1;
    dir[i * 3] = dx / l;
    dir[i * 3 + 1] = dy / l;
    dir[i * 3 + 2] = dz / l;
    for (let e = 0; e < 2; e++) {
      const q = e ? p.to : p.from;
      const k = key(Math.floor(q[0] / size), Math.floor(q[1] / size));
      const l2 = grid.get(k);
      if (l2) l2.push(i);
      else grid.set(k, [i]);
    }
  }
  for (let i = 0; i < n; i++) {
    const p = pieces[i];
    for (let e = 0; e < 2; e++) {
      const q = e ? p.to : p.from;
      const gx = q[0] / size;
      const gy = q[1] / size;
      const cx = Math.floor(gx);
      const cy = Math.floor(gy);
      // A touching end is at most TOL ≤ a quarter cell away: a neighbouring cell only near that side.
      const fx = gx - cx;
      const fy = gy - cy;
      const ox0 = fx < 0.3 ? -1 : 0;
      const ox1 = fx > 0.7 ? 1 : 0;
      const oy0 = fy < 0.3 ? -1 : 0;
      const oy1 = fy > 0.7 ? 1 : 0;
      for (let ox = ox0; ox <= ox1; ox++)
        for (let oy = oy0; oy <= oy1; oy++) {
          const cell = grid.get(key(cx + ox, cy + oy));
          if (!cell) continue;
          for (const j of cell) {
            if (j <= i) continue;
            const o = pieces[j];
            if (o.type !== p.type) continue;
            const f0 = o.from[0] - q[0], f1 = o.from[1] - q[1], t0 = o.to[0] - q[0], t1 = o.to[1] - q[1];
            const touches = f0 * f0 + f1 * f1 <= TOL * TOL || t0 * t0 + t1 * t1 <= TOL * TOL;
            if (!touches) continue;
            const ax = dir[i * 3], ay = dir[i * 3 + 1], az = dir[i * 3 + 2];
            const bx = dir[j * 3], by = dir[j * 3 + 1], bz = dir[j * 3 + 2];
            const c1 = ay * bz - az * by, c2 = az * bx - ax * bz, c3 = ax * by - ay * bx;
            const c = Math.sqrt(c1 * c1 + c2 * c2 + c3 * c3);
            if (c <= 1e-3) parent[find(i)] = find(j);
          }
        }
    }
  }
  // Groups by root, in the order their first piece comes.
  const groupOf: EdgePiece[][] = new Array(n);
  const order: EdgePiece[][] = [];
  for (let i = 0; i < n; i++) {
    const r = find(i);
    const g = groupOf[r];
    if (g) g.push(pieces[i]);
    else order.push((groupOf[r] = [pieces[i]]));
  }
  const runs: EdgeRun[] = [];
  for (const g of order) {
    const ids: string[] = [];
    let len = 0;
    let plan = 0;
    for (const p of g) {
      if (!ids.includes(p.planeId)) ids.push(p.planeId);
      if (p.partner && !ids.includes(p.partner.planeId)) ids.push(p.partner.planeId);
      len += p.trueLengthFt;
      plan += p.planLengthFt;
    }
    runs.push({ type: g[0].type, lengthFt: len, planLengthFt: plan, planeIds: ids, pieces: g });
  }
  return runs;
}

/** Find the piece of a plane's edge that contains a plan point (nearest along the edge). */
export function pieceAt(pieces: EdgePiece[], edgeIndex: number, p: Pt): EdgePiece | undefined {
  let best: EdgePiece | undefined;
  let bestD = Infinity;
  for (const pc of pieces) {
    if (pc.edgeIndex !== edgeIndex) continue;
    const len = Math.hypot(pc.to[0] - pc.from[0], pc.to[1] - pc.from[1]);
    const t = param(p, pc.from, pc.to);
    const d = t < 0 ? -t : t > len ? t - len : 0;
    if (d < bestD) {
      bestD = d;
      best = pc;
    }
  }
  return best;
}
