/**
 * Input of the roof takeoff (POST /api/calc/takeoff) and the gap study (POST /api/calc/gap-study).
 *
 * Sub-objects and fields not given take defaults (filled here, so the engine sees complete input);
 * unknown keys are stripped; ids are non-empty strings. Plan coordinates are feet, small sizes inches,
 * pitch is rise per 12 of run. Every `rules` field has a default, so `{}` parses.
 * Defaults are tagged like the engine's tests: [published] with the source, [common practice], [from memory].
 */
import { z } from "zod";
import {
  EDGE_TYPES,
  LUMBER_NOMINALS,
  MAX_PLANES,
  MAX_STACKS,
  MAX_PLAN_FT,
  MIN_PANEL_COVERAGE_IN,
  MIN_BATTEN_SPACING_IN,
  MAX_ID_LENGTH,
  ATTIC_TYPES,
  CODE_EDITIONS,
  UNDERLAYMENT_KINDS,
  SPACER_KINDS,
  PANEL_SYSTEMS,
  PANEL_STARTS,
  PENETRATION_KINDS,
  CLIMATE_ZONE_RE,
  WIND_EXPOSURES,
} from "./takeoff-limits";
import { parsePlaneFast, parseSiteFast, parseStackFast } from "./takeoff-fast";
import { planeGeometryOfParsed, isGeometryError } from "../engine/roof/geometry";

export * from "./takeoff-limits";

const id = z.string({ error: "Required" }).min(1, "Required").max(MAX_ID_LENGTH, `Use at most ${MAX_ID_LENGTH} characters`);
const size = z.number({ error: "Enter a number" }).min(0, "Must not be negative");
const positive = z.number({ error: "Enter a number" }).positive("Must be more than 0");
const pct = z.number({ error: "Enter a number" }).min(0, "Must not be negative").max(100, "At most 100");
const fraction = z.number({ error: "Enter a number" }).min(0).max(1);
const emittance = z.number({ error: "Enter a number" }).min(0.01, "At least 0.01").max(1, "At most 1");
/** Stock pieces (battens, trim, panels) are at least a foot long. */
const stockLength = z.number({ error: "Enter a number" }).min(1, "At least 1 ft");
const fastenerSpacing = z.number({ error: "Enter a number" }).min(1, "At least 1 in");
const battenSpacing = z.number({ error: "Enter a number" }).min(MIN_BATTEN_SPACING_IN, `At least ${MIN_BATTEN_SPACING_IN} in`);
const planFt = z.number({ error: "Enter a number" }).min(-MAX_PLAN_FT, `At least -${MAX_PLAN_FT} ft`).max(MAX_PLAN_FT, `At most ${MAX_PLAN_FT} ft`);

// ---------------------------------------------------------------------------------------------------
// rules
// ---------------------------------------------------------------------------------------------------

/**
 * A roll's laps must leave some of it: a side lap as wide as the roll, or an end lap as long, would give no
 * coverage per roll (no count, or a division by zero).
 */
function checkRollLaps(r: { rollWidthIn: number; rollLengthFt: number; sideLapIn: number; endLapIn: number }, ctx: z.RefinementCtx): void {
  if (!(r.sideLapIn < r.rollWidthIn)) ctx.addIssue({ code: "custom", message: "The side lap must be less than the roll width", path: ["sideLapIn"] });
  if (!(r.endLapIn / 12 < r.rollLengthFt)) ctx.addIssue({ code: "custom", message: "The end lap must be less than the roll length", path: ["endLapIn"] });
}

const roll = (d: { rollWidthIn: number; rollLengthFt: number; sideLapIn: number; endLapIn: number }) =>
  z
    .object({
      rollWidthIn: positive.default(d.rollWidthIn),
      rollLengthFt: positive.default(d.rollLengthFt),
      sideLapIn: size.default(d.sideLapIn),
      endLapIn: size.default(d.endLapIn),
    })
    .prefault({})
    .superRefine(checkRollLaps);

