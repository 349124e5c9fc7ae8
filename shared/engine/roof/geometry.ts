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
 * The takeoff's input check and the takeoff itself both need each plane's geometry, for the same freshly
 * parsed plane object: this remembers it per object and index so it is worked out once. Only for objects
 * nobody changes afterwards (schema output); anything else calls `planeGeometry`.
 *
 * The memo is one slot per plane index holding the last object seen there (a hit needs that very object).
 * It used to be a WeakMap keyed by the plane objects, but every takeoff adds a hundred short-lived keys,
 * and V8 makes a weak key costly to add and to collect (an ephemeron), several times the cost of working
 * the geometry out. The slots keep the last roof's planes alive until the next roof replaces them; a new
 * roof's plane 0 clears them, so a large roof followed by small ones is not kept either.
 */
const memoPlane: PlaneShapeInput[] = [];
const memoGeometry: (PlaneGeometry | GeometryError)[] = [];

export function planeGeometryOfParsed(plane: PlaneShapeInput, index: number): PlaneGeometry | GeometryError {
  if (index < memoPlane.length && memoPlane[index] === plane) return memoGeometry[index];
  const g = planeGeometry(plane, index);
  // A roof's planes come in order from 0: plane 0 drops the last roof's, then each one takes the next
  // slot (a plane out of that order is simply not remembered).
  if (index === 0) {
    memoPlane.length = 0;
    memoGeometry.length = 0;
  }
  if (index < memoPlane.length) {
    memoPlane[index] = plane;
    memoGeometry[index] = g;
  } else if (index === memoPlane.length) {
    memoPlane.push(plane);
    memoGeometry.push(g);
  }
  return g;
}

/**
 * Math.hypot(x, y), the same number without calling the builtin: V8's Math.hypot is a comparatively slow call
 * that also allocates a small array for its arguments on every call (about 80 bytes; a takeoff makes a
 * thousand such calls). V8 (the engine of Node and of Chromium) works it out as follows (src/builtins/math.tq,
 * MathHypot): any ±∞ gives +∞, else any NaN gives NaN, else a zero maximum gives 0; otherwise each |leg| is
 * divided by the larger one, the squares are summed (Kahan summation, which for two terms is the plain sum,
 * the first term's compensation being exactly 0) and √sum is multiplied back by the larger leg. Doing the same
 * steps here gives the very same double: checked on Node 20 against Math.hypot for 2·10⁷ random pairs over the
 * whole double range and every special value (±0, ±∞, NaN, subnormals), with no difference. Other JavaScript
 * engines may round their own Math.hypot differently in the last bit; this function gives V8's answer there too.
 * A zero leg is answered directly: the result is exactly |other leg| (also for −0, NaN and ±∞).
 */
export function hypot2(x: number, y: number): number {
  if (y === 0) return Math.abs(x);
  if (x === 0) return Math.abs(y);
  const ax = Math.abs(x);
  const ay = Math.abs(y);
  if (ax === Infinity || ay === Infinity) return Infinity;
  if (ax !== ax || ay !== ay) return NaN;
  const max = ax > ay ? ax : ay;
  const a = ax / max;
  const b = ay / max;
  return Math.sqrt(a * a + b * b) * max;
}

/** slopeFactor of the last pitch asked for: a roof's planes mostly share a few pitches (one per building). */
let lastPitch = NaN;
let lastSlopeFactor = NaN;
function slopeFactorOf(pitch: number): number {
  if (pitch !== lastPitch) {
    lastSlopeFactor = slopeFactor(pitch);
    lastPitch = pitch;
  }
  return lastSlopeFactor;
}

const fail = (reason: string, path: (string | number)[]): GeometryError => ({ ok: false, reason, path });
const NO_AREA = "The outline has no area (its corners are on one line)";

/**
 * The scratch lists planeGeometry fills and copies out at their exact length (see ../scratch-list; the heights
 * stay doubles stored unboxed). planeGeometry calls nothing that could call it again, so one set is enough.
 * Entries past the current plane's are left from earlier planes (they only keep those small objects alive
 * until overwritten). Each is filled in place (store, or push at the end) at its own store site, which sees
 * one kind of list.
 */
const scratchPts: Pt[] = [];
const scratchLocal: Pt[] = [];
const scratchHeights: number[] = [];
const scratchEdges: PlaneEdgeGeometry[] = [];

/**
 * Geometry of one plane, or the reason it cannot be a roof plane with the input path to blame.
 * `path` is relative to the input root, e.g. ["planes", 2, "outline"].
 */
