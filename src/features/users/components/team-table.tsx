import type { Role } from "@shared/auth/roles";
import { ROLES } from "@shared/auth/roles";
import type { TeamMemberDto } from "@shared/schemas/auth";
import { ROLE_LABELS } from "@/config/roles";
import { cn } from "@/lib/cn";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/select";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: "medium", timeStyle: "short" });

export function formatLastSignIn(iso: string | null): string {
  if (!iso) return "Never";
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? "Unknown" : dateTime.format(d);
}

type Props = {
  members: TeamMemberDto[];
  currentUserId: number;
  /** The member whose change is being saved: their controls are disabled meanwhile. */
  pendingId?: number | null;
  onChangeRole: (member: TeamMemberDto, role: Role) => void;
  onDeactivate: (member: TeamMemberDto) => void;
  onReactivate: (member: TeamMemberDto) => void;
  onSetPassword: (member: TeamMemberDto) => void;
};

export function TeamTable({
  members,
  currentUserId,
  pendingId,
  onChangeRole,
  onDeactivate,
  onReactivate,
  onSetPassword,
}: Props) {
  const sorted = [...members].sort(
    (a, b) => Number(b.active) - Number(a.active) || a.name.localeCompare(b.name),
  );

  return (
    <Table aria-label="Team members">
      <THead>
        <tr>
          <Th>Name</Th>
          <Th>E-mail</Th>
          <Th className="w-40">Role</Th>
          <Th>Status</Th>
          <Th>Last sign-in</Th>
          <Th className="text-right">
            <span className="sr-only">Actions</span>
          </Th>
        </tr>
      </THead>
      <TBody>
        {sorted.map((m) => {
          const isSelf = m.id === currentUserId;
          const busy = pendingId === m.id;
          return (
            <Tr key={m.id} className={cn(!m.active && "bg-steel-50/70 text-steel-500")}>
              <Td className="font-medium text-steel-900">
                <span className={cn(!m.active && "text-steel-500")}>{m.name}</span>
                {isSelf && (
                  <Badge tone="muted" className="ml-2">
                    You
                  </Badge>
                )}
              </Td>
              <Td className="text-steel-700">{m.email}</Td>
              <Td>
                <Select
                  aria-label={`Role for ${m.name}`}
                  value={m.role}
                  disabled={isSelf || busy || !m.active}
                  title={isSelf ? "Another owner can change your role" : undefined}
                  onChange={(e) => onChangeRole(m, e.target.value as Role)}
                  className="w-36"
                >
                  {ROLES.map((r) => (
                    <option key={r} value={r}>
                      {ROLE_LABELS[r]}
                    </option>
                  ))}
                </Select>
              </Td>
              <Td>{m.active ? <Badge tone="ok">Active</Badge> : <Badge tone="muted">Deactivated</Badge>}</Td>
              <Td className="whitespace-nowrap tabular-nums text-steel-600">{formatLastSignIn(m.lastLoginAt)}</Td>
              <Td className="whitespace-nowrap text-right">
                <div className="flex justify-end gap-1.5">
                  <Button
                    variant="ghost"
                    size="sm"
                    disabled={busy || !m.active}
                    onClick={() => onSetPassword(m)}
                    aria-label={`Set a new password for ${m.name}`}
                  >
                    Set password
                  </Button>
                  {m.active ? (
                    <Button
                      variant="ghost"
                      size="sm"
                      className="text-danger-700 hover:bg-danger-50"
                      disabled={busy || isSelf}
                      onClick={() => onDeactivate(m)}
                      aria-label={`Deactivate ${m.name}`}
                    >
                      Deactivate
                    </Button>
                  ) : (
                    <Button
                      variant="secondary"
                      size="sm"
                      loading={busy}
                      onClick={() => onReactivate(m)}
                      aria-label={`Reactivate ${m.name}`}
                    >
                      Reactivate
                    </Button>
                  )}
                </div>
              </Td>
            </Tr>
          );
        })}
      </TBody>
    </Table>
  );
}
