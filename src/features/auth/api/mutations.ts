import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { ChangePasswordInput, LoginInput, UserDto } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";
import { authKeys } from "@/lib/auth";

export const login = (input: LoginInput) =>
  api<{ user: UserDto }>("/auth/login", { method: "POST", json: input }).then((r) => r.user);

/** Signs in; on success the cache holds only the new user (nothing left from a previous session). */
export function useLogin() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: login,
    meta: { handlesError: true }, // the sign-in form shows field errors, 401 and 429 itself
    onSuccess: (user) => {
      qc.removeQueries();
      qc.setQueryData(authKeys.me, user);
    },
  });
}

/**
 * Signs out. The caller then navigates to the sign-in page, whose loader confirms with the server
 * that the session is gone and only then drops every cached query (the user included).
 * Dropping them here instead would make the still-mounted screen refetch, get a 401, and send
 * the user to sign in with a `next` back to the page they just left.
 */
export function useLogout() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api<void>("/auth/logout", { method: "POST" }),
    onSuccess: () => qc.cancelQueries(),
  });
}

/** Changes the signed-in user's own password (`POST /api/auth/password`, 204). */
export function useChangePassword() {
  return useMutation({
    mutationFn: ({ currentPassword, newPassword }: ChangePasswordInput) =>
      api<void>("/auth/password", { method: "POST", json: { currentPassword, newPassword } }),
    meta: { handlesError: true },
  });
}