export function planeGeometry(plane: PlaneShapeInput, index: number): PlaneGeometry | GeometryError {
  const src = plane.outline;
  const n = src.length;
  const pts = scratchPts;
  for (let i = 0; i < n; i++) {
    const c: Pt = [src[i][0], src[i][1]];
    if (i < pts.length) pts[i] = c;
    else pts.push(c);
  }
  if (n < 3) return fail("A roof plane needs at least 3 corners", ["planes", index, "outline"]);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(pts[i][0]) || !Number.isFinite(pts[i][1])) {
      return fail("Corner coordinates must be finite numbers", ["planes", index, "outline", i]);
    }
  }
  const pitch = plane.pitch;
  if (!Number.isFinite(pitch) || pitch < 0 || pitch > 24) {
    return fail("Pitch must be between 0 and 24 (rise per 12 of run)", ["planes", index, "pitch"]);
  }
  const outline = pts.slice(0, n);
  const area = signedArea(outline);
  if (allCollinear(outline)) return fail(NO_AREA, ["planes", index, "outline"]);
  const bad = selfIntersection(outline);
  if (bad) {
    return fail(
      bad.i === bad.j ? `Corners ${bad.i} and ${(bad.i + 1) % n} are at the same point` : `The outline crosses itself (edges ${bad.i} and ${bad.j})`,
      ["planes", index, "outline"],
    );
  }
  if (Math.abs(area) <= TOL * TOL) return fail(NO_AREA, ["planes", index, "outline"]);
  const eaveEdge = plane.eaveEdge;
  if (!Number.isInteger(eaveEdge) || eaveEdge < 0 || eaveEdge >= n) {
    return fail(`The eave edge must be an edge number from 0 to ${n - 1}`, ["planes", index, "eaveEdge"]);
  }
  const winding = area > 0 ? "ccw" : "cw";
  const a = outline[eaveEdge];
  const b = outline[(eaveEdge + 1) % n];
  const len = hypot2(b[0] - a[0], b[1] - a[1]);
  if (len <= TOL) return fail("The eave edge has no length", ["planes", index, "eaveEdge"]);
  const d0 = (b[0] - a[0]) / len;
  const d1 = (b[1] - a[1]) / len;
  // Interior is on the left of each edge for a counter-clockwise polygon, on the right for clockwise.
  const up: Pt = winding === "ccw" ? [-d1, d0] : [d1, -d0];
  // Right of someone at the eave looking up-slope: `up` turned a quarter turn clockwise.
  const right: Pt = [up[1], -up[0]];
  // Local (s, v) of each corner (s along `right`, v along `up`, from the eave corner `a`), rejecting corners below the eave line; the corner's height,
  // and the extent of the plane in the local frame.
  const ox = a[0], oy = a[1], ux = up[0], uy = up[1], rx = right[0], ry = right[1];
  const k = slopeFactorOf(pitch);
  const baseElevationFt = plane.baseElevationFt ?? 0;
  const loc = scratchLocal;
  const hs = scratchHeights;
  let sMin = Infinity, sMax = -Infinity, vMax = 0;
  for (let i = 0; i < n; i++) {
    const dx = outline[i][0] - ox;
    const dy = outline[i][1] - oy;
    const v = dx * ux + dy * uy;
    if (v < -TOL) {
      return fail(`Corner ${i} is below the eave line (${(-v).toFixed(2)} ft on the outside of the eave)`, ["planes", index, "outline", i]);
    }
    const s = dx * rx + dy * ry;
    const sv: Pt = [s, v];
    const z = baseElevationFt + (v * pitch) / 12;
    if (i < loc.length) loc[i] = sv;
    else loc.push(sv);
    if (i < hs.length) hs[i] = z;
    else hs.push(z);
    sMin = Math.min(sMin, s);
    sMax = Math.max(sMax, s);
    vMax = Math.max(vMax, v);
  }
  const eds = scratchEdges;
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    const p = outline[i];
    const q = outline[j];
    const plan = hypot2(q[0] - p[0], q[1] - p[1]);
    const z0 = hs[i];
    const z1 = hs[j];
    const ed: PlaneEdgeGeometry = { index: i, from: p, to: q, planLengthFt: plan, trueLengthFt: hypot2(plan, z1 - z0), z0, z1 };
    if (i < eds.length) eds[i] = ed;
    else eds.push(ed);
  }
  const planAreaSqFt = Math.abs(area);
  const slopedAreaSqFt = planAreaSqFt * k;
  return {
    id: plane.id,
    index,
    pitch,
    slopeFactor: k,
    outline,
    winding,
    planAreaSqFt,
    slopedAreaSqFt,
    squares: slopedAreaSqFt / 100,
    baseElevationFt,
    eaveEdge,
    origin: a,
    up,
    right,
    local: loc.slice(0, n),
    heights: hs.slice(0, n),
    edges: eds.slice(0, n),
    sMin,
    sMax,
    vMax,
  };
}

/** True when every corner lies within TOL of the line through the two corners farthest apart. */
function allCollinear(pts: Pt[]): boolean {
  const n = pts.length;
  let a = pts[0];
  let b = pts[1];
  // The farthest pair, first found on ties. Squared distances rule out most pairs without a square root
  // (√ is monotonic, so d² ≤ best² means d ≤ best); the root is still compared so ties go as before.
  let best = -1;
  let best2 = -1;
  for (let i = 0; i < n; i++) {
    const xi = pts[i][0], yi = pts[i][1];
    for (let j = i + 1; j < n; j++) {
      const ex = pts[j][0] - xi;
      const ey = pts[j][1] - yi;
      const d2 = ex * ex + ey * ey;
      if (d2 <= best2) continue;
      const d = Math.sqrt(d2);
      if (d > best) {
        best = d;
        best2 = d2;
        a = pts[i];
        b = pts[j];
      }
    }
  }
  if (best <= TOL) return true;
  const bx = b[0] - a[0], by = b[1] - a[1];
  for (let i = 0; i < n; i++) if (!(Math.abs((pts[i][0] - a[0]) * by - (pts[i][1] - a[1]) * bx) / best <= TOL)) return false;
  return true;
}

export const isGeometryError = (g: PlaneGeometry | GeometryError): g is GeometryError => (g as GeometryError).ok === false;
