import { EmptyState } from "@/components/ui/empty-state";

/** The job workspace's Layer stack section. */
export function LayerStackSection(_props: { jobId: number }) {
  return <EmptyState title="Layer stack" description="The assembly builder is being built." />;
}
