/**
 * The takeoff orchestrator: input (validated by the zod schema) → geometry → edges → panels → wind zones
 * and fasteners → layers → trim → ventilation and thermal → materials and advisories.
 *
 * Rounding happens once, at the end: each material's quantity is summed across the job and rounded up to
 * purchase units. The only earlier roundings are the physical ones: each panel's length, battens'
 * fasteners per row and ice-barrier courses, trim pieces per run, and clips per zone segment.
 */
import type { z } from "zod";
import { takeoffInputSchema, type StackInput, type TakeoffInput } from "../schemas/takeoff";
import type { Advisory } from "./advisory";
import {
  clipSpacingBattenAdvisory,
  cricketAdvisories,
  fallProtectionAdvisories,
  foilAdvisory,
  gapTooThinAdvisory,
  iceBarrierAdvisories,
  panelLengthAdvisories,
  planeLabels,
  ratedAssemblyAdvisory,
  reroofAdvisory,
  slopeAdvisories,
  transitionAdvisory,
  treatedLumberAdvisory,
  underlaymentAdvisories,
  windAdvisories,
} from "./advisories";
import { ceilTol, fmt, num, plural, roundedUp, toFixedFast, wasteText } from "./format";
import { battenPieces, battenTotals, counterBattenTotals } from "./layers/battens";
import { deckAreaToReplace } from "./layers/deck";
import { iceBarrierCourses, iceBarrierWidthIn } from "./layers/ice-barrier";
import { rollsFor, type RollSpec } from "./layers/rolls";
import { LUMBER, type LumberNominal } from "./lumber";
import { MATERIAL_KEYS, materialLine, pipeBootKey, type MaterialKey, type MaterialLine } from "./materials";
import type { EdgeType } from "./roof/edge-types";
import { analyseEdges, buildRuns, edgeTotalsOf, pieceAt, type EdgePiece, type EdgeRun, type EdgeTotals } from "./roof/edges";
import { isGeometryError, planeGeometryOfParsed, toPlan, type PlaneGeometry } from "./roof/geometry";
import { layoutPanels, PanelPieces, type PanelOptions } from "./roof/panels";
import { slopeAngleDeg } from "./roof/slope";
import { computeThermal, foilFacesGap } from "./thermal/index";
import { tallyTrim, TRIM_KEY_BY_EDGE, type TrimTally } from "./trim";
import type { EdgeQuantities, FastenersResult, PlaneQuantities, PlaneResult, StackResult, TakeoffOutcome, TakeoffQuantities, TakeoffResult, ZoneFasteners } from "./types";
import { aboveDeckChannel, type ChannelResult } from "./ventilation/channel";
import { climateZoneNumber, computeVentilation } from "./ventilation/index";
import { takeExact } from "./scratch-list";
import {
  edgeDistance,
  HIP_ZONE3_MAX_PITCH,
  leastDimensionOfOutlines,
  LOW_SLOPE_MAX_PITCH,
  planeFasteners,
  type PlaneFastenerOptions,
  type PlaneFastenerTotals,
  type PlaneWindZones,
  type WindZone,
  type ZoneCounts,
  type ZoneModel,
} from "./wind/zones";

export type { TakeoffOutcome, TakeoffResult, TakeoffQuantities };

/** Turn a zod error into the engine's refusal: the first issue's message and path, and every field. */
export function refusalFromZod(error: z.ZodError): Extract<TakeoffOutcome, { ok: false }> {
  const first = error.issues[0];
  const fields: Record<string, string> = {};
  for (const i of error.issues) {
    const key = i.path.map(String).join(".") || "body";
    if (!(key in fields)) fields[key] = i.message;
  }
  return { ok: false, reason: first?.message ?? "Invalid input", path: (first?.path ?? []).map((p) => (typeof p === "symbol" ? String(p) : p)), fields };
}

/** Parse with the schema, then compute. Never throws on bad input: returns `{ ok: false, reason, path }`. */
export function computeTakeoff(input: unknown): TakeoffOutcome {
  const parsed = takeoffInputSchema.safeParse(input);
  if (!parsed.success) return refusalFromZod(parsed.error);
  return computeTakeoffParsed(parsed.data);
}

/**
 * The same takeoff with each plane's quantities only (areas, squares, typed edges and their lengths, panels and
 * the cut list): every roof-wide figure is the same as computeTakeoff's, and none of the per-plane detail for
 * drawing (corner heights, where each edge piece lies, wind zones and layers per plane) is built.
 */
export function computeTakeoffQuantities(input: unknown): TakeoffOutcome<TakeoffQuantities> {
  const parsed = takeoffInputSchema.safeParse(input);
  if (!parsed.success) return refusalFromZod(parsed.error);
  return computeTakeoffParsed(parsed.data, { detail: "quantities" });
}

/** The store of panel pieces the per-plane passes reuse (see RoofContext.panelScratch). */
const PANEL_SCRATCH = new PanelPieces(64);

/**
 * The options of layoutPanels and planeFasteners, one record of each set afresh for every plane (neither call
 * keeps its options): a record per call was a needless allocation per plane. The engine runs one takeoff at a
 * time, synchronously.
 */
const PANEL_OPTS: PanelOptions = { coverageWidthIn: 0, start: "left", hemAllowanceIn: 0, into: PANEL_SCRATCH };
const FASTENER_OPTS: PlaneFastenerOptions = {
  system: "standing-seam",
  model: { kind: "steep", aFt: 0, zone3AsZone2: false },
  clipSpacingIn: { field: 0, edge: 0, corner: 0 },
  screwsPerSquare: { field: 0, edge: 0, corner: 0 },
  battenSpacingIn: null,
};

/**
 * Each plane's lists (edges, vertices) are gathered in these scratch lists and copied out at their exact length
 * (see ./scratch-list). One array per record shape; emptied after each copy (takeExact) so that they keep no
 * result alive.
 */
const EDGE_QUANTITIES: EdgeQuantities[] = [];
const EDGE_RESULTS: PlaneResult["edges"] = [];
const VERTICES: PlaneResult["vertices"] = [];

/** "full": each plane's whole detail (PlaneResult); "quantities": its quantities only (PlaneQuantities). */
export type TakeoffDetail = "full" | "quantities";

export interface TakeoffOptions {
  /** Compute only these planes (edges are still typed against every plane of the roof). */
  planeIds?: readonly string[];
  /** What each plane's entry holds; default "full". */
  detail?: TakeoffDetail;
}

/**
 * Appends a list's items, in order. A loop rather than push(...list): the spread's hidden-class check in V8
 * failed on every takeoff here (a deoptimization loop, seen with node --trace-deopt), throwing the whole
 * computeTakeoffParsed out of optimized code each run. For the same reason the lists this function reads again
 * are built with loops, not map() or filter(). And computeTakeoffParsed walks its long lists (planes, runs) by
 * index, not with for…of: in a function that large V8 left the array iterator's next() a real call, one result
 * object allocated per item.
 */
function addAll<T>(to: T[], list: readonly T[]): void {
  for (let k = 0; k < list.length; k++) to.push(list[k]);
}

/** The distinct values of a list, in first-seen order. */
function unique<T>(xs: readonly T[]): T[] {
  const seen = new Set<T>();
  const out: T[] = [];
  for (const x of xs) {
    if (seen.has(x)) continue;
    seen.add(x);
    out.push(x);
  }
  return out;
}

/** Materials are listed in the order of MATERIAL_KEYS. */
const MATERIAL_RANK = Object.fromEntries(Object.keys(MATERIAL_KEYS).map((k, i) => [k, i])) as Record<MaterialKey, number>;

/**
 * Sums that take whole counts from one detail and doubles from the other (planeFasteners' "totals" record holds
 * doubles, the full record small integers) start as a double, NaN, and are then set to 0: their fields hold
 * doubles from the start, so the sums keep one hidden class whichever detail ran. Started as the small integer
 * 0, they changed class after the first takeoff of the other detail, and V8 then deoptimised the takeoff on
 * every run where both details were asked for (as in a server answering both).
 */
