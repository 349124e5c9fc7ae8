import { EmptyState } from "@/components/ui/empty-state";

/** The job workspace's Proposal section. */
export function ProposalSection(_props: { jobId: number }) {
  return <EmptyState title="Proposal" description="Sending the proposal to the homeowner comes with the proposal release: the PDF, the e-mail, signature and deposit." />;
}
