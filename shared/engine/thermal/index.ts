/**
 * Thermal side of a roof assembly: the gap between deck and panels, its effective emittance and
 * enclosed-air-space resistance for summer (heat flow down) and winter (heat flow up), the finish's
 * Solar Reflectance Index, the cool-roof check and a dew-point caution for humid climates.
 *
 * R values are in h·ft²·°F/Btu (the trade's R-value); the `...Si` fields carry m²·K/W.
 */
import { advisory, type Advisory } from "../advisory";
import { BUILDING_MATERIAL_EMITTANCE, effectiveEmittance } from "./emittance";
import { airSpaceResistance } from "./air-space";
import { agedReflectance, coolRoofCheck, solarReflectanceIndex, type CoolRoofResult } from "./sri";
import { cToF, dewPointF } from "./dew-point";

export * from "./emittance";
export * from "./air-space";
export * from "./sri";
export * from "./dew-point";

export type FoilPosition = "on-deck" | "under-panels";
export type FoilFace = "up" | "down";

/**
 * Does a foil layer face the air gap? Foil on the deck facing up, or foil under the panels facing down,
 * faces the gap, and only when there is a gap. A radiant barrier works only facing an air space
 * (ASTM C1158; DOE radiant barrier fact sheet).
 */
export function foilFacesGap(position: FoilPosition, reflectiveFace: FoilFace, gapIn: number): boolean {
  if (!(gapIn > 0)) return false;
  return (position === "on-deck" && reflectiveFace === "up") || (position === "under-panels" && reflectiveFace === "down");
}

export interface ThermalInput {
  /** Deck-to-panel gap, inches (0 when the panels lie on the underlayment). */
  gapIn: number;
  /** True when the gap is open at eave and top (a ventilated channel, not an enclosed air space). */
  gapVentilated: boolean;
  /** Roof pitch, rise per 12 of run. */
  pitch: number;
  /** The radiant barrier, if any. `position` says which face it replaces (default "on-deck"). */
  foil: null | { emittance: number; facesGap: boolean; position?: FoilPosition };
  panelUndersideEmittance: number;
  /** Emittance of the deck face (underlayment), default 0.90. */
  deckEmittance?: number;
  solarReflectance: number;
  thermalEmittance: number;
  /** True when `solarReflectance` is the aged value. */
  agedReflectanceKnown?: boolean;
  climateZone?: string;
  coolRoofRequired?: boolean;
  planeIds?: string[];
}

export interface DewPointCheck {
  designTempF: number;
  rhPct: number;
  dewPointF: number;
  /** Design air temperature less the night-sky undercooling. */
  panelNightTempF: number;
  undercoolingF: number;
  /** True when the panel's night temperature is at or below the dew point. */
  condensationPossible: boolean;
  note: string;
}

export interface ThermalResult {
  gapIn: number;
  ventilated: boolean;
  /** Effective emittance of the gap; null with no gap. */
  effectiveEmittance: number | null;
  /** Enclosed air-space R, heat flow down (summer), h·ft²·°F/Btu; null with no gap or a ventilated gap. */
  airSpaceRSummer: number | null;
  /** Enclosed air-space R, heat flow up (winter), h·ft²·°F/Btu; null with no gap or a ventilated gap. */
  airSpaceRWinter: number | null;
  airSpaceRSummerSi: number | null;
  airSpaceRWinterSi: number | null;
  /** True when the gap is below the table's 13 mm and the footnote formula was used. */
  rExtrapolated: boolean;
  rNote: string;
  /** Roof angle from horizontal, degrees. */
  roofAngleDeg: number;
  /** SRI of the finish as given (initial), medium wind. */
  sri: number;
  agedSolarReflectance: number;
  /** Cool-roof check; null unless cool roofing is asked for. */
  coolRoof: CoolRoofResult | null;
  /** Dew-point caution; null outside humid climate zones. */
  dewPoint: DewPointCheck | null;
}

/** Design condition for the condensation caution (common practice, no published source). */
export const CONDENSATION_DESIGN = { tempF: 80, rhPct: 80, undercoolingF: 15 } as const;

