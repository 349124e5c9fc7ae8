import { EmptyState } from "@/components/ui/empty-state";

/** The job workspace's Files section. */
export function FilesSection(_props: { jobId: number }) {
  return <EmptyState title="Files" description="Photos, plan sets and imports come with the files release." />;
}
