import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { loginInputSchema, type LoginInput } from "@shared/schemas/auth";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";

type Props = {
  onSubmit: (values: LoginInput) => Promise<unknown>;
  defaultEmail?: string;
};

const FORM_FIELDS = ["email", "password"] as const;

/** Why the server refused, in words for the person at the keyboard. */
function refusalMessage(err: unknown): string {
  if (err instanceof ApiError) {
    if (err.status === 401) return "That e-mail and password don't match an active account. Check both and try again.";
    if (err.status === 429) return "Too many failed sign-in attempts. Wait 15 minutes, then try again.";
  }
  return errorMessage(err);
}

export function SignInForm({ onSubmit, defaultEmail = "" }: Props) {
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof loginInputSchema>, unknown, LoginInput>({
    resolver: zodResolver(loginInputSchema),
    defaultValues: { email: defaultEmail, password: "" },
  });

  const submit = handleSubmit(async (values) => {
    try {
      await onSubmit(values);
    } catch (err) {
      const fields = err instanceof ApiError ? err.fields : undefined;
      const known = Object.entries(fields ?? {}).filter(([name]) =>
        (FORM_FIELDS as readonly string[]).includes(name),
      );
      for (const [name, message] of known) {
        setError(name as (typeof FORM_FIELDS)[number], { message }, { shouldFocus: true });
      }
      if (known.length === 0) setError("root.server", { message: refusalMessage(err) });
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4" aria-label="Sign in">
      {errors.root?.server?.message && <Alert tone="error">{errors.root.server.message}</Alert>}
      <Field label="E-mail" error={errors.email?.message}>
        <Input type="email" autoComplete="username" autoFocus spellCheck={false} {...register("email")} />
      </Field>
      <Field label="Password" error={errors.password?.message}>
        <Input type="password" autoComplete="current-password" {...register("password")} />
      </Field>
      <Button type="submit" size="lg" className="w-full" loading={isSubmitting}>
        {isSubmitting ? "Signing in…" : "Sign in"}
      </Button>
    </form>
  );
}
