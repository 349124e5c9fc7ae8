import { useId } from "react";
import type { InstallPlane } from "@shared/schemas/install-packet";
import { formatFeetInches } from "@shared/schemas/proposal";
import { ZONE_FILL, ZONE_LABEL, bounds, stadium, svgPoints } from "@/features/install-packet/lib/zones";

const EAVE = "#b7612a";

/**
 * One plane's wind-zone diagram, plan view, north up: zone 1 (or 1') as the base, zone 2 within the
 * zone 2 width of each roof edge, zone 3 (hatched) where the bands of two edges meeting at a corner overlap.
 */
export function ZoneDiagram({ plane, className }: { plane: InstallPlane; className?: string }) {
  const uid = useId().replace(/:/g, "");
  const z = plane.zoneDiagram;
  const { x0, y0, x1, y1 } = bounds(plane.outline);
  const w = Math.max(x1 - x0, 1);
  const h = Math.max(y1 - y0, 1);
  const pad = Math.max(w, h) * 0.06;
  const pts = (p: readonly (readonly [number, number])[]) => svgPoints(p, y1);
  const band = (i: number, r: number) => stadium(z.roofEdges[i]!.from, z.roofEdges[i]!.to, r);
  const r3 = Math.min(z.zone3PlanFt[0], z.zone3PlanFt[1]);
  const stroke = Math.max(w, h) / 220;
  const n = plane.outline.length;
  const ea = plane.outline[plane.eaveEdge % n]!;
  const eb = plane.outline[(plane.eaveEdge + 1) % n]!;
  const zone3Fill = z.zone3AsZone2 ? ZONE_FILL["2"] : ZONE_FILL["3"];
  const labelId = `${uid}-label`;
  return (
    <svg
      viewBox={`${x0 - pad} ${-pad} ${w + 2 * pad} ${h + 2 * pad}`}
      className={className}
      role="img"
      aria-labelledby={labelId}
      preserveAspectRatio="xMidYMid meet"
    >
      <title id={labelId}>{`Wind zones of plane ${plane.number}, ${plane.name}: zone 2 band ${formatFeetInches(z.zone2PlanFt)} (plan) from each roof edge${z.corners.length && !z.zone3AsZone2 ? ", zone 3 at the corners" : ""}; eave in copper.`}</title>
      <defs>
        <clipPath id={`${uid}-outline`}>
          <polygon points={pts(plane.outline)} />
        </clipPath>
        {z.roofEdges.map((_, i) => (
          <clipPath key={i} id={`${uid}-b${i}`}>
            <polygon points={pts(band(i, r3))} />
          </clipPath>
        ))}
        {z.roofEdges.map((_, i) => (
          <clipPath key={`z2-${i}`} id={`${uid}-c${i}`}>
            <polygon points={pts(band(i, z.zone2PlanFt))} />
          </clipPath>
        ))}
        <pattern id={`${uid}-hatch`} width={stroke * 6} height={stroke * 6} patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
          <line x1="0" y1="0" x2="0" y2={stroke * 6} stroke="#ffffff" strokeWidth={stroke * 1.4} strokeOpacity="0.7" />
        </pattern>
      </defs>
      <g clipPath={`url(#${uid}-outline)`}>
        <polygon points={pts(plane.outline)} fill={z.model === "low-slope" ? ZONE_FILL["1'"] : ZONE_FILL["1"]} />
        {z.model === "low-slope" && z.zone1PlanFt
          ? z.roofEdges.map((_, i) => <polygon key={`z1-${i}`} points={pts(band(i, z.zone1PlanFt!))} fill={ZONE_FILL["1"]} />)
          : null}
        {z.roofEdges.map((_, i) => (
          <polygon key={`z2-${i}`} points={pts(band(i, z.zone2PlanFt))} fill={ZONE_FILL["2"]} />
        ))}
        {z.corners.map(([i, j]) => (
          <g key={`z3-${i}-${j}`}>
            <g clipPath={`url(#${uid}-b${i})`}>
              <polygon points={pts(band(j, z.zone2PlanFt))} fill={zone3Fill} />
              {!z.zone3AsZone2 && <polygon points={pts(band(j, z.zone2PlanFt))} fill={`url(#${uid}-hatch)`} />}
            </g>
            <g clipPath={`url(#${uid}-c${i})`}>
              <polygon points={pts(band(j, r3))} fill={zone3Fill} />
              {!z.zone3AsZone2 && <polygon points={pts(band(j, r3))} fill={`url(#${uid}-hatch)`} />}
            </g>
          </g>
        ))}
      </g>
      <polygon points={pts(plane.outline)} fill="none" stroke="#1d262d" strokeWidth={stroke} strokeLinejoin="round" />
      <line x1={ea[0]} y1={y1 - ea[1]} x2={eb[0]} y2={y1 - eb[1]} stroke={EAVE} strokeWidth={stroke * 3} strokeLinecap="round" />
    </svg>
  );
}

/** The legend under the diagrams: a swatch and a name for each zone, and the eave line. */
export function ZoneLegend({ lowSlope }: { lowSlope: boolean }) {
  const zones = lowSlope ? ["1'", "1", "2", "3"] : ["1", "2", "3"];
  return (
    <ul className="flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-steel-600" aria-label="Zone legend">
      {zones.map((zn) => (
        <li key={zn} className="flex items-center gap-1.5">
          <svg viewBox="0 0 12 10" className="h-2.5 w-3 shrink-0" aria-hidden="true">
            <rect x="0.5" y="0.5" width="11" height="9" fill={ZONE_FILL[zn]} stroke="#8c99a3" strokeWidth="0.6" />
            {zn === "3" && <path d="M2 9.5 9.5 2M0.5 5.5 5.5 0.5M6 9.5 11.5 4" stroke="#fff" strokeWidth="1" strokeOpacity="0.8" />}
          </svg>
          {ZONE_LABEL[zn]}
        </li>
      ))}
      <li className="flex items-center gap-1.5">
        <span aria-hidden="true" className="inline-block h-0.5 w-4 rounded" style={{ background: EAVE }} />
        Eave
      </li>
    </ul>
  );
}
