import { EmptyState } from "@/components/ui/empty-state";

/** The job workspace's Takeoff section. */
export function TakeoffSection(_props: { jobId: number }) {
  return <EmptyState title="Takeoff" description="The takeoff tables are being built." />;
}
