/**
 * The above-deck air channel: the space between the deck and the panels made by the spacer layer.
 *
 * - No spacer: no gap.
 * - Horizontal battens alone: the battens run across the slope and close the channel at every row:
 *   not continuous, net free area 0; the gap is the batten thickness.
 * - Battens over counter-battens: counter-battens run up the slope, so the channel is the counter-batten
 *   layer: height = counter-batten thickness, net free area per foot of eave = t × 12 × (1 − w/s);
 *   the deck-to-panel gap is counter-batten plus batten thickness.
 * - 3D mesh mat or dimpled sheet: continuous, height = thickness (0.3 in and 0.4 in by default, common
 *   practice, maker-dependent), net free area per foot = height × 12 × open fraction (defaults 0.8 and 0.6,
 *   from memory).
 * Lumber is taken at its dressed size (NIST PS 20).
 * A channel qualifies as ventilation when it is continuous, at least 3/4 in high and open at the eave and
 * the top: California Title 24 (2008) re-roof alternative ("at least a 3/4 inch air-space added to the roof
 * deck"); ORNL research cites 3/4 in as the minimum for airflow.
 */
import { LUMBER, type LumberNominal } from "../lumber";

export type SpacerKind = "none" | "battens" | "mesh" | "dimpled";

export interface ChannelSpacer {
  kind: SpacerKind;
  /** Mesh / dimpled sheet thickness, inches. */
  thicknessIn?: number;
  /** Mesh / dimpled sheet open fraction of the channel cross-section (0..1). */
  openFraction?: number;
  battens?: {
    nominal: LumberNominal;
    spacingIn: number;
    counterBattens: boolean;
    /** Default: the batten's nominal size. */
    counterBattenNominal?: LumberNominal;
    /** Default 24 in on centre (common practice). */
    counterBattenSpacingIn?: number;
  };
}

export interface ChannelOpenings {
  eaveOpen: boolean;
  topOpen: boolean;
}

export interface ChannelResult {
  kind: SpacerKind;
  /** Deck-to-panel gap, inches. */
  gapIn: number;
  /** Height of the air channel, inches. */
  channelHeightIn: number;
  /** Unbroken from eave to ridge. */
  continuous: boolean;
  /** Qualifies as above-deck ventilation. */
  qualifies: boolean;
  /** Net free area per foot of eave, in²/ft. */
  channelNfaPerFtSqIn: number;
  /** True when horizontal battens without counter-battens close the channel. */
  blockedByBattens: boolean;
  /** Plain-language reasons the channel does not qualify (empty when it does). */
  reasons: string[];
}

/** Minimum channel height to count as above-deck ventilation, inches (Title 24 2008; ORNL). */
export const MIN_CHANNEL_HEIGHT_IN = 0.75;
export const DEFAULT_COUNTER_BATTEN_SPACING_IN = 24;
/** Defaults for the mat spacers: thickness (common practice) and open fraction (from memory). */
export const MAT_DEFAULTS = {
  mesh: { thicknessIn: 0.3, openFraction: 0.8 },
  dimpled: { thicknessIn: 0.4, openFraction: 0.6 },
} as const;

const positive = (x: number | undefined, fallback: number) => (x !== undefined && Number.isFinite(x) && x > 0 ? x : fallback);
const fmtIn = (x: number) => `${Number(x.toFixed(2))} in`;

export function aboveDeckChannel(spacer: ChannelSpacer, openings: ChannelOpenings): ChannelResult {
  let gapIn = 0;
  let channelHeightIn = 0;
  let continuous = false;
  let channelNfaPerFtSqIn = 0;
  let blockedByBattens = false;
  const reasons: string[] = [];

  if (spacer.kind === "none") {
    reasons.push("There is no spacer: the panels lie on the underlayment, so there is no air channel.");
  } else if (spacer.kind === "battens") {
    const b = spacer.battens ?? { nominal: "1x4" as const, spacingIn: 24, counterBattens: false };
    const batten = LUMBER[b.nominal];
    if (!b.counterBattens) {
      gapIn = batten.thicknessIn;
      channelHeightIn = batten.thicknessIn;
      blockedByBattens = true;
      reasons.push(
        "Horizontal battens run across the slope and close the channel at every row, so air cannot flow from the eave to the ridge. Add counter-battens running up the slope under them.",
      );
    } else {
      const cb = LUMBER[b.counterBattenNominal ?? b.nominal];
      const s = positive(b.counterBattenSpacingIn, DEFAULT_COUNTER_BATTEN_SPACING_IN);
      gapIn = cb.thicknessIn + batten.thicknessIn;
      channelHeightIn = cb.thicknessIn;
      continuous = true;
      channelNfaPerFtSqIn = cb.thicknessIn * 12 * Math.max(0, 1 - cb.widthIn / s);
    }
  } else {
    const d = MAT_DEFAULTS[spacer.kind];
    const t = positive(spacer.thicknessIn, d.thicknessIn);
    const open =
      spacer.openFraction !== undefined && Number.isFinite(spacer.openFraction)
        ? Math.min(Math.max(spacer.openFraction, 0), 1)
        : d.openFraction;
    gapIn = t;
    channelHeightIn = t;
    continuous = true;
    channelNfaPerFtSqIn = t * 12 * open;
  }

  if (spacer.kind !== "none") {
    if (channelHeightIn < MIN_CHANNEL_HEIGHT_IN - 1e-9) {
      reasons.push(
        `The channel is ${fmtIn(channelHeightIn)} high; a ventilation channel needs at least 3/4 in. At this height the layer is a thermal break, not a ventilation channel.`,
      );
    }
    if (!openings.eaveOpen) reasons.push("The channel is closed at the eave, so no air can enter.");
    if (!openings.topOpen) reasons.push("The channel is closed at the top, so no air can leave.");
  }
  const qualifies = continuous && channelHeightIn >= MIN_CHANNEL_HEIGHT_IN - 1e-9 && openings.eaveOpen && openings.topOpen;
  return { kind: spacer.kind, gapIn, channelHeightIn, continuous, qualifies, channelNfaPerFtSqIn, blockedByBattens, reasons: qualifies ? [] : reasons };
}
