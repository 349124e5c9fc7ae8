/**
 * Gap study: the same takeoff for each of the five spacer options side by side, for a set of planes:
 * none, battens, counter-battens (battens over counter-battens), 3D mesh mat, dimpled sheet. Battens take
 * the assembly's batten settings, which default to 1x4 at 24 in. Every assembly used by the chosen planes
 * gets the option's spacer; edges are still typed against the whole roof.
 */
import { gapStudyInputSchema, type GapStudyInput, type StackInput } from "../schemas/takeoff";
import type { Advisory } from "./advisory";
import { computeTakeoffParsed, refusalFromZod, type TakeoffDetail } from "./takeoff";
import type { MaterialLine } from "./materials";
import type { PlaneQuantities, PlaneResult, TakeoffResult } from "./types";
import { applySpacerAndFoil, SPACER_OPTIONS } from "./stack-options";

export const GAP_STUDY_OPTIONS = SPACER_OPTIONS;
export type GapStudyOption = (typeof GAP_STUDY_OPTIONS)[number];

export interface GapStudySummary {
  gapIn: number;
  channelHeightIn: number;
  continuous: boolean;
  qualifies: boolean;
  channelNfaPerFtSqIn: number;
  effectiveEmittance: number | null;
  airSpaceRSummer: number | null;
  airSpaceRWinter: number | null;
  rNote: string;
  upliftAssembly: "tested" | "not-tested-needs-review" | "not-required";
  /** The spacer's own materials (mats, battens, their fasteners). */
  spacerMaterials: MaterialLine[];
  advisories: Advisory[];
}

export interface GapStudyOptionResult<P extends PlaneQuantities = PlaneResult> {
  spacer: GapStudyOption;
  summary: GapStudySummary;
  result: TakeoffResult<P>;
}

export type GapStudyOutcome<P extends PlaneQuantities = PlaneResult> =
  | { ok: true; options: GapStudyOptionResult<P>[] }
  | { ok: false; reason: string; path: (string | number)[]; fields?: Record<string, string> };

const withSpacer = (stack: StackInput, option: GapStudyOption): StackInput => applySpacerAndFoil(stack, { spacer: option });

const SPACER_KEYS = /^(spacer-|batten-|counter-batten-|screw-batten$)/;

/** The five options; `detail` as in the takeoff (default "full": each plane's whole detail). */
export function computeGapStudyParsed(input: GapStudyInput, detail?: "full"): GapStudyOutcome;
export function computeGapStudyParsed(input: GapStudyInput, detail: TakeoffDetail): GapStudyOutcome<PlaneResult | PlaneQuantities>;
export function computeGapStudyParsed(input: GapStudyInput, detail: TakeoffDetail = "full"): GapStudyOutcome<PlaneResult | PlaneQuantities> {
  const options: GapStudyOptionResult<PlaneResult | PlaneQuantities>[] = [];
  const chosen = new Set(input.planeIds);
  const usedStacks = new Set(input.planes.filter((p) => chosen.has(p.id)).map((p) => p.stackId ?? input.defaultStackId));
  for (const option of GAP_STUDY_OPTIONS) {
    const stacks = input.stacks.map((s) => (usedStacks.has(s.id) ? withSpacer(s, option) : s));
    const out = computeTakeoffParsed({ ...input, stacks }, { planeIds: input.planeIds, detail });
    if (!out.ok) return out;
    const r = out.result;
    const main = r.stacks.reduce((m, s) => (s.slopedAreaSqFt > m.slopedAreaSqFt ? s : m), r.stacks[0]);
    options.push({
      spacer: option,
      summary: {
        gapIn: main.channel.gapIn,
        channelHeightIn: main.channel.channelHeightIn,
        continuous: main.channel.continuous,
        qualifies: main.channel.qualifies,
        channelNfaPerFtSqIn: main.channel.channelNfaPerFtSqIn,
        effectiveEmittance: main.thermal.effectiveEmittance,
        airSpaceRSummer: main.thermal.airSpaceRSummer,
        airSpaceRWinter: main.thermal.airSpaceRWinter,
        rNote: main.thermal.rNote,
        upliftAssembly: main.upliftAssembly,
        spacerMaterials: r.materials.filter((m) => SPACER_KEYS.test(m.key)),
        advisories: r.advisories,
      },
      result: r,
    });
  }
  return { ok: true, options };
}

/** Parse with the schema (takeoff input + planeIds), then run the five options. */
export function computeGapStudy(input: unknown, detail?: "full"): GapStudyOutcome;
export function computeGapStudy(input: unknown, detail: TakeoffDetail): GapStudyOutcome<PlaneResult | PlaneQuantities>;
export function computeGapStudy(input: unknown, detail: TakeoffDetail = "full"): GapStudyOutcome<PlaneResult | PlaneQuantities> {
  const parsed = gapStudyInputSchema.safeParse(input);
  if (!parsed.success) return refusalFromZod(parsed.error);
  return computeGapStudyParsed(parsed.data, detail);
}
