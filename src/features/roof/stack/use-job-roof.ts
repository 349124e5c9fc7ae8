/**
 * The roof draft for a section that edits it (Layer stack, Gap study): loads the server's roof into the
 * shared draft store once it arrives (resuming a draft kept in this browser) and returns both.
 */
import { useEffect, useState } from "react";
import { useRoof } from "@/lib/queries/roof";
import { roofDraftStore, useRoofDraft, type RoofDraft } from "../api/roof-draft";

export function useJobRoof(jobId: number) {
  const roof = useRoof(jobId);
  const draft = useRoofDraft(jobId);
  const [stale, setStale] = useState<ReturnType<typeof roofDraftStore.load>["stale"]>(null);
  useEffect(() => {
    if (!roof.data) return;
    const out = roofDraftStore.load({ ...roof.data, jobId });
    if (out.stale) setStale(out.stale);
  }, [roof.data, jobId]);
  return { roof, draft: draft as RoofDraft | undefined, stale, clearStale: () => setStale(null) };
}
