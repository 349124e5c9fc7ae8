import type { Advisory, Severity } from "@shared/engine/advisory";
import { cn } from "@/lib/cn";

const ORDER: Record<Severity, number> = { error: 0, warning: 1, info: 2 };
const WORD: Record<Severity, string> = { error: "Error", warning: "Warning", info: "Note" };
const TONE: Record<Severity, string> = { error: "text-danger-700", warning: "text-caution-700", info: "text-steel-600" };

export function SeverityIcon({ severity }: { severity: Severity }) {
  return (
    <svg viewBox="0 0 16 16" className="size-3.5 shrink-0" aria-hidden="true" fill="currentColor">
      {severity === "error" ? (
        <path d="M8 1 15 14H1L8 1Zm-.75 5v4h1.5V6h-1.5Zm0 5v1.5h1.5V11h-1.5Z" />
      ) : severity === "warning" ? (
        <path d="M8 1.5a6.5 6.5 0 1 1 0 13 6.5 6.5 0 0 1 0-13ZM7.25 4.5v4.25h1.5V4.5h-1.5Zm0 5.75v1.5h1.5v-1.5h-1.5Z" />
      ) : (
        <path d="M8 1.5a6.5 6.5 0 1 1 0 13 6.5 6.5 0 0 1 0-13Zm-.75 5.75v4.25h1.5V7.25h-1.5Zm0-2.75V6h1.5V4.5h-1.5Z" />
      )}
    </svg>
  );
}

/** Every advisory of the takeoff: severity (icon and word), message, planes and reference. */
export function AdvisoryList({ advisories, planeNames }: { advisories: Advisory[]; planeNames: Map<string, string> }) {
  if (!advisories.length) return <p className="text-sm text-steel-600">No advisories.</p>;
  const sorted = [...advisories].sort((a, b) => ORDER[a.severity] - ORDER[b.severity]);
  return (
    <ul className="divide-y divide-steel-100 rounded-lg border border-steel-200 bg-white shadow-panel" aria-label="Advisories">
      {sorted.map((a, i) => (
        <li key={a.code + i} className="grid gap-x-3 px-3 py-2 sm:grid-cols-[6.5rem_minmax(0,1fr)]" data-severity={a.severity}>
          <span className={cn("inline-flex items-center gap-1 text-xs font-semibold", TONE[a.severity])}>
            <SeverityIcon severity={a.severity} />
            {WORD[a.severity]}
          </span>
          <div className="min-w-0">
            <p className="text-sm text-steel-900">{a.message}</p>
            <p className="mt-0.5 text-xs text-steel-500">
              {a.planeIds.length > 0 && <span>Planes: {a.planeIds.map((id) => planeNames.get(id) ?? id).join(", ")} · </span>}
              Reference: {a.reference}
            </p>
          </div>
        </li>
      ))}
    </ul>
  );
}
