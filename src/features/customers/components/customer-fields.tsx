import { get, useFormContext, type FieldError } from "react-hook-form";
import { cn } from "@/lib/cn";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Textarea } from "@/components/ui/textarea";

type Props = {
  /** "" for a customer form; "customer." inside the new-job form. */
  prefix?: "" | "customer.";
  /** Shows the notes box (the customer dialog; not the inline add in the new-job form). */
  withNotes?: boolean;
  autoFocus?: boolean;
  className?: string;
};

/** The homeowner's name, contact and address; inside a react-hook-form `FormProvider`. */
export function CustomerFields({ prefix = "", withNotes = false, autoFocus = false, className }: Props) {
  const {
    register,
    formState: { errors },
  } = useFormContext();
  const err = (name: string) => (get(errors, `${prefix}${name}`) as FieldError | undefined)?.message;
  const reg = (name: string) => register(`${prefix}${name}`);

  return (
    <div className={cn("grid grid-cols-6 gap-x-3 gap-y-2.5", className)}>
      <Field label="Name" error={err("name")} className="col-span-6">
        <Input autoComplete="off" {...(autoFocus ? { "data-autofocus": true } : {})} {...reg("name")} />
      </Field>
      <Field
        label="E-mail"
        error={err("email")}
        hint="Proposals are sent here."
        className="col-span-6 sm:col-span-4"
      >
        <Input type="email" autoComplete="off" spellCheck={false} {...reg("email")} />
      </Field>
      <Field label="Phone" error={err("phone")} className="col-span-6 sm:col-span-2">
        <Input type="tel" autoComplete="off" {...reg("phone")} />
      </Field>
      <Field label="Street address" error={err("addressLine1")} className="col-span-6 sm:col-span-4">
        <Input autoComplete="off" {...reg("addressLine1")} />
      </Field>
      <Field label="Apt, unit (optional)" error={err("addressLine2")} className="col-span-6 sm:col-span-2">
        <Input autoComplete="off" {...reg("addressLine2")} />
      </Field>
      <Field label="City" error={err("city")} className="col-span-6 sm:col-span-3">
        <Input autoComplete="off" {...reg("city")} />
      </Field>
      <Field label="State" error={err("region")} className="col-span-3 sm:col-span-1">
        <Input autoComplete="off" {...reg("region")} />
      </Field>
      <Field label="ZIP" error={err("postalCode")} className="col-span-3 sm:col-span-2">
        <Input autoComplete="off" inputMode="numeric" {...reg("postalCode")} />
      </Field>
      {withNotes && (
        <Field label="Notes" error={err("notes")} className="col-span-6">
          <Textarea rows={3} {...reg("notes")} />
        </Field>
      )}
    </div>
  );
}
