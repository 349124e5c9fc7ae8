import { FormProvider, useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import {
  customerInputSchema,
  type CustomerDto,
  type CustomerFormValues,
  type CustomerInput,
} from "@shared/schemas/customer";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { CustomerFields } from "@/features/customers/components/customer-fields";

const FIELDS = ["name", "email", "phone", "addressLine1", "addressLine2", "city", "region", "postalCode", "notes"] as const;
type FieldName = (typeof FIELDS)[number];

/** The form's starting values: a customer's current ones, or blanks. */
export function customerFormValues(c?: CustomerDto | null): CustomerFormValues {
  return Object.fromEntries(FIELDS.map((k) => [k, c?.[k] ?? ""])) as CustomerFormValues;
}

type Props = {
  customer?: CustomerDto | null;
  submitLabel: string;
  onSubmit: (values: CustomerInput) => Promise<unknown>;
  onCancel: () => void;
};

/** Add or edit a homeowner; validated with the shared `customerInputSchema`, server field errors on the fields. */
export function CustomerForm({ customer, submitLabel, onSubmit, onCancel }: Props) {
  const form = useForm<CustomerFormValues, unknown, CustomerInput>({
    resolver: zodResolver(customerInputSchema),
    defaultValues: customerFormValues(customer),
  });
  const {
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = form;

  const submit = handleSubmit(async (values) => {
    try {
      await onSubmit(values);
    } catch (err) {
      const known = Object.entries(err instanceof ApiError ? (err.fields ?? {}) : {}).filter(([k]) =>
        (FIELDS as readonly string[]).includes(k),
      );
      known.forEach(([k, message], i) => setError(k as FieldName, { message }, { shouldFocus: i === 0 }));
      if (known.length === 0) setError("root.server", { message: errorMessage(err) });
    }
  });

  return (
    <FormProvider {...form}>
      <form onSubmit={submit} noValidate className="space-y-4">
        {errors.root?.server?.message && <Alert tone="error">{errors.root.server.message}</Alert>}
        <CustomerFields withNotes autoFocus />
        <div className="flex justify-end gap-2 border-t border-steel-100 pt-4">
          <Button variant="secondary" onClick={onCancel} disabled={isSubmitting}>
            Cancel
          </Button>
          <Button type="submit" loading={isSubmitting}>
            {submitLabel}
          </Button>
        </div>
      </form>
    </FormProvider>
  );
}
