/**
 * The fast parse of the usual takeoff input (shared/schemas/takeoff-fast.ts) must answer exactly as the zod
 * schemas do, or decline. These tests compare each function with its schema on generated values (valid ones and
 * ones with a wrong field), and the whole takeoff input with the same input parsed by the schemas alone, as it was
 * before the fast path: the same answer, or the same issues.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { z } from "zod";
import {
  checkRoofShape,
  MAX_PLANES,
  MAX_STACKS,
  parsePlaneFast,
  parseSiteFast,
  parseStackFast,
  planeSchema,
  rulesSchema,
  siteSchema,
  stackSchema,
  takeoffInputSchema,
} from "@shared/schemas/takeoff";
import { buildBenchRoof } from "@shared/engine/roof/bench-roof";
import { gableRoof, hipRoof, lShapeGableRoof, shedRoof } from "@shared/engine/roof/generators";

/** A value's keys in order with their values, all the way down (undefined values kept), for toStrictEqual. */
const shape = (v: unknown): unknown =>
  Array.isArray(v) ? v.map(shape) : v !== null && typeof v === "object" ? Object.entries(v).map(([k, x]) => [k, shape(x)]) : v;

const validCoord = fc.oneof(fc.integer({ min: -1000, max: 1000 }), fc.double({ min: -1000, max: 1000, noNaN: true }));
const validOutline = fc.array(fc.tuple(validCoord, validCoord), { minLength: 3, maxLength: 8 });
const badCorner = fc.constantFrom<unknown>([1], [1, 2, 3], ["a", 2], [Number.NaN, 0], [0, Infinity], [2000, 0], [0, -1000.5], null, "1,2", { 0: 1, 1: 2 });
const outline = fc.oneof(
  { weight: 6, arbitrary: validOutline },
  { weight: 1, arbitrary: fc.tuple(validOutline, badCorner, fc.nat(8)).map(([o, c, at]) => { const x: unknown[] = [...o]; x.splice(at % (x.length + 1), 0, c); return x; }) },
  { weight: 1, arbitrary: fc.constantFrom<unknown>(undefined, null, "[[0,0]]", [[0, 0], [1, 1]], {}) },
  { weight: 1, arbitrary: fc.array(fc.tuple(fc.integer(), fc.integer()), { minLength: 199, maxLength: 202 }) },
);
const edgeTypes = fc.oneof(
  { weight: 3, arbitrary: fc.constant(undefined) },
  { weight: 2, arbitrary: fc.dictionary(fc.nat(300).map(String), fc.constantFrom("eave", "rake", "ridge", "hip", "valley", "transition", "sidewall", "headwall"), { maxKeys: 4 }) },
  {
    weight: 1,
    arbitrary: fc.constantFrom<unknown>(
      {},
      { x: "eave" },
      { "1": "gutter" },
      { "01": "rake" },
      [],
      null,
      "eave",
      JSON.parse('{"__proto__": "eave"}'),
      Object.create(null),
      Object.fromEntries(Array.from({ length: 201 }, (_, i) => [String(i), "eave"])),
      Object.fromEntries(Array.from({ length: 200 }, (_, i) => [String(i), "rake"])),
    ),
  },
);
const penetration = fc.record(
  {
    id: fc.oneof(fc.string({ maxLength: 6 }), fc.constantFrom<unknown>(undefined, "", "x".repeat(101), 5)),
    kind: fc.constantFrom<unknown>(undefined, "pipe", "chimney", "skylight", "vent", "other", "hole", 1),
    diameterIn: fc.oneof(fc.double({ min: 0, max: 40, noNaN: true }), fc.constantFrom<unknown>(undefined, -1, Number.NaN, "3")),
    widthIn: fc.oneof(fc.nat(60), fc.constantFrom<unknown>(undefined, -0.5)),
    lengthIn: fc.oneof(fc.nat(60), fc.constantFrom<unknown>(undefined, null)),
    count: fc.constantFrom<unknown>(undefined, 1, 2, 7, 0, 1.5, -1, "2"),
    other: fc.constant("dropped"),
  },
  { requiredKeys: [] },
);
const penetrations = fc.oneof(
  fc.constant(undefined),
  fc.array(penetration, { maxLength: 3 }),
  fc.constantFrom<unknown>(null, {}, [null], ["pipe"], Array.from({ length: 201 }, () => ({}))),
);
/** A plane with each key present or not, most values valid, some not (so both answers are seen). */
const plane = fc.record(
  {
    id: fc.oneof({ weight: 8, arbitrary: fc.string({ minLength: 1, maxLength: 8 }) }, { weight: 1, arbitrary: fc.constantFrom<unknown>("", "p".repeat(101), "p".repeat(100), 7, null) }),
    name: fc.oneof(fc.string({ maxLength: 12 }), fc.constantFrom<unknown>(undefined, "n".repeat(120), "n".repeat(121), null, 5)),
    pitch: fc.oneof({ weight: 8, arbitrary: fc.oneof(fc.integer({ min: 0, max: 24 }), fc.double({ min: 0, max: 24, noNaN: true })) }, { weight: 1, arbitrary: fc.constantFrom<unknown>(-0, -1e-9, 24.0000001, 25, Number.NaN, Infinity, "4", undefined) }),
    outline,
    eaveEdge: fc.oneof({ weight: 8, arbitrary: fc.nat(9) }, { weight: 1, arbitrary: fc.constantFrom<unknown>(-1, 1.5, "0", undefined, 2 ** 60, Number.NaN) }),
    baseElevationFt: fc.oneof(fc.double({ min: -50, max: 50, noNaN: true }), fc.constantFrom<unknown>(undefined, Number.NaN, -Infinity, "0", null)),
    eaveOverhangIn: fc.oneof(fc.double({ min: 0, max: 36, noNaN: true }), fc.constantFrom<unknown>(undefined, -1, null, Infinity)),
    edgeTypes,
    stackId: fc.oneof(fc.constantFrom<unknown>("s", "t", undefined), fc.constantFrom<unknown>("", "s".repeat(101), 5, null)),
    penetrations,
    unknownKey: fc.anything({ maxDepth: 1 }),
  },
  { requiredKeys: [] },
);

