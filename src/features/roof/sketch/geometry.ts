/**
 * Plan-view helpers for the roof sketch: the one view transform (feet → screen px, y flipped), snapping,
 * feet-and-inches text, and small polygon measures. Plan coordinates are feet, x to the east, y to the
 * north; the screen's y grows downward, so `toView` flips it.
 */
import { slopeFactor } from "@shared/engine/roof/slope";

export type Pt = [number, number];

/** The view: `scale` px per foot and the screen position (px) of the plan origin. */
export interface View {
  scale: number;
  ox: number;
  oy: number;
}

export const MIN_SCALE = 1.5;
export const MAX_SCALE = 160;

/** Plan feet → screen px (y flipped). The only place the plan is mapped to the screen. */
export const toView = (v: View, [x, y]: readonly [number, number]): Pt => [v.ox + x * v.scale, v.oy - y * v.scale];

/** Screen px → plan feet (the inverse of `toView`). */
export const fromView = (v: View, [px, py]: readonly [number, number]): Pt => [(px - v.ox) / v.scale, (v.oy - py) / v.scale];

/** Zoom by `factor` keeping the plan point under screen point `at` where it is. */
export function zoomAt(v: View, factor: number, at: readonly [number, number]): View {
  const scale = clamp(v.scale * factor, MIN_SCALE, MAX_SCALE);
  const [fx, fy] = fromView(v, at);
  return { scale, ox: at[0] - fx * scale, oy: at[1] + fy * scale };
}

/** The view that shows `box` (plan feet) inside a `width` × `height` px viewport with `pad` px around. */
export function fitView(box: Box | null, width: number, height: number, pad = 48): View {
  if (!box) return { scale: 12, ox: pad, oy: height - pad };
  const w = Math.max(box.maxX - box.minX, 1);
  const h = Math.max(box.maxY - box.minY, 1);
  const scale = clamp(Math.min((width - 2 * pad) / w, (height - 2 * pad) / h), MIN_SCALE, MAX_SCALE);
  const cx = (box.minX + box.maxX) / 2;
  const cy = (box.minY + box.maxY) / 2;
  return { scale, ox: width / 2 - cx * scale, oy: height / 2 + cy * scale };
}

export interface Box {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

export function boundsOf(outlines: readonly (readonly (readonly [number, number])[])[]): Box | null {
  let box: Box | null = null;
  for (const o of outlines)
    for (const [x, y] of o) {
      if (!box) box = { minX: x, minY: y, maxX: x, maxY: y };
      else {
        box.minX = Math.min(box.minX, x);
        box.minY = Math.min(box.minY, y);
        box.maxX = Math.max(box.maxX, x);
        box.maxY = Math.max(box.maxY, y);
      }
    }
  return box;
}

export const clamp = (n: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, n));

/** Snap steps offered, in feet. */
export const SNAP_STEPS = [
  { value: 1, label: "1 ft" },
  { value: 0.5, label: "6 in" },
  { value: 1 / 12, label: "1 in" },
] as const;

/** Round to the snap step, then to 1/1000 ft so float noise never reaches the document. */
export function snapValue(n: number, step: number): number {
  const s = step > 0 ? Math.round(n / step) * step : n;
  return roundFt(s);
}

export const roundFt = (n: number) => Math.round(n * 1000) / 1000 + 0; // + 0 turns -0 into 0

export const snapPoint = ([x, y]: readonly [number, number], step: number): Pt => [snapValue(x, step), snapValue(y, step)];

export const dist = (a: readonly [number, number], b: readonly [number, number]) => Math.hypot(b[0] - a[0], b[1] - a[1]);

/** Shoelace signed area (positive counter-clockwise). */
export function signedArea(poly: readonly (readonly [number, number])[]): number {
  let a = 0;
  for (let i = 0; i < poly.length; i++) {
    const p = poly[i]!;
    const q = poly[(i + 1) % poly.length]!;
    a += p[0] * q[1] - q[0] * p[1];
  }
  return a / 2;
}

