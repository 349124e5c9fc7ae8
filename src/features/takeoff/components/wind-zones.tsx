/**
 * Fasteners by wind zone, with a plan diagram per plane. The bands follow the engine's zone model
 * (shared/engine/wind/zones.ts): steep roofs — zone 2 within a of a roof edge (eave, rake, ridge, hip),
 * zone 3 within a of two roof edges meeting at a corner, zone 1 elsewhere; low slopes (θ ≤ 7°, ASCE 7-16
 * Fig. 30.3-2A) — zone 2 band 0.6h, zone 3 corners 0.6h × 0.2h, zone 1 to 1.2h, zone 1' beyond.
 * Drawn in plan from the plane's outline and the zone widths in the stored result: a band is the edge
 * stroked at twice its width (round ends: "within a distance"), clipped to the outline; a corner zone is
 * one edge's band masked by the other's.
 */
import { useId } from "react";
import type { PlaneResult, TakeoffResult, WindZone } from "@shared/engine/types";

const ROOF_EDGES = new Set(["eave", "rake", "ridge", "hip"]);
const ZONE_FILL: Record<WindZone, string> = {
  "1'": "fill-white",
  "1": "fill-steel-100",
  "2": "fill-accent-200",
  "3": "fill-accent-600",
};
const ZONE_STROKE: Record<WindZone, string> = {
  "1'": "stroke-white",
  "1": "stroke-steel-100",
  "2": "stroke-accent-200",
  "3": "stroke-accent-600",
};
const ZONE_NAME: Record<WindZone, string> = { "1'": "Zone 1' (interior)", "1": "Zone 1 (field)", "2": "Zone 2 (edge)", "3": "Zone 3 (corner)" };

type Pt = [number, number];

function roofEdgesOf(p: PlaneResult) {
  const edges = p.edges.filter((e) => ROOF_EDGES.has(e.type)).map((e) => ({ a: e.from, b: e.to }));
  const near = (u: Pt, v: Pt) => Math.hypot(u[0] - v[0], u[1] - v[1]) <= 0.01;
  const corners: [number, number][] = [];
  for (let i = 0; i < edges.length; i++)
    for (let j = i + 1; j < edges.length; j++) {
      const e = edges[i]!;
      const f = edges[j]!;
      if (!(near(e.a, f.a) || near(e.a, f.b) || near(e.b, f.a) || near(e.b, f.b))) continue;
      const d1 = [e.b[0] - e.a[0], e.b[1] - e.a[1]];
      const d2 = [f.b[0] - f.a[0], f.b[1] - f.a[1]];
      const cross = (d1[0]! * d2[1]! - d1[1]! * d2[0]!) / ((Math.hypot(d1[0]!, d1[1]!) || 1) * (Math.hypot(d2[0]!, d2[1]!) || 1));
      if (Math.abs(cross) <= 1e-3) continue;
      corners.push([i, j]);
    }
  return { edges, corners };
}

