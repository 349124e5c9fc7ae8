import { useState } from "react";
import type { Role } from "@shared/auth/roles";
import type { TeamMemberDto } from "@shared/schemas/auth";
import { ApiError, errorMessage } from "@/lib/api-client";
import { ROLE_LABELS } from "@/config/roles";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadFailed } from "@/components/ui/load-failed";
import { LoadingRow } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { PageHeader } from "@/components/layout/page-header";
import { useTeamMembers } from "@/lib/queries/users";
import { useCreateUser, useSetUserPassword, useUpdateUser } from "@/features/users/api/mutations";
import { AddUserForm } from "@/features/users/components/add-user-form";
import { SetPasswordForm } from "@/features/users/components/set-password-form";
import { TeamTable } from "@/features/users/components/team-table";

export const LAST_OWNER_MESSAGE =
  "Your company must keep at least one active owner. Make another team member an owner first, then change or deactivate this one.";

/** Why a change to a member was refused, in plain words. */
export function updateRefusal(err: unknown): string {
  if (err instanceof ApiError && err.code === "last_owner") return LAST_OWNER_MESSAGE;
  return errorMessage(err);
}

/** The owner's Team screen body: the member table, adding members, roles, passwords, deactivation. */
export function TeamManager({ currentUserId }: { currentUserId: number }) {
  const team = useTeamMembers();
  const createUser = useCreateUser();
  const updateUser = useUpdateUser();
  const setPassword = useSetUserPassword();

  const [adding, setAdding] = useState(false);
  const [passwordFor, setPasswordFor] = useState<TeamMemberDto | null>(null);
  const [deactivating, setDeactivating] = useState<TeamMemberDto | null>(null);
  const [refusal, setRefusal] = useState<string | null>(null);

  const pendingId = updateUser.isPending ? updateUser.variables?.id : null;

  const update = (member: TeamMemberDto, changes: { role?: Role; active?: boolean }, done: string) => {
    setRefusal(null);
    return updateUser.mutateAsync({ id: member.id, changes }).then(
      () => {
        toast.success(done);
      },
      (err: unknown) => {
        setRefusal(updateRefusal(err));
      },
    );
  };

  const activeCount = team.data?.filter((m) => m.active).length ?? 0;

  return (
    <>
      <PageHeader
        title="Team"
        description={
          team.data
            ? `${activeCount} active ${activeCount === 1 ? "member" : "members"}. Owners manage roles, passwords and access.`
            : "Owners manage roles, passwords and access."
        }
        actions={<Button onClick={() => setAdding(true)}>Add team member</Button>}
      />

      {refusal && (
        <Alert tone="error" title="Change not saved" className="mb-3" onDismiss={() => setRefusal(null)}>
          {refusal}
        </Alert>
      )}

      {team.isPending ? (
        <LoadingRow label="Loading team" text="Loading team…" />
      ) : team.isError ? (
        <LoadFailed title="The team list could not be loaded" error={team.error} onRetry={() => team.refetch()} />
      ) : team.data.length === 0 ? (
        <EmptyState title="No team members yet" description="Add the estimators and crew leads who use Ridgewright." />
      ) : (
        <TeamTable
          members={team.data}
          currentUserId={currentUserId}
          pendingId={pendingId}
          onChangeRole={(m, role) => update(m, { role }, `${m.name} is now ${ROLE_LABELS[role].toLowerCase()}.`)}
          onDeactivate={(m) => {
            setRefusal(null);
            setDeactivating(m);
          }}
          onReactivate={(m) => update(m, { active: true }, `${m.name} can sign in again.`)}
          onSetPassword={(m) => setPasswordFor(m)}
        />
      )}

      <Dialog
        open={adding}
        onClose={() => setAdding(false)}
        busy={createUser.isPending}
        title="Add team member"
        description="They can sign in as soon as you add them."
      >
        <AddUserForm
          onCancel={() => setAdding(false)}
          onSubmit={async (values) => {
            const member = await createUser.mutateAsync(values);
            setAdding(false);
            toast.success(`${member.name} was added as ${ROLE_LABELS[member.role].toLowerCase()}.`);
          }}
        />
      </Dialog>

      <Dialog
        open={passwordFor !== null}
        onClose={() => setPasswordFor(null)}
        busy={setPassword.isPending}
        title={`New password for ${passwordFor?.name ?? ""}`}
        description="Their current password stops working at once. Tell them the new one in person."
      >
        {passwordFor && (
          <SetPasswordForm
            onCancel={() => setPasswordFor(null)}
            onSubmit={async (input) => {
              await setPassword.mutateAsync({ id: passwordFor.id, input });
              toast.success(`New password set for ${passwordFor.name}.`);
              setPasswordFor(null);
            }}
          />
        )}
      </Dialog>

      <Dialog
        open={deactivating !== null}
        onClose={() => setDeactivating(null)}
        busy={updateUser.isPending}
        title={`Deactivate ${deactivating?.name ?? ""}?`}
        description="They are signed out everywhere at once and can't sign in until you reactivate them. Their work stays in place."
        footer={
          <>
            <Button variant="secondary" onClick={() => setDeactivating(null)} disabled={updateUser.isPending}>
              Cancel
            </Button>
            <Button
              variant="danger"
              loading={updateUser.isPending}
              onClick={() => {
                const m = deactivating;
                if (!m) return;
                void update(m, { active: false }, `${m.name} was deactivated.`).finally(() => setDeactivating(null));
              }}
            >
              Deactivate
            </Button>
          </>
        }
      />
    </>
  );
}
