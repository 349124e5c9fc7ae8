import { describe, expect, it } from "vitest";
import { rollNetSqFt, rollsFor } from "@shared/engine/layers/rolls";
import { iceBarrierCourses, iceBarrierWidthIn } from "@shared/engine/layers/ice-barrier";
import { battenPieces, battenRows, battenTotals, counterBattenRuns, counterBattenTotals } from "@shared/engine/layers/battens";
import { hipRoof, lShapeGableRoof } from "@shared/engine/roof/generators";
import { deckAreaToReplace } from "@shared/engine/layers/deck";
import { slopeFactor } from "@shared/engine/roof/slope";
import { computeTakeoff } from "@shared/engine/takeoff";
import { geoms, takeoffInput } from "./engine-helpers";

const rect = { id: "a", pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10]] as [number, number][], eaveEdge: 0 };

describe("underlayment rolls", () => {
  it("net coverage per roll = (width − side lap) × (length − end lap) (common practice roll sizes)", () => {
    // synthetic 48 in × 250 ft, 4 in / 6 in laps: 44/12 × 249.5 = 914.83 ft²
    expect(rollNetSqFt({ rollWidthIn: 48, rollLengthFt: 250, sideLapIn: 4, endLapIn: 6 })).toBeCloseTo(914.833, 3);
    // self-adhered 36 in × 65 ft, 3.5 in / 6 in: 32.5/12 × 64.5 = 174.69 ft²
    expect(rollNetSqFt({ rollWidthIn: 36, rollLengthFt: 65, sideLapIn: 3.5, endLapIn: 6 })).toBeCloseTo(174.6875, 4);
    // No. 30 felt 36 in × 72 ft with 2 in head lap and 6 in end lap (NRCA metal roof manual laps): 34/12 × 71.5
    expect(rollNetSqFt({ rollWidthIn: 36, rollLengthFt: 72, sideLapIn: 2, endLapIn: 6 })).toBeCloseTo(202.583, 3);
  });

  it("rolls = ceil(area × (1 + waste) / net), with the arithmetic in the basis", () => {
    const r = rollsFor(670.82, 10, { rollWidthIn: 48, rollLengthFt: 250, sideLapIn: 4, endLapIn: 6 });
    // 670.82 × 1.10 / 914.83 = 0.807 → 1
    expect(r.exact).toBeCloseTo(0.8066, 3);
    expect(r.rolls).toBe(1);
    expect(r.basis).toBe("670.8 ft² sloped × 1.10 waste ÷ 914.8 ft² net per roll ((48 in - 4 in lap) × (250 ft - 6 in lap)) = 0.81, rounded up to 1 roll");
    // two layers double the area
    expect(rollsFor(670.82, 10, { rollWidthIn: 48, rollLengthFt: 250, sideLapIn: 4, endLapIn: 6 }, { layers: 2 }).rolls).toBe(2);
  });

  it("mats are butted, not lapped (common practice)", () => {
    const r = rollsFor(1000, 10, { rollWidthIn: 48, rollLengthFt: 50, sideLapIn: 0, endLapIn: 0 });
    // 1000 × 1.1 / 200 = 5.5 → 6
    expect(r.rolls).toBe(6);
    expect(r.basis).toContain("butted");
  });
});

