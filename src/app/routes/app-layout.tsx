import { Navigate, Outlet, redirect, useLocation, useNavigate, useNavigation, type LoaderFunctionArgs } from "react-router-dom";
import type { QueryClient } from "@tanstack/react-query";
import { AppShell } from "@/components/layout/app-shell";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { FullPageSpinner } from "@/components/ui/spinner";
import { paths, signInPath } from "@/config/paths";
import { authQueries, useMe } from "@/lib/auth";
import { useLogout } from "@/features/auth/api/mutations";

/** Runs before any signed-in screen: no session → the sign-in page, with `next` back here. */
export const protectedLoader =
  (qc: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    const me = await qc.ensureQueryData(authQueries.me());
    if (!me) {
      const url = new URL(request.url);
      return redirect(signInPath(url.pathname + url.search));
    }
    return null;
  };

/** The signed-in frame. When the session ends (a 401 anywhere sets the user to null) it sends the user to sign in. */
export function AppLayout() {
  const { data: me } = useMe();
  const logout = useLogout();
  const navigate = useNavigate();
  const navigation = useNavigation();
  const location = useLocation();

  if (me === null) return <Navigate to={signInPath(location.pathname + location.search)} replace />;
  if (!me) return <FullPageSpinner />;

  const signOut = () =>
    logout.mutate(undefined, {
      onSuccess: () => navigate(paths.signIn, { replace: true, state: { signedOut: true } }),
    });

  return (
    <AppShell user={me} onSignOut={signOut} signingOut={logout.isPending} busy={navigation.state === "loading"}>
      <ErrorBoundary key={location.pathname} what="This screen">
        <Outlet />
      </ErrorBoundary>
    </AppShell>
  );
}
