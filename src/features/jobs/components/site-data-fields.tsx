import type { ReactNode } from "react";
import { useFormContext, type FieldError } from "react-hook-form";
import type { z } from "zod";
import { ATTIC_TYPES, CODE_EDITIONS } from "@shared/schemas/takeoff";
import { jobSiteSchema } from "@shared/schemas/job";
import { cn } from "@/lib/cn";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";

export type SiteFormValues = z.input<typeof jobSiteSchema>;

/** A form that has the engine's site object under `site` (the new-job form, the Site section). */
type WithSite = { site?: SiteFormValues };

export const ATTIC_LABELS: Record<(typeof ATTIC_TYPES)[number], string> = {
  vented: "Vented attic",
  unvented: "Unvented (sealed) attic",
  cathedral: "Cathedral ceiling, no attic",
};

/** The site object a new job starts with: the engine's own defaults, written out. */
export const DEFAULT_SITE = jobSiteSchema.parse({});

/** Blank → left out (the engine's default applies); otherwise a number (NaN is refused with "Enter a number"). */
export const numberOrUndefined = (v: unknown) => (v === "" || v === null || v === undefined ? undefined : Number(v));
/** A yes / no / not-stated select. */
export const triState = (v: unknown) => (v === "true" || v === true ? true : v === "false" || v === false ? false : undefined);
const blankToUndefined = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);
const upperOrUndefined = (v: unknown) => (typeof v === "string" && v.trim() ? v.trim().toUpperCase() : undefined);

function Group({ title, children, note }: { title: string; children: ReactNode; note?: ReactNode }) {
  return (
    <fieldset className="min-w-0">
      <legend className="mb-2 text-xs font-semibold uppercase tracking-wide text-steel-500">{title}</legend>
      <div className="grid grid-cols-2 gap-x-3 gap-y-2.5 sm:grid-cols-4">{children}</div>
      {note && <p className="mt-2 text-xs text-steel-500">{note}</p>}
    </fieldset>
  );
}

function Check({
  label,
  hint,
  children,
  className = "col-span-2 sm:col-span-1 self-end pb-1.5",
}: {
  label: ReactNode;
  hint?: ReactNode;
  children: ReactNode;
  className?: string;
}) {
  return (
    <label className={cn("flex items-start gap-2 text-sm text-steel-800", className)}>
      {children}
      <span>
        {label}
        {hint && <span className="block text-xs text-steel-500">{hint}</span>}
      </span>
    </label>
  );
}

const checkboxClass =
  "mt-0.5 size-4 shrink-0 rounded border-steel-400 accent-accent-700 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500 focus-visible:ring-offset-1 disabled:cursor-not-allowed";

/**
 * The site data the engine uses for the takeoff: attic and ventilation, climate and code, the existing
 * roof, and wind. Used inside a react-hook-form `FormProvider` whose values have `site`; wrap it in a
 * disabled `<fieldset>` to make it read-only.
 */
