/**
 * Output of the roof takeoff (POST /api/calc/takeoff) and the gap study (POST /api/calc/gap-study): what the
 * engine returns, described key by key. The routes wrap it as `{ data: … }`; these schemas describe the value
 * inside.
 *
 * Every object is strict: a key the schema does not name is an error, and every key the engine emits is named.
 * Lengths are feet and areas square feet unless the name ends in `In` (inches) or `SqIn` (square inches);
 * squares are 100 ft² of sloped area. Whole counts are `.int()`; nothing is rounded that the engine leaves
 * unrounded. `z.output` of each schema is the engine's own type (checked in
 * tests/shared/takeoff-result-schema.test.ts).
 */
import { z } from "zod";
import { SEVERITIES } from "../engine/advisory";
import { SPACER_OPTIONS } from "../engine/stack-options";
import { MATERIAL_CATEGORIES, MATERIAL_KEYS, type MaterialKey } from "../engine/materials";
import { EDGE_TYPES } from "../engine/roof/edge-types";
import { EDGE_DISTANCE_TERMS, WIND_ZONES } from "../engine/wind/zones";
import { LUMBER_NOMINALS, PANEL_SYSTEMS, SPACER_KINDS, WIND_EXPOSURES } from "./takeoff";

/** Whether the assembly still matches a tested uplift assembly (asked for with site.wind.ratedAssemblyRequired). */
export const UPLIFT_ASSEMBLY_STATES = ["tested", "not-tested-needs-review", "not-required"] as const;
/** How the space under the deck is ventilated: a vented attic, an unvented attic, a vented cathedral ceiling. */
export const VENTILATION_MODES = ["attic", "unvented", "cathedral"] as const;
/** Wind-zone layout of a plane: the steep-slope figure, or the low-slope one (pitch up to 7°). */
export const WIND_ZONE_MODELS = ["steep", "low-slope"] as const;

const count = () => z.number().int().min(0);
const point = z.tuple([z.number(), z.number()]);

// ---------------------------------------------------------------------------------------------------
// edges
// ---------------------------------------------------------------------------------------------------

/** An edge piece's type and lengths (every takeoff answer). */
export const edgeQuantitiesSchema = z.strictObject({
  /** The input edge number (edge i runs from corner i to corner i + 1). */
  index: count(),
  type: z.enum(EDGE_TYPES),
  planLengthFt: z.number(),
  /** Length along the slope. */
  trueLengthFt: z.number(),
});

/** An edge piece with where it lies and how its type was reached (the full detail). */
export const edgeResultSchema = z.strictObject({
  ...edgeQuantitiesSchema.shape,
  /** Piece number when the edge is split where a neighbouring plane's edge begins or ends. */
  part: count(),
  /** The type from the geometry, before any override. */
  computedType: z.enum(EDGE_TYPES),
  overridden: z.boolean(),
  shared: z.boolean(),
  /** The neighbouring plane along this piece, if shared. */
  sharedWith: z.strictObject({ planeId: z.string(), edgeIndex: count() }).nullable(),
  /** Plan coordinates [x, y]. */
  from: point,
  to: point,
});

/** True length per edge type over the roof, each shared piece once. */
export const edgeTotalsSchema = z.strictObject({
  eaveLf: z.number(),
  rakeLf: z.number(),
  ridgeLf: z.number(),
  hipLf: z.number(),
  valleyLf: z.number(),
  transitionLf: z.number(),
  sidewallLf: z.number(),
  headwallLf: z.number(),
});

// ---------------------------------------------------------------------------------------------------
// panels and layers
// ---------------------------------------------------------------------------------------------------

/** Panels of one length: whole inches, how many. */
export const cutListEntrySchema = z.strictObject({
  lengthIn: count(),
  count: count(),
});

/** A plane's panels: how many, each one's ordered length and the cut list (longest first). */
export const panelQuantitiesSchema = z.strictObject({
  count: count(),
  /** One entry per panel, whole inches. */
  lengthsIn: z.array(count()),
  cutList: z.array(cutListEntrySchema),
  /** 0 when the plane has no panel. */
  longestIn: count(),
});

export const panelsResultSchema = z.strictObject({
  ...panelQuantitiesSchema.shape,
  system: z.enum(PANEL_SYSTEMS),
  coverageWidthIn: z.number(),
  /** Ordered panel area less the sloped area, ft². */
  offcutSqFt: z.number(),
  /** Σ ordered lengths. */
  totalLengthFt: z.number(),
});

