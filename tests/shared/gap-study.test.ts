import { describe, expect, it } from "vitest";
import { computeGapStudy, GAP_STUDY_OPTIONS } from "@shared/engine/gap-study";
import { gableRoof } from "@shared/engine/roof/generators";

const input = (extra: Record<string, unknown> = {}) => ({
  planes: gableRoof(30, 20, 6),
  stacks: [{ id: "s" }],
  defaultStackId: "s",
  planeIds: ["p-s"],
  ...extra,
});

describe("gap study", () => {
  it("runs the five spacer options side by side", () => {
    const r = computeGapStudy(input());
    if (!r.ok) throw new Error(r.reason);
    expect(r.options.map((o) => o.spacer)).toEqual([...GAP_STUDY_OPTIONS]);
    expect(GAP_STUDY_OPTIONS).toEqual(["none", "battens", "counter-battens", "mesh", "dimpled"]);
    const by = Object.fromEntries(r.options.map((o) => [o.spacer, o.summary]));
    // dressed lumber, NIST PS 20: 1x = 3/4 in; 3D mesh about 0.3 in, dimpled sheet about 0.4 in (common practice)
    expect(by.none.gapIn).toBe(0);
    expect(by.battens).toMatchObject({ gapIn: 0.75, continuous: false, qualifies: false, channelNfaPerFtSqIn: 0 });
    // counter-battens: 1x4 over 1x4 → 1.5 in gap; channel 0.75 in qualifies (Title 24 2008: at least 3/4 in)
    expect(by["counter-battens"]).toMatchObject({ gapIn: 1.5, continuous: true, qualifies: true });
    expect(by["counter-battens"].channelNfaPerFtSqIn).toBeCloseTo(7.69, 2);
    expect(by.mesh).toMatchObject({ gapIn: 0.3, continuous: true, qualifies: false });
    expect(by.dimpled).toMatchObject({ gapIn: 0.4, continuous: true, qualifies: false });
  });

  it("only the chosen planes are taken off, with edges typed against the whole roof", () => {
    const r = computeGapStudy(input());
    if (!r.ok) throw new Error(r.reason);
    const res = r.options[0].result;
    expect(res.planes.map((p) => p.id)).toEqual(["p-s"]);
    expect(res.totals.planAreaSqFt).toBeCloseTo(300, 10);
    // the ridge is still a ridge (shared with the plane left out) and counts once
    expect(res.edgeTotals.ridgeLf).toBeCloseTo(30, 10);
    expect(res.edgeTotals.eaveLf).toBeCloseTo(30, 10);
  });

  it("spacer materials differ per option; battens are 1x4 at 24 in by default", () => {
    const r = computeGapStudy(input());
    if (!r.ok) throw new Error(r.reason);
    const keys = Object.fromEntries(r.options.map((o) => [o.spacer, o.summary.spacerMaterials.map((m) => m.key)]));
    expect(keys.none).toEqual([]);
    expect(keys.battens).toEqual(["batten-1x4", "screw-batten"]);
    expect(keys["counter-battens"]).toEqual(["batten-1x4", "counter-batten-1x4", "screw-batten"]);
    expect(keys.mesh).toEqual(["spacer-mesh"]);
    expect(keys.dimpled).toEqual(["spacer-dimpled"]);
    const battens = r.options[1].result.planes[0].layers.battens!;
    expect(battens).toMatchObject({ nominal: "1x4", spacingIn: 24 });
  });

  it("uplift-assembly status and advisories per option", () => {
    const r = computeGapStudy(input({ site: { wind: { ratedAssemblyRequired: true } } }));
    if (!r.ok) throw new Error(r.reason);
    const status = Object.fromEntries(r.options.map((o) => [o.spacer, o.summary.upliftAssembly]));
    expect(status).toEqual({
      none: "tested",
      battens: "not-tested-needs-review",
      "counter-battens": "not-tested-needs-review",
      mesh: "not-tested-needs-review",
      dimpled: "not-tested-needs-review",
    });
    const codes = (i: number) => r.options[i].summary.advisories.map((a) => a.code);
    expect(codes(0)).not.toContain("spacer-voids-rated-assembly");
    expect(codes(1)).toContain("spacer-voids-rated-assembly");
  });

  it("an enclosed gap has an air-space R; a ventilated one reports none (ASHRAE 2021 ch. 26 Table 3 covers enclosed spaces)", () => {
    const r = computeGapStudy(input());
    if (!r.ok) throw new Error(r.reason);
    const by = Object.fromEntries(r.options.map((o) => [o.spacer, o.summary]));
    // horizontal battens alone enclose cells between rows: E = 0.82 for two 0.90 faces (ASHRAE 2021 ch. 26 Table 3 note)
    expect(by.battens.effectiveEmittance).toBeCloseTo(0.818, 3);
    expect(by.battens.airSpaceRSummer).toBeGreaterThan(0);
    expect(by["counter-battens"].airSpaceRSummer).toBeNull();
    expect(by.none.effectiveEmittance).toBeNull();
  });

  it("refuses bad input with a path", () => {
    expect(computeGapStudy(input({ planeIds: ["nope"] }))).toMatchObject({ ok: false, path: ["planeIds", 0] });
    expect(computeGapStudy(input({ planeIds: [] }))).toMatchObject({ ok: false, path: ["planeIds"] });
  });
});
