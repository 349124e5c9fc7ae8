/**
 * Live totals from the browser preview (squares, areas, linear feet per edge type) with the edge legend,
 * and the engine's refusal when the roof does not compute.
 */
import { memo } from "react";
import type { EdgeTotals } from "@shared/engine/types";
import { Alert } from "@/components/ui/alert";
import { Spinner } from "@/components/ui/spinner";
import { EDGE_STYLES, EDGE_TYPE_LIST, EdgeSwatch } from "./edge-styles";
import { feetInches } from "./geometry";
import type { Preview } from "./preview";

const num = (n: number, d = 0) => n.toLocaleString("en-US", { minimumFractionDigits: d, maximumFractionDigits: d });

interface Props {
  preview: Preview | null;
  pending: boolean;
  refusedPlaneName: string | null;
  onShowRefused: (() => void) | null;
  note: string | null;
}

export const TotalsPanel = memo(function TotalsPanel({ preview, pending, refusedPlaneName, onShowRefused, note }: Props) {
  const result = preview?.ok ? preview.result : null;
  const edgeTotals: EdgeTotals | null = result?.edgeTotals ?? null;
  return (
    <section aria-labelledby="sketch-totals-title" className="space-y-3">
      <div className="flex items-center justify-between">
        <h2 id="sketch-totals-title" className="text-sm font-semibold text-steel-900">
          Live totals
        </h2>
        <span className="flex items-center gap-1 text-xs text-steel-500" aria-live="polite">
          {pending ? (
            <>
              <Spinner /> Updating
            </>
          ) : (
            "Preview"
          )}
        </span>
      </div>

      {preview && !preview.ok && "empty" in preview ? (
        <p className="text-sm text-steel-600">{preview.reason}</p>
      ) : preview && !preview.ok ? (
        <Alert tone="caution" title="The roof doesn't compute yet">
          <p>
            {refusedPlaneName ? `${refusedPlaneName}: ` : ""}
            {preview.reason}
          </p>
          {onShowRefused && (
            <button type="button" onClick={onShowRefused} className="mt-1 text-xs font-medium underline">
              Show the plane
            </button>
          )}
        </Alert>
      ) : null}

      {result && (
        <dl className="grid grid-cols-3 gap-2" aria-label="Roof totals">
          <Stat label="Squares" value={num(result.totals.squares, 2)} />
          <Stat label="Sloped area" value={`${num(result.totals.slopedAreaSqFt)} sq ft`} />
          <Stat label="Plan area" value={`${num(result.totals.planAreaSqFt)} sq ft`} />
        </dl>
      )}

      <div>
        <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-steel-600">Edges: legend and lengths</h3>
        <table className="w-full text-sm" aria-label="Edge types and total lengths">
          <thead className="sr-only">
            <tr>
              <th scope="col">Line</th>
              <th scope="col">Edge type</th>
              <th scope="col">Line style</th>
              <th scope="col">Total length</th>
            </tr>
          </thead>
          <tbody>
            {EDGE_TYPE_LIST.map((t) => {
              const s = EDGE_STYLES[t];
              const lf = edgeTotals ? edgeTotals[`${t}Lf` as keyof EdgeTotals] : null;
              return (
                <tr key={t} className="align-middle">
                  <td className="w-11 py-0.5">
                    <EdgeSwatch style={s} />
                  </td>
                  <td className="py-0.5 font-medium text-steel-800">{s.label}</td>
                  <td className="py-0.5 text-xs text-steel-500">{s.pattern}</td>
                  <td className="py-0.5 text-right tabular-nums text-steel-800" data-testid={`lf-${t}`}>
                    {lf === null ? "—" : lf > 0 ? `${num(lf, 1)} LF` : "0"}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
        {result && (
          <p className="mt-1 text-xs text-steel-500">
            True lengths along the slope; a shared edge counts once. Longest panel {feetInches(Math.max(0, ...result.planes.map((p) => p.panels.longestIn / 12)))}.
          </p>
        )}
      </div>
      {note && <p className="text-xs text-steel-500">{note}</p>}
    </section>
  );
});

function Stat({ label, value }: { label: string; value: string }) {
  return (
    <div className="rounded-md border border-steel-200 bg-steel-50 px-2 py-1.5">
      <dt className="text-xs text-steel-600">{label}</dt>
      <dd className="text-sm font-semibold tabular-nums text-steel-900">{value}</dd>
    </div>
  );
}