/** A plane's layers under the panels; areas are sloped ft², lengths lf. */
export const planeLayersSchema = z.strictObject({
  /** Sloped area × underlayment layers. */
  underlaymentSqFt: z.number(),
  iceBarrier: z
    .strictObject({
      /** Width up the slope from the eave. */
      widthIn: z.number(),
      courses: count(),
      eaveLf: z.number(),
      /** courses × eave length. */
      membraneLf: z.number(),
      /** Why nothing is added (self-adhered underlayment over the whole deck). */
      note: z.string().optional(),
    })
    .nullable(),
  battens: z
    .strictObject({
      /** Lumber nominal size, e.g. "1x4". */
      nominal: z.enum(LUMBER_NOMINALS),
      rows: count(),
      lf: z.number(),
      fasteners: count(),
      spacingIn: z.number(),
    })
    .nullable(),
  counterBattens: z
    .strictObject({
      nominal: z.enum(LUMBER_NOMINALS),
      runs: count(),
      lf: z.number(),
      fasteners: count(),
      spacingIn: z.number(),
    })
    .nullable(),
  meshSqFt: z.number(),
  dimpledSqFt: z.number(),
  foilSqFt: z.number(),
  /** Deck area to replace (whole plane, or the repair share). */
  deckSqFt: z.number(),
});

// ---------------------------------------------------------------------------------------------------
// wind zones
// ---------------------------------------------------------------------------------------------------

const windZone = z.enum(WIND_ZONES);
const zoneSpacingSchema = z.strictObject({ field: z.number(), edge: z.number(), corner: z.number() });

/** One plane's counts in one wind zone. */
export const zoneCountsSchema = z.strictObject({
  clips: count(),
  /** Clip-line length in the zone, along the slope. */
  lineFt: z.number(),
  /** Panel area in the zone, along the slope, ft² (exposed-fastener panels). */
  areaSqFt: z.number(),
  /** Exposed-fastener screws, unrounded (a rate per square × area). */
  panelScrews: z.number(),
});

/** A plane's wind zones (ASCE 7 components and cladding) and the clips and screws in each. */
export const planeWindZonesSchema = z.strictObject({
  model: z.enum(WIND_ZONE_MODELS),
  /** Edge distance a. */
  aFt: z.number(),
  /** Zone widths in plan and along the slope; zone 1 widths only for the low-slope model. */
  widths: z.strictObject({
    zone2PlanFt: z.number(),
    zone2SlopeFt: z.number(),
    zone3PlanFt: point,
    zone3SlopeFt: point,
    zone1PlanFt: z.number().optional(),
    zone1SlopeFt: z.number().optional(),
  }),
  /** Zone 3 read as zone 2 (hip roofs up to 25°). */
  zone3AsZone2: z.boolean(),
  /** Clip spacing used per zone, after the batten limit, inches. */
  clipSpacingIn: zoneSpacingSchema,
  zones: z.record(windZone, zoneCountsSchema),
  clips: count(),
  clipsPerPanel: z.array(count()),
  /** Exposed-fastener screws, unrounded. */
  panelScrews: z.number(),
  /** Zones whose required clip spacing is closer than the battens allow. */
  spacingLimitedByBattens: z.array(windZone),
});

// ---------------------------------------------------------------------------------------------------
// planes
// ---------------------------------------------------------------------------------------------------

/** A plane's quantities: what the takeoff answers per plane by default. */
export const planeQuantitiesSchema = z.strictObject({
  id: z.string(),
  name: z.string(),
  /** The plane's roof assembly. */
  stackId: z.string(),
  /** Rise per 12 of run. */
  pitch: z.number(),
  /** Sloped length ÷ plan length. */
  slopeFactor: z.number(),
  planAreaSqFt: z.number(),
  slopedAreaSqFt: z.number(),
  squares: z.number(),
  edges: z.array(edgeQuantitiesSchema),
  panels: panelQuantitiesSchema,
});

/** A plane's full detail (`?detail=full`). */
export const planeResultSchema = z.strictObject({
  ...planeQuantitiesSchema.shape,
  /** Slope angle from horizontal, degrees. */
  angleDeg: z.number(),
  /** Each corner in plan with its height. */
  vertices: z.array(z.strictObject({ x: z.number(), y: z.number(), z: z.number() })),
  eaveEdge: count(),
  edges: z.array(edgeResultSchema),
  panels: panelsResultSchema,
  windZones: planeWindZonesSchema,
  layers: planeLayersSchema,
});

// ---------------------------------------------------------------------------------------------------
// roof-wide figures
// ---------------------------------------------------------------------------------------------------

