/**
 * The takeoff input's usual form parsed without zod: each function gives exactly what its zod schema in ./takeoff
 * gives (the same values, the same keys in the same order, unknown keys dropped, defaults filled) for input in the
 * form the app, the API's clients and the stored roofs send, and declines anything else (`undefined`), which the
 * zod schema then parses and reports as usual. They must never accept what the schema refuses: when in doubt they
 * decline.
 *
 * Why: zod builds a result and an issue list per field, and in the server, where the request's other work has
 * pushed zod's code and schemas out of the processor's caches, parsing a 100-plane takeoff's input took about a
 * quarter of the takeoff's time. Measured right after a round trip: about 200 µs for 100 planes, and 260–380 µs
 * for the site and two assemblies.
 *
 * A change to planeSchema, penetrationSchema, stackSchema or siteSchema needs the same change here.
 * tests/shared/takeoff-fast-parse.test.ts compares each function with its schema on generated input, valid and
 * not, and the whole takeoff input with the one parsed by the schemas alone.
 */
import type { PenetrationParsed, PlaneParsed, SiteParsed, StackParsed } from "./takeoff";
import type { EdgeType } from "../engine/roof/edge-types";
import {
  ATTIC_TYPES,
  CLIMATE_ZONE_RE,
  CODE_EDITIONS,
  EDGE_TYPES,
  LUMBER_NOMINALS,
  MAX_ID_LENGTH,
  MAX_PLAN_FT,
  MIN_BATTEN_SPACING_IN,
  MIN_PANEL_COVERAGE_IN,
  PANEL_STARTS,
  PANEL_SYSTEMS,
  PENETRATION_KINDS,
  SPACER_KINDS,
  UNDERLAYMENT_KINDS,
  WIND_EXPOSURES,
} from "./takeoff-limits";

type Rec = Record<string, unknown>;

const isNumber = (v: unknown): v is number => typeof v === "number" && Number.isFinite(v);
const EDGE_TYPE_SET: ReadonlySet<unknown> = new Set(EDGE_TYPES);
const PENETRATION_KIND_SET: ReadonlySet<unknown> = new Set(PENETRATION_KINDS);
const EDGE_NUMBER = /^\d+$/;

// ---------------------------------------------------------------------------------------------------
// Helpers: each returns the field's parsed value or throws DECLINE, which the exported functions turn into
// `undefined` (so a refusal deep inside needs no checks on the way out; nothing is thrown for usual input).
// ---------------------------------------------------------------------------------------------------

const DECLINE = new Error("not in the usual form: the zod schema parses it");
function decline(): never {
  throw DECLINE;
}
function orDecline<T>(parse: (raw: unknown) => T, raw: unknown): T | undefined {
  try {
    return parse(raw);
  } catch (e) {
    if (e === DECLINE) return undefined;
    throw e;
  }
}
/** z.object's input check: an object, not null, not an array. */
const obj = (v: unknown): Rec => (typeof v === "object" && v !== null && !Array.isArray(v) ? (v as Rec) : decline());
/** A sub-object with `.prefault({})`: the input's, or `{}` when left out. */
const sub = (v: unknown): Rec => (v === undefined ? {} : obj(v));
/** A number (finite, as z.number() requires) that `ok` accepts. */
const num = (v: unknown, ok: (x: number) => boolean): number => (isNumber(v) && ok(v) ? v : decline());
/** A field with `.default(d)`: d when left out (or undefined), else checked. */
const numOr = (v: unknown, d: number, ok: (x: number) => boolean): number => (v === undefined ? d : num(v, ok));
const boolOr = (v: unknown, d: boolean): boolean => (v === undefined ? d : typeof v === "boolean" ? v : decline());
function oneOf<T>(v: unknown, set: ReadonlySet<unknown>, d: T): T {
  return v === undefined ? d : set.has(v) ? (v as T) : decline();
}
/** An optional field: in the answer when its key is in the input (as zod's object parse has it), checked unless undefined. */
function opt(out: Rec, r: Rec, key: string, check: (v: unknown) => unknown): void {
  if (!(key in r)) return;
  const v = r[key];
  if (v !== undefined) check(v);
  out[key] = v;
}
const id = (v: unknown): string => (typeof v === "string" && v.length >= 1 && v.length <= MAX_ID_LENGTH ? v : decline());
const member = (set: ReadonlySet<unknown>) => (v: unknown) => (set.has(v) ? v : decline());
const bool = (v: unknown) => (typeof v === "boolean" ? v : decline());
const isSize = (x: number) => x >= 0;
const isPositive = (x: number) => x > 0;
const isPct = (x: number) => x >= 0 && x <= 100;
const isFraction = (x: number) => x >= 0 && x <= 1;
const isEmittance = (x: number) => x >= 0.01 && x <= 1;
const isStockLength = (x: number) => x >= 1;
const isBattenSpacing = (x: number) => x >= MIN_BATTEN_SPACING_IN;
const isCoverage = (x: number) => x >= MIN_PANEL_COVERAGE_IN && x <= 60;
const isPitch = (x: number) => x >= 0 && x <= 24;
const isLayers = (x: number) => Number.isSafeInteger(x) && x >= 1 && x <= 2;
const isExistingLayers = (x: number) => Number.isSafeInteger(x) && x >= 0 && x <= 10;
const size = (v: unknown) => num(v, isSize);
const positive = (v: unknown) => num(v, isPositive);
const fraction = (v: unknown) => num(v, isFraction);

