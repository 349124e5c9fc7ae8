import type { ReactNode } from "react";
import type { JobDto } from "@shared/schemas/job";
import { ATTIC_LABELS, DEFAULT_SITE } from "@/features/jobs/components/site-data-fields";
import { DASH, fullSite } from "@/lib/format";

const yesNo = (v: boolean | undefined, unknown = "Not stated") => (v === undefined ? unknown : v ? "Yes" : "No");
const num = (v: number | undefined, unit: string) => (v === undefined ? DASH : `${v} ${unit}`);

function Item({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="flex justify-between gap-3 border-b border-steel-100 py-1.5 last:border-0 sm:block sm:border-0 sm:py-0">
      <dt className="text-xs text-steel-500">{label}</dt>
      <dd className="text-sm font-medium text-steel-900">{children}</dd>
    </div>
  );
}

/** The Site section for crew: the address, the site data and the notes, to read on site. */
export function SiteReadOnly({ job }: { job: JobDto }) {
  const s = { ...DEFAULT_SITE, ...job.site, wind: { ...DEFAULT_SITE.wind, ...job.site?.wind } };
  const address = fullSite(job);
  return (
    <div className="space-y-5">
      <section aria-labelledby="ro-address" className="space-y-1">
        <h2 id="ro-address" className="text-sm font-semibold text-steel-900">
          Site
        </h2>
        <p className="text-sm text-steel-800">{address || <span className="text-steel-500">No address recorded</span>}</p>
      </section>
      <section aria-labelledby="ro-data" className="space-y-2">
        <h3 id="ro-data" className="text-xs font-semibold uppercase tracking-wide text-steel-500">
          Site data
        </h3>
        <dl className="grid gap-x-6 gap-y-3 sm:grid-cols-3 lg:grid-cols-4">
          <Item label="Attic">{ATTIC_LABELS[s.atticType]}</Item>
          <Item label="Attic floor area">{num(s.atticFloorAreaSqFt, "sq ft")}</Item>
          <Item label="Climate zone">{s.climateZone ?? DASH}</Item>
          <Item label="Ice-dam risk">{yesNo(s.iceDamRisk, "Unknown")}</Item>
          <Item label="Code edition">IRC {s.codeEdition}</Item>
          <Item label="Cool roof required">{yesNo(s.coolRoofRequired)}</Item>
          <Item label="Existing layers">{s.existingLayers}</Item>
          <Item label="Tear-off">{s.tearOff ? "Tear off to the deck" : "Overlay"}</Item>
          <Item label="Basic wind speed">{num(s.wind.basicWindSpeedMph, "mph")}</Item>
          <Item label="Exposure">{s.wind.exposure ?? DASH}</Item>
          <Item label="Mean roof height">{num(s.wind.meanRoofHeightFt, "ft")}</Item>
          <Item label="Rated assembly required">{yesNo(s.wind.ratedAssemblyRequired)}</Item>
        </dl>
      </section>
      <section aria-labelledby="ro-notes" className="space-y-1">
        <h3 id="ro-notes" className="text-xs font-semibold uppercase tracking-wide text-steel-500">
          Notes
        </h3>
        <p className="whitespace-pre-wrap text-sm text-steel-800">{job.notes || <span className="text-steel-500">No notes</span>}</p>
      </section>
    </div>
  );
}
