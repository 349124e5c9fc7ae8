/**
 * Which layer of the stack an advisory concerns, by its engine code (shared/engine/advisories.ts,
 * ventilation/index.ts, thermal/index.ts). Codes not listed are about the roof's shape or the site,
 * not a layer: they are shown with the stack only when they name planes that use it.
 */
import type { Advisory } from "@shared/engine/advisory";

export const LAYERS = ["deck", "underlayment", "spacer", "radiantBarrier", "panel", "ventilation"] as const;
export type Layer = (typeof LAYERS)[number];

export const LAYER_TITLES: Record<Layer, string> = {
  deck: "Deck",
  underlayment: "Underlayment",
  spacer: "Spacer",
  radiantBarrier: "Radiant barrier",
  panel: "Panel system",
  ventilation: "Ventilation products",
};

export const ADVISORY_LAYER: Record<string, Layer> = {
  "reroof-over-two-layers": "deck",
  "underlayment-high-wind": "underlayment",
  "underlayment-two-layers-required": "underlayment",
  "underlayment-felt-two-layers-recommended": "underlayment",
  "underlayment-unsuited-to-slope": "underlayment",
  "underlayment-not-high-temperature": "underlayment",
  "ice-barrier-missing": "underlayment",
  "ice-barrier-confirm": "underlayment",
  "gap-too-thin-for-ventilation": "spacer",
  "spacer-voids-rated-assembly": "spacer",
  "clip-spacing-exceeds-battens": "spacer",
  "treated-lumber-contact": "spacer",
  "channel-blocked-by-battens": "spacer",
  "channel-does-not-qualify": "spacer",
  "foil-faces-no-air-space": "radiantBarrier",
  "slope-below-code-minimum": "panel",
  "slope-below-maker-minimum": "panel",
  "panel-over-max-length": "panel",
  "panel-long-expansion": "panel",
  "cool-roof-not-met": "panel",
  "condensation-risk": "panel",
  "vent-area-estimated": "ventilation",
  "ventilation-short": "ventilation",
  "ventilation-unbalanced": "ventilation",
  "vent-exception-exhaust-share": "ventilation",
  "vent-exception-vapor-retarder": "ventilation",
  "hip-ridge-too-short-for-exhaust": "ventilation",
  "channel-not-attic-ventilation": "ventilation",
  "cathedral-vent-space": "ventilation",
};

export interface StackAdvisories {
  byLayer: Record<Layer, Advisory[]>;
  /** Findings for this stack's planes that are not about a layer (slope safety, crickets …). */
  other: Advisory[];
  count: number;
}

const SEVERITY_ORDER = { error: 0, warning: 1, info: 2 } as const;

/**
 * The advisories for one stack: those naming a plane that uses it, and roof-wide ones (no planes)
 * about a layer when the stack is the roof's only or default stack.
 */
export function advisoriesForStack(all: Advisory[], planeIds: string[], opts: { roofWide: boolean }): StackAdvisories {
  const mine = new Set(planeIds);
  const byLayer = Object.fromEntries(LAYERS.map((l) => [l, [] as Advisory[]])) as Record<Layer, Advisory[]>;
  const other: Advisory[] = [];
  let count = 0;
  for (const a of [...all].sort((x, y) => SEVERITY_ORDER[x.severity] - SEVERITY_ORDER[y.severity])) {
    const layer = ADVISORY_LAYER[a.code];
    const concerns = a.planeIds.length ? a.planeIds.some((id) => mine.has(id)) : opts.roofWide && layer !== undefined;
    if (!concerns) continue;
    count++;
    if (layer) byLayer[layer].push(a);
    else other.push(a);
  }
  return { byLayer, other, count };
}
