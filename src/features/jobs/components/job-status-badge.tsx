import type { ReactNode } from "react";
import type { JobStatus } from "@shared/schemas/job";
import { cn } from "@/lib/cn";
import { STATUS_HINTS, STATUS_LABELS } from "@/features/jobs/lib/status";

/**
 * Each status has its own tint AND its own glyph (a ring filling up as the job advances, a cross for lost),
 * and always its name: colour is never the only signal.
 */
const STYLE: Record<JobStatus, string> = {
  lead: "bg-white text-steel-700 ring-steel-300",
  estimating: "bg-steel-100 text-steel-800 ring-steel-300",
  proposed: "bg-accent-50 text-accent-800 ring-accent-200",
  won: "bg-ok-50 text-ok-700 ring-ok-200",
  scheduled: "bg-accent-100 text-accent-900 ring-accent-300",
  installed: "bg-steel-800 text-white ring-steel-800",
  lost: "bg-steel-50 text-steel-500 ring-steel-200",
};

/** The share of the ring filled: 0 → empty circle, 1 → full disc. */
const PROGRESS: Record<Exclude<JobStatus, "lost">, number> = {
  lead: 0,
  estimating: 0.25,
  proposed: 0.5,
  won: 0.75,
  scheduled: 0.875,
  installed: 1,
};

function Glyph({ status }: { status: JobStatus }) {
  if (status === "lost") {
    return (
      <svg viewBox="0 0 12 12" className="size-3 shrink-0" aria-hidden="true">
        <circle cx="6" cy="6" r="4.75" fill="none" stroke="currentColor" strokeWidth="1.2" />
        <path d="m4.2 4.2 3.6 3.6M7.8 4.2 4.2 7.8" stroke="currentColor" strokeWidth="1.2" strokeLinecap="round" />
      </svg>
    );
  }
  const p = PROGRESS[status];
  const r = 4.75;
  let fill: ReactNode = null;
  if (p >= 1) fill = <circle cx="6" cy="6" r={r} fill="currentColor" />;
  else if (p > 0) {
    const a = 2 * Math.PI * p;
    const x = 6 + r * Math.sin(a);
    const y = 6 - r * Math.cos(a);
    fill = <path d={`M6 6 L6 ${6 - r} A${r} ${r} 0 ${p > 0.5 ? 1 : 0} 1 ${x.toFixed(2)} ${y.toFixed(2)} Z`} fill="currentColor" />;
  }
  return (
    <svg viewBox="0 0 12 12" className="size-3 shrink-0" aria-hidden="true">
      <circle cx="6" cy="6" r={r} fill="none" stroke="currentColor" strokeWidth="1.2" />
      {fill}
    </svg>
  );
}

export function JobStatusBadge({ status, className }: { status: JobStatus; className?: string }) {
  return (
    <span
      title={STATUS_HINTS[status]}
      className={cn(
        "inline-flex items-center gap-1 whitespace-nowrap rounded px-1.5 py-0.5 text-xs font-medium ring-1 ring-inset",
        STYLE[status],
        className,
      )}
    >
      <Glyph status={status} />
      {STATUS_LABELS[status]}
    </span>
  );
}
