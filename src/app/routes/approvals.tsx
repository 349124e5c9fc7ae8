import { useParams } from "react-router-dom";
import { PageHeader } from "@/components/layout/page-header";
import { NotFoundRoute } from "@/app/routes/not-found";
import { ApprovalsQueue } from "@/features/quotes/components/approvals-queue";
import { ApprovalReview } from "@/features/quotes/components/approval-review";

/** The owner's review queue. */
export function ApprovalsRoute() {
  return (
    <>
      <title>Approvals · Ridgewright</title>
      <PageHeader
        title="Approvals"
        description="Quotes your estimators have submitted, oldest first. Open one to see its costs, margin and overrides."
      />
      <ApprovalsQueue />
    </>
  );
}

/** `/approvals/:quoteId`: one quote's review. */
export function ApprovalReviewRoute() {
  const id = Number(useParams().quoteId);
  if (!Number.isInteger(id) || id <= 0) return <NotFoundRoute />;
  return <ApprovalReview quoteId={id} />;
}
