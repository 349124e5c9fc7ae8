import { describe, expect, it } from "vitest";
import {
  edgeDistance,
  leastDimensionOfOutlines,
  planeRoofEdges,
  spacingOverBattens,
  withinDistanceInterval,
  zoneSegmentsAlong,
} from "@shared/engine/wind/zones";
import { analyseEdges } from "@shared/engine/roof/edges";
import { hipRoof } from "@shared/engine/roof/generators";
import { slopeFactor } from "@shared/engine/roof/slope";
import { computeTakeoff } from "@shared/engine/takeoff";
import { geoms } from "./engine-helpers";

const rect = { id: "a", pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10]] as [number, number][], eaveEdge: 0 };

describe("edge distance a (ASCE 7-10 Fig. 30.4-1 notes; same a for θ > 7° in ASCE 7-16/7-22)", () => {
  it.each([
    // L, h, a, governing term: a = min(0.1 L, 0.4 h), not less than 0.04 L nor 3 ft
    [30, 15, 3.0, "0.1L"],
    [25, 12, 3.0, "3 ft"], // 0.1 × 25 = 2.5 < 3 ft floor
    [50, 10, 4.0, "0.4h"], // 0.4 × 10 = 4 < 5
    [200, 20, 8.0, "0.4h"], // min(20, 8) = 8 ≥ 0.04 × 200 = 8
    [80, 35, 8.0, "0.1L"], // min(8, 14) = 8
  ])("L %i ft, h %i ft → a = %f ft (%s)", (L, h, a, governs) => {
    const r = edgeDistance(L, h);
    expect(r.aFt).toBeCloseTo(a, 10);
    expect(r.governs).toBe(governs);
  });

  it("the 0.04 L floor governs on long, low buildings (ASCE 7-10 Fig. 30.4-1 note)", () => {
    // L 300, h 15: min(30, 6) = 6 < 0.04 × 300 = 12 → 12
    expect(edgeDistance(300, 15)).toMatchObject({ aFt: 12, governs: "0.04L" });
  });

  it("fallbacks: h missing → max(0.1 L, 3 ft); L missing → short side of the box around the outlines", () => {
    expect(edgeDistance(50).aFt).toBe(5);
    expect(edgeDistance(20).aFt).toBe(3);
    expect(edgeDistance(20).heightMissing).toBe(true);
    expect(leastDimensionOfOutlines([[[0, 0], [40, 0], [40, 10]], [[0, 10], [40, 30], [0, 30]]])).toBe(30);
  });
});

describe("zone geometry", () => {
  it("distance interval along a line: the stadium around a segment (geometry)", () => {
    // line x = 0 upward from y = −10; segment y = 0 from x = −5 to 5; r = 2 → t ∈ [8, 12]
    expect(withinDistanceInterval([0, -10], [0, 1], [-5, 0], [5, 0], 2)).toEqual([8, 12]);
    // past the end (x = 6): only the end disk, 1² + (t − 10)² ≤ 4 → 10 ± √3
    const [lo, hi] = withinDistanceInterval([6, -10], [0, 1], [-5, 0], [5, 0], 2)!;
    expect(lo).toBeCloseTo(10 - Math.sqrt(3), 12);
    expect(hi).toBeCloseTo(10 + Math.sqrt(3), 12);
    expect(withinDistanceInterval([9, -10], [0, 1], [-5, 0], [5, 0], 2)).toBeNull();
  });

  it("steep model: zone 3 at a corner of two roof edges, zone 2 along one, zone 1 inside (simplified ASCE 7-10 Fig. 30.4-1)", () => {
    const planes = geoms([rect]);
    const roof = planeRoofEdges(analyseEdges(planes).byPlane[0]);
    const model = { kind: "steep" as const, aFt: 3, zone3AsZone2: false };
    // at the rake (x = 0): within a of the rake and, up to y = 3, of the eave that meets it
    expect(zoneSegmentsAlong([0, 0], [0, 1], 10, roof, model)).toEqual([
      { zone: "3", planFt: expect.closeTo(3, 10) },
      { zone: "2", planFt: expect.closeTo(7, 10) },
    ]);
    // at x = 4: the eave band, then the field (the high side is a headwall, not a roof edge)
    expect(zoneSegmentsAlong([4, 0], [0, 1], 10, roof, model)).toEqual([
      { zone: "2", planFt: expect.closeTo(3, 10) },
      { zone: "1", planFt: expect.closeTo(7, 10) },
    ]);
  });

  it("low-slope model (θ ≤ 7°): zone 2 band 0.6h, zone 1 to 1.2h, zone 1' beyond, zone 3 corners 0.6h × 0.2h (ASCE 7-16 Fig. 30.3-2A)", () => {
    const planes = geoms([{ id: "f", pitch: 1, outline: [[0, 0], [40, 0], [40, 30], [0, 30]], eaveEdge: 0 }]);
    const roof = planeRoofEdges(analyseEdges(planes).byPlane[0]);
    const model = { kind: "low-slope" as const, aFt: 3, h: 10, zone3AsZone2: false };
    expect(zoneSegmentsAlong([20, 0], [0, 1], 30, roof, model)).toEqual([
      { zone: "2", planFt: expect.closeTo(6, 10) },
      { zone: "1", planFt: expect.closeTo(6, 10) },
      { zone: "1'", planFt: expect.closeTo(18, 10) },
    ]);
    // 1 ft from the rake: inside 0.2h of the rake and 0.6h of the eave → zone 3 up to y = 6, then the rake's zone 2
    expect(zoneSegmentsAlong([1, 0], [0, 1], 30, roof, model)).toEqual([
      { zone: "3", planFt: expect.closeTo(6, 10) },
      { zone: "2", planFt: expect.closeTo(24, 10) },
    ]);
  });
});

