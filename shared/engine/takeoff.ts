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
  ratedAssemblyAdvisory,
  reroofAdvisory,
  slopeAdvisories,
  transitionAdvisory,
  treatedLumberAdvisory,
  underlaymentAdvisories,
  windAdvisories,
} from "./advisories";
import { ceilTol, fmt, num, plural, wasteText } from "./format";
import { battenPieces, battenTotals, counterBattenTotals } from "./layers/battens";
import { deckAreaToReplace } from "./layers/deck";
import { iceBarrierCourses, iceBarrierWidthIn } from "./layers/ice-barrier";
import { rollsFor, type RollSpec } from "./layers/rolls";
import { LUMBER, type LumberNominal } from "./lumber";
import { MATERIAL_KEYS, materialLine, pipeBootKey, type MaterialKey, type MaterialLine } from "./materials";
import type { EdgeType } from "./roof/edge-types";
import { analyseEdges, buildRuns, edgeTotalsOf, pieceAt, type EdgePiece, type EdgeRun, type EdgeTotals } from "./roof/edges";
import { isGeometryError, planeGeometryOfParsed, toPlan, type PlaneGeometry } from "./roof/geometry";
import { layoutPanels, PanelPieces } from "./roof/panels";
import { slopeAngleDeg } from "./roof/slope";
import { computeThermal, foilFacesGap } from "./thermal/index";
import { countTrimRuns, TRIM_KEY_BY_EDGE, type TrimRunCount } from "./trim";
import type { EdgeQuantities, FastenersResult, PlaneQuantities, PlaneResult, StackResult, TakeoffOutcome, TakeoffQuantities, TakeoffResult, ZoneFasteners } from "./types";
import { aboveDeckChannel, type ChannelResult } from "./ventilation/channel";
import { climateZoneNumber, computeVentilation } from "./ventilation/index";
import {
  edgeDistance,
  HIP_ZONE3_MAX_PITCH,
  type EdgeDistance,
  leastDimensionOfOutlines,
  LOW_SLOPE_MAX_PITCH,
  planeFasteners,
  WIND_ZONES,
  type PlaneWindZones,
  type WindZone,
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

/** "full": each plane's whole detail (PlaneResult); "quantities": its quantities only (PlaneQuantities). */
export type TakeoffDetail = "full" | "quantities";

export interface TakeoffOptions {
  /** Compute only these planes (edges are still typed against every plane of the roof). */
  planeIds?: readonly string[];
  /** What each plane's entry holds; default "full". */
  detail?: TakeoffDetail;
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
const MATERIAL_RANK = new Map(Object.keys(MATERIAL_KEYS).map((k, i) => [k, i]));

const zeroZone = (): ZoneFasteners => ({ clips: 0, clipScrews: 0, panelScrews: 0, lineFt: 0, areaSqFt: 0 });

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

function edgeTypeAtPanelEnd(g: PlaneGeometry, pieces: EdgePiece[], single: (EdgeType | null)[], edge: number, s: number): EdgeType | undefined {
  const t = single[edge];
  if (t) return t; // the edge is one piece
  const p = toPlan(g, s, edgeVAt(g, edge, s));
  return pieceAt(pieces, edge, p)?.type;
}

/** Per outline edge: its type when it is a single piece, else null (look the piece up by position). */
function singlePieceTypes(g: PlaneGeometry, pieces: EdgePiece[]): (EdgeType | null)[] {
  const out: (EdgeType | null)[] = new Array(g.edges.length).fill(null);
  const count = new Array(g.edges.length).fill(0);
  for (const pc of pieces) count[pc.edgeIndex]++;
  for (const pc of pieces) if (count[pc.edgeIndex] === 1) out[pc.edgeIndex] = pc.type;
  return out;
}

/** What the per-plane passes add up across the job (rounded once, in the materials). */
interface JobSums {
  longestByPlane: Map<number, number>;
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

const newJobSums = (): JobSums => ({
  longestByPlane: new Map(),
  slopedAreaSqFt: 0,
  squares: 0,
  panelCount: 0,
  panelLengthFt: 0,
  offcutSqFt: 0,
  zones: { "1'": zeroZone(), "1": zeroZone(), "2": zeroZone(), "3": zeroZone() },
  clips: 0,
  clipScrews: 0,
  panelScrewsExact: 0,
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
});

/** The roof-wide facts each plane's pass reads. */
interface RoofContext {
  input: TakeoffInput;
  geoms: PlaneGeometry[];
  planeStacks: StackInput[];
  /** Edge pieces per plane, typed against the whole roof. */
  byPlane: EdgePiece[][];
  ed: EdgeDistance;
  h: number | null;
  hipRoof: boolean;
  panelScratch: PanelPieces;
  channelOf: (s: StackInput) => ChannelResult;
  detail: TakeoffDetail;
}

/** One plane's takeoff; its quantities are also added to the job's sums. */
function takeoffPlane(ctx: RoofContext, i: number, sums: JobSums): PlaneResult | PlaneQuantities {
  const { input, geoms, planeStacks, ed, h, hipRoof } = ctx;
  const { site, rules } = input;
  const screwsPerClip = rules.clips.screwsPerClip;
  const g = geoms[i];
  const plane = input.planes[i];
  const stack = planeStacks[i];
  const pieces = ctx.byPlane[i];
  const panelOpts = stack.panel;
  const panels = layoutPanels(g, {
    coverageWidthIn: panelOpts.coverageWidthIn,
    start: panelOpts.start,
    hemAllowanceIn: panelOpts.hemAllowanceIn ?? rules.panels.hemAllowanceIn,
    into: ctx.panelScratch,
  });
  sums.longestByPlane.set(i, panels.longestIn);
  sums.slopedAreaSqFt += g.slopedAreaSqFt;
  sums.squares += g.squares;
  sums.panelCount += panels.count;
  sums.panelLengthFt += panels.totalLengthFt;
  sums.offcutSqFt += panels.offcutSqFt;
  const pKey: MaterialKey = panelOpts.system === "standing-seam" ? "panel-standing-seam" : "panel-exposed-fastener";
  const pl = sums.panelLf.get(pKey) ?? { lf: 0, count: 0 };
  pl.lf += panels.totalLengthFt;
  pl.count += panels.count;
  sums.panelLf.set(pKey, pl);

  // Wind zones and fasteners.
  let model: ZoneModel;
  if (g.pitch <= LOW_SLOPE_MAX_PITCH + 1e-9 && h !== null) model = { kind: "low-slope", aFt: ed.aFt, h, zone3AsZone2: false };
  else {
    if (g.pitch <= LOW_SLOPE_MAX_PITCH + 1e-9) sums.lowSlopeWithoutHeight.push(g.id);
    model = { kind: "steep", aFt: ed.aFt, zone3AsZone2: hipRoof && g.pitch <= HIP_ZONE3_MAX_PITCH + 1e-9 };
  }
  const sp = stack.spacer;
  const battenSpacingIn = sp.kind === "battens" && panelOpts.system === "standing-seam" ? sp.battens.spacingIn : null;
  const wz: PlaneWindZones = planeFasteners(g, pieces, panels, {
    system: panelOpts.system,
    model,
    clipSpacingIn: {
      field: panelOpts.clipSpacingIn.field ?? rules.clips.spacingIn.field,
      edge: panelOpts.clipSpacingIn.edge ?? rules.clips.spacingIn.edge,
      corner: panelOpts.clipSpacingIn.corner ?? rules.clips.spacingIn.corner,
    },
    screwsPerSquare: {
      field: panelOpts.screwsPerSquare.field ?? rules.exposedFastener.screwsPerSquare.field,
      edge: panelOpts.screwsPerSquare.edge ?? rules.exposedFastener.screwsPerSquare.edge,
      corner: panelOpts.screwsPerSquare.corner ?? rules.exposedFastener.screwsPerSquare.corner,
    },
    battenSpacingIn,
  });
  if (battenSpacingIn && wz.spacingLimitedByBattens.length) sums.clipLimited.push({ planeId: g.id, zones: wz.spacingLimitedByBattens, battenSpacingIn });
  sums.clips += wz.clips;
  sums.clipScrews += wz.clips * screwsPerClip;
  sums.panelScrewsExact += wz.panelScrews;
  for (const z of WIND_ZONES) {
    const src = wz.zones[z];
    sums.zones[z].clips += src.clips;
    sums.zones[z].clipScrews += src.clips * screwsPerClip;
    sums.zones[z].panelScrews += src.panelScrews;
    sums.zones[z].lineFt += src.lineFt;
    sums.zones[z].areaSqFt += src.areaSqFt;
  }

  // Closures at the panel ends.
  const ch = ctx.channelOf(stack);
  const vented = gapVentilated(stack, ch);
  const single = singlePieceTypes(g, pieces);
  const pp = panels.pieces;
  for (let n = 0; n < pp.count; n++) {
    const bottom = edgeTypeAtPanelEnd(g, pieces, single, pp.bottomEdge(n), pp.sProbe(n));
    const top = edgeTypeAtPanelEnd(g, pieces, single, pp.topEdge(n), pp.sProbe(n));
    if (bottom === "eave") {
      if (vented) sums.closureVented++;
      else sums.closureEave++;
    }
    if (top === "ridge" || top === "hip") {
      if (vented) sums.closureVented++;
      else sums.closureRidge++;
    }
  }

  // Layers.
  const uKey = underlaymentKey(stack);
  const u = sums.underl.get(uKey) ?? { area: 0, layered: 0, layers: new Set<number>() };
  u.area += g.slopedAreaSqFt;
  u.layered += g.slopedAreaSqFt * stack.underlayment.layers;
  u.layers.add(stack.underlayment.layers);
  sums.underl.set(uKey, u);

  let ice: PlaneResult["layers"]["iceBarrier"] = null;
  const wantsIce = stack.underlayment.iceBarrier ?? site.iceDamRisk === true;
  const eaveLf = pieces.filter((pc) => pc.type === "eave").reduce((t, pc) => t + pc.trueLengthFt, 0);
  if (wantsIce && eaveLf > 0) {
    const widthIn = iceBarrierWidthIn(plane.eaveOverhangIn, g.pitch, site.codeEdition, rules.iceBarrier.insideWallIn);
    if (stack.underlayment.kind === "self-adhered") {
      ice = { widthIn, courses: 0, eaveLf, membraneLf: 0, note: "The self-adhered underlayment covers the whole deck, so no separate ice barrier is added." };
    } else {
      const courses = iceBarrierCourses(widthIn, rules.iceBarrier.rollWidthIn, rules.iceBarrier.sideLapIn);
      sums.iceMembraneLf += courses * eaveLf;
      sums.icePlanes.push({ id: g.id, widthIn, courses, eaveLf });
      ice = { widthIn, courses, eaveLf, membraneLf: courses * eaveLf };
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
    const b = sums.battenLf.get(sp.battens.nominal) ?? { lf: 0, rows: 0 };
    b.lf += rows.lf;
    b.rows += rows.rows;
    sums.battenLf.set(sp.battens.nominal, b);
    sums.spacerFasteners += rows.fasteners;
    battens = { nominal: sp.battens.nominal, rows: rows.rows, lf: rows.lf, fasteners: rows.fasteners, spacingIn: sp.battens.spacingIn };
    if (sp.battens.counterBattens) {
      const nominal = sp.battens.counterBattenNominal ?? sp.battens.nominal;
      const spacing = sp.battens.counterBattenSpacingIn ?? rules.battens.counterBattenSpacingIn;
      const cr = counterBattenTotals(g, spacing, rules.battens.fastenerSpacingIn);
      const c = sums.counterLf.get(nominal) ?? { lf: 0, runs: 0 };
      c.lf += cr.lf;
      c.runs += cr.rows;
      sums.counterLf.set(nominal, c);
      sums.spacerFasteners += cr.fasteners;
      counterBattens = { nominal, runs: cr.rows, lf: cr.lf, fasteners: cr.fasteners, spacingIn: spacing };
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

  for (const pen of plane.penetrations) sums.penetrations.push({ planeId: g.id, kind: pen.kind, diameterIn: pen.diameterIn, widthIn: pen.widthIn, id: pen.id, count: pen.count });

  if (ctx.detail === "quantities") {
    const edges: EdgeQuantities[] = [];
    for (const pc of pieces) edges.push({ index: pc.edgeIndex, type: pc.type, planLengthFt: pc.planLengthFt, trueLengthFt: pc.trueLengthFt });
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
    vertices: g.outline.map((p, k) => ({ x: p[0], y: p[1], z: g.heights[k] })),
    eaveEdge: g.eaveEdge,
    edges: pieces.map((pc) => ({
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
    })),
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
    windZones: wz,
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

/** The job's quantities in purchase units, each with the arithmetic in words; rounded once, here. */
function materialLines(m: {
  rules: TakeoffInput["rules"];
  sums: JobSums;
  edgeTotals: EdgeTotals;
  trimRuns: TrimRunCount[];
  trimLaps: number;
  trimFasteners: number;
  vent: ReturnType<typeof computeVentilation>;
  ridgeRuns: EdgeRun[];
  dominantStack: StackInput;
}): { lines: MaterialLine[]; deckSheets: number; panelScrews: number } {
  const { rules, sums, edgeTotals, trimRuns, trimLaps, trimFasteners, vent, ridgeRuns, dominantStack } = m;
  const { clips, clipScrews, panelScrewsExact, spacerFasteners, underl, iceMembraneLf, icePlanes, meshArea, dimpledArea, foilArea, deckArea } = sums;
  const { battenLf, counterLf, panelLf, closureEave, closureRidge, closureVented, penetrations } = sums;
  const screwsPerClip = rules.clips.screwsPerClip;
  const w = rules.waste;
  const lines: MaterialLine[] = [];
  for (const [key, v] of panelLf) {
    lines.push(
      materialLine(
        key,
        Number(v.lf.toFixed(4)),
        `${v.count} ${plural(v.count, "panel")} ordered to the inch (see each plane's cut list), Σ lengths = ${fmt(v.lf, 2)} lf; offcuts are in the lengths, no further waste`,
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
    // Planes with the same width and courses are one term (a large roof would otherwise list every plane).
    const groups = new Map<string, { ids: string[]; eaveLf: number; courses: number; widthIn: number }>();
    for (const p of icePlanes) {
      const key = `${p.widthIn}|${p.courses}`;
      const gr = groups.get(key);
      if (gr) {
        gr.ids.push(p.id);
        gr.eaveLf += p.eaveLf;
      } else groups.set(key, { ids: [p.id], eaveLf: p.eaveLf, courses: p.courses, widthIn: p.widthIn });
    }
    const detail = Array.from(groups.values())
      .map((gr) => `${gr.ids.length === 1 ? gr.ids[0] : `${gr.ids.length} planes`}: ${fmt(gr.eaveLf)} ft eave × ${gr.courses} ${plural(gr.courses, "course")} (${fmt(gr.widthIn)} in up the slope)`)
      .join("; ");
    lines.push(
      materialLine(
        "ice-barrier",
        rolls,
        `${detail} = ${fmt(iceMembraneLf)} lf of ${num(ib.rollWidthIn)} in membrane × ${wasteText(w.iceBarrierPct)} waste ÷ ${fmt(perRoll, 2)} ft net per roll (${num(ib.rollLengthFt)} ft − ${num(ib.endLapIn)} in end lap) = ${fmt(exact, 2)} → ${rolls} ${plural(rolls, "roll")}`,
      ),
    );
  }
  if (meshArea > 0) lines.push(materialLine("spacer-mesh", rollsFor(meshArea, w.meshPct, rules.mesh).rolls, rollsFor(meshArea, w.meshPct, rules.mesh).basis));
  if (dimpledArea > 0) lines.push(materialLine("spacer-dimpled", rollsFor(dimpledArea, w.dimpledPct, rules.dimpled).rolls, rollsFor(dimpledArea, w.dimpledPct, rules.dimpled).basis));
  const stock = rules.battens.stockLengthFt;
  for (const [nominal, v] of battenLf) {
    const pcs = battenPieces(v.lf, w.battensPct, stock);
    const lum = LUMBER[nominal];
    lines.push(
      materialLine(
        `batten-${nominal}` as MaterialKey,
        pcs,
        `${v.rows} ${plural(v.rows, "row")} across the slope = ${fmt(v.lf)} lf × ${wasteText(w.battensPct)} waste ÷ ${num(stock)} ft stock = ${fmt((v.lf * (1 + w.battensPct / 100)) / stock, 2)} → ${pcs} ${plural(pcs, "piece")} (${num(lum.thicknessIn)} × ${num(lum.widthIn)} in dressed)`,
      ),
    );
  }
  for (const [nominal, v] of counterLf) {
    const pcs = battenPieces(v.lf, w.battensPct, stock);
    lines.push(
      materialLine(
        `counter-batten-${nominal}` as MaterialKey,
        pcs,
        `${v.runs} ${plural(v.runs, "run")} up the slope = ${fmt(v.lf)} lf × ${wasteText(w.battensPct)} waste ÷ ${num(stock)} ft stock = ${fmt((v.lf * (1 + w.battensPct / 100)) / stock, 2)} → ${pcs} ${plural(pcs, "piece")}`,
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
        `${fmt(deckArea)} ft² of deck to replace × ${wasteText(w.deckPct)} waste ÷ ${num(rules.deck.sheetSqFt)} ft² per sheet = ${fmt(exact, 2)} → ${deckSheets} ${plural(deckSheets, "sheet")}`,
      ),
    );
  }
  // Trim by type: pieces per run, summed.
  const edgeOrder: EdgeType[] = ["eave", "rake", "ridge", "hip", "valley", "sidewall", "headwall", "transition"];
  for (const t of edgeOrder) {
    const rs = trimRuns.filter((r) => r.type === t);
    if (!rs.length) continue;
    const pieces = rs.reduce((s, r) => s + r.pieces, 0);
    const qty = ceilTol(pieces * (1 + w.trimPct / 100));
    // Equal runs are one term: "4 × 36 ft → 4" (four runs of 36 ft, 4 pieces each).
    const same = new Map<string, number>();
    for (const r of rs) {
      const key = `${fmt(r.lengthFt)} ft → ${r.pieces}`;
      same.set(key, (same.get(key) ?? 0) + 1);
    }
    const list = Array.from(same, ([key, n]) => (n > 1 ? `${n} × ${key}` : key)).join(", ");
    lines.push(
      materialLine(
        TRIM_KEY_BY_EDGE[t],
        qty,
        `${rs.length} ${plural(rs.length, "run")} (${list}); pieces per run = ceil((L − ${num(rules.trim.endLapIn)} in lap) ÷ (${num(rules.trim.stockLengthFt)} ft − lap)) = ${pieces}` +
          (w.trimPct ? ` × ${wasteText(w.trimPct)} waste → ${qty}` : ""),
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
        `${fmt(edgeTotals.valleyLf)} lf of valley × ${wasteText(w.iceBarrierPct)} waste ÷ ${fmt(perRoll, 2)} ft net per ${num(ib.rollWidthIn)} in roll = ${fmt(exact, 2)} → ${rolls} ${plural(rolls, "roll")}`,
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
          `${fmt(sealLf)} lf ÷ ${num(rules.sealant.lfPerTube)} lf per tube = ${fmt(exact, 2)} → ${tubes} ${plural(tubes, "tube")}`,
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
          `${fmt(butylLf)} lf ÷ ${num(rules.butyl.rollLengthFt)} ft per roll = ${fmt(exact, 2)} → ${rolls} ${plural(rolls, "roll")}`,
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
    lines.push(materialLine(key, boxes, `${fmt(count, 0)} ${what} × ${wasteText(fw)} waste ÷ ${perBox} per box = ${fmt(exact, 2)} → ${boxes} ${plural(boxes, "box", "boxes")}`));
  };
  if (clips > 0) {
    const perClipBox = rules.fasteners.clipsPerBox;
    const exact = (clips * (1 + fw / 100)) / perClipBox;
    const n = ceilTol(exact);
    lines.push(
      materialLine(
        "clip",
        n,
        `${clips} clips placed (per clip line 1 + Σ ceil(zone segment ÷ zone spacing)) × ${wasteText(fw)} waste${perClipBox > 1 ? ` ÷ ${perClipBox} per box` : ""} = ${fmt(exact, 2)} → ${n}`,
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
          `ridge ${fmt(edgeTotals.ridgeLf)} lf less 1 ft at each end of ${ridgeRuns.length} ${plural(ridgeRuns.length, "ridge")}${dominantStack.ventilation.ventHips ? " + vented hips" : ""}${dominantStack.ventilation.ventHeadwalls ? " + vented headwalls" : ""} = ${fmt(vent.result.exhaustLf)} lf → ${q} lf`,
        ),
      );
    }
    if (vent.result.intakeLf > 0) {
      const q = ceilTol(vent.result.intakeLf);
      lines.push(materialLine("vent-intake", q, `eaves ${fmt(vent.result.intakeLf)} lf → ${q} lf`));
    }
  }
  lines.sort((a, b) => MATERIAL_RANK.get(a.key)! - MATERIAL_RANK.get(b.key)!);
  return { lines, deckSheets, panelScrews };
}

export function computeTakeoffParsed(input: TakeoffInput, opts?: TakeoffOptions & { detail?: "full" }): TakeoffOutcome;
export function computeTakeoffParsed(input: TakeoffInput, opts: TakeoffOptions & { detail: "quantities" }): TakeoffOutcome<TakeoffQuantities>;
export function computeTakeoffParsed(input: TakeoffInput, opts: TakeoffOptions = {}): TakeoffOutcome<TakeoffResult<PlaneResult | PlaneQuantities>> {
  const { site, rules } = input;
  // ---- geometry --------------------------------------------------------------------------------------
  const geoms: PlaneGeometry[] = [];
  for (let i = 0; i < input.planes.length; i++) {
    const g = planeGeometryOfParsed(input.planes[i], i);
    if (isGeometryError(g)) return g;
    geoms.push(g);
  }
  const stacksById = new Map(input.stacks.map((s) => [s.id, s]));
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
  const scoped = geoms.map((_, i) => i).filter(inScope);
  if (!scoped.length) return { ok: false, reason: "None of the chosen planes is on this roof", path: ["planeIds"] };

  // ---- edges (typed against the whole roof) -------------------------------------------------------------
  const overrides = input.planes.map((p) => (Object.keys(p.edgeTypes).length ? p.edgeTypes : null));
  const edgesAll = analyseEdges(geoms, (p, e) => overrides[p]?.[e]);
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
  const scopedIds = new Set(scoped.map((i) => input.planes[i].id));
  advisories.push(...edgesAll.advisories.filter((a) => a.planeIds.some((id) => scopedIds.has(id))));

  // ---- wind ------------------------------------------------------------------------------------------
  const lGiven = site.wind.leastHorizontalDimensionFt;
  const L = lGiven ?? leastDimensionOfOutlines(geoms.map((g) => g.outline));
  const h = site.wind.meanRoofHeightFt ?? null;
  const ed = edgeDistance(L, h);
  const hipRoof = edgesAll.totals.hipLf > 0;

  // ---- per plane --------------------------------------------------------------------------------------
  const channels = new Map<string, ChannelResult>();
  const ctx: RoofContext = {
    input,
    geoms,
    planeStacks,
    byPlane: edgesAll.byPlane,
    ed,
    h,
    hipRoof,
    // Only the longest panel is kept past each plane's pass, so one store of panel pieces serves every plane.
    panelScratch: new PanelPieces(64),
    channelOf: (s: StackInput) => {
      let c = channels.get(s.id);
      if (!c) {
        c = channelFor(s, rules);
        channels.set(s.id, c);
      }
      return c;
    },
    detail: opts.detail ?? "full",
  };
  const sums = newJobSums();
  const planeResults = scoped.map((i) => takeoffPlane(ctx, i, sums));
  const { channelOf } = ctx;
  const { longestByPlane, zones, clips, clipScrews, spacerFasteners, planesWithoutIce, clipLimited, penetrations } = sums;

  // ---- trim ------------------------------------------------------------------------------------------
  const trimRuns = countTrimRuns(runs, rules.trim.stockLengthFt, rules.trim.endLapIn, rules.trim.fastenerSpacingIn);
  const trimFasteners = trimRuns.reduce((t, r) => t + r.fasteners, 0);
  const trimLaps = trimRuns.reduce((t, r) => t + r.laps, 0);

  // ---- stacks: channel and thermal --------------------------------------------------------------------
  const stackResults: StackResult[] = [];
  const thermalAdvisories: Advisory[] = [];
  for (const s of input.stacks) {
    const planeIdx = scoped.filter((i) => planeStacks[i].id === s.id);
    if (!planeIdx.length) continue;
    const ids = planeIdx.map((i) => geoms[i].id);
    const ch = channelOf(s);
    const plan = planeIdx.reduce((t, i) => t + geoms[i].planAreaSqFt, 0);
    const sloped = planeIdx.reduce((t, i) => t + geoms[i].slopedAreaSqFt, 0);
    // Pitch for the air-space table: the assembly's largest plane.
    const main = planeIdx.reduce((m, i) => (geoms[i].slopedAreaSqFt > geoms[m].slopedAreaSqFt ? i : m), planeIdx[0]);
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
    thermalAdvisories.push(...th.advisories);
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
    const pitches = planeIdx.map((i) => ({ id: geoms[i].id, pitch: geoms[i].pitch }));
    advisories.push(...slopeAdvisories(pitches, { system: s.panel.system, lapSealant: s.panel.lapSealant, minPitch: s.panel.minPitch }));
    advisories.push(...underlaymentAdvisories(s.underlayment, pitches, site.wind.basicWindSpeedMph));
    advisories.push(...foilAdvisory({ foil: rb.kind === "foil", facesGap, gapIn: ch.gapIn, position: rb.position, face: rb.reflectiveFace, planeIds: ids }));
    advisories.push(...gapTooThinAdvisory({ atticType: site.atticType, kind: s.spacer.kind, gapIn: ch.gapIn, claimed: s.ventilation.aboveDeckClaimed, planeIds: ids }));
    advisories.push(...ratedAssemblyAdvisory({ required: site.wind.ratedAssemblyRequired, spacerKind: s.spacer.kind, planeIds: ids }));
    if (s.spacer.kind === "battens") {
      advisories.push(...treatedLumberAdvisory({ treated: s.spacer.battens.treated, substrate: s.panel.substrate, planeIds: ids }));
    }
  }
  const dominant = stackResults.reduce((m, s) => (s.slopedAreaSqFt > m.slopedAreaSqFt + 1e-9 ? s : m), stackResults[0]);
  const dominantStack = stacksById.get(dominant.id)!;

  // ---- ventilation (the roof as one vented space) -------------------------------------------------------
  const scopedPlaneIds = scoped.map((i) => geoms[i].id);
  const planArea = scoped.reduce((t, i) => t + geoms[i].planAreaSqFt, 0);
  const ridgeRuns = runs.filter((r) => r.type === "ridge");
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
  const scopedPlanes = scoped.map((i) => ({ id: geoms[i].id, pitch: geoms[i].pitch }));
  advisories.push(
    ...iceBarrierAdvisories({
      iceDamRisk: site.iceDamRisk,
      climateZoneNumber: climateZoneNumber(site.climateZone),
      planesWithout: planesWithoutIce,
      allPlaneIds: scopedPlaneIds,
    }),
  );
  const maxLengthByPlane = scoped.map((i) => ({ id: geoms[i].id, longestIn: longestByPlane.get(i)!, max: planeStacks[i].panel.maxLengthFt ?? rules.panels.maxLengthFt }));
  const maxFts = unique(maxLengthByPlane.map((p) => p.max));
  for (const mx of maxFts) {
    advisories.push(
      ...panelLengthAdvisories(
        maxLengthByPlane.filter((p) => p.max === mx),
        mx,
        Math.min(rules.panels.longPanelInfoFt, mx),
      ),
    );
  }
  advisories.push(...reroofAdvisory(site.existingLayers, site.tearOff));
  advisories.push(...cricketAdvisories(penetrations));
  const transitionPlanes = unique(runs.filter((r) => r.type === "transition").flatMap((r) => r.planeIds)).filter((id) => scopedIds.has(id));
  advisories.push(...transitionAdvisory(edgeTotals.transitionLf, transitionPlanes));
  const battenSpacings = unique(clipLimited.map((c) => c.battenSpacingIn));
  for (const bs of battenSpacings) advisories.push(...clipSpacingBattenAdvisory(clipLimited.filter((c) => c.battenSpacingIn === bs), bs));
  advisories.push(...fallProtectionAdvisories(scopedPlanes));
  advisories.push(...windAdvisories({ planes: scopedPlanes, heightMissing: ed.heightMissing, lowSlopeWithoutHeight: sums.lowSlopeWithoutHeight, aFt: ed.aFt }));
  advisories.push(...vent.advisories, ...thermalAdvisories);

  // ---- materials (rounded once, here) -----------------------------------------------------------------
  const { lines, deckSheets, panelScrews } = materialLines({ rules, sums, edgeTotals, trimRuns, trimLaps, trimFasteners, vent, ridgeRuns, dominantStack });

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

function dedupe(list: Advisory[]): Advisory[] {
  const seen = new Set<string>();
  const out: Advisory[] = [];
  for (const a of list) {
    const key = `${a.code}|${a.planeIds.join(",")}|${a.message}`;
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(a);
  }
  const rank = { error: 0, warning: 1, info: 2 } as const;
  return out.map((a, i) => ({ a, i })).sort((x, y) => rank[x.a.severity] - rank[y.a.severity] || x.i - y.i).map((x) => x.a);
}