export const rulesSchema = z
  .object({
    /** Waste, percent [common practice]. */
    waste: z
      .object({
        underlaymentPct: pct.default(10),
        iceBarrierPct: pct.default(5),
        meshPct: pct.default(10),
        dimpledPct: pct.default(10),
        foilPct: pct.default(10),
        battensPct: pct.default(10),
        fastenersPct: pct.default(5),
        deckPct: pct.default(10),
        trimPct: pct.default(0),
      })
      .prefault({}),
    /** Underlayment rolls: width, length, side lap (between courses) and end lap [common practice; NRCA for felt laps]. */
    underlayment: z
      .object({
        selfAdhered: roll({ rollWidthIn: 36, rollLengthFt: 65, sideLapIn: 3.5, endLapIn: 6 }),
        synthetic: roll({ rollWidthIn: 48, rollLengthFt: 250, sideLapIn: 4, endLapIn: 6 }),
        felt30: roll({ rollWidthIn: 36, rollLengthFt: 72, sideLapIn: 2, endLapIn: 6 }),
        felt15: roll({ rollWidthIn: 36, rollLengthFt: 144, sideLapIn: 2, endLapIn: 6 }),
      })
      .prefault({}),
    /** Ice barrier membrane and where it reaches (IRC R905.1.2: 24 in inside the exterior wall). */
    iceBarrier: z
      .object({
        rollWidthIn: positive.default(36),
        rollLengthFt: positive.default(65),
        sideLapIn: size.default(3.5),
        endLapIn: size.default(6),
        insideWallIn: size.default(24),
      })
      .prefault({})
      .superRefine(checkRollLaps),
    /** Spacer mats, butted not lapped [common practice; sizes maker-dependent, editable]. */
    mesh: roll({ rollWidthIn: 39, rollLengthFt: 75, sideLapIn: 0, endLapIn: 0 }),
    dimpled: roll({ rollWidthIn: 48, rollLengthFt: 50, sideLapIn: 0, endLapIn: 0 }),
    /** Radiant barrier foil roll [common practice]. */
    foil: roll({ rollWidthIn: 48, rollLengthFt: 125, sideLapIn: 2, endLapIn: 6 }),
    battens: z
      .object({
        stockLengthFt: stockLength.default(8),
        fastenerSpacingIn: fastenerSpacing.default(24),
        counterBattenSpacingIn: battenSpacing.default(24),
      })
      .prefault({}),
    trim: z
      .object({
        stockLengthFt: stockLength.default(10),
        endLapIn: size.default(3),
        fastenerSpacingIn: fastenerSpacing.default(12),
      })
      .prefault({})
      .refine((t) => t.endLapIn / 12 < t.stockLengthFt, { message: "The end lap must be shorter than the stock length", path: ["endLapIn"] }),
    sealant: z
      .object({
        /** Linear feet of bead per tube [common practice]. */
        lfPerTube: positive.default(25),
        /** Bead per trim end lap, ft [common practice]. */
        lfPerTrimLap: size.default(1),
        lfPerPipe: size.default(3),
        lfPerChimney: size.default(15),
        lfPerSkylight: size.default(15),
        lfPerOther: size.default(3),
      })
      .prefault({}),
    butyl: z.object({ rollLengthFt: positive.default(50) }).prefault({}),
    vents: z
      .object({
        /** Vent product net free area per foot [common practice; product-dependent]. */
        ridgeNfaPerFtSqIn: size.default(18),
        intakeNfaPerFtSqIn: size.default(9),
      })
      .prefault({}),
    panels: z
      .object({
        maxLengthFt: stockLength.default(40),
        longPanelInfoFt: positive.default(30),
        hemAllowanceIn: size.default(0),
      })
      .prefault({}),
    clips: z
      .object({
        spacingIn: z
          .object({ field: positive.default(24), edge: positive.default(16), corner: positive.default(12) })
          .prefault({}),
        screwsPerClip: z.number().int().min(0).default(2),
      })
      .prefault({}),
    exposedFastener: z
      .object({
        screwsPerSquare: z
          .object({ field: size.default(80), edge: size.default(100), corner: size.default(120) })
          .prefault({}),
      })
      .prefault({}),
    fasteners: z.object({ screwsPerBox: z.number().int().min(1).default(250), clipsPerBox: z.number().int().min(1).default(1) }).prefault({}),
    deck: z.object({ sheetSqFt: positive.default(32) }).prefault({}),
  })
  .prefault({});
export type Rules = z.output<typeof rulesSchema>;

/** Freezes an object and everything in it. */
function deepFreeze<T>(v: T): T {
  if (v !== null && typeof v === "object" && !Object.isFrozen(v)) {
    Object.freeze(v);
    for (const x of Object.values(v)) deepFreeze(x);
  }
  return v;
}

/**
 * Every rule at its default: what rulesSchema gives for no rules at all, worked out once and frozen (nothing may
 * change it; an attempt throws, as modules run in strict mode).
 */
