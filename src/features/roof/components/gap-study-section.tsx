import { EmptyState } from "@/components/ui/empty-state";

/** The job workspace's Gap study section. */
export function GapStudySection(_props: { jobId: number }) {
  return <EmptyState title="Gap study" description="The spacer comparison is being built." />;
}
