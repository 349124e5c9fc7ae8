/**
 * The output schemas (shared/schemas/takeoff-result.ts) against the engine: at compile time, each schema's
 * z.output is the engine's own type (both ways); at run time, real takeoff and gap-study answers over a wide
 * spread of roofs parse under the strict schemas, as returned and after a JSON round trip (what the API
 * sends), and the spread reaches the optional and nullable branches. Extra keys, missing keys and wrong enum
 * values are refused.
 */
import { isDeepStrictEqual } from "node:util";
import { describe, expect, expectTypeOf, it } from "vitest";
import { z } from "zod";
import { computeTakeoff, computeTakeoffQuantities } from "@shared/engine/takeoff";
import { computeGapStudy, type GapStudyOptionResult, type GapStudySummary } from "@shared/engine/gap-study";
import { buildBenchRoof } from "@shared/engine/roof/bench-roof";
import { gableRoof, hipRoof, lShapeGableRoof, shedRoof } from "@shared/engine/roof/generators";
import { EDGE_TYPES } from "@shared/engine/roof/edge-types";
import { SEVERITIES, type Advisory } from "@shared/engine/advisory";
import type { MaterialLine } from "@shared/engine/materials";
import type { EdgeTotals } from "@shared/engine/roof/edges";
import type { CutListEntry } from "@shared/engine/roof/panels";
import type { ChannelResult } from "@shared/engine/ventilation/channel";
import type { VentilationResult } from "@shared/engine/ventilation/index";
import type { CoolRoofResult, DewPointCheck, ThermalResult } from "@shared/engine/thermal/index";
import type { PlaneWindZones, ZoneCounts } from "@shared/engine/wind/zones";
import type {
  EdgeQuantities,
  EdgeResult,
  FastenersResult,
  PanelQuantities,
  PanelsResult,
  PlaneLayersResult,
  PlaneQuantities,
  PlaneResult,
  StackResult,
  TakeoffQuantities,
  TakeoffResult,
  TakeoffTotals,
  WindResult,
  ZoneFasteners,
} from "@shared/engine/types";
import {
  advisorySchema,
  channelSchema,
  coolRoofSchema,
  cutListEntrySchema,
  dewPointSchema,
  edgeQuantitiesSchema,
  edgeResultSchema,
  edgeTotalsSchema,
  fastenersSchema,
  gapStudyQuantitiesSchema,
  gapStudyResultSchema,
  gapStudySummarySchema,
  materialLineSchema,
  panelQuantitiesSchema,
  panelsResultSchema,
  planeLayersSchema,
  planeQuantitiesSchema,
  planeResultSchema,
  planeWindZonesSchema,
  roofThermalSchema,
  stackResultSchema,
  takeoffQuantitiesSchema,
  takeoffResultSchema,
  thermalSchema,
  totalsSchema,
  ventilationSchema,
  windSchema,
  zoneCountsSchema,
  zoneFastenersSchema,
} from "@shared/schemas/takeoff-result";

// ---------------------------------------------------------------------------------------------------
// types: z.output of each schema is the engine's type, both ways (tsc fails when they drift)
// ---------------------------------------------------------------------------------------------------

