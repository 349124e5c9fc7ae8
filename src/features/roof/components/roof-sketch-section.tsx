import { EmptyState } from "@/components/ui/empty-state";

/** The job workspace's Roof sketch section. */
export function RoofSketchSection(_props: { jobId: number }) {
  return <EmptyState title="Roof sketch" description="The plan-view editor is being built." />;
}