/** The roof's fasteners in one wind zone. */
export const zoneFastenersSchema = z.strictObject({
  clips: count(),
  clipScrews: count(),
  /** Exposed-fastener screws in the zone, unrounded. */
  panelScrews: z.number(),
  /** Clip-line (or panel centre-line) length in the zone, along the slope. */
  lineFt: z.number(),
  /** Panel area in the zone, along the slope, ft². */
  areaSqFt: z.number(),
});

/** Fasteners placed on the roof, without waste. */
export const fastenersSchema = z.strictObject({
  clips: count(),
  clipScrews: count(),
  /** Exposed-fastener screws, rounded up once for the roof. */
  panelScrews: count(),
  trimFasteners: count(),
  /** Batten and counter-batten fasteners. */
  spacerFasteners: count(),
  zones: z.record(windZone, zoneFastenersSchema),
});

/** The wind figures the zones use (ASCE 7 edge distance a). */
export const windSchema = z.strictObject({
  aFt: z.number(),
  leastHorizontalDimensionFt: z.number(),
  /** True when L was taken from the outlines, not given. */
  leastHorizontalDimensionEstimated: z.boolean(),
  meanRoofHeightFt: z.number().nullable(),
  /** The term that sets a: "0.1L", "0.4h", "0.04L" or "3 ft". */
  governs: z.enum(EDGE_DISTANCE_TERMS),
  hipRoof: z.boolean(),
  basicWindSpeedMph: z.number().nullable(),
  exposure: z.enum(WIND_EXPOSURES).nullable(),
});

/** The above-deck air channel an assembly's spacer makes. */
export const channelSchema = z.strictObject({
  kind: z.enum(SPACER_KINDS),
  /** Deck-to-panel gap, inches. */
  gapIn: z.number(),
  channelHeightIn: z.number(),
  /** Unbroken from eave to ridge. */
  continuous: z.boolean(),
  /** Counts as above-deck ventilation. */
  qualifies: z.boolean(),
  /** Net free area per foot of eave, in²/ft. */
  channelNfaPerFtSqIn: z.number(),
  blockedByBattens: z.boolean(),
  /** Why the channel does not qualify (empty when it does). */
  reasons: z.array(z.string()),
});

/** Cool-roof check of the panel finish (asked for with site.coolRoofRequired). */
export const coolRoofSchema = z.strictObject({
  agedSolarReflectance: z.number(),
  /** The aged value was estimated from the initial one. */
  agedEstimated: z.boolean(),
  agedSri: z.number(),
  title24SteepSlope: z.boolean(),
  /** null when only an aged value below 0.25 is known. */
  energyStarSteepSlope: z.boolean().nullable(),
  meets: z.boolean(),
});

/** Condensation caution for humid climate zones; temperatures °F. */
export const dewPointSchema = z.strictObject({
  designTempF: z.number(),
  rhPct: z.number(),
  dewPointF: z.number(),
  panelNightTempF: z.number(),
  undercoolingF: z.number(),
  condensationPossible: z.boolean(),
  note: z.string(),
});

/** Thermal figures of an assembly's gap; R in h·ft²·°F/Btu, `…Si` in m²·K/W. */
export const thermalSchema = z.strictObject({
  /** Deck-to-panel gap, inches. */
  gapIn: z.number(),
  ventilated: z.boolean(),
  /** null with no gap. */
  effectiveEmittance: z.number().nullable(),
  /** Enclosed air-space R, heat flow down; null with no gap or a ventilated gap. */
  airSpaceRSummer: z.number().nullable(),
  /** Enclosed air-space R, heat flow up; null with no gap or a ventilated gap. */
  airSpaceRWinter: z.number().nullable(),
  airSpaceRSummerSi: z.number().nullable(),
  airSpaceRWinterSi: z.number().nullable(),
  rExtrapolated: z.boolean(),
  rNote: z.string(),
  roofAngleDeg: z.number(),
  sri: z.number(),
  agedSolarReflectance: z.number(),
  coolRoof: coolRoofSchema.nullable(),
  dewPoint: dewPointSchema.nullable(),
});

/** The roof's thermal figures: the dominant assembly's (largest sloped area), with its id. */
export const roofThermalSchema = z.strictObject({
  ...thermalSchema.shape,
  stackId: z.string(),
});