describe("each output schema's type is the engine's type", () => {
  it("parts", () => {
    expectTypeOf<z.output<typeof edgeQuantitiesSchema>>().toEqualTypeOf<EdgeQuantities>();
    expectTypeOf<z.output<typeof edgeResultSchema>>().toEqualTypeOf<EdgeResult>();
    expectTypeOf<z.output<typeof edgeTotalsSchema>>().toEqualTypeOf<EdgeTotals>();
    expectTypeOf<z.output<typeof cutListEntrySchema>>().toEqualTypeOf<CutListEntry>();
    expectTypeOf<z.output<typeof panelQuantitiesSchema>>().toEqualTypeOf<PanelQuantities>();
    expectTypeOf<z.output<typeof panelsResultSchema>>().toEqualTypeOf<PanelsResult>();
    expectTypeOf<z.output<typeof planeLayersSchema>>().toEqualTypeOf<PlaneLayersResult>();
    expectTypeOf<z.output<typeof zoneCountsSchema>>().toEqualTypeOf<ZoneCounts>();
    expectTypeOf<z.output<typeof planeWindZonesSchema>>().toEqualTypeOf<PlaneWindZones>();
    expectTypeOf<z.output<typeof planeQuantitiesSchema>>().toEqualTypeOf<PlaneQuantities>();
    expectTypeOf<z.output<typeof planeResultSchema>>().toEqualTypeOf<PlaneResult>();
    expectTypeOf<z.output<typeof zoneFastenersSchema>>().toEqualTypeOf<ZoneFasteners>();
    expectTypeOf<z.output<typeof fastenersSchema>>().toEqualTypeOf<FastenersResult>();
    expectTypeOf<z.output<typeof windSchema>>().toEqualTypeOf<WindResult>();
    expectTypeOf<z.output<typeof channelSchema>>().toEqualTypeOf<ChannelResult>();
    expectTypeOf<z.output<typeof coolRoofSchema>>().toEqualTypeOf<CoolRoofResult>();
    expectTypeOf<z.output<typeof dewPointSchema>>().toEqualTypeOf<DewPointCheck>();
    expectTypeOf<z.output<typeof thermalSchema>>().toEqualTypeOf<ThermalResult>();
    // The roof's thermal is an intersection (ThermalResult & { stackId }) in the engine: .branded compares
    // the two types member by member rather than by their written form.
    expectTypeOf<z.output<typeof roofThermalSchema>>().branded.toEqualTypeOf<TakeoffResult["thermal"]>();
    expectTypeOf<z.output<typeof ventilationSchema>>().toEqualTypeOf<VentilationResult>();
    expectTypeOf<z.output<typeof stackResultSchema>>().toEqualTypeOf<StackResult>();
    expectTypeOf<z.output<typeof totalsSchema>>().toEqualTypeOf<TakeoffTotals>();
    expectTypeOf<z.output<typeof materialLineSchema>>().toEqualTypeOf<MaterialLine>();
    expectTypeOf<z.output<typeof advisorySchema>>().toEqualTypeOf<Advisory>();
    expectTypeOf<z.output<typeof gapStudySummarySchema>>().toEqualTypeOf<GapStudySummary>();
  });

  it("answers", () => {
    // .branded: the answers hold the roof thermal intersection (see above).
    expectTypeOf<z.output<typeof takeoffQuantitiesSchema>>().branded.toEqualTypeOf<TakeoffQuantities>();
    expectTypeOf<z.output<typeof takeoffResultSchema>>().branded.toEqualTypeOf<TakeoffResult>();
    expectTypeOf<z.output<typeof gapStudyQuantitiesSchema>>().branded.toEqualTypeOf<{ options: GapStudyOptionResult<PlaneQuantities>[] }>();
    expectTypeOf<z.output<typeof gapStudyResultSchema>>().branded.toEqualTypeOf<{ options: GapStudyOptionResult[] }>();
    // No transforms: what is sent is what is read.
    expectTypeOf<z.input<typeof takeoffResultSchema>>().branded.toEqualTypeOf<TakeoffResult>();
    expectTypeOf<z.input<typeof gapStudyQuantitiesSchema>>().branded.toEqualTypeOf<{ options: GapStudyOptionResult<PlaneQuantities>[] }>();
  });
});

// ---------------------------------------------------------------------------------------------------
// inputs: a spread of roofs, assemblies and sites
// ---------------------------------------------------------------------------------------------------

type Obj = Record<string, unknown>;
const roof = (planes: unknown[], stacks: Obj[] = [{ id: "s" }], site: Obj = {}): Obj => ({ site, planes, stacks, defaultStackId: stacks[0].id });
const lShape = (pitch: number) => lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 26, wingWidthFt: 18, wingDepthFt: 12, wingOffsetFt: 10 }, pitch);