/** A penetration whose every field is valid (each present or not). */
const validPenetration = fc.record(
  { id: fc.string({ maxLength: 6 }), kind: fc.constantFrom("pipe", "chimney", "skylight", "vent", "other"), diameterIn: fc.nat(8), widthIn: fc.nat(60), lengthIn: fc.nat(60), count: fc.integer({ min: 1, max: 3 }) },
  { requiredKeys: [] },
);
/** A plane whose every field is valid (the optional ones present or not, or present as undefined). */
const validPlane = fc.record(
  {
    id: fc.string({ minLength: 1, maxLength: 8 }),
    name: fc.oneof(fc.string({ maxLength: 12 }), fc.constant(undefined)),
    pitch: fc.oneof(fc.integer({ min: 0, max: 24 }), fc.double({ min: 0, max: 24, noNaN: true })),
    outline: validOutline,
    eaveEdge: fc.nat(9),
    baseElevationFt: fc.oneof(fc.double({ min: -50, max: 50, noNaN: true }), fc.constant(undefined)),
    eaveOverhangIn: fc.oneof(fc.double({ min: 0, max: 36, noNaN: true }), fc.constant(undefined)),
    edgeTypes: fc.oneof(fc.constant(undefined), fc.dictionary(fc.nat(300).map(String), fc.constantFrom("eave", "rake", "ridge", "hip", "valley"), { maxKeys: 4 })),
    stackId: fc.constantFrom("s", "t", undefined),
    penetrations: fc.oneof(fc.constant(undefined), fc.array(validPenetration, { maxLength: 2 })),
  },
  { requiredKeys: ["id", "pitch", "outline", "eaveEdge"] },
);
/** A valid value with one field taken from a generated value that may be wrong (so a single wrong field is common). */
const withOneFieldOf = <T extends object>(valid: fc.Arbitrary<T>, mixed: fc.Arbitrary<object>, keys: string[]) =>
  fc.tuple(valid, mixed, fc.constantFrom(...keys)).map(([v, m, k]) => (k in m ? { ...v, [k]: (m as Record<string, unknown>)[k] } : v));
const oneBadPenetrationPlane = fc
  .tuple(validPlane, withOneFieldOf(validPenetration, penetration, ["id", "kind", "diameterIn", "widthIn", "lengthIn", "count"]))
  .map(([p, pen]) => ({ ...p, penetrations: [pen] }));
const anyPlane = fc.oneof(
  validPlane,
  plane,
  withOneFieldOf(validPlane, plane, ["id", "name", "pitch", "outline", "eaveEdge", "baseElevationFt", "eaveOverhangIn", "edgeTypes", "stackId", "penetrations"]),
  oneBadPenetrationPlane,
);

