/**
 * Geometry of the zone diagram (plan feet): the bands within a distance of a roof edge, as polygons.
 * The same construction as the PDF's diagram, so screen and paper agree.
 */
export type Pt = readonly [number, number];

/** All points within r of segment ab, as a polygon (two half circles joined by straight sides). */
export function stadium(a: Pt, b: Pt, r: number, steps = 8): [number, number][] {
  const base = Math.atan2(b[1] - a[1], b[0] - a[0]);
  const pts: [number, number][] = [];
  for (let i = 0; i <= steps; i++) {
    const t = base - Math.PI / 2 + (Math.PI * i) / steps;
    pts.push([b[0] + r * Math.cos(t), b[1] + r * Math.sin(t)]);
  }
  for (let i = 0; i <= steps; i++) {
    const t = base + Math.PI / 2 + (Math.PI * i) / steps;
    pts.push([a[0] + r * Math.cos(t), a[1] + r * Math.sin(t)]);
  }
  return pts;
}

export function bounds(pts: readonly Pt[]) {
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  for (const [x, y] of pts) {
    x0 = Math.min(x0, x);
    y0 = Math.min(y0, y);
    x1 = Math.max(x1, x);
    y1 = Math.max(y1, y);
  }
  return { x0, y0, x1, y1 };
}

/** The SVG `points` attribute for a polygon, y flipped (north up). */
export const svgPoints = (pts: readonly Pt[], yTop: number) => pts.map(([x, y]) => `${+x.toFixed(3)},${+(yTop - y).toFixed(3)}`).join(" ");

/** Zone fills shared with the PDF; each zone is also named in the legend and the tables. */
export const ZONE_FILL: Record<string, string> = { "1'": "#f7f9fa", "1": "#e4edf2", "2": "#9dc1d3", "3": "#3f7d9b" };
export const ZONE_LABEL: Record<string, string> = { "1'": "Zone 1' (low slope, inner field)", "1": "Zone 1 (field)", "2": "Zone 2 (edge)", "3": "Zone 3 (corner)" };
