import { PageHeader } from "@/components/layout/page-header";
import { EmptyState } from "@/components/ui/empty-state";

export function CompanyRoute() {
  return (
    <div className="space-y-4">
      <PageHeader title="Company" />
      <EmptyState title="Company profile" description="The profile printed on proposals is being built." />
    </div>
  );
}
