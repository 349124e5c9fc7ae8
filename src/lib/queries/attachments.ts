/**
 * The job's files: one key factory, the list query and the single-file upload, shared by the Files section
 * and the roof sketch's plan underlay (which uploads a plan and lists the plans).
 */
import { queryOptions, useQuery } from "@tanstack/react-query";
import type { AttachmentDto } from "@shared/schemas/attachment";
import { api } from "@/lib/api-client";
import { uploadFiles } from "@/lib/upload";

export const attachmentKeys = {
  all: ["attachments"] as const,
  lists: () => [...attachmentKeys.all, "list"] as const,
  list: (jobId: number) => [...attachmentKeys.lists(), jobId] as const,
  /** The job's plan drawings only (under `list`, so invalidating the list refreshes them too). */
  plans: (jobId: number) => [...attachmentKeys.list(jobId), "plan"] as const,
};

export const attachmentQueries = {
  list: (jobId: number) =>
    queryOptions({
      queryKey: attachmentKeys.list(jobId),
      queryFn: ({ signal }) => api<{ data: AttachmentDto[] }>(`/jobs/${jobId}/attachments`, { signal }).then((r) => r.data),
    }),
  plans: (jobId: number) =>
    queryOptions({
      queryKey: attachmentKeys.plans(jobId),
      queryFn: ({ signal }) =>
        api<{ data: AttachmentDto[] }>(`/jobs/${jobId}/attachments?kind=plan`, { signal }).then((r) => r.data),
    }),
};

/** The job's files; polls every 2 s while a photo is being converted. */
export const useAttachments = (jobId: number) =>
  useQuery({
    ...attachmentQueries.list(jobId),
    refetchInterval: (q) => (q.state.data?.some((a) => a.status === "processing") ? 2000 : false),
  });

/** Uploads one file (its own request, so each has its own progress). */
export function uploadAttachment(jobId: number, file: File, opts: { caption?: string; kind?: "plan"; onProgress?: (f: number) => void; signal?: AbortSignal }) {
  const form = new FormData();
  if (opts.caption) form.append("caption", opts.caption);
  if (opts.kind) form.append("kind", opts.kind);
  form.append("file", file, file.name);
  return uploadFiles<{ data: AttachmentDto[] }>(`/jobs/${jobId}/attachments`, form, opts).then((r) => r.data);
}
