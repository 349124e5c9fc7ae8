import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { RoofCsvError } from "@shared/roof-csv";
import type { RoofDto } from "@shared/schemas/roof";
import { api } from "@/lib/api-client";
import { uploadFiles } from "@/lib/upload";
import { jobKeys } from "@/lib/queries/jobs";
import { roofKeys, type StoredTakeoff } from "@/lib/queries/roof";
import { roofDraftStore, type RoofDoc } from "./roof-draft";

export interface SavedRoof extends RoofDto {
  takeoff: StoredTakeoff;
}

/**
 * Saves the job's draft with the version it was started from. On 409 (someone else saved first)
 * the draft stays as it is; the screen offers to reload or to keep editing.
 */
export function useSaveRoof(jobId: number) {
  const qc = useQueryClient();
  return useMutation({
    meta: { handlesError: true },
    mutationFn: async () => {
      const d = roofDraftStore.get(jobId);
      if (!d) throw new Error("The roof has not loaded yet");
      const doc: RoofDoc = d.doc;
      const saved = await api<{ data: SavedRoof }>(`/jobs/${jobId}/roof`, {
        method: "PUT",
        json: { ...doc, version: d.baseVersion },
      }).then((r) => r.data);
      return { saved, doc };
    },
    onSuccess: ({ saved, doc }) => {
      roofDraftStore.markSaved(jobId, saved.version, doc);
      const { takeoff, ...roof } = saved;
      qc.setQueryData(roofKeys.detail(jobId), roof);
      qc.setQueryData(roofKeys.takeoff(jobId), takeoff);
      // The board and the job show squares from the saved takeoff.
      return qc.invalidateQueries({ queryKey: jobKeys.all });
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
