/**
 * Per-plane geometry. A plane is a simple polygon in plan view (feet) with a pitch and the index of its
 * eave edge (edge i runs from vertex i to vertex i+1, wrapping). The eave is horizontal; the plane rises
 * perpendicular to it toward the interior, whose side comes from the polygon's winding (signed area),
 * not from the centroid. Height of a point = base elevation + (perpendicular distance from the eave
 * line) × p/12.
 *
 * Local frame of a plane: origin at the eave edge's first vertex, `up` the unit vector up the slope
 * (in plan), `right` the unit vector to the right of someone standing at the eave looking up-slope.
 * Local coordinates: s = (P − origin)·right (across the slope), v = (P − origin)·up (plan run from the
 * eave line).
 */
import { TOL } from "../constants";
import type { Pt } from "./polygon";
import { selfIntersection, signedArea } from "./polygon";
import { slopeFactor } from "./slope";

export interface PlaneShapeInput {
  id: string;
  pitch: number;
  outline: readonly (readonly [number, number])[];
  eaveEdge: number;
  baseElevationFt?: number;
}

export interface PlaneEdgeGeometry {
  index: number;
  from: Pt;
  to: Pt;
  planLengthFt: number;
  trueLengthFt: number;
  /** Heights (ft) at `from` and `to`. */
  z0: number;
  z1: number;
}

export interface PlaneGeometry {
  id: string;
  /** Position in the input's planes[]. */
  index: number;
  pitch: number;
  slopeFactor: number;
  outline: Pt[];
  winding: "ccw" | "cw";
  planAreaSqFt: number;
  slopedAreaSqFt: number;
  squares: number;
  baseElevationFt: number;
  eaveEdge: number;
  origin: Pt;
  up: Pt;
  right: Pt;
  /** Vertices in the local (s, v) frame. */
  local: Pt[];
  /** Height (ft) of each vertex. */
  heights: number[];
  edges: PlaneEdgeGeometry[];
  sMin: number;
  sMax: number;
  vMax: number;
}

export type GeometryError = { ok: false; reason: string; path: (string | number)[] };

/** Local (s, v) coordinates of a plan point. */
export function toLocal(g: Pick<PlaneGeometry, "origin" | "up" | "right">, p: Pt): Pt {
  const dx = p[0] - g.origin[0];
  const dy = p[1] - g.origin[1];
  return [dx * g.right[0] + dy * g.right[1], dx * g.up[0] + dy * g.up[1]];
}

/** Plan point of local (s, v) coordinates. */
export function toPlan(g: Pick<PlaneGeometry, "origin" | "up" | "right">, s: number, v: number): Pt {
  return [g.origin[0] + s * g.right[0] + v * g.up[0], g.origin[1] + s * g.right[1] + v * g.up[1]];
}

/** Height (ft) of a plan point on the plane's surface. */
export function heightAt(g: Pick<PlaneGeometry, "origin" | "up" | "baseElevationFt" | "pitch">, p: Pt): number {
  const v = (p[0] - g.origin[0]) * g.up[0] + (p[1] - g.origin[1]) * g.up[1];
  return g.baseElevationFt + (v * g.pitch) / 12;
}

/**
 * Geometry of one plane, or the reason it cannot be a roof plane with the input path to blame.
 * `path` is relative to the input root, e.g. ["planes", 2, "outline"].
 */
/**
 * The takeoff's input check and the takeoff itself both need each plane's geometry, for the same freshly
 * parsed plane object: this remembers it per object (and index) so it is worked out once. Only for objects
 * nobody changes afterwards (schema output); anything else calls `planeGeometry`.
 */
const parsedGeometry = new WeakMap<object, { index: number; g: PlaneGeometry | GeometryError }>();

export function planeGeometryOfParsed(plane: PlaneShapeInput, index: number): PlaneGeometry | GeometryError {
  const hit = parsedGeometry.get(plane);
  if (hit && hit.index === index) return hit.g;
  const g = planeGeometry(plane, index);
  parsedGeometry.set(plane, { index, g });
  return g;
}

