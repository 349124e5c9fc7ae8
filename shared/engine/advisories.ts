/**
 * The takeoff's own advisories (the ventilation and thermal modules raise theirs: vent area, balance,
 * the above-deck channel, cool roof and condensation). Each has our own stable code, a severity, a
 * plain-language message, the published reference or "common practice", and the planes concerned.
 */
import { advisory, type Advisory } from "./advisory";
import { fmt, zoneListText } from "./format";
import { CRICKET_MIN_WIDTH_IN } from "./trim";
import { WIND_FIGURES_MAX_PITCH, type WindZone } from "./wind/zones";

export type PanelSystem = "standing-seam" | "exposed-fastener";
export type UnderlaymentKind = "self-adhered" | "synthetic" | "felt";

const pitchText = (p: number) => `${fmt(p, p % 1 === 0 ? 0 : 2)}:12`;

/** A message names at most this many planes (or openings) and counts the rest; the advisory's planeIds list them all. */
export const MAX_NAMED_IN_MESSAGE = 8;

/**
 * Each item's text, comma-separated, the first MAX_NAMED_IN_MESSAGE of them, then "and 12 more" for the rest.
 * Written as a loop rather than map() then join(): with those, V8's check of the mapped array's hidden class
 * failed on every takeoff (a deoptimization loop seen with node --trace-deopt), so the whole takeoff that had
 * inlined this advisory left optimized code each run.
 */
function listText<T>(items: readonly T[], term: (x: T) => string): string {
  let s = "";
  const n = Math.min(items.length, MAX_NAMED_IN_MESSAGE);
  for (let k = 0; k < n; k++) s += (k > 0 ? ", " : "") + term(items[k]);
  if (items.length > n) s += ` and ${items.length - n} more`;
  return s;
}

/**
 * A plane as the advisories name it in their messages: `label` is what the estimator called it (see planeLabels),
 * `id` goes into the advisory's planeIds.
 */
export interface NamedPlane {
  id: string;
  label: string;
}

/** `South slope, North slope`: the planes' labels. */
const planeList = (planes: readonly NamedPlane[]) => listText(planes, (p) => p.label);

/**
 * How messages name each plane: its name; its id when it has no name; its name and id, as "South slope (hip-s)",
 * when another plane of the roof has the same name (two buildings each with a "South slope").
 */
export function planeLabels(planes: readonly { id: string; name: string }[]): string[] {
  const uses = new Map<string, number>();
  for (const p of planes) {
    const name = p.name.trim();
    if (name) uses.set(name, (uses.get(name) ?? 0) + 1);
  }
  return planes.map((p) => {
    const name = p.name.trim();
    if (!name) return p.id;
    return uses.get(name)! > 1 ? `${name} (${p.id})` : name;
  });
}

/**
 * Code minimum slope for metal roof panels, IRC 2021 R905.10.2 / IBC 1507.4.2: lapped, non-soldered
 * seams without applied lap sealant 3:12; with applied lap sealant 1/2:12; standing seam 1/4:12.
 */
export function codeMinimumPitch(system: PanelSystem, lapSealant: boolean): number {
  if (system === "standing-seam") return 0.25;
  return lapSealant ? 0.5 : 3;
}

export function slopeAdvisories(
  planes: (NamedPlane & { pitch: number })[],
  panel: { system: PanelSystem; lapSealant: boolean; minPitch?: number },
): Advisory[] {
  const out: Advisory[] = [];
  const code = codeMinimumPitch(panel.system, panel.lapSealant);
  const belowCode = planes.filter((p) => p.pitch < code - 1e-9);
  if (belowCode.length) {
    const what =
      panel.system === "standing-seam"
        ? "standing-seam panels"
        : panel.lapSealant
          ? "lapped panels with applied lap sealant"
          : "lapped, non-soldered panels without applied lap sealant";
    out.push(
      advisory(
        "slope-below-code-minimum",
        "error",
        `The code's minimum slope for ${what} is ${pitchText(code)}; ${listText(belowCode, (p) => `${p.label} is ${pitchText(p.pitch)}`)}. ` +
          "Choose a panel system rated for this slope or change the roof's slope.",
        "IRC 2021 R905.10.2; IBC 2021 1507.4.2",
        belowCode.map((p) => p.id),
      ),
    );
  }
  if (panel.minPitch !== undefined) {
    const belowMaker = planes.filter((p) => p.pitch < panel.minPitch! - 1e-9 && p.pitch >= code - 1e-9);
    if (belowMaker.length) {
      out.push(
        advisory(
          "slope-below-maker-minimum",
          "warning",
          `The panel maker's minimum slope is ${pitchText(panel.minPitch)}; ${listText(belowMaker, (p) => `${p.label} is ${pitchText(p.pitch)}`)}. ` +
            "Below it the profile can leak and the warranty may not apply: use a profile rated for the slope.",
          "the panel maker's installation instructions",
          belowMaker.map((p) => p.id),
        ),
      );
    }
  }
  return out;
}

