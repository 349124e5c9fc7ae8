import { EmptyState } from "@/components/ui/empty-state";

/** The job workspace's Site section. */
export function SiteSection(_props: { jobId: number }) {
  return <EmptyState title="Site" description="Site details are being built." />;
}
