import { useState } from "react";
import type { JobDto, JobStatus } from "@shared/schemas/job";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { toast } from "@/components/ui/toast";
import { useUpdateJob } from "@/features/jobs/api/mutations";
import { JobStatusBadge } from "@/features/jobs/components/job-status-badge";
import { STATUS_HINTS, STATUS_LABELS, manualMoves, moveLabel } from "@/features/jobs/lib/status";

/** The job's status and the moves a person may make by hand (the rest follow the roof and the proposal). */
export function JobStatusPanel({ job, disabled }: { job: JobDto; disabled: boolean }) {
  const update = useUpdateJob(job.id);
  const [refusal, setRefusal] = useState<string | null>(null);
  // a lost job reopens as estimating when it has a measured roof (squares from the saved takeoff), else as a lead;
  // the server checks the same and refuses the other move
  const moves = manualMoves(job.status).filter((to) =>
    job.status !== "lost" ? true : to === (job.squares === null ? "lead" : "estimating"),
  );
  const pending = update.isPending ? (update.variables as { status?: JobStatus }).status : undefined;

  const move = (to: JobStatus) => {
    setRefusal(null);
    update.mutate(
      { status: to },
      {
        onSuccess: () => toast.success(`Status is now ${STATUS_LABELS[to].toLowerCase()}.`),
        onError: (err) => {
          if (err instanceof ApiError && err.status === 409) setRefusal(err.message);
          else setRefusal(errorMessage(err));
        },
      },
    );
  };

  return (
    <section aria-labelledby="status-title" className="space-y-2">
      <h2 id="status-title" className="text-sm font-semibold text-steel-900">
        Status
      </h2>
      <div className="flex items-center gap-2">
        <JobStatusBadge status={job.status} />
        <span className="text-xs text-steel-600">{STATUS_HINTS[job.status]}</span>
      </div>
      {refusal && (
        <Alert tone="error" title="Status not changed" onDismiss={() => setRefusal(null)}>
          {refusal}
        </Alert>
      )}
      {!disabled && moves.length > 0 && (
        <div className="flex flex-wrap gap-1.5">
          {moves.map((to) => (
            <Button
              key={to}
              variant="secondary"
              size="sm"
              loading={pending === to}
              disabled={update.isPending}
              onClick={() => move(to)}
              className={to === "lost" ? "text-danger-700" : undefined}
            >
              {moveLabel(job.status, to)}
            </Button>
          ))}
        </div>
      )}
      <p className="text-xs text-steel-500">
        The rest happens by itself: the first saved roof makes a lead estimating, a sent proposal makes it proposed, an
        accepted one won.
      </p>
    </section>
  );
}
