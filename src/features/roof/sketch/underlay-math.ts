/**
 * Placing a plan image under the sketch. The underlay's lower-left corner sits at `originFt` (plan feet),
 * the image is `widthFt` wide with its height from its aspect ratio, and it is turned `rotationDeg`
 * counter-clockwise (plan x east, y north) about that corner.
 *
 * Points on the image are written in "image widths": (0, 0) is the lower-left corner, (1, 0) the
 * lower-right, and y goes up the image, so they do not depend on the size of the rendered picture. An
 * image pixel (px, py) with py counted down from the top of a W × H picture is (px / W, (H − py) / W).
 * Everything reaches the screen through the sketch's one `toView` transform.
 */
import type { Underlay } from "@shared/schemas/roof";
import { fromView, roundFt, toView, type Pt, type View } from "./geometry";

/** The picture's size in pixels (any resolution of the same image gives the same placement). */
export interface ImageSize {
  width: number;
  height: number;
}

/** Placement fields of an underlay (all the maths needs). */
export type Placement = Pick<Underlay, "originFt" | "widthFt" | "rotationDeg">;

const rad = (deg: number) => (deg * Math.PI) / 180;

/** Turns a plan vector counter-clockwise by `deg`. */
function rotate([x, y]: readonly [number, number], deg: number): Pt {
  const c = Math.cos(rad(deg));
  const s = Math.sin(rad(deg));
  return [x * c - y * s, x * s + y * c];
}

/** A point on the image (in image widths) → plan feet. */
export function imageToPlan(u: Placement, f: readonly [number, number]): Pt {
  const [x, y] = rotate([f[0] * u.widthFt, f[1] * u.widthFt], u.rotationDeg);
  return [u.originFt[0] + x, u.originFt[1] + y];
}

/** Plan feet → the point on the image (in image widths); the inverse of `imageToPlan`. */
export function planToImage(u: Placement, p: readonly [number, number]): Pt {
  const [x, y] = rotate([p[0] - u.originFt[0], p[1] - u.originFt[1]], -u.rotationDeg);
  return [x / u.widthFt, y / u.widthFt];
}

/** An image pixel (x right, y down from the top) → plan feet. */
export const pixelToPlan = (u: Placement, size: ImageSize, [px, py]: readonly [number, number]): Pt =>
  imageToPlan(u, [px / size.width, (size.height - py) / size.width]);

/** Plan feet → image pixel (x right, y down from the top). */
export function planToPixel(u: Placement, size: ImageSize, p: readonly [number, number]): Pt {
  const [fx, fy] = planToImage(u, p);
  return [fx * size.width, size.height - fy * size.width];
}

/** Keeps stored numbers tidy: 1/10 000 ft (about 0.01 mm), well below anything drawn. */
const tidy = (n: number) => Math.round(n * 10_000) / 10_000 + 0;

export type ScaleResult = { ok: true; placement: Placement } | { ok: false; error: string };

/** The widest underlay the roof document accepts (ft). */
export const MAX_UNDERLAY_WIDTH_FT = 10_000;

/**
 * Sets the scale from two points clicked on the image (plan feet, as placed now) and the real distance
 * between them: the image is resized so the two points lie `distanceFt` apart, the first point stays
 * where it is on the plan, and the rotation is kept.
 */
export function scaleFromTwoPoints(u: Placement, first: readonly [number, number], second: readonly [number, number], distanceFt: number): ScaleResult {
  if (!(distanceFt > 0) || !Number.isFinite(distanceFt)) return { ok: false, error: "Enter a distance of more than 0." };
  const f1 = planToImage(u, first);
  const f2 = planToImage(u, second);
  const widths = Math.hypot(f2[0] - f1[0], f2[1] - f1[1]); // the points' distance in image widths
  if (widths < 1e-6) return { ok: false, error: "The two points are at the same place. Click two points apart from each other." };
  const widthFt = distanceFt / widths;
  if (widthFt > MAX_UNDERLAY_WIDTH_FT) return { ok: false, error: `That makes the plan more than ${MAX_UNDERLAY_WIDTH_FT.toLocaleString("en-US")} ft wide. Check the distance.` };
  // the first point keeps its plan position: origin = first − R·(f1 · widthFt)
  const [x, y] = rotate([f1[0] * widthFt, f1[1] * widthFt], u.rotationDeg);
  return { ok: true, placement: { originFt: [tidy(first[0] - x), tidy(first[1] - y)], widthFt: tidy(widthFt), rotationDeg: u.rotationDeg } };
}

/** Moves the underlay by (dx, dy) plan feet. */
export const moveUnderlay = (u: Placement, dx: number, dy: number): Placement => ({
  ...u,
  originFt: [roundFt(u.originFt[0] + dx), roundFt(u.originFt[1] + dy)],
});

/**
 * Turns the underlay to `deg`, keeping the image's centre where it is on the plan (its lower-left corner
 * when the aspect ratio, height / width, is not known yet).
 */
export function rotateUnderlay(u: Placement, deg: number, aspect: number | null): Placement {
  const pivot: Pt = aspect && aspect > 0 ? [0.5, 0.5 * aspect] : [0, 0];
  const at = imageToPlan(u, pivot);
  const [x, y] = rotate([pivot[0] * u.widthFt, pivot[1] * u.widthFt], deg);
  return { ...u, rotationDeg: deg, originFt: [tidy(at[0] - x), tidy(at[1] - y)] };
}

/** Sets the width (ft) keeping the lower-left corner where it is. */
export const resizeUnderlay = (u: Placement, widthFt: number): Placement => ({ ...u, widthFt: tidy(widthFt) });

/**
 * The SVG `matrix(a b c d e f)` that draws a W × H px `<image>` (placed at 0, 0 at its natural size)
 * where the underlay lies on screen: built from where three of its corners land through `toView`, so the
 * image follows the plan's y-flip, zoom and pan exactly like the planes.
 */
export function underlayMatrix(view: View, u: Placement, size: ImageSize): [number, number, number, number, number, number] {
  const o = toView(view, pixelToPlan(u, size, [0, 0]));
  const ex = toView(view, pixelToPlan(u, size, [1, 0]));
  const ey = toView(view, pixelToPlan(u, size, [0, 1]));
  return [ex[0] - o[0], ex[1] - o[1], ey[0] - o[0], ey[1] - o[1], o[0], o[1]];
}

/** Plan feet per image pixel, for showing the scale ("1 px = 0.05 ft"). */
export const feetPerPixel = (u: Placement, size: ImageSize) => u.widthFt / size.width;

/** Where a new underlay goes: filling most of the drawing's width, its lower-left near the drawing's. */
export function initialPlacement(view: View, canvas: { width: number; height: number }): Placement {
  const widthFt = Math.max(1, Math.round((canvas.width * 0.8) / view.scale));
  const [left, bottom] = fromView(view, [canvas.width * 0.1, canvas.height * 0.9]);
  return { originFt: [Math.round(left), Math.round(bottom)], widthFt, rotationDeg: 0 };
}

/** Rotation as typed: any angle, folded into −180…180 (the schema allows −360…360). */
export function normaliseDeg(deg: number): number {
  const r = ((((deg + 180) % 360) + 360) % 360) - 180;
  return Math.round(r * 100) / 100 + 0;
}
