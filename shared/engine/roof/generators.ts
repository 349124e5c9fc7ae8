/**
 * Generators for common footprints. Each returns planes in the takeoff input's shape (outline in plan
 * feet, eave edge 0; the winding may be either, the engine reads it), ready for the sketch tools.
 * Rectangles are axis-aligned with their lower-left corner at `origin` (default [0, 0]).
 */
import { TOL } from "../constants";

export interface GeneratedPlane {
  id: string;
  name: string;
  pitch: number;
  outline: [number, number][];
  eaveEdge: number;
  baseElevationFt?: number;
  stackId?: string;
}

export interface GeneratorOptions {
  /** Prefix for plane ids (default "p"). */
  idPrefix?: string;
  origin?: [number, number];
  baseElevationFt?: number;
  stackId?: string;
}

const shift = (pts: [number, number][], o: [number, number]): [number, number][] => pts.map(([x, y]) => [x + o[0], y + o[1]]);

function finish(planes: Omit<GeneratedPlane, "baseElevationFt" | "stackId">[], opts: GeneratorOptions): GeneratedPlane[] {
  const o = opts.origin ?? [0, 0];
  return planes.map((p) => ({
    ...p,
    outline: shift(p.outline, o),
    ...(opts.baseElevationFt !== undefined ? { baseElevationFt: opts.baseElevationFt } : {}),
    ...(opts.stackId !== undefined ? { stackId: opts.stackId } : {}),
  }));
}

function checkSize(widthFt: number, depthFt: number, pitch: number) {
  if (!(widthFt > 0) || !(depthFt > 0) || !Number.isFinite(widthFt) || !Number.isFinite(depthFt)) {
    throw new RangeError("Width and depth must be positive numbers");
  }
  if (!(pitch >= 0 && pitch <= 24)) throw new RangeError("Pitch must be between 0 and 24");
}

/**
 * Gable roof on a widthFt (x) × depthFt (y) rectangle: two planes with the ridge at mid-depth, running
 * along x (or along y with `ridgeAlong: "y"`). Eaves on the long sides of the ridge, rakes at the ends.
 */
export function gableRoof(
  widthFt: number,
  depthFt: number,
  pitch: number,
  opts: GeneratorOptions & { ridgeAlong?: "x" | "y" } = {},
): GeneratedPlane[] {
  checkSize(widthFt, depthFt, pitch);
  const id = opts.idPrefix ?? "p";
  const w = widthFt;
  const d = depthFt;
  if ((opts.ridgeAlong ?? "x") === "x") {
    const m = d / 2;
    return finish(
      [
        { id: `${id}-s`, name: "South slope", pitch, eaveEdge: 0, outline: [[0, 0], [w, 0], [w, m], [0, m]] },
        { id: `${id}-n`, name: "North slope", pitch, eaveEdge: 0, outline: [[w, d], [0, d], [0, m], [w, m]] },
      ],
      opts,
    );
  }
  const m = w / 2;
  return finish(
    [
      { id: `${id}-w`, name: "West slope", pitch, eaveEdge: 0, outline: [[0, d], [0, 0], [m, 0], [m, d]] },
      { id: `${id}-e`, name: "East slope", pitch, eaveEdge: 0, outline: [[w, 0], [w, d], [m, d], [m, 0]] },
    ],
    opts,
  );
}

/**
 * Hip roof on a rectangle, all four planes at one pitch: two trapezoids on the long sides and two
 * triangles at the ends; the ridge is (long side − short side) long. A square gives a pyramid.
 */
