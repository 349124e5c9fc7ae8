/**
 * Ice barrier at the eaves, IRC R905.1.2: from the lowest edges of the roof to a point at least 24 in
 * inside the exterior wall line; the 2015–2021 editions also ask for at least 36 in along the slope on
 * pitches of 8:12 and steeper (dropped in 2024). Width along the slope:
 *   max((eave overhang + 24 in) × k, 36 in when p ≥ 8 and the edition is 2015–2021).
 * Courses of 36 in membrane = 1 + ceil((width − 36) / (36 − side lap)).
 * R905.1.2 lists asphalt shingles, metal roof shingles, roll roofing, slate and wood, not metal panels:
 * for panels the ice barrier follows local amendments and practice.
 */
import { slopeFactor } from "../roof/slope";
import { ceilTol } from "../format";

/** `k` is the pitch's slope factor; a caller that has it (a plane's geometry) passes it to skip the square root. */
export function iceBarrierWidthIn(eaveOverhangIn: number, pitch: number, codeEdition: number, insideWallIn = 24, k = slopeFactor(pitch)): number {
  const along = (eaveOverhangIn + insideWallIn) * k;
  const steepMin = pitch >= 8 && codeEdition >= 2015 && codeEdition <= 2021 ? 36 : 0;
  return Math.max(along, steepMin);
}

export function iceBarrierCourses(widthIn: number, rollWidthIn = 36, sideLapIn = 3.5): number {
  if (!(widthIn > 0)) return 0;
  return Math.max(1, 1 + ceilTol((widthIn - rollWidthIn) / (rollWidthIn - sideLapIn)));
}
