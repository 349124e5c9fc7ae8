import type { Transaction } from "sequelize";
import { z } from "zod";
import { computeTakeoff, computeTakeoffParsed, refusalFromZod, type TakeoffOutcome } from "../../shared/engine/takeoff";
import type { JobSite } from "../../shared/schemas/job";
import type { RoofDocument } from "../../shared/schemas/roof";
import { rulesSchema, siteInputSchema } from "../../shared/schemas/takeoff";
import { badRequest } from "../errors";
import { rulesForCompany } from "./price-book-rules";

export type StoredTakeoff = Record<string, unknown> & { totals?: { squares?: number } };

/** The engine's answer as the stored takeoff, or its refusal as a 400 with the engine's field path. */
function storedOrRefused(out: TakeoffOutcome): StoredTakeoff {
  if (!out.ok) {
    const path = Array.isArray(out.path) ? out.path.map(String).join(".") : "";
    const fields = out.fields && Object.keys(out.fields).length > 0 ? out.fields : { [path || "planes"]: out.reason };
    throw badRequest(out.reason || "The roof cannot be computed", fields as Record<string, string>);
  }
  return out.result as unknown as StoredTakeoff;
}

/**
 * The takeoff of a stored roof: the engine's result for the roof document, the job's site and the
 * company's price-book rules. The same function serves every save, so the stored takeoff is always
 * what the engine gives for what is stored. Engine refusals become a 400 with the engine's field path.
 */
export async function computeStoredTakeoff(
  doc: RoofDocument,
  site: JobSite,
  companyId: number,
  transaction?: Transaction,
): Promise<StoredTakeoff> {
  const rules = await rulesForCompany(companyId, transaction);
  return storedOrRefused(
    computeTakeoff({
      site,
      planes: doc.planes,
      stacks: doc.stacks,
      defaultStackId: doc.defaultStackId,
      rules,
    }),
  );
}

/** The two parts of the engine's input a parsed roof document does not carry. */
const siteAndRulesSchema = z.object({ site: siteInputSchema, rules: rulesSchema });

/**
 * `computeStoredTakeoff` for a roof document `roofSaveSchema` has already parsed and cross-checked (the roof
 * save), with the company's rules already read: only the job's site and the rules are parsed here; the
 * planes and stacks go to the engine as they are, so they are not parsed a third time and each plane's
 * geometry, worked out by the schema's checks, is reused. Same result and same refusals as
 * `computeStoredTakeoff` (the site's and the rules' issues, in that order, with their paths).
 */
export function computeStoredTakeoffOfParsed(doc: RoofDocument, site: unknown, rules: Record<string, unknown>): StoredTakeoff {
  const parsed = siteAndRulesSchema.safeParse({ site, rules });
  if (!parsed.success) return storedOrRefused(refusalFromZod(parsed.error));
  return storedOrRefused(
    computeTakeoffParsed({
      site: parsed.data.site,
      planes: doc.planes,
      stacks: doc.stacks,
      defaultStackId: doc.defaultStackId,
      rules: parsed.data.rules,
    }),
  );
}

/** Squares of a takeoff, to the hundredth, for jobs.squares. */
export function takeoffSquares(takeoff: StoredTakeoff): number | null {
  const sq = takeoff.totals?.squares;
  return typeof sq === "number" && Number.isFinite(sq) ? Math.round(sq * 100) / 100 : null;
}