export const DEFAULT_RULES: Rules = deepFreeze(rulesSchema.parse(undefined));

/**
 * The takeoff input's rules: rulesSchema, but a takeoff without rules (the calculation API's usual call) gets
 * DEFAULT_RULES instead of a new parse of `{}`. That parse gives the same values, but it runs about sixty
 * fields' defaults through zod, some 130 µs of a takeoff in the server, where the request's other work has
 * pushed zod's code and schemas out of the processor's caches.
 */
const takeoffRulesSchema = rulesSchema.unwrap().default(() => DEFAULT_RULES);

// ---------------------------------------------------------------------------------------------------
// site
// ---------------------------------------------------------------------------------------------------

const codeEdition = z.preprocess(
  (v) => (typeof v === "string" && /^\d{4}$/.test(v.trim()) ? Number(v) : v),
  z.union(CODE_EDITIONS.map((y) => z.literal(y)) as unknown as [z.ZodLiteral<2012>, z.ZodLiteral<2015>, z.ZodLiteral<2018>, z.ZodLiteral<2021>, z.ZodLiteral<2024>], {
    error: "Code edition must be one of 2012, 2015, 2018, 2021, 2024",
  }),
);

export const siteSchema = z
  .object({
    atticType: z.enum(ATTIC_TYPES).default("vented"),
    atticFloorAreaSqFt: size.optional(),
    climateZone: z
      .string()
      .trim()
      .toUpperCase()
      .regex(CLIMATE_ZONE_RE, 'Use an IECC climate zone such as "3A"')
      .max(2, 'Use an IECC climate zone such as "3A"')
      .optional(),
    /** Ice-dam risk stated for the site (IRC R905.1.2 areas). Unknown when left out. */
    iceDamRisk: z.boolean().optional(),
    /** The user states the conditions of the IRC R806.2 exception (1/300) are met. */
    ventException: z.boolean().default(false),
    codeEdition: codeEdition.default(2021),
    coolRoofRequired: z.boolean().default(false),
    /** A Class I or II vapour retarder on the warm side (for the R806.2 exception in zones 6–8). */
    vaporRetarder: z.boolean().optional(),
    existingLayers: z.number().int().min(0).max(10).default(1),
    tearOff: z.boolean().default(true),
    wind: z
      .object({
        ratedAssemblyRequired: z.boolean().default(false),
        basicWindSpeedMph: size.optional(),
        exposure: z.enum(WIND_EXPOSURES).optional(),
        leastHorizontalDimensionFt: positive.optional(),
        meanRoofHeightFt: positive.optional(),
      })
      .prefault({}),
  })
  .prefault({});

// ---------------------------------------------------------------------------------------------------
// planes
// ---------------------------------------------------------------------------------------------------

export const penetrationSchema = z.object({
  id: z.string().max(MAX_ID_LENGTH, `Use at most ${MAX_ID_LENGTH} characters`).optional(),
  kind: z.enum(PENETRATION_KINDS).default("pipe"),
  /** Pipe outside diameter, inches. */
  diameterIn: size.optional(),
  /** Width across the slope (perpendicular to the slope), inches: a chimney or curb. */
  widthIn: size.optional(),
  /** Length up the slope, inches. */
  lengthIn: size.optional(),
  count: z.number().int().min(1).default(1),
});

const edgeTypeOverrides = z
  .record(z.string().regex(/^\d+$/, "Edge numbers are whole numbers"), z.enum(EDGE_TYPES))
  .refine((r) => Object.keys(r).length <= 200, { message: "At most 200 edges" }); // a plane has at most 200 corners

/**
 * A plane's outline: 3 to 200 corners, each a pair [x, y] of plan feet within ±MAX_PLAN_FT. The corners are
 * checked in one pass over the array rather than as a zod tuple per corner: a 100-plane roof has about 500
 * corners, and a tuple schema builds several objects per corner on every takeoff and every roof save. The
 * issues are those the per-field schemas give (the same paths down to the coordinate, the same messages), and
 * like a type error they stop the roof's cross-checks, which need whole corners.
 */