export function ZoneDiagram({ plane, size = 220 }: { plane: PlaneResult; size?: number }) {
  const uid = useId().replace(/:/g, "");
  const pts: Pt[] = plane.vertices.map((v) => [v.x, v.y]);
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]);
  const minX = Math.min(...xs);
  const maxX = Math.max(...xs);
  const minY = Math.min(...ys);
  const maxY = Math.max(...ys);
  const pad = 8;
  const s = (size - 2 * pad) / Math.max(maxX - minX, maxY - minY, 1);
  const w = (maxX - minX) * s + 2 * pad;
  const h = (maxY - minY) * s + 2 * pad;
  const V = (p: Pt): Pt => [(p[0] - minX) * s + pad, (maxY - p[1]) * s + pad];
  const poly = pts.map((p) => V(p).join(",")).join(" ");
  const wz = plane.windZones;
  const low = wz.model === "low-slope";
  const r2 = wz.widths.zone2PlanFt * s;
  const r3 = (low ? wz.widths.zone3PlanFt[1] : wz.widths.zone3PlanFt[0]) * s;
  const r1 = (wz.widths.zone1PlanFt ?? 0) * s;
  const { edges, corners } = roofEdgesOf(plane);
  const line = (i: number, width: number, className: string, mask?: string) => {
    const e = edges[i]!;
    const [x1, y1] = V(e.a);
    const [x2, y2] = V(e.b);
    return <line key={`${i}-${width}-${mask ?? ""}`} x1={x1} y1={y1} x2={x2} y2={y2} strokeWidth={width} strokeLinecap="round" className={className} mask={mask} />;
  };
  const eave = plane.edges.find((e) => e.index === plane.eaveEdge && e.type === "eave") ?? plane.edges.find((e) => e.index === plane.eaveEdge);

  return (
    <svg
      viewBox={`0 0 ${w} ${h}`}
      width={w}
      height={h}
      className="h-auto max-w-full"
      role="img"
      aria-label={`Wind zones on ${plane.name || plane.id}: ${low ? "low-slope" : "steep-roof"} model, zone 2 band ${wz.widths.zone2PlanFt.toFixed(1)} ft in plan${wz.zone3AsZone2 ? ", corners counted as zone 2" : ""}.`}
      data-testid={`zone-diagram-${plane.id}`}
    >
      <defs>
        <clipPath id={`clip-${uid}`}>
          <polygon points={poly} />
        </clipPath>
        <pattern id={`hatch-${uid}`} width="5" height="5" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
          <path d="M0 0V5" className="stroke-white/70" strokeWidth="1.2" />
        </pattern>
        {corners.map(([i, j], q) => (
          <g key={q}>
            <mask id={`m-${uid}-${q}-a`} maskUnits="userSpaceOnUse" x={0} y={0} width={w} height={h}>
              {line(j, 2 * r2, "stroke-white")}
            </mask>
            <mask id={`m-${uid}-${q}-b`} maskUnits="userSpaceOnUse" x={0} y={0} width={w} height={h}>
              {line(i, 2 * r2, "stroke-white")}
            </mask>
          </g>
        ))}
      </defs>
      <g clipPath={`url(#clip-${uid})`}>
        <polygon points={poly} className={low ? ZONE_FILL["1'"] : ZONE_FILL["1"]} />
        {low && r1 > 0 && edges.map((_, i) => line(i, 2 * r1, ZONE_STROKE["1"]))}
        {edges.map((_, i) => line(i, 2 * r2, ZONE_STROKE["2"]))}
        {!wz.zone3AsZone2 &&
          corners.map(([i, j], q) => (
            <g key={q}>
              {line(i, 2 * r3, ZONE_STROKE["3"], `url(#m-${uid}-${q}-a)`)}
              {line(j, 2 * r3, ZONE_STROKE["3"], `url(#m-${uid}-${q}-b)`)}
            </g>
          ))}
      </g>
      <polygon points={poly} fill="none" className="stroke-steel-700" strokeWidth={1.2} />
      {eave && (
        <line
          x1={V(eave.from)[0]}
          y1={V(eave.from)[1]}
          x2={V(eave.to)[0]}
          y2={V(eave.to)[1]}
          className="stroke-steel-900"
          strokeWidth={3}
        />
      )}
    </svg>
  );
}

export function ZoneLegend({ low }: { low: boolean }) {
  const zones: WindZone[] = low ? ["1'", "1", "2", "3"] : ["1", "2", "3"];
  return (
    <ul className="flex flex-wrap gap-x-3 gap-y-1 text-xs text-steel-700" aria-label="Zone legend">
      {zones.map((z) => (
        <li key={z} className="inline-flex items-center gap-1">
          <svg viewBox="0 0 12 12" className="size-3" aria-hidden="true">
            <rect width="12" height="12" className={`${ZONE_FILL[z]} stroke-steel-400`} strokeWidth="1" />
          </svg>
          {ZONE_NAME[z]}
        </li>
      ))}
      <li className="inline-flex items-center gap-1">
        <svg viewBox="0 0 12 12" className="size-3" aria-hidden="true">
          <line x1="0" y1="6" x2="12" y2="6" className="stroke-steel-900" strokeWidth="3" />
        </svg>
        Eave (heavy line)
      </li>
    </ul>
  );
}

const ZONES_SHOWN: WindZone[] = ["3", "2", "1", "1'"];