export function underlaymentAdvisories(
  stack: { kind: UnderlaymentKind; highTemp: boolean; layers: number },
  planes: (NamedPlane & { pitch: number })[],
  basicWindSpeedMph: number | undefined,
): Advisory[] {
  const out: Advisory[] = [];
  const ids = planes.map((p) => p.id);
  if (!ids.length) return out;
  const kindText = stack.kind === "self-adhered" ? "self-adhered membrane" : stack.kind === "synthetic" ? "synthetic underlayment" : "felt";
  if (basicWindSpeedMph !== undefined && basicWindSpeedMph >= 140) {
    if (stack.kind !== "felt") {
      out.push(
        advisory(
          "underlayment-high-wind",
          "warning",
          `At a basic wind speed of ${fmt(basicWindSpeedMph, 0)} mph (140 mph or more) the code lists ASTM D226 Type II or ASTM D4869 Type IV felt under metal panels, ` +
            `not ${kindText}, unless the local code or an evaluation report accepts it. Check with the building department.`,
          "IRC 2021 Table R905.1.1(1) and (2)",
          ids,
        ),
      );
    } else {
      const twoToFour = planes.filter((p) => p.pitch >= 2 && p.pitch < 4);
      if (twoToFour.length && stack.layers < 2) {
        out.push(
          advisory(
            "underlayment-two-layers-required",
            "warning",
            `At 140 mph or more, slopes from 2:12 up to 4:12 need two layers of felt (a 19 in starter, then 36 in sheets lapped 19 in): ${planeList(twoToFour)}.`,
            "IRC 2021 Table R905.1.1(2)",
            twoToFour.map((p) => p.id),
          ),
        );
      }
    }
  }
  if (stack.kind === "felt") {
    const threeToFour = planes.filter((p) => p.pitch >= 3 && p.pitch < 4);
    if (threeToFour.length && stack.layers < 2 && !(basicWindSpeedMph !== undefined && basicWindSpeedMph >= 140)) {
      out.push(
        advisory(
          "underlayment-felt-two-layers-recommended",
          "info",
          `The trade recommends two layers of No. 30 felt under metal from 3:12 up to 4:12: ${planeList(threeToFour)}.`,
          "NRCA metal roof manual (as quoted in trade guidance)",
          threeToFour.map((p) => p.id),
        ),
      );
    }
  }
  const low = planes.filter((p) => p.pitch < 2);
  if (low.length && stack.kind !== "self-adhered") {
    out.push(
      advisory(
        "underlayment-unsuited-to-slope",
        "warning",
        `Below 2:12 a mechanically fastened ${kindText} lets water that gets under the panels reach the deck; use a self-adhered membrane on ${planeList(low)}.`,
        "common practice",
        low.map((p) => p.id),
      ),
    );
  }
  if (!stack.highTemp && stack.kind !== "felt") {
    out.push(
      advisory(
        "underlayment-not-high-temperature",
        "warning",
        `Metal panels run hot: the ${kindText} should be rated for high temperature, or it can soften, stick to the panels or run. Choose a high-temperature product.`,
        "common practice",
        ids,
      ),
    );
  }
  return out;
}

