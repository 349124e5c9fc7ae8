/**
 * Attic ventilation: required net free area, IRC 2021 R806.2.
 * The vented space needs net free area of 1/150 of its area, or 1/300 under the section's exception.
 * Areas are in ft², net free area in in² (1 ft² = 144 in²). Intake and exhaust are each half the
 * required area (common practice; under the exception the code asks for 40–50 % in the upper vents).
 */
import { SQIN_PER_SQFT } from "../constants";

export interface AtticNfaInput {
  ventedAreaSqFt: number;
  /** The user states the R806.2 exception's conditions are met. */
  exception: boolean;
}

export interface AtticNfaResult {
  requiredSqIn: number;
  ratio: 150 | 300;
  intakeRequiredSqIn: number;
  exhaustRequiredSqIn: number;
}

export function requiredAtticNfa({ ventedAreaSqFt, exception }: AtticNfaInput): AtticNfaResult {
  const ratio: 150 | 300 = exception ? 300 : 150;
  const area = Number.isFinite(ventedAreaSqFt) && ventedAreaSqFt > 0 ? ventedAreaSqFt : 0;
  const requiredSqIn = (area * SQIN_PER_SQFT) / ratio;
  return { requiredSqIn, ratio, intakeRequiredSqIn: requiredSqIn / 2, exhaustRequiredSqIn: requiredSqIn / 2 };
}

/** IECC climate zone number from a string like "6A" or "7"; null when it cannot be read. */
export function climateZoneNumber(zone: string | undefined): number | null {
  if (!zone) return null;
  const m = /^\s*([0-8])\s*[ABC]?\s*$/i.exec(zone);
  return m ? Number(m[1]) : null;
}