/** Per plane: the diagram and the clip (or screw) counts by zone; the roof's totals above. */
export function WindZonesPanel({ takeoff }: { takeoff: TakeoffResult }) {
  const f = takeoff.fasteners;
  const anyLow = takeoff.planes.some((p) => p.windZones.model === "low-slope");
  const standing = takeoff.planes.some((p) => p.panels.system === "standing-seam");
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-start gap-x-6 gap-y-2 rounded-lg border border-steel-200 bg-white px-3 py-2 text-sm shadow-panel">
        <dl className="flex flex-wrap gap-x-6 gap-y-1">
          <Stat label="Edge distance a">
            {takeoff.wind.aFt.toFixed(2)} ft <span className="text-xs font-normal text-steel-500">({takeoff.wind.governs} governs)</span>
          </Stat>
          {standing && <Stat label="Clips">{f.clips.toLocaleString("en-US")}</Stat>}
          {standing && <Stat label="Clip screws">{f.clipScrews.toLocaleString("en-US")}</Stat>}
          {f.panelScrews > 0 && <Stat label="Panel screws">{Math.ceil(f.panelScrews).toLocaleString("en-US")}</Stat>}
          <Stat label="Trim fasteners">{f.trimFasteners.toLocaleString("en-US")}</Stat>
          {f.spacerFasteners > 0 && <Stat label="Spacer fasteners">{f.spacerFasteners.toLocaleString("en-US")}</Stat>}
        </dl>
        <ZoneLegend low={anyLow} />
      </div>
      <p className="text-xs text-steel-500">
        Zone model (simplified from ASCE 7-10 Fig. 30.4-1 and ASCE 7-16 Fig. 30.3-2A): zone 3 within a of two roof edges meeting at a corner, zone 2 within a of
        one eave, rake, ridge or hip, zone 1 elsewhere; widths measured in plan. Counts are pieces placed, before waste. The panel maker's tested uplift schedule
        and a design professional govern the actual spacing.
      </p>
      <div className="grid gap-3 md:grid-cols-2 xl:grid-cols-3">
        {takeoff.planes.map((p) => (
          <section key={p.id} className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel" aria-label={`Wind zones, ${p.name || p.id}`}>
            <header className="mb-2 flex items-baseline justify-between gap-2">
              <h4 className="truncate text-sm font-semibold text-steel-900">{p.name || p.id}</h4>
              <span className="whitespace-nowrap text-xs text-steel-500">
                {p.windZones.model === "low-slope" ? "low-slope model" : "steep model"} · a {p.windZones.aFt.toFixed(1)} ft
              </span>
            </header>
            <div className="flex flex-wrap items-start gap-3">
              <ZoneDiagram plane={p} size={150} />
              <table className="min-w-0 flex-1 text-xs tabular-nums">
                <thead>
                  <tr className="text-steel-500">
                    <th scope="col" className="py-0.5 text-left font-medium">Zone</th>
                    <th scope="col" className="py-0.5 text-right font-medium">{p.panels.system === "standing-seam" ? "Clips" : "Screws"}</th>
                    <th scope="col" className="py-0.5 text-right font-medium">Spacing</th>
                    <th scope="col" className="py-0.5 text-right font-medium">Line ft</th>
                  </tr>
                </thead>
                <tbody>
                  {ZONES_SHOWN.filter((z) => p.windZones.zones[z].lineFt > 0 || p.windZones.zones[z].clips > 0).map((z) => {
                    const c = p.windZones.zones[z];
                    const key = z === "3" ? "corner" : z === "2" ? "edge" : "field";
                    return (
                      <tr key={z} className="border-t border-steel-100">
                        <th scope="row" className="py-0.5 text-left font-medium text-steel-800">
                          {z}
                          {p.windZones.spacingLimitedByBattens.includes(z) && <span title="Limited by the batten spacing"> †</span>}
                        </th>
                        <td className="py-0.5 text-right font-semibold text-steel-900">
                          {p.panels.system === "standing-seam" ? c.clips : Math.ceil(c.panelScrews)}
                        </td>
                        <td className="py-0.5 text-right text-steel-600">{p.panels.system === "standing-seam" ? `${p.windZones.clipSpacingIn[key]} in` : "—"}</td>
                        <td className="py-0.5 text-right text-steel-600">{c.lineFt.toFixed(0)}</td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </div>
            {p.windZones.zone3AsZone2 && <p className="mt-1 text-xs text-steel-500">Hip roof at 25° or less: corners counted as zone 2.</p>}
            {p.windZones.spacingLimitedByBattens.length > 0 && <p className="mt-1 text-xs text-caution-700">† Clip spacing held to the batten spacing.</p>}
          </section>
        ))}
      </div>
    </div>
  );
}

function Stat({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-xs text-steel-500">{label}</dt>
      <dd className="font-semibold tabular-nums text-steel-900">{children}</dd>
    </div>
  );
}
