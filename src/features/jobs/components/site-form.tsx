import { useEffect } from "react";
import { FormProvider, useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { jobSiteSchema, jobUpdateSchema, type JobDto, type JobUpdate } from "@shared/schemas/job";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Textarea } from "@/components/ui/textarea";
import { SITE_FIELD_PATHS, SiteDataFields } from "@/features/jobs/components/site-data-fields";
import { SiteAddressFields } from "@/features/jobs/components/site-address-fields";

type FormValues = z.input<typeof jobUpdateSchema>;

const ADDRESS = ["siteAddressLine1", "siteAddressLine2", "siteCity", "siteRegion", "sitePostalCode"] as const;
const KNOWN = new Set<string>([...ADDRESS, "notes", ...SITE_FIELD_PATHS]);

/** The form's values from a job: blanks for missing text, the stored site with the engine's defaults filled in. */
export function siteFormValues(job: JobDto): FormValues {
  const parsed = jobSiteSchema.safeParse(job.site ?? {});
  return {
    siteAddressLine1: job.siteAddressLine1 ?? "",
    siteAddressLine2: job.siteAddressLine2 ?? "",
    siteCity: job.siteCity ?? "",
    siteRegion: job.siteRegion ?? "",
    sitePostalCode: job.sitePostalCode ?? "",
    notes: job.notes ?? "",
    site: parsed.success ? parsed.data : job.site,
  };
}

type Props = {
  job: JobDto;
  disabled: boolean;
  /** PATCH /api/jobs/:id with only what changed. */
  onSave: (changes: Partial<JobUpdate>) => Promise<JobDto>;
};

/**
 * The Site section's form: the site's address, the site data for the takeoff and notes, validated with
 * the shared `jobUpdateSchema`. Only what changed is sent; a failed save keeps everything typed.
 */
export function SiteForm({ job, disabled, onSave }: Props) {
  const form = useForm<FormValues, unknown, JobUpdate>({
    resolver: zodResolver(jobUpdateSchema),
    defaultValues: siteFormValues(job),
  });
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting, isDirty, dirtyFields },
  } = form;

  // someone else's change (or a status move) arrives: take it, unless the person is mid-edit
  useEffect(() => {
    if (!form.formState.isDirty) reset(siteFormValues(job));
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [job.updatedAt]);

  const submit = handleSubmit(async (values) => {
    const changes: Partial<JobUpdate> = {};
    const dirty = dirtyFields as Partial<Record<keyof FormValues, unknown>>;
    for (const k of [...ADDRESS, "notes"] as const) if (dirty[k]) changes[k] = values[k];
    if (dirty.site) changes.site = values.site;
    if (Object.keys(changes).length === 0) return;
    try {
      const saved = await onSave(changes);
      reset(siteFormValues(saved));
    } catch (err) {
      const fields = Object.entries(err instanceof ApiError ? (err.fields ?? {}) : {}).filter(([k]) => KNOWN.has(k));
      fields.forEach(([k, message], i) => setError(k as keyof FormValues, { message }, { shouldFocus: i === 0 }));
      if (fields.length === 0) setError("root.server", { message: errorMessage(err) });
    }
  });

  return (
    <FormProvider {...form}>
      <form onSubmit={submit} noValidate aria-labelledby="site-form-title">
        <fieldset disabled={disabled || isSubmitting} className="min-w-0 space-y-5">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id="site-form-title" className="text-sm font-semibold text-steel-900">
              Site
            </h2>
            {isDirty && !disabled && <span className="text-xs font-medium text-caution-700">Unsaved changes</span>}
          </div>
          {errors.root?.server?.message && (
            <Alert tone="error" title="Not saved">
              {errors.root.server.message} Your changes are still here; try again.
            </Alert>
          )}

          <fieldset className="min-w-0">
            <legend className="mb-2 text-xs font-semibold uppercase tracking-wide text-steel-500">Address</legend>
            <SiteAddressFields />
          </fieldset>

          <div className="border-t border-steel-100 pt-4">
            <p className="mb-3 text-xs text-steel-500">
              Site data for the takeoff: ventilation, ice barrier, tear-off and wind fastening are worked out from these.
            </p>
            <SiteDataFields />
          </div>

          <Field label="Notes" error={errors.notes?.message} className="border-t border-steel-100 pt-4">
            <Textarea rows={3} placeholder="Access, pets, gate code, what the homeowner asked for…" {...register("notes")} />
          </Field>

          {!disabled && (
            <div className="flex items-center justify-end gap-2 border-t border-steel-100 pt-4">
              <Button variant="secondary" disabled={!isDirty || isSubmitting} onClick={() => reset(siteFormValues(job))}>
                Discard changes
              </Button>
              <Button type="submit" loading={isSubmitting} disabled={!isDirty}>
                Save site
              </Button>
            </div>
          )}
        </fieldset>
      </form>
    </FormProvider>
  );
}
