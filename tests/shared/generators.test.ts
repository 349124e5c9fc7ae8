import { describe, expect, it } from "vitest";
import { gableRoof, hipRoof, lShapeGableRoof, shedRoof } from "@shared/engine/roof/generators";
import { buildBenchRoof } from "@shared/engine/roof/bench-roof";
import { analyseEdges } from "@shared/engine/roof/edges";
import { takeoffInputSchema } from "@shared/schemas/takeoff";
import { geoms } from "./engine-helpers";

const area = (planes: ReturnType<typeof gableRoof>) => geoms(planes).reduce((t, g) => t + g.planAreaSqFt, 0);

describe("generators return valid planes in the input shape", () => {
  it("gable along x or y covers the rectangle", () => {
    expect(area(gableRoof(30, 20, 6))).toBeCloseTo(600, 10);
    const y = gableRoof(30, 20, 6, { ridgeAlong: "y", origin: [5, 5], idPrefix: "g", stackId: "s" });
    expect(y.map((p) => p.id)).toEqual(["g-w", "g-e"]);
    expect(y.every((p) => p.stackId === "s")).toBe(true);
    expect(analyseEdges(geoms(y)).totals.ridgeLf).toBeCloseTo(20, 10);
  });

  it("hip roofs: ridge = long side − short side, either way round; a square gives a pyramid", () => {
    expect(analyseEdges(geoms(hipRoof(20, 32, 5))).totals.ridgeLf).toBeCloseTo(12, 10);
    const pyramid = analyseEdges(geoms(hipRoof(24, 24, 8)));
    expect(pyramid.totals.ridgeLf).toBe(0);
    // four hips of 12 ft run: 12 × √(288 + 64)/12 (rafter tables: hip in/ft of run)
    expect(pyramid.totals.hipLf).toBeCloseTo(4 * 12 * (Math.sqrt(288 + 64) / 12), 10);
  });

  it("shed and L-shape", () => {
    expect(area(shedRoof(12, 8, 2))).toBe(96);
    expect(area(lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 30, wingWidthFt: 20, wingDepthFt: 15, wingOffsetFt: 10 }, 6))).toBeCloseTo(1500, 10);
  });

  it("refuses impossible sizes", () => {
    expect(() => gableRoof(0, 10, 6)).toThrow(RangeError);
    expect(() => hipRoof(10, 10, 30)).toThrow(RangeError);
    expect(() => lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 20, wingWidthFt: 30, wingDepthFt: 10, wingOffsetFt: 5 }, 6)).toThrow(RangeError);
  });

  it("the bench roof has the asked number of planes and passes the schema", () => {
    for (const n of [1, 7, 100]) {
      const input = buildBenchRoof(n);
      expect(input.planes).toHaveLength(n);
      expect(takeoffInputSchema.safeParse(input).success).toBe(true);
    }
  });
});