describe("ice barrier (IRC R905.1.2)", () => {
  it.each([
    // computed from the published rule: (overhang + 24 in) × k, 36 in minimum at ≥ 8:12 in the 2015–2021 editions
    [12, 4, 2021, 37.9], // 36 × 1.0541 = 37.95
    [24, 8, 2021, 57.7], // 48 × 1.2019 = 57.69
    [18, 12, 2021, 59.4], // 42 × 1.4142 = 59.40
  ])("%i in overhang at %i/12 → %f in up the slope", (overhang, p, edition, width) => {
    expect(iceBarrierWidthIn(overhang, p, edition)).toBeCloseTo(width, 1);
  });

  it("the 36 in minimum at 8:12 and steeper applies in 2015–2021 and was dropped in 2024 (IRC R905.1.2)", () => {
    // no overhang: 24 × 1.20185 = 28.84 in
    expect(iceBarrierWidthIn(0, 8, 2021)).toBe(36);
    expect(iceBarrierWidthIn(0, 8, 2024)).toBeCloseTo(28.84, 2);
    expect(iceBarrierWidthIn(0, 7.9, 2018)).toBeCloseTo(24 * slopeFactor(7.9), 10);
  });

  it("courses of 36 in membrane = 1 + ceil((width − 36) / (36 − lap)) (lap 3.5 in, common practice)", () => {
    expect(iceBarrierCourses(36)).toBe(1);
    expect(iceBarrierCourses(37.95)).toBe(2);
    expect(iceBarrierCourses(68.5)).toBe(2); // 36 + 32.5
    expect(iceBarrierCourses(68.6)).toBe(3);
  });

  it("the takeoff lays the courses along the eaves and buys rolls once", () => {
    const r = computeTakeoff(takeoffInput([rect], { site: { iceDamRisk: true } }));
    if (!r.ok) throw new Error(r.reason);
    const ice = r.result.planes[0].layers.iceBarrier!;
    expect(ice.courses).toBe(2);
    expect(ice.membraneLf).toBeCloseTo(40, 10); // 20 ft eave × 2 courses
    const line = r.result.materials.find((m) => m.key === "ice-barrier")!;
    // 40 lf × 1.05 ÷ 64.5 ft net per 65 ft roll = 0.65 → 1
    expect(line.quantity).toBe(1);
    expect(line.basis).toBe("a: 20.0 ft eave × 2 courses (37.9 in up the slope) = 40.0 lf of 36 in membrane × 1.05 waste ÷ 64.50 ft net per roll (65 ft - 6 in end lap) = 0.65, rounded up to 1 roll");
  });

  it("planes with the same width and courses are one term of the basis (a hip roof at one pitch)", () => {
    const r = computeTakeoff(takeoffInput(hipRoof(40, 30, 4), { site: { iceDamRisk: true } }));
    if (!r.ok) throw new Error(r.reason);
    const line = r.result.materials.find((m) => m.key === "ice-barrier")!;
    // eaves 40 + 30 + 40 + 30 = 140 ft, each 2 courses of 36 in for 12 in overhang + 24 in × 1.0541 = 37.9 in
    expect(line.basis.startsWith("4 planes: 140.0 ft eave × 2 courses (37.9 in up the slope) = 280.0 lf")).toBe(true);
  });
});