const roofs: [string, Obj][] = [
  ["a 6/12 gable, all defaults", roof(gableRoof(40, 30, 6))],
  [
    "a 5/12 gable with the ridge along y, exposed-fastener panels, No. 15 felt, wind speed and exposure given",
    roof(
      gableRoof(30, 40, 5, { ridgeAlong: "y" }),
      [{ id: "s", panel: { system: "exposed-fastener", coverageWidthIn: 36 }, underlayment: { kind: "felt", feltNumber: 15 } }],
      { wind: { basicWindSpeedMph: 130, exposure: "C" } },
    ),
  ],
  [
    "an 8/12 hip roof: battens over counter-battens (2x2 over 1x3, treated), foil under the panels facing down, aluminium panels",
    roof(hipRoof(44, 30, 8), [
      {
        id: "s",
        spacer: { kind: "battens", battens: { nominal: "2x2", spacingIn: 16, counterBattens: true, counterBattenNominal: "1x3", treated: true } },
        radiantBarrier: { kind: "foil", position: "under-panels", reflectiveFace: "down" },
        panel: { substrate: "aluminum" },
      },
    ]),
  ],
  ["a square pyramid hip, 10/12, foil on the deck facing up with no gap", roof(hipRoof(30, 30, 10), [{ id: "s", radiantBarrier: { kind: "foil" } }])],
  [
    "an L-shaped 9/12 roof with edge-type overrides (sidewall, headwall, transition)",
    roof(
      lShape(9).map((p, i) => (i === 0 ? { ...p, edgeTypes: { 1: "sidewall" } } : i === 1 ? { ...p, edgeTypes: { 1: "headwall", 2: "transition" } } : p)),
      [{ id: "s", panel: { system: "exposed-fastener", coverageWidthIn: 36 } }],
    ),
  ],
  [
    "a 3/12 shed: horizontal battens alone under standing seam (clip spacing limited, channel blocked), above-deck claimed",
    roof(shedRoof(16, 10, 3), [
      { id: "s", spacer: { kind: "battens", battens: { spacingIn: 24, counterBattens: false } }, panel: { clipSpacingIn: { corner: 12 } }, ventilation: { aboveDeckClaimed: true } },
    ]),
  ],
  ["a 1/12 low-slope gable with the mean roof height given", roof(gableRoof(40, 30, 1), [{ id: "s", panel: { lapSealant: true } }], { wind: { meanRoofHeightFt: 14 } })],
  ["a 2/12 shed without the mean roof height", roof(shedRoof(24, 12, 2), [{ id: "s", panel: { system: "exposed-fastener", coverageWidthIn: 36 } }])],
  [
    "a 6/12 gable whose north slope is two planes (the ridge splits into two pieces)",
    roof([
      { id: "s", pitch: 6, eaveEdge: 0, outline: [[0, 0], [40, 0], [40, 15], [0, 15]] },
      { id: "nw", pitch: 6, eaveEdge: 0, outline: [[20, 30], [0, 30], [0, 15], [20, 15]] },
      { id: "ne", pitch: 6, eaveEdge: 0, outline: [[40, 30], [20, 30], [20, 15], [40, 15]] },
    ]),
  ],
  ["a steep 16/12 gable", roof(gableRoof(30, 24, 16))],
  ["a steep 14/12 hip with the mean roof height given", roof(hipRoof(40, 30, 14), [{ id: "s" }], { wind: { meanRoofHeightFt: 22 } })],
  [
    "an unvented attic in humid zone 2A (dew point), dimpled sheet, cool roof required with a dark finish",
    roof(gableRoof(36, 28, 4), [{ id: "s", spacer: { kind: "dimpled" }, panel: { solarReflectance: 0.1, thermalEmittance: 0.8 } }], {
      atticType: "unvented",
      climateZone: "2A",
      coolRoofRequired: true,
    }),
  ],
  [
    "a cathedral ceiling, mesh mat claimed as ventilation, the 1/300 exception in zone 7 with the floor area given",
    roof(gableRoof(32, 24, 7), [{ id: "s", spacer: { kind: "mesh", thicknessIn: 0.5 }, ventilation: { aboveDeckClaimed: true, ventHips: true } }], {
      atticType: "cathedral",
      ventException: true,
      atticFloorAreaSqFt: 700,
      climateZone: "7",
    }),
  ],
  [
    "an enclosed gap (dimpled sheet closed at the top) with a light finish and cool roof required",
    roof(gableRoof(30, 20, 6), [{ id: "s", spacer: { kind: "dimpled" }, ventilation: { topOpen: false }, panel: { solarReflectance: 0.6, thermalEmittance: 0.85 } }], {
      coolRoofRequired: true,
      climateZone: "3A",
    }),
  ],
  [
    "a re-roof over two existing layers, deck replaced, penetrations of every kind",
    roof(
      gableRoof(40, 30, 6).map((p, i) =>
        i === 0
          ? {
              ...p,
              penetrations: [
                { kind: "chimney", widthIn: 36, lengthIn: 24 },
                { kind: "pipe", diameterIn: 2 },
                { kind: "pipe", diameterIn: 5, count: 2 },
                { kind: "pipe", diameterIn: 8 },
                { kind: "pipe", diameterIn: 12 },
                { kind: "skylight", widthIn: 24, lengthIn: 48 },
                { kind: "vent" },
                { kind: "other" },
              ],
            }
          : p,
      ),
      [{ id: "s", deck: { action: "replace", material: "osb" } }],
      { existingLayers: 2, tearOff: false },
    ),
  ],
  [
    "ice-dam risk with self-adhered underlayment over the whole deck, deck repaired",
    roof(hipRoof(40, 28, 5), [{ id: "s", underlayment: { kind: "self-adhered" }, deck: { action: "repair", repairSharePct: 15 } }], { iceDamRisk: true, climateZone: "6A" }),
  ],
  [
    "ice barrier asked for on two layers of synthetic underlayment, 2012 code, zone 6",
    roof(gableRoof(40, 30, 3), [{ id: "s", underlayment: { layers: 2, iceBarrier: true } }], { codeEdition: 2012, climateZone: "6" }),
  ],
  ["ice-dam risk stated but the ice barrier turned off", roof(gableRoof(30, 24, 6), [{ id: "s", underlayment: { iceBarrier: false } }], { iceDamRisk: true })],
  [
    "a rated assembly required, no spacer (tested)",
    roof(gableRoof(36, 24, 6), [{ id: "s" }], { wind: { ratedAssemblyRequired: true, basicWindSpeedMph: 150, exposure: "D", meanRoofHeightFt: 20 } }),
  ],
  [
    "a rated assembly required over a mesh mat (not tested), two named assemblies",
    {
      site: { wind: { ratedAssemblyRequired: true, leastHorizontalDimensionFt: 28 } },
      planes: lShape(6).map((p, i) => ({ ...p, stackId: i < 2 ? "main" : "wing" })),
      stacks: [
        { id: "main", name: "Main house", spacer: { kind: "mesh" } },
        { id: "wing", spacer: { kind: "none" }, panel: { maxLengthFt: 10, hemAllowanceIn: 1.5, start: "centred" } },
      ],
      defaultStackId: "main",
    },
  ],
  ["a long plane past the longest panel allowed", roof(gableRoof(30, 90, 6), [{ id: "s", panel: { maxLengthFt: 30, start: "right" } }])],
  ["the generated 1-plane roof", buildBenchRoof(1) as Obj],
  ["the generated 7-plane roof", buildBenchRoof(7) as Obj],
  ["the generated 40-plane roof", buildBenchRoof(40) as Obj],
  ["the generated 101-plane roof", buildBenchRoof(101) as Obj],
];