/** A field's value: usually valid, sometimes left as undefined, sometimes one of `bad`. */
type Field = <T>(valid: fc.Arbitrary<T>, ...bad: unknown[]) => fc.Arbitrary<unknown>;
const anyField: Field = (valid, ...bad) =>
  fc.oneof({ weight: 6, arbitrary: valid as fc.Arbitrary<unknown> }, { weight: 1, arbitrary: fc.constant(undefined) }, { weight: 1, arbitrary: fc.constantFrom<unknown>(...bad, null, "x") });
/** The same, a bad value seldom (so that an assembly often has exactly one, which the fast parse must refuse). */
const seldomBadField: Field = (valid, ...bad) =>
  fc.oneof({ weight: 60, arbitrary: valid as fc.Arbitrary<unknown> }, { weight: 8, arbitrary: fc.constant(undefined) }, { weight: 1, arbitrary: fc.constantFrom<unknown>(...bad, null, "x") });
/** The same, never one of the bad values (for assemblies and sites the schema accepts). */
const goodField: Field = (valid) => fc.oneof({ weight: 6, arbitrary: valid as fc.Arbitrary<unknown> }, { weight: 1, arbitrary: fc.constant(undefined) });
/** Assemblies and sites made with `field`: anyField gives some with a wrong value, goodField only valid ones. */
function inputParts(field: Field) {
  const sizeField = field(fc.double({ min: 0, max: 500, noNaN: true }), -1, Number.NaN, Infinity, "4");
  const positiveField = field(fc.double({ min: 0.001, max: 500, noNaN: true }), 0, -0, -2, Number.NaN);
  const boolField = field(fc.boolean(), 0, 1, "true");
  const fractionField = field(fc.double({ min: 0, max: 1, noNaN: true }), 1.01, -0.01, Number.NaN);
  const emittanceField = field(fc.double({ min: 0.01, max: 1, noNaN: true }), 0, 0.009, 1.1);
  /** A sub-object with each key present or not (or the whole thing left out, or not an object). */
  const part = (shape: Record<string, fc.Arbitrary<unknown>>) =>
    field === goodField
      ? fc.oneof({ weight: 8, arbitrary: fc.record({ ...shape, stray: fc.constant(1) }, { requiredKeys: [] }) as fc.Arbitrary<unknown> }, { weight: 1, arbitrary: fc.constant(undefined) })
      : fc.oneof({ weight: 8, arbitrary: fc.record({ ...shape, stray: fc.constant(1) }, { requiredKeys: [] }) as fc.Arbitrary<unknown> }, { weight: 1, arbitrary: fc.constantFrom<unknown>(undefined, null, [], "x") });
  const zoneValues = (f: fc.Arbitrary<unknown>) => part({ field: f, edge: f, corner: f });
  const stack = fc.record(
    {
      id: field === goodField ? fc.string({ minLength: 1, maxLength: 8 }) : field(fc.string({ minLength: 1, maxLength: 8 }), "", "s".repeat(101), 3),
      name: field(fc.string({ maxLength: 10 }), "n".repeat(121), 5),
      deck: part({ action: field(fc.constantFrom("keep", "repair", "replace"), "redo"), material: field(fc.constantFrom("plywood", "osb"), "mdf"), thicknessIn: positiveField, repairSharePct: field(fc.double({ min: 0, max: 100, noNaN: true }), 101, -1) }),
      underlayment: part({
        kind: field(fc.constantFrom("self-adhered", "synthetic", "felt"), "paper"),
        highTemp: boolField,
        feltNumber: field(fc.constantFrom(15, 30), 20, "30"),
        layers: field(fc.constantFrom(1, 2), 0, 3, 1.5),
        iceBarrier: boolField,
      }),
      spacer: part({
        kind: field(fc.constantFrom("none", "battens", "mesh", "dimpled"), "foam"),
        thicknessIn: positiveField,
        openFraction: fractionField,
        battens: part({
          nominal: field(fc.constantFrom("1x3", "1x4", "2x2", "2x4"), "2x6"),
          spacingIn: field(fc.double({ min: 6, max: 48, noNaN: true }), 5.9, -1),
          counterBattens: boolField,
          counterBattenNominal: field(fc.constantFrom("1x3", "1x4", "2x2", "2x4"), "1x2"),
          counterBattenSpacingIn: field(fc.double({ min: 6, max: 48, noNaN: true }), 2),
          treated: boolField,
        }),
      }),
      radiantBarrier: part({ kind: field(fc.constantFrom("none", "foil"), "film"), position: field(fc.constantFrom("on-deck", "under-panels"), "above"), reflectiveFace: field(fc.constantFrom("up", "down"), "both"), emittance: emittanceField }),
      panel: part({
        system: field(fc.constantFrom("standing-seam", "exposed-fastener"), "shingle"),
        coverageWidthIn: field(fc.double({ min: 6, max: 60, noNaN: true }), 5.99, 60.01),
        gauge: positiveField,
        substrate: field(fc.constantFrom("metallic-coated-steel", "aluminum", "copper", "zinc"), "tin"),
        solarReflectance: fractionField,
        thermalEmittance: fractionField,
        lapSealant: boolField,
        minPitch: field(fc.double({ min: 0, max: 24, noNaN: true }), 24.5, -1),
        panelUndersideEmittance: emittanceField,
        clipSpacingIn: zoneValues(positiveField),
        screwsPerSquare: zoneValues(sizeField),
        hemAllowanceIn: sizeField,
        maxLengthFt: field(fc.double({ min: 1, max: 60, noNaN: true }), 0.5),
        start: field(fc.constantFrom("left", "right", "centred"), "middle"),
      }),
      ventilation: part({ intakeNfaPerFtSqIn: sizeField, exhaustNfaPerFtSqIn: sizeField, eaveOpen: boolField, topOpen: boolField, ventHips: boolField, ventHeadwalls: boolField, aboveDeckClaimed: boolField }),
      unknownKey: fc.anything({ maxDepth: 1 }),
    },
    { requiredKeys: [] },
  );
  const site = fc.oneof(
    { weight: 1, arbitrary: field === goodField ? fc.constant(undefined) : fc.constantFrom<unknown>(undefined, null, [], "vented") },
    {
      weight: 8,
      arbitrary: fc.record(
        {
          atticType: field(fc.constantFrom("vented", "unvented", "cathedral"), "open"),
          atticFloorAreaSqFt: sizeField,
          climateZone: field(fc.constantFrom("3A", "5a", " 7 ", "4C", "8"), "9Z", "3AB", "A3", "", " ", 3),
          iceDamRisk: boolField,
          ventException: boolField,
          codeEdition: field(fc.constantFrom<unknown>(2012, 2015, 2018, 2021, 2024, "2018", " 2024 "), 2019, "2021a", "20 21", 2021.5),
          coolRoofRequired: boolField,
          vaporRetarder: boolField,
          existingLayers: field(fc.integer({ min: 0, max: 10 }), -1, 11, 1.5),
          tearOff: boolField,
          wind: part({
            ratedAssemblyRequired: boolField,
            basicWindSpeedMph: sizeField,
            exposure: field(fc.constantFrom("B", "C", "D"), "A", "b"),
            leastHorizontalDimensionFt: positiveField,
            meanRoofHeightFt: positiveField,
          }),
          unknownKey: fc.anything({ maxDepth: 1 }),
        },
        { requiredKeys: [] },
      ),
    },
  );
  return { stack, site };
}
const anyParts = inputParts(anyField);
const seldomBadParts = inputParts(seldomBadField);
const goodParts = inputParts(goodField);
const stack = fc.oneof(anyParts.stack, seldomBadParts.stack, goodParts.stack);
const site = fc.oneof(anyParts.site, seldomBadParts.site, goodParts.site);