export const planArea = (poly: readonly (readonly [number, number])[]) => Math.abs(signedArea(poly));

/** Sloped (true) area: plan area × √(144 + p²)/12. */
export const slopedAreaOf = (poly: readonly (readonly [number, number])[], pitch: number) => planArea(poly) * slopeFactor(pitch);

/** Area centroid, falling back to the vertex average for degenerate outlines. */
export function centroid(poly: readonly (readonly [number, number])[]): Pt {
  const a = signedArea(poly);
  if (Math.abs(a) < 1e-9) {
    const n = poly.length || 1;
    return [poly.reduce((s, p) => s + p[0], 0) / n, poly.reduce((s, p) => s + p[1], 0) / n];
  }
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < poly.length; i++) {
    const p = poly[i]!;
    const q = poly[(i + 1) % poly.length]!;
    const f = p[0] * q[1] - q[0] * p[1];
    cx += (p[0] + q[0]) * f;
    cy += (p[1] + q[1]) * f;
  }
  return [cx / (6 * a), cy / (6 * a)];
}

/**
 * Edges that can be the eave: every corner lies on the plane's inner side of the edge's line (within
 * 0.01 ft), so the plane rises from it everywhere. Convex outlines allow every edge.
 */
export function validEaveEdges(poly: readonly (readonly [number, number])[]): number[] {
  const n = poly.length;
  const wind = Math.sign(signedArea(poly)) || 1;
  const out: number[] = [];
  for (let i = 0; i < n; i++) {
    const a = poly[i]!;
    const b = poly[(i + 1) % n]!;
    const len = dist(a, b);
    if (len < 1e-9) continue;
    let ok = true;
    for (const p of poly) {
      // signed distance to the left of a→b; the interior is on the left for ccw outlines
      const side = ((b[0] - a[0]) * (p[1] - a[1]) - (b[1] - a[1]) * (p[0] - a[0])) / len;
      if (side * wind < -0.01) {
        ok = false;
        break;
      }
    }
    if (ok) out.push(i);
  }
  return out;
}

/** The eave for a newly drawn outline: the longest edge that can be one (else edge 0). */
export function defaultEaveEdge(poly: readonly (readonly [number, number])[]): number {
  const valid = validEaveEdges(poly);
  let best = valid[0] ?? 0;
  for (const i of valid) if (edgeLength(poly, i) > edgeLength(poly, best) + 1e-9) best = i;
  return best;
}

export const edgeLength = (poly: readonly (readonly [number, number])[], i: number) =>
  dist(poly[i]!, poly[(i + 1) % poly.length]!);

/** Does the closed outline cross itself (any two non-adjacent edges touching)? */
export function selfCrosses(poly: readonly (readonly [number, number])[]): boolean {
  const n = poly.length;
  const cross = (o: readonly number[], a: readonly number[], b: readonly number[]) =>
    (a[0]! - o[0]!) * (b[1]! - o[1]!) - (a[1]! - o[1]!) * (b[0]! - o[0]!);
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      if (j === i + 1 || (i === 0 && j === n - 1)) continue;
      const a = poly[i]!;
      const b = poly[(i + 1) % n]!;
      const c = poly[j]!;
      const d = poly[(j + 1) % n]!;
      const d1 = cross(c, d, a);
      const d2 = cross(c, d, b);
      const d3 = cross(a, b, c);
      const d4 = cross(a, b, d);
      if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
    }
  }
  return false;
}

/**
 * Sets the plan length of edge i (from corner i to corner i + 1) by moving its end corner along the
 * edge's direction. Returns null for a zero-length edge or a length that is not positive.
 */
export function withEdgeLength(poly: readonly Pt[], i: number, lengthFt: number): Pt[] | null {
  const n = poly.length;
  const a = poly[i]!;
  const j = (i + 1) % n;
  const b = poly[j]!;
  const len = dist(a, b);
  if (!(lengthFt > 0) || len < 1e-9) return null;
  const k = lengthFt / len;
  const next = poly.map((p) => [p[0], p[1]] as Pt);
  next[j] = [roundFt(a[0] + (b[0] - a[0]) * k), roundFt(a[1] + (b[1] - a[1]) * k)];
  return next;
}

