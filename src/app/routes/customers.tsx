import { ErrorBoundary } from "@/components/ui/error-boundary";
import { CustomersManager } from "@/features/customers/components/customers-manager";

/** `/customers` (owners and estimators): the homeowners, with search, editing, archive and restore. */
export function CustomersRoute() {
  return (
    <>
      <title>Customers · Ridgewright</title>
      <ErrorBoundary what="The customers screen">
        <CustomersManager />
      </ErrorBoundary>
    </>
  );
}
