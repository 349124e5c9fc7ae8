import { useMutation, useQueryClient } from "@tanstack/react-query";
import type {
  CreateUserInput,
  SetPasswordInput,
  TeamMemberDto,
  UpdateUserInput,
} from "@shared/schemas/auth";
import { api } from "@/lib/api-client";
import { userKeys } from "@/lib/queries/users";

function replaceMember(list: TeamMemberDto[] | undefined, member: TeamMemberDto) {
  if (!list) return list;
  const found = list.some((m) => m.id === member.id);
  return found ? list.map((m) => (m.id === member.id ? member : m)) : [...list, member];
}

export function useCreateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateUserInput) =>
      api<{ data: TeamMemberDto }>("/users", { method: "POST", json: input }).then((r) => r.data),
    meta: { handlesError: true }, // the add-member form shows the error on its fields
    onSuccess: (member) => {
      qc.setQueryData(userKeys.list(), (list: TeamMemberDto[] | undefined) => replaceMember(list, member));
      return qc.invalidateQueries({ queryKey: userKeys.list() });
    },
  });
}

export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: UpdateUserInput }) =>
      api<{ data: TeamMemberDto }>(`/users/${id}`, { method: "PATCH", json: changes }).then((r) => r.data),
    meta: { handlesError: true }, // the team screen shows the refusal (e.g. the last owner) in a banner
    onSuccess: (member) => {
      qc.setQueryData(userKeys.list(), (list: TeamMemberDto[] | undefined) => replaceMember(list, member));
    },
  });
}

export function useSetUserPassword() {
  return useMutation({
    mutationFn: ({ id, input }: { id: number; input: SetPasswordInput }) =>
      api<void>(`/users/${id}/password`, { method: "PUT", json: input }),
    meta: { handlesError: true },
  });
}
