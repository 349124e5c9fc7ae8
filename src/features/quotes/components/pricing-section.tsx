import { EmptyState } from "@/components/ui/empty-state";

/** The job workspace's Pricing section. */
export function PricingSection(_props: { jobId: number }) {
  return <EmptyState title="Pricing" description="Quotes and pricing are being built." />;
}
