import { ErrorBoundary } from "@/components/ui/error-boundary";
import { useMe } from "@/lib/auth";
import { CustomerFields } from "@/features/customers/components/customer-fields";
import { CustomerPicker } from "@/features/customers/components/customer-picker";
import { JobsBoard } from "@/features/jobs/components/jobs-board";
import type { CustomerInputs } from "@/features/jobs/components/new-job-form";

/** The new-job form's customer inputs come from the customers feature; the screen brings the two together. */
const CUSTOMER_INPUTS: CustomerInputs = { Picker: CustomerPicker, Fields: CustomerFields };

/** `/jobs`: the jobs board. Its filters, sort and page are in the URL's search params. */
export function JobsRoute() {
  const { data: me } = useMe();
  if (!me) return null; // the signed-in layout redirects
  return (
    <>
      <title>Jobs · Ridgewright</title>
      <ErrorBoundary what="The jobs board">
        <JobsBoard me={me} customerInputs={CUSTOMER_INPUTS} />
      </ErrorBoundary>
    </>
  );
}
