import type { MouseEvent, ReactNode } from "react";
import { Link, useNavigate } from "react-router-dom";
import type { JobListItem, JobSort } from "@shared/schemas/job";
import { cn } from "@/lib/cn";
import { paths } from "@/config/paths";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { JobStatusBadge } from "@/features/jobs/components/job-status-badge";
import { ProposalProgressBadge, proposalOf } from "@/features/jobs/components/proposal-progress";
import { DASH, formatDateTime, formatMoney, formatShortDate, formatSquares, shortSite } from "@/lib/format";
import { sortOf, type SortColumn } from "@/features/jobs/lib/board-params";

type Props = {
  jobs: JobListItem[];
  sort: JobSort;
  onSort: (column: SortColumn) => void;
  /** Owners and estimators; crew never get the quote total. */
  showQuoteTotal: boolean;
  /** The next page is loading: the rows dim a little. */
  stale?: boolean;
};

function SortIcon({ dir }: { dir: "asc" | "desc" | null }) {
  return (
    <svg viewBox="0 0 12 12" className={cn("size-3 shrink-0", dir ? "text-accent-700" : "text-steel-400")} aria-hidden="true">
      <path d="M6 2 3.5 4.75h5Z" fill="currentColor" opacity={dir === "desc" ? 0.25 : 1} />
      <path d="M6 10 3.5 7.25h5Z" fill="currentColor" opacity={dir === "asc" ? 0.25 : 1} />
    </svg>
  );
}

function SortHeader({
  column,
  label,
  sort,
  onSort,
  className,
  alignRight,
}: {
  column: SortColumn;
  label: string;
  sort: JobSort;
  onSort: (c: SortColumn) => void;
  className?: string;
  alignRight?: boolean;
}) {
  const current = sortOf(sort);
  const dir = current.column === column ? current.dir : null;
  return (
    <Th aria-sort={dir === "asc" ? "ascending" : dir === "desc" ? "descending" : "none"} className={cn("p-0", className)}>
      <button
        type="button"
        onClick={() => onSort(column)}
        className={cn(
          "flex w-full items-center gap-1 px-3 py-2 text-xs font-semibold uppercase tracking-wide hover:text-steel-900",
          "focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-inset focus-visible:ring-accent-500",
          dir ? "text-steel-900" : "text-steel-600",
          alignRight && "justify-end",
        )}
      >
        {label}
        <SortIcon dir={dir} />
      </button>
    </Th>
  );
}

const Muted = ({ children }: { children: ReactNode }) => <span className="text-steel-400">{children}</span>;

/** The board's table: a real `<table>`, sortable headers, each row opening its job. */
export function JobsTable({ jobs, sort, onSort, showQuoteTotal, stale }: Props) {
  const navigate = useNavigate();

  const open = (e: MouseEvent<HTMLTableRowElement>, id: number) => {
    // the row's own link (and anything else clickable in it) handles itself; a text selection is not a click
    if ((e.target as HTMLElement).closest("a, button, input, select, label")) return;
    if (window.getSelection()?.toString()) return;
    const to = paths.jobSection(id, "site");
    if (e.metaKey || e.ctrlKey) window.open(to, "_blank", "noopener");
    else navigate(to);
  };

  return (
    <Table aria-label="Jobs" aria-busy={stale || undefined} className={cn("transition-opacity", stale && "opacity-60")}>
      <THead>
        <tr>
          <SortHeader column="status" label="Status" sort={sort} onSort={onSort} className="w-28" />
          <SortHeader column="customer" label="Customer" sort={sort} onSort={onSort} />
          <Th className="hidden lg:table-cell">Site</Th>
          <SortHeader column="squares" label="Squares" sort={sort} onSort={onSort} alignRight className="w-20 text-right" />
          {showQuoteTotal && (
            <SortHeader column="quoteTotal" label="Quote" sort={sort} onSort={onSort} alignRight className="w-24 text-right" />
          )}
          {showQuoteTotal && <Th className="hidden w-36 md:table-cell">Proposal</Th>}
          <Th className="hidden w-36 lg:table-cell">Estimator</Th>
          <SortHeader column="updatedAt" label="Last change" sort={sort} onSort={onSort} className="w-32" />
        </tr>
      </THead>
      <TBody>
        {jobs.map((j) => {
          const site = shortSite(j);
          return (
            <Tr
              key={j.id}
              onClick={(e) => open(e, j.id)}
              className={cn("cursor-pointer", j.archivedAt && "text-steel-500")}
            >
              <Td className="py-1.5">
                <JobStatusBadge status={j.status} />
              </Td>
              <Td className="whitespace-nowrap py-1.5">
                <Link
                  to={paths.jobSection(j.id, "site")}
                  className="font-medium text-steel-900 underline-offset-2 hover:text-accent-700 hover:underline focus-visible:rounded-sm focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
                >
                  {j.customer.name || `Job ${j.id}`}
                </Link>
                <span className="ml-1.5 text-xs tabular-nums text-steel-400">#{j.id}</span>
                {j.archivedAt && <span className="ml-1.5 text-xs text-steel-500">(archived)</span>}
                {/* narrower screens: the site and the estimator go under the customer instead of their own columns */}
                <span className="flex max-w-[14rem] gap-1 text-xs text-steel-500 lg:hidden">
                  <span className="truncate">{site || "No address"}</span>
                  <span className="shrink-0">· {j.estimator?.name ?? "Unassigned"}</span>
                </span>
              </Td>
              <Td className="hidden max-w-[18rem] truncate py-1.5 text-steel-700 lg:table-cell" title={site || undefined}>
                {site || <Muted>No address</Muted>}
              </Td>
              <Td className="py-1.5 text-right tabular-nums">{j.squares === null ? <Muted>{DASH}</Muted> : formatSquares(j.squares)}</Td>
              {showQuoteTotal && (
                <Td className="py-1.5 text-right tabular-nums">
                  {j.quoteTotalCents == null ? <Muted>{DASH}</Muted> : formatMoney(j.quoteTotalCents)}
                </Td>
              )}
              {showQuoteTotal && (
                <Td className="hidden py-1.5 md:table-cell">
                  <ProposalProgressBadge progress={proposalOf(j)} />
                </Td>
              )}
              <Td className="hidden max-w-[10rem] truncate py-1.5 text-steel-700 lg:table-cell">{j.estimator?.name ?? <Muted>Unassigned</Muted>}</Td>
              <Td className="whitespace-nowrap py-1.5 tabular-nums text-steel-600">
                <time dateTime={j.updatedAt} title={formatDateTime(j.updatedAt)}>
                  {formatShortDate(j.updatedAt)}
                </time>
              </Td>
            </Tr>
          );
        })}
      </TBody>
    </Table>
  );
}
