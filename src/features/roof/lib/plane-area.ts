import { slopedArea } from "@shared/engine/roof/slope";

/** Plan area (shoelace) and roof-surface area (plan × slope factor) of an outline, ft². */
export function slopedAreaOf(p: { outline: [number, number][]; pitch: number }): { plan: number; sloped: number } {
  let twice = 0;
  p.outline.forEach(([x, y], i) => {
    const [nx, ny] = p.outline[(i + 1) % p.outline.length]!;
    twice += x * ny - nx * y;
  });
  const plan = Math.abs(twice) / 2;
  return { plan, sloped: slopedArea(plan, p.pitch) };
}
