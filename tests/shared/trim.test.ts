import { describe, expect, it } from "vitest";
import { computeTakeoff } from "@shared/engine/takeoff";
import { hipRoof } from "@shared/engine/roof/generators";
import { tallyTrim, trimFastenersForRun, trimPieces } from "@shared/engine/trim";
import type { EdgeRun } from "@shared/engine/roof/edges";

describe("trim pieces per run: n = ceil((L − lap) / (stock − lap))", () => {
  it.each([
    // common practice, no published source: 10 ft stock, 3 in end lap
    [40, 5], // (40 − 0.25) / 9.75 = 4.08 → 5
    [9.9, 1], // 9.65 / 9.75 = 0.99 → 1
    [19.6, 2], // 19.35 / 9.75 = 1.98 → 2
    [10, 1], // (10 − 0.25) / 9.75 = 1 exactly → 1
    [10.01, 2], // just over one stock length → 2
  ])("%f ft → %i pieces", (len, n) => {
    expect(trimPieces(len)).toBe(n);
  });

  it("drip edge laps of at least 2 in (IRC R905.2.8.5): a 2 in lap on 10 ft stock", () => {
    // (30 − 2/12) / (10 − 2/12) = 3.03 → 4
    expect(trimPieces(30, 10, 2)).toBe(4);
  });

  it("no length, no pieces; a short edge still takes one piece", () => {
    expect(trimPieces(0)).toBe(0);
    expect(trimPieces(0.1)).toBe(1);
  });

  it("trim fasteners at 12 in o.c. plus one (common practice)", () => {
    expect(trimFastenersForRun(10)).toBe(11);
    expect(trimFastenersForRun(10.05)).toBe(12);
  });
});

describe("the runs tallied by edge type", () => {
  const run = (type: EdgeRun["type"], lengthFt: number): EdgeRun => ({ type, lengthFt, planLengthFt: lengthFt, planeIds: [], pieces: [] });

  it("sums pieces, fasteners and laps per run, grouping equal lengths in the order met (common practice, 10 ft stock, 3 in lap)", () => {
    const t = tallyTrim([run("ridge", 20), run("eave", 40), run("eave", 30), run("eave", 40), run("valley", 0)], 10, 3, 12);
    // eaves: 40 ft → 5 pieces (4 laps), 30 ft → 4 pieces (3 laps), 40 ft → 5; ridge 20 ft → (20 − 0.25) / 9.75 = 2.03 → 3 (2 laps)
    expect(t.byType.map((b) => b.type)).toEqual(["eave", "ridge", "valley"]); // the listing order, not the order met
    expect(t.byType[2]).toMatchObject({ runs: 1, pieces: 0 }); // a 0 ft run takes no piece and no fastener
    expect(t.byType[0]).toEqual({ type: "eave", runs: 3, pieces: 14, lengthsFt: [40, 30], runsOfLength: [2, 1], piecesOfLength: [5, 4] });
    expect(t.byType[1]).toMatchObject({ runs: 1, pieces: 3, lengthsFt: [20] });
    expect(t.laps).toBe(4 + 3 + 4 + 2);
    // fasteners at 12 in o.c. + 1 per run: 41 + 31 + 41 + 21
    expect(t.fasteners).toBe(41 + 31 + 41 + 21);
  });

  it("past sixteen distinct lengths of one type it still groups every equal length", () => {
    const runs = Array.from({ length: 40 }, (_, i) => run("rake", 10 + (i % 20)));
    const t = tallyTrim(runs, 10, 3, 12);
    expect(t.byType).toHaveLength(1);
    expect(t.byType[0].lengthsFt).toEqual(Array.from({ length: 20 }, (_, i) => 10 + i));
    expect(t.byType[0].runsOfLength).toEqual(Array(20).fill(2));
    expect(t.byType[0].pieces).toBe(runs.reduce((n, r) => n + trimPieces(r.lengthFt), 0));
  });
});

describe("trim basis in the takeoff", () => {
  it("equal runs are one term: a 40 × 30 ft hip roof has 2 eaves of 40 ft and 2 of 30 ft", () => {
    const r = computeTakeoff({ planes: hipRoof(40, 30, 4), stacks: [{ id: "s" }], defaultStackId: "s" });
    if (!r.ok) throw new Error(r.reason);
    const eave = r.result.materials.find((m) => m.key === "trim-eave")!;
    // common practice, no published source: pieces per run = ceil((L − 3 in) ÷ (10 ft − 3 in));
    // 40 ft: 477 ÷ 117 = 4.08 → 5; 30 ft: 357 ÷ 117 = 3.05 → 4; 2 × 5 + 2 × 4 = 18
    expect(eave.basis).toBe("4 runs (2 × 40.0 ft at 5 pieces each, 2 × 30.0 ft at 4 pieces each); pieces per run = ceil((L - 3 in lap) ÷ (10 ft - lap)) = 18");
    expect(eave.quantity).toBe(18);
  });
});
