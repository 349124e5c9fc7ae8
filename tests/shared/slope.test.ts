import { describe, expect, it } from "vitest";
import {
  commonInPerFtRun,
  hipValleyFactor,
  hipValleyInPerFtRun,
  pitchFromAngleDeg,
  slopeAngleDeg,
  slopedArea,
  slopeFactor,
  slopePercent,
  squares,
} from "@shared/engine/roof/slope";
import { pitch, sqft } from "@shared/engine/units";

// Framing-square rafter tables (published: I. S. Griffith, Carpentry (1916); US Navy Builder training
// manual): angle, slope factor, common rafter in per ft of run, hip/valley in per ft of common run.
describe("rafter-table slope factors", () => {
  it.each([
    // pitch, angle °, slope factor, common in/ft, hip/valley in/ft, decimals checked
    [2, 9.46, 1.0138, 12.17, 17.09],
    [4, 18.43, 1.0541, 12.6491, 17.4356],
    [6, 26.57, 1.118, 13.42, 18.0],
    [7, 30.26, 1.1577, 13.89, 18.36],
    [8, 33.69, 1.2019, 14.4222, 18.7617],
    [12, 45.0, 1.4142, 16.9706, 20.7846],
  ])("%i/12: %f°, k %f, common %f in/ft, hip %f in/ft (rafter tables)", (p, angle, k, common, hip) => {
    expect(slopeAngleDeg(p)).toBeCloseTo(angle, 2);
    expect(slopeFactor(p)).toBeCloseTo(k, 4);
    // the tables print two decimals; the bracketed exact values four
    const digits = (x: number) => (String(x).split(".")[1] ?? "").length;
    expect(commonInPerFtRun(p)).toBeCloseTo(common, Math.min(digits(common), 4));
    expect(hipValleyInPerFtRun(p)).toBeCloseTo(hip, Math.min(Math.max(digits(hip), 1), 4));
    expect(hipValleyFactor(p)).toBeCloseTo(hip / 12, 3);
  });

  it("flat roof: factor 1, hip factor √2 (geometry: the diagonal of a square)", () => {
    expect(slopeFactor(0)).toBe(1);
    expect(hipValleyFactor(0)).toBeCloseTo(Math.SQRT2, 12);
  });

  it("percent slope is 100·p/12 (definition)", () => {
    expect(slopePercent(6)).toBeCloseTo(50, 12);
    expect(slopePercent(12)).toBeCloseTo(100, 12);
  });

  it("pitchFromAngleDeg inverts slopeAngleDeg", () => {
    for (const p of [0.25, 3, 7, 12, 24]) expect(pitchFromAngleDeg(slopeAngleDeg(p))).toBeCloseTo(p, 10);
  });

  it("sloped area = plan area × k; 100 ft² at 12/12 → 141.42 ft² (geometry: √2)", () => {
    expect(slopedArea(sqft(100), pitch(12))).toBeCloseTo(141.42, 2);
    // common practice, no published source: 1 square = 100 ft² of roof surface
    expect(squares(141.42)).toBeCloseTo(1.4142, 4);
  });
});
