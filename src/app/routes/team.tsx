import type { LoaderFunctionArgs } from "react-router-dom";
import type { QueryClient } from "@tanstack/react-query";
import { canOpen } from "@/config/paths";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { authQueries, useMe } from "@/lib/auth";
import { userQueries } from "@/lib/queries/users";
import { TeamManager } from "@/features/users/components/team-manager";

/** Starts loading the team list while the screen's code loads (owners only; the list is owner-only). */
export const teamLoader =
  (qc: QueryClient) =>
  async (_args: LoaderFunctionArgs) => {
    const me = await qc.ensureQueryData(authQueries.me());
    if (me && canOpen("team", me.role)) void qc.prefetchQuery(userQueries.list());
    return null;
  };

export function TeamRoute() {
  const { data: me } = useMe();
  if (!me) return null;
  return (
    <>
      <title>Team · Ridgewright</title>
      <ErrorBoundary what="The team screen">
        <TeamManager currentUserId={me.id} />
      </ErrorBoundary>
    </>
  );
}