type Full = TakeoffResult;
type Lean = TakeoffQuantities;

function run(input: Obj): { full: Full; lean: Lean } {
  const full = computeTakeoff(input);
  const lean = computeTakeoffQuantities(input);
  if (!full.ok) throw new Error(`refused: ${full.reason} at ${full.path.join(".")}`);
  if (!lean.ok) throw new Error(`refused: ${lean.reason} at ${lean.path.join(".")}`);
  return { full: full.result, lean: lean.result };
}

/** Parses strictly; on failure the message lists every issue with its path. */
function expectParses(schema: z.ZodType, value: unknown): void {
  const r = schema.safeParse(value);
  if (!r.success) throw new Error(z.prettifyError(r.error));
  // No transform, default or stripping: the parsed value is the value (node's deep equality: quicker than
  // toEqual on a large answer, and stricter).
  expect(isDeepStrictEqual(r.data, value)).toBe(true);
}

const jsonRoundTrip = <T>(v: T): T => JSON.parse(JSON.stringify(v)) as T;

const results = new Map<string, { full: Full; lean: Lean }>();
const resultOf = (name: string, input: Obj) => {
  let r = results.get(name);
  if (!r) {
    r = run(input);
    results.set(name, r);
  }
  return r;
};

// ---------------------------------------------------------------------------------------------------
// runtime: real answers parse
// ---------------------------------------------------------------------------------------------------

