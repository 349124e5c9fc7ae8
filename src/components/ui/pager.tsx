import { cn } from "@/lib/cn";
import { Button } from "@/components/ui/button";

type Props = {
  page: number;
  pageSize: number;
  total: number;
  onPage: (page: number) => void;
  /** With both, a page-size choice is shown. */
  pageSizes?: readonly number[];
  onPageSize?: (size: number) => void;
  /** "jobs", "customers", "entries". */
  noun?: string;
  className?: string;
};

const count = new Intl.NumberFormat("en-US");

/** "26–50 of 312 jobs", previous/next, and the page size: under a paged table. */
export function Pager({ page, pageSize, total, onPage, pageSizes, onPageSize, noun = "rows", className }: Props) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const from = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const to = Math.min(total, page * pageSize);
  return (
    <nav aria-label="Pages" className={cn("flex flex-wrap items-center justify-between gap-2 text-sm text-steel-600", className)}>
      <p aria-live="polite" className="tabular-nums">
        {total === 0 ? `No ${noun}` : `${count.format(from)}–${count.format(to)} of ${count.format(total)} ${noun}`}
      </p>
      <div className="flex items-center gap-2">
        {pageSizes && onPageSize && (
          <label className="flex items-center gap-1.5 text-xs text-steel-600">
            Per page
            <select
              value={pageSize}
              onChange={(e) => onPageSize(Number(e.target.value))}
              className="h-7 rounded-md border border-steel-300 bg-white px-1.5 text-xs text-steel-800 focus-visible:border-accent-600 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500/30"
            >
              {pageSizes.map((n) => (
                <option key={n} value={n}>
                  {n}
                </option>
              ))}
            </select>
          </label>
        )}
        <span className="tabular-nums text-xs text-steel-500">
          Page {page} of {pages}
        </span>
        <Button variant="secondary" size="sm" disabled={page <= 1} onClick={() => onPage(page - 1)} aria-label="Previous page">
          <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
            <path d="m10 3.5-4.5 4.5 4.5 4.5" strokeLinecap="round" strokeLinejoin="round" />
          </svg>
          Previous
        </Button>
        <Button variant="secondary" size="sm" disabled={page >= pages} onClick={() => onPage(page + 1)} aria-label="Next page">
          Next
          <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
            <path d="m6 3.5 4.5 4.5L6 12.5" strokeLinecap="round" strokeLinejoin="round" />
          </svg>
        </Button>
      </div>
    </nav>
  );
}
