/**
 * Thermal resistance of an ENCLOSED plane air space, ASHRAE Handbook—Fundamentals 2021, ch. 26, Table 3.
 *
 * Units. The table values below are the inch-pound values, R in h·ft²·°F/Btu; the SI value
 * (m²·K/W) is the inch-pound value / 5.678. (They cannot be m²·K/W: still air conducts about
 * 0.026 W/(m·K), so a 90 mm layer of still air with no radiation at all would be at most
 * 0.09 / 0.026 ≈ 3.5 m²·K/W, while the table's largest entry is 10.05. Read as h·ft²·°F/Btu,
 * 10.05 is 1.77 m²·K/W, and the table's footnote formula, which is in SI, meets the 13 mm row.)
 *
 * Conditions: heat flow down at 90 °F mean / 10 °F difference (summer), heat flow up at 50 °F mean /
 * 10 °F difference (winter).
 *
 * Interpolation rules:
 * - linear in effective emittance E and in thickness (mm) between the table's rows and columns;
 * - heat flow down: also linear in roof angle between the horizontal (0°) and 45° rows, the angle
 *   clamped to 0..45°;
 * - heat flow up: the horizontal rows at every roof angle;
 * - E is clamped to the table's 0.03..0.82;
 * - thickness above 90 mm is taken as 90 mm (the table stops there; resistance of a thicker space is
 *   not extrapolated because convection, not thickness, governs beyond it), and the result says so
 *   (`clampedThickness`);
 * - thickness below 13 mm: the table footnote's formula R = 1/(h_c + E·h_r) (SI) with
 *   h_c = 21.8 (1 + 0.00274 t_m) / l (l in mm, t_m the mean temperature in °C) and
 *   h_r ≈ 0.227 ((t_m + 273)/100)³, using the given E (0..1, not clamped), marked `extrapolated`.
 */

/** 1 m²·K/W = 5.678 h·ft²·°F/Btu. */
export const IP_PER_SI_R = 5.678;
export const MM_PER_IN = 25.4;

/** Table rows: air-space thickness in mm (0.5, 0.75, 1.5, 3.5 in). */
export const AIR_SPACE_THICKNESS_MM = [13, 20, 40, 90] as const;
/** Table columns: effective emittance. */
export const AIR_SPACE_EMITTANCE = [0.03, 0.05, 0.2, 0.5, 0.82] as const;

type Row = readonly [number, number, number, number, number];
type Block = readonly [Row, Row, Row, Row];

/** ASHRAE 2021 ch. 26 Table 3: horizontal space, heat flow down, 90 °F mean, 10 °F difference (h·ft²·°F/Btu). */
export const TABLE_HORIZONTAL_DOWN: Block = [
  [2.5, 2.33, 1.65, 1.08, 0.79],
  [3.52, 3.29, 2.1, 1.19, 0.85],
  [6.08, 5.34, 2.78, 1.42, 0.97],
  [10.05, 8.18, 3.41, 1.59, 1.02],
];
/** ASHRAE 2021 ch. 26 Table 3: 45° slope, heat flow down, 90 °F mean, 10 °F difference. */
export const TABLE_45_DOWN: Block = [
  [2.5, 2.33, 1.65, 1.08, 0.79],
  [3.52, 3.29, 2.1, 1.19, 0.85],
  [5.05, 4.54, 2.56, 1.36, 0.91],
  [4.83, 4.32, 2.5, 1.36, 0.91],
];
/** ASHRAE 2021 ch. 26 Table 3: horizontal space, heat flow up, 50 °F mean, 10 °F difference. */
export const TABLE_HORIZONTAL_UP: Block = [
  [2.1, 2.04, 1.59, 1.14, 0.85],
  [2.27, 2.21, 1.7, 1.14, 0.85],
  [2.5, 2.38, 1.82, 1.19, 0.91],
  [2.78, 2.67, 1.93, 1.31, 0.91],
];

/** Mean temperatures of the table's conditions, °C: 90 °F (summer, down) and 50 °F (winter, up). */
export const MEAN_TEMP_C = { down: (90 - 32) / 1.8, up: (50 - 32) / 1.8 } as const;

export type HeatFlow = "down" | "up";