describe("real takeoff answers parse under the strict output schemas", () => {
  it.each(roofs)("%s", (name, input) => {
    const { full, lean } = resultOf(name, input);
    expectParses(takeoffResultSchema, full);
    expectParses(takeoffQuantitiesSchema, lean);
    // What the API sends: the same after JSON (no undefined-valued keys, no NaN or Infinity turned to null).
    expectParses(takeoffResultSchema, jsonRoundTrip(full));
    expectParses(takeoffQuantitiesSchema, jsonRoundTrip(lean));
    // The two details are not interchangeable: each schema names exactly its own plane keys.
    expect(takeoffQuantitiesSchema.safeParse(full).success).toBe(false);
    expect(takeoffResultSchema.safeParse(lean).success).toBe(false);
  });

  it("the spread reaches every optional and nullable branch of the schemas", () => {
    for (const [name, input] of roofs) resultOf(name, input);
    const all = [...results.values()].map((r) => r.full);
    const planes = all.flatMap((r) => r.planes);
    const layers = planes.map((p) => p.layers);
    const edges = planes.flatMap((p) => p.edges);
    const thermals = all.flatMap((r) => r.stacks.map((s) => s.thermal));
    const seen = <T>(xs: T[]) => new Set(xs);

    expect(seen(edges.map((e) => e.type))).toEqual(new Set(EDGE_TYPES));
    expect(edges.some((e) => e.overridden && e.type !== e.computedType)).toBe(true);
    expect(seen(edges.map((e) => e.sharedWith === null))).toEqual(new Set([true, false]));
    expect(seen(edges.map((e) => e.part > 0))).toEqual(new Set([true, false]));
    expect(seen(planes.map((p) => p.panels.system))).toEqual(new Set(["standing-seam", "exposed-fastener"]));

    // Ice barrier: none, courses added, and the self-adhered note (the optional key).
    expect(layers.some((l) => l.iceBarrier === null)).toBe(true);
    expect(layers.some((l) => l.iceBarrier !== null && l.iceBarrier.courses > 0 && l.iceBarrier.note === undefined)).toBe(true);
    expect(layers.some((l) => l.iceBarrier?.note !== undefined && l.iceBarrier.courses === 0)).toBe(true);
    expect(layers.some((l) => l.battens !== null && l.counterBattens === null)).toBe(true);
    expect(layers.some((l) => l.battens !== null && l.counterBattens !== null)).toBe(true);
    for (const k of ["meshSqFt", "dimpledSqFt", "foilSqFt", "deckSqFt"] as const) expect(layers.some((l) => l[k] > 0)).toBe(true);

    // Wind zones: both models, the low-slope one with its zone 1 widths (optional keys), limits by battens.
    const lowSlope = planes.filter((p) => p.windZones.model === "low-slope");
    expect(lowSlope.length).toBeGreaterThan(0);
    for (const p of lowSlope) expect(p.windZones.widths.zone1PlanFt).toBeGreaterThan(0);
    expect(planes.some((p) => p.windZones.model === "steep" && !("zone1PlanFt" in p.windZones.widths))).toBe(true);
    expect(planes.some((p) => p.windZones.zone3AsZone2)).toBe(true);
    expect(planes.some((p) => p.windZones.spacingLimitedByBattens.length > 0)).toBe(true);

    // Roof-wide: every ventilation mode and ratio, every uplift state, wind inputs given and not.
    expect(seen(all.map((r) => r.ventilation.mode))).toEqual(new Set(["attic", "unvented", "cathedral"]));
    expect(seen(all.map((r) => r.ventilation.ratio))).toEqual(new Set([150, 300, null]));
    expect(seen(all.flatMap((r) => r.stacks.map((s) => s.upliftAssembly)))).toEqual(new Set(["tested", "not-tested-needs-review", "not-required"]));
    expect(seen(all.map((r) => r.wind.exposure === null))).toEqual(new Set([true, false]));
    expect(seen(all.map((r) => r.wind.meanRoofHeightFt === null))).toEqual(new Set([true, false]));
    expect(seen(all.map((r) => r.wind.basicWindSpeedMph === null))).toEqual(new Set([true, false]));
    expect(seen(all.flatMap((r) => r.stacks.map((s) => s.name === null)))).toEqual(new Set([true, false]));
    expect(seen(all.flatMap((r) => r.stacks.map((s) => s.channel.kind)))).toEqual(new Set(["none", "battens", "mesh", "dimpled"]));
    expect(all.some((r) => r.stacks.some((s) => s.channel.blockedByBattens && s.channel.reasons.length > 0))).toBe(true);

    // Thermal: no gap, ventilated gap, enclosed gap (R values), cool roof met and not, dew point.
    expect(thermals.some((t) => t.effectiveEmittance === null)).toBe(true);
    expect(thermals.some((t) => t.ventilated && t.airSpaceRSummer === null)).toBe(true);
    expect(thermals.some((t) => t.airSpaceRSummer !== null && t.airSpaceRWinterSi !== null)).toBe(true);
    expect(seen(thermals.map((t) => t.coolRoof?.meets ?? null))).toEqual(new Set([true, false, null]));
    expect(thermals.some((t) => t.dewPoint !== null)).toBe(true);
    expect(thermals.some((t) => t.dewPoint === null)).toBe(true);

    expect(seen(all.flatMap((r) => r.advisories.map((a) => a.severity)))).toEqual(new Set(SEVERITIES));
    expect(all.some((r) => r.advisories.some((a) => a.planeIds.length === 0))).toBe(true);
    // Materials: quantities in whole purchase units except panels (linear feet to 4 decimals).
    const materials = all.flatMap((r) => r.materials);
    expect(materials.some((m) => m.key.startsWith("pipe-boot-"))).toBe(true);
    for (const m of materials) if (m.category !== "panels") expect(Number.isInteger(m.quantity)).toBe(true);
  });
});