function zeroZone(): ZoneFasteners {
  const z: ZoneFasteners = { clips: NaN, clipScrews: NaN, panelScrews: NaN, lineFt: NaN, areaSqFt: NaN };
  z.clips = z.clipScrews = z.panelScrews = z.lineFt = z.areaSqFt = 0;
  return z;
}

function underlaymentKey(stack: StackInput): MaterialKey {
  const u = stack.underlayment;
  if (u.kind === "self-adhered") return "underlayment-self-adhered";
  if (u.kind === "synthetic") return "underlayment-synthetic";
  return u.feltNumber === 15 ? "underlayment-felt-15" : "underlayment-felt-30";
}

function underlaymentRoll(rules: TakeoffInput["rules"], key: MaterialKey): RollSpec {
  switch (key) {
    case "underlayment-self-adhered":
      return rules.underlayment.selfAdhered;
    case "underlayment-synthetic":
      return rules.underlayment.synthetic;
    case "underlayment-felt-15":
      return rules.underlayment.felt15;
    default:
      return rules.underlayment.felt30;
  }
}

function channelFor(stack: StackInput, rules: TakeoffInput["rules"]): ChannelResult {
  const sp = stack.spacer;
  return aboveDeckChannel(
    {
      kind: sp.kind,
      thicknessIn: sp.thicknessIn,
      openFraction: sp.openFraction,
      battens: {
        nominal: sp.battens.nominal,
        spacingIn: sp.battens.spacingIn,
        counterBattens: sp.battens.counterBattens,
        counterBattenNominal: sp.battens.counterBattenNominal,
        counterBattenSpacingIn: sp.battens.counterBattenSpacingIn ?? rules.battens.counterBattenSpacingIn,
      },
    },
    { eaveOpen: stack.ventilation.eaveOpen, topOpen: stack.ventilation.topOpen },
  );
}

/** An open, unbroken gap: air moves through it (not an enclosed air space). */
const gapVentilated = (stack: StackInput, ch: ChannelResult) => ch.gapIn > 0 && ch.continuous && stack.ventilation.eaveOpen && stack.ventilation.topOpen;

/** v (local) of an outline edge at local s. */
function edgeVAt(g: PlaneGeometry, edge: number, s: number): number {
  const a = g.local[edge];
  const b = g.local[(edge + 1) % g.local.length];
  if (Math.abs(b[0] - a[0]) < 1e-12) return Math.min(a[1], b[1]);
  return a[1] + ((s - a[0]) * (b[1] - a[1])) / (b[0] - a[0]);
}

/** The type of the edge piece a panel end at local s meets on outline edge `edge` (an edge of several pieces). */
function edgeTypeAtPanelEnd(g: PlaneGeometry, pieces: EdgePiece[], edge: number, s: number): EdgeType | undefined {
  const p = toPlan(g, s, edgeVAt(g, edge, s));
  return pieceAt(pieces, edge, p)?.type;
}

/**
 * Per outline edge, what a panel end on it needs for closures, as codes in two scratch arrays: 1 when the
 * edge is one piece of the type asked for (an eave for `eave`, a ridge or hip for `top`), 0 when it is one
 * piece of another type (or has no piece), -1 when it has several pieces (look the piece up by position).
 * Codes instead of types so that the per-panel loop compares small integers and allocates nothing.
 */
const closureEdgeScratch = { count: new Int32Array(16), eave: new Int8Array(16), top: new Int8Array(16) };
function closureEdgeCodes(nEdges: number, pieces: EdgePiece[]): { eave: Int8Array; top: Int8Array } {
  const sc = closureEdgeScratch;
  if (sc.count.length < nEdges) {
    sc.count = new Int32Array(nEdges * 2);
    sc.eave = new Int8Array(nEdges * 2);
    sc.top = new Int8Array(nEdges * 2);
  }
  const { count, eave, top } = sc;
  // A plain loop: a plane has a handful of edges, too few for fill()'s call to pay.
  for (let e = 0; e < nEdges; e++) {
    count[e] = 0;
    eave[e] = 0;
    top[e] = 0;
  }
  for (let k = 0; k < pieces.length; k++) count[pieces[k].edgeIndex]++;
  for (let k = 0; k < pieces.length; k++) {
    const pc = pieces[k];
    const e = pc.edgeIndex;
    if (count[e] === 1) {
      eave[e] = pc.type === "eave" ? 1 : 0;
      top[e] = pc.type === "ridge" || pc.type === "hip" ? 1 : 0;
    } else {
      eave[e] = -1;
      top[e] = -1;
    }
  }
  return sc;
}

/** What the per-plane passes add up across the job (rounded once, in the materials). */
interface JobSums {
  /** Longest panel (in) per plane index (entries only for the planes computed). */
  longestByPlane: Float64Array;
  /** The roof's totals, added plane by plane in plane order. */
  slopedAreaSqFt: number;
  squares: number;
  panelCount: number;
  panelLengthFt: number;
  offcutSqFt: number;
  zones: Record<WindZone, ZoneFasteners>;
  clips: number;
  clipScrews: number;
  panelScrewsExact: number;
  spacerFasteners: number;
  underl: Map<MaterialKey, { area: number; layered: number; layers: Set<number> }>;
  iceMembraneLf: number;
  icePlanes: { id: string; widthIn: number; courses: number; eaveLf: number }[];
  planesWithoutIce: string[];
  meshArea: number;
  dimpledArea: number;
  foilArea: number;
  deckArea: number;
  battenLf: Map<LumberNominal, { lf: number; rows: number }>;
  counterLf: Map<LumberNominal, { lf: number; runs: number }>;
  panelLf: Map<MaterialKey, { lf: number; count: number }>;
  closureEave: number;
  closureRidge: number;
  closureVented: number;
  clipLimited: { planeId: string; zones: WindZone[]; battenSpacingIn: number }[];
  penetrations: { planeId: string; kind: string; diameterIn?: number; widthIn?: number; id?: string; count: number }[];
  lowSlopeWithoutHeight: string[];
}

function newJobSums(planeCount: number): JobSums {
  const sums: JobSums = {
    longestByPlane: new Float64Array(planeCount),
    slopedAreaSqFt: 0,
    squares: 0,
    panelCount: 0,
    panelLengthFt: 0,
    offcutSqFt: 0,
    zones: { "1'": zeroZone(), "1": zeroZone(), "2": zeroZone(), "3": zeroZone() },
    clips: NaN, // doubles from the start (see zeroZone), set to 0 below
    clipScrews: NaN,
    panelScrewsExact: NaN,
    spacerFasteners: 0,
    underl: new Map(),
    iceMembraneLf: 0,
    icePlanes: [],
    planesWithoutIce: [],
    meshArea: 0,
    dimpledArea: 0,
    foilArea: 0,
    deckArea: 0,
    battenLf: new Map(),
    counterLf: new Map(),
    panelLf: new Map(),
    closureEave: 0,
    closureRidge: 0,
    closureVented: 0,
    clipLimited: [],
    penetrations: [],
    lowSlopeWithoutHeight: [],
  };
  sums.clips = sums.clipScrews = sums.panelScrewsExact = 0;
  return sums;
}

/** The clip spacing and screw rates of one assembly: the stack's own values, else the job's rules. */
interface FastenerRates {
  clipSpacingIn: { field: number; edge: number; corner: number };
  screwsPerSquare: { field: number; edge: number; corner: number };
}

function fastenerRatesOf(stack: StackInput, rules: TakeoffInput["rules"]): FastenerRates {
  const po = stack.panel;
  return {
    clipSpacingIn: {
      field: po.clipSpacingIn.field ?? rules.clips.spacingIn.field,
      edge: po.clipSpacingIn.edge ?? rules.clips.spacingIn.edge,
      corner: po.clipSpacingIn.corner ?? rules.clips.spacingIn.corner,
    },
    screwsPerSquare: {
      field: po.screwsPerSquare.field ?? rules.exposedFastener.screwsPerSquare.field,
      edge: po.screwsPerSquare.edge ?? rules.exposedFastener.screwsPerSquare.edge,
      corner: po.screwsPerSquare.corner ?? rules.exposedFastener.screwsPerSquare.corner,
    },
  };
}

