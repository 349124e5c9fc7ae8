import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { AttachmentDto, AttachmentUpdate } from "@shared/schemas/attachment";
import { api } from "@/lib/api-client";
import { attachmentKeys } from "@/lib/queries/attachments";

export function useUpdateAttachment(jobId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: AttachmentUpdate & { id: number }) =>
      api<{ data: AttachmentDto }>(`/attachments/${id}`, { method: "PATCH", json: input }).then((r) => r.data),
    onSuccess: (a) => {
      qc.setQueryData<AttachmentDto[]>(attachmentKeys.list(jobId), (list) => list?.map((x) => (x.id === a.id ? a : x)));
    },
  });
}

export function useDeleteAttachment(jobId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api<void>(`/attachments/${id}`, { method: "DELETE" }).then(() => id),
    onSuccess: (id) => {
      qc.setQueryData<AttachmentDto[]>(attachmentKeys.list(jobId), (list) => list?.filter((x) => x.id !== id));
    },
  });
}
