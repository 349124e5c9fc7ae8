import type { Advisory, Severity } from "@shared/engine/advisory";
import { cn } from "@/lib/cn";

const TONE: Record<Severity, string> = {
  error: "border-danger-200 bg-danger-50 text-danger-700",
  warning: "border-caution-200 bg-caution-50 text-caution-700",
  info: "border-steel-200 bg-steel-50 text-steel-700",
};

export const SEVERITY_WORD: Record<Severity, string> = { error: "Error", warning: "Warning", info: "Note" };

/** Severity as an icon and a word (colour is never the only signal). */
export function SeverityMark({ severity, className }: { severity: Severity; className?: string }) {
  return (
    <span className={cn("inline-flex shrink-0 items-center gap-1 font-semibold", className)}>
      <svg viewBox="0 0 16 16" className="size-3.5" aria-hidden="true" fill="currentColor">
        {severity === "error" ? (
          <path d="M8 1 15 14H1L8 1Zm-.75 5v4h1.5V6h-1.5Zm0 5v1.5h1.5V11h-1.5Z" />
        ) : severity === "warning" ? (
          <path d="M8 1.5a6.5 6.5 0 1 1 0 13 6.5 6.5 0 0 1 0-13ZM7.25 4.5v4.25h1.5V4.5h-1.5Zm0 5.75v1.5h1.5v-1.5h-1.5Z" />
        ) : (
          <path d="M8 1.5a6.5 6.5 0 1 1 0 13 6.5 6.5 0 0 1 0-13Zm-.75 5.75v4.25h1.5V7.25h-1.5Zm0-2.75V6h1.5V4.5h-1.5Z" />
        )}
      </svg>
      {SEVERITY_WORD[severity]}
    </span>
  );
}

/** One advisory: severity, message, reference. */
export function AdvisoryNote({ advisory, compact }: { advisory: Advisory; compact?: boolean }) {
  return (
    <li className={cn("rounded-md border px-2.5 py-1.5 text-xs", TONE[advisory.severity])} data-code={advisory.code}>
      <div className="flex items-start gap-2">
        <SeverityMark severity={advisory.severity} />
        <p className="min-w-0 flex-1 text-steel-800">{advisory.message}</p>
      </div>
      {!compact && <p className="mt-0.5 pl-[4.25rem] text-[11px] text-steel-500">{advisory.reference}</p>}
    </li>
  );
}