/** The roof-wide facts each plane's pass reads. */
interface RoofContext {
  input: TakeoffInput;
  geoms: PlaneGeometry[];
  planeStacks: StackInput[];
  /** Edge pieces per plane, typed against the whole roof. */
  byPlane: EdgePiece[][];
  hipRoof: boolean;
  panelScratch: PanelPieces;
  channelOf: (s: StackInput) => ChannelResult;
  /** Clip spacing and screw rates per assembly, worked out on the first plane that uses it. */
  ratesOf: (s: StackInput) => FastenerRates;
  /**
   * The roof's zone models: one for low-slope planes (when the mean roof height is known), and the steep one
   * with zone 3 kept or read as zone 2 (a hip roof's planes up to HIP_ZONE3_MAX_PITCH). Shared by every plane:
   * planeFasteners only reads them.
   */
  lowSlopeModel: ZoneModel | null;
  steepModel: ZoneModel;
  steepZone3AsZone2Model: ZoneModel;
  detail: TakeoffDetail;
}

/** Adds one plane's counts in a wind zone to the job's. */
function addZone(dst: ZoneFasteners, src: ZoneCounts, screwsPerClip: number): void {
  dst.clips += src.clips;
  dst.clipScrews += src.clips * screwsPerClip;
  dst.panelScrews += src.panelScrews;
  dst.lineFt += src.lineFt;
  dst.areaSqFt += src.areaSqFt;
}

/** One plane's takeoff; its quantities are also added to the job's sums. */
function takeoffPlane(ctx: RoofContext, i: number, sums: JobSums): PlaneResult | PlaneQuantities {
  const { input, geoms, planeStacks, hipRoof } = ctx;
  const { site, rules } = input;
  const screwsPerClip = rules.clips.screwsPerClip;
  const g = geoms[i];
  const plane = input.planes[i];
  const stack = planeStacks[i];
  const pieces = ctx.byPlane[i];
  const panelOpts = stack.panel;
  const layoutOpts = PANEL_OPTS;
  layoutOpts.coverageWidthIn = panelOpts.coverageWidthIn;
  layoutOpts.start = panelOpts.start;
  layoutOpts.hemAllowanceIn = panelOpts.hemAllowanceIn ?? rules.panels.hemAllowanceIn;
  layoutOpts.into = ctx.panelScratch;
  const panels = layoutPanels(g, layoutOpts);
  sums.longestByPlane[i] = panels.longestIn;
  sums.slopedAreaSqFt += g.slopedAreaSqFt;
  sums.squares += g.squares;
  sums.panelCount += panels.count;
  sums.panelLengthFt += panels.totalLengthFt;
  sums.offcutSqFt += panels.offcutSqFt;
  const pKey: MaterialKey = panelOpts.system === "standing-seam" ? "panel-standing-seam" : "panel-exposed-fastener";
  let pl = sums.panelLf.get(pKey);
  if (!pl) {
    pl = { lf: 0, count: 0 };
    sums.panelLf.set(pKey, pl);
  }
  pl.lf += panels.totalLengthFt;
  pl.count += panels.count;

  // Wind zones and fasteners.
  let model: ZoneModel;
  if (g.pitch <= LOW_SLOPE_MAX_PITCH + 1e-9 && ctx.lowSlopeModel !== null) model = ctx.lowSlopeModel;
  else {
    if (g.pitch <= LOW_SLOPE_MAX_PITCH + 1e-9) sums.lowSlopeWithoutHeight.push(g.id);
    model = hipRoof && g.pitch <= HIP_ZONE3_MAX_PITCH + 1e-9 ? ctx.steepZone3AsZone2Model : ctx.steepModel;
  }
  const sp = stack.spacer;
  const battenSpacingIn = sp.kind === "battens" && panelOpts.system === "standing-seam" ? sp.battens.spacingIn : null;
  const rates = ctx.ratesOf(stack);
  const fo = FASTENER_OPTS;
  fo.system = panelOpts.system;
  fo.model = model;
  fo.clipSpacingIn = rates.clipSpacingIn;
  fo.screwsPerSquare = rates.screwsPerSquare;
  fo.battenSpacingIn = battenSpacingIn;
  // The quantities path needs only the plane's counts ("totals": one reused record, read before the next plane).
  let wzFull: PlaneWindZones | null = null;
  let wz: PlaneFastenerTotals;
  if (ctx.detail === "quantities") wz = planeFasteners(g, pieces, panels, fo, "totals");
  else wz = wzFull = planeFasteners(g, pieces, panels, fo);
  if (battenSpacingIn && wz.spacingLimitedByBattens.length) sums.clipLimited.push({ planeId: g.id, zones: wz.spacingLimitedByBattens, battenSpacingIn });
  sums.clips += wz.clips;
  sums.clipScrews += wz.clips * screwsPerClip;
  sums.panelScrewsExact += wz.panelScrews;
  // Zone by zone, each named outright (a property read by a fixed name is cheaper than by a variable key).
  addZone(sums.zones["1'"], wz.zones["1'"], screwsPerClip);
  addZone(sums.zones["1"], wz.zones["1"], screwsPerClip);
  addZone(sums.zones["2"], wz.zones["2"], screwsPerClip);
  addZone(sums.zones["3"], wz.zones["3"], screwsPerClip);

  // Closures at the panel ends: one per panel end at an eave, and at a ridge or hip.
  const ch = ctx.channelOf(stack);
  const vented = gapVentilated(stack, ch);
  const codes = closureEdgeCodes(g.edges.length, pieces);
  const eaveCode = codes.eave;
  const topCode = codes.top;
  const pp = panels.pieces;
  let eaveEnds = 0;
  let topEnds = 0;
  for (let n = 0; n < pp.count; n++) {
    const be = pp.bottomEdge(n);
    const bc = eaveCode[be];
    if (bc === 1 || (bc === -1 && edgeTypeAtPanelEnd(g, pieces, be, pp.sProbe(n)) === "eave")) eaveEnds++;
    const te = pp.topEdge(n);
    const tc = topCode[te];
    if (tc === 1) topEnds++;
    else if (tc === -1) {
      const top = edgeTypeAtPanelEnd(g, pieces, te, pp.sProbe(n));
      if (top === "ridge" || top === "hip") topEnds++;
    }
  }
  if (vented) sums.closureVented += eaveEnds + topEnds;
  else {
    sums.closureEave += eaveEnds;
    sums.closureRidge += topEnds;
  }

  // Layers.
  const uKey = underlaymentKey(stack);
  let u = sums.underl.get(uKey);
  if (!u) {
    u = { area: 0, layered: 0, layers: new Set<number>() };
    sums.underl.set(uKey, u);
  }
  u.area += g.slopedAreaSqFt;
  u.layered += g.slopedAreaSqFt * stack.underlayment.layers;
  u.layers.add(stack.underlayment.layers);

  // The layers' records (ice barrier, battens) are built only for the full detail; the sums always.
  const full = ctx.detail === "full";
  let ice: PlaneResult["layers"]["iceBarrier"] = null;
  const wantsIce = stack.underlayment.iceBarrier ?? site.iceDamRisk === true;
  let eaveLf = 0;
  for (let k = 0; k < pieces.length; k++) if (pieces[k].type === "eave") eaveLf += pieces[k].trueLengthFt;
  if (wantsIce && eaveLf > 0) {
    // g.slopeFactor is slopeFactor(g.pitch), the very number (Math.hypot is costly).
    const widthIn = iceBarrierWidthIn(plane.eaveOverhangIn, g.pitch, site.codeEdition, rules.iceBarrier.insideWallIn, g.slopeFactor);
    if (stack.underlayment.kind === "self-adhered") {
      if (full) ice = { widthIn, courses: 0, eaveLf, membraneLf: 0, note: "The self-adhered underlayment covers the whole deck, so no separate ice barrier is added." };
    } else {
      const courses = iceBarrierCourses(widthIn, rules.iceBarrier.rollWidthIn, rules.iceBarrier.sideLapIn);
      sums.iceMembraneLf += courses * eaveLf;
      sums.icePlanes.push({ id: g.id, widthIn, courses, eaveLf });
      if (full) ice = { widthIn, courses, eaveLf, membraneLf: courses * eaveLf };
    }
  } else if (site.iceDamRisk === true && !wantsIce && eaveLf > 0 && stack.underlayment.kind !== "self-adhered") {
    sums.planesWithoutIce.push(g.id);
  }

  let battens: PlaneResult["layers"]["battens"] = null;
  let counterBattens: PlaneResult["layers"]["counterBattens"] = null;
  let meshSqFt = 0;
  let dimpledSqFt = 0;
  if (sp.kind === "battens") {
    const rows = battenTotals(g, sp.battens.spacingIn, rules.battens.fastenerSpacingIn);
    let b = sums.battenLf.get(sp.battens.nominal);
    if (!b) {
      b = { lf: 0, rows: 0 };
      sums.battenLf.set(sp.battens.nominal, b);
    }
    b.lf += rows.lf;
    b.rows += rows.rows;
    sums.spacerFasteners += rows.fasteners;
    if (full) battens = { nominal: sp.battens.nominal, rows: rows.rows, lf: rows.lf, fasteners: rows.fasteners, spacingIn: sp.battens.spacingIn };
    if (sp.battens.counterBattens) {
      const nominal = sp.battens.counterBattenNominal ?? sp.battens.nominal;
      const spacing = sp.battens.counterBattenSpacingIn ?? rules.battens.counterBattenSpacingIn;
      const cr = counterBattenTotals(g, spacing, rules.battens.fastenerSpacingIn);
      let c = sums.counterLf.get(nominal);
      if (!c) {
        c = { lf: 0, runs: 0 };
        sums.counterLf.set(nominal, c);
      }
      c.lf += cr.lf;
      c.runs += cr.rows;
      sums.spacerFasteners += cr.fasteners;
      if (full) counterBattens = { nominal, runs: cr.rows, lf: cr.lf, fasteners: cr.fasteners, spacingIn: spacing };
    }
  } else if (sp.kind === "mesh") {
    meshSqFt = g.slopedAreaSqFt;
    sums.meshArea += meshSqFt;
  } else if (sp.kind === "dimpled") {
    dimpledSqFt = g.slopedAreaSqFt;
    sums.dimpledArea += dimpledSqFt;
  }
  const foilSqFt = stack.radiantBarrier.kind === "foil" ? g.slopedAreaSqFt : 0;
  sums.foilArea += foilSqFt;
  const deckSqFt = deckAreaToReplace(g.slopedAreaSqFt, stack.deck.action, stack.deck.repairSharePct);
  sums.deckArea += deckSqFt;

  const pens = plane.penetrations;
  for (let k = 0; k < pens.length; k++) {
    const pen = pens[k];
    sums.penetrations.push({ planeId: g.id, kind: pen.kind, diameterIn: pen.diameterIn, widthIn: pen.widthIn, id: pen.id, count: pen.count });
  }

  if (!full) {
    const eq = EDGE_QUANTITIES;
    for (let k = 0; k < pieces.length; k++) {
      const pc = pieces[k];
      eq[k] = { index: pc.edgeIndex, type: pc.type, planLengthFt: pc.planLengthFt, trueLengthFt: pc.trueLengthFt };
    }
    const edges = takeExact(eq, pieces.length);
    return {
      id: g.id,
      name: plane.name,
      stackId: stack.id,
      pitch: g.pitch,
      slopeFactor: g.slopeFactor,
      planAreaSqFt: g.planAreaSqFt,
      slopedAreaSqFt: g.slopedAreaSqFt,
      squares: g.squares,
      edges,
      panels: { count: panels.count, lengthsIn: panels.lengthsIn, cutList: panels.cutList, longestIn: panels.longestIn },
    };
  }
  const outline = g.outline;
  const vs = VERTICES;
  for (let k = 0; k < outline.length; k++) vs[k] = { x: outline[k][0], y: outline[k][1], z: g.heights[k] };
  const vertices = takeExact(vs, outline.length);
  const er = EDGE_RESULTS;
  for (let k = 0; k < pieces.length; k++) {
    const pc = pieces[k];
    er[k] = {
      index: pc.edgeIndex,
      part: pc.part,
      type: pc.type,
      computedType: pc.computedType,
      overridden: pc.overridden,
      shared: pc.shared,
      sharedWith: pc.partner ? { planeId: pc.partner.planeId, edgeIndex: pc.partner.edgeIndex } : null,
      from: [pc.from[0], pc.from[1]],
      to: [pc.to[0], pc.to[1]],
      planLengthFt: pc.planLengthFt,
      trueLengthFt: pc.trueLengthFt,
    };
  }
  const edges = takeExact(er, pieces.length);
  return {
    id: g.id,
    name: plane.name,
    stackId: stack.id,
    pitch: g.pitch,
    angleDeg: slopeAngleDeg(g.pitch),
    slopeFactor: g.slopeFactor,
    planAreaSqFt: g.planAreaSqFt,
    slopedAreaSqFt: g.slopedAreaSqFt,
    squares: g.squares,
    vertices,
    eaveEdge: g.eaveEdge,
    edges,
    panels: {
      system: panelOpts.system,
      coverageWidthIn: panels.coverageWidthIn,
      count: panels.count,
      lengthsIn: panels.lengthsIn,
      cutList: panels.cutList,
      offcutSqFt: panels.offcutSqFt,
      totalLengthFt: panels.totalLengthFt,
      longestIn: panels.longestIn,
    },
    windZones: wzFull!,
    layers: {
      underlaymentSqFt: g.slopedAreaSqFt * stack.underlayment.layers,
      iceBarrier: ice,
      battens,
      counterBattens,
      meshSqFt,
      dimpledSqFt,
      foilSqFt,
      deckSqFt,
    },
  };
}

