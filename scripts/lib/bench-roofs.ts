/**
 * The roofs the API benchmarks save (invented buildings, built with the engine's footprint generators): the
 * same three assemblies on each, and the version the save sends.
 */
import { gableRoof, hipRoof, lShapeGableRoof, shedRoof, type GeneratedPlane } from "../../shared/engine/roof/generators";
import type { RoofSaveValues } from "../../shared/schemas/roof";

/** A roof save body: the planes with plain synthetic underlayment, 1x4 battens with foil, and mesh on the porches. */
function roofSave(planes: GeneratedPlane[], version: number): RoofSaveValues {
  return {
    planes,
    stacks: [
      { id: "plain", name: "Synthetic, panels on the deck", underlayment: { kind: "synthetic", highTemp: true }, spacer: { kind: "none" } },
      {
        id: "battens",
        name: "1x4 battens with foil",
        underlayment: { kind: "synthetic", highTemp: true },
        spacer: { kind: "battens", battens: { nominal: "1x4", spacingIn: 24 } },
        radiantBarrier: { kind: "foil" },
      },
      { id: "mesh", name: "Mesh on the porches", underlayment: { kind: "self-adhered" }, spacer: { kind: "mesh", thicknessIn: 0.375 } },
    ],
    defaultStackId: "plain",
    version,
  };
}

/** A realistic 12-plane roof: a hip house, an L-shaped wing with valleys, a detached garage gable, two porches. */
export function twelvePlaneRoof(version: number): RoofSaveValues {
  const planes = [
    ...hipRoof(44, 30, 6, { idPrefix: "main", stackId: "battens" }),
    ...lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 26, wingWidthFt: 18, wingDepthFt: 16, wingOffsetFt: 6 }, 8, { idPrefix: "ell", origin: [60, 0], stackId: "battens" }),
    ...gableRoof(24, 22, 5, { idPrefix: "garage", origin: [0, 50] }),
    ...shedRoof(16, 8, 2, { idPrefix: "porch-a", origin: [40, 50], stackId: "mesh" }),
    ...shedRoof(12, 6, 2, { idPrefix: "porch-b", origin: [64, 50], stackId: "mesh" }),
  ];
  return roofSave(planes, version);
}

/** A 20-plane house: a hip main block, an L-shaped wing with valleys, a garage gable, three gable dormers' worth of porches and sheds. */
export function twentyPlaneRoof(version: number): RoofSaveValues {
  const planes = [
    ...hipRoof(46, 32, 7, { idPrefix: "main", stackId: "battens" }),
    ...lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 26, wingWidthFt: 18, wingDepthFt: 16, wingOffsetFt: 6 }, 8, { idPrefix: "ell", origin: [62, 0], stackId: "battens" }),
    ...gableRoof(24, 22, 5, { idPrefix: "garage", origin: [0, 52] }),
    ...gableRoof(10, 8, 9, { idPrefix: "breezeway", origin: [26, 52] }),
    ...hipRoof(14, 12, 4, { idPrefix: "bay", origin: [110, 0] }),
    ...shedRoof(16, 8, 2, { idPrefix: "porch-a", origin: [40, 52], stackId: "mesh" }),
    ...shedRoof(12, 6, 2, { idPrefix: "porch-b", origin: [60, 52], stackId: "mesh" }),
    ...shedRoof(10, 6, 3, { idPrefix: "porch-c", origin: [76, 52], stackId: "mesh" }),
    ...shedRoof(8, 5, 3, { idPrefix: "porch-d", origin: [90, 52], stackId: "mesh" }),
  ];
  return roofSave(planes, version);
}
