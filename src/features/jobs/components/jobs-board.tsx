import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { useNavigate, useSearchParams } from "react-router-dom";
import { JOB_STATUSES } from "@shared/schemas/job";
import type { UserDto } from "@shared/schemas/auth";
import { canSeePricing } from "@shared/auth/roles";
import { errorMessage } from "@/lib/api-client";
import { paths } from "@/config/paths";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { LoadFailed } from "@/components/ui/load-failed";
import { Pager } from "@/components/ui/pager";
import { Select } from "@/components/ui/select";
import { Spinner } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { PageHeader } from "@/components/layout/page-header";
import { userQueries } from "@/lib/queries/users";
import { useJobs } from "@/lib/queries/jobs";
import { JobsTable } from "@/features/jobs/components/jobs-table";
import { NewJobForm, type CustomerInputs } from "@/features/jobs/components/new-job-form";
import { SearchBox } from "@/components/ui/search-box";
import { PAGE_SIZES, nextSort, readBoard, toRequest, writeBoard, type BoardState } from "@/features/jobs/lib/board-params";
import { STATUS_LABELS } from "@/features/jobs/lib/status";
import { useCreateJob } from "@/features/jobs/api/mutations";

/** Who the estimator filter offers: owners pick from the team; an estimator (no team list) has "Mine". */
function useEstimatorOptions(me: UserDto) {
  // only owners may read the team list: the query is not even started for others
  const team = useQuery({ ...userQueries.list(), enabled: me.role === "owner" });
  if (me.role === "estimator") return [{ value: String(me.id), label: "Mine" }];
  return (team.data ?? [])
    .filter((m) => m.role !== "crew" && m.active)
    .sort((a, b) => a.name.localeCompare(b.name))
    .map((m) => ({ value: String(m.id), label: m.id === me.id ? `${m.name} (me)` : m.name }));
}