/** Equal as Map keys are (SameValueZero): NaN equals NaN. */
const sameKey = (a: number, b: number) => a === b || (a !== a && b !== b);

/** Files an ice-barrier group under its width, then its courses. */
function addIceGroup<G extends { courses: number; widthIn: number }>(byWidth: Map<number, Map<number, G>>, gr: G): void {
  let byCourses = byWidth.get(gr.widthIn);
  if (!byCourses) {
    byCourses = new Map();
    byWidth.set(gr.widthIn, byCourses);
  }
  byCourses.set(gr.courses, gr);
}

/** The job's quantities in purchase units, each with the arithmetic in words; rounded once, here. */
function materialLines(m: {
  rules: TakeoffInput["rules"];
  sums: JobSums;
  edgeTotals: EdgeTotals;
  trim: TrimTally;
  vent: ReturnType<typeof computeVentilation>;
  ridgeRuns: EdgeRun[];
  dominantStack: StackInput;
}): { lines: MaterialLine[]; deckSheets: number; panelScrews: number } {
  const { rules, sums, edgeTotals, trim, vent, ridgeRuns, dominantStack } = m;
  const trimLaps = trim.laps;
  const trimFasteners = trim.fasteners;
  const { clips, clipScrews, panelScrewsExact, spacerFasteners, underl, iceMembraneLf, icePlanes, meshArea, dimpledArea, foilArea, deckArea } = sums;
  const { battenLf, counterLf, panelLf, closureEave, closureRidge, closureVented, penetrations } = sums;
  const screwsPerClip = rules.clips.screwsPerClip;
  const w = rules.waste;
  const lines: MaterialLine[] = [];
  for (const [key, v] of panelLf) {
    lines.push(
      materialLine(
        key,
        Number(toFixedFast(v.lf, 4)),
        `${v.count} ${plural(v.count, "panel")} ordered to the inch (see each plane's cut list), lengths adding up to ${fmt(v.lf, 2)} lf; offcuts are in the lengths, no further waste`,
      ),
    );
  }
  for (const [key, v] of underl) {
    const spec = underlaymentRoll(rules, key);
    const uniform = v.layers.size === 1 ? v.layers.values().next().value! : null;
    const r = uniform ? rollsFor(v.area, w.underlaymentPct, spec, { layers: uniform }) : rollsFor(v.layered, w.underlaymentPct, spec, { what: "sloped, layers counted" });
    lines.push(materialLine(key, r.rolls, r.basis));
  }
  if (iceMembraneLf > 0) {
    const ib = rules.iceBarrier;
    const perRoll = ib.rollLengthFt - ib.endLapIn / 12;
    const exact = (iceMembraneLf * (1 + w.iceBarrierPct / 100)) / perRoll;
    const rolls = ceilTol(exact);
    // Planes with the same width and courses are one term (a large roof would otherwise list every plane),
    // groups listed in order of first plane. A roof has a few groups: each plane's is found by a scan of those
    // seen so far; past 16 groups, by a map keyed by width, then courses (numbers, not a text key per plane).
    const groups: { ids: string[]; eaveLf: number; courses: number; widthIn: number }[] = [];
    let byWidth: Map<number, Map<number, { ids: string[]; eaveLf: number; courses: number; widthIn: number }>> | null = null;
    for (const p of icePlanes) {
      let gr: (typeof groups)[number] | undefined;
      if (byWidth) gr = byWidth.get(p.widthIn)?.get(p.courses);
      else {
        for (let q = 0; q < groups.length; q++) {
          const c = groups[q];
          if (sameKey(c.widthIn, p.widthIn) && sameKey(c.courses, p.courses)) {
            gr = c;
            break;
          }
        }
      }
      if (gr) {
        gr.ids.push(p.id);
        gr.eaveLf += p.eaveLf;
        continue;
      }
      const added = { ids: [p.id], eaveLf: p.eaveLf, courses: p.courses, widthIn: p.widthIn };
      groups.push(added);
      if (byWidth) addIceGroup(byWidth, added);
      else if (groups.length > 16) {
        byWidth = new Map();
        for (const c of groups) addIceGroup(byWidth, c);
      }
    }
    const terms: string[] = [];
    for (const gr of groups) {
      terms.push(`${gr.ids.length === 1 ? gr.ids[0] : `${gr.ids.length} planes`}: ${fmt(gr.eaveLf)} ft eave × ${gr.courses} ${plural(gr.courses, "course")} (${fmt(gr.widthIn)} in up the slope)`);
    }
    const detail = terms.join("; ");
    lines.push(
      materialLine(
        "ice-barrier",
        rolls,
        `${detail} = ${fmt(iceMembraneLf)} lf of ${num(ib.rollWidthIn)} in membrane × ${wasteText(w.iceBarrierPct)} waste ÷ ${fmt(perRoll, 2)} ft net per roll (${num(ib.rollLengthFt)} ft - ${num(ib.endLapIn)} in end lap) = ${roundedUp(exact, rolls, "roll")}`,
      ),
    );
  }
  if (meshArea > 0) {
    const r = rollsFor(meshArea, w.meshPct, rules.mesh);
    lines.push(materialLine("spacer-mesh", r.rolls, r.basis));
  }
  if (dimpledArea > 0) {
    const r = rollsFor(dimpledArea, w.dimpledPct, rules.dimpled);
    lines.push(materialLine("spacer-dimpled", r.rolls, r.basis));
  }
  const stock = rules.battens.stockLengthFt;
  for (const [nominal, v] of battenLf) {
    const pcs = battenPieces(v.lf, w.battensPct, stock);
    const lum = LUMBER[nominal];
    lines.push(
      materialLine(
        `batten-${nominal}` as MaterialKey,
        pcs,
        `${v.rows} ${plural(v.rows, "row")} across the slope = ${fmt(v.lf)} lf × ${wasteText(w.battensPct)} waste ÷ ${num(stock)} ft stock = ${roundedUp((v.lf * (1 + w.battensPct / 100)) / stock, pcs, "piece")} (${num(lum.thicknessIn)} × ${num(lum.widthIn)} in dressed)`,
      ),
    );
  }
  for (const [nominal, v] of counterLf) {
    const pcs = battenPieces(v.lf, w.battensPct, stock);
    lines.push(
      materialLine(
        `counter-batten-${nominal}` as MaterialKey,
        pcs,
        `${v.runs} ${plural(v.runs, "run")} up the slope = ${fmt(v.lf)} lf × ${wasteText(w.battensPct)} waste ÷ ${num(stock)} ft stock = ${roundedUp((v.lf * (1 + w.battensPct / 100)) / stock, pcs, "piece")}`,
      ),
    );
  }
  if (foilArea > 0) {
    const r = rollsFor(foilArea, w.foilPct, rules.foil);
    lines.push(materialLine("radiant-barrier-foil", r.rolls, r.basis));
  }
  let deckSheets = 0;
  if (deckArea > 0) {
    const exact = (deckArea * (1 + w.deckPct / 100)) / rules.deck.sheetSqFt;
    deckSheets = ceilTol(exact);
    lines.push(
      materialLine(
        "deck-sheet",
        deckSheets,
        `${fmt(deckArea)} ft² of deck to replace × ${wasteText(w.deckPct)} waste ÷ ${num(rules.deck.sheetSqFt)} ft² per sheet = ${roundedUp(exact, deckSheets, "sheet")}`,
      ),
    );
  }
  // Trim by type (in TRIM_TYPE_ORDER): pieces per run, summed.
  for (const t of trim.byType) {
    const pieces = t.pieces;
    const qty = ceilTol(pieces * (1 + w.trimPct / 100));
    // Equal runs are one term: "4 × 36.0 ft at 4 pieces each" (four runs of 36 ft). Runs are first counted by
    // their exact length (a run's pieces follow from its length; see tallyTrim), and each distinct length is
    // written once; two lengths that print alike then merge into one term, in the order their first run came.
    const same = new Map<string, number>();
    const lengths = t.lengthsFt;
    for (let j = 0; j < lengths.length; j++) {
      const key = `${fmt(lengths[j])} ft at ${t.piecesOfLength[j]} ${plural(t.piecesOfLength[j], "piece")}`;
      same.set(key, (same.get(key) ?? 0) + t.runsOfLength[j]);
    }
    let list = "";
    for (const [key, n] of same) {
      if (list) list += ", ";
      list += n > 1 ? `${n} × ${key} each` : key;
    }
    lines.push(
      materialLine(
        TRIM_KEY_BY_EDGE[t.type],
        qty,
        `${t.runs} ${plural(t.runs, "run")} (${list}); pieces per run = ceil((L - ${num(rules.trim.endLapIn)} in lap) ÷ (${num(rules.trim.stockLengthFt)} ft - lap)) = ${pieces}` +
          (w.trimPct ? ` × ${wasteText(w.trimPct)} waste = ${roundedUp(pieces * (1 + w.trimPct / 100), qty, "piece")}` : ""),
      ),
    );
  }
  if (edgeTotals.valleyLf > 0) {
    const ib = rules.iceBarrier;
    const perRoll = ib.rollLengthFt - ib.endLapIn / 12;
    const exact = (edgeTotals.valleyLf * (1 + w.iceBarrierPct / 100)) / perRoll;
    const rolls = ceilTol(exact);
    lines.push(
      materialLine(
        "valley-membrane",
        rolls,
        `${fmt(edgeTotals.valleyLf)} lf of valley × ${wasteText(w.iceBarrierPct)} waste ÷ ${fmt(perRoll, 2)} ft net per ${num(ib.rollWidthIn)} in roll = ${roundedUp(exact, rolls, "roll")}`,
      ),
    );
  }
  // Penetrations.
  const penCount = new Map<MaterialKey, number>();
  let sealPenLf = 0;
  for (const p of penetrations) {
    const s = rules.sealant;
    if (p.kind === "pipe" || p.kind === "vent") {
      const k = pipeBootKey(p.diameterIn);
      penCount.set(k, (penCount.get(k) ?? 0) + p.count);
      sealPenLf += s.lfPerPipe * p.count;
    } else if (p.kind === "chimney") {
      penCount.set("flashing-chimney", (penCount.get("flashing-chimney") ?? 0) + p.count);
      sealPenLf += s.lfPerChimney * p.count;
    } else if (p.kind === "skylight") {
      penCount.set("skylight-curb-flashing", (penCount.get("skylight-curb-flashing") ?? 0) + p.count);
      sealPenLf += s.lfPerSkylight * p.count;
    } else {
      sealPenLf += s.lfPerOther * p.count;
    }
  }
  for (const [k, n] of penCount) lines.push(materialLine(k, n, `${n} on the roof, one each`));
  // Closures.
  if (closureEave) lines.push(materialLine("closure-eave", closureEave, `${closureEave} panel ${plural(closureEave, "end")} at eaves, one closure each`));
  if (closureRidge) lines.push(materialLine("closure-ridge", closureRidge, `${closureRidge} panel ${plural(closureRidge, "end")} at ridges and hips, one closure each`));
  if (closureVented)
    lines.push(materialLine("closure-vented", closureVented, `${closureVented} panel ${plural(closureVented, "end")} at eaves, ridges and hips over a ventilated gap, one vented closure each`));
  // Sealants.
  const wallLf = edgeTotals.sidewallLf + edgeTotals.headwallLf + edgeTotals.transitionLf;
  const sealLf = wallLf + trimLaps * rules.sealant.lfPerTrimLap + sealPenLf;
  if (sealLf > 0) {
    const exact = sealLf / rules.sealant.lfPerTube;
    const tubes = ceilTol(exact);
    lines.push(
      materialLine(
        "sealant-tube",
        tubes,
        `${fmt(wallLf)} lf at wall and transition flashings + ${trimLaps} trim ${plural(trimLaps, "lap")} × ${num(rules.sealant.lfPerTrimLap)} ft + ${fmt(sealPenLf)} lf at penetrations = ` +
          `${fmt(sealLf)} lf ÷ ${num(rules.sealant.lfPerTube)} lf per tube = ${roundedUp(exact, tubes, "tube")}`,
      ),
    );
  }
  const butylLf =
    edgeTotals.eaveLf + 2 * edgeTotals.ridgeLf + 2 * edgeTotals.hipLf + 2 * edgeTotals.valleyLf + edgeTotals.sidewallLf + edgeTotals.headwallLf + edgeTotals.transitionLf;
  if (butylLf > 0) {
    const exact = butylLf / rules.butyl.rollLengthFt;
    const rolls = ceilTol(exact);
    lines.push(
      materialLine(
        "butyl-tape",
        rolls,
        `eaves ${fmt(edgeTotals.eaveLf)} + 2 × ridges ${fmt(edgeTotals.ridgeLf)} + 2 × hips ${fmt(edgeTotals.hipLf)} + 2 × valleys ${fmt(edgeTotals.valleyLf)} + walls and transitions ${fmt(wallLf)} = ` +
          `${fmt(butylLf)} lf ÷ ${num(rules.butyl.rollLengthFt)} ft per roll = ${roundedUp(exact, rolls, "roll")}`,
      ),
    );
  }
  // Fasteners.
  const fw = w.fastenersPct;
  const perBox = rules.fasteners.screwsPerBox;
  const box = (key: MaterialKey, count: number, what: string) => {
    if (!(count > 0)) return;
    const exact = (count * (1 + fw / 100)) / perBox;
    const boxes = ceilTol(exact);
    lines.push(materialLine(key, boxes, `${fmt(count, 0)} ${what} × ${wasteText(fw)} waste ÷ ${perBox} per box = ${roundedUp(exact, boxes, "box", "boxes")}`));
  };
  if (clips > 0) {
    const perClipBox = rules.fasteners.clipsPerBox;
    const exact = (clips * (1 + fw / 100)) / perClipBox;
    const n = ceilTol(exact);
    lines.push(
      materialLine(
        "clip",
        n,
        `${clips} clips placed (per clip line 1 + the sum of ceil(zone segment ÷ zone spacing)) × ${wasteText(fw)} waste${perClipBox > 1 ? ` ÷ ${perClipBox} per box` : ""} = ${perClipBox > 1 ? roundedUp(exact, n, "box", "boxes") : roundedUp(exact, n, "clip")}`,
      ),
    );
  }
  box("screw-clip", clipScrews, `clip screws (${clips} clips × ${screwsPerClip})`);
  const panelScrews = ceilTol(panelScrewsExact);
  box("screw-panel", panelScrews, "panel screws (panel area by zone ÷ 100 × screws per square)");
  box("screw-trim", trimFasteners, `trim fasteners (${num(rules.trim.fastenerSpacingIn)} in o.c. along each run, + 1)`);
  box("screw-batten", spacerFasteners, `batten fasteners (per row ceil(L ÷ ${num(rules.battens.fastenerSpacingIn)} in) + 1)`);
  // Vents.
  if (vent.result.mode !== "unvented") {
    if (vent.result.exhaustLf > 0) {
      const q = ceilTol(vent.result.exhaustLf);
      lines.push(
        materialLine(
          "vent-ridge",
          q,
          `ridge ${fmt(edgeTotals.ridgeLf)} lf less 1 ft at each end of ${ridgeRuns.length} ${plural(ridgeRuns.length, "ridge")}${dominantStack.ventilation.ventHips ? " + vented hips" : ""}${dominantStack.ventilation.ventHeadwalls ? " + vented headwalls" : ""} = ${roundedUp(vent.result.exhaustLf, q, "lf", "lf")}`,
        ),
      );
    }
    if (vent.result.intakeLf > 0) {
      const q = ceilTol(vent.result.intakeLf);
      lines.push(materialLine("vent-intake", q, `eaves ${roundedUp(vent.result.intakeLf, q, "lf", "lf")}`));
    }
  }
  lines.sort((a, b) => MATERIAL_RANK[a.key] - MATERIAL_RANK[b.key]);
  return { lines, deckSheets, panelScrews };
}

