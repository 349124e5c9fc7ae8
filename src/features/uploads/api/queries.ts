import { queryOptions, useQuery } from "@tanstack/react-query";
import type { AttachmentDto } from "@shared/schemas/attachment";
import { api } from "@/lib/api-client";

export const attachmentKeys = {
  all: ["attachments"] as const,
  lists: () => [...attachmentKeys.all, "list"] as const,
  list: (jobId: number) => [...attachmentKeys.lists(), jobId] as const,
};

export const attachmentQueries = {
  list: (jobId: number) =>
    queryOptions({
      queryKey: attachmentKeys.list(jobId),
      queryFn: ({ signal }) => api<{ data: AttachmentDto[] }>(`/jobs/${jobId}/attachments`, { signal }).then((r) => r.data),
    }),
};

/** The job's files; polls every 2 s while a photo is being converted. */
export const useAttachments = (jobId: number) =>
  useQuery({
    ...attachmentQueries.list(jobId),
    refetchInterval: (q) => (q.state.data?.some((a) => a.status === "processing") ? 2000 : false),
  });
