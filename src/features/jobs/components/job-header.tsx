import type { ReactNode } from "react";
import { Link } from "react-router-dom";
import type { JobDto } from "@shared/schemas/job";
import { paths } from "@/config/paths";
import { JobStatusBadge } from "@/features/jobs/components/job-status-badge";
import { ProposalProgressLine, proposalOf } from "@/features/jobs/components/proposal-progress";
import { DASH, formatMoney, formatSquares, fullSite } from "@/lib/format";

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
  const proposal = proposalOf(job);
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
        <JobShortcuts jobId={job.id} />
        <div className="min-w-0 max-sm:w-full">
          <div className="flex flex-wrap items-center gap-2">
            <h1 className="text-lg font-semibold tracking-tight text-steel-950 sm:truncate">
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
          {showQuoteTotal && proposal && (
            <div className="mt-1.5">
              <ProposalProgressLine progress={proposal} />
            </div>
          )}
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

const shortcut =
  "inline-flex h-9 items-center gap-1.5 rounded-md px-3 text-sm font-medium focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500 focus-visible:ring-offset-1 sm:h-8";

/**
 * What the crew open first, for everyone who may open the job: the install packet (printable page and
 * PDF) and the job's files (photo upload). First in the header on a phone, at the right on wider screens.
 */
function JobShortcuts({ jobId }: { jobId: number }) {
  return (
    <div className="flex w-full gap-2 sm:order-last sm:w-auto">
      <Link to={`/jobs/${jobId}/packet`} className={`${shortcut} flex-1 justify-center bg-accent-700 text-white shadow-sm hover:bg-accent-800 sm:flex-none`}>
        <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.5" aria-hidden="true">
          <path d="M4 1.75h5.5L12.5 4.75v9.5h-8.5z M9.25 1.75v3.25h3.25 M6 8h4.5M6 10.5h4.5" strokeLinejoin="round" />
        </svg>
        Install packet
      </Link>
      <Link
        to={paths.jobSection(jobId, "files")}
        className={`${shortcut} flex-1 justify-center border border-steel-300 bg-white text-steel-800 shadow-sm hover:bg-steel-50 sm:flex-none`}
      >
        <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.5" aria-hidden="true">
          <path d="M2 5.25h2.5l1.25-1.75h4.5l1.25 1.75H14v7.5H2z" strokeLinejoin="round" />
          <circle cx="8" cy="8.75" r="2.25" />
        </svg>
        Photos &amp; files
      </Link>
    </div>
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
