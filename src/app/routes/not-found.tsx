import { Link } from "react-router-dom";
import { EmptyState } from "@/components/ui/empty-state";
import { paths } from "@/config/paths";

export function NotFoundRoute() {
  return (
    <>
      <title>Page not found · Ridgewright</title>
      <EmptyState
        className="mt-6"
        title="Page not found"
        description="There's nothing at this address. It may have moved, or the link may be mistyped."
        action={
          <Link
            to={paths.jobs}
            className="text-sm font-medium text-accent-700 underline-offset-2 hover:underline focus-visible:rounded focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
          >
            Go to Jobs
          </Link>
        }
      />
    </>
  );
}
