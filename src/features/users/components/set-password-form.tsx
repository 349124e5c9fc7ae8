import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { setPasswordInputSchema, type SetPasswordInput } from "@shared/schemas/auth";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";

/** The shared contract plus a repeat, which only the form needs. */
const setPasswordFormSchema = setPasswordInputSchema
  .extend({ confirmPassword: z.string() })
  .refine((v) => v.confirmPassword === v.password, {
    path: ["confirmPassword"],
    message: "The two passwords don't match",
  });

type Props = {
  onSubmit: (values: SetPasswordInput) => Promise<unknown>;
  onCancel: () => void;
};

export function SetPasswordForm({ onSubmit, onCancel }: Props) {
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof setPasswordFormSchema>, unknown, z.output<typeof setPasswordFormSchema>>({
    resolver: zodResolver(setPasswordFormSchema),
    defaultValues: { password: "", confirmPassword: "" },
  });

  const submit = handleSubmit(async ({ password }) => {
    try {
      await onSubmit({ password });
    } catch (err) {
      const message = err instanceof ApiError ? err.fields?.password : undefined;
      if (message) setError("password", { message });
      else setError("root.server", { message: errorMessage(err) });
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {errors.root?.server?.message && <Alert tone="error">{errors.root.server.message}</Alert>}
      <Field label="New password" error={errors.password?.message} hint="At least 10 characters.">
        <Input type="password" autoComplete="new-password" data-autofocus {...register("password")} />
      </Field>
      <Field label="Repeat new password" error={errors.confirmPassword?.message}>
        <Input type="password" autoComplete="new-password" {...register("confirmPassword")} />
      </Field>
      <div className="flex justify-end gap-2 border-t border-steel-100 pt-4">
        <Button variant="secondary" onClick={onCancel} disabled={isSubmitting}>
          Cancel
        </Button>
        <Button type="submit" loading={isSubmitting}>
          Set password
        </Button>
      </div>
    </form>
  );
}