describe("clips and screws by zone", () => {
  it("20 × 10 ft plane at 4/12, 16 in coverage, 24 in spacing everywhere → 15 panels of 127 in, 7 clips each", () => {
    // common practice: n = 1 + ceil(126.49 in / 24 in) = 1 + 6 = 7
    const r = computeTakeoff({
      planes: [rect],
      stacks: [{ id: "s", panel: { coverageWidthIn: 16, clipSpacingIn: { field: 24, edge: 24, corner: 24 } } }],
      defaultStackId: "s",
    });
    if (!r.ok) throw new Error(r.reason);
    const p = r.result.planes[0];
    expect(p.panels.count).toBe(15);
    expect(p.panels.lengthsIn).toEqual(Array(15).fill(127));
    expect(p.windZones.clipsPerPanel).toEqual(Array(15).fill(7));
    expect(r.result.fasteners.clips).toBe(105);
    // 2 screws per clip (common practice)
    expect(r.result.fasteners.clipScrews).toBe(210);
  });

  it("default spacings 24 / 16 / 12 in by zone, worked by hand (common practice spacings)", () => {
    const r = computeTakeoff({ planes: [rect], stacks: [{ id: "s" }], defaultStackId: "s" });
    if (!r.ok) throw new Error(r.reason);
    const k = slopeFactor(4);
    // a = max(0.1 × 10, 3) = 3 ft (h not given). Along the slope: 3 ft plan × k = 37.95 in; the rest 7 ft × k = 88.54 in.
    expect(3 * k * 12).toBeCloseTo(37.95, 2);
    // lines within 3 ft of a rake (x = 0, 1.33, 2.67, 17.33, 18.67): zone 3 then zone 2:
    //   1 + ceil(37.95 / 12) + ceil(88.54 / 16) = 1 + 4 + 6 = 11
    // the other ten lines: zone 2 then zone 1: 1 + ceil(37.95 / 16) + ceil(88.54 / 24) = 1 + 3 + 4 = 8
    expect(r.result.planes[0].windZones.clipsPerPanel).toEqual([11, 11, 11, 8, 8, 8, 8, 8, 8, 8, 8, 8, 8, 11, 11]);
    expect(r.result.fasteners.clips).toBe(5 * 11 + 10 * 8);
    const z = r.result.fasteners.zones;
    expect(z["3"].clips + z["2"].clips + z["1"].clips + z["1'"].clips).toBe(135);
    // zone widths are shown in plan and along the slope
    expect(r.result.planes[0].windZones.widths.zone2PlanFt).toBe(3);
    expect(r.result.planes[0].windZones.widths.zone2SlopeFt).toBeCloseTo(3 * k, 10);
    expect(r.result.wind).toMatchObject({ aFt: 3, leastHorizontalDimensionFt: 10, leastHorizontalDimensionEstimated: true });
  });

  it("hip roofs at 25° or less treat zone 3 as zone 2 (ASCE 7-02/05 low-rise figure notes)", () => {
    const clipsIn3 = (p: number) => {
      const r = computeTakeoff({ planes: hipRoof(40, 30, p), stacks: [{ id: "s" }], defaultStackId: "s", site: { wind: { meanRoofHeightFt: 15 } } });
      if (!r.ok) throw new Error(r.reason);
      return r.result.fasteners.zones["3"].clips;
    };
    expect(clipsIn3(5)).toBe(0); // 22.6°
    expect(clipsIn3(6)).toBeGreaterThan(0); // 26.6°
  });

  it("over battens clips land only on battens: spacing no closer than the battens (common practice)", () => {
    expect(spacingOverBattens(12, 24)).toBe(24);
    expect(spacingOverBattens(16, 24)).toBe(24);
    expect(spacingOverBattens(36, 24)).toBe(24);
    expect(spacingOverBattens(48, 24)).toBe(48);
    expect(spacingOverBattens(16, null)).toBe(16);
    const r = computeTakeoff({ planes: [rect], stacks: [{ id: "s", spacer: { kind: "battens" } }], defaultStackId: "s" });
    if (!r.ok) throw new Error(r.reason);
    // every zone at 24 in → 7 clips per line, as in the uniform case
    expect(r.result.planes[0].windZones.clipsPerPanel).toEqual(Array(15).fill(7));
    expect(r.result.advisories.map((a) => a.code)).toContain("clip-spacing-exceeds-battens");
  });

  it("exposed-fastener screws per square by zone (80 / 100 / 120, from memory)", () => {
    const r = computeTakeoff({
      planes: [rect],
      stacks: [{ id: "s", panel: { system: "exposed-fastener", coverageWidthIn: 36, lapSealant: true } }],
      defaultStackId: "s",
    });
    if (!r.ok) throw new Error(r.reason);
    const z = r.result.fasteners.zones;
    const area = z["1"].areaSqFt + z["2"].areaSqFt + z["3"].areaSqFt;
    // panel strips × true length: 7 strips of 3 ft × 10 ft × k (the last strip overhangs the rake)
    expect(area).toBeCloseTo(7 * 3 * 10 * slopeFactor(4), 8);
    const expected = (z["1"].areaSqFt * 80 + z["2"].areaSqFt * 100 + z["3"].areaSqFt * 120) / 100;
    expect(r.result.fasteners.panelScrews).toBe(Math.ceil(expected));
    expect(r.result.fasteners.clips).toBe(0);
    expect(z["3"].areaSqFt).toBeGreaterThan(0);
  });
});