const outlineSchema = z
  .array(z.unknown(), { error: "Required" })
  .min(3, "A plane needs at least 3 corners")
  .max(200, "At most 200 corners")
  .superRefine((corners, ctx) => {
    for (let i = 0; i < corners.length; i++) {
      const c = corners[i];
      if (!Array.isArray(c) || c.length !== 2) {
        ctx.addIssue({ code: "custom", message: "Each corner is a pair of numbers [x, y] in feet", path: [i], continue: false });
        continue;
      }
      for (let k = 0; k < 2; k++) {
        const v: unknown = c[k];
        if (typeof v !== "number" || !Number.isFinite(v)) ctx.addIssue({ code: "custom", message: "Enter a number", path: [i, k], continue: false });
        else if (v < -MAX_PLAN_FT) ctx.addIssue({ code: "custom", message: `At least -${MAX_PLAN_FT} ft`, path: [i, k], continue: false });
        else if (v > MAX_PLAN_FT) ctx.addIssue({ code: "custom", message: `At most ${MAX_PLAN_FT} ft`, path: [i, k], continue: false });
      }
    }
  }) as unknown as z.ZodType<[number, number][], [number, number][]>;

export const planeSchema = z.object({
  id,
  name: z.string().max(120).default(""),
  pitch: z.number({ error: "Enter a number" }).min(0, "Pitch must be 0 or more").max(24, "Pitch must be at most 24"),
  outline: outlineSchema,
  eaveEdge: z.number({ error: "Enter a number" }).int("Must be a whole number").min(0, "Must be 0 or more"),
  baseElevationFt: z.number({ error: "Enter a number" }).default(0),
  eaveOverhangIn: size.default(12),
  /** User's edge types by edge number (edge i runs from corner i to corner i + 1). */
  edgeTypes: edgeTypeOverrides.default({}),
  stackId: id.optional(),
  penetrations: z.array(penetrationSchema).max(200).default([]),
});

export type PlaneParsed = z.output<typeof planeSchema>;
export type PenetrationParsed = z.output<typeof penetrationSchema>;

export { parsePlaneFast, parseSiteFast, parseStackFast };

/**
 * Runs `schema` inside the parse that `payload` belongs to (a transform's), so its issues are those it raises in
 * the input as a whole: the same paths, messages, and effect on the checks that follow (a plane's wrong corner
 * count, say, does not stop the roof's cross-checks). `_zod.run` is zod 4's own step for a schema inside another
 * (z.array calls it for each item); the issues stay raw until the outer parse finalises them, as they would in
 * z.array. tests/shared/takeoff-fast-parse.test.ts holds the refusals to those of the plain zod schemas.
 */
function parseInside<T>(schema: z.ZodType<T>, raw: unknown, payload: z.core.ParsePayload): T {
  const done = schema._zod.run({ value: raw, issues: [] }, { async: false });
  if (done instanceof Promise) throw new Error("The takeoff input's schemas are synchronous");
  for (const issue of done.issues) payload.issues.push(issue);
  return done.value as T;
}

/**
 * z.array(item) with its limits and messages, its items parsed by `fast` (./takeoff-fast) when it answers for
 * every item, and by the array schema itself otherwise. The input type is the array schema's.
 */
function fastList<T extends z.ZodType>(
  item: T,
  fast: (raw: unknown) => z.output<T> | undefined,
  limits: { min: number; tooFew: string; max: number; tooMany: string },
) {
  const list = z.array(item, { error: "Required" }).min(limits.min, limits.tooFew).max(limits.max, limits.tooMany);
  return z
    .unknown()
    .transform((raw, payload) => {
      if (Array.isArray(raw) && raw.length >= limits.min && raw.length <= limits.max) {
        const out: z.output<T>[] = [];
        for (let i = 0; i < raw.length; i++) {
          const parsed = fast(raw[i]);
          if (parsed === undefined) break;
          out.push(parsed);
        }
        if (out.length === raw.length) return out;
      }
      return parseInside(list, raw, payload);
    }) as unknown as z.ZodType<z.output<T>[], z.input<T>[]>;
}

/** A roof's planes: planeSchema for each, by parsePlaneFast where it answers for every plane. */
export const planesSchema = fastList(planeSchema, parsePlaneFast, {
  min: 1,
  tooFew: "Add at least one roof plane",
  max: MAX_PLANES,
  tooMany: `At most ${MAX_PLANES} planes`,
});

// ---------------------------------------------------------------------------------------------------
// stacks
// ---------------------------------------------------------------------------------------------------

const battensSchema = z
  .object({
    nominal: z.enum(LUMBER_NOMINALS).default("1x4"),
    spacingIn: battenSpacing.default(24),
    counterBattens: z.boolean().default(false),
    counterBattenNominal: z.enum(LUMBER_NOMINALS).optional(),
    /** Default: rules.battens.counterBattenSpacingIn (24 in). */
    counterBattenSpacingIn: battenSpacing.optional(),
    /** Preservative-treated lumber. */
    treated: z.boolean().default(false),
  })
  .prefault({});

