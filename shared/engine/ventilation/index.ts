/**
 * Ventilation of the space under the roof and of the above-deck channel.
 *
 * - Vented attic: required net free area from IRC 2021 R806.2 (1/150, 1/300 under the exception), half
 *   at the intake (eave) and half at the exhaust (ridge) (common practice).
 * - Cathedral (vaulted) ceiling: the rafter spaces are still vented space under R806 with at least 1 in of
 *   air space between insulation and sheathing (R806.3); treated like a vented attic over its area.
 * - Unvented attic (IRC R806.5): no net free area is required.
 * Provided exhaust = (ridge LF − 1 ft at each end of each ridge segment, floor 0, plus hips and headwalls only
 * when the stack marks them vented) × the exhaust product's NFA per foot; provided intake = eave LF × the
 * intake product's NFA per foot (common practice).
 * The above-deck channel never counts toward the attic's net free area.
 */
import { advisory, type Advisory } from "../advisory";
import { requiredAtticNfa, climateZoneNumber } from "./attic";
import type { ChannelResult } from "./channel";

export * from "./attic";
export * from "./channel";

export type AtticType = "vented" | "unvented" | "cathedral";

export interface VentilationInput {
  site: {
    atticType: AtticType;
    atticFloorAreaSqFt?: number;
    ventException?: boolean;
    codeEdition?: string;
    climateZone?: string;
    vaporRetarder?: boolean;
  };
  roofPlanAreaSqFt: number;
  ridgeLf: number;
  /** Number of separate ridge lines (each loses 1 ft of vent at each end). */
  ridgeSegments: number;
  hipLf: number;
  headwallLf: number;
  eaveLf: number;
  intakeNfaPerFtSqIn: number;
  exhaustNfaPerFtSqIn: number;
  ventHips?: boolean;
  ventHeadwalls?: boolean;
  /** The assembly claims above-deck ventilation (the channel must qualify). */
  aboveDeckClaimed: boolean;
  channel: ChannelResult;
  planeIds?: string[];
}

export interface VentilationResult {
  mode: "attic" | "unvented" | "cathedral";
  ventedAreaSqFt: number;
  /** True when the vented area is the roof's plan area because the attic floor area was not given. */
  ventedAreaEstimated: boolean;
  /** 150 or 300; null for an unvented attic. */
  ratio: 150 | 300 | null;
  requiredNfaSqIn: number;
  intakeRequiredSqIn: number;
  exhaustRequiredSqIn: number;
  intakeProvidedSqIn: number;
  exhaustProvidedSqIn: number;
  exhaustLf: number;
  intakeLf: number;
  /** Intake provided is at least the exhaust provided. */
  balanced: boolean;
  codeEdition: string;
  aboveDeck: Pick<ChannelResult, "gapIn" | "continuous" | "qualifies" | "channelNfaPerFtSqIn" | "channelHeightIn" | "reasons">;
}

/** Ridge vent stops 1 ft short of each end of a ridge (common practice). */
export const RIDGE_END_ALLOWANCE_FT = 1;
/** Under the R806.2 exception, 40–50 % of the required area in the upper vents. */
export const EXCEPTION_EXHAUST_SHARE = { min: 0.4, max: 0.5 } as const;

const nn = (x: number | undefined) => (x !== undefined && Number.isFinite(x) && x > 0 ? x : 0);
const sqin = (x: number) => `${Math.round(x)} sq in`;
const EPS = 1e-6;

