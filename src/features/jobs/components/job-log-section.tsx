import { EmptyState } from "@/components/ui/empty-state";

/** The job workspace's Log section. */
export function JobLogSection(_props: { jobId: number }) {
  return <EmptyState title="Log" description="The change log is being built." />;
}
