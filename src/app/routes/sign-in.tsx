import { Link, redirect, useLocation, useNavigate, useSearchParams, type LoaderFunctionArgs } from "react-router-dom";
import { useEffect } from "react";
import { useQueryClient, type QueryClient } from "@tanstack/react-query";
import { Alert } from "@/components/ui/alert";
import { LogoMark } from "@/components/layout/logo-mark";
import { paths, safeNext } from "@/config/paths";
import { authKeys, fetchMe } from "@/lib/auth";
import { useLogin } from "@/features/auth/api/mutations";
import { SignInForm } from "@/features/auth/components/sign-in-form";

/**
 * Asks the server (not the cache) whether a session exists: a signed-in visitor goes on to `next`;
 * a signed-out one stays on the form.
 */
export const signInLoader =
  (qc: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    let user = null;
    try {
      user = await fetchMe(request.signal);
    } catch {
      // server unreachable: show the form; a sign-in attempt reports the problem
    }
    if (user) {
      qc.setQueryData(authKeys.me, user);
      return redirect(safeNext(new URL(request.url).searchParams.get("next")));
    }
    return null;
  };

export function SignInRoute() {
  const qc = useQueryClient();
  // Forget everything cached from the last session (e.g. right after sign-out). Done once the
  // signed-in screens have unmounted: removing their queries earlier would make them refetch.
  useEffect(() => {
    qc.removeQueries();
  }, [qc]);
  const login = useLogin();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const location = useLocation();
  const state = location.state as { signedOut?: boolean; passwordReset?: boolean } | null;
  const signedOut = state?.signedOut === true;
  const passwordReset = state?.passwordReset === true;
  const next = params.get("next");

  return (
    <div
      className="flex min-h-screen flex-col items-center justify-center bg-steel-100 px-4 py-10"
      style={{
        backgroundImage:
          "repeating-linear-gradient(90deg, transparent 0 55px, rgb(188 194 201 / 0.35) 55px 56px, transparent 56px 58px, rgb(255 255 255 / 0.5) 58px 59px)",
      }}
    >
      <title>Sign in · Ridgewright</title>
      <div className="w-full max-w-[22rem]">
        <div className="mb-5 flex items-center justify-center gap-2.5">
          <LogoMark className="size-9" />
          <span className="text-xl font-semibold tracking-tight text-steel-950">Ridgewright</span>
        </div>
        <div className="rounded-lg border border-steel-200 bg-white px-6 pb-6 pt-5 shadow-panel">
          <h1 className="text-base font-semibold text-steel-950">Sign in</h1>
          <p className="mb-4 mt-0.5 text-sm text-steel-600">Takeoffs, quotes and proposals for your roofing company.</p>
          {signedOut && (
            <Alert tone="success" className="mb-4">
              You're signed out.
            </Alert>
          )}
          {passwordReset && (
            <Alert tone="success" className="mb-4">
              Your new password is set. Sign in with it.
            </Alert>
          )}
          {next && next !== paths.jobs && !signedOut && (
            <Alert tone="info" className="mb-4">
              Sign in to continue.
            </Alert>
          )}
          <SignInForm
            onSubmit={async (values) => {
              await login.mutateAsync(values);
              await navigate(safeNext(next), { replace: true });
            }}
          />
        </div>
        <p className="mt-4 text-center text-xs leading-relaxed text-steel-600">
          <Link
            to={paths.forgotPassword}
            className="font-medium text-accent-700 underline-offset-2 hover:underline focus-visible:rounded-sm focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
          >
            Forgot your password?
          </Link>
        </p>
      </div>
    </div>
  );
}
