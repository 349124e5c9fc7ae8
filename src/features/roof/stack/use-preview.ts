/**
 * The engine's takeoff for the draft, computed in the browser while editing (the saved numbers come
 * from the server). Deferred, so typing stays quick on a large roof.
 */
import { useDeferredValue, useMemo } from "react";
import { computeTakeoff } from "@shared/engine/takeoff";
import type { TakeoffOutcome } from "@shared/engine/types";
import type { JobSite } from "@shared/schemas/job";
import type { Rules } from "@shared/schemas/takeoff";
import type { RoofDoc } from "../api/roof-draft";

export function useTakeoffPreview(doc: RoofDoc | undefined, site: JobSite | undefined, rules: Rules | undefined): TakeoffOutcome | null {
  const deferred = useDeferredValue(doc);
  return useMemo(() => {
    if (!deferred || !deferred.planes.length || !deferred.stacks.length) return null;
    return computeTakeoff({
      site: site ?? {},
      planes: deferred.planes,
      stacks: deferred.stacks,
      defaultStackId: deferred.defaultStackId,
      ...(rules ? { rules } : {}),
    });
  }, [deferred, site, rules]);
}
