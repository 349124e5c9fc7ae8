import { useMutation, useQueryClient, type QueryClient } from "@tanstack/react-query";
import type { JobAssignment, JobDto, JobFormValues, JobUpdate } from "@shared/schemas/job";
import { api } from "@/lib/api-client";
import { jobKeys } from "@/lib/queries/jobs";
import { customerKeys } from "@/lib/queries/customers";
import { roofKeys } from "@/lib/queries/roof";

/** A changed job: the detail is replaced, the board lists and this job's log refetch. */
function afterJobChange(qc: QueryClient, job: JobDto) {
  qc.setQueryData(jobKeys.detail(job.id), job);
  return Promise.all([
    qc.invalidateQueries({ queryKey: jobKeys.lists() }),
    qc.invalidateQueries({ queryKey: jobKeys.audits(job.id) }),
  ]);
}

/** POST /api/jobs. The new-job form shows the errors itself. */
export function useCreateJob() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: JobFormValues) => api<{ data: JobDto }>("/jobs", { method: "POST", json: input }).then((r) => r.data),
    meta: { handlesError: true },
    onSuccess: (job) => {
      qc.setQueryData(jobKeys.detail(job.id), job);
      // a customer created with the job appears in the customer lists
      void qc.invalidateQueries({ queryKey: customerKeys.lists() });
      return qc.invalidateQueries({ queryKey: jobKeys.lists() });
    },
  });
}

/** PATCH /api/jobs/:id (site, address, notes, status). The caller shows the errors. */
export function useUpdateJob(jobId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (changes: Partial<JobUpdate> | Record<string, unknown>) =>
      api<{ data: JobDto }>(`/jobs/${jobId}`, { method: "PATCH", json: changes }).then((r) => r.data),
    meta: { handlesError: true },
    onSuccess: (job, changes) => {
      // the server recomputes the stored takeoff when the site data changes (wind, ice barrier, ventilation)
      if ("site" in changes) void qc.invalidateQueries({ queryKey: roofKeys.takeoff(job.id) });
      return afterJobChange(qc, job);
    },
  });
}

/** PUT /api/jobs/:id/assignment. */
export function useSetJobAssignment(jobId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: JobAssignment) =>
      api<{ data: JobDto }>(`/jobs/${jobId}/assignment`, { method: "PUT", json: input }).then((r) => r.data),
    meta: { handlesError: true },
    onSuccess: (job) => afterJobChange(qc, job),
  });
}

/** POST /api/jobs/:id/archive or /restore. Failures become a toast. */
export function useSetJobArchived(jobId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (archived: boolean) =>
      api<{ data: JobDto }>(`/jobs/${jobId}/${archived ? "archive" : "restore"}`, { method: "POST" }).then((r) => r.data),
    onSuccess: (job) => afterJobChange(qc, job),
  });
}
