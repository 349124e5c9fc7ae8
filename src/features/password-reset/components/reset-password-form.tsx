import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { passwordSchema } from "@shared/schemas/auth";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";

const resetFormSchema = z
  .object({ password: passwordSchema, repeat: z.string() })
  .refine((v) => v.password === v.repeat, { path: ["repeat"], message: "The two passwords don't match" });
type ResetFormValues = z.infer<typeof resetFormSchema>;

/** The link itself was refused (unknown, used or expired), as opposed to a problem with the password. */
export const isBadResetLink = (err: unknown) =>
  err instanceof ApiError && (err.code === "invalid_reset_token" || (err.status === 400 && Boolean(err.fields?.token)));

type Props = {
  onSubmit: (password: string) => Promise<unknown>;
  /** The server refused the link. */
  onBadLink: () => void;
};

export function ResetPasswordForm({ onSubmit, onBadLink }: Props) {
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<ResetFormValues>({ resolver: zodResolver(resetFormSchema), defaultValues: { password: "", repeat: "" } });

  const submit = handleSubmit(async ({ password }) => {
    try {
      await onSubmit(password);
    } catch (err) {
      if (isBadResetLink(err)) return onBadLink();
      const field = err instanceof ApiError ? err.fields?.password : undefined;
      if (field) setError("password", { message: field }, { shouldFocus: true });
      else setError("root.server", { message: errorMessage(err) });
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Set a new password">
      {errors.root?.server?.message && <Alert tone="error">{errors.root.server.message}</Alert>}
      <Field label="New password" error={errors.password?.message} hint="At least 10 characters.">
        <Input type="password" autoComplete="new-password" autoFocus {...register("password")} />
      </Field>
      <Field label="Repeat the new password" error={errors.repeat?.message}>
        <Input type="password" autoComplete="new-password" {...register("repeat")} />
      </Field>
      <Button type="submit" size="lg" className="w-full" loading={isSubmitting}>
        {isSubmitting ? "Saving…" : "Set new password"}
      </Button>
    </form>
  );
}
