import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/layout/page-header";

/** The owner's review queue (placeholder until quotes exist). */
export function ApprovalsRoute() {
  return (
    <>
      <title>Approvals · Ridgewright</title>
      <PageHeader title="Approvals" description="Quotes your estimators send for review before they go to a homeowner." />
      <EmptyState
        icon={
          <svg viewBox="0 0 48 48" className="size-12" fill="none" stroke="currentColor" strokeWidth="1.5">
            <rect x="10" y="7" width="28" height="34" rx="3" />
            <path d="M17 16h14M17 22h14M17 28h8" strokeLinecap="round" />
            <path d="m26 33 3 3 6-7" strokeLinecap="round" strokeLinejoin="round" />
          </svg>
        }
        title="Nothing waiting for review"
        description="When an estimator sends a quote for approval, you'll see its cost, margin and any manual overrides here, and approve it or return it. The review queue arrives in an upcoming release."
      />
    </>
  );
}
