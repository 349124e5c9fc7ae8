import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { ROLES } from "@shared/auth/roles";
import { createUserInputSchema, type CreateUserInput } from "@shared/schemas/auth";
import { ApiError, errorMessage } from "@/lib/api-client";
import { ROLE_DESCRIPTIONS, ROLE_LABELS } from "@/config/roles";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";

type FormInput = z.input<typeof createUserInputSchema>;
const FORM_FIELDS = ["email", "name", "role", "password"] as const;
type FormField = (typeof FORM_FIELDS)[number];

type Props = {
  onSubmit: (values: CreateUserInput) => Promise<unknown>;
  onCancel: () => void;
};

export function AddUserForm({ onSubmit, onCancel }: Props) {
  const {
    register,
    handleSubmit,
    setError,
    watch,
    formState: { errors, isSubmitting },
  } = useForm<FormInput, unknown, CreateUserInput>({
    resolver: zodResolver(createUserInputSchema),
    defaultValues: { name: "", email: "", role: "estimator", password: "" },
  });
  const role = watch("role");

  const submit = handleSubmit(async (values) => {
    try {
      await onSubmit(values);
    } catch (err) {
      if (err instanceof ApiError && err.status === 409 && !err.fields) {
        setError("email", { message: "Someone in your company already signs in with this e-mail." }, { shouldFocus: true });
        return;
      }
      const known = Object.entries(err instanceof ApiError ? (err.fields ?? {}) : {}).filter(([name]) =>
        (FORM_FIELDS as readonly string[]).includes(name),
      );
      for (const [name, message] of known) setError(name as FormField, { message });
      if (known.length === 0) setError("root.server", { message: errorMessage(err) });
    }
  });

  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {errors.root?.server?.message && <Alert tone="error">{errors.root.server.message}</Alert>}
      <Field label="Name" error={errors.name?.message}>
        <Input autoComplete="off" data-autofocus {...register("name")} />
      </Field>
      <Field label="E-mail" error={errors.email?.message} hint="They sign in with this address.">
        <Input type="email" autoComplete="off" spellCheck={false} {...register("email")} />
      </Field>
      <Field
        label="Role"
        error={errors.role?.message}
        hint={role && ROLE_DESCRIPTIONS[role as keyof typeof ROLE_DESCRIPTIONS]}
      >
        <Select {...register("role")}>
          {ROLES.map((r) => (
            <option key={r} value={r}>
              {ROLE_LABELS[r]}
            </option>
          ))}
        </Select>
      </Field>
      <Field
        label="First password"
        error={errors.password?.message}
        hint="At least 10 characters. Give it to them in person; they can change it under Account."
      >
        <Input type="password" autoComplete="new-password" {...register("password")} />
      </Field>
      <div className="flex justify-end gap-2 border-t border-steel-100 pt-4">
        <Button variant="secondary" onClick={onCancel} disabled={isSubmitting}>
          Cancel
        </Button>
        <Button type="submit" loading={isSubmitting}>
          Add member
        </Button>
      </div>
    </form>
  );
}
