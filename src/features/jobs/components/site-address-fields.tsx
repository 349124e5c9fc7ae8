import { useFormContext, type FieldError } from "react-hook-form";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";

/** A form with the job's site address fields (the new-job form, the Site section). */
type WithSiteAddress = {
  siteAddressLine1?: string;
  siteAddressLine2?: string;
  siteCity?: string;
  siteRegion?: string;
  sitePostalCode?: string;
};

/** The site address inputs; the form around them provides `FormProvider`. */
export function SiteAddressFields() {
  const {
    register,
    formState: { errors },
  } = useFormContext<WithSiteAddress>();
  const error = (name: keyof WithSiteAddress) => (errors[name] as FieldError | undefined)?.message;
  return (
    <div className="grid grid-cols-6 gap-x-3 gap-y-2.5">
      <Field label="Street address" error={error("siteAddressLine1")} className="col-span-6 sm:col-span-4">
        <Input autoComplete="off" {...register("siteAddressLine1")} />
      </Field>
      <Field label="Apt, unit (optional)" error={error("siteAddressLine2")} className="col-span-6 sm:col-span-2">
        <Input autoComplete="off" {...register("siteAddressLine2")} />
      </Field>
      <Field label="City" error={error("siteCity")} className="col-span-6 sm:col-span-3">
        <Input autoComplete="off" {...register("siteCity")} />
      </Field>
      <Field label="State" error={error("siteRegion")} className="col-span-3 sm:col-span-1">
        <Input autoComplete="off" {...register("siteRegion")} />
      </Field>
      <Field label="ZIP" error={error("sitePostalCode")} className="col-span-3 sm:col-span-2">
        <Input autoComplete="off" inputMode="numeric" {...register("sitePostalCode")} />
      </Field>
    </div>
  );
}