export function computeTakeoffParsed(input: TakeoffInput, opts?: TakeoffOptions & { detail?: "full" }): TakeoffOutcome;
export function computeTakeoffParsed(input: TakeoffInput, opts: TakeoffOptions & { detail: "quantities" }): TakeoffOutcome<TakeoffQuantities>;
export function computeTakeoffParsed(input: TakeoffInput, opts: TakeoffOptions): TakeoffOutcome<TakeoffResult<PlaneResult | PlaneQuantities>>;
export function computeTakeoffParsed(input: TakeoffInput, opts: TakeoffOptions = {}): TakeoffOutcome<TakeoffResult<PlaneResult | PlaneQuantities>> {
  const { site, rules } = input;
  // ---- geometry --------------------------------------------------------------------------------------
  const geoms: PlaneGeometry[] = [];
  for (let i = 0; i < input.planes.length; i++) {
    const g = planeGeometryOfParsed(input.planes[i], i);
    if (isGeometryError(g)) return g;
    geoms.push(g);
  }
  const stacksById = new Map<string, StackInput>();
  for (const s of input.stacks) stacksById.set(s.id, s);
  const defaultStack = stacksById.get(input.defaultStackId);
  if (!defaultStack) return { ok: false, reason: `Unknown assembly "${input.defaultStackId}"`, path: ["defaultStackId"] };
  const planeStacks: StackInput[] = [];
  for (let i = 0; i < input.planes.length; i++) {
    const sid = input.planes[i].stackId ?? input.defaultStackId;
    const s = stacksById.get(sid);
    if (!s) return { ok: false, reason: `Unknown assembly "${sid}"`, path: ["planes", i, "stackId"] };
    planeStacks.push(s);
  }
  const scope = opts.planeIds ? new Set(opts.planeIds) : null;
  const inScope = (i: number) => !scope || scope.has(input.planes[i].id);
  const scoped: number[] = [];
  for (let i = 0; i < geoms.length; i++) if (inScope(i)) scoped.push(i);
  if (!scoped.length) return { ok: false, reason: "None of the chosen planes is on this roof", path: ["planeIds"] };

  // ---- edges (typed against the whole roof) -------------------------------------------------------------
  const overrides: (Record<string, EdgeType> | null)[] = [];
  for (let i = 0; i < input.planes.length; i++) {
    const et = input.planes[i].edgeTypes;
    overrides.push(Object.keys(et).length ? et : null);
  }
  // How the advisories' messages name each plane (its name; see planeLabels).
  const labels = planeLabels(input.planes);
  const edgesAll = analyseEdges(geoms, (p, e) => overrides[p]?.[e], (p) => labels[p]);
  const advisories: Advisory[] = [];
  let edgeTotals: EdgeTotals = edgesAll.totals;
  let runs = edgesAll.runs;
  if (scope) {
    // A shared piece counts on the first in-scope plane; pieces of planes out of scope do not count.
    const byPlane = edgesAll.byPlane.map((ps, i) =>
      inScope(i) ? ps.map((pc) => ({ ...pc, counted: !pc.partner || !inScope(pc.partner.planeIdx) || pc.planeIdx < pc.partner.planeIdx })) : [],
    );
    runs = buildRuns(byPlane);
    edgeTotals = edgeTotalsOf(byPlane);
  }
  // The ids of the computed planes, as a set built on first use (most roofs raise no edge advisory and have no
  // transition to look up).
  let scopedIds: Set<string> | null = null;
  const isScopedId = (id: string) => {
    if (!scopedIds) {
      scopedIds = new Set<string>();
      for (const i of scoped) scopedIds.add(input.planes[i].id);
    }
    return scopedIds.has(id);
  };
  for (const a of edgesAll.advisories) if (a.planeIds.some(isScopedId)) advisories.push(a);

  // ---- wind ------------------------------------------------------------------------------------------
  const lGiven = site.wind.leastHorizontalDimensionFt;
  let L: number;
  if (lGiven !== undefined) L = lGiven;
  else {
    const outlines: PlaneGeometry["outline"][] = [];
    for (let i = 0; i < geoms.length; i++) outlines.push(geoms[i].outline);
    L = leastDimensionOfOutlines(outlines);
  }
  const h = site.wind.meanRoofHeightFt ?? null;
  const ed = edgeDistance(L, h);
  const hipRoof = edgesAll.totals.hipLf > 0;

  // ---- per plane --------------------------------------------------------------------------------------
  const channels = new Map<string, ChannelResult>();
  const rates = new Map<StackInput, FastenerRates>();
  const ctx: RoofContext = {
    input,
    geoms,
    planeStacks,
    byPlane: edgesAll.byPlane,
    hipRoof,
    // Only the longest panel is kept past each plane's pass, so one store of panel pieces serves every plane
    // (and every takeoff: the engine runs one takeoff at a time, synchronously).
    panelScratch: PANEL_SCRATCH,
    channelOf: (s: StackInput) => {
      let c = channels.get(s.id);
      if (!c) {
        c = channelFor(s, rules);
        channels.set(s.id, c);
      }
      return c;
    },
    ratesOf: (s: StackInput) => {
      let r = rates.get(s);
      if (!r) {
        r = fastenerRatesOf(s, rules);
        rates.set(s, r);
      }
      return r;
    },
    lowSlopeModel: h !== null ? { kind: "low-slope", aFt: ed.aFt, h, zone3AsZone2: false } : null,
    steepModel: { kind: "steep", aFt: ed.aFt, zone3AsZone2: false },
    steepZone3AsZone2Model: { kind: "steep", aFt: ed.aFt, zone3AsZone2: true },
    detail: opts.detail ?? "full",
  };
  const sums = newJobSums(input.planes.length);
  const planeResults: (PlaneResult | PlaneQuantities)[] = [];
  for (let r = 0; r < scoped.length; r++) planeResults.push(takeoffPlane(ctx, scoped[r], sums));
  const { channelOf } = ctx;
  const { longestByPlane, zones, clips, clipScrews, spacerFasteners, planesWithoutIce, clipLimited, penetrations } = sums;

  // ---- trim ------------------------------------------------------------------------------------------
  const trim = tallyTrim(runs, rules.trim.stockLengthFt, rules.trim.endLapIn, rules.trim.fastenerSpacingIn);
  const trimFasteners = trim.fasteners;

  // ---- stacks: channel and thermal --------------------------------------------------------------------
  const stackResults: StackResult[] = [];
  const thermalAdvisories: Advisory[] = [];
  // The computed planes of each assembly (by id), in plane order: one pass instead of a filter per assembly.
  const planesOfStack = new Map<string, number[]>();
  // Each plane's { id, label, pitch }, one record for both its assembly's list and the roof's (the advisories
  // only read them).
  const pitchOf: { id: string; label: string; pitch: number }[] = [];
  for (let i = 0; i < geoms.length; i++) pitchOf.push({ id: geoms[i].id, label: labels[i], pitch: geoms[i].pitch });
  for (let r = 0; r < scoped.length; r++) {
    const i = scoped[r];
    const sid = planeStacks[i].id;
    const list = planesOfStack.get(sid);
    if (list) list.push(i);
    else planesOfStack.set(sid, [i]);
  }
  for (const s of input.stacks) {
    const planeIdx = planesOfStack.get(s.id);
    if (!planeIdx) continue;
    const ids: string[] = [];
    const pitches: { id: string; label: string; pitch: number }[] = [];
    let plan = 0;
    let sloped = 0;
    // Pitch for the air-space table: the assembly's largest plane (the first of equals).
    let main = planeIdx[0];
    for (let r = 0; r < planeIdx.length; r++) {
      const i = planeIdx[r];
      const g = geoms[i];
      ids.push(g.id);
      pitches.push(pitchOf[i]);
      plan += g.planAreaSqFt;
      sloped += g.slopedAreaSqFt;
      if (g.slopedAreaSqFt > geoms[main].slopedAreaSqFt) main = i;
    }
    const ch = channelOf(s);
    const rb = s.radiantBarrier;
    const facesGap = rb.kind === "foil" ? foilFacesGap(rb.position, rb.reflectiveFace, ch.gapIn) : false;
    const th = computeThermal({
      gapIn: ch.gapIn,
      gapVentilated: gapVentilated(s, ch),
      pitch: geoms[main].pitch,
      foil: rb.kind === "foil" ? { emittance: rb.emittance, facesGap, position: rb.position } : null,
      panelUndersideEmittance: s.panel.panelUndersideEmittance,
      solarReflectance: s.panel.solarReflectance,
      thermalEmittance: s.panel.thermalEmittance,
      climateZone: site.climateZone,
      coolRoofRequired: site.coolRoofRequired,
      planeIds: ids,
    });
    addAll(thermalAdvisories, th.advisories);
    stackResults.push({
      id: s.id,
      name: s.name ?? null,
      planeIds: ids,
      planAreaSqFt: plan,
      slopedAreaSqFt: sloped,
      squares: sloped / 100,
      channel: ch,
      thermal: th.result,
      upliftAssembly: !site.wind.ratedAssemblyRequired ? "not-required" : s.spacer.kind === "none" ? "tested" : "not-tested-needs-review",
    });

    // Assembly advisories.
    addAll(advisories, slopeAdvisories(pitches, { system: s.panel.system, lapSealant: s.panel.lapSealant, minPitch: s.panel.minPitch }));
    addAll(advisories, underlaymentAdvisories(s.underlayment, pitches, site.wind.basicWindSpeedMph));
    addAll(advisories, foilAdvisory({ foil: rb.kind === "foil", facesGap, gapIn: ch.gapIn, position: rb.position, face: rb.reflectiveFace, planeIds: ids }));
    addAll(advisories, gapTooThinAdvisory({ atticType: site.atticType, kind: s.spacer.kind, gapIn: ch.gapIn, claimed: s.ventilation.aboveDeckClaimed, planeIds: ids }));
    addAll(advisories, ratedAssemblyAdvisory({ required: site.wind.ratedAssemblyRequired, spacerKind: s.spacer.kind, planeIds: ids }));
    if (s.spacer.kind === "battens") {
      addAll(advisories, treatedLumberAdvisory({ treated: s.spacer.battens.treated, substrate: s.panel.substrate, planeIds: ids }));
    }
  }
  const dominant = stackResults.reduce((m, s) => (s.slopedAreaSqFt > m.slopedAreaSqFt + 1e-9 ? s : m), stackResults[0]);
  const dominantStack = stacksById.get(dominant.id)!;

  // ---- ventilation (the roof as one vented space) -------------------------------------------------------
  const scopedPlaneIds: string[] = [];
  const scopedPlanes: { id: string; label: string; pitch: number }[] = [];
  let planArea = 0;
  for (let r = 0; r < scoped.length; r++) {
    const i = scoped[r];
    const g = geoms[i];
    scopedPlaneIds.push(g.id);
    scopedPlanes.push(pitchOf[i]);
    planArea += g.planAreaSqFt;
  }
  const ridgeRuns: EdgeRun[] = [];
  for (let k = 0; k < runs.length; k++) if (runs[k].type === "ridge") ridgeRuns.push(runs[k]);
  const vent = computeVentilation({
    site: {
      atticType: site.atticType,
      atticFloorAreaSqFt: site.atticFloorAreaSqFt,
      ventException: site.ventException,
      codeEdition: String(site.codeEdition),
      climateZone: site.climateZone,
      vaporRetarder: site.vaporRetarder,
    },
    roofPlanAreaSqFt: planArea,
    ridgeLf: edgeTotals.ridgeLf,
    ridgeSegments: ridgeRuns.length,
    hipLf: edgeTotals.hipLf,
    headwallLf: edgeTotals.headwallLf,
    eaveLf: edgeTotals.eaveLf,
    intakeNfaPerFtSqIn: dominantStack.ventilation.intakeNfaPerFtSqIn ?? rules.vents.intakeNfaPerFtSqIn,
    exhaustNfaPerFtSqIn: dominantStack.ventilation.exhaustNfaPerFtSqIn ?? rules.vents.ridgeNfaPerFtSqIn,
    ventHips: dominantStack.ventilation.ventHips,
    ventHeadwalls: dominantStack.ventilation.ventHeadwalls,
    aboveDeckClaimed: dominantStack.ventilation.aboveDeckClaimed,
    channel: dominant.channel,
    planeIds: scopedPlaneIds,
  });

  // ---- roof-wide advisories ---------------------------------------------------------------------------
  addAll(
    advisories,
    iceBarrierAdvisories({
      iceDamRisk: site.iceDamRisk,
      climateZoneNumber: climateZoneNumber(site.climateZone),
      planesWithout: planesWithoutIce,
      allPlaneIds: scopedPlaneIds,
    }),
  );
  // The planes grouped by their assembly's longest panel allowed, groups in order of first plane.
  const byMaxLength = new Map<number, { id: string; label: string; longestIn: number }[]>();
  for (let r = 0; r < scoped.length; r++) {
    const i = scoped[r];
    const max = planeStacks[i].panel.maxLengthFt ?? rules.panels.maxLengthFt;
    const entry = { id: geoms[i].id, label: labels[i], longestIn: longestByPlane[i] };
    const list = byMaxLength.get(max);
    if (list) list.push(entry);
    else byMaxLength.set(max, [entry]);
  }
  for (const [mx, planes] of byMaxLength) addAll(advisories, panelLengthAdvisories(planes, mx, Math.min(rules.panels.longPanelInfoFt, mx)));
  addAll(advisories, reroofAdvisory(site.existingLayers, site.tearOff));
  if (penetrations.length) {
    const labelById = new Map<string, string>();
    for (let i = 0; i < geoms.length; i++) labelById.set(geoms[i].id, labels[i]);
    addAll(advisories, cricketAdvisories(penetrations, (id) => labelById.get(id) ?? id));
  }
  const transitionIds: string[] = [];
  for (let k = 0; k < runs.length; k++) if (runs[k].type === "transition") addAll(transitionIds, runs[k].planeIds);
  const transitionPlanes = unique(transitionIds).filter(isScopedId);
  addAll(advisories, transitionAdvisory(edgeTotals.transitionLf, transitionPlanes));
  // The planes whose clips the battens limit, grouped by batten spacing in order of first plane.
  const byBattenSpacing = new Map<number, JobSums["clipLimited"]>();
  for (const c of clipLimited) {
    const list = byBattenSpacing.get(c.battenSpacingIn);
    if (list) list.push(c);
    else byBattenSpacing.set(c.battenSpacingIn, [c]);
  }
  for (const [bs, limited] of byBattenSpacing) addAll(advisories, clipSpacingBattenAdvisory(limited, bs));
  addAll(advisories, fallProtectionAdvisories(scopedPlanes));
  addAll(advisories, windAdvisories({ planes: scopedPlanes, heightMissing: ed.heightMissing, lowSlopeWithoutHeight: sums.lowSlopeWithoutHeight, aFt: ed.aFt }));
  addAll(advisories, vent.advisories);
  addAll(advisories, thermalAdvisories);

  // ---- materials (rounded once, here) -----------------------------------------------------------------
  const { lines, deckSheets, panelScrews } = materialLines({ rules, sums, edgeTotals, trim, vent, ridgeRuns, dominantStack });

  // ---- result -----------------------------------------------------------------------------------------
  const fasteners: FastenersResult = { clips, clipScrews, panelScrews, trimFasteners, spacerFasteners, zones };
  const totals = {
    planAreaSqFt: planArea,
    slopedAreaSqFt: sums.slopedAreaSqFt,
    squares: sums.squares,
    panelCount: sums.panelCount,
    panelLengthFt: sums.panelLengthFt,
    offcutSqFt: sums.offcutSqFt,
    deckSheets,
  };
  const result: TakeoffResult<PlaneResult | PlaneQuantities> = {
    planes: planeResults,
    edgeTotals,
    totals,
    materials: lines,
    fasteners,
    wind: {
      aFt: ed.aFt,
      leastHorizontalDimensionFt: L,
      leastHorizontalDimensionEstimated: lGiven === undefined,
      meanRoofHeightFt: h,
      governs: ed.governs,
      hipRoof,
      basicWindSpeedMph: site.wind.basicWindSpeedMph ?? null,
      exposure: site.wind.exposure ?? null,
    },
    ventilation: vent.result,
    thermal: { ...dominant.thermal, stackId: dominant.id },
    stacks: stackResults,
    advisories: dedupe(advisories),
  };
  return { ok: true, result };
}