export function iceBarrierAdvisories(opts: {
  iceDamRisk: boolean | undefined;
  climateZoneNumber: number | null;
  planesWithout: string[];
  allPlaneIds: string[];
}): Advisory[] {
  const out: Advisory[] = [];
  if (opts.iceDamRisk === true && opts.planesWithout.length) {
    out.push(
      advisory(
        "ice-barrier-missing",
        "warning",
        "The site has a risk of ice dams but the assembly on these planes has no ice barrier at the eaves. The code section lists shingles, metal " +
          "shingles, roll roofing, slate and wood rather than metal panels, but local amendments and common practice carry it over to panels: " +
          "add a self-adhered ice barrier from the eave to at least 24 in inside the exterior wall.",
        "IRC 2021 R905.1.2 (local amendments and practice for metal panels)",
        opts.planesWithout,
      ),
    );
  }
  if (opts.iceDamRisk === undefined && opts.climateZoneNumber !== null && opts.climateZoneNumber >= 5) {
    out.push(
      advisory(
        "ice-barrier-confirm",
        "info",
        `The site is in climate zone ${opts.climateZoneNumber}, where ice dams are common, but the ice-dam risk is not stated. Check with the building department ` +
          "whether an ice barrier is required, and set the site's ice-dam risk.",
        "IRC 2021 R905.1.2 (where the jurisdiction has a history of ice forming at the eaves)",
        [],
      ),
    );
  }
  return out;
}

export function foilAdvisory(opts: { foil: boolean; facesGap: boolean; gapIn: number; position: string; face: string; planeIds: string[] }): Advisory[] {
  if (!opts.foil || opts.facesGap || !opts.planeIds.length) return [];
  const why =
    opts.gapIn <= 0
      ? "there is no air space between the deck and the panels"
      : `foil ${opts.position === "on-deck" ? "on the deck facing down" : "under the panels facing up"} lies against a solid surface`;
  return [
    advisory(
      "foil-faces-no-air-space",
      "error",
      `The radiant barrier gives no radiant benefit here: ${why}. A radiant barrier works only facing an air space: put it on the deck facing up under a spacer, or under the panels facing down over one.`,
      "ASTM C1158; US DOE radiant barrier fact sheet; ASTM C1313 (emittance 0.1 or less)",
      opts.planeIds,
    ),
  ];
}

export function gapTooThinAdvisory(opts: { atticType: string; kind: string; gapIn: number; claimed: boolean; planeIds: string[] }): Advisory[] {
  // Raised only when above-deck ventilation is NOT claimed: a claimed channel that fails is the
  // ventilation module's "channel-does-not-qualify".
  if (opts.claimed || !opts.planeIds.length) return [];
  if (opts.atticType === "vented") return [];
  if (!(opts.kind === "mesh" || opts.kind === "dimpled")) return [];
  if (opts.gapIn >= 0.75 - 1e-9) return [];
  return [
    advisory(
      "gap-too-thin-for-ventilation",
      "warning",
      `A ${opts.atticType === "cathedral" ? "vaulted (cathedral) ceiling" : "unvented attic"} gains most from a ventilated gap over the deck, but this ` +
        `${opts.kind === "mesh" ? "mesh mat" : "dimpled sheet"} leaves ${fmt(opts.gapIn, 2)} in: a thermal break and drainage plane, not a ventilation channel. ` +
        "A channel needs at least 3/4 in, open at the eave and the top (counter-battens or a thicker spacer).",
      "California Title 24 (2008) re-roof alternative (at least a 3/4 in air space); ORNL research (3/4 in minimum for airflow)",
      opts.planeIds,
    ),
  ];
}

export function ratedAssemblyAdvisory(opts: { required: boolean; spacerKind: string; planeIds: string[] }): Advisory[] {
  if (!opts.required || opts.spacerKind === "none" || !opts.planeIds.length) return [];
  const what = opts.spacerKind === "battens" ? "battens" : opts.spacerKind === "mesh" ? "a mesh mat" : "a dimpled sheet";
  const isAre = opts.spacerKind === "battens" ? "are" : "is";
  return [
    advisory(
      "spacer-voids-rated-assembly",
      "error",
      `A tested uplift-rated assembly is required, but ${what} between the deck and the panels ${isAre} not part of the panel system's tested assembly. ` +
        "The rating no longer applies: have a design professional review the attachment, or use the maker's tested assembly.",
      "common practice (uplift ratings apply only to the assembly as tested)",
      opts.planeIds,
    ),
  ];
}

