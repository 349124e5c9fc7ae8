/**
 * A generated roof for timing the engine: house-sized hip, gable and L-shaped (valleyed) buildings on a
 * grid, apart so buildings do not share edges, until `planeCount` planes exist (a shed fills an odd
 * remainder). Two assemblies (mesh mat; counter-battened with foil), ice barrier, pipe boots: most of the
 * engine runs. Deterministic: the same count gives the same roof.
 */
import type { TakeoffInputRaw } from "../../schemas/takeoff";
import { gableRoof, hipRoof, lShapeGableRoof, shedRoof, type GeneratedPlane } from "./generators";

export function buildBenchRoof(planeCount: number): TakeoffInputRaw {
  if (!Number.isInteger(planeCount) || planeCount < 1) throw new RangeError("planeCount must be a positive integer");
  const planes: GeneratedPlane[] = [];
  const cell = 60;
  const cols = 6;
  let b = 0;
  while (planes.length < planeCount) {
    const origin: [number, number] = [(b % cols) * cell, Math.floor(b / cols) * cell + 20];
    const left = planeCount - planes.length;
    const pitch = 4 + (b % 5);
    const idPrefix = `b${b}`;
    let next: GeneratedPlane[];
    // House-sized footprints (about 900–1,300 ft² each).
    if (left >= 4 && b % 3 === 0) next = lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 26, wingWidthFt: 18, wingDepthFt: 12, wingOffsetFt: 10 }, pitch, { idPrefix, origin });
    else if (left >= 4 && b % 3 === 1) next = hipRoof(36 + (b % 4) * 2, 28, pitch, { idPrefix, origin });
    else if (left >= 2) next = gableRoof(32 + (b % 3) * 4, 24, pitch, { idPrefix, origin });
    else next = shedRoof(16, 10, 3, { idPrefix, origin });
    planes.push(...next);
    b++;
  }
  return {
    site: {
      atticType: "vented",
      climateZone: "5A",
      iceDamRisk: true,
      wind: { ratedAssemblyRequired: false, meanRoofHeightFt: 18, leastHorizontalDimensionFt: 30, basicWindSpeedMph: 115, exposure: "B" },
    },
    planes: planes.map((p, i) => ({
      ...p,
      stackId: i % 2 ? "battens" : "mesh",
      penetrations: i % 7 === 0 ? [{ kind: "pipe" as const, diameterIn: 3 }] : [],
    })),
    stacks: [
      { id: "mesh", underlayment: { kind: "synthetic", highTemp: true }, spacer: { kind: "mesh" }, radiantBarrier: { kind: "none", position: "on-deck", reflectiveFace: "up" }, panel: { system: "standing-seam", coverageWidthIn: 16, gauge: 24, solarReflectance: 0.3, thermalEmittance: 0.85 } },
      {
        id: "battens",
        underlayment: { kind: "synthetic", highTemp: true },
        spacer: { kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: true } },
        radiantBarrier: { kind: "foil", position: "on-deck", reflectiveFace: "up" },
        panel: { system: "standing-seam", coverageWidthIn: 16, gauge: 24, solarReflectance: 0.3, thermalEmittance: 0.85 },
      },
    ],
    defaultStackId: "mesh",
  };
}
