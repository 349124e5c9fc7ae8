import { useMutation } from "@tanstack/react-query";
import type { ForgotPasswordInput, ResetPasswordInput } from "@shared/schemas/auth";
import { api } from "@/lib/api-client";

/** `POST /api/auth/forgot` (202 whether or not the e-mail has an account; the CSRF token is fetched first). */
export function useForgotPassword() {
  return useMutation({
    mutationFn: (input: ForgotPasswordInput) => api<{ message?: string }>("/auth/forgot", { method: "POST", json: input }),
    meta: { handlesError: true },
  });
}

/** `POST /api/auth/reset` (204; 400 `invalid_reset_token` for a used, expired or unknown link). */
export function useResetPassword() {
  return useMutation({
    mutationFn: (input: ResetPasswordInput) => api<void>("/auth/reset", { method: "POST", json: input }),
    meta: { handlesError: true },
  });
}