const DECK_ACTIONS: ReadonlySet<unknown> = new Set(["keep", "repair", "replace"]);
const DECK_MATERIALS: ReadonlySet<unknown> = new Set(["plywood", "osb"]);
const UNDERLAYMENTS: ReadonlySet<unknown> = new Set(UNDERLAYMENT_KINDS);
const FELT_NUMBERS: ReadonlySet<unknown> = new Set([15, 30]);
const SPACERS: ReadonlySet<unknown> = new Set(SPACER_KINDS);
const NOMINALS: ReadonlySet<unknown> = new Set(LUMBER_NOMINALS);
const BARRIER_KINDS: ReadonlySet<unknown> = new Set(["none", "foil"]);
const BARRIER_POSITIONS: ReadonlySet<unknown> = new Set(["on-deck", "under-panels"]);
const FACES: ReadonlySet<unknown> = new Set(["up", "down"]);
const SYSTEMS: ReadonlySet<unknown> = new Set(PANEL_SYSTEMS);
const SUBSTRATES: ReadonlySet<unknown> = new Set(["metallic-coated-steel", "aluminum", "copper", "zinc"]);
const STARTS: ReadonlySet<unknown> = new Set(PANEL_STARTS);
const ATTICS: ReadonlySet<unknown> = new Set(ATTIC_TYPES);
const EDITIONS: ReadonlySet<unknown> = new Set(CODE_EDITIONS);
const EXPOSURES: ReadonlySet<unknown> = new Set(WIND_EXPOSURES);
const FOUR_DIGITS = /^\d{4}$/;

// ---------------------------------------------------------------------------------------------------
// assemblies (stackSchema)
// ---------------------------------------------------------------------------------------------------

/** stackSchema's own answer for an assembly in the usual form, or undefined (see the module comment). */
export function parseStackFast(raw: unknown): StackParsed | undefined {
  return orDecline(stackFast, raw);
}

