import { useEffect } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import {
  companyProfileSchema,
  type CompanyDto,
  type CompanyProfileFormValues,
  type CompanyProfileInput,
} from "@shared/schemas/price-book";
import { ApiError, errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Textarea } from "@/components/ui/textarea";
import { toast } from "@/components/ui/toast";
import { useSaveCompany } from "@/features/company/api/queries";
import { LogoField } from "@/features/company/components/logo-field";
import { parseNumber } from "@/lib/money";

type Values = {
  name: string;
  legalName: string;
  licenceNumber: string;
  addressLine1: string;
  addressLine2: string;
  city: string;
  region: string;
  postalCode: string;
  phone: string;
  email: string;
  website: string;
  proposalTerms: string;
  exclusions: string;
  warranty: string;
  proposalPrefix: string;
  nextProposalNumber: number | undefined;
};

const toValues = (c: CompanyDto): Values => ({
  name: c.name,
  legalName: c.legalName ?? "",
  licenceNumber: c.licenceNumber ?? "",
  addressLine1: c.addressLine1 ?? "",
  addressLine2: c.addressLine2 ?? "",
  city: c.city ?? "",
  region: c.region ?? "",
  postalCode: c.postalCode ?? "",
  phone: c.phone ?? "",
  email: c.email ?? "",
  website: c.website ?? "",
  proposalTerms: c.proposalTerms ?? "",
  exclusions: c.exclusions ?? "",
  warranty: c.warranty ?? "",
  proposalPrefix: c.proposalPrefix ?? "",
  nextProposalNumber: c.nextProposalNumber,
});


