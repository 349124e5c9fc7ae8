import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { changePasswordInputSchema, type ChangePasswordInput } from "@shared/schemas/auth";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";

/** The shared contract plus a repeat of the new password, which only the form needs. */
const changePasswordFormSchema = changePasswordInputSchema
  .safeExtend({ confirmPassword: z.string() })
  .refine((v) => v.confirmPassword === v.newPassword, {
    path: ["confirmPassword"],
    message: "The two new passwords don't match",
  });
type FormInput = z.input<typeof changePasswordFormSchema>;
type FormOutput = z.output<typeof changePasswordFormSchema>;

const FORM_FIELDS = ["currentPassword", "newPassword"] as const;

type Props = { onSubmit: (values: ChangePasswordInput) => Promise<unknown> };

export function ChangePasswordForm({ onSubmit }: Props) {
  const [done, setDone] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<FormInput, unknown, FormOutput>({
    resolver: zodResolver(changePasswordFormSchema),
    defaultValues: { currentPassword: "", newPassword: "", confirmPassword: "" },
  });

  const submit = handleSubmit(async ({ currentPassword, newPassword }) => {
    setDone(false);
    try {
      await onSubmit({ currentPassword, newPassword });
      reset();
      setDone(true);
    } catch (err) {
      const known = Object.entries(err instanceof ApiError ? (err.fields ?? {}) : {}).filter(([name]) =>
        (FORM_FIELDS as readonly string[]).includes(name),
      );
      for (const [name, message] of known) setError(name as (typeof FORM_FIELDS)[number], { message });
      if (known.length === 0) setError("root.server", { message: errorMessage(err) });
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {done && <Alert tone="success">Your password was changed. Use the new one next time you sign in.</Alert>}
      {errors.root?.server?.message && <Alert tone="error">{errors.root.server.message}</Alert>}
      <Field label="Current password" error={errors.currentPassword?.message}>
        <Input type="password" autoComplete="current-password" {...register("currentPassword")} />
      </Field>
      <Field label="New password" error={errors.newPassword?.message} hint="At least 10 characters. A short sentence works well.">
        <Input type="password" autoComplete="new-password" {...register("newPassword")} />
      </Field>
      <Field label="Repeat new password" error={errors.confirmPassword?.message}>
        <Input type="password" autoComplete="new-password" {...register("confirmPassword")} />
      </Field>
      <Button type="submit" loading={isSubmitting}>
        Change password
      </Button>
    </form>
  );
}
