import type { PlaneResult } from "@shared/engine/types";
import { feetInches } from "../csv";

/** The panel cut list per plane: ordered lengths and how many of each. */
export function CutList({ planes }: { planes: PlaneResult[] }) {
  return (
    <div className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
      {planes.map((p) => (
        <section key={p.id} className="rounded-lg border border-steel-200 bg-white shadow-panel" aria-label={`Cut list, ${p.name || p.id}`}>
          <header className="flex items-baseline justify-between gap-2 border-b border-steel-100 px-3 py-2">
            <h4 className="truncate text-sm font-semibold text-steel-900">{p.name || p.id}</h4>
            <span className="whitespace-nowrap text-xs text-steel-500">
              {p.panels.count} panels · {p.panels.coverageWidthIn} in · {p.panels.system === "standing-seam" ? "standing seam" : "exposed fastener"}
            </span>
          </header>
          <table className="w-full text-sm">
            <thead>
              <tr className="text-xs text-steel-500">
                <th scope="col" className="px-3 py-1 text-left font-medium">Length</th>
                <th scope="col" className="px-3 py-1 text-right font-medium">Inches</th>
                <th scope="col" className="px-3 py-1 text-right font-medium">Count</th>
              </tr>
            </thead>
            <tbody className="tabular-nums">
              {p.panels.cutList.map((c) => (
                <tr key={c.lengthIn} className="border-t border-steel-100">
                  <td className="px-3 py-1 text-steel-900">{feetInches(c.lengthIn)}</td>
                  <td className="px-3 py-1 text-right text-steel-600">{c.lengthIn}</td>
                  <td className="px-3 py-1 text-right font-semibold text-steel-900">× {c.count}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="border-t border-steel-100 px-3 py-1.5 text-xs text-steel-500">
            {p.panels.totalLengthFt.toFixed(1)} ft of panel · longest {feetInches(p.panels.longestIn)} · offcut {p.panels.offcutSqFt.toFixed(1)} ft²
          </p>
        </section>
      ))}
    </div>
  );
}
