import { describe, expect, it } from "vitest";
import { computeTakeoff, type TakeoffResult } from "@shared/engine/takeoff";
import { gableRoof, hipRoof, lShapeGableRoof } from "@shared/engine/roof/generators";
import { MATERIAL_KEYS } from "@shared/engine/materials";

function takeoff(input: Record<string, unknown>): TakeoffResult {
  const r = computeTakeoff({ stacks: [{ id: "s" }], defaultStackId: "s", ...input });
  if (!r.ok) throw new Error(`${r.reason} at ${r.path.join(".")}`);
  return r.result;
}
const qty = (r: TakeoffResult, key: string) => r.materials.find((m) => m.key === key)?.quantity;
const K6 = Math.sqrt(180) / 12; // rafter table 6/12: 1.1180

describe("hand-worked gable: 30 × 20 ft at 6/12", () => {
  const r = takeoff({ planes: gableRoof(30, 20, 6), site: { atticFloorAreaSqFt: 600 } });

  it("areas: plan 2 × 30 × 10 = 600 ft²; sloped 600 × 1.1180 = 670.82 ft²; 6.71 squares", () => {
    expect(r.totals.planAreaSqFt).toBeCloseTo(600, 10);
    expect(r.totals.slopedAreaSqFt).toBeCloseTo(600 * K6, 10);
    expect(r.totals.squares).toBeCloseTo(6 * K6, 10);
  });

  it("edges: the ridge once (30 ft), two eaves (60 ft), four rakes (4 × 10 × 1.1180 = 44.72 ft)", () => {
    expect(r.edgeTotals).toMatchObject({ ridgeLf: 30, eaveLf: 60, hipLf: 0, valleyLf: 0 });
    expect(r.edgeTotals.rakeLf).toBeCloseTo(44.72, 2);
    expect(r.planes[0].edges.map((e) => e.type)).toEqual(["eave", "rake", "ridge", "rake"]);
    expect(r.planes[0].edges[2]).toMatchObject({ shared: true, sharedWith: { planeId: "p-n", edgeIndex: 2 } });
  });

  it("panels: 360 in ÷ 16 in = 22.5 → 23 per slope; 10 ft × 1.1180 × 12 = 134.16 → 135 in", () => {
    expect(r.planes.map((p) => p.panels.count)).toEqual([23, 23]);
    expect(r.planes[0].panels.cutList).toEqual([{ lengthIn: 135, count: 23 }]);
    // offcut per slope: 23 × 16/12 × 135/12 − 335.41 = 345.0 − 335.41 = 9.59 ft²
    expect(r.planes[0].panels.offcutSqFt).toBeCloseTo(345 - 300 * K6, 10);
    // 46 × 135 in = 517.5 lf
    expect(qty(r, "panel-standing-seam")).toBeCloseTo(517.5, 6);
  });

  it("trim: eaves 2 × ceil(29.75 / 9.75) = 8; rakes 4 × ceil(10.93 / 9.75) = 8; ridge ceil(29.75 / 9.75) = 4", () => {
    expect(qty(r, "trim-eave")).toBe(8);
    expect(qty(r, "trim-rake")).toBe(8);
    expect(qty(r, "ridge-cap")).toBe(4);
    expect(qty(r, "hip-cap")).toBeUndefined();
  });

  it("underlayment: 670.82 × 1.10 ÷ 914.83 = 0.81 → 1 synthetic roll; closures 46 at the eaves, 46 at the ridge", () => {
    expect(qty(r, "underlayment-synthetic")).toBe(1);
    expect(qty(r, "closure-eave")).toBe(46);
    expect(qty(r, "closure-ridge")).toBe(46);
  });

  it("ventilation: 600 ft² ÷ 150 × 144 = 576 in² (IRC R806.2); ridge vent 30 − 2 × 1 = 28 lf", () => {
    expect(r.ventilation.requiredNfaSqIn).toBeCloseTo(576, 10);
    expect(r.ventilation.exhaustLf).toBeCloseTo(28, 10);
    expect(qty(r, "vent-ridge")).toBe(28);
    expect(qty(r, "vent-intake")).toBe(60);
  });

  it("every material has a known key, a unit and a basis in words", () => {
    for (const m of r.materials) {
      expect(Object.keys(MATERIAL_KEYS)).toContain(m.key);
      expect(m.unit).toBe(MATERIAL_KEYS[m.key].unit);
      expect(m.basis.length).toBeGreaterThan(10);
      expect(Number.isFinite(m.quantity)).toBe(true);
    }
  });
});