function stackFast(raw: unknown): StackParsed {
  const r = obj(raw);
  const out: Rec = { id: id(r.id) };
  opt(out, r, "name", (v) => (typeof v === "string" && v.length <= 120 ? v : decline()));
  const d = sub(r.deck);
  out.deck = {
    action: oneOf(d.action, DECK_ACTIONS, "keep"),
    material: oneOf(d.material, DECK_MATERIALS, "plywood"),
    thicknessIn: numOr(d.thicknessIn, 0.5, isPositive),
    repairSharePct: numOr(d.repairSharePct, 10, isPct),
  };
  const u = sub(r.underlayment);
  const underlayment: Rec = {
    kind: oneOf(u.kind, UNDERLAYMENTS, "synthetic"),
    highTemp: boolOr(u.highTemp, true),
    feltNumber: oneOf(u.feltNumber, FELT_NUMBERS, 30),
    layers: numOr(u.layers, 1, isLayers),
  };
  opt(underlayment, u, "iceBarrier", bool);
  out.underlayment = underlayment;
  const s = sub(r.spacer);
  const spacer: Rec = { kind: oneOf(s.kind, SPACERS, "none") };
  opt(spacer, s, "thicknessIn", positive);
  opt(spacer, s, "openFraction", fraction);
  const b = sub(s.battens);
  const battens: Rec = {
    nominal: oneOf(b.nominal, NOMINALS, "1x4"),
    spacingIn: numOr(b.spacingIn, 24, isBattenSpacing),
    counterBattens: boolOr(b.counterBattens, false),
  };
  opt(battens, b, "counterBattenNominal", member(NOMINALS));
  opt(battens, b, "counterBattenSpacingIn", (v) => num(v, isBattenSpacing));
  battens.treated = boolOr(b.treated, false);
  spacer.battens = battens;
  out.spacer = spacer;
  const f = sub(r.radiantBarrier);
  out.radiantBarrier = {
    kind: oneOf(f.kind, BARRIER_KINDS, "none"),
    position: oneOf(f.position, BARRIER_POSITIONS, "on-deck"),
    reflectiveFace: oneOf(f.reflectiveFace, FACES, "up"),
    emittance: numOr(f.emittance, 0.05, isEmittance),
  };
  const p = sub(r.panel);
  const panel: Rec = {
    system: oneOf(p.system, SYSTEMS, "standing-seam"),
    coverageWidthIn: numOr(p.coverageWidthIn, 16, isCoverage),
    gauge: numOr(p.gauge, 24, isPositive),
    substrate: oneOf(p.substrate, SUBSTRATES, "metallic-coated-steel"),
    solarReflectance: numOr(p.solarReflectance, 0.3, isFraction),
    thermalEmittance: numOr(p.thermalEmittance, 0.85, isFraction),
    lapSealant: boolOr(p.lapSealant, false),
  };
  opt(panel, p, "minPitch", (v) => num(v, isPitch));
  panel.panelUndersideEmittance = numOr(p.panelUndersideEmittance, 0.9, isEmittance);
  panel.clipSpacingIn = zoneValues(sub(p.clipSpacingIn), positive);
  panel.screwsPerSquare = zoneValues(sub(p.screwsPerSquare), size);
  opt(panel, p, "hemAllowanceIn", size);
  opt(panel, p, "maxLengthFt", (v) => num(v, isStockLength));
  panel.start = oneOf(p.start, STARTS, "left");
  out.panel = panel;
  const v = sub(r.ventilation);
  const ventilation: Rec = {};
  opt(ventilation, v, "intakeNfaPerFtSqIn", size);
  opt(ventilation, v, "exhaustNfaPerFtSqIn", size);
  ventilation.eaveOpen = boolOr(v.eaveOpen, true);
  ventilation.topOpen = boolOr(v.topOpen, true);
  ventilation.ventHips = boolOr(v.ventHips, false);
  ventilation.ventHeadwalls = boolOr(v.ventHeadwalls, false);
  ventilation.aboveDeckClaimed = boolOr(v.aboveDeckClaimed, false);
  out.ventilation = ventilation;
  return out as StackParsed;
}

/** A `{ field?, edge?, corner? }` object (clip spacing, screws per square). */
function zoneValues(z: Rec, check: (v: unknown) => unknown): Rec {
  const out: Rec = {};
  opt(out, z, "field", check);
  opt(out, z, "edge", check);
  opt(out, z, "corner", check);
  return out;
}

// ---------------------------------------------------------------------------------------------------
// site (siteSchema)
// ---------------------------------------------------------------------------------------------------

/** siteSchema's own answer for a site in the usual form (or left out), or undefined (see the module comment). */
export function parseSiteFast(raw: unknown): SiteParsed | undefined {
  return orDecline(siteFast, raw);
}

function siteFast(raw: unknown): SiteParsed {
  const r = sub(raw);
  const out: Rec = { atticType: oneOf(r.atticType, ATTICS, "vented") };
  opt(out, r, "atticFloorAreaSqFt", size);
  if ("climateZone" in r) {
    const v = r.climateZone;
    if (v === undefined) out.climateZone = undefined;
    else {
      // z.string().trim().toUpperCase().regex(…).max(2): the trimmed, upper-case text.
      const t = typeof v === "string" ? v.trim().toUpperCase() : decline();
      out.climateZone = CLIMATE_ZONE_RE.test(t) && t.length <= 2 ? t : decline();
    }
  }
  opt(out, r, "iceDamRisk", bool);
  out.ventException = boolOr(r.ventException, false);
  let edition = r.codeEdition;
  if (edition === undefined) edition = 2021;
  else {
    // The schema's preprocess: four digits as text become the number.
    if (typeof edition === "string" && FOUR_DIGITS.test(edition.trim())) edition = Number(edition);
    if (!EDITIONS.has(edition)) decline();
  }
  out.codeEdition = edition;
  out.coolRoofRequired = boolOr(r.coolRoofRequired, false);
  opt(out, r, "vaporRetarder", bool);
  out.existingLayers = numOr(r.existingLayers, 1, isExistingLayers);
  out.tearOff = boolOr(r.tearOff, true);
  const w = sub(r.wind);
  const wind: Rec = { ratedAssemblyRequired: boolOr(w.ratedAssemblyRequired, false) };
  opt(wind, w, "basicWindSpeedMph", size);
  opt(wind, w, "exposure", member(EXPOSURES));
  opt(wind, w, "leastHorizontalDimensionFt", positive);
  opt(wind, w, "meanRoofHeightFt", positive);
  out.wind = wind;
  return out as SiteParsed;
}