export function planeGeometry(plane: PlaneShapeInput, index: number): PlaneGeometry | GeometryError {
  const base = ["planes", index] as (string | number)[];
  const outline: Pt[] = plane.outline.map((p) => [p[0], p[1]] as const);
  const n = outline.length;
  if (n < 3) return { ok: false, reason: "A roof plane needs at least 3 corners", path: [...base, "outline"] };
  for (let i = 0; i < n; i++) {
    const [x, y] = outline[i];
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      return { ok: false, reason: "Corner coordinates must be finite numbers", path: [...base, "outline", i] };
    }
  }
  if (!Number.isFinite(plane.pitch) || plane.pitch < 0 || plane.pitch > 24) {
    return { ok: false, reason: "Pitch must be between 0 and 24 (rise per 12 of run)", path: [...base, "pitch"] };
  }
  const area = signedArea(outline);
  const noArea = { ok: false as const, reason: "The outline has no area (its corners are on one line)", path: [...base, "outline"] };
  if (allCollinear(outline)) return noArea;
  const bad = selfIntersection(outline);
  if (bad) {
    return {
      ok: false,
      reason:
        bad.i === bad.j
          ? `Corners ${bad.i} and ${(bad.i + 1) % n} are at the same point`
          : `The outline crosses itself (edges ${bad.i} and ${bad.j})`,
      path: [...base, "outline"],
    };
  }
  if (Math.abs(area) <= TOL * TOL) return noArea;
  if (!Number.isInteger(plane.eaveEdge) || plane.eaveEdge < 0 || plane.eaveEdge >= n) {
    return { ok: false, reason: `The eave edge must be an edge number from 0 to ${n - 1}`, path: [...base, "eaveEdge"] };
  }
  const winding = area > 0 ? "ccw" : "cw";
  const a = outline[plane.eaveEdge];
  const b = outline[(plane.eaveEdge + 1) % n];
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  if (len <= TOL) return { ok: false, reason: "The eave edge has no length", path: [...base, "eaveEdge"] };
  const d: Pt = [(b[0] - a[0]) / len, (b[1] - a[1]) / len];
  // Interior is on the left of each edge for a counter-clockwise polygon, on the right for clockwise.
  const up: Pt = winding === "ccw" ? [-d[1], d[0]] : [d[1], -d[0]];
  // Right of someone at the eave looking up-slope: `up` turned a quarter turn clockwise.
  const right: Pt = [up[1], -up[0]];
  const g0 = { origin: a, up, right };
  const local = outline.map((p) => toLocal(g0, p));
  for (let i = 0; i < n; i++) {
    if (local[i][1] < -TOL) {
      return {
        ok: false,
        reason: `Corner ${i} is below the eave line (${(-local[i][1]).toFixed(2)} ft on the outside of the eave)`,
        path: [...base, "outline", i],
      };
    }
  }
  const k = slopeFactor(plane.pitch);
  const baseElevationFt = plane.baseElevationFt ?? 0;
  const heights = local.map(([, v]) => baseElevationFt + (v * plane.pitch) / 12);
  const edges: PlaneEdgeGeometry[] = [];
  let sMin = Infinity, sMax = -Infinity, vMax = 0;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    const p = outline[i];
    const q = outline[j];
    const plan = Math.hypot(q[0] - p[0], q[1] - p[1]);
    const dz = heights[j] - heights[i];
    edges.push({ index: i, from: p, to: q, planLengthFt: plan, trueLengthFt: Math.hypot(plan, dz), z0: heights[i], z1: heights[j] });
    sMin = Math.min(sMin, local[i][0]);
    sMax = Math.max(sMax, local[i][0]);
    vMax = Math.max(vMax, local[i][1]);
  }
  const planAreaSqFt = Math.abs(area);
  const slopedAreaSqFt = planAreaSqFt * k;
  return {
    id: plane.id,
    index,
    pitch: plane.pitch,
    slopeFactor: k,
    outline,
    winding,
    planAreaSqFt,
    slopedAreaSqFt,
    squares: slopedAreaSqFt / 100,
    baseElevationFt,
    eaveEdge: plane.eaveEdge,
    origin: a,
    up,
    right,
    local,
    heights,
    edges,
    sMin,
    sMax,
    vMax,
  };
}

/** True when every corner lies within TOL of the line through the two corners farthest apart. */
function allCollinear(pts: Pt[]): boolean {
  let a = pts[0];
  let b = pts[1];
  let best = -1;
  for (let i = 0; i < pts.length; i++)
    for (let j = i + 1; j < pts.length; j++) {
      const d = Math.sqrt((pts[j][0] - pts[i][0]) ** 2 + (pts[j][1] - pts[i][1]) ** 2);
      if (d > best) {
        best = d;
        a = pts[i];
        b = pts[j];
      }
    }
  if (best <= TOL) return true;
  return pts.every((p) => Math.abs((p[0] - a[0]) * (b[1] - a[1]) - (p[1] - a[1]) * (b[0] - a[0])) / best <= TOL);
}

export const isGeometryError = (g: PlaneGeometry | GeometryError): g is GeometryError => (g as GeometryError).ok === false;

/** Inward unit normal (plan) of edge i of a plane. */
export function inwardNormal(g: Pick<PlaneGeometry, "winding">, from: Pt, to: Pt): Pt {
  const len = Math.hypot(to[0] - from[0], to[1] - from[1]) || 1;
  const dx = (to[0] - from[0]) / len;
  const dy = (to[1] - from[1]) / len;
  return g.winding === "ccw" ? [-dy, dx] : [dy, -dx];
}
