import { ROLE_DESCRIPTIONS, ROLE_LABELS } from "@/config/roles";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { PageHeader } from "@/components/layout/page-header";
import { useMe } from "@/lib/auth";
import { useChangePassword } from "@/features/auth/api/mutations";
import { ChangePasswordForm } from "@/features/auth/components/change-password-form";

export function AccountRoute() {
  const { data: me } = useMe();
  const changePassword = useChangePassword();
  if (!me) return null;

  return (
    <>
      <title>Account · Ridgewright</title>
      <PageHeader title="Account" description="Your sign-in details." />
      <div className="grid max-w-4xl gap-4 md:grid-cols-[minmax(0,1fr)_minmax(0,1.2fr)]">
        <section aria-labelledby="profile-heading" className="rounded-lg border border-steel-200 bg-white p-5 shadow-panel">
          <h2 id="profile-heading" className="text-sm font-semibold text-steel-900">
            Profile
          </h2>
          <dl className="mt-3 space-y-3 text-sm">
            <div>
              <dt className="text-xs text-steel-500">Name</dt>
              <dd className="font-medium text-steel-900">{me.name}</dd>
            </div>
            <div>
              <dt className="text-xs text-steel-500">E-mail</dt>
              <dd className="text-steel-900">{me.email}</dd>
            </div>
            <div>
              <dt className="text-xs text-steel-500">Role</dt>
              <dd className="text-steel-900">
                {ROLE_LABELS[me.role]} <span className="text-steel-500">· {ROLE_DESCRIPTIONS[me.role]}</span>
              </dd>
            </div>
          </dl>
          <p className="mt-4 border-t border-steel-100 pt-3 text-xs text-steel-500">
            To change your name, e-mail or role, ask your company's owner.
          </p>
        </section>
        <section aria-labelledby="password-heading" className="rounded-lg border border-steel-200 bg-white p-5 shadow-panel">
          <h2 id="password-heading" className="mb-3 text-sm font-semibold text-steel-900">
            Change password
          </h2>
          <ErrorBoundary what="The password form">
            <ChangePasswordForm onSubmit={changePassword.mutateAsync} />
          </ErrorBoundary>
        </section>
      </div>
    </>
  );
}
