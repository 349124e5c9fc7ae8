/**
 * Panel layout on one plane. Panels run eave to ridge in strips of the coverage width w, perpendicular to
 * the eave. Strips start at the plane's extreme extent across the slope (an eave can be shorter than the
 * plane is wide), from the left seen from the eave looking up-slope by default, or from the right, or
 * centred (a panel's centre on the plane's centreline). A strip counts only where it overlaps the polygon
 * by more than TOL of width; each connected piece of the polygon inside a strip is one panel (a notch can
 * split a strip in two). A panel's length is the true slope length of its piece, the longer side where the
 * strip is cut at an angle, plus hem allowances, rounded up to the inch (panels are ordered to the inch:
 * common practice, no published source):
 *   lengthIn = ceil(12 · k · (vMax − vMin) + hems − 1e-6).
 */
import { TOL } from "../constants";
import type { PlaneGeometry } from "./geometry";
import { convexStripComponent, isConvex, stripComponents, type StripComponent } from "./polygon";

export type PanelStart = "left" | "right" | "centred";

export interface PanelPiece {
  /** Strip edges across the slope (local s, ft). */
  stripS0: number;
  stripS1: number;
  /** The piece's extent inside the strip (local s and v, ft). */
  sMin: number;
  sMax: number;
  vMin: number;
  vMax: number;
  /** Unrounded true slope length of the piece, ft. */
  slopeLengthFt: number;
  /** Ordered length, whole inches. */
  lengthIn: number;
  /** Outline edges under the panel's bottom and top ends (at the piece's middle). */
  bottomEdge: number;
  topEdge: number;
  sProbe: number;
  /** Local s of this panel's clip line (its seam on the starting side, kept inside the piece). */
  clipLineS: number;
}

export interface CutListEntry {
  lengthIn: number;
  count: number;
}

export interface PanelLayout {
  coverageWidthIn: number;
  count: number;
  /** One entry per panel, in laying order. */
  lengthsIn: number[];
  /** Equal lengths grouped, longest first. */
  cutList: CutListEntry[];
  /** Σ (w × ordered length) − sloped area, ft² (hip and valley offcuts are reported, not reused). */
  offcutSqFt: number;
  /** Σ ordered lengths, ft. */
  totalLengthFt: number;
  /** Coverage area of the panels ordered, ft². */
  orderedAreaSqFt: number;
  longestIn: number;
  pieces: PanelPiece[];
}

export interface PanelOptions {
  coverageWidthIn: number;
  start?: PanelStart;
  /** Added to every panel's length (eave hem + top hem), inches. Default 0. */
  hemAllowanceIn?: number;
}

/** Strip start positions (local s, ft) covering [sMin, sMax] in laying order. */
export function stripStarts(sMin: number, sMax: number, w: number, start: PanelStart): number[] {
  const out: number[] = [];
  if (start === "left") {
    for (let a = sMin, j = 0; a < sMax - TOL; a = sMin + ++j * w) out.push(a);
  } else if (start === "right") {
    for (let b = sMax, j = 0; b > sMin + TOL; b = sMax - ++j * w) out.push(b - w);
  } else {
    const c = (sMin + sMax) / 2 - w / 2;
    const j0 = Math.floor((sMin - c) / w);
    for (let j = j0; c + j * w < sMax - TOL; j++) if (c + (j + 1) * w > sMin + TOL) out.push(c + j * w);
  }
  return out;
}

export function layoutPanels(g: PlaneGeometry, opts: PanelOptions): PanelLayout {
  const wIn = opts.coverageWidthIn;
  const w = wIn / 12;
  const start = opts.start ?? "left";
  const hem = opts.hemAllowanceIn ?? 0;
  const k = g.slopeFactor;
  const pieces: PanelPiece[] = [];
  const convex = isConvex(g.local);
  const scratch: StripComponent = { sMin: 0, sMax: 0, vMin: 0, vMax: 0, bottomEdge: 0, topEdge: 0, sProbe: 0 };
  const add = (c: StripComponent, a: number, b: number) => {
    if (c.sMax - c.sMin <= TOL) return;
    const slopeLengthFt = k * (c.vMax - c.vMin);
    const seam = start === "right" ? b : a;
    pieces.push({
      stripS0: a,
      stripS1: b,
      sMin: c.sMin,
      sMax: c.sMax,
      vMin: c.vMin,
      vMax: c.vMax,
      slopeLengthFt,
      lengthIn: Math.ceil(12 * slopeLengthFt + hem - 1e-6),
      bottomEdge: c.bottomEdge,
      topEdge: c.topEdge,
      sProbe: c.sProbe,
      clipLineS: Math.min(Math.max(seam, c.sMin), c.sMax),
    });
  };
  for (const a of stripStarts(g.sMin, g.sMax, w, start)) {
    const b = a + w;
    if (convex) {
      const c = convexStripComponent(g.local, a, b, scratch);
      if (c) add(c, a, b);
    } else for (const c of stripComponents(g.local, a, b)) add(c, a, b);
  }
  const lengthsIn = pieces.map((p) => p.lengthIn);
  const counts = new Map<number, number>();
  for (const l of lengthsIn) counts.set(l, (counts.get(l) ?? 0) + 1);
  const cutList = [...counts.entries()].map(([lengthIn, count]) => ({ lengthIn, count })).sort((p, q) => q.lengthIn - p.lengthIn);
  const totalLengthFt = lengthsIn.reduce((s, l) => s + l, 0) / 12;
  const orderedAreaSqFt = w * totalLengthFt;
  return {
    coverageWidthIn: wIn,
    count: pieces.length,
    lengthsIn,
    cutList,
    offcutSqFt: orderedAreaSqFt - g.slopedAreaSqFt,
    totalLengthFt,
    orderedAreaSqFt,
    longestIn: lengthsIn.reduce((m, l) => Math.max(m, l), 0),
    pieces,
  };
}
