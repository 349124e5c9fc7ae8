import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { LoadFailed } from "@/components/ui/load-failed";
import { Spinner } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { useMe } from "@/lib/auth";
import { useJob } from "@/lib/queries/jobs";
import { useSetJobArchived, useUpdateJob } from "@/features/jobs/api/mutations";
import { AssignmentForm, AssignmentReadOnly } from "@/features/jobs/components/assignment-panel";
import { JobStatusPanel } from "@/features/jobs/components/job-status-panel";
import { SiteForm } from "@/features/jobs/components/site-form";
import { SiteReadOnly } from "@/features/jobs/components/site-read-only";

const card = "rounded-lg border border-steel-200 bg-white p-4 shadow-panel";

/**
 * The job workspace's Site section: the site's address, site data and notes (edit), the status moves,
 * who is assigned, archive and restore. Crew read it.
 */
export function SiteSection({ jobId }: { jobId: number }) {
  const job = useJob(jobId);
  const { data: me } = useMe();
  const update = useUpdateJob(jobId);
  const setArchived = useSetJobArchived(jobId);
  const [confirmArchive, setConfirmArchive] = useState(false);

  if (job.isPending) {
    return (
      <div className="flex items-center gap-2 py-8 text-steel-500">
        <Spinner label="Loading the site" /> <span>Loading the site…</span>
      </div>
    );
  }
  if (job.isError) {
    return (
      <LoadFailed title="The site could not be loaded" error={job.error} onRetry={() => job.refetch()} />
    );
  }

  const j = job.data;
  const role = me?.role ?? "crew";
  if (role === "crew") {
    return (
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <div className={card}>
          <SiteReadOnly job={j} />
        </div>
        <div className={card}>
          <AssignmentReadOnly job={j} />
        </div>
      </div>
    );
  }

  const archived = Boolean(j.archivedAt);
  const restore = () =>
    setArchived.mutate(false, { onSuccess: () => toast.success("The job was restored; it's back on the board.") });

  return (
    <div className="space-y-3">
      {archived && (
        <Alert tone="caution" title="This job is archived">
          <p>It's off the board and can't be changed. Restore it to work on it again.</p>
          <Button variant="secondary" size="sm" className="mt-2" loading={setArchived.isPending} onClick={restore}>
            Restore job
          </Button>
        </Alert>
      )}
      <div className="grid items-start gap-4 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <div className={card}>
          <ErrorBoundary what="The site form">
            <SiteForm
              key={j.id}
              job={j}
              disabled={archived}
              onSave={async (changes) => {
                const saved = await update.mutateAsync(changes);
                toast.success("Site saved.");
                return saved;
              }}
            />
          </ErrorBoundary>
        </div>
        <div className="grid gap-4 md:grid-cols-2 lg:grid-cols-1">
          <div className={card}>
            <JobStatusPanel job={j} disabled={archived} />
          </div>
          <div className={card}>
            {role === "owner" ? (
              <AssignmentForm job={j} disabled={archived} />
            ) : (
              <AssignmentReadOnly job={j} note="Only an owner can change who's assigned to a job." />
            )}
          </div>
          {!archived && (
            <div className={`${card} md:col-span-2 lg:col-span-1`}>
              <h2 className="text-sm font-semibold text-steel-900">Archive</h2>
              <p className="mt-1 text-xs text-steel-600">
                Takes the job off the board. Nothing is deleted; you can restore it from the board's Archived view.
              </p>
              <Button
                variant="secondary"
                size="sm"
                className="mt-2 text-danger-700"
                onClick={() => setConfirmArchive(true)}
              >
                Archive job
              </Button>
            </div>
          )}
        </div>
      </div>

      <Dialog
        open={confirmArchive}
        onClose={() => setConfirmArchive(false)}
        busy={setArchived.isPending}
        title="Archive this job?"
        description={`${j.customer.name}'s job leaves the board and can't be changed until it's restored. Its roof, quotes and files stay as they are.`}
        footer={
          <>
            <Button variant="secondary" onClick={() => setConfirmArchive(false)} disabled={setArchived.isPending}>
              Cancel
            </Button>
            <Button
              variant="danger"
              loading={setArchived.isPending}
              onClick={() =>
                setArchived.mutate(true, {
                  onSuccess: () => toast.success("The job was archived."),
                  onSettled: () => setConfirmArchive(false),
                })
              }
            >
              Archive job
            </Button>
          </>
        }
      />
    </div>
  );
}