// ---------------------------------------------------------------------------------------------------
// planes (planeSchema)
// ---------------------------------------------------------------------------------------------------

/**
 * planeSchema's own answer for a plane in the usual form, or undefined (see the module comment). The outline
 * holds the input's corner arrays themselves, as zod's array parse keeps them.
 */
export function parsePlaneFast(raw: unknown): PlaneParsed | undefined {
  return orDecline(planeFast, raw);
}

const isEaveEdge = (x: number) => Number.isSafeInteger(x) && x >= 0;
const isCount = (x: number) => Number.isSafeInteger(x) && x >= 1;
const anyNumber = () => true;
const edgeType = member(EDGE_TYPE_SET);

function planeFast(raw: unknown): PlaneParsed {
  const p = obj(raw);
  const out: Rec = {
    id: id(p.id),
    name: p.name === undefined ? "" : typeof p.name === "string" && p.name.length <= 120 ? p.name : decline(),
    pitch: num(p.pitch, isPitch),
    outline: outlineFast(p.outline),
    eaveEdge: num(p.eaveEdge, isEaveEdge),
    baseElevationFt: numOr(p.baseElevationFt, 0, anyNumber),
    eaveOverhangIn: numOr(p.eaveOverhangIn, 12, isSize),
    edgeTypes: edgeTypesFast(p.edgeTypes),
  };
  opt(out, p, "stackId", id);
  out.penetrations = penetrationsFast(p.penetrations);
  return out as PlaneParsed;
}

/** outlineSchema's answer (a new array of the same corner arrays). */
function outlineFast(v: unknown): [number, number][] {
  if (!Array.isArray(v) || v.length < 3 || v.length > 200) decline();
  const out: [number, number][] = [];
  for (let i = 0; i < v.length; i++) {
    const c: unknown = v[i];
    if (!Array.isArray(c) || c.length !== 2) decline();
    const x: unknown = c[0];
    const y: unknown = c[1];
    if (!isNumber(x) || !isNumber(y) || x < -MAX_PLAN_FT || x > MAX_PLAN_FT || y < -MAX_PLAN_FT || y > MAX_PLAN_FT) decline();
    out.push(c as [number, number]);
  }
  return out;
}

/** edgeTypeOverrides' answer with its default (a new object of the same entries). */
function edgeTypesFast(v: unknown): Record<string, EdgeType> {
  if (v === undefined) return {};
  if (typeof v !== "object" || v === null || Object.getPrototypeOf(v) !== Object.prototype) decline();
  const keys = Reflect.ownKeys(v);
  if (keys.length > 200) decline();
  const out: Record<string, EdgeType> = {};
  for (const k of keys) {
    if (typeof k !== "string" || !EDGE_NUMBER.test(k) || !Object.prototype.propertyIsEnumerable.call(v, k)) decline();
    out[k] = edgeType((v as Rec)[k]) as EdgeType;
  }
  return out;
}

/** The penetrations' answer with its default. */
function penetrationsFast(v: unknown): PenetrationParsed[] {
  if (v === undefined) return [];
  if (!Array.isArray(v) || v.length > 200) decline();
  const out: PenetrationParsed[] = [];
  for (let i = 0; i < v.length; i++) {
    const r = obj(v[i]);
    const pen: Rec = {};
    opt(pen, r, "id", (x) => (typeof x === "string" && x.length <= MAX_ID_LENGTH ? x : decline()));
    pen.kind = oneOf(r.kind, PENETRATION_KIND_SET, "pipe");
    opt(pen, r, "diameterIn", size);
    opt(pen, r, "widthIn", size);
    opt(pen, r, "lengthIn", size);
    pen.count = numOr(r.count, 1, isCount);
    out.push(pen as PenetrationParsed);
  }
  return out;
}
