import type { RoofDocument, RoofDto } from "../../shared/schemas/roof";
import type { Roof } from "../models/index";
import { parseJsonColumn } from "./job.presenter";

/** GET /api/jobs/:id/roof for a job whose roof was never saved: version 0, nothing drawn yet. */
export const EMPTY_ROOF: RoofDto = { planes: [], stacks: [], defaultStackId: "", version: 0 };

export function presentRoofDocument(doc: RoofDocument, version: number): RoofDto {
  return {
    planes: doc.planes,
    stacks: doc.stacks,
    defaultStackId: doc.defaultStackId,
    version,
    ...(doc.underlay ? { underlay: doc.underlay } : {}),
  };
}

export function presentRoof(roof: Roof | null): RoofDto {
  if (!roof) return EMPTY_ROOF;
  return presentRoofDocument(parseJsonColumn<RoofDocument>(roof.document), roof.version);
}
