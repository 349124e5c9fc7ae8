import { describe, expect, it } from "vitest";
import { computeTakeoff, computeTakeoffQuantities } from "@shared/engine/takeoff";
import { computeGapStudy } from "@shared/engine/gap-study";
import { buildBenchRoof } from "@shared/engine/roof/bench-roof";
import { gableRoof, hipRoof, lShapeGableRoof } from "@shared/engine/roof/generators";
import type { PlaneQuantities, PlaneResult, TakeoffResult } from "@shared/engine/types";

/** What a plane's quantities must be: these fields of its full detail, nothing else. */
const quantitiesOf = (p: PlaneResult) => ({
  id: p.id,
  name: p.name,
  stackId: p.stackId,
  pitch: p.pitch,
  slopeFactor: p.slopeFactor,
  planAreaSqFt: p.planAreaSqFt,
  slopedAreaSqFt: p.slopedAreaSqFt,
  squares: p.squares,
  edges: p.edges.map((e) => ({ index: e.index, type: e.type, planLengthFt: e.planLengthFt, trueLengthFt: e.trueLengthFt })),
  panels: { count: p.panels.count, lengthsIn: p.panels.lengthsIn, cutList: p.panels.cutList, longestIn: p.panels.longestIn },
});

const withoutPlanes = <P extends PlaneQuantities>({ planes: _planes, ...rest }: TakeoffResult<P>) => rest;

const roofs: [string, unknown][] = [
  ["a 6/12 gable", { planes: gableRoof(40, 30, 6), stacks: [{ id: "s" }], defaultStackId: "s" }],
  ["a hip roof with battens", { planes: hipRoof(44, 30, 8), stacks: [{ id: "s", spacer: { kind: "battens", battens: { counterBattens: true } } }], defaultStackId: "s" }],
  [
    "an L-shaped roof with an edge override",
    {
      planes: lShapeGableRoof({ mainWidthFt: 40, mainDepthFt: 26, wingWidthFt: 18, wingDepthFt: 12, wingOffsetFt: 10 }, 9).map((p, i) => (i === 0 ? { ...p, edgeTypes: { 1: "sidewall" } } : p)),
      stacks: [{ id: "s", panel: { system: "exposed-fastener", coverageWidthIn: 36 } }],
      defaultStackId: "s",
    },
  ],
  ["the generated 100-plane roof", buildBenchRoof(100)],
];

describe("the takeoff with each plane's quantities only", () => {
  it.each(roofs)("%s: the same roof-wide figures, and each plane's quantities as in its full detail", (_name, input) => {
    const full = computeTakeoff(input);
    const lean = computeTakeoffQuantities(input);
    if (!full.ok || !lean.ok) throw new Error("roof refused");
    // Everything but the planes is the same, to the last bit (totals are added in the same order).
    expect(withoutPlanes(lean.result)).toEqual(withoutPlanes(full.result));
    expect(lean.result.planes).toHaveLength(full.result.planes.length);
    // Each plane: exactly its quantities (toStrictEqual: no other keys), with the full detail's values.
    lean.result.planes.forEach((p, i) => expect(p).toStrictEqual(quantitiesOf(full.result.planes[i])));
  });

  it("keeps every field the takeoff contract names for a plane and leaves out the drawing detail", () => {
    const lean = computeTakeoffQuantities(roofs[0][1]);
    if (!lean.ok) throw new Error(lean.reason);
    const p = lean.result.planes[0];
    expect(Object.keys(p)).toEqual(["id", "name", "stackId", "pitch", "slopeFactor", "planAreaSqFt", "slopedAreaSqFt", "squares", "edges", "panels"]);
    expect(Object.keys(p.edges[0])).toEqual(["index", "type", "planLengthFt", "trueLengthFt"]);
    expect(Object.keys(p.panels)).toEqual(["count", "lengthsIn", "cutList", "longestIn"]);
    // 40 × 30 ft gable at 6/12: two planes of 40 × 15 ft plan; slope factor √(6² + 12²)/12 = 1.1180 (rafter tables).
    expect(p.planAreaSqFt).toBeCloseTo(600, 9);
    expect(p.slopeFactor).toBeCloseTo(Math.sqrt(180) / 12, 12);
    expect(p.panels.lengthsIn).toHaveLength(p.panels.count);
    // A bad roof is refused the same way as by the full takeoff.
    expect(computeTakeoffQuantities({ planes: [], stacks: [{ id: "s" }], defaultStackId: "s" })).toEqual(
      computeTakeoff({ planes: [], stacks: [{ id: "s" }], defaultStackId: "s" }),
    );
  });

  it("the gap study gives the same options either way, with each plane's quantities when asked", () => {
    const input = { planes: gableRoof(30, 20, 6), stacks: [{ id: "s" }], defaultStackId: "s", planeIds: ["p-s"] };
    const full = computeGapStudy(input);
    const lean = computeGapStudy(input, "quantities");
    if (!full.ok || !lean.ok) throw new Error("refused");
    expect(lean.options.map((o) => [o.spacer, o.summary])).toEqual(full.options.map((o) => [o.spacer, o.summary]));
    lean.options.forEach((o, k) => {
      expect(withoutPlanes(o.result)).toEqual(withoutPlanes(full.options[k].result));
      o.result.planes.forEach((p, i) => expect(p).toStrictEqual(quantitiesOf(full.options[k].result.planes[i])));
    });
  });
});