function TeamEstimatorOptions({ me }: { me: UserDto }) {
  const options = useEstimatorOptions(me);
  return (
    <>
      {options.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
    </>
  );
}

/** The jobs board: filters, the table, paging, and the new-job dialog. Its state is in the URL. */
/** `customerInputs`: the customer picker and fields the new-job form shows (from the customers feature). */
export function JobsBoard({ me, customerInputs }: { me: UserDto; customerInputs: CustomerInputs }) {
  const [searchParams, setSearchParams] = useSearchParams();
  const navigate = useNavigate();
  const board = readBoard(searchParams);
  const jobs = useJobs(toRequest(board));
  const createJob = useCreateJob();
  const [creating, setCreating] = useState(false);

  const crew = me.role === "crew";
  const office = !crew;
  const showQuoteTotal = canSeePricing(me.role);

  /** Changing a filter goes back to page 1; the search box replaces history while typing. */
  const update = (changes: Partial<BoardState>, opts: { replace?: boolean } = {}) => {
    const resetPage = !("page" in changes);
    setSearchParams(writeBoard({ ...board, ...(resetPage ? { page: 1 } : {}), ...changes }), { replace: opts.replace });
  };

  const filtered = Boolean(board.q || board.status || board.estimator);
  const data = jobs.data;

  return (
    <>
      <PageHeader
        title="Jobs"
        description={crew ? "The jobs you're assigned to." : "Every lead, quote and install for your company."}
        actions={
          office && (
            <Button onClick={() => setCreating(true)}>
              <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.8" aria-hidden="true">
                <path d="M8 3v10M3 8h10" strokeLinecap="round" />
              </svg>
              New job
            </Button>
          )
        }
      />

      <div role="search" aria-label="Filter jobs" className="mb-3 flex flex-wrap items-center gap-2">
        <SearchBox
          label="Search jobs"
          placeholder="Customer, e-mail, street, city or ZIP"
          value={board.q}
          onSearch={(q) => update({ q }, { replace: true })}
          className="w-full sm:w-72"
        />
        <Select
          aria-label="Status"
          value={board.status}
          onChange={(e) => update({ status: e.target.value as BoardState["status"] })}
          className="w-40"
        >
          <option value="">All statuses</option>
          <option value="open">Open jobs</option>
          {JOB_STATUSES.map((s) => (
            <option key={s} value={s}>
              {STATUS_LABELS[s]}
            </option>
          ))}
        </Select>
        {office && (
          <Select
            aria-label="Estimator"
            value={board.estimator}
            onChange={(e) => update({ estimator: e.target.value })}
            className="w-44"
          >
            <option value="">All estimators</option>
            <option value="none">Unassigned</option>
            <TeamEstimatorOptions me={me} />
            {board.estimator && board.estimator !== "none" && board.estimator !== String(me.id) && me.role !== "owner" && (
              <option value={board.estimator}>Estimator #{board.estimator}</option>
            )}
          </Select>
        )}
        {office && (
          <div role="group" aria-label="Show" className="inline-flex rounded-md border border-steel-300 bg-white p-0.5 shadow-sm">
            {[
              { archived: false, label: "Live" },
              { archived: true, label: "Archived" },
            ].map((o) => (
              <button
                key={o.label}
                type="button"
                aria-pressed={board.archived === o.archived}
                onClick={() => update({ archived: o.archived })}
                className={
                  board.archived === o.archived
                    ? "h-6 rounded px-2.5 text-xs font-medium text-white bg-steel-800 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
                    : "h-6 rounded px-2.5 text-xs font-medium text-steel-600 hover:bg-steel-100 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
                }
              >
                {o.label}
              </button>
            ))}
          </div>
        )}
        {filtered && (
          <Button variant="ghost" size="sm" onClick={() => update({ q: "", status: "", estimator: "" })}>
            Clear filters
          </Button>
        )}
        {jobs.isFetching && !jobs.isPending && (
          <span className="flex items-center gap-1.5 text-xs text-steel-500">
            <Spinner label="Updating" /> Updating…
          </span>
        )}
      </div>

      <ErrorBoundary what="The jobs table">
        {jobs.isPending ? (
          <div className="flex items-center gap-2 rounded-lg border border-steel-200 bg-white px-4 py-10 text-steel-500 shadow-panel">
            <Spinner label="Loading jobs" /> <span>Loading jobs…</span>
          </div>
        ) : jobs.isError && !data ? (
          <LoadFailed title="The jobs could not be loaded" error={jobs.error} onRetry={() => jobs.refetch()} />
        ) : data && data.data.length === 0 ? (
          filtered || board.archived || board.page > 1 ? (
            <EmptyState
              title={board.archived && !filtered ? "No archived jobs" : "No jobs match"}
              description={
                filtered ? "Nothing matches these filters. Try a shorter search or another status." : undefined
              }
              action={
                filtered ? (
                  <Button variant="secondary" onClick={() => update({ q: "", status: "", estimator: "" })}>
                    Clear filters
                  </Button>
                ) : board.page > 1 ? (
                  <Button variant="secondary" onClick={() => update({ page: 1 })}>
                    Back to the first page
                  </Button>
                ) : undefined
              }
            />
          ) : (
            <EmptyState
              icon={
                <svg viewBox="0 0 48 48" className="size-12" fill="none" stroke="currentColor" strokeWidth="1.5">
                  <path d="M6 25 24 10l18 15" strokeLinecap="round" strokeLinejoin="round" />
                  <path d="M13 20v19M19 15v24M24 11v28M29 15v24M35 20v19" strokeLinecap="round" />
                  <path d="M9 39h30" strokeLinecap="round" />
                </svg>
              }
              title={crew ? "No jobs assigned to you" : "No jobs yet"}
              description={
                crew
                  ? "When the office assigns you to a job, it shows here with its roof and install details."
                  : "Start with a new job: pick or add the homeowner, the site's address and what you know about the site."
              }
              action={office ? <Button onClick={() => setCreating(true)}>New job</Button> : undefined}
            />
          )
        ) : data ? (
          <div className="space-y-2">
            {jobs.isError && (
              <Alert tone="error" title="The list could not be refreshed">
                {errorMessage(jobs.error)}
              </Alert>
            )}
            <JobsTable
              jobs={data.data}
              sort={board.sort}
              onSort={(c) => update({ sort: nextSort(board.sort, c) })}
              showQuoteTotal={showQuoteTotal}
              stale={jobs.isPlaceholderData}
            />
            <Pager
              page={board.page}
              pageSize={board.pageSize}
              total={data.meta.total}
              noun={data.meta.total === 1 ? "job" : "jobs"}
              onPage={(page) => update({ page })}
              pageSizes={PAGE_SIZES}
              onPageSize={(pageSize) => update({ pageSize })}
            />
          </div>
        ) : null}
      </ErrorBoundary>

      {office && (
        <Dialog
          open={creating}
          onClose={() => setCreating(false)}
          busy={createJob.isPending}
          title="New job"
          description="Pick the homeowner or add them, and where the roof is. Everything else can be filled in later."
          className="max-w-2xl"
        >
          <NewJobForm
            me={me}
            customerInputs={customerInputs}
            onCancel={() => setCreating(false)}
            onSubmit={async (values) => {
              const job = await createJob.mutateAsync(values);
              setCreating(false);
              toast.success(`Job created for ${job.customer.name}.`);
              navigate(paths.jobSection(job.id, "site"));
            }}
          />
        </Dialog>
      )}
    </>
  );
}
