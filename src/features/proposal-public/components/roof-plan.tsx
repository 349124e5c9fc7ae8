import { useEffect, useRef, useState } from "react";
import { formatPitch, type PlanPlane } from "@shared/schemas/proposal";
import { labelPoint, scaleBarFeet } from "@/features/proposal-public/lib/plan-geometry";

/** The drawing's width in CSS pixels, so labels keep their real size on a phone and on a wide screen. */
function useWidth(fallback: number) {
  const ref = useRef<HTMLDivElement>(null);
  const [width, setWidth] = useState(fallback);
  useEffect(() => {
    const el = ref.current;
    if (!el || typeof ResizeObserver === "undefined") return;
    const ro = new ResizeObserver(([entry]) => {
      const w = Math.round(entry?.contentRect.width ?? 0);
      if (w > 0) setWidth(w);
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  return { ref, width };
}

const PAD = 28;

/**
 * The roof seen from above, north up: each plane with its number and pitch, its eave in copper and a
 * small arrow pointing down the slope. The same drawing as the PDF's roof plan.
 */
export function RoofPlan({ planes }: { planes: PlanPlane[] }) {
  const { ref, width } = useWidth(640);
  if (planes.length === 0) return null;

  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const p of planes) {
    for (const [x, y] of p.outline) {
      x0 = Math.min(x0, x);
      y0 = Math.min(y0, y);
      x1 = Math.max(x1, x);
      y1 = Math.max(y1, y);
    }
  }
  const spanX = Math.max(x1 - x0, 1);
  const spanY = Math.max(y1 - y0, 1);
  const innerW = Math.max(width - 2 * PAD, 120);
  const maxH = Math.min(420, Math.max(260, width * 0.75));
  const scale = Math.min(innerW / spanX, (maxH - 2 * PAD) / spanY);
  const h = spanY * scale + 2 * PAD + 22;
  const ox = PAD + (innerW - spanX * scale) / 2;
  const oy = PAD;
  const toView = ([x, y]: readonly [number, number]): [number, number] => [ox + (x - x0) * scale, oy + (y1 - y) * scale];

  const shapes = planes.map((p) => {
    const pts = p.outline.map(toView);
    const n = pts.length;
    const a = pts[((p.eaveEdge % n) + n) % n]!;
    const b = pts[(p.eaveEdge + 1) % n]!;
    const lp = labelPoint(pts);
    const ex = b[0] - a[0];
    const ey = b[1] - a[1];
    const el = Math.hypot(ex, ey) || 1;
    let nx = -ey / el;
    let ny = ex / el;
    if (nx * ((a[0] + b[0]) / 2 - lp.x) + ny * ((a[1] + b[1]) / 2 - lp.y) < 0) {
      nx = -nx;
      ny = -ny;
    }
    return { p, pts, a, b, lp, nx, ny, small: lp.room < 20 };
  });

  const barFt = scaleBarFeet(spanX);
  const barW = barFt * scale;
  const sy = h - 14;

  return (
    <div ref={ref} className="w-full">
      <svg
        viewBox={`0 0 ${width} ${h}`}
        width="100%"
        height={h}
        role="img"
        aria-labelledby="roof-plan-title"
        className="block rounded-md border border-steel-200 bg-white"
        style={{ maxWidth: "100%" }}
      >
        <title id="roof-plan-title">
          {`Roof plan, north up: ${planes.map((p) => `plane ${p.number}, ${p.name}, ${formatPitch(p.pitch)}`).join("; ")}`}
        </title>
        {shapes.map(({ p, pts, a, b }) => (
          <g key={p.id}>
            <polygon
              points={pts.map((q) => q.join(",")).join(" ")}
              className="fill-accent-50 stroke-accent-700"
              strokeWidth={1.2}
              strokeLinejoin="round"
            />
            <line x1={a[0]} y1={a[1]} x2={b[0]} y2={b[1]} className="stroke-accent-500" strokeWidth={3.5} strokeLinecap="round" />
          </g>
        ))}
        {shapes.map(({ p, lp, nx, ny, small }) => {
          const ax = lp.x + nx * 18;
          const ay = lp.y + ny * 18;
          const len = 9;
          const tx = ax + nx * (len + 4);
          const ty = ay + ny * (len + 4);
          return (
            <g key={`l-${p.id}`} aria-hidden="true">
              <text x={lp.x} y={small ? lp.y + 4 : lp.y - 2} textAnchor="middle" className="fill-accent-800 font-bold" fontSize={small ? 10 : 13}>
                {p.number}
              </text>
              {!small && (
                <>
                  <text x={lp.x} y={lp.y + 11} textAnchor="middle" className="fill-steel-600" fontSize={10.5}>
                    {formatPitch(p.pitch)}
                  </text>
                  <line x1={ax} y1={ay} x2={ax + nx * len} y2={ay + ny * len} className="stroke-accent-500" strokeWidth={1.2} />
                  <polygon
                    points={`${tx},${ty} ${ax + nx * len - ny * 3},${ay + ny * len + nx * 3} ${ax + nx * len + ny * 3},${ay + ny * len - nx * 3}`}
                    className="fill-accent-500"
                  />
                </>
              )}
            </g>
          );
        })}
        <g aria-hidden="true">
          <polygon points={`${width - 22},10 ${width - 16},26 ${width - 22},22 ${width - 28},26`} className="fill-steel-900" />
          <text x={width - 22} y={38} textAnchor="middle" fontSize={10} className="fill-steel-900 font-bold">
            N
          </text>
          <rect x={12} y={sy} width={barW} height={3.5} className="fill-steel-900" />
          <text x={12 + barW + 6} y={sy + 4} fontSize={10} className="fill-steel-600">
            {barFt} ft
          </text>
          {width >= 330 && (
            <g transform={`translate(${width - 178}, ${sy})`}>
              <line x1={0} y1={2} x2={18} y2={2} className="stroke-accent-500" strokeWidth={3.5} strokeLinecap="round" />
              <text x={23} y={5.5} fontSize={10} className="fill-steel-600">
                Eave
              </text>
              <rect x={56} y={-3} width={11} height={9} className="fill-accent-50 stroke-accent-700" strokeWidth={1} />
              <text x={71} y={5.5} fontSize={10} className="fill-steel-600">
                Plane no. and pitch
              </text>
            </g>
          )}
        </g>
      </svg>
    </div>
  );
}
