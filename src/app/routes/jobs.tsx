import { ErrorBoundary } from "@/components/ui/error-boundary";
import { useMe } from "@/features/auth/api/queries";
import { JobsBoard } from "@/features/jobs/components/jobs-board";

/** `/jobs`: the jobs board. Its filters, sort and page are in the URL's search params. */
export function JobsRoute() {
  const { data: me } = useMe();
  if (!me) return null; // the signed-in layout redirects
  return (
    <>
      <title>Jobs · Ridgewright</title>
      <ErrorBoundary what="The jobs board">
        <JobsBoard me={me} />
      </ErrorBoundary>
    </>
  );
}
