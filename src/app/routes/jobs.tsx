import { canSeePricing } from "@shared/auth/roles";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/layout/page-header";
import { useMe } from "@/features/auth/api/queries";

/** The jobs board. The board itself (table, filters, new job) arrives with the jobs work; this is its empty frame. */
export function JobsRoute() {
  const { data: me } = useMe();
  const crew = me?.role === "crew";

  return (
    <>
      <title>Jobs · Ridgewright</title>
      <PageHeader
        title="Jobs"
        description={crew ? "The jobs you're assigned to." : "Every lead, quote and install for your company."}
      />
      <EmptyState
        icon={
          <svg viewBox="0 0 48 48" className="size-12" fill="none" stroke="currentColor" strokeWidth="1.5">
            <path d="M6 25 24 10l18 15" strokeLinecap="round" strokeLinejoin="round" />
            <path d="M13 20v19M19 15v24M24 11v28M29 15v24M35 20v19" strokeLinecap="round" />
            <path d="M9 39h30" strokeLinecap="round" />
          </svg>
        }
        title="The jobs board is on its way"
        description={
          crew ? (
            <p>Your assigned jobs, with their install packets and photos, will be listed here.</p>
          ) : (
            <p>
              This is where each job will be listed with its status, customer, site, roof size in squares
              {me && canSeePricing(me.role) ? ", quote total" : ""} and last change, with filters. It arrives in an
              upcoming release; nothing needs setting up in the meantime.
            </p>
          )
        }
      />
    </>
  );
}
