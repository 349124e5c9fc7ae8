import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { computeTakeoff, type TakeoffResult } from "@shared/engine/takeoff";
import { gableRoof, hipRoof, lShapeGableRoof, type GeneratedPlane } from "@shared/engine/roof/generators";
import { layoutPanels } from "@shared/engine/roof/panels";
import { isGeometryError, planeGeometry } from "@shared/engine/roof/geometry";

/** A convex plane: corners on a circle at distinct multiples of 15°, any edge as the eave. */
const convexPlane = fc
  .record({
    slots: fc.uniqueArray(fc.integer({ min: 0, max: 23 }), { minLength: 3, maxLength: 8 }),
    radius: fc.double({ min: 3, max: 60, noNaN: true }),
    cx: fc.double({ min: -100, max: 100, noNaN: true }),
    cy: fc.double({ min: -100, max: 100, noNaN: true }),
    pitch: fc.double({ min: 0, max: 24, noNaN: true }),
    eave: fc.nat(),
  })
  .map(({ slots, radius, cx, cy, pitch, eave }) => {
    const outline = [...slots]
      .sort((a, b) => a - b)
      .map((s) => [cx + radius * Math.cos((s * Math.PI) / 12), cy + radius * Math.sin((s * Math.PI) / 12)] as [number, number]);
    return { id: "c", pitch, outline, eaveEdge: eave % outline.length };
  });

const roofArb = fc.oneof(
  fc
    .record({ w: fc.double({ min: 8, max: 80, noNaN: true }), d: fc.double({ min: 8, max: 60, noNaN: true }), p: fc.double({ min: 0.5, max: 18, noNaN: true }) })
    .map(({ w, d, p }) => gableRoof(w, d, p)),
  fc
    .record({ w: fc.double({ min: 8, max: 80, noNaN: true }), d: fc.double({ min: 8, max: 60, noNaN: true }), p: fc.double({ min: 0.5, max: 18, noNaN: true }) })
    .map(({ w, d, p }) => hipRoof(w, d, p)),
  fc
    .record({ p: fc.double({ min: 1, max: 14, noNaN: true }), b: fc.double({ min: 10, max: 24, noNaN: true }) })
    .map(({ p, b }) => lShapeGableRoof({ mainWidthFt: 50, mainDepthFt: 26, wingWidthFt: Math.min(b, 26), wingDepthFt: 14, wingOffsetFt: 12 }, p)),
);

type Transform = { angle: number; dx: number; dy: number; reverse: boolean; shift: number };
const transformArb = fc.record({
  angle: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
  dx: fc.double({ min: -500, max: 500, noNaN: true }),
  dy: fc.double({ min: -500, max: 500, noNaN: true }),
  reverse: fc.boolean(),
  shift: fc.nat(10),
});

/** Rotate and move the roof in plan, reverse each outline and start it at another corner (eave edge renumbered). */
function transform(planes: GeneratedPlane[], t: Transform): GeneratedPlane[] {
  const c = Math.cos(t.angle);
  const s = Math.sin(t.angle);
  return planes.map((p) => {
    const n = p.outline.length;
    let outline = p.outline.map(([x, y]) => [c * x - s * y + t.dx, s * x + c * y + t.dy] as [number, number]);
    let eave = p.eaveEdge;
    if (t.reverse) {
      outline = [...outline].reverse();
      eave = (((n - 2 - eave) % n) + n) % n; // edge e (v_e → v_e+1) becomes edge n − 2 − e, reversed
    }
    const k = t.shift % n;
    outline = [...outline.slice(k), ...outline.slice(0, k)];
    eave = (((eave - k) % n) + n) % n;
    return { ...p, outline, eaveEdge: eave };
  });
}

function run(planes: GeneratedPlane[]): TakeoffResult {
  const r = computeTakeoff({ planes, stacks: [{ id: "s" }], defaultStackId: "s", site: { wind: { leastHorizontalDimensionFt: 30, meanRoofHeightFt: 15 } } });
  if (!r.ok) throw new Error(`${r.reason} at ${r.path.join(".")}`);
  return r.result;
}

describe("invariants (fast-check)", () => {
  it("sloped area ≥ plan area, and = plan × √(144 + p²)/12 (rafter-table slope factor)", () => {
    fc.assert(
      fc.property(convexPlane, (plane) => {
        const g = planeGeometry(plane, 0);
        if (isGeometryError(g)) throw new Error(g.reason);
        expect(g.slopedAreaSqFt).toBeGreaterThanOrEqual(g.planAreaSqFt - 1e-9);
        expect(g.slopedAreaSqFt / g.planAreaSqFt).toBeCloseTo(Math.hypot(plane.pitch, 12) / 12, 9);
      }),
      { numRuns: 200 },
    );
  });

  it("panel coverage width × count ≥ the plane's width across the eave direction", () => {
    fc.assert(
      fc.property(convexPlane, fc.constantFrom(12, 16, 18, 36), (plane, coverageWidthIn) => {
        const g = planeGeometry(plane, 0);
        if (isGeometryError(g)) throw new Error(g.reason);
        const p = layoutPanels(g, { coverageWidthIn });
        expect((p.count * coverageWidthIn) / 12).toBeGreaterThanOrEqual(g.sMax - g.sMin - 0.01);
        // and every panel is at least as long as the plane is high where it sits (ordered lengths round up)
        for (const piece of p.pieces) expect(piece.lengthIn).toBeGreaterThanOrEqual(12 * piece.slopeLengthFt - 1e-6);
        expect(p.offcutSqFt).toBeGreaterThanOrEqual(-1e-6);
      }),
      { numRuns: 200 },
    );
  });

  it("totals do not depend on vertex start, order reversal, rotation or position", () => {
    fc.assert(
      fc.property(roofArb, transformArb, (planes, t) => {
        const a = run(planes);
        const b = run(transform(planes, t));
        expect(b.totals.planAreaSqFt).toBeCloseTo(a.totals.planAreaSqFt, 6);
        expect(b.totals.slopedAreaSqFt).toBeCloseTo(a.totals.slopedAreaSqFt, 6);
        for (const key of Object.keys(a.edgeTotals) as (keyof typeof a.edgeTotals)[]) {
          expect(b.edgeTotals[key]).toBeCloseTo(a.edgeTotals[key], 6);
        }
        expect(b.totals.panelCount).toBe(a.totals.panelCount);
      }),
      { numRuns: 60 },
    );
  });

  it("sum of plane areas equals the footprint for generated roofs (plan areas add up)", () => {
    fc.assert(
      fc.property(fc.double({ min: 8, max: 80, noNaN: true }), fc.double({ min: 8, max: 60, noNaN: true }), fc.double({ min: 0, max: 24, noNaN: true }), (w, d, p) => {
        expect(run(hipRoof(w, d, p)).totals.planAreaSqFt).toBeCloseTo(w * d, 6);
        expect(run(gableRoof(w, d, p)).totals.planAreaSqFt).toBeCloseTo(w * d, 6);
      }),
      { numRuns: 50 },
    );
  });
});
