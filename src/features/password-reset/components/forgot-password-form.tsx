import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { forgotPasswordInputSchema, type ForgotPasswordInput } from "@shared/schemas/auth";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";

/** The one answer, whether or not the address has an account (the page reveals nothing). */
export const FORGOT_SENT_MESSAGE = "If an account exists for that e-mail, we've sent a link to set a new password. It works once and expires soon.";

type Props = { onSubmit: (values: ForgotPasswordInput) => Promise<unknown>; sent: boolean };

export function ForgotPasswordForm({ onSubmit, sent }: Props) {
  const {
    register,
    handleSubmit,
    setError,
    getValues,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof forgotPasswordInputSchema>, unknown, ForgotPasswordInput>({
    resolver: zodResolver(forgotPasswordInputSchema),
    defaultValues: { email: "" },
  });

  const submit = handleSubmit(async (values) => {
    try {
      await onSubmit(values);
    } catch (err) {
      const field = err instanceof ApiError ? err.fields?.email : undefined;
      if (field) setError("email", { message: field }, { shouldFocus: true });
      else setError("root.server", { message: errorMessage(err) });
    }
  });

  if (sent) {
    return (
      <div className="space-y-3">
        <Alert tone="success">{FORGOT_SENT_MESSAGE}</Alert>
        <p className="text-sm text-steel-600">
          Check the inbox of <span className="font-medium text-steel-900">{getValues("email")}</span>, including the spam folder.
        </p>
      </div>
    );
  }

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Ask for a reset link">
      {errors.root?.server?.message && <Alert tone="error">{errors.root.server.message}</Alert>}
      <Field label="E-mail" error={errors.email?.message}>
        <Input type="email" autoComplete="username" autoFocus spellCheck={false} {...register("email")} />
      </Field>
      <Button type="submit" size="lg" className="w-full" loading={isSubmitting}>
        {isSubmitting ? "Sending…" : "Send me a reset link"}
      </Button>
    </form>
  );
}