/**
 * Compares a fast parse with its schema on generated values (and `also` on each answer, beside the schema's);
 * returns how often it answered and declined.
 */
function compare<T>(arb: fc.Arbitrary<unknown>, fast: (raw: unknown) => T | undefined, schema: z.ZodType<T>, numRuns: number, also?: (got: T, want: T) => void) {
  let answered = 0;
  let declined = 0;
  fc.assert(
    fc.property(arb, (raw) => {
      const got = fast(raw);
      const want = schema.safeParse(raw);
      if (got === undefined) {
        declined++;
        return;
      }
      answered++;
      expect(want.success).toBe(true);
      expect(shape(got)).toStrictEqual(shape(want.data));
      expect(got).toStrictEqual(want.data);
      also?.(got, want.data!);
    }),
    { numRuns },
  );
  return { answered, declined };
}

/** The planes of every shape the sketch tools draw, with the optional fields the sketch sets. */
function drawnPlanes() {
  return [
    ...gableRoof(30, 20, 6, { idPrefix: "g" }),
    ...hipRoof(36, 28, 8, { idPrefix: "h", origin: [60, 0], baseElevationFt: 2, stackId: "s" }),
    ...lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 26, wingWidthFt: 18, wingDepthFt: 12, wingOffsetFt: 10 }, 4, { idPrefix: "l", origin: [0, 60] }),
    ...shedRoof(16, 10, 3, { idPrefix: "s", origin: [80, 80] }),
  ].map((p, i) => ({ ...p, eaveOverhangIn: 12 + i, edgeTypes: i % 3 ? {} : { "1": "rake" as const }, penetrations: i % 2 ? [] : [{ kind: "pipe" as const, diameterIn: 3 }, { id: "c1", kind: "chimney" as const, widthIn: 36, lengthIn: 24, count: 1 }] }));
}