describe("real gap-study answers parse under the strict output schemas", () => {
  const studies: [string, Obj][] = [
    ["two planes of the generated 12-plane roof", { ...(buildBenchRoof(12) as Obj), planeIds: ["b0-main-s", "b0-main-n"] }],
    [
      "an 8/12 hip with counter-battens and foil in a humid zone, one plane",
      { ...roof(hipRoof(44, 30, 8), [{ id: "s", spacer: { kind: "battens", battens: { counterBattens: true } }, radiantBarrier: { kind: "foil" } }], { climateZone: "3A" }), planeIds: ["p-s"] },
    ],
    [
      "an L-shaped roof with overrides over an unvented attic, rated assembly required",
      {
        ...roof(lShape(5).map((p, i) => (i === 0 ? { ...p, edgeTypes: { 1: "sidewall" } } : p)), [{ id: "s" }], { atticType: "unvented", wind: { ratedAssemblyRequired: true } }),
        planeIds: ["p-main-s", "p-wing-w", "p-wing-e"],
      },
    ],
  ];

  it.each(studies)("%s", (_name, input) => {
    const full = computeGapStudy(input);
    const lean = computeGapStudy(input, "quantities");
    if (!full.ok || !lean.ok) throw new Error("gap study refused");
    expect(full.options.map((o) => o.spacer)).toEqual(["none", "battens", "counter-battens", "mesh", "dimpled"]);
    // The route answers { data: { options } }; the schemas describe { options }.
    expectParses(gapStudyResultSchema, { options: full.options });
    expectParses(gapStudyQuantitiesSchema, { options: lean.options });
    expectParses(gapStudyResultSchema, jsonRoundTrip({ options: full.options }));
    expectParses(gapStudyQuantitiesSchema, jsonRoundTrip({ options: lean.options }));
    expect(gapStudyQuantitiesSchema.safeParse({ options: full.options }).success).toBe(false);
    expect(gapStudyResultSchema.safeParse({ options: lean.options }).success).toBe(false);
    // The spacer options put material lines in the summaries (battens, mats and their fasteners).
    expect(full.options.some((o) => o.summary.spacerMaterials.length > 0)).toBe(true);
  });
});

// ---------------------------------------------------------------------------------------------------
// strictness: what the schemas refuse
// ---------------------------------------------------------------------------------------------------

