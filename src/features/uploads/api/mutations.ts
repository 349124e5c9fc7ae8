import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { AttachmentDto, AttachmentUpdate } from "@shared/schemas/attachment";
import type { RoofCsvError } from "@shared/roof-csv";
import type { RoofDto } from "@shared/schemas/roof";
import { api } from "@/lib/api-client";
import { uploadFiles } from "@/lib/upload";
import { roofKeys } from "@/features/roof/api/queries";
import { roofDraftStore } from "@/features/roof/api/roof-draft";
import { attachmentKeys } from "./queries";

/** Uploads one file (its own request, so each has its own progress). */
export function uploadAttachment(jobId: number, file: File, opts: { caption?: string; kind?: "plan"; onProgress?: (f: number) => void; signal?: AbortSignal }) {
  const form = new FormData();
  if (opts.caption) form.append("caption", opts.caption);
  if (opts.kind) form.append("kind", opts.kind);
  form.append("file", file, file.name);
  return uploadFiles<{ data: AttachmentDto[] }>(`/jobs/${jobId}/attachments`, form, opts).then((r) => r.data);
}

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

export interface PlaneImportCommit {
  data: { planes: RoofDto["planes"]; rows: number[]; errors: RoofCsvError[]; committed: true; roof: RoofDto };
}

/** Sends the CSV with the roof version it was previewed against; the server saves it as a new version. */
export function useCommitPlaneImport(jobId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ file, version }: { file: File; version: number }) => {
      const form = new FormData();
      form.append("version", String(version));
      form.append("file", file, file.name);
      return uploadFiles<PlaneImportCommit>(`/jobs/${jobId}/roof/import?commit=1`, form).then((r) => r.data);
    },
    onSuccess: ({ roof }) => {
      qc.setQueryData(roofKeys.detail(jobId), roof);
      const draft = roofDraftStore.get(jobId);
      if (draft && !draft.dirty) roofDraftStore.replaceWithServer({ ...roof, jobId });
      return qc.invalidateQueries({ queryKey: roofKeys.takeoff(jobId) });
    },
    meta: { handlesError: true },
  });
}
