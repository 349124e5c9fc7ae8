import { useState } from "react";
import { Link, useNavigate, useSearchParams } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { paths } from "@/config/paths";
import { useForgotPassword, useResetPassword } from "@/features/password-reset/api/mutations";
import { AuthCard } from "@/features/password-reset/components/auth-card";
import { ForgotPasswordForm } from "@/features/password-reset/components/forgot-password-form";
import { ResetPasswordForm } from "@/features/password-reset/components/reset-password-form";

const linkClass = "font-medium text-accent-700 underline-offset-2 hover:underline focus-visible:rounded-sm focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500";

const BackToSignIn = () => (
  <Link to={paths.signIn} className={linkClass}>
    Back to sign in
  </Link>
);

/** `/forgot-password` (public): asks for a one-time reset link by e-mail. */
export function ForgotPasswordRoute() {
  const forgot = useForgotPassword();
  const [sent, setSent] = useState(false);
  return (
    <AuthCard
      title="Forgot your password?"
      intro="Enter the e-mail you sign in with. We'll send a link to set a new password."
      below={<BackToSignIn />}
    >
      <ForgotPasswordForm sent={sent} onSubmit={(v) => forgot.mutateAsync(v).then(() => setSent(true))} />
    </AuthCard>
  );
}

/** `/reset-password?token=…` (public): sets a new password with the link's token, then back to sign in. */
export function ResetPasswordRoute() {
  const [params] = useSearchParams();
  const token = params.get("token") ?? "";
  const reset = useResetPassword();
  const navigate = useNavigate();
  const [badLink, setBadLink] = useState(!/^[A-Za-z0-9_-]{1,200}$/.test(token));

  if (badLink) {
    return (
      <AuthCard title="This reset link doesn't work" below={<BackToSignIn />}>
        <Alert tone="error">The link is not valid: it may have been used already, or it has expired.</Alert>
        <p className="mt-3 text-sm text-steel-700">
          <Link to={paths.forgotPassword} className={linkClass}>
            Ask for a new link
          </Link>{" "}
          and use it within the time the e-mail gives.
        </p>
      </AuthCard>
    );
  }

  return (
    <AuthCard title="Set a new password" intro="Choose a new password for your account." below={<BackToSignIn />}>
      <ResetPasswordForm
        onBadLink={() => setBadLink(true)}
        onSubmit={async (password) => {
          await reset.mutateAsync({ token, password });
          await navigate(paths.signIn, { replace: true, state: { passwordReset: true } });
        }}
      />
    </AuthCard>
  );
}
