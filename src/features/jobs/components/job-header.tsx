import type { ReactNode } from "react";
import { Link } from "react-router-dom";
import type { JobDto } from "@shared/schemas/job";
import { paths } from "@/config/paths";
import { JobStatusBadge } from "@/features/jobs/components/job-status-badge";
import { DASH, formatMoney, formatSquares, fullSite } from "@/features/jobs/lib/format";

type Props = { job: JobDto; showQuoteTotal: boolean };

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="min-w-0">
      <dt className="text-[11px] font-medium uppercase tracking-wide text-steel-500">{label}</dt>
      <dd className="truncate text-sm font-medium tabular-nums text-steel-900">{children}</dd>
    </div>
  );
}

/** The job workspace's summary above the tabs: who and where, status, size, quote total and estimator. */
export function JobHeader({ job, showQuoteTotal }: Props) {
  const site = fullSite(job);
  return (
    <header className="space-y-2">
      <Link
        to={paths.jobs}
        className="inline-flex items-center gap-1 rounded text-xs font-medium text-steel-600 hover:text-accent-700 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
      >
        <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
          <path d="m10 3.5-4.5 4.5 4.5 4.5" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
        Jobs board
      </Link>
      <div className="flex flex-wrap items-end justify-between gap-x-6 gap-y-2">
        <div className="min-w-0">
          <div className="flex flex-wrap items-center gap-2">
            <h1 className="truncate text-lg font-semibold tracking-tight text-steel-950">
              {job.customer.name || `Job ${job.id}`}
              {site && <span className="font-normal text-steel-500"> · {site}</span>}
            </h1>
            <JobStatusBadge status={job.status} />
            {job.archivedAt && (
              <span className="rounded bg-steel-200 px-1.5 py-0.5 text-xs font-medium text-steel-700">Archived</span>
            )}
          </div>
          <p className="mt-0.5 text-xs text-steel-500">
            Job #{job.id}
            {job.customer.email ? ` · ${job.customer.email}` : ""}
            {job.customer.phone ? ` · ${job.customer.phone}` : ""}
          </p>
        </div>
        <dl className="flex flex-wrap gap-x-6 gap-y-1">
          <Fact label="Squares">{formatSquares(job.squares)}</Fact>
          {showQuoteTotal && <Fact label="Quote total">{job.quoteTotalCents == null ? DASH : formatMoney(job.quoteTotalCents)}</Fact>}
          <Fact label="Estimator">{job.estimator?.name ?? <span className="font-normal text-steel-500">Unassigned</span>}</Fact>
        </dl>
      </div>
    </header>
  );
}

/** The header's place while the job loads (same height, so the tabs don't jump). */
export function JobHeaderSkeleton() {
  return (
    <div className="space-y-2" aria-hidden="true">
      <div className="h-4 w-20 rounded bg-steel-100" />
      <div className="h-6 w-80 max-w-full animate-pulse rounded bg-steel-100" />
      <div className="h-4 w-40 rounded bg-steel-100" />
    </div>
  );
}
