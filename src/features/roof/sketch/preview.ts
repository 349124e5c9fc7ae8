/**
 * The live engine preview for the sketch: the job's site (GET /api/jobs/:id) and the price book's rules
 * (GET /api/price-book/rules, owners and estimators) feed `computeTakeoff` in the browser. The preview is
 * computed from a deferred copy of the document so drawing stays responsive; the saved and printed
 * numbers come from the server.
 */
import { useDeferredValue, useMemo } from "react";
import { useQuery } from "@tanstack/react-query";
import type { JobDto } from "@shared/schemas/job";
import type { Rules } from "@shared/schemas/takeoff";
import { computeTakeoff } from "@shared/engine/takeoff";
import type { TakeoffOutcome } from "@shared/engine/types";
import { jobQueries } from "@/lib/queries/jobs";
import { priceBookQueries } from "@/lib/queries/price-book";
import type { RoofDoc } from "@/features/roof/api/roof-draft";
import { withDefaultStack } from "./edits";

/** The job and the price book's rules: the app's shared queries, so the caches are shared. */
export const sketchQueries = {
  /** The shared job query (its key, so the Site section's saves reach the preview). */
  job: (jobId: number) => jobQueries.detail(jobId),
  rules: () => priceBookQueries.rules(),
};

export type Preview = TakeoffOutcome | { ok: false; empty: true; reason: string; path: (string | number)[] };

/** Runs the engine on the document; never throws (an unexpected error becomes a refusal). */
export function computePreview(doc: RoofDoc, site: JobDto["site"] | undefined, rules: Rules | undefined): Preview {
  if (doc.planes.length === 0) return { ok: false, empty: true, reason: "Draw a roof plane to see the totals.", path: [] };
  const d = withDefaultStack(doc);
  try {
    return computeTakeoff({ site: site ?? {}, planes: d.planes, stacks: d.stacks, defaultStackId: d.defaultStackId, ...(rules ? { rules } : {}) });
  } catch (e) {
    return { ok: false, reason: `The preview could not compute this roof (${e instanceof Error ? e.message : "unknown error"}).`, path: [] };
  }
}

/** The deferred preview plus whether it lags behind the document. */
export function useTakeoffPreview(jobId: number, doc: RoofDoc | undefined, canReadRules: boolean) {
  const job = useQuery(sketchQueries.job(jobId));
  const rules = useQuery({ ...sketchQueries.rules(), enabled: canReadRules });
  const deferredDoc = useDeferredValue(doc);
  const site = job.data?.site;
  const ruleData = canReadRules ? rules.data : undefined;
  const preview = useMemo(() => (deferredDoc ? computePreview(deferredDoc, site, ruleData) : null), [deferredDoc, site, ruleData]);
  const refusedIndex = refusedPlaneIndex(preview);
  return {
    preview,
    refusedPlaneId: refusedIndex !== null ? (deferredDoc?.planes[refusedIndex]?.id ?? null) : null,
    pending: deferredDoc !== doc,
    siteLoaded: Boolean(job.data),
    rulesLoaded: !canReadRules || Boolean(rules.data),
    siteError: job.isError,
    rulesError: canReadRules && rules.isError,
  };
}

/** The index of the plane a refusal points at (`planes.3.outline` → 3), if any. */
export function refusedPlaneIndex(preview: Preview | null): number | null {
  if (!preview || preview.ok) return null;
  const [head, idx] = preview.path;
  return head === "planes" && typeof idx === "number" ? idx : head === "planes" && typeof idx === "string" && /^\d+$/.test(idx) ? Number(idx) : null;
}