export const stackSchema = z.object({
  id,
  name: z.string().max(120).optional(),
  deck: z
    .object({
      action: z.enum(["keep", "repair", "replace"]).default("keep"),
      material: z.enum(["plywood", "osb"]).default("plywood"),
      thicknessIn: positive.default(0.5),
      repairSharePct: pct.default(10),
    })
    .prefault({}),
  underlayment: z
    .object({
      kind: z.enum(UNDERLAYMENT_KINDS).default("synthetic"),
      highTemp: z.boolean().default(true),
      /** Felt weight when kind is felt. */
      feltNumber: z.union([z.literal(15), z.literal(30)]).default(30),
      layers: z.number().int().min(1).max(2).default(1),
      /** Ice barrier at the eaves; default: where the site states an ice-dam risk. */
      iceBarrier: z.boolean().optional(),
    })
    .prefault({}),
  spacer: z
    .object({
      kind: z.enum(SPACER_KINDS).default("none"),
      thicknessIn: positive.optional(),
      openFraction: fraction.optional(),
      battens: battensSchema,
    })
    .prefault({}),
  radiantBarrier: z
    .object({
      kind: z.enum(["none", "foil"]).default("none"),
      position: z.enum(["on-deck", "under-panels"]).default("on-deck"),
      reflectiveFace: z.enum(["up", "down"]).default("up"),
      emittance: emittance.default(0.05),
    })
    .prefault({}),
  panel: z
    .object({
      system: z.enum(PANEL_SYSTEMS).default("standing-seam"),
      coverageWidthIn: z
        .number({ error: "Enter a number" })
        .min(MIN_PANEL_COVERAGE_IN, `At least ${MIN_PANEL_COVERAGE_IN} in`)
        .max(60, "At most 60 in")
        .default(16),
      gauge: z.number({ error: "Enter a number" }).positive().default(24),
      /** Metallic-coated steel (the default) or another metal; treated lumber is checked against steel. */
      substrate: z.enum(["metallic-coated-steel", "aluminum", "copper", "zinc"]).default("metallic-coated-steel"),
      solarReflectance: fraction.default(0.3),
      thermalEmittance: fraction.default(0.85),
      lapSealant: z.boolean().default(false),
      minPitch: z.number().min(0).max(24).optional(),
      panelUndersideEmittance: emittance.default(0.9),
      clipSpacingIn: z.object({ field: positive.optional(), edge: positive.optional(), corner: positive.optional() }).prefault({}),
      screwsPerSquare: z.object({ field: size.optional(), edge: size.optional(), corner: size.optional() }).prefault({}),
      hemAllowanceIn: size.optional(),
      maxLengthFt: stockLength.optional(),
      start: z.enum(PANEL_STARTS).default("left"),
    })
    .prefault({}),
  ventilation: z
    .object({
      intakeNfaPerFtSqIn: size.optional(),
      exhaustNfaPerFtSqIn: size.optional(),
      eaveOpen: z.boolean().default(true),
      topOpen: z.boolean().default(true),
      ventHips: z.boolean().default(false),
      ventHeadwalls: z.boolean().default(false),
      /** The assembly counts on the above-deck channel as ventilation. */
      aboveDeckClaimed: z.boolean().default(false),
    })
    .prefault({}),
});

export type StackParsed = z.output<typeof stackSchema>;
export type SiteParsed = z.output<typeof siteSchema>;

/** A roof's assemblies: stackSchema for each, by parseStackFast where it answers for every assembly. */
export const stacksSchema = fastList(stackSchema, parseStackFast, {
  min: 1,
  tooFew: "Add at least one roof assembly",
  max: MAX_STACKS,
  tooMany: `At most ${MAX_STACKS} roof assemblies`,
});

/**
 * The site: siteSchema's answer, by parseSiteFast where it answers. Left out, it is `{}` (as siteSchema's own
 * prefault has it), which also makes the key optional in an object, as siteSchema's is.
 */
export const siteInputSchema = z
  .unknown()
  .transform((raw, payload) => parseSiteFast(raw) ?? parseInside(siteSchema, raw, payload))
  .prefault({}) as unknown as z.ZodType<SiteParsed, z.input<typeof siteSchema>>;

// ---------------------------------------------------------------------------------------------------
// the whole input
// ---------------------------------------------------------------------------------------------------