export function fallProtectionAdvisories(planes: (NamedPlane & { pitch: number })[]): Advisory[] {
  const out: Advisory[] = [
    advisory(
      "fall-protection",
      "info",
      "Residential roofing 6 ft or more above a lower level needs fall protection at any slope: guardrails, safety nets or personal fall arrest, or a " +
        "written fall protection plan where those are shown to be infeasible. Watch for overhead power lines, keep metal panels away from them, and handle " +
        "cut edges with gloves. Local codes and your safety professional govern.",
      "OSHA 29 CFR 1926.501(b)(13); 1926.502(k)",
      [],
    ),
  ];
  const steep = planes.filter((p) => p.pitch > 4 + 1e-9);
  if (steep.length) {
    out.push(
      advisory(
        "steep-roof-fall-protection",
        "warning",
        `Steep roof (over 4 in 12): ${planeList(steep)}. Use guardrails with toeboards, safety nets or personal fall arrest; ` +
          "metal panels are slippery, especially when wet, frosted or dusty, and loose panels can slide. Plan anchors and staging before loading the roof.",
        "OSHA 29 CFR 1926.500(b) (steep roof); 1926.501(b)(11)",
        steep.map((p) => p.id),
      ),
    );
  }
  return out;
}

export function panelLengthAdvisories(planes: (NamedPlane & { longestIn: number })[], maxLengthFt: number, longInfoFt: number): Advisory[] {
  const out: Advisory[] = [];
  const over = planes.filter((p) => p.longestIn > maxLengthFt * 12 + 1e-9);
  if (over.length) {
    out.push(
      advisory(
        "panel-over-max-length",
        "warning",
        `Panels longer than ${fmt(maxLengthFt, 0)} ft on ${listText(over, (p) => `${p.label} (${fmt(p.longestIn / 12, 1)} ft)`)}: longer than trucks usually carry. ` +
          "Plan on-site roll-forming, or an end lap or step where the panel maker allows one.",
        "common practice (shipping limit)",
        over.map((p) => p.id),
      ),
    );
  }
  const long = planes.filter((p) => p.longestIn > longInfoFt * 12 + 1e-9);
  if (long.length) {
    out.push(
      advisory(
        "panel-long-expansion",
        "info",
        `Panels over ${fmt(longInfoFt, 0)} ft on ${planeList(long)} move with heat: use floating clips and the maker's expansion details at the ridge and eave.`,
        "common practice",
        long.map((p) => p.id),
      ),
    );
  }
  return out;
}

export function reroofAdvisory(existingLayers: number, tearOff: boolean): Advisory[] {
  if (existingLayers < 2 || tearOff) return [];
  return [
    advisory(
      "reroof-over-two-layers",
      "error",
      `The roof already has ${existingLayers} layers. A new roof may not go over two or more existing layers (or over water-soaked or deteriorated roofing): tear off to the deck.`,
      "IRC 2021 R908.3.1.1",
      [],
    ),
  ];
}

export function cricketAdvisories(
  items: { planeId: string; kind: string; widthIn?: number; id?: string }[],
  /** How the message names the plane with this id (see planeLabels); the id itself when not given. */
  labelOf: (planeId: string) => string = (id) => id,
): Advisory[] {
  const wide = items.filter((i) => (i.kind === "chimney" || i.kind === "skylight" || i.kind === "other") && (i.widthIn ?? 0) > CRICKET_MIN_WIDTH_IN);
  if (!wide.length) return [];
  return [
    advisory(
      "cricket-required",
      "warning",
      `A cricket (saddle) is needed on the high side of each ${listText(wide, (i) => `${i.kind}${i.id ? ` "${i.id}"` : ""} on ${labelOf(i.planeId)} (${fmt(i.widthIn!, 0)} in wide)`)}: ` +
        "penetrations more than 30 in wide across the slope must have one.",
      "IRC 2021 R903.2.2",
      [...new Set(wide.map((i) => i.planeId))],
    ),
  ];
}

