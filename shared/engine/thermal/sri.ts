/**
 * Solar Reflectance Index, ASTM E1980-11.
 *
 * The steady-state surface temperature Ts solves
 *   α·I = ε·σ·(Ts⁴ − Tsky⁴) + hc·(Ts − Ta)
 * with α = 1 − solar reflectance, I = 1000 W/m², Ta = 310 K, Tsky = 300 K, σ = 5.66961e-8 W/(m²·K⁴),
 * hc = 12 W/(m²·K) for medium wind (5 low, 30 high). Then
 *   SRI = 100 (Tb − Ts) / (Tb − Tw)
 * with the standard black (reflectance 0.05, emittance 0.90, SRI 0) and white (0.80, 0.90, SRI 100).
 * Solved by Newton's method (the left side is increasing and convex in Ts, so it converges from above).
 */
export const SOLAR_FLUX = 1000;
export const AMBIENT_K = 310;
export const SKY_K = 300;
export const STEFAN_BOLTZMANN = 5.66961e-8;
export const HC_LOW = 5;
export const HC_MEDIUM = 12;
export const HC_HIGH = 30;
export const STANDARD_BLACK = { reflectance: 0.05, emittance: 0.9 } as const;
export const STANDARD_WHITE = { reflectance: 0.8, emittance: 0.9 } as const;

/** Steady-state surface temperature (K) of a surface in the E1980 conditions. */
export function surfaceTemperatureK(reflectance: number, emittance: number, hc: number = HC_MEDIUM): number {
  if (!Number.isFinite(reflectance) || !Number.isFinite(emittance) || !Number.isFinite(hc)) throw new RangeError("SRI inputs must be finite");
  const alpha = 1 - Math.min(Math.max(reflectance, 0), 1);
  const eps = Math.min(Math.max(emittance, 0), 1);
  const f = (t: number) => eps * STEFAN_BOLTZMANN * (t ** 4 - SKY_K ** 4) + hc * (t - AMBIENT_K) - alpha * SOLAR_FLUX;
  const df = (t: number) => 4 * eps * STEFAN_BOLTZMANN * t ** 3 + hc;
  // Start above the root: with no emission the surface would reach Ta + αI/hc.
  let t = AMBIENT_K + (alpha * SOLAR_FLUX) / Math.max(hc, 1e-6) + 1;
  for (let i = 0; i < 100; i++) {
    const step = f(t) / df(t);
    t -= step;
    if (Math.abs(step) < 1e-10) break;
  }
  return t;
}

/**
 * The standard black's and white's temperatures depend on the wind coefficient alone: each solve is kept for
 * its hc (a handful of values in practice: low, medium and high wind), so an SRI costs one solve, not three.
 */
const standardTemps = new Map<number, { tb: number; tw: number }>();
function standardTemperaturesK(hc: number): { tb: number; tw: number } {
  let t = standardTemps.get(hc);
  if (!t) {
    t = {
      tb: surfaceTemperatureK(STANDARD_BLACK.reflectance, STANDARD_BLACK.emittance, hc),
      tw: surfaceTemperatureK(STANDARD_WHITE.reflectance, STANDARD_WHITE.emittance, hc),
    };
    // Bounded: an odd caller passing many coefficients cannot grow it without limit.
    if (standardTemps.size >= 16) standardTemps.clear();
    standardTemps.set(hc, t);
  }
  return t;
}

/** Solar Reflectance Index (dimensionless; can be below 0 or above 100). */
export function solarReflectanceIndex(reflectance: number, emittance: number, hc: number = HC_MEDIUM): number {
  // The input checks come first, as they did when the standards were solved on every call.
  const ts = surfaceTemperatureK(reflectance, emittance, hc);
  const { tb, tw } = standardTemperaturesK(hc);
  return (100 * (tb - ts)) / (tb - tw);
}

/** California Title 24 estimate of aged solar reflectance from the initial value: 0.2 + 0.7 (ρ − 0.2). */
export function agedReflectance(initial: number): number {
  return 0.2 + 0.7 * (initial - 0.2);
}

/** Title 24 steep-slope cool roof: aged SR ≥ 0.20 with TE ≥ 0.75, or aged SRI ≥ 16. */
export const TITLE24_STEEP = { agedReflectance: 0.2, emittance: 0.75, sri: 16 } as const;
/** Former ENERGY STAR steep-slope level: initial SR ≥ 0.25. */
export const ENERGY_STAR_STEEP = { initialReflectance: 0.25 } as const;

export interface CoolRoofInput {
  solarReflectance: number;
  thermalEmittance: number;
  /** True when `solarReflectance` is already the aged (3-year) value; else it is initial and aged is estimated. */
  agedKnown?: boolean;
}

export interface CoolRoofResult {
  agedSolarReflectance: number;
  /** True when the aged value was estimated from the initial one (Title 24 estimate). */
  agedEstimated: boolean;
  /** SRI from the aged reflectance at medium wind (what Title 24 checks). */
  agedSri: number;
  /** Title 24 steep-slope requirement met. */
  title24SteepSlope: boolean;
  /**
   * Former ENERGY STAR steep-slope initial SR ≥ 0.25. null when only the aged value is known and it is below
   * 0.25 (the initial value is unknown; aged is never above initial, so an aged value ≥ 0.25 passes).
   */
  energyStarSteepSlope: boolean | null;
  /** Both checks met (an unknown ENERGY STAR result counts as met). */
  meets: boolean;
}

export function coolRoofCheck(input: CoolRoofInput): CoolRoofResult {
  const { solarReflectance: sr, thermalEmittance: te } = input;
  const agedKnown = input.agedKnown === true;
  const aged = agedKnown ? sr : agedReflectance(sr);
  const agedSri = solarReflectanceIndex(aged, te);
  const title24 = (aged >= TITLE24_STEEP.agedReflectance && te >= TITLE24_STEEP.emittance) || agedSri >= TITLE24_STEEP.sri;
  let energyStar: boolean | null;
  if (!agedKnown) energyStar = sr >= ENERGY_STAR_STEEP.initialReflectance;
  else energyStar = aged >= ENERGY_STAR_STEEP.initialReflectance ? true : null;
  return {
    agedSolarReflectance: aged,
    agedEstimated: !agedKnown,
    agedSri,
    title24SteepSlope: title24,
    energyStarSteepSlope: energyStar,
    meets: title24 && energyStar !== false,
  };
}