const baseShape = {
  site: siteInputSchema,
  planes: planesSchema,
  stacks: stacksSchema,
  defaultStackId: id,
  rules: takeoffRulesSchema,
};

/** The parsed planes, stacks and default assembly the cross-checks look at. */
export type RoofShapeParsed = {
  planes: z.output<typeof planeSchema>[];
  stacks: z.output<typeof stackSchema>[];
  defaultStackId: string;
};

/**
 * The cross-checks of a roof whose fields are already parsed (duplicate ids, unknown assemblies, an eave edge
 * or edge type out of range, outlines that cross themselves, have no area or dip below the eave line), as
 * issues with the field paths the forms show. The takeoff input runs them after parsing; a schema that
 * parses the same planes and stacks itself (the roof save) calls this on its own parsed values instead of
 * parsing them a second time. Each plane's geometry is worked out once per parsed plane object
 * (`planeGeometryOfParsed`), so the engine reuses it when it gets the same objects.
 */
export function checkRoofShape(v: RoofShapeParsed, ctx: z.RefinementCtx): void {
  const stackIds = new Set<string>();
  v.stacks.forEach((s, i) => {
    if (stackIds.has(s.id)) ctx.addIssue({ code: "custom", message: "Duplicate assembly id", path: ["stacks", i, "id"] });
    stackIds.add(s.id);
  });
  if (!stackIds.has(v.defaultStackId)) {
    ctx.addIssue({ code: "custom", message: `Unknown assembly "${v.defaultStackId}"`, path: ["defaultStackId"] });
  }
  const planeIds = new Set<string>();
  v.planes.forEach((p, i) => {
    if (planeIds.has(p.id)) ctx.addIssue({ code: "custom", message: "Duplicate plane id", path: ["planes", i, "id"] });
    planeIds.add(p.id);
    if (p.stackId !== undefined && !stackIds.has(p.stackId)) {
      ctx.addIssue({ code: "custom", message: `Unknown assembly "${p.stackId}"`, path: ["planes", i, "stackId"] });
    }
    const n = p.outline.length;
    if (p.eaveEdge >= n) {
      ctx.addIssue({ code: "custom", message: `The eave edge must be an edge number from 0 to ${n - 1}`, path: ["planes", i, "eaveEdge"] });
      return;
    }
    for (const key of Object.keys(p.edgeTypes)) {
      if (Number(key) >= n) {
        ctx.addIssue({ code: "custom", message: `There is no edge ${key} (edges 0 to ${n - 1})`, path: ["planes", i, "edgeTypes", key] });
      }
    }
    // The geometric checks (self-intersection, zero area, a corner below the eave line).
    if (!(p.pitch >= 0 && p.pitch <= 24) || n < 3) return; // reported by the field's own check
    const g = planeGeometryOfParsed(p, i);
    if (isGeometryError(g)) ctx.addIssue({ code: "custom", message: g.reason, path: g.path });
  });
}

export const takeoffInputSchema = z.object(baseShape).superRefine(checkRoofShape);
export type TakeoffInput = z.output<typeof takeoffInputSchema>;
export type TakeoffInputRaw = z.input<typeof takeoffInputSchema>;
export type PlaneInput = TakeoffInput["planes"][number];
export type StackInput = TakeoffInput["stacks"][number];
export type SiteInput = TakeoffInput["site"];

/**
 * Query of the calculation routes: `detail=full` asks for each plane's whole detail (corner heights, where each
 * edge piece lies and what it meets, wind zones and layers per plane); by default each plane carries its
 * quantities (areas, squares, typed edges with their lengths, panels and cut list), as the roof-wide figures do.
 */
export const calcQuerySchema = z.object({
  detail: z.enum(["quantities", "full"], { error: 'Use detail=quantities or detail=full' }).default("quantities"),
});

export const gapStudyInputSchema = z
  .object({ ...baseShape, planeIds: z.array(id, { error: "Required" }).min(1, "Choose at least one plane").max(MAX_PLANES, `At most ${MAX_PLANES} planes`) })
  .superRefine((v, ctx) => {
    checkRoofShape(v, ctx);
    const known = new Set(v.planes.map((p) => p.id));
    v.planeIds.forEach((pid, i) => {
      if (!known.has(pid)) ctx.addIssue({ code: "custom", message: `Unknown plane "${pid}"`, path: ["planeIds", i] });
    });
  });
export type GapStudyInput = z.output<typeof gapStudyInputSchema>;
export type GapStudyInputRaw = z.input<typeof gapStudyInputSchema>;