export function transitionAdvisory(transitionLf: number, planeIds: string[]): Advisory[] {
  if (!(transitionLf > 0)) return [];
  return [
    advisory(
      "transition-flashing",
      "info",
      `The roof changes slope along ${fmt(transitionLf, 1)} ft: flash the change of slope (transition flashing is in the list of materials).`,
      "IRC 2021 R903.2.1",
      planeIds,
    ),
  ];
}

export function clipSpacingBattenAdvisory(limited: { planeId: string; zones: WindZone[] }[], battenSpacingIn: number): Advisory[] {
  const planeIds: string[] = [];
  const zoneSet = new Set<WindZone>();
  for (const l of limited) {
    if (!l.zones.length) continue;
    planeIds.push(l.planeId);
    for (const z of l.zones) zoneSet.add(z);
  }
  if (!planeIds.length) return [];
  return [
    advisory(
      "clip-spacing-exceeds-battens",
      "warning",
      `Clips can land only on battens (${fmt(battenSpacingIn, 0)} in apart), but the clip schedule asks for closer spacing in ${zoneListText(Array.from(zoneSet))}. ` +
        "The count uses the batten spacing. Add battens at the closer spacing in those zones, or build a solid second deck over sleepers.",
      "common practice; the panel maker's uplift table governs",
      planeIds,
    ),
  ];
}

export function treatedLumberAdvisory(opts: { treated: boolean; substrate: string; planeIds: string[] }): Advisory[] {
  if (!opts.treated || opts.substrate !== "metallic-coated-steel" || !opts.planeIds.length) return [];
  return [
    advisory(
      "treated-lumber-contact",
      "warning",
      "Preservative-treated battens touching metallic-coated steel panels or fasteners: copper-based treatments corrode zinc and aluminium-zinc coatings. " +
        "Use untreated lumber, or separate the metal from the wood with a membrane, and fasteners rated for treated wood.",
      "common practice",
      opts.planeIds,
    ),
  ];
}

export function windAdvisories(opts: { planes: (NamedPlane & { pitch: number })[]; heightMissing: boolean; lowSlopeWithoutHeight: string[]; aFt: number }): Advisory[] {
  const out: Advisory[] = [
    advisory(
      "wind-zones-simplified",
      "info",
      `Fastener zones use edge distance a = ${fmt(opts.aFt, 2)} ft and a simplified zone model (zone 3 at corners, zone 2 along edges, zone 1 in the field). ` +
        "The panel maker's tested uplift schedule and a design professional govern the actual clip and screw spacing.",
      "ASCE 7-10 Fig. 30.4-1; ASCE 7-16 Fig. 30.3-2A (simplified)",
      [],
    ),
  ];
  if (opts.heightMissing) {
    out.push(
      advisory(
        "wind-mean-height-missing",
        "info",
        "The mean roof height was not given, so the edge distance is taken as 10 % of the least horizontal dimension (at least 3 ft). Enter the height for the code's value.",
        "ASCE 7-10 Fig. 30.4-1 note",
        [],
      ),
    );
  }
  if (opts.lowSlopeWithoutHeight.length) {
    out.push(
      advisory(
        "wind-low-slope-needs-height",
        "info",
        "Planes at 7° or less use zone widths in terms of the mean roof height, which was not given: the steep-roof zones were used instead.",
        "ASCE 7-16 Fig. 30.3-2A",
        opts.lowSlopeWithoutHeight,
      ),
    );
  }
  const beyond = opts.planes.filter((p) => p.pitch > WIND_FIGURES_MAX_PITCH + 1e-9);
  if (beyond.length) {
    out.push(
      advisory(
        "pitch-beyond-wind-figures",
        "info",
        `Above 45° (12:12) the roof pressure figures do not apply: ${planeList(beyond)}. Have a design professional set the attachment (wall pressures may govern).`,
        "ASCE 7-16 Fig. 30.3-2 series (roof angles up to 45°)",
        beyond.map((p) => p.id),
      ),
    );
  }
  return out;
}
