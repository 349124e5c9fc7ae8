import type { Transaction } from "sequelize";
import { computeTakeoff } from "../../shared/engine/takeoff";
import type { JobSite } from "../../shared/schemas/job";
import type { RoofDocument } from "../../shared/schemas/roof";
import { badRequest } from "../errors";
import { rulesForCompany } from "./price-book-rules";

export type StoredTakeoff = Record<string, unknown> & { totals?: { squares?: number } };

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
  const out = computeTakeoff({
    site,
    planes: doc.planes,
    stacks: doc.stacks,
    defaultStackId: doc.defaultStackId,
    rules,
  });
  if (!out.ok) {
    const path = Array.isArray(out.path) ? out.path.map(String).join(".") : "";
    const fields = out.fields && Object.keys(out.fields).length > 0 ? out.fields : { [path || "planes"]: out.reason };
    throw badRequest(out.reason || "The roof cannot be computed", fields as Record<string, string>);
  }
  return out.result as unknown as StoredTakeoff;
}

/** Squares of a takeoff, to the hundredth, for jobs.squares. */
export function takeoffSquares(takeoff: StoredTakeoff): number | null {
  const sq = takeoff.totals?.squares;
  return typeof sq === "number" && Number.isFinite(sq) ? Math.round(sq * 100) / 100 : null;
}