describe("battens and counter-battens (common practice, no published source)", () => {
  const [g] = geoms([rect]);
  it("rows at 24 in along the slope, first at the eave and last at the top", () => {
    const b = battenRows(g, 24);
    // slope length 126.49 in: rows at 0, 24, 48, 72, 96, 120 in and the top → 7 rows of 20 ft
    expect(b.rows).toHaveLength(7);
    expect(b.lf).toBeCloseTo(140, 10);
    // per row ceil(240 in / 24 in) + 1 = 11 fasteners
    expect(b.fasteners).toBe(77);
    // pieces = ceil(140 × 1.10 / 8 ft) = ceil(19.25) = 20
    expect(battenPieces(b.lf, 10, 8)).toBe(20);
  });

  it("each row is as long as the plane is wide at its height (a triangle narrows)", () => {
    const [tri] = geoms([{ id: "t", pitch: 12, outline: [[0, 0], [20, 0], [10, 10]], eaveEdge: 0 }]);
    const b = battenRows(tri, 12 * Math.SQRT2 * 5); // every 5 ft of run
    // rows at 0 and 5 ft of run; the apex row has no length
    expect(b.rows.map((r) => r.lengthFt)).toEqual([expect.closeTo(20, 4), expect.closeTo(10, 4)]);
  });

  it("counter-battens up the slope at 24 in o.c.", () => {
    const c = counterBattenRuns(g, 24);
    // x = 0, 2, …, 18 and the far side at 20: 11 runs of 10 ft × 1.0541
    expect(c.rows).toHaveLength(11);
    expect(c.lf).toBeCloseTo(11 * 10 * slopeFactor(4), 8);
    // per run ceil(126.49 / 24) + 1 = 7
    expect(c.fasteners).toBe(77);
  });

  it("the totals the takeoff uses are the listed rows summed (rows, length, fasteners), on an L-shaped roof too", () => {
    const planes = [...geoms([rect]), ...geoms(lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 26, wingWidthFt: 18, wingDepthFt: 12, wingOffsetFt: 10 }, 7))];
    for (const pl of planes) {
      for (const [listed, totals] of [
        [battenRows(pl, 24, 12), battenTotals(pl, 24, 12)],
        [counterBattenRuns(pl, 16), counterBattenTotals(pl, 16)],
      ] as const) {
        expect(totals.rows).toBe(listed.rows.length);
        expect(totals.lf).toBe(listed.rows.reduce((t, r) => t + r.lengthFt, 0));
        expect(totals.fasteners).toBe(listed.rows.reduce((t, r) => t + r.fasteners, 0));
      }
    }
  });

  it("lumber sizes through the batten gap: 1x = 3/4 in, 2x = 1-1/2 in (NIST PS 20 dry dressed sizes)", () => {
    const gap = (battens: object) => {
      const r = computeTakeoff({ planes: [rect], stacks: [{ id: "s", spacer: { kind: "battens", battens } }], defaultStackId: "s" });
      if (!r.ok) throw new Error(r.reason);
      return r.result.stacks[0].channel;
    };
    expect(gap({ nominal: "1x4" }).gapIn).toBe(0.75);
    expect(gap({ nominal: "2x2" }).gapIn).toBe(1.5);
    expect(gap({ nominal: "1x4", counterBattens: true }).gapIn).toBe(1.5);
    expect(gap({ nominal: "1x4", counterBattens: true, counterBattenNominal: "2x4" }).gapIn).toBe(2.25);
    // counter-battens 1x4 at 24 in: 0.75 × 12 × (1 − 3.5/24) = 7.69 in²/ft of eave (PS 20 sizes)
    expect(gap({ nominal: "1x4", counterBattens: true }).channelNfaPerFtSqIn).toBeCloseTo(7.69, 2);
  });

  it("the takeoff turns batten LF into stock pieces and fasteners into boxes", () => {
    const r = computeTakeoff({ planes: [rect], stacks: [{ id: "s", spacer: { kind: "battens" } }], defaultStackId: "s" });
    if (!r.ok) throw new Error(r.reason);
    expect(r.result.materials.find((m) => m.key === "batten-1x4")?.quantity).toBe(20);
    expect(r.result.fasteners.spacerFasteners).toBe(77);
    // 77 × 1.05 ÷ 250 = 0.32 → 1 box
    expect(r.result.materials.find((m) => m.key === "screw-batten")?.quantity).toBe(1);
  });
});

describe("deck sheets to replace (common practice: 4 × 8 ft sheets)", () => {
  it("keep, repair a share, or replace all", () => {
    expect(deckAreaToReplace(1000, "keep", 10)).toBe(0);
    expect(deckAreaToReplace(1000, "repair", 10)).toBe(100);
    expect(deckAreaToReplace(1000, "replace", 10)).toBe(1000);
  });

  it("sheets = ceil(area × 1.10 ÷ 32)", () => {
    const r = computeTakeoff({ planes: [rect], stacks: [{ id: "s", deck: { action: "replace" } }], defaultStackId: "s" });
    if (!r.ok) throw new Error(r.reason);
    // 210.82 ft² × 1.10 ÷ 32 = 7.25 → 8
    expect(r.result.materials.find((m) => m.key === "deck-sheet")?.quantity).toBe(8);
    expect(r.result.totals.deckSheets).toBe(8);
  });
});

describe("radiant barrier and mats", () => {
  it("foil and mesh rolls from the sloped area", () => {
    const r = computeTakeoff({
      planes: [rect],
      stacks: [{ id: "s", spacer: { kind: "mesh" }, radiantBarrier: { kind: "foil", position: "on-deck", reflectiveFace: "up" } }],
      defaultStackId: "s",
    });
    if (!r.ok) throw new Error(r.reason);
    // foil 48 in × 125 ft, 2 in / 6 in laps: 46/12 × 124.5 = 477.25 ft²; 210.82 × 1.1 / 477.25 = 0.49 → 1
    expect(r.result.materials.find((m) => m.key === "radiant-barrier-foil")?.quantity).toBe(1);
    expect(r.result.materials.find((m) => m.key === "spacer-mesh")?.quantity).toBe(1);
    expect(r.result.planes[0].layers.meshSqFt).toBeCloseTo(200 * slopeFactor(4), 10);
  });
});