describe("the output schemas are strict", () => {
  const base = () => structuredClone(resultOf(roofs[2][0], roofs[2][1]));

  /** The issues of a parse that must fail, as "path: code". */
  const issuesOf = (schema: z.ZodType, value: unknown) => {
    const r = schema.safeParse(value);
    expect(r.success).toBe(false);
    return r.error!.issues.map((i) => `${i.path.join(".")}: ${i.code}`);
  };

  it("refuses a key the schema does not name, at any depth", () => {
    const { full, lean } = base();
    expect(issuesOf(takeoffResultSchema, { ...full, priceCents: 100 })).toEqual([": unrecognized_keys"]);
    (full.planes[0].edges[0] as unknown as Obj).colour = "red";
    expect(issuesOf(takeoffResultSchema, full)).toEqual(["planes.0.edges.0: unrecognized_keys"]);
    (lean.fasteners.zones as unknown as Obj)["4"] = lean.fasteners.zones["3"];
    expect(issuesOf(takeoffQuantitiesSchema, lean)).toEqual(["fasteners.zones: unrecognized_keys"]);
  });

  it("refuses a missing key, a wrong enum value, a fraction where a count is whole, a string where null or a number is", () => {
    const { full, lean } = base();
    const noSheets = structuredClone(lean) as unknown as { totals: Obj };
    delete noSheets.totals.deckSheets;
    expect(issuesOf(takeoffQuantitiesSchema, noSheets)).toEqual(["totals.deckSheets: invalid_type"]);
    const noZone = structuredClone(lean) as unknown as { fasteners: { zones: Obj } };
    delete noZone.fasteners.zones["1'"];
    expect(issuesOf(takeoffQuantitiesSchema, noZone)).toEqual(["fasteners.zones.1': invalid_type"]);

    (lean.planes[0].edges[0] as unknown as Obj).type = "gutter";
    expect(issuesOf(takeoffQuantitiesSchema, lean)).toEqual(["planes.0.edges.0.type: invalid_value"]);
    const badSeverity = structuredClone(full);
    (badSeverity.advisories[0] as unknown as Obj).severity = "critical";
    expect(issuesOf(takeoffResultSchema, badSeverity)).toEqual(["advisories.0.severity: invalid_value"]);
    const badKey = structuredClone(full);
    (badKey.materials[0] as unknown as Obj).key = "gutter-guard";
    expect(issuesOf(takeoffResultSchema, badKey)).toEqual(["materials.0.key: invalid_value"]);

    const fraction = structuredClone(full);
    fraction.totals.panelCount += 0.5;
    expect(issuesOf(takeoffResultSchema, fraction)).toEqual(["totals.panelCount: invalid_type"]);
    const negative = structuredClone(full);
    negative.fasteners.clips = -1;
    expect(issuesOf(takeoffResultSchema, negative)).toEqual(["fasteners.clips: too_small"]);
    const badNull = structuredClone(full);
    (badNull.wind as unknown as Obj).meanRoofHeightFt = "unknown";
    expect(issuesOf(takeoffResultSchema, badNull)).toEqual(["wind.meanRoofHeightFt: invalid_type"]);
    const nan = structuredClone(full);
    nan.planes[0].slopedAreaSqFt = Number.NaN;
    expect(issuesOf(takeoffResultSchema, nan)).toEqual(["planes.0.slopedAreaSqFt: invalid_type"]);
    const infinite = structuredClone(full);
    infinite.materials[0].quantity = Number.POSITIVE_INFINITY; // JSON would send it as null
    expect(issuesOf(takeoffResultSchema, infinite)).toEqual(["materials.0.quantity: invalid_type"]);
  });

  it("refuses a gap-study option that is not one of the five, and an option without its summary", () => {
    const input = { ...roof(gableRoof(30, 20, 6)), planeIds: ["p-s"] };
    const out = computeGapStudy(input, "quantities");
    if (!out.ok) throw new Error(out.reason);
    const renamed = structuredClone(out.options);
    (renamed[1] as unknown as Obj).spacer = "foam";
    expect(issuesOf(gapStudyQuantitiesSchema, { options: renamed })).toEqual(["options.1.spacer: invalid_value"]);
    const bare = out.options.map(({ spacer, result }) => ({ spacer, result }));
    expect(issuesOf(gapStudyQuantitiesSchema, { options: bare })).toHaveLength(5);
  });
});
