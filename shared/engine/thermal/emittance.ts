/**
 * Effective emittance of an air space bounded by two parallel surfaces.
 *
 *   1/E = 1/e1 + 1/e2 − 1
 *
 * ASHRAE Handbook—Fundamentals 2021, ch. 26, note to Table 3 (plane air spaces).
 */

/** Bright aluminium foil (ASHRAE Handbook—Fundamentals 2021, ch. 26, Table 2). */
export const FOIL_EMITTANCE = 0.05;
/** Ordinary building materials, wood, paper, painted metal (ASHRAE 2021 ch. 26, Table 2). */
export const BUILDING_MATERIAL_EMITTANCE = 0.9;
/** A radiant barrier has a surface emittance of 0.1 or less (ASTM C1313). */
export const RADIANT_BARRIER_MAX_EMITTANCE = 0.1;

/**
 * Effective emittance E of the space between two faces of emittance e1 and e2 (each in (0, 1]).
 * Returns 0 if either face has emittance 0 (a perfect reflector passes no radiation).
 */
export function effectiveEmittance(e1: number, e2: number): number {
  if (!Number.isFinite(e1) || !Number.isFinite(e2)) throw new RangeError("emittance must be a finite number");
  const a = Math.min(Math.max(e1, 0), 1);
  const b = Math.min(Math.max(e2, 0), 1);
  if (a === 0 || b === 0) return 0;
  return 1 / (1 / a + 1 / b - 1);
}
