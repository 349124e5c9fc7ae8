import { describe, expect, it } from "vitest";
import { analyseEdges } from "@shared/engine/roof/edges";
import { gableRoof, hipRoof, lShapeGableRoof, shedRoof } from "@shared/engine/roof/generators";
import { slopeFactor } from "@shared/engine/roof/slope";
import { geoms } from "./engine-helpers";

const typesOf = (a: ReturnType<typeof analyseEdges>) => a.byPlane.map((ps) => ps.map((p) => p.type));

describe("edge typing", () => {
  it("gable: one ridge counted once, two eaves, four rakes", () => {
    const a = analyseEdges(geoms(gableRoof(30, 20, 6)));
    expect(typesOf(a)).toEqual([
      ["eave", "rake", "ridge", "rake"],
      ["eave", "rake", "ridge", "rake"],
    ]);
    const k = slopeFactor(6); // rafter table 6/12: 1.1180
    expect(a.totals.ridgeLf).toBeCloseTo(30, 10);
    expect(a.totals.eaveLf).toBeCloseTo(60, 10);
    expect(a.totals.rakeLf).toBeCloseTo(4 * 10 * k, 10);
    expect(a.runs.filter((r) => r.type === "rake")).toHaveLength(4);
    expect(a.runs.filter((r) => r.type === "ridge")).toHaveLength(1);
    const ridgePieces = a.byPlane.flat().filter((p) => p.type === "ridge");
    expect(ridgePieces.map((p) => p.shared)).toEqual([true, true]);
    expect(ridgePieces.filter((p) => p.counted)).toHaveLength(1);
  });

  it("hip roof 40 × 30 at 6/12: four hips of 22.5 ft, a 10 ft ridge (hip factor √(288+36) = 18 in/ft of run)", () => {
    const a = analyseEdges(geoms(hipRoof(40, 30, 6)));
    expect(typesOf(a)).toEqual([
      ["eave", "hip", "ridge", "hip"],
      ["eave", "hip", "ridge", "hip"],
      ["eave", "hip", "hip"],
      ["eave", "hip", "hip"],
    ]);
    // framing-square tables: 15 ft run × 18 in/ft = 270 in = 22.5 ft per hip
    expect(a.totals.hipLf).toBeCloseTo(4 * 22.5, 10);
    expect(a.totals.ridgeLf).toBeCloseTo(10, 10);
    expect(a.totals.eaveLf).toBeCloseTo(140, 10);
    expect(a.totals.rakeLf).toBe(0);
  });

  it("L-shaped roof: two valleys from the inside corners", () => {
    const a = analyseEdges(geoms(lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 30, wingWidthFt: 20, wingDepthFt: 15, wingOffsetFt: 10 }, 6)));
    // plan diagonal √(10² + 10²), rise 10 × 6/12 = 5: √(200 + 25) = 15 ft each (= 10 ft run × 18 in/ft)
    expect(a.totals.valleyLf).toBeCloseTo(30, 10);
    expect(a.byPlane[0].map((p) => p.type)).toEqual(["eave", "valley", "valley", "eave", "rake", "ridge", "rake"]);
    expect(a.totals.ridgeLf).toBeCloseTo(40 + 25, 10);
  });

  it("shed: the high side against nothing is a headwall; the user can retype it", () => {
    const planes = geoms(shedRoof(20, 10, 3));
    expect(analyseEdges(planes).byPlane[0].map((p) => p.type)).toEqual(["eave", "rake", "headwall", "rake"]);
    const over = analyseEdges(planes, (_p, e) => (e === 2 ? "ridge" : e === 1 ? "sidewall" : undefined));
    expect(over.byPlane[0].map((p) => [p.type, p.overridden, p.computedType])).toEqual([
      ["eave", false, "eave"],
      ["sidewall", true, "rake"],
      ["ridge", true, "headwall"],
      ["rake", false, "rake"],
    ]);
    expect(over.totals.sidewallLf).toBeCloseTo(10 * slopeFactor(3), 10);
    expect(over.totals.ridgeLf).toBe(20);
  });

  it("change of slope: top of one plane, bottom of the other → transition (IRC R903.2.1 flashing)", () => {
    // lower plane 4/12 from y=0 to 10 (top at 3.333 ft), upper plane 8/12 from y=10 to 16 with base 3.333
    const planes = geoms([
      { id: "low", pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10]], eaveEdge: 0 },
      { id: "up", pitch: 8, outline: [[0, 10], [20, 10], [20, 16], [0, 16]], eaveEdge: 0, baseElevationFt: 10 / 3 },
    ]);
    const a = analyseEdges(planes);
    expect(a.byPlane[0][2].type).toBe("transition");
    expect(a.byPlane[1][0].type).toBe("transition");
    expect(a.totals.transitionLf).toBeCloseTo(20, 10);
    expect(a.totals.eaveLf).toBeCloseTo(20, 10);
    expect(a.advisories).toHaveLength(0);
  });

  it("splits an edge at the ends of an overlap", () => {
    // a 30 ft ridge-side plane against a 10 ft neighbour along part of its top edge
    const planes = geoms([
      { id: "big", pitch: 6, outline: [[0, 0], [30, 0], [30, 10], [0, 10]], eaveEdge: 0 },
      { id: "small", pitch: 6, outline: [[20, 20], [10, 20], [10, 10], [20, 10]], eaveEdge: 0 },
    ]);
    const a = analyseEdges(planes);
    const top = a.byPlane[0].filter((p) => p.edgeIndex === 2);
    expect(top.map((p) => [p.type, p.shared, Number(p.planLengthFt.toFixed(6))])).toEqual([
      ["headwall", false, 10],
      ["ridge", true, 10],
      ["headwall", false, 10],
    ]);
    expect(a.totals.ridgeLf).toBeCloseTo(10, 10);
    expect(a.totals.headwallLf).toBeCloseTo(20, 10);
  });

  it("warns when two planes' heights differ along a shared edge by more than 0.05 ft", () => {
    const planes = geoms([
      { id: "a", pitch: 6, outline: [[0, 0], [20, 0], [20, 10], [0, 10]], eaveEdge: 0 },
      { id: "b", pitch: 4, outline: [[20, 20], [0, 20], [0, 10], [20, 10]], eaveEdge: 0 },
    ]);
    const a = analyseEdges(planes);
    expect(a.advisories.map((x) => x.code)).toEqual(["shared-edge-height-mismatch"]);
    expect(a.advisories[0].planeIds).toEqual(["a", "b"]);
  });

  it("pairs edges only through overlapping bounding boxes: far-apart buildings share nothing", () => {
    const planes = geoms([...gableRoof(30, 20, 6, { idPrefix: "a" }), ...gableRoof(30, 20, 6, { idPrefix: "b", origin: [100, 0] })]);
    const a = analyseEdges(planes);
    expect(a.totals.ridgeLf).toBeCloseTo(60, 10);
    expect(a.byPlane.flat().filter((p) => p.shared)).toHaveLength(4);
  });
});