export function hipRoof(widthFt: number, depthFt: number, pitch: number, opts: GeneratorOptions = {}): GeneratedPlane[] {
  checkSize(widthFt, depthFt, pitch);
  const id = opts.idPrefix ?? "p";
  const w = widthFt;
  const d = depthFt;
  if (Math.abs(w - d) <= TOL) {
    // (nearly) square: a pyramid with its apex at the centre
    const c: [number, number] = [w / 2, d / 2];
    return finish(
      [
        { id: `${id}-s`, name: "South slope", pitch, eaveEdge: 0, outline: [[0, 0], [w, 0], c] },
        { id: `${id}-n`, name: "North slope", pitch, eaveEdge: 0, outline: [[w, d], [0, d], c] },
        { id: `${id}-w`, name: "West end", pitch, eaveEdge: 0, outline: [[0, d], [0, 0], c] },
        { id: `${id}-e`, name: "East end", pitch, eaveEdge: 0, outline: [[w, 0], [w, d], c] },
      ],
      opts,
    );
  }
  if (w > d) {
    const h = d / 2;
    return finish(
      [
        {
          id: `${id}-s`,
          name: "South slope",
          pitch,
          eaveEdge: 0,
          outline: [[0, 0], [w, 0], [w - h, h], [h, h]],
        },
        {
          id: `${id}-n`,
          name: "North slope",
          pitch,
          eaveEdge: 0,
          outline: [[w, d], [0, d], [h, h], [w - h, h]],
        },
        { id: `${id}-w`, name: "West end", pitch, eaveEdge: 0, outline: [[0, d], [0, 0], [h, h]] },
        { id: `${id}-e`, name: "East end", pitch, eaveEdge: 0, outline: [[w, 0], [w, d], [w - h, h]] },
      ],
      opts,
    );
  }
  const h = w / 2;
  return finish(
    [
      { id: `${id}-w`, name: "West slope", pitch, eaveEdge: 0, outline: [[0, d], [0, 0], [h, h], [h, d - h]] },
      { id: `${id}-e`, name: "East slope", pitch, eaveEdge: 0, outline: [[w, 0], [w, d], [h, d - h], [h, h]] },
      { id: `${id}-s`, name: "South end", pitch, eaveEdge: 0, outline: [[0, 0], [w, 0], [h, h]] },
      { id: `${id}-n`, name: "North end", pitch, eaveEdge: 0, outline: [[w, d], [0, d], [h, d - h]] },
    ],
    opts,
  );
}

/** Shed roof: one plane rising from the eave at y = 0 to the high side at y = depth (a headwall unless retyped). */
export function shedRoof(widthFt: number, depthFt: number, pitch: number, opts: GeneratorOptions = {}): GeneratedPlane[] {
  checkSize(widthFt, depthFt, pitch);
  const id = opts.idPrefix ?? "p";
  return finish([{ id: `${id}-1`, name: "Shed", pitch, eaveEdge: 0, outline: [[0, 0], [widthFt, 0], [widthFt, depthFt], [0, depthFt]] }], opts);
}

/**
 * L-shaped gable roof at one pitch: a main block mainWidthFt × mainDepthFt (ridge along x at mid-depth)
 * and a wing wingWidthFt wide (x), projecting wingDepthFt to the south from the main eave, its left
 * side at wingOffsetFt. The wing's ridge (along y) is lower or equal (wing width ≤ main depth) and dies
 * into the main south slope; two valleys run from the inside corners up to where the wing ridge meets
 * the main slope. Four planes.
 */
export function lShapeGableRoof(
  dims: { mainWidthFt: number; mainDepthFt: number; wingWidthFt: number; wingDepthFt: number; wingOffsetFt: number },
  pitch: number,
  opts: GeneratorOptions = {},
): GeneratedPlane[] {
  const { mainWidthFt: W, mainDepthFt: D, wingWidthFt: B, wingDepthFt: E, wingOffsetFt: X } = dims;
  checkSize(W, D, pitch);
  checkSize(B, E, pitch);
  if (B > D + 1e-9) throw new RangeError("The wing may not be wider than the main block is deep");
  if (X <= 0 || X + B >= W) throw new RangeError("The wing must sit inside the main block's south eave");
  const id = opts.idPrefix ?? "p";
  const m = D / 2;
  const c = X + B / 2;
  const r = B / 2; // the wing ridge meets the main slope at y = B/2 (equal pitches)
  return finish(
    [
      {
        id: `${id}-main-s`,
        name: "Main south slope",
        pitch,
        eaveEdge: 0,
        outline: [[0, 0], [X, 0], [c, r], [X + B, 0], [W, 0], [W, m], [0, m]],
      },
      { id: `${id}-main-n`, name: "Main north slope", pitch, eaveEdge: 0, outline: [[W, D], [0, D], [0, m], [W, m]] },
      { id: `${id}-wing-w`, name: "Wing west slope", pitch, eaveEdge: 0, outline: [[X, -E], [X, 0], [c, r], [c, -E]] },
      { id: `${id}-wing-e`, name: "Wing east slope", pitch, eaveEdge: 0, outline: [[X + B, 0], [X + B, -E], [c, -E], [c, r]] },
    ],
    opts,
  );
}