export interface AirSpaceInput {
  /** Gap between the two faces, inches. */
  gapIn: number;
  /** Effective emittance of the space (see effectiveEmittance). */
  effectiveEmittance: number;
  heatFlow: HeatFlow;
  /** Roof slope in degrees from horizontal. */
  roofAngleDeg: number;
}

export interface AirSpaceResult {
  /** R in h·ft²·°F/Btu. */
  rIp: number;
  /** R in m²·K/W. */
  rSi: number;
  /** True when the gap is thinner than the table's 13 mm and the footnote formula was used. */
  extrapolated: boolean;
  /** True when the gap is thicker than 90 mm and the 90 mm row was used. */
  clampedThickness: boolean;
  /** True when E was outside 0.03..0.82 and clamped to the table's range (table lookups only). */
  clampedEmittance: boolean;
}

const clamp = (x: number, lo: number, hi: number) => Math.min(Math.max(x, lo), hi);

/** Index i with xs[i] <= x <= xs[i+1] (x already clamped to the range) and the fraction between them. */
function bracket(xs: readonly number[], x: number): [number, number] {
  for (let i = 0; i < xs.length - 1; i++) {
    if (x <= xs[i + 1]) return [i, (x - xs[i]) / (xs[i + 1] - xs[i])];
  }
  return [xs.length - 2, 1];
}

const lerp = (a: number, b: number, f: number) => a + (b - a) * f;

/** Bilinear lookup in one block, thickness (mm) and E already clamped to the table. */
function lookup(block: Block, mm: number, e: number): number {
  const [ri, rf] = bracket(AIR_SPACE_THICKNESS_MM, mm);
  const [ci, cf] = bracket(AIR_SPACE_EMITTANCE, e);
  const at = (r: number) => lerp(block[r][ci], block[r][ci + 1], cf);
  return lerp(at(ri), at(ri + 1), rf);
}

/** ASHRAE 2021 ch. 26 Table 3 footnote: R (SI) of a thin space by conduction plus radiation. */
export function thinAirSpaceRSi(mm: number, e: number, meanTempC: number): number {
  const hc = (21.8 * (1 + 0.00274 * meanTempC)) / mm;
  const hr = 0.227 * ((meanTempC + 273) / 100) ** 3;
  return 1 / (hc + clamp(e, 0, 1) * hr);
}

export function airSpaceResistance(input: AirSpaceInput): AirSpaceResult {
  const { gapIn, heatFlow } = input;
  if (!Number.isFinite(gapIn) || gapIn <= 0) {
    return { rIp: 0, rSi: 0, extrapolated: false, clampedThickness: false, clampedEmittance: false };
  }
  const mm = gapIn * MM_PER_IN;
  const eRaw = Number.isFinite(input.effectiveEmittance) ? input.effectiveEmittance : 0.82;
  const minMm = AIR_SPACE_THICKNESS_MM[0];
  const maxMm = AIR_SPACE_THICKNESS_MM[AIR_SPACE_THICKNESS_MM.length - 1];

  // A hair of tolerance so that 13 mm given in inches (0.5118 in) reads as the table row, not the formula.
  if (mm < minMm - 1e-9) {
    const rSi = thinAirSpaceRSi(mm, eRaw, MEAN_TEMP_C[heatFlow]);
    return { rIp: rSi * IP_PER_SI_R, rSi, extrapolated: true, clampedThickness: false, clampedEmittance: false };
  }

  const e = clamp(eRaw, AIR_SPACE_EMITTANCE[0], AIR_SPACE_EMITTANCE[AIR_SPACE_EMITTANCE.length - 1]);
  const t = Math.min(Math.max(mm, minMm), maxMm);
  let rIp: number;
  if (heatFlow === "up") {
    rIp = lookup(TABLE_HORIZONTAL_UP, t, e);
  } else {
    const angle = clamp(Number.isFinite(input.roofAngleDeg) ? input.roofAngleDeg : 0, 0, 45);
    rIp = lerp(lookup(TABLE_HORIZONTAL_DOWN, t, e), lookup(TABLE_45_DOWN, t, e), angle / 45);
  }
  return {
    rIp,
    rSi: rIp / IP_PER_SI_R,
    extrapolated: false,
    clampedThickness: mm > maxMm + 1e-9,
    clampedEmittance: e !== eRaw,
  };
}
