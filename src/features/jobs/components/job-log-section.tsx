import { useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadFailed } from "@/components/ui/load-failed";
import { Pager } from "@/components/ui/pager";
import { Spinner } from "@/components/ui/spinner";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { useMe } from "@/lib/auth";
import { userQueries } from "@/lib/queries/users";
import { useJob, useJobAudit } from "@/lib/queries/jobs";
import { summarizeAudit } from "@/features/jobs/lib/audit-summary";
import { formatDateTime } from "@/lib/format";

const PAGE_SIZE = 25;

const ENTITY_LABELS: Record<string, string> = {
  job: "Job",
  roof: "Roof",
  quote: "Quote",
  attachment: "Files",
};

/** The job workspace's Log section: who changed what and when, newest first, a page at a time. */
export function JobLogSection({ jobId }: { jobId: number }) {
  const [page, setPage] = useState(1);
  const log = useJobAudit(jobId, { page, pageSize: PAGE_SIZE });
  const job = useJob(jobId);
  const { data: me } = useMe();
  // names for the ids in assignment entries: the team (owners may read it) and the job's own people
  const team = useQuery({ ...userQueries.list(), enabled: me?.role === "owner" });
  const names = new Map<number, string>();
  for (const m of team.data ?? []) names.set(m.id, m.name);
  if (job.data?.estimator) names.set(job.data.estimator.id, job.data.estimator.name);
  for (const c of job.data?.crew ?? []) names.set(c.id, c.name);
  if (me) names.set(me.id, me.name);

  if (log.isPending) {
    return (
      <div className="flex items-center gap-2 py-8 text-steel-500">
        <Spinner label="Loading the log" /> <span>Loading the log…</span>
      </div>
    );
  }
  if (log.isError && !log.data) {
    return (
      <LoadFailed title="The log could not be loaded" error={log.error} onRetry={() => log.refetch()} />
    );
  }
  const { data: events, meta } = log.data;
  if (events.length === 0 && page === 1) {
    return <EmptyState title="Nothing logged yet" description="Every change to this job, its roof and its quotes is recorded here." />;
  }

  return (
    <section aria-labelledby="job-log-title" className="space-y-2">
      <div className="flex items-baseline justify-between gap-2">
        <h2 id="job-log-title" className="text-sm font-semibold text-steel-900">
          Change log
        </h2>
        <p className="text-xs text-steel-500">Newest first</p>
      </div>
      <Table aria-label="Change log" className={log.isPlaceholderData ? "opacity-60" : undefined}>
        <THead>
          <tr>
            <Th className="w-44">When</Th>
            <Th className="w-40">Who</Th>
            <Th className="w-20">Part</Th>
            <Th>What changed</Th>
          </tr>
        </THead>
        <TBody>
          {events.map((e) => {
            const s = summarizeAudit(e, (id) => names.get(id));
            return (
              <Tr key={e.id} className="align-top">
                <Td className="whitespace-nowrap py-1.5 align-top tabular-nums text-steel-600">
                  <time dateTime={e.createdAt}>{formatDateTime(e.createdAt)}</time>
                </Td>
                <Td className="py-1.5 align-top text-steel-800">{e.actor?.name ?? <span className="text-steel-500">System</span>}</Td>
                <Td className="py-1.5 align-top text-xs text-steel-500">{ENTITY_LABELS[e.entityType] ?? e.entityType}</Td>
                <Td className="py-1.5 align-top">
                  <p className="font-medium text-steel-900">{s.title}</p>
                  {s.details.length > 0 && (
                    <ul className="mt-0.5 space-y-0.5 text-xs text-steel-600">
                      {s.details.map((d, i) => (
                        <li key={i}>{d}</li>
                      ))}
                    </ul>
                  )}
                </Td>
              </Tr>
            );
          })}
        </TBody>
      </Table>
      <Pager page={page} pageSize={PAGE_SIZE} total={meta.total} noun={meta.total === 1 ? "entry" : "entries"} onPage={setPage} />
    </section>
  );
}
