import { Fragment, useState } from "react";
import { MATERIAL_CATEGORIES, type MaterialLine } from "@shared/engine/materials";
import { cn } from "@/lib/cn";

const CATEGORY_TITLES: Record<string, string> = {
  panels: "Panels",
  underlayment: "Underlayment",
  "ice-barrier": "Ice barrier",
  spacer: "Spacer",
  "radiant-barrier": "Radiant barrier",
  deck: "Deck",
  trim: "Trim",
  flashing: "Flashing",
  closures: "Closures",
  fasteners: "Fasteners",
  sealants: "Sealants",
  penetrations: "Penetrations",
  ventilation: "Ventilation",
};

/** Materials grouped by category; each row expands to show how its number was reached. */
export function MaterialsTable({ materials }: { materials: MaterialLine[] }) {
  const [open, setOpen] = useState<Set<string>>(new Set());
  const groups = MATERIAL_CATEGORIES.map((c) => ({ category: c, lines: materials.filter((m) => m.category === c) })).filter((g) => g.lines.length);
  const toggle = (key: string) =>
    setOpen((prev) => {
      const next = new Set(prev);
      if (next.has(key)) next.delete(key);
      else next.add(key);
      return next;
    });
  return (
    <div className="overflow-x-auto rounded-lg border border-steel-200 bg-white shadow-panel">
      <table className="w-full border-collapse text-left text-sm" aria-label="Materials">
        <thead className="border-b border-steel-200 bg-steel-50">
          <tr>
            <th scope="col" className="px-3 py-2 text-xs font-semibold uppercase tracking-wide text-steel-600">
              Material
            </th>
            <th scope="col" className="px-3 py-2 text-right text-xs font-semibold uppercase tracking-wide text-steel-600">
              Quantity
            </th>
            <th scope="col" className="px-3 py-2 text-xs font-semibold uppercase tracking-wide text-steel-600">
              Unit
            </th>
            <th scope="col" className="w-24 px-3 py-2 text-xs font-semibold uppercase tracking-wide text-steel-600">
              <span className="sr-only">Basis</span>
            </th>
          </tr>
        </thead>
        {groups.map((g) => (
          <tbody key={g.category} aria-label={CATEGORY_TITLES[g.category] ?? g.category}>
            <tr className="bg-steel-50/70">
              <th scope="colgroup" colSpan={4} className="border-t border-steel-200 px-3 py-1 text-xs font-semibold text-steel-700">
                {CATEGORY_TITLES[g.category] ?? g.category} <span className="font-normal text-steel-500">· {g.lines.length}</span>
              </th>
            </tr>
            {g.lines.map((m) => {
              const isOpen = open.has(m.key);
              const basisId = `basis-${m.key}`;
              return (
                <Fragment key={m.key}>
                  <tr className="border-t border-steel-100 hover:bg-steel-50/60">
                    <td className="px-3 py-1.5">
                      <span className="text-steel-900">{m.description}</span>
                      <span className="ml-2 font-mono text-[11px] text-steel-400">{m.key}</span>
                    </td>
                    <td className="px-3 py-1.5 text-right font-semibold tabular-nums text-steel-900">{m.quantity.toLocaleString("en-US")}</td>
                    <td className="px-3 py-1.5 text-steel-600">{m.unit}</td>
                    <td className="px-3 py-1.5 text-right">
                      <button
                        type="button"
                        aria-expanded={isOpen}
                        aria-label={`${isOpen ? "Hide basis" : "Basis"} for ${m.description}`}
                        aria-controls={basisId}
                        onClick={() => toggle(m.key)}
                        className="rounded px-1.5 py-0.5 text-xs font-medium text-accent-700 hover:bg-accent-50 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
                      >
                        {isOpen ? "Hide basis" : "Basis"}
                      </button>
                    </td>
                  </tr>
                  <tr id={basisId} hidden={!isOpen} className={cn(isOpen && "bg-accent-50/40")}>
                    <td colSpan={4} className="px-3 pb-2 pt-0 text-xs text-steel-700">
                      {m.basis}
                    </td>
                  </tr>
                </Fragment>
              );
            })}
          </tbody>
        ))}
      </table>
    </div>
  );
}