describe("hand-worked hip roof: 40 × 30 ft at 6/12", () => {
  const r = takeoff({ planes: hipRoof(40, 30, 6) });

  it("areas: 1200 ft² plan × 1.1180 = 1341.64 ft² sloped", () => {
    expect(r.totals.planAreaSqFt).toBeCloseTo(1200, 10);
    expect(r.totals.slopedAreaSqFt).toBeCloseTo(1200 * K6, 10);
  });

  it("hips 4 × 15 ft run × 18 in/ft = 4 × 22.5 ft (rafter tables: √(288 + 36) = 18); ridge 40 − 30 = 10 ft; eaves 140 ft; no rakes", () => {
    expect(r.edgeTotals.hipLf).toBeCloseTo(90, 10);
    expect(r.edgeTotals.ridgeLf).toBeCloseTo(10, 10);
    expect(r.edgeTotals.eaveLf).toBeCloseTo(140, 10);
    expect(r.edgeTotals.rakeLf).toBe(0);
  });

  it("trim: hip caps 4 × ceil(22.25 / 9.75) = 12; ridge 1; eaves 2 × 5 + 2 × 4 = 18", () => {
    expect(qty(r, "hip-cap")).toBe(12);
    expect(qty(r, "ridge-cap")).toBe(1);
    expect(qty(r, "trim-eave")).toBe(18);
    expect(qty(r, "trim-rake")).toBeUndefined();
  });

  it("panels: 30 on each long side, 23 on each end (30 ft ÷ 16 in = 22.5)", () => {
    expect(r.planes.map((p) => p.panels.count)).toEqual([30, 30, 23, 23]);
    // every panel meets the eave once and a ridge or hip once
    expect(qty(r, "closure-eave")).toBe(106);
    expect(qty(r, "closure-ridge")).toBe(106);
  });

  it("the short ridge cannot carry the exhaust: 8 lf × 18 in²/ft = 144 in² < 576 in² (raised by the ventilation module)", () => {
    expect(r.ventilation.exhaustProvidedSqIn).toBeCloseTo(144, 10);
    expect(r.advisories.map((a) => a.code)).toContain("hip-ridge-too-short-for-exhaust");
  });
});

