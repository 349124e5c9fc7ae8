/**
 * A small chart comparing the five spacer options: spacer cost per square (bars on the left) and the
 * enclosed air-space R, summer and winter (bars on the right). A ventilated gap has no enclosed
 * air-space R: it is marked "n/a, ventilated", not drawn as zero. Plain SVG, no chart library.
 */
export interface GapChartRow {
  label: string;
  costPerSquareCents: number | null;
  rSummer: number | null;
  rWinter: number | null;
  ventilated: boolean;
  current?: boolean;
}

const ROW = 30;
const LABEL_W = 150;
const PANEL_W = 210;
const GAP = 36;
const TOP = 34;

export function GapChart({ rows, showCost }: { rows: GapChartRow[]; showCost: boolean }) {
  const maxCost = Math.max(1, ...rows.map((r) => r.costPerSquareCents ?? 0));
  const maxR = Math.max(0.5, ...rows.flatMap((r) => [r.rSummer ?? 0, r.rWinter ?? 0]));
  const costX = LABEL_W;
  const rX = showCost ? LABEL_W + PANEL_W + GAP : LABEL_W;
  const W = rX + PANEL_W + 60;
  const H = TOP + rows.length * ROW + 14;
  const describe = rows
    .map(
      (r) =>
        `${r.label}: ${showCost ? `cost ${r.costPerSquareCents === null ? "not priced" : `$${(r.costPerSquareCents / 100).toFixed(2)} per square`}, ` : ""}` +
        `R ${r.rSummer === null ? (r.ventilated ? "not applicable, ventilated" : "none") : `${r.rSummer.toFixed(2)} summer, ${r.rWinter!.toFixed(2)} winter`}`,
    )
    .join("; ");
  return (
    <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full max-w-[720px]" role="img" aria-label={`Comparison chart. ${describe}`} data-testid="gap-chart">
      {showCost && (
        <text x={costX} y={14} className="fill-steel-700 text-[11px] font-semibold">
          Spacer cost per square
        </text>
      )}
      <text x={rX} y={14} className="fill-steel-700 text-[11px] font-semibold">
        Air-space R (h·ft²·°F/Btu)
      </text>
      <g transform={`translate(${rX} 20)`} className="text-[10px]">
        <rect width={10} height={6} y={1} className="fill-accent-600" />
        <text x={14} y={7} className="fill-steel-600">
          summer
        </text>
        <rect x={64} width={10} height={6} y={1} className="fill-steel-400" />
        <text x={78} y={7} className="fill-steel-600">
          winter
        </text>
      </g>
      {rows.map((r, i) => {
        const y = TOP + i * ROW;
        const costW = r.costPerSquareCents === null ? 0 : (r.costPerSquareCents / maxCost) * (PANEL_W - 56);
        return (
          <g key={r.label}>
            {r.current && <rect x={0} y={y - 3} width={W} height={ROW - 2} className="fill-accent-50" />}
            <text x={LABEL_W - 8} y={y + 14} textAnchor="end" className="fill-steel-800 text-[11px]">
              {r.label}
              {r.current ? " (now)" : ""}
            </text>
            {showCost &&
              (r.costPerSquareCents === null ? (
                <text x={costX} y={y + 14} className="fill-steel-500 text-[10px]">
                  not priced
                </text>
              ) : (
                <>
                  <rect x={costX} y={y + 4} width={Math.max(costW, 1)} height={14} className="fill-steel-700" />
                  <text x={costX + costW + 4} y={y + 15} className="fill-steel-800 text-[10px] tabular-nums">
                    ${(r.costPerSquareCents / 100).toFixed(2)}
                  </text>
                </>
              ))}
            {r.rSummer === null ? (
              <text x={rX} y={y + 14} className="fill-steel-500 text-[10px]">
                {r.ventilated ? "n/a, ventilated" : "no air space"}
              </text>
            ) : (
              <>
                <rect x={rX} y={y + 3} width={Math.max((r.rSummer / maxR) * (PANEL_W - 40), 1)} height={8} className="fill-accent-600" />
                <rect x={rX} y={y + 12} width={Math.max(((r.rWinter ?? 0) / maxR) * (PANEL_W - 40), 1)} height={8} className="fill-steel-400" />
                <text x={rX + (Math.max(r.rSummer, r.rWinter ?? 0) / maxR) * (PANEL_W - 40) + 4} y={y + 15} className="fill-steel-800 text-[10px] tabular-nums">
                  {r.rSummer.toFixed(2)} / {(r.rWinter ?? 0).toFixed(2)}
                </text>
              </>
            )}
          </g>
        );
      })}
      <line x1={costX} x2={costX} y1={TOP - 4} y2={H - 10} className="stroke-steel-300" display={showCost ? undefined : "none"} />
      <line x1={rX} x2={rX} y1={TOP - 4} y2={H - 10} className="stroke-steel-300" />
    </svg>
  );
}
