import type { QuoteStatus } from "@shared/schemas/quote";
import { cn } from "@/lib/cn";
import { formatPct } from "@/lib/money";

export const STATUS_LABEL: Record<QuoteStatus, string> = {
  draft: "Draft",
  in_review: "In review",
  approved: "Approved",
  sent: "Sent",
  accepted: "Accepted",
  declined: "Declined",
  expired: "Expired",
};

const STATUS_CLASS: Record<QuoteStatus, string> = {
  draft: "bg-white text-steel-700 ring-steel-300",
  in_review: "bg-accent-50 text-accent-800 ring-accent-200",
  approved: "bg-ok-50 text-ok-700 ring-ok-200",
  sent: "bg-steel-100 text-steel-800 ring-steel-300",
  accepted: "bg-ok-50 text-ok-700 ring-ok-200",
  declined: "bg-danger-50 text-danger-700 ring-danger-200",
  expired: "bg-steel-100 text-steel-500 ring-steel-200",
};

/** The state of a quote, in words (the colour only repeats them). */
export function StatusBadge({ status, className }: { status: QuoteStatus; className?: string }) {
  return (
    <span
      className={cn(
        "inline-flex items-center gap-1 whitespace-nowrap rounded px-1.5 py-0.5 text-xs font-medium ring-1 ring-inset",
        STATUS_CLASS[status],
        className,
      )}
    >
      {status === "in_review" && <span aria-hidden="true" className="size-1.5 rounded-full bg-accent-600" />}
      {STATUS_LABEL[status]}
    </span>
  );
}

/** A margin against the company minimum: the number, then "below 20% min" or "≥ 20% min" in words, with a mark. */
export function MarginText({ marginPct, minMarginPct, className }: { marginPct: number; minMarginPct: number; className?: string }) {
  const below = marginPct < minMarginPct;
  return (
    <span className={cn("inline-flex items-center gap-1 whitespace-nowrap tabular-nums", below ? "text-danger-700" : "text-ok-700", className)}>
      <span aria-hidden="true" className="text-[10px]">
        {below ? "▼" : "●"}
      </span>
      <span className="font-semibold">{formatPct(marginPct)}</span>
      <span className="text-xs font-normal">
        {below ? `below ${formatPct(minMarginPct, 0)} min` : `≥ ${formatPct(minMarginPct, 0)} min`}
      </span>
    </span>
  );
}