/** Vent requirement and supply of the space under the deck (IRC R806), and the above-deck channel. */
export const ventilationSchema = z.strictObject({
  mode: z.enum(VENTILATION_MODES),
  ventedAreaSqFt: z.number(),
  /** The roof's plan area stood in for the attic floor area. */
  ventedAreaEstimated: z.boolean(),
  /** 1/150 or 1/300 (IRC R806.2); null for an unvented attic. */
  ratio: z.literal([150, 300]).nullable(),
  requiredNfaSqIn: z.number(),
  intakeRequiredSqIn: z.number(),
  exhaustRequiredSqIn: z.number(),
  intakeProvidedSqIn: z.number(),
  exhaustProvidedSqIn: z.number(),
  exhaustLf: z.number(),
  intakeLf: z.number(),
  /** Intake provided is at least the exhaust provided. */
  balanced: z.boolean(),
  codeEdition: z.string(),
  /** The dominant assembly's channel, as far as ventilation goes. */
  aboveDeck: channelSchema.pick({ gapIn: true, continuous: true, qualifies: true, channelNfaPerFtSqIn: true, channelHeightIn: true, reasons: true }),
});

/** One roof assembly over its planes. */
export const stackResultSchema = z.strictObject({
  id: z.string(),
  name: z.string().nullable(),
  planeIds: z.array(z.string()),
  planAreaSqFt: z.number(),
  slopedAreaSqFt: z.number(),
  squares: z.number(),
  channel: channelSchema,
  thermal: thermalSchema,
  upliftAssembly: z.enum(UPLIFT_ASSEMBLY_STATES),
});

export const totalsSchema = z.strictObject({
  planAreaSqFt: z.number(),
  slopedAreaSqFt: z.number(),
  squares: z.number(),
  panelCount: count(),
  panelLengthFt: z.number(),
  offcutSqFt: z.number(),
  /** Deck sheets to buy, waste included. */
  deckSheets: count(),
});

/** One material in purchase units, waste included, rounded up once for the job. */
export const materialLineSchema = z.strictObject({
  key: z.enum(Object.keys(MATERIAL_KEYS) as MaterialKey[]),
  category: z.enum(MATERIAL_CATEGORIES),
  description: z.string(),
  /** Rolls, pieces, boxes …; panels in linear feet (not whole). */
  quantity: z.number().min(0),
  unit: z.string(),
  /** How the number was reached, in words. */
  basis: z.string(),
});

/** A finding about the roof. */
export const advisorySchema = z.strictObject({
  /** Stable kebab-case code. */
  code: z.string(),
  severity: z.enum(SEVERITIES),
  message: z.string(),
  /** The published reference, or "common practice". */
  reference: z.string(),
  /** Planes concerned; empty for roof-wide findings. */
  planeIds: z.array(z.string()),
});

// ---------------------------------------------------------------------------------------------------
// the answers
// ---------------------------------------------------------------------------------------------------

/** The takeoff with planes of the given schema (quantities or full detail). */
function takeoffOf<P extends z.ZodType>(plane: P) {
  return z.strictObject({
    planes: z.array(plane),
    edgeTotals: edgeTotalsSchema,
    totals: totalsSchema,
    materials: z.array(materialLineSchema),
    fasteners: fastenersSchema,
    wind: windSchema,
    ventilation: ventilationSchema,
    thermal: roofThermalSchema,
    stacks: z.array(stackResultSchema),
    advisories: z.array(advisorySchema),
  });
}

/** POST /api/calc/takeoff (default): each plane's quantities. */
export const takeoffQuantitiesSchema = takeoffOf(planeQuantitiesSchema);
/** POST /api/calc/takeoff?detail=full: each plane's full detail. */
export const takeoffResultSchema = takeoffOf(planeResultSchema);

/** The main assembly's gap figures under one spacer option. */
export const gapStudySummarySchema = z.strictObject({
  gapIn: z.number(),
  channelHeightIn: z.number(),
  continuous: z.boolean(),
  qualifies: z.boolean(),
  channelNfaPerFtSqIn: z.number(),
  effectiveEmittance: z.number().nullable(),
  airSpaceRSummer: z.number().nullable(),
  airSpaceRWinter: z.number().nullable(),
  rNote: z.string(),
  upliftAssembly: z.enum(UPLIFT_ASSEMBLY_STATES),
  /** The spacer's own materials (mats, battens, their fasteners). */
  spacerMaterials: z.array(materialLineSchema),
  advisories: z.array(advisorySchema),
});

function gapStudyOf<P extends z.ZodType>(plane: P) {
  return z.strictObject({
    options: z.array(
      z.strictObject({
        /** The spacer option (GAP_STUDY_OPTIONS). */
        spacer: z.enum(SPACER_OPTIONS),
        summary: gapStudySummarySchema,
        result: takeoffOf(plane),
      }),
    ),
  });
}

/** POST /api/calc/gap-study (default): the five spacer options, each plane's quantities. */
export const gapStudyQuantitiesSchema = gapStudyOf(planeQuantitiesSchema);
/** POST /api/calc/gap-study?detail=full: the five spacer options, each plane's full detail. */
export const gapStudyResultSchema = gapStudyOf(planeResultSchema);