/**
 * Drops repeated advisories, keeping the first: two are the same when `${code}|${planeIds}|${message}` is the
 * same text. Then orders them errors, warnings, infos, each kind in the order raised.
 */
function dedupe(list: Advisory[]): Advisory[] {
  // Building and hashing that key for every advisory is costly (messages run to a thousand characters, plane
  // lists to hundreds of ids), so advisories are bucketed by the key's length, worked out without building it.
  // Within a bucket, equal codes, messages and plane lists mean an equal key; only a same-length pair that
  // differs in them has its key texts built and compared (the "|" and "," could then fall elsewhere).
  const byLength = new Map<number, Advisory[]>();
  const errors: Advisory[] = [];
  const warnings: Advisory[] = [];
  const infos: Advisory[] = [];
  for (const a of list) {
    const len = a.code.length + joinedLength(a.planeIds) + a.message.length + 2;
    let bucket = byLength.get(len);
    if (!bucket) {
      bucket = [];
      byLength.set(len, bucket);
    }
    let seen = false;
    for (const b of bucket) {
      if ((b.code === a.code && b.message === a.message && sameStrings(b.planeIds, a.planeIds)) || dedupeKey(b) === dedupeKey(a)) {
        seen = true;
        break;
      }
    }
    if (seen) continue;
    bucket.push(a);
    // A stable sort by severity keeps the order raised within each kind: the same as three lists in turn.
    if (a.severity === "error") errors.push(a);
    else if (a.severity === "warning") warnings.push(a);
    else infos.push(a);
  }
  return errors.concat(warnings, infos);
}

const dedupeKey = (a: Advisory) => `${a.code}|${a.planeIds.join(",")}|${a.message}`;

/** Length of `ids.join(",")`, without joining. */
function joinedLength(ids: string[]): number {
  let n = ids.length > 0 ? ids.length - 1 : 0;
  for (const id of ids) n += id.length;
  return n;
}

function sameStrings(a: string[], b: string[]): boolean {
  if (a.length !== b.length) return false;
  for (let k = 0; k < a.length; k++) if (a[k] !== b[k]) return false;
  return true;
}
