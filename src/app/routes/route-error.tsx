import { isRouteErrorResponse, Link, useRouteError } from "react-router-dom";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { paths } from "@/config/paths";
import { errorMessage } from "@/lib/api-client";

/** What a route shows when its loader or its screen fails. */
export function RouteError() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) {
    return <EmptyState className="m-6" title="Page not found" description="There is nothing at this address." />;
  }
  // a lazy screen's file is gone (a new version was deployed while this tab was open)
  const staleBuild = error instanceof TypeError && /dynamically imported module|Importing a module script/i.test(error.message);
  if (!staleBuild) console.error(error);

  return (
    <div className="p-6">
      <EmptyState
        title={staleBuild ? "Ridgewright was updated" : "Something went wrong"}
        description={
          staleBuild
            ? "Reload the page to get the new version."
            : `${errorMessage(error)} Reload the page; if it keeps happening, tell your company's owner.`
        }
        action={
          <div className="flex items-center gap-3">
            <Button onClick={() => window.location.reload()}>Reload</Button>
            <Link to={paths.jobs} className="text-sm font-medium text-accent-700 hover:underline">
              Go to Jobs
            </Link>
          </div>
        }
      />
    </div>
  );
}