/**
 * Feet and inches to the nearest inch: 23.34 → `23' 4"`, 0.5 → `0' 6"`, 12 → `12' 0"`.
 * Inches that round to 12 carry into the feet.
 */
export function feetInches(ft: number): string {
  const neg = ft < 0;
  let whole = Math.floor(Math.abs(ft));
  let inches = Math.round((Math.abs(ft) - whole) * 12);
  if (inches === 12) {
    whole += 1;
    inches = 0;
  }
  return `${neg ? "-" : ""}${whole}' ${inches}"`;
}

/**
 * Reads a length typed in feet: `23.5`, `23' 6"`, `23'6`, `23 6` (feet and inches), `6"` or `6 in`.
 * Returns null when it is not a length.
 */
export function parseFeet(text: string): number | null {
  const t = text.trim().toLowerCase().replace(/\s+/g, " ");
  if (!t) return null;
  if (/^-?\d+(\.\d+)?$/.test(t)) return Number(t);
  const inOnly = /^(-?\d+(?:\.\d+)?) ?(?:"|in|inch|inches)$/.exec(t);
  if (inOnly) return Number(inOnly[1]) / 12;
  const fi = /^(-?)(\d+(?:\.\d+)?) ?(?:'|ft|feet)? ?(?:(\d+(?:\.\d+)?) ?(?:"|in|inch|inches)?)?$/.exec(t);
  if (fi && (fi[3] !== undefined || /'|ft|feet/.test(t))) {
    const v = Number(fi[2]) + (fi[3] ? Number(fi[3]) / 12 : 0);
    return fi[1] ? -v : v;
  }
  return null;
}

/** Plan coordinate as text for inputs: up to 3 decimals. */
export const ftText = (n: number) => String(roundFt(n));

/** Is the point inside the polygon (even-odd rule)? */
export function pointInPolygon([x, y]: readonly [number, number], poly: readonly (readonly [number, number])[]): boolean {
  let inside = false;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i]!;
    const [xj, yj] = poly[j]!;
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

function distToSegment(p: readonly [number, number], a: readonly [number, number], b: readonly [number, number]): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const l2 = dx * dx + dy * dy;
  const t = l2 ? clamp(((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / l2, 0, 1) : 0;
  return Math.hypot(p[0] - (a[0] + t * dx), p[1] - (a[1] + t * dy));
}

/**
 * Where to put a plane's label: the centroid when it sits well inside, else the sampled inside point
 * farthest from the outline (concave outlines such as a main slope with a wing's valleys cut in).
 * Returns the point and its clearance (distance to the outline, ft).
 */
export function labelPoint(poly: readonly (readonly [number, number])[]): { at: Pt; clearance: number } {
  const clearanceOf = (p: readonly [number, number]) => {
    let d = Infinity;
    for (let i = 0; i < poly.length; i++) d = Math.min(d, distToSegment(p, poly[i]!, poly[(i + 1) % poly.length]!));
    return d;
  };
  const c = centroid(poly);
  const box = boundsOf([poly]);
  if (!box) return { at: c, clearance: 0 };
  let best: { at: Pt; clearance: number } = { at: c, clearance: pointInPolygon(c, poly) ? clearanceOf(c) : 0 };
  const short = Math.min(box.maxX - box.minX, box.maxY - box.minY);
  if (best.clearance >= short * 0.3) return best;
  const N = 14;
  for (let i = 1; i < N; i++)
    for (let j = 1; j < N; j++) {
      const p: Pt = [box.minX + ((box.maxX - box.minX) * i) / N, box.minY + ((box.maxY - box.minY) * j) / N];
      if (!pointInPolygon(p, poly)) continue;
      const d = clearanceOf(p);
      if (d > best.clearance + 1e-9) best = { at: p, clearance: d };
    }
  return best;
}
