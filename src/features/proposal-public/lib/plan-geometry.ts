/** Geometry for the plan drawing: label placement inside each plane and a "nice" scale bar. */
type Pt = readonly [number, number];

/** Area-weighted centroid of a polygon (the vertex average for a degenerate one). */
export function centroid(pts: readonly Pt[]): [number, number] {
  let a = 0;
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < pts.length; i++) {
    const [x0, y0] = pts[i]!;
    const [x1, y1] = pts[(i + 1) % pts.length]!;
    const cr = x0 * y1 - x1 * y0;
    a += cr;
    cx += (x0 + x1) * cr;
    cy += (y0 + y1) * cr;
  }
  if (Math.abs(a) < 1e-9) {
    return [pts.reduce((s, p) => s + p[0], 0) / pts.length, pts.reduce((s, p) => s + p[1], 0) / pts.length];
  }
  return [cx / (3 * a), cy / (3 * a)];
}

function distToSegment(px: number, py: number, a: Pt, b: Pt): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const l2 = dx * dx + dy * dy;
  const t = l2 > 0 ? Math.max(0, Math.min(1, ((px - a[0]) * dx + (py - a[1]) * dy) / l2)) : 0;
  return Math.hypot(px - (a[0] + t * dx), py - (a[1] + t * dy));
}

export function insidePolygon(px: number, py: number, pts: readonly Pt[]): boolean {
  let c = false;
  for (let i = 0, j = pts.length - 1; i < pts.length; j = i++) {
    const [xi, yi] = pts[i]!;
    const [xj, yj] = pts[j]!;
    if (yi > py !== yj > py && px < ((xj - xi) * (py - yi)) / (yj - yi) + xi) c = !c;
  }
  return c;
}

/** The inside point farthest from the outline (the centroid first, then a grid), and how much room it has. */
export function labelPoint(pts: readonly Pt[]): { x: number; y: number; room: number } {
  const clearance = (x: number, y: number) => {
    let d = Infinity;
    for (let i = 0; i < pts.length; i++) d = Math.min(d, distToSegment(x, y, pts[i]!, pts[(i + 1) % pts.length]!));
    return d;
  };
  const [cx, cy] = centroid(pts);
  let best = insidePolygon(cx, cy, pts) ? { x: cx, y: cy, room: clearance(cx, cy) } : { x: cx, y: cy, room: -1 };
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]);
  const x0 = Math.min(...xs);
  const x1 = Math.max(...xs);
  const y0 = Math.min(...ys);
  const y1 = Math.max(...ys);
  const n = 14;
  for (let i = 0; i <= n; i++) {
    for (let j = 0; j <= n; j++) {
      const x = x0 + ((x1 - x0) * i) / n;
      const y = y0 + ((y1 - y0) * j) / n;
      if (!insidePolygon(x, y, pts)) continue;
      const r = clearance(x, y);
      if (r > best.room * 1.25) best = { x, y, room: r };
    }
  }
  return best;
}

/** A round scale-bar length in feet for a drawing `spanFt` wide (about a fifth of it). */
export function scaleBarFeet(spanFt: number): number {
  const target = spanFt / 5;
  for (const n of [1, 2, 5, 10, 20, 25, 50, 100, 200, 250, 500]) if (n >= target) return n;
  return 1000;
}
