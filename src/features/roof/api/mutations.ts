import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { RoofDto } from "@shared/schemas/roof";
import { api } from "@/lib/api-client";
import { roofKeys, type StoredTakeoff } from "./queries";
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
      return qc.invalidateQueries({ queryKey: ["jobs"] });
    },
  });
}