describe("parsePlaneFast answers as planeSchema does, or declines", () => {
  it("on generated planes: an answer only where planeSchema accepts, and then the same values, keys, key order and corner arrays", () => {
    const { answered, declined } = compare(anyPlane, parsePlaneFast, planeSchema, 3000, (got, want) =>
      // zod's array parse keeps each corner array itself (the outline's items are not parsed one by one).
      got.outline.forEach((c, i) => expect(c).toBe(want.outline[i])),
    );
    // Both answers came up often enough for the comparison to mean something.
    expect(answered).toBeGreaterThan(300);
    expect(declined).toBeGreaterThan(300);
  });

  it("answers for every plane the sketch tools and the benchmark roof make (the fast path is the common path)", () => {
    const planes: unknown[] = [...drawnPlanes(), ...buildBenchRoof(100).planes];
    for (const p of planes) {
      const fast = parsePlaneFast(JSON.parse(JSON.stringify(p)));
      expect(fast).toBeDefined();
      expect(fast).toStrictEqual(planeSchema.parse(p));
    }
  });

  it("declines a plane planeSchema refuses, for each field (spot checks)", () => {
    const good = { id: "a", pitch: 4, outline: [[0, 0], [20, 0], [20, 10]], eaveEdge: 0 };
    expect(parsePlaneFast(good)).toBeDefined();
    const bad: Record<string, unknown>[] = [
      { id: "" },
      { name: null },
      { pitch: 24.5 },
      { pitch: "4" },
      { outline: [[0, 0], [20, 0]] },
      { outline: [[0, 0], [20, 0], [20, Number.NaN]] },
      { outline: [[0, 0], [20, 0], [1001, 10]] },
      { eaveEdge: 0.5 },
      { baseElevationFt: Infinity },
      { eaveOverhangIn: -1 },
      { edgeTypes: { "1": "gutter" } },
      { edgeTypes: { a: "eave" } },
      { stackId: "" },
      { penetrations: [{ kind: "hole" }] },
      { penetrations: [{ count: 0 }] },
      { penetrations: [{ diameterIn: -2 }] },
    ];
    for (const change of bad) {
      const raw = { ...good, ...change };
      expect(planeSchema.safeParse(raw).success, JSON.stringify(change)).toBe(false);
      expect(parsePlaneFast(raw), JSON.stringify(change)).toBeUndefined();
    }
  });
});

describe("parseStackFast and parseSiteFast answer as stackSchema and siteSchema do, or decline", () => {
  it("on generated assemblies: an answer only where stackSchema accepts, and then the same values, keys and key order", () => {
    const { answered, declined } = compare(stack, parseStackFast, stackSchema, 3000);
    expect(answered).toBeGreaterThan(30);
    expect(declined).toBeGreaterThan(300);
  });

  it("on generated sites: an answer only where siteSchema accepts (or the site is left out), the same answer", () => {
    const { answered, declined } = compare(site, parseSiteFast, siteSchema, 3000);
    expect(answered).toBeGreaterThan(100);
    expect(declined).toBeGreaterThan(300);
  });

  it("answers for the assemblies and sites the app sends (the fast path is the common path)", () => {
    const bench = buildBenchRoof(100);
    for (const s of [...bench.stacks, { id: "bare" }, { id: "felt", underlayment: { kind: "felt", highTemp: false, feltNumber: 15, layers: 2 }, spacer: { kind: "battens", battens: { nominal: "2x4", spacingIn: 16, counterBattens: true, counterBattenNominal: "1x4", treated: true } }, panel: { system: "exposed-fastener", coverageWidthIn: 36, gauge: 26, clipSpacingIn: { field: 24 }, screwsPerSquare: { edge: 90 }, maxLengthFt: 30 }, ventilation: { intakeNfaPerFtSqIn: 9, exhaustNfaPerFtSqIn: 18, eaveOpen: false } }]) {
      const raw = JSON.parse(JSON.stringify(s));
      expect(parseStackFast(raw), s.id).toStrictEqual(stackSchema.parse(raw));
    }
    for (const s of [bench.site, undefined, {}, { atticType: "cathedral", climateZone: "6b", codeEdition: "2018", existingLayers: 2, tearOff: false, wind: { ratedAssemblyRequired: true, exposure: "C" } }]) {
      const raw = s === undefined ? undefined : JSON.parse(JSON.stringify(s));
      const fast = parseSiteFast(raw);
      expect(fast).toBeDefined();
      expect(fast).toStrictEqual(siteSchema.parse(raw));
    }
  });
});