export function computeVentilation(input: VentilationInput): { result: VentilationResult; advisories: Advisory[] } {
  const planeIds = input.planeIds ?? [];
  const { site, channel } = input;
  const advisories: Advisory[] = [];
  const codeEdition = site.codeEdition ?? "2021";
  const mode: VentilationResult["mode"] = site.atticType === "unvented" ? "unvented" : site.atticType === "cathedral" ? "cathedral" : "attic";

  const ridgeVentLf = Math.max(0, nn(input.ridgeLf) - 2 * RIDGE_END_ALLOWANCE_FT * Math.max(0, Math.floor(nn(input.ridgeSegments))));
  const exhaustLf = ridgeVentLf + (input.ventHips ? nn(input.hipLf) : 0) + (input.ventHeadwalls ? nn(input.headwallLf) : 0);
  const intakeLf = nn(input.eaveLf);
  const exhaustProvidedSqIn = exhaustLf * nn(input.exhaustNfaPerFtSqIn);
  const intakeProvidedSqIn = intakeLf * nn(input.intakeNfaPerFtSqIn);

  const aboveDeck = {
    gapIn: channel.gapIn,
    continuous: channel.continuous,
    qualifies: channel.qualifies,
    channelNfaPerFtSqIn: channel.channelNfaPerFtSqIn,
    channelHeightIn: channel.channelHeightIn,
    reasons: channel.reasons,
  };

  let ventedAreaSqFt = 0;
  let ventedAreaEstimated = false;
  let ratio: 150 | 300 | null = null;
  let requiredNfaSqIn = 0;
  let intakeRequiredSqIn = 0;
  let exhaustRequiredSqIn = 0;
  const exception = site.ventException === true;

  if (mode !== "unvented") {
    const given = site.atticFloorAreaSqFt;
    if (given !== undefined && Number.isFinite(given) && given > 0) {
      ventedAreaSqFt = given;
    } else {
      ventedAreaSqFt = nn(input.roofPlanAreaSqFt);
      ventedAreaEstimated = true;
      advisories.push(
        advisory(
          "vent-area-estimated",
          "info",
          `The ${mode === "cathedral" ? "vented ceiling" : "attic floor"} area was not given, so the roof's plan area (${Math.round(ventedAreaSqFt)} sq ft) is used. ` +
            "Enter the measured area for an exact vent requirement.",
          "IRC 2021 R806.2 (net free area is a share of the vented space)",
          planeIds,
        ),
      );
    }
    const req = requiredAtticNfa({ ventedAreaSqFt, exception });
    ratio = req.ratio;
    requiredNfaSqIn = req.requiredSqIn;
    intakeRequiredSqIn = req.intakeRequiredSqIn;
    exhaustRequiredSqIn = req.exhaustRequiredSqIn;

    // Short: without the exception both halves must be met. Under the exception the code asks for 40–50 % of
    // the area in the upper vents (checked below), so the total is checked here, and intake against what the
    // exhaust leaves.
    const short = exception
      ? intakeProvidedSqIn + exhaustProvidedSqIn < requiredNfaSqIn - EPS || intakeProvidedSqIn < requiredNfaSqIn / 2 - EPS
      : intakeProvidedSqIn < intakeRequiredSqIn - EPS || exhaustProvidedSqIn < exhaustRequiredSqIn - EPS;
    if (requiredNfaSqIn > 0 && short) {
      advisories.push(
        advisory(
          "ventilation-short",
          "warning",
          `Not enough vent area: ${sqin(requiredNfaSqIn)} of net free area is needed (1/${ratio} of ${Math.round(ventedAreaSqFt)} sq ft), ` +
            `about ${sqin(intakeRequiredSqIn)} low and ${sqin(exhaustRequiredSqIn)} high. Provided: intake ${sqin(intakeProvidedSqIn)}, exhaust ${sqin(exhaustProvidedSqIn)}. ` +
            "Add eave or ridge vent, or choose vent products with more net free area per foot.",
          `IRC ${codeEdition} R806.2`,
          planeIds,
        ),
      );
    }
    if (intakeProvidedSqIn < exhaustProvidedSqIn - EPS) {
      advisories.push(
        advisory(
          "ventilation-unbalanced",
          "info",
          `The intake (${sqin(intakeProvidedSqIn)}) is less than the exhaust (${sqin(exhaustProvidedSqIn)}). With less air coming in low, ` +
            "the ridge vent can pull air from the living space or pull in weather. Keep intake at least equal to exhaust.",
          "common practice",
          planeIds,
        ),
      );
    }
    if (exception && requiredNfaSqIn > 0) {
      const share = exhaustProvidedSqIn / requiredNfaSqIn;
      if (share < EXCEPTION_EXHAUST_SHARE.min - EPS || share > EXCEPTION_EXHAUST_SHARE.max + EPS) {
        advisories.push(
          advisory(
            "vent-exception-exhaust-share",
            "warning",
            `The 1/300 ratio is used, which requires 40–50 % of the required vent area (${sqin(0.4 * requiredNfaSqIn)}–${sqin(0.5 * requiredNfaSqIn)}) ` +
              `in upper vents no more than 3 ft below the ridge, with the rest low. The exhaust provides ${sqin(exhaustProvidedSqIn)} (${Math.round(share * 100)} %). ` +
              "Adjust the vents or use the 1/150 ratio.",
            `IRC ${codeEdition} R806.2 exception`,
            planeIds,
          ),
        );
      }
    }
    const zone = climateZoneNumber(site.climateZone);
    if (exception && zone !== null && zone >= 6 && !site.vaporRetarder) {
      advisories.push(
        advisory(
          "vent-exception-vapor-retarder",
          "warning",
          `The 1/300 ratio is used in climate zone ${zone}, where the code also asks for a Class I or II vapor retarder on the warm-in-winter side of the ceiling. ` +
            "None is noted: confirm one is installed, or use the 1/150 ratio.",
          `IRC ${codeEdition} R806.2 exception (climate zones 6, 7 and 8)`,
          planeIds,
        ),
      );
    }
    const ridgeCapacity = ridgeVentLf * nn(input.exhaustNfaPerFtSqIn);
    if (nn(input.hipLf) > 0 && exhaustRequiredSqIn > 0 && ridgeCapacity < exhaustRequiredSqIn - EPS) {
      const hipsCover = input.ventHips === true && exhaustProvidedSqIn >= exhaustRequiredSqIn - EPS;
      if (!hipsCover) {
        advisories.push(
          advisory(
            "hip-ridge-too-short-for-exhaust",
            "warning",
            `On this hip roof the ridge is too short to carry the exhaust: ${Math.round(ridgeVentLf * 10) / 10} ft of ridge vent gives ${sqin(ridgeCapacity)} against ` +
              `${sqin(exhaustRequiredSqIn)} needed. Add vented hip caps, roof-mounted exhaust vents near the ridge, or a higher-flow ridge vent.`,
            "common practice",
            planeIds,
          ),
        );
      }
    }
  }

  if (input.aboveDeckClaimed && channel.blockedByBattens) {
    advisories.push(
      advisory(
        "channel-blocked-by-battens",
        "error",
        "The roof is meant to be ventilated above the deck, but horizontal battens alone block the air path at every row. " +
          "Put counter-battens running up the slope under the battens, or use a continuous spacer at least 3/4 in thick.",
        "California Title 24 (2008) re-roof alternative: at least a 3/4 in air space added to the roof deck; ORNL research (3/4 in minimum for airflow)",
        planeIds,
      ),
    );
  } else if (input.aboveDeckClaimed && !channel.qualifies) {
    advisories.push(
      advisory(
        "channel-does-not-qualify",
        "error",
        `The roof is meant to be ventilated above the deck, but the channel does not qualify: ${channel.reasons.join(" ")}`,
        "California Title 24 (2008) re-roof alternative: at least a 3/4 in air space added to the roof deck, open at the eave and the top; ORNL research (3/4 in minimum for airflow)",
        planeIds,
      ),
    );
  }

  if (input.aboveDeckClaimed || channel.continuous) {
    const below =
      mode === "unvented"
        ? "The unvented attic still has to meet the code's unvented-attic rules (air-impermeable insulation against the deck and the rest of R806.5)."
        : "The space under the deck still needs its own vents: eave and ridge vents with at least 1 in of air space between the insulation and the deck.";
    advisories.push(
      advisory(
        "channel-not-attic-ventilation",
        "info",
        `The air channel between the deck and the panels cools the roof, but it never counts toward the attic's required vent area. ${below}`,
        mode === "unvented" ? "IRC 2021 R806.5" : "IRC 2021 R806.3 (1 in air space at the vents); IRC 2021 R806.5 (unvented alternative)",
        planeIds,
      ),
    );
  }

  if (mode === "cathedral") {
    advisories.push(
      advisory(
        "cathedral-vent-space",
        "info",
        "Vaulted ceiling: each rafter space is vented space. Keep at least 1 in of air space between the insulation and the deck from the eave vent to the ridge vent in every rafter bay, or build it as an unvented assembly.",
        "IRC 2021 R806.3; IRC 2021 R806.5",
        planeIds,
      ),
    );
  }

  return {
    result: {
      mode,
      ventedAreaSqFt,
      ventedAreaEstimated,
      ratio,
      requiredNfaSqIn,
      intakeRequiredSqIn,
      exhaustRequiredSqIn,
      intakeProvidedSqIn,
      exhaustProvidedSqIn,
      exhaustLf,
      intakeLf,
      balanced: intakeProvidedSqIn >= exhaustProvidedSqIn - EPS,
      codeEdition,
      aboveDeck,
    },
    advisories,
  };
}