/**
 * IECC climate zone string ("3A", "4C", "7") → zone number and moisture regime letter (A humid, B dry,
 * C marine), or null when it cannot be read.
 */
export function parseClimateZone(zone: string | undefined): { zone: number; moisture: "A" | "B" | "C" | null } | null {
  if (!zone) return null;
  const m = /^\s*([0-8])\s*([ABC])?\s*$/i.exec(zone);
  if (!m) return null;
  return { zone: Number(m[1]), moisture: m[2] ? (m[2].toUpperCase() as "A" | "B" | "C") : null };
}

/** Humid for the condensation caution: IECC moisture regime A in zones 0–4 (IECC Figure C301.1 / R301.1). */
export function isHumidClimateZone(zone: string | undefined): boolean {
  const z = parseClimateZone(zone);
  return !!z && z.moisture === "A" && z.zone <= 4;
}

export function computeThermal(input: ThermalInput): { result: ThermalResult; advisories: Advisory[] } {
  const planeIds = input.planeIds ?? [];
  const advisories: Advisory[] = [];
  const gapIn = Number.isFinite(input.gapIn) && input.gapIn > 0 ? input.gapIn : 0;
  const roofAngleDeg = (Math.atan(Math.max(0, input.pitch) / 12) * 180) / Math.PI;

  // Faces that bound the gap: the deck (underlayment) and the panel underside. A foil that faces the gap
  // replaces the emittance of the face it sits on; a foil facing nothing gives no radiant credit.
  let deckFace = input.deckEmittance ?? BUILDING_MATERIAL_EMITTANCE;
  let panelFace = input.panelUndersideEmittance;
  if (input.foil && input.foil.facesGap && gapIn > 0) {
    if ((input.foil.position ?? "on-deck") === "on-deck") deckFace = input.foil.emittance;
    else panelFace = input.foil.emittance;
  }
  const e = gapIn > 0 ? effectiveEmittance(deckFace, panelFace) : null;

  let airSpaceRSummer: number | null = null;
  let airSpaceRWinter: number | null = null;
  let airSpaceRSummerSi: number | null = null;
  let airSpaceRWinterSi: number | null = null;
  let rExtrapolated = false;
  let rNote: string;
  if (gapIn === 0 || e === null) {
    rNote = "No air space: the panels lie on the underlayment, so there is no air-space resistance to count.";
  } else if (input.gapVentilated) {
    rNote =
      "The gap is open at the eave and the top, so air moves through it: it is a ventilated channel, not an " +
      "enclosed air space, and the handbook's enclosed air-space resistance does not apply. Its benefit is the " +
      "heat the moving air carries away, not an R-value.";
  } else {
    const summer = airSpaceResistance({ gapIn, effectiveEmittance: e, heatFlow: "down", roofAngleDeg });
    const winter = airSpaceResistance({ gapIn, effectiveEmittance: e, heatFlow: "up", roofAngleDeg });
    airSpaceRSummer = summer.rIp;
    airSpaceRWinter = winter.rIp;
    airSpaceRSummerSi = summer.rSi;
    airSpaceRWinterSi = winter.rSi;
    rExtrapolated = summer.extrapolated || winter.extrapolated;
    const parts = [
      "Enclosed air space, ASHRAE Handbook—Fundamentals 2021 ch. 26 Table 3: summer at 90 °F mean (heat flowing down), " +
        "winter at 50 °F mean (heat flowing up), interpolated in emittance, thickness and roof angle.",
    ];
    if (rExtrapolated) parts.push("The gap is thinner than the table's 1/2 in, so the value comes from the table's footnote formula (extrapolated).");
    if (summer.clampedThickness) parts.push("The gap is thicker than the table's 3-1/2 in; the 3-1/2 in values are used.");
    if (summer.clampedEmittance) parts.push("The effective emittance is outside the table's 0.03–0.82 and was held at the nearest column.");
    rNote = parts.join(" ");
  }

  const sri = solarReflectanceIndex(input.solarReflectance, input.thermalEmittance);
  const agedSolarReflectance = input.agedReflectanceKnown ? input.solarReflectance : agedReflectance(input.solarReflectance);

  let coolRoof: CoolRoofResult | null = null;
  if (input.coolRoofRequired) {
    coolRoof = coolRoofCheck({
      solarReflectance: input.solarReflectance,
      thermalEmittance: input.thermalEmittance,
      agedKnown: input.agedReflectanceKnown,
    });
    if (!coolRoof.meets) {
      const misses: string[] = [];
      if (!coolRoof.title24SteepSlope) {
        misses.push(
          `California Title 24 steep-slope level (aged solar reflectance at least 0.20 with thermal emittance at least 0.75, ` +
            `or SRI at least 16): this finish has aged reflectance ${coolRoof.agedSolarReflectance.toFixed(2)}` +
            `${coolRoof.agedEstimated ? " (estimated from the initial value)" : ""}, emittance ${input.thermalEmittance.toFixed(2)}, aged SRI ${Math.round(coolRoof.agedSri)}`,
        );
      }
      if (coolRoof.energyStarSteepSlope === false) {
        misses.push(`former ENERGY STAR steep-slope level (initial solar reflectance at least 0.25): this finish has ${input.solarReflectance.toFixed(2)}`);
      }
      advisories.push(
        advisory(
          "cool-roof-not-met",
          "warning",
          `Cool roofing was asked for, but the panel finish falls short of the ${misses.join("; and the ")}. ` +
            "Choose a lighter or more reflective rated finish, and confirm what the local code or program actually requires.",
          "California Title 24 Part 6 steep-slope cool roof (aged SR 0.20 / TE 0.75 or SRI 16); former ENERGY STAR roof products steep-slope (initial SR 0.25); ASTM E1980-11",
          planeIds,
        ),
      );
    }
  }

  let dewPoint: DewPointCheck | null = null;
  if (isHumidClimateZone(input.climateZone)) {
    const { tempF, rhPct, undercoolingF } = CONDENSATION_DESIGN;
    const dp = dewPointF(tempF, rhPct);
    const panelNightTempF = tempF - undercoolingF;
    dewPoint = {
      designTempF: tempF,
      rhPct,
      dewPointF: dp,
      panelNightTempF,
      undercoolingF,
      condensationPossible: panelNightTempF <= dp,
      note:
        `Design condition ${tempF} °F at ${rhPct} % relative humidity (common practice): dew point ${dp.toFixed(1)} °F ` +
        `(Magnus formula, Alduchov & Eskridge 1996). On clear nights panels can fall 10–20 °F below the air ` +
        `(metal construction industry education material); at ${undercoolingF} °F below, the panel is at ${panelNightTempF} °F.`,
    };
    if (dewPoint.condensationPossible) {
      advisories.push(
        advisory(
          "condensation-risk",
          "info",
          `In a humid climate (zone ${input.climateZone!.trim().toUpperCase()}) the underside of the panels can cool below the dew point on clear nights ` +
            `(about ${panelNightTempF} °F against a dew point of ${dp.toFixed(1)} °F on an ${tempF} °F, ${rhPct} % humidity night), so water can form under the metal. ` +
            "Give that water a way out: an underlayment that drains to the eave and a gap that lets the underside dry. Follow the panel maker's details.",
          "Dew point: Alduchov & Eskridge 1996 (Magnus formula); night-sky undercooling of 10–20 °F: metal construction industry education material; design condition 80 °F / 80 % RH with 15 °F undercooling: common practice",
          planeIds,
        ),
      );
    }
  }

  return {
    result: {
      gapIn,
      ventilated: gapIn > 0 && input.gapVentilated,
      effectiveEmittance: e,
      airSpaceRSummer,
      airSpaceRWinter,
      airSpaceRSummerSi,
      airSpaceRWinterSi,
      rExtrapolated,
      rNote,
      roofAngleDeg,
      sri,
      agedSolarReflectance,
      coolRoof,
      dewPoint,
    },
    advisories,
  };
}