describe("the takeoff input as a whole", () => {
  // The takeoff input as it was defined before the fast path: planeSchema for every plane.
  const reference = z
    .object({
      site: siteSchema,
      planes: z.array(planeSchema, { error: "Required" }).min(1, "Add at least one roof plane").max(MAX_PLANES, `At most ${MAX_PLANES} planes`),
      stacks: z.array(stackSchema, { error: "Required" }).min(1, "Add at least one roof assembly").max(MAX_STACKS, `At most ${MAX_STACKS} roof assemblies`),
      defaultStackId: z.string({ error: "Required" }).min(1, "Required").max(100, "Use at most 100 characters"),
      rules: rulesSchema,
    })
    .superRefine(checkRoofShape);
  const issues = (e: z.ZodError) => e.issues.map((i) => [i.path.map(String).join("."), i.message]);
  const roof = (planes: unknown) => ({ site: {}, planes, stacks: [{ id: "s" }, { id: "t" }], defaultStackId: "s" });
  const same = (input: unknown) => {
    const got = takeoffInputSchema.safeParse(input);
    const want = reference.safeParse(input);
    expect(got.success).toBe(want.success);
    if (got.success && want.success) expect(shape(got.data)).toStrictEqual(shape(want.data));
    else expect(issues(got.error!)).toStrictEqual(issues(want.error!));
    return got.success;
  };

  it("parse to the same roof, or fail with the same messages at the same paths", () => {
    let failed = 0;
    fc.assert(
      fc.property(
        fc.oneof({ weight: 6, arbitrary: fc.array(anyPlane, { minLength: 1, maxLength: 4 }) }, { weight: 1, arbitrary: fc.constantFrom<unknown>([], undefined, "planes", {}) }),
        (planes) => {
          const got = takeoffInputSchema.safeParse(roof(planes));
          const want = reference.safeParse(roof(planes));
          expect(got.success).toBe(want.success);
          if (got.success && want.success) expect(shape(got.data)).toStrictEqual(shape(want.data));
          else {
            failed++;
            expect(issues(got.error!)).toStrictEqual(issues(want.error!));
          }
        },
      ),
      { numRuns: 1500 },
    );
    expect(failed).toBeGreaterThan(100);
  });

  it("with generated sites and assemblies (some keys left out): the same roof, or the same messages at the same paths", () => {
    let failed = 0;
    fc.assert(
      fc.property(
        fc.record(
          {
            site,
            planes: fc.array(validPlane, { minLength: 1, maxLength: 2 }),
            stacks: fc.oneof({ weight: 6, arbitrary: fc.array(stack, { minLength: 1, maxLength: 3 }) }, { weight: 1, arbitrary: fc.constantFrom<unknown>([], undefined, {}) }),
            defaultStackId: fc.constantFrom<unknown>("s", "t", undefined),
          },
          { requiredKeys: ["planes"] },
        ),
        (input) => {
          if (!same(input)) failed++;
        },
      ),
      { numRuns: 1500 },
    );
    expect(failed).toBeGreaterThan(100);
  });

  it("at most 500 planes, as before", () => {
    const many = Array.from({ length: MAX_PLANES + 1 }, (_, i) => ({ id: `p${i}`, pitch: 4, outline: [[0, 0], [10, 0], [10, 10]], eaveEdge: 0 }));
    const r = takeoffInputSchema.safeParse(roof(many));
    expect(r.success).toBe(false);
    expect(issues(r.error!)).toStrictEqual([["planes", "At most 500 planes"]]);
  });
});
