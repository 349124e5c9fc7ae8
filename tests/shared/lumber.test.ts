import { describe, expect, it } from "vitest";
import { LUMBER, LUMBER_NOMINALS, lumberSize } from "@shared/engine/lumber";
import { SQIN_PER_SQFT, TOL } from "@shared/engine/constants";

describe("dressed lumber sizes", () => {
  it("gives the dry dressed thickness of 1x and 2x stock", () => {
    // NIST PS 20 (American Softwood Lumber Standard), dry dressed sizes: nominal 1 in → 3/4 in, 2 in → 1-1/2 in
    expect(LUMBER["1x3"].thicknessIn).toBe(0.75);
    expect(LUMBER["1x4"].thicknessIn).toBe(0.75);
    expect(LUMBER["2x2"].thicknessIn).toBe(1.5);
    expect(LUMBER["2x4"].thicknessIn).toBe(1.5);
  });

  it("gives the dry dressed widths", () => {
    // NIST PS 20, dry dressed sizes: nominal 3 in → 2-1/2 in, 4 in → 3-1/2 in, 2 in → 1-1/2 in
    expect(LUMBER["1x3"].widthIn).toBe(2.5);
    expect(LUMBER["1x4"].widthIn).toBe(3.5);
    expect(LUMBER["2x2"].widthIn).toBe(1.5);
    expect(LUMBER["2x4"].widthIn).toBe(3.5);
  });

  it("covers every nominal size it names and looks them up", () => {
    expect(Object.keys(LUMBER).sort()).toEqual([...LUMBER_NOMINALS].sort());
    // NIST PS 20: 2x4 is 1-1/2 × 3-1/2 in
    expect(lumberSize("2x4")).toEqual({ thicknessIn: 1.5, widthIn: 3.5 });
  });
});

describe("engine constants", () => {
  it("uses one 0.01 ft tolerance and 144 sq in per sq ft", () => {
    expect(TOL).toBe(0.01);
    // 1 ft² = 12 in × 12 in = 144 in² (definition of the foot)
    expect(SQIN_PER_SQFT).toBe(144);
  });
});
