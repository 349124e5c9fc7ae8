import { describe, expect, it } from "vitest";
import { layoutPanels, stripStarts } from "@shared/engine/roof/panels";
import { hipRoof } from "@shared/engine/roof/generators";
import { slopeFactor } from "@shared/engine/roof/slope";
import { geoms } from "./engine-helpers";

describe("panel layout", () => {
  it("20 × 10 ft plane at 4/12, 16 in coverage → 15 panels of 127 in (common practice: ordered to the inch)", () => {
    const [g] = geoms([{ id: "a", pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10]], eaveEdge: 0 }]);
    const p = layoutPanels(g, { coverageWidthIn: 16 });
    // 240 in ÷ 16 in = 15 strips; 10 ft run × 1.0541 (rafter table 4/12) × 12 = 126.49 in → 127 in
    expect(p.count).toBe(15);
    expect(p.lengthsIn).toEqual(Array(15).fill(127));
    expect(p.cutList).toEqual([{ lengthIn: 127, count: 15 }]);
    // offcut = 15 × (16/12 ft) × (127/12 ft) − 200 × k = 211.667 − 210.819 = 0.848 ft²
    expect(p.offcutSqFt).toBeCloseTo(15 * (16 / 12) * (127 / 12) - 200 * slopeFactor(4), 10);
  });

  it("adds hem allowances before rounding up", () => {
    const [g] = geoms([{ id: "a", pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10]], eaveEdge: 0 }]);
    // 126.49 + 1.5 + 1.5 = 129.49 → 130 in
    expect(layoutPanels(g, { coverageWidthIn: 16, hemAllowanceIn: 3 }).lengthsIn[0]).toBe(130);
  });

  it("an exact length is not rounded up by float noise (the 1e-6 in the rule)", () => {
    // 12 ft run at 0 pitch = 144 in exactly
    const [g] = geoms([{ id: "a", pitch: 0, outline: [[0, 0], [4, 0], [4, 12], [0, 12]], eaveEdge: 0 }]);
    expect(layoutPanels(g, { coverageWidthIn: 16 }).lengthsIn).toEqual([144, 144, 144]);
  });

  it("strips start at the plane's extreme extent, not the eave's end", () => {
    // a plane wider at the top than at the eave (an overhanging rake), eave from x=2 to x=10
    const [g] = geoms([{ id: "a", pitch: 6, outline: [[2, 0], [10, 0], [10, 8], [0, 8], [0, 4]], eaveEdge: 0 }]);
    const p = layoutPanels(g, { coverageWidthIn: 24 });
    expect(p.count).toBe(5); // 10 ft ÷ 2 ft
    // local s is measured from the eave's first corner (x = 2): the first strip starts 2 ft to its left, at x = 0
    expect(g.sMin).toBeCloseTo(-2, 12);
    expect(p.pieces.at(0).stripS0).toBeCloseTo(-2, 12);
  });

  it("left, right and centred starts", () => {
    expect(stripStarts(0, 10, 4, "left")).toEqual([0, 4, 8]);
    expect(stripStarts(0, 10, 4, "right")).toEqual([6, 2, -2]);
    // centred: a panel's centre on the centreline x = 5 → strips at 3, then 7 and −1
    expect(stripStarts(0, 10, 4, "centred")).toEqual([-1, 3, 7]);
  });

  it("a strip that overlaps the plane by 0.01 ft or less is not a panel", () => {
    const [g] = geoms([{ id: "a", pitch: 4, outline: [[0, 0], [16.005, 0], [16.005, 10], [0, 10]], eaveEdge: 0 }]);
    expect(layoutPanels(g, { coverageWidthIn: 16 }).count).toBe(12);
  });

  it("cut at an angle: each panel takes the longer side (hip roof end triangle)", () => {
    const [, , west] = geoms(hipRoof(40, 30, 6));
    const p = layoutPanels(west, { coverageWidthIn: 16 });
    // west triangle: eave 30 ft, apex 15 ft up the run; 30 ft ÷ 16 in = 22.5 → 23 panels
    expect(p.count).toBe(23);
    const k = slopeFactor(6);
    // the first strip, 0..16 in from the corner, reaches 16/12 ft up the run on its longer side
    expect(p.lengthsIn[0]).toBe(Math.ceil(12 * k * (16 / 12) - 1e-6)); // 17.89 → 18 in
    expect(Math.max(...p.lengthsIn)).toBe(Math.ceil(12 * k * 15 - 1e-6)); // 201.25 → 202 in
    // hip offcuts are reported, not reused
    expect(p.offcutSqFt).toBeGreaterThan(0);
  });
});
