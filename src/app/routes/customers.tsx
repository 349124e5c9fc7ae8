import { PageHeader } from "@/components/layout/page-header";
import { EmptyState } from "@/components/ui/empty-state";

export function CustomersRoute() {
  return (
    <div className="space-y-4">
      <PageHeader title="Customers" />
      <EmptyState title="Customers" description="The customer list is being built." />
    </div>
  );
}