export function SiteDataFields({ className }: { className?: string }) {
  const {
    register,
    formState: { errors },
  } = useFormContext<WithSite>();
  const e = (errors.site ?? {}) as Record<string, FieldError | Record<string, FieldError> | undefined>;
  const msg = (k: string) => (e[k] as FieldError | undefined)?.message;
  const windMsg = (k: string) => ((e.wind as Record<string, FieldError> | undefined)?.[k] as FieldError | undefined)?.message;
  const num = { setValueAs: numberOrUndefined };

  return (
    <div className={cn("space-y-4", className)}>
      <Group title="Attic and ventilation">
        <Field label="Attic" error={msg("atticType")} className="col-span-2 sm:col-span-1">
          <Select {...register("site.atticType")}>
            {ATTIC_TYPES.map((t) => (
              <option key={t} value={t}>
                {ATTIC_LABELS[t]}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Attic floor area (sq ft)" error={msg("atticFloorAreaSqFt")} className="col-span-2 sm:col-span-1">
          <Input type="number" inputMode="decimal" min={0} step="any" {...register("site.atticFloorAreaSqFt", num)} />
        </Field>
        <Field label="Vapour retarder" error={msg("vaporRetarder")} className="col-span-2 sm:col-span-1">
          <Select {...register("site.vaporRetarder", { setValueAs: triState })}>
            <option value="">Not stated</option>
            <option value="true">Class I or II, warm side</option>
            <option value="false">No</option>
          </Select>
        </Field>
        <Check label="1/300 vent exception" hint="Where IRC R806.2 allows it">
          <input type="checkbox" className={checkboxClass} {...register("site.ventException")} />
        </Check>
      </Group>

      <Group title="Climate and code">
        <Field label="Climate zone" error={msg("climateZone")} hint="IECC zone, e.g. 5A" className="col-span-2 sm:col-span-1">
          <Input
            autoComplete="off"
            spellCheck={false}
            maxLength={3}
            placeholder="Not set"
            className="uppercase placeholder:normal-case"
            {...register("site.climateZone", { setValueAs: upperOrUndefined })}
          />
        </Field>
        <Field label="Code edition" error={msg("codeEdition")} className="col-span-2 sm:col-span-1">
          <Select {...register("site.codeEdition", { setValueAs: (v) => Number(v) })}>
            {CODE_EDITIONS.map((y) => (
              <option key={y} value={y}>
                IRC {y}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Ice-dam risk" error={msg("iceDamRisk")} className="col-span-2 sm:col-span-1">
          <Select {...register("site.iceDamRisk", { setValueAs: triState })}>
            <option value="">Unknown</option>
            <option value="true">Yes</option>
            <option value="false">No</option>
          </Select>
        </Field>
        <Check label="Cool roof required">
          <input type="checkbox" className={checkboxClass} {...register("site.coolRoofRequired")} />
        </Check>
      </Group>

      <Group title="Existing roof">
        <Field label="Existing layers" error={msg("existingLayers")} className="col-span-2 sm:col-span-1">
          <Input type="number" inputMode="numeric" min={0} max={10} step={1} {...register("site.existingLayers", num)} />
        </Field>
        <Check label="Tear off to the deck" hint="Unchecked: over the existing roofing">
          <input type="checkbox" className={checkboxClass} {...register("site.tearOff")} />
        </Check>
      </Group>

      <Group
        title="Wind"
        note="Use the design values the building department gives for the site (ASCE 7 wind speed and exposure)."
      >
        <Field label="Basic wind speed (mph)" error={windMsg("basicWindSpeedMph")} className="col-span-2 sm:col-span-1">
          <Input type="number" inputMode="decimal" min={0} step="any" {...register("site.wind.basicWindSpeedMph", num)} />
        </Field>
        <Field label="Exposure" error={windMsg("exposure")} className="col-span-2 sm:col-span-1">
          <Select {...register("site.wind.exposure", { setValueAs: blankToUndefined })}>
            <option value="">Not set</option>
            <option value="B">B (suburban, wooded)</option>
            <option value="C">C (open terrain)</option>
            <option value="D">D (open water)</option>
          </Select>
        </Field>
        <Field
          label="Least width (ft)"
          hint="Least horizontal dimension"
          error={windMsg("leastHorizontalDimensionFt")}
          className="col-span-2 sm:col-span-1"
        >
          <Input type="number" inputMode="decimal" min={0} step="any" {...register("site.wind.leastHorizontalDimensionFt", num)} />
        </Field>
        <Field label="Mean roof height (ft)" error={windMsg("meanRoofHeightFt")} className="col-span-2 sm:col-span-1">
          <Input type="number" inputMode="decimal" min={0} step="any" {...register("site.wind.meanRoofHeightFt", num)} />
        </Field>
        <Check
          label="A tested (rated) assembly is required"
          hint="e.g. by the local code or the insurer"
          className="col-span-2 sm:col-span-4"
        >
          <input type="checkbox" className={checkboxClass} {...register("site.wind.ratedAssemblyRequired")} />
        </Check>
      </Group>
    </div>
  );
}

/** Every field of the site object, as form paths: where a server's field error can land. */
export const SITE_FIELD_PATHS = [
  "site.atticType",
  "site.atticFloorAreaSqFt",
  "site.climateZone",
  "site.iceDamRisk",
  "site.ventException",
  "site.codeEdition",
  "site.coolRoofRequired",
  "site.vaporRetarder",
  "site.existingLayers",
  "site.tearOff",
  "site.wind.ratedAssemblyRequired",
  "site.wind.basicWindSpeedMph",
  "site.wind.exposure",
  "site.wind.leastHorizontalDimensionFt",
  "site.wind.meanRoofHeightFt",
] as const;

/** A short line saying what the site data holds, for a collapsed panel's summary. */
export function describeSite(site: Partial<SiteFormValues> | undefined): string {
  if (!site) return "";
  const parts: string[] = [];
  parts.push(ATTIC_LABELS[site.atticType ?? "vented"].replace(/,.*$/, ""));
  if (site.climateZone) parts.push(`zone ${String(site.climateZone).toUpperCase()}`);
  parts.push(`IRC ${site.codeEdition ?? 2021}`);
  const layers = site.existingLayers ?? 1;
  parts.push(`${layers} existing ${layers === 1 ? "layer" : "layers"}${site.tearOff === false ? ", overlay" : ", tear-off"}`);
  if (site.wind?.basicWindSpeedMph) parts.push(`${site.wind.basicWindSpeedMph} mph${site.wind.exposure ? ` exp. ${site.wind.exposure}` : ""}`);
  return parts.join(" · ");
}
