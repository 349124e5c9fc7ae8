import { useEffect, useRef, useState, type ComponentType } from "react";
import { Controller, FormProvider, useForm, useWatch, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useQuery } from "@tanstack/react-query";
import type { UserDto } from "@shared/schemas/auth";
import { jobInputSchema, type JobFormValues, type JobInput } from "@shared/schemas/job";
import type { CustomerDto } from "@shared/schemas/customer";
import { ApiError, errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";
import { Textarea } from "@/components/ui/textarea";
import { userQueries } from "@/lib/queries/users";
import {
  DEFAULT_SITE,
  SITE_FIELD_PATHS,
  SiteDataFields,
  describeSite,
  numberOrUndefined,
  type SiteFormValues,
} from "@/features/jobs/components/site-data-fields";
import { SiteAddressFields } from "@/features/jobs/components/site-address-fields";

type Mode = "existing" | "new";
type Picked = Pick<CustomerDto, "id" | "name"> & Partial<CustomerDto>;

/**
 * The customer inputs the form shows. They belong to the customers feature, so the screen that renders the
 * form passes them in (the jobs feature does not import another feature).
 */
export type CustomerInputs = {
  /** Finds an existing customer; "Add … as a new customer" calls `onAddNew` with the typed name. */
  Picker: ComponentType<{
    value: Picked | null;
    onChange: (customer: Picked | null) => void;
    onAddNew: (name: string) => void;
    onBlur?: () => void;
  }>;
  /** A new customer's fields, registered under `customer.` in the surrounding react-hook-form. */
  Fields: ComponentType<{ prefix: "customer."; autoFocus?: boolean }>;
};

const EMPTY_CUSTOMER = {
  name: "",
  email: "",
  phone: "",
  addressLine1: "",
  addressLine2: "",
  city: "",
  region: "",
  postalCode: "",
};

export const newJobDefaults = (): JobFormValues => ({
  customerId: undefined,
  customer: { ...EMPTY_CUSTOMER },
  siteAddressLine1: "",
  siteAddressLine2: "",
  siteCity: "",
  siteRegion: "",
  sitePostalCode: "",
  notes: "",
  estimatorId: undefined,
  site: structuredClone(DEFAULT_SITE),
});

const TOP_FIELDS = [
  "customerId",
  "siteAddressLine1",
  "siteAddressLine2",
  "siteCity",
  "siteRegion",
  "sitePostalCode",
  "notes",
  "estimatorId",
] as const;
const CUSTOMER_FIELDS = Object.keys(EMPTY_CUSTOMER).map((k) => `customer.${k}`);

type Props = {
  me: UserDto;
  onSubmit: (values: JobInput) => Promise<unknown>;
  onCancel: () => void;
  customerInputs: CustomerInputs;
};

/**
 * The new-job form: the customer picked from the list or added here, the site's address, the estimator
 * (owners choose; an estimator's own jobs are theirs), notes, and the site data for the takeoff (collapsed,
 * with the engine's defaults). Validated with the shared `jobInputSchema`; server field errors land on the fields.
 */
export function NewJobForm({ me, onSubmit, onCancel, customerInputs }: Props) {
  const { Picker: CustomerPicker, Fields: CustomerFields } = customerInputs;
  const [mode, setModeState] = useState<Mode>("existing");
  const modeRef = useRef<Mode>("existing");
  const [picked, setPicked] = useState<Picked | null>(null);
  const [siteOpen, setSiteOpen] = useState(false);
  const isOwner = me.role === "owner";
  const team = useQuery({ ...userQueries.list(), enabled: isOwner });

  // The schema wants a picked customer OR a new one: the half the person is not using is left out.
  const resolver = useRef<Resolver<JobFormValues, unknown, JobInput>>((values, ctx, opts) => {
    const v = modeRef.current === "existing" ? { ...values, customer: undefined } : { ...values, customerId: undefined };
    return zodResolver(jobInputSchema)(v, ctx, opts);
  }).current;

  const form = useForm<JobFormValues, unknown, JobInput>({ resolver, defaultValues: newJobDefaults() });
  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    clearErrors,
    formState: { errors, isSubmitting },
  } = form;
  const site = useWatch({ control, name: "site" });

  const setMode = (m: Mode) => {
    modeRef.current = m;
    setModeState(m);
    clearErrors(["customerId", "customer"]);
  };

  // a problem in the collapsed site data opens it
  useEffect(() => {
    if (errors.site) setSiteOpen(true);
  }, [errors.site]);

  const submit = handleSubmit(async (values) => {
    try {
      await onSubmit(values);
    } catch (err) {
      const fields = err instanceof ApiError ? (err.fields ?? {}) : {};
      const known = new Set<string>([
        ...TOP_FIELDS,
        ...SITE_FIELD_PATHS,
        ...(modeRef.current === "new" ? CUSTOMER_FIELDS : []),
      ]);
      let placed = 0;
      for (const [key, message] of Object.entries(fields)) {
        const name = key === "customer" && modeRef.current === "existing" ? "customerId" : key;
        if (!known.has(name)) continue;
        setError(name as keyof JobFormValues, { message }, { shouldFocus: placed === 0 });
        placed++;
      }
      if (placed === 0) setError("root.server", { message: errorMessage(err) });
    }
  });

  const segment = (m: Mode, label: string) => (
    <button
      type="button"
      aria-pressed={mode === m}
      onClick={() => setMode(m)}
      className={cn(
        "h-6 rounded px-2.5 text-xs font-medium focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500",
        mode === m ? "bg-steel-800 text-white" : "text-steel-600 hover:bg-steel-100",
      )}
    >
      {label}
    </button>
  );

  return (
    <FormProvider {...form}>
      <form onSubmit={submit} noValidate className="space-y-5">
        {errors.root?.server?.message && <Alert tone="error">{errors.root.server.message}</Alert>}

        <section aria-labelledby="nj-customer" className="space-y-2.5">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h3 id="nj-customer" className="text-sm font-semibold text-steel-900">
              Customer
            </h3>
            <div role="group" aria-label="Customer" className="inline-flex rounded-md border border-steel-300 bg-white p-0.5">
              {segment("existing", "Existing customer")}
              {segment("new", "New customer")}
            </div>
          </div>
          {mode === "existing" ? (
            <Field label="Find the customer" error={errors.customerId?.message ?? errors.customer?.message}>
              <Controller
                control={control}
                name="customerId"
                render={({ field }) => (
                  <CustomerPicker
                    value={picked}
                    onBlur={field.onBlur}
                    onChange={(c) => {
                      setPicked(c);
                      field.onChange(c?.id);
                      if (c) clearErrors("customerId");
                    }}
                    onAddNew={(name) => {
                      setMode("new");
                      if (name) setValue("customer.name", name);
                    }}
                  />
                )}
              />
            </Field>
          ) : (
            <CustomerFields prefix="customer." autoFocus />
          )}
        </section>

        <section aria-labelledby="nj-site" className="space-y-2.5">
          <div>
            <h3 id="nj-site" className="text-sm font-semibold text-steel-900">
              Site address
            </h3>
            <p className="text-xs text-steel-500">Leave it blank when the roof is at the customer's own address.</p>
          </div>
          <SiteAddressFields />
        </section>

        <div className="grid grid-cols-6 gap-x-3 gap-y-2.5">
          {isOwner && (
            <Field
              label="Estimator"
              error={errors.estimatorId?.message}
              className="col-span-6 sm:col-span-2"
              hint={team.isError ? "The team list could not be loaded." : undefined}
            >
              <Select {...register("estimatorId", { setValueAs: numberOrUndefined })}>
                <option value="">Unassigned</option>
                {(team.data ?? [])
                  .filter((m) => m.active && m.role !== "crew")
                  .map((m) => (
                    <option key={m.id} value={m.id}>
                      {m.id === me.id ? `${m.name} (me)` : m.name}
                    </option>
                  ))}
              </Select>
            </Field>
          )}
          <Field label="Notes" error={errors.notes?.message} className={cn("col-span-6", isOwner && "sm:col-span-4")}>
            <Textarea rows={isOwner ? 1 : 2} placeholder="Access, pets, gate code, what the homeowner asked for…" {...register("notes")} />
          </Field>
        </div>

        <details
          open={siteOpen}
          onToggle={(e) => setSiteOpen((e.currentTarget as HTMLDetailsElement).open)}
          className="group rounded-md border border-steel-200 bg-steel-50/60"
        >
          <summary className="flex cursor-pointer list-none items-center gap-2 rounded-md px-3 py-2 text-sm focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500 [&::-webkit-details-marker]:hidden">
            <svg
              viewBox="0 0 16 16"
              className="size-3.5 shrink-0 text-steel-500 transition-transform group-open:rotate-90"
              fill="none"
              stroke="currentColor"
              strokeWidth="1.8"
              aria-hidden="true"
            >
              <path d="m6 3.5 4.5 4.5L6 12.5" strokeLinecap="round" strokeLinejoin="round" />
            </svg>
            <span className="font-semibold text-steel-900">Site data for the takeoff</span>
            <span className="min-w-0 truncate text-xs text-steel-500">{describeSite(site as SiteFormValues | undefined)}</span>
            {errors.site && <span className="ml-auto shrink-0 text-xs font-medium text-danger-700">Check these fields</span>}
          </summary>
          <div className="border-t border-steel-200 px-3 pb-3 pt-3">
            <SiteDataFields />
          </div>
        </details>

        <div className="flex justify-end gap-2 border-t border-steel-100 pt-4">
          <Button variant="secondary" onClick={onCancel} disabled={isSubmitting}>
            Cancel
          </Button>
          <Button type="submit" loading={isSubmitting}>
            Create job
          </Button>
        </div>
      </form>
    </FormProvider>
  );
}