/** The owner's company profile, printed on proposals. The form keeps what was typed when a save fails. */
export function CompanyProfileForm({ company }: { company: CompanyDto }) {
  const save = useSaveCompany();
  const {
    register,
    handleSubmit,
    setError,
    reset,
    watch,
    formState: { errors, isSubmitting, isDirty },
  } = useForm<CompanyProfileFormValues, unknown, CompanyProfileInput>({
    resolver: zodResolver(companyProfileSchema),
    defaultValues: toValues(company),
  });

  useEffect(() => {
    if (!isDirty) reset(toValues(company));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [company]);

  const prefix = watch("proposalPrefix") ?? "";
  const next = watch("nextProposalNumber");

  const submit = handleSubmit(async (values) => {
    try {
      const saved = await save.mutateAsync(values);
      reset(toValues(saved));
      toast.success("Company profile saved.");
    } catch (err) {
      if (err instanceof ApiError && err.fields) {
        for (const [name, message] of Object.entries(err.fields)) setError(name as keyof CompanyProfileFormValues, { message });
        toast.error("Not saved: check the highlighted fields.");
        return;
      }
      setError("root", { message: errorMessage(err) });
      toast.error("The company profile was not saved.");
    }
  });

  const section = "rounded-lg border border-steel-200 bg-white p-4 shadow-panel";
  const h2 = "text-sm font-semibold text-steel-900";

  return (
    <form onSubmit={submit} noValidate className="space-y-4">
      {errors.root?.message && (
        <Alert tone="error" title="Not saved">
          {errors.root.message} Everything you typed is still here.
        </Alert>
      )}
      <div className="grid grid-cols-1 gap-4 lg:grid-cols-3">
        <section className={cn(section, "lg:col-span-2")} aria-labelledby="co-identity">
          <h2 id="co-identity" className={h2}>
            Business details
          </h2>
          <div className="mt-3 grid grid-cols-1 gap-3 md:grid-cols-6">
            <Field label="Trading name" error={errors.name?.message} className="md:col-span-3">
              <Input autoComplete="organization" {...register("name")} />
            </Field>
            <Field label="Legal name" error={errors.legalName?.message} className="md:col-span-3">
              <Input {...register("legalName")} />
            </Field>
            <Field label="Licence number" error={errors.licenceNumber?.message} className="md:col-span-2">
              <Input {...register("licenceNumber")} />
            </Field>
            <Field label="Phone" error={errors.phone?.message} className="md:col-span-2">
              <Input type="tel" autoComplete="tel" {...register("phone")} />
            </Field>
            <Field label="E-mail" error={errors.email?.message} className="md:col-span-2">
              <Input type="email" autoComplete="email" {...register("email")} />
            </Field>
            <Field label="Website" error={errors.website?.message} className="md:col-span-6" hint="Starting with https://">
              <Input type="url" {...register("website")} />
            </Field>
            <Field label="Address line 1" error={errors.addressLine1?.message} className="md:col-span-3">
              <Input autoComplete="address-line1" {...register("addressLine1")} />
            </Field>
            <Field label="Address line 2" error={errors.addressLine2?.message} className="md:col-span-3">
              <Input autoComplete="address-line2" {...register("addressLine2")} />
            </Field>
            <Field label="City" error={errors.city?.message} className="md:col-span-3">
              <Input autoComplete="address-level2" {...register("city")} />
            </Field>
            <Field label="State / region" error={errors.region?.message} className="md:col-span-1">
              <Input autoComplete="address-level1" {...register("region")} />
            </Field>
            <Field label="Postal code" error={errors.postalCode?.message} className="md:col-span-2">
              <Input autoComplete="postal-code" {...register("postalCode")} />
            </Field>
          </div>
        </section>

        <div className="space-y-4">
          <section className={section} aria-labelledby="co-logo">
            <h2 id="co-logo" className={h2}>
              Logo
            </h2>
            <LogoField company={company} canEdit />
          </section>
          <section className={section} aria-labelledby="co-numbering">
            <h2 id="co-numbering" className={h2}>
              Proposal numbering
            </h2>
            <div className="mt-3 grid grid-cols-2 gap-3">
              <Field label="Prefix" error={errors.proposalPrefix?.message}>
                <Input {...register("proposalPrefix")} />
              </Field>
              <Field label="Next number" error={errors.nextProposalNumber?.message}>
                <Input inputMode="numeric" {...register("nextProposalNumber", { setValueAs: (v) => parseNumber(v) ?? undefined })} />
              </Field>
            </div>
            <p className="mt-2 text-xs text-steel-500">
              The next quote will be numbered{" "}
              <strong className="font-mono text-steel-800">
                {prefix}
                {typeof next === "number" && Number.isFinite(next) ? next : "…"}
              </strong>
              . Numbers already given out are never reused.
            </p>
          </section>
        </div>
      </div>

      <section className={section} aria-labelledby="co-texts">
        <h2 id="co-texts" className={h2}>
          Printed on every proposal
        </h2>
        <div className="mt-3 grid grid-cols-1 gap-3 lg:grid-cols-3">
          <Field label="Terms and conditions" error={errors.proposalTerms?.message}>
            <Textarea rows={8} className="min-h-28" {...register("proposalTerms")} />
          </Field>
          <Field label="Exclusions" error={errors.exclusions?.message} hint="What the price does not include">
            <Textarea rows={8} className="min-h-28" {...register("exclusions")} />
          </Field>
          <Field label="Workmanship warranty" error={errors.warranty?.message} hint="Your own warranty; the panel maker's is separate">
            <Textarea rows={8} className="min-h-28" {...register("warranty")} />
          </Field>
        </div>
      </section>

      <div className={cn(isDirty && "sticky bottom-0 z-10", "-mx-1 flex items-center justify-end gap-2 border-t border-steel-200 bg-steel-50/95 px-1 py-2 backdrop-blur")}>
        {isDirty && <p className="mr-auto text-xs text-steel-600">Unsaved changes</p>}
        <Button variant="ghost" disabled={!isDirty || isSubmitting} onClick={() => reset(toValues(company))}>
          Discard changes
        </Button>
        <Button type="submit" loading={isSubmitting} disabled={!isDirty}>
          Save profile
        </Button>
      </div>
    </form>
  );
}
