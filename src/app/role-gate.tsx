import { Outlet } from "react-router-dom";
import { canOpen, type Screen } from "@/config/paths";
import { ROLE_LABELS } from "@/config/roles";
import { NoAccess } from "@/components/layout/no-access";
import { useMe } from "@/lib/auth";

/** Renders the screen below it only for roles that may open it; others get the no-access panel. */
export function RoleGate({ screen, name }: { screen: Screen; name: string }) {
  const { data: me } = useMe();
  if (!me) return null; // the signed-in layout above redirects
  if (!canOpen(screen, me.role)) {
    return (
      <>
        <title>{`No access · Ridgewright`}</title>
        <NoAccess screenName={name} roleLabel={ROLE_LABELS[me.role]} />
      </>
    );
  }
  return <Outlet />;
}