describe("hand-worked L-shaped roof with valleys: main 40 × 30, wing 20 wide projecting 15, at 6/12", () => {
  const r = takeoff({ planes: lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 30, wingWidthFt: 20, wingDepthFt: 15, wingOffsetFt: 10 }, 6) });

  it("areas: main south 600 − ½ × 20 × 10 = 500, main north 600, wing slopes 10 × (15 + 25)/2 = 200 each → 1500 ft²", () => {
    expect(r.planes.map((p) => p.planAreaSqFt)).toEqual([500, 600, 200, 200].map((x) => expect.closeTo(x, 10)));
    expect(r.totals.slopedAreaSqFt).toBeCloseTo(1500 * K6, 10);
  });

  it("edges: valleys 2 × √(10² + 10² + 5²) = 30 ft; ridges 40 + 25 = 65 ft; eaves 10 + 10 + 40 + 15 + 15 = 90 ft", () => {
    expect(r.edgeTotals.valleyLf).toBeCloseTo(30, 10);
    expect(r.edgeTotals.ridgeLf).toBeCloseTo(65, 10);
    expect(r.edgeTotals.eaveLf).toBeCloseTo(90, 10);
    // rakes: main 4 × 15 × 1.1180 = 67.08, wing 2 × 10 × 1.1180 = 22.36
    expect(r.edgeTotals.rakeLf).toBeCloseTo(60 * K6 + 20 * K6, 10);
  });

  it("valley pans 2 × ceil(14.75 / 9.75) = 4; a 36 in membrane strip under them: 30 × 1.05 ÷ 64.5 = 0.49 → 1 roll", () => {
    expect(qty(r, "valley-pan")).toBe(4);
    expect(qty(r, "valley-membrane")).toBe(1);
  });

  it("two ridges lose 1 ft at each end: 65 − 4 = 61 lf of ridge vent", () => {
    expect(r.ventilation.exhaustLf).toBeCloseTo(61, 10);
  });

  it("closures: one at each panel end on an eave, ridge or hip; none where a panel dies into a valley", () => {
    // strips of 16 in from each plane's left side (looking up-slope); a panel's end type is read at its middle
    // main north: 40 ft → 30 panels, all eave to ridge
    // main south: 30 strips; middles 4j/3 + 2/3 ft inside the notch (10 < x < 30) for j = 8…21 → 14 end in a valley
    // wing west: 25 ft wide → 19 strips from the north; middles at or south of y = 0 (j = 7…18) → 12 at the eave
    // wing east: 19 strips from the south; middles at or south of y = 0 (j = 0…10) → 11 at the eave
    expect(r.planes.map((p) => p.panels.count)).toEqual([30, 30, 19, 19]);
    expect(qty(r, "closure-eave")).toBe(30 + 16 + 12 + 11);
    // every panel's top meets a ridge
    expect(qty(r, "closure-ridge")).toBe(98);
    expect(r.planes[2].edges.map((e) => e.type)).toEqual(["eave", "valley", "ridge", "rake"]);
  });
});

describe("results are consistent", () => {
  it("totals add up the planes and are not rounded", () => {
    const r = takeoff({ planes: hipRoof(37.3, 21.7, 7.5) });
    expect(r.totals.slopedAreaSqFt).toBeCloseTo(r.planes.reduce((t, p) => t + p.slopedAreaSqFt, 0), 10);
    expect(Number.isInteger(r.totals.slopedAreaSqFt)).toBe(false);
    expect(r.totals.panelCount).toBe(r.planes.reduce((t, p) => t + p.panels.lengthsIn.length, 0));
  });

  it("thermal comes from the dominant assembly, and every assembly has its own", () => {
    const r = computeTakeoff({
      planes: [...gableRoof(30, 20, 6).map((p) => ({ ...p, stackId: "mesh" })), { id: "porch", pitch: 3, outline: [[0, -8], [10, -8], [10, 0], [0, 0]], eaveEdge: 0 }],
      stacks: [{ id: "plain" }, { id: "mesh", spacer: { kind: "mesh" } }],
      defaultStackId: "plain",
    });
    if (!r.ok) throw new Error(r.reason);
    expect(r.result.stacks.map((s) => s.id)).toEqual(["plain", "mesh"]);
    expect(r.result.thermal.stackId).toBe("mesh");
    expect(r.result.thermal.gapIn).toBeCloseTo(0.3, 10);
    expect(r.result.stacks[0].thermal.gapIn).toBe(0);
  });

  it("refuses bad input with a path instead of throwing", () => {
    const r = computeTakeoff({ planes: [{ id: "a", pitch: 30, outline: [[0, 0], [1, 0], [0, 1]], eaveEdge: 0 }], stacks: [{ id: "s" }], defaultStackId: "s" });
    expect(r).toMatchObject({ ok: false, path: ["planes", 0, "pitch"] });
    expect(computeTakeoff(null)).toMatchObject({ ok: false });
  });
});
