import { describe, expect, it } from "vitest";
import { trimFastenersForRun, trimPieces } from "@shared/engine/trim";

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
