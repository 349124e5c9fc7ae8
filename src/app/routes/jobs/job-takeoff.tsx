import { useRoofDraft } from "@/features/roof/api/roof-draft";
import { TakeoffSection } from "@/features/takeoff/components/takeoff-section";

/**
 * The job workspace's Takeoff section: the saved takeoff, with a note when the roof draft kept in this
 * browser has changes the takeoff does not include yet.
 */
export function JobTakeoffSection({ jobId }: { jobId: number }) {
  const draft = useRoofDraft(jobId);
  return <TakeoffSection jobId={jobId} unsavedRoof={Boolean(draft?.dirty)} />;
}
