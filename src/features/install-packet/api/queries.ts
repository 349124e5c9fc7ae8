import { queryOptions, useQuery } from "@tanstack/react-query";
import type { InstallPacketDocDto } from "@shared/schemas/install-packet";
import { ApiError, api } from "@/lib/api-client";

export const installPacketKeys = {
  all: ["install-packet"] as const,
  detail: (jobId: number) => [...installPacketKeys.all, jobId] as const,
};

/** The URL of the packet's PDF (served inline; the link downloads it). */
export const installPacketPdfUrl = (jobId: number) => `/api/jobs/${jobId}/install-packet.pdf`;

/** The thumbnail of a photo flagged for the crew. */
export const attachmentThumbUrl = (attachmentId: number) => `/api/attachments/${attachmentId}/thumb`;

export const installPacketQueries = {
  detail: (jobId: number) =>
    queryOptions({
      queryKey: installPacketKeys.detail(jobId),
      queryFn: ({ signal }) => api<{ data: InstallPacketDocDto }>(`/jobs/${jobId}/install-packet`, { signal }).then((r) => r.data),
      // 404 (not the actor's job) and 409 (no roof yet) don't get better by asking again
      retry: (n, err) => !(err instanceof ApiError && (err.status === 404 || err.status === 409)) && n < 2,
    }),
};

/** The job's install packet, built by the server from the saved roof and its takeoff. */
export const useInstallPacket = (jobId: number, enabled = true) => useQuery({ ...installPacketQueries.detail(jobId), enabled });
