import { describe, expect, it } from "vitest";
import { clipSpacingBattenAdvisory, codeMinimumPitch, fallProtectionAdvisories, MAX_NAMED_IN_MESSAGE, planeLabels, ratedAssemblyAdvisory, slopeAdvisories } from "@shared/engine/advisories";
import { computeTakeoff } from "@shared/engine/takeoff";
import { gableRoof } from "@shared/engine/roof/generators";

const rect = (pitch: number, id = "a") => ({ id, pitch, outline: [[0, 0], [20, 0], [20, 10], [0, 10]] as [number, number][], eaveEdge: 0 });

function run(input: Record<string, unknown>) {
  const r = computeTakeoff({ stacks: [{ id: "s" }], defaultStackId: "s", planes: [rect(6)], ...input });
  if (!r.ok) throw new Error(`${r.reason} at ${r.path.join(".")}`);
  return r.result;
}
const codes = (input: Record<string, unknown>) => run(input).advisories.map((a) => a.code);
const find = (input: Record<string, unknown>, code: string) => run(input).advisories.find((a) => a.code === code);

describe("minimum slopes for metal roof panels (IRC 2021 R905.10.2; IBC 1507.4.2)", () => {
  it.each([
    ["standing-seam", false, 0.25], // standing seam 1/4:12
    ["exposed-fastener", true, 0.5], // lapped, non-soldered, with applied lap sealant 1/2:12
    ["exposed-fastener", false, 3], // lapped, non-soldered, without lap sealant 3:12
  ] as const)("%s, lap sealant %s → %f:12", (system, lapSealant, min) => {
    expect(codeMinimumPitch(system, lapSealant)).toBe(min);
    expect(slopeAdvisories([{ id: "p", label: "Porch", pitch: min }], { system, lapSealant })).toHaveLength(0);
    const below = slopeAdvisories([{ id: "p", label: "Porch", pitch: min - 0.01 }], { system, lapSealant });
    expect(below).toHaveLength(1);
    expect(below[0]).toMatchObject({ code: "slope-below-code-minimum", severity: "error", planeIds: ["p"] });
    expect(below[0].reference).toContain("R905.10.2");
    // The message names the plane as the estimator did, with its slope.
    expect(below[0].message).toMatch(/; Porch is [0-9.]+:12\./);
  });

  it("below the panel maker's minimum: a warning (e.g. about 3:12 for many snap-lock profiles)", () => {
    const a = find({ planes: [rect(2)], stacks: [{ id: "s", panel: { minPitch: 3 } }] }, "slope-below-maker-minimum");
    expect(a?.severity).toBe("warning");
    expect(a?.planeIds).toEqual(["a"]);
  });

  it("exposed-fastener panels without lap sealant default to the 3:12 minimum (IRC R905.10.2)", () => {
    expect(codes({ planes: [rect(2.5)], stacks: [{ id: "s", panel: { system: "exposed-fastener" } }] })).toContain("slope-below-code-minimum");
  });
});

describe("underlayment", () => {
  it("≥ 140 mph: self-adhered or synthetic gets a warning (IRC 2021 Table R905.1.1(1))", () => {
    const a = find({ site: { wind: { basicWindSpeedMph: 150 } } }, "underlayment-high-wind");
    expect(a?.severity).toBe("warning");
    expect(a?.reference).toContain("R905.1.1");
    expect(codes({ site: { wind: { basicWindSpeedMph: 130 } } })).not.toContain("underlayment-high-wind");
  });

  it("≥ 140 mph, felt from 2:12 to 4:12 needs two layers (IRC 2021 Table R905.1.1(2))", () => {
    const felt = (layers: number) =>
      codes({ planes: [rect(3)], site: { wind: { basicWindSpeedMph: 140 } }, stacks: [{ id: "s", underlayment: { kind: "felt", layers } }] });
    expect(felt(1)).toContain("underlayment-two-layers-required");
    expect(felt(2)).not.toContain("underlayment-two-layers-required");
  });

  it("not high-temperature under metal: warning (common practice)", () => {
    expect(codes({ stacks: [{ id: "s", underlayment: { kind: "self-adhered", highTemp: false } }] })).toContain("underlayment-not-high-temperature");
  });

  it("below 2:12 a mechanically fastened underlayment is unsuited (common practice)", () => {
    expect(codes({ planes: [rect(1)] })).toContain("underlayment-unsuited-to-slope");
    expect(codes({ planes: [rect(1)], stacks: [{ id: "s", underlayment: { kind: "self-adhered" } }] })).not.toContain("underlayment-unsuited-to-slope");
  });
});

describe("ice barrier (IRC 2021 R905.1.2)", () => {
  it("missing where the site has an ice-dam risk: a warning citing local amendments for panels", () => {
    const a = find({ site: { iceDamRisk: true }, stacks: [{ id: "s", underlayment: { iceBarrier: false } }] }, "ice-barrier-missing");
    expect(a?.severity).toBe("warning");
    expect(a?.reference).toContain("R905.1.2");
  });

  it("zone 5+ with the risk unstated asks to confirm", () => {
    expect(codes({ site: { climateZone: "6A" } })).toContain("ice-barrier-confirm");
    expect(codes({ site: { climateZone: "3A" } })).not.toContain("ice-barrier-confirm");
  });
});

describe("spacers, foil and assemblies", () => {
  it("foil facing no air space: error, no radiant credit (ASTM C1158; DOE fact sheet)", () => {
    const foil = (spacer: string, face: string) =>
      codes({ stacks: [{ id: "s", spacer: { kind: spacer }, radiantBarrier: { kind: "foil", position: "on-deck", reflectiveFace: face } }] });
    expect(foil("none", "up")).toContain("foil-faces-no-air-space");
    expect(foil("battens", "down")).toContain("foil-faces-no-air-space");
    expect(foil("battens", "up")).not.toContain("foil-faces-no-air-space");
  });

  it("a spacer under a rated uplift assembly: error asking for engineering review (common practice)", () => {
    const a = find({ site: { wind: { ratedAssemblyRequired: true } }, stacks: [{ id: "s", spacer: { kind: "mesh" } }] }, "spacer-voids-rated-assembly");
    expect(a?.severity).toBe("error");
    expect(codes({ site: { wind: { ratedAssemblyRequired: true } } })).not.toContain("spacer-voids-rated-assembly");
  });

  it("treated battens against metallic-coated steel: warning (common practice)", () => {
    expect(codes({ stacks: [{ id: "s", spacer: { kind: "battens", battens: { treated: true } } }] })).toContain("treated-lumber-contact");
    expect(codes({ stacks: [{ id: "s", spacer: { kind: "battens", battens: { treated: true } }, panel: { substrate: "aluminum" } }] })).not.toContain(
      "treated-lumber-contact",
    );
  });

  it("a thin mat under a cathedral ceiling is a thermal break, not a ventilation channel (Title 24 2008: 3/4 in)", () => {
    expect(codes({ site: { atticType: "cathedral" }, stacks: [{ id: "s", spacer: { kind: "mesh" } }] })).toContain("gap-too-thin-for-ventilation");
    expect(codes({ site: { atticType: "vented" }, stacks: [{ id: "s", spacer: { kind: "mesh" } }] })).not.toContain("gap-too-thin-for-ventilation");
  });

  it("horizontal battens alone block a claimed channel (raised once, by the ventilation module)", () => {
    const c = codes({ stacks: [{ id: "s", spacer: { kind: "battens" }, ventilation: { aboveDeckClaimed: true } }] });
    expect(c.filter((x) => x === "channel-blocked-by-battens")).toHaveLength(1);
  });
});

describe("re-roofing, crickets, transitions, panel length, falls, wind range", () => {
  it("a new roof over two or more layers without tear-off: error (IRC 2021 R908.3.1.1)", () => {
    const a = find({ site: { existingLayers: 2, tearOff: false } }, "reroof-over-two-layers");
    expect(a?.severity).toBe("error");
    expect(codes({ site: { existingLayers: 2, tearOff: true } })).not.toContain("reroof-over-two-layers");
    expect(codes({ site: { existingLayers: 1, tearOff: false } })).not.toContain("reroof-over-two-layers");
  });

  it("a chimney more than 30 in wide across the slope needs a cricket (IRC 2021 R903.2.2)", () => {
    const pl = (widthIn: number) => [{ ...rect(6), penetrations: [{ kind: "chimney", widthIn }] }];
    expect(codes({ planes: pl(36) })).toContain("cricket-required");
    expect(codes({ planes: pl(30) })).not.toContain("cricket-required");
  });

  it("a change of slope gets transition flashing (IRC 2021 R903.2.1)", () => {
    const planes = [rect(4, "low"), { id: "up", pitch: 8, outline: [[0, 10], [20, 10], [20, 16], [0, 16]], eaveEdge: 0, baseElevationFt: 10 / 3 }];
    const r = run({ planes });
    expect(r.advisories.find((a) => a.code === "transition-flashing")?.reference).toBe("IRC 2021 R903.2.1");
    expect(r.materials.find((m) => m.key === "flashing-transition")?.quantity).toBe(3); // 20 ft: ceil(19.75 / 9.75) = 3
  });

  it("panels over 40 ft: warning; over 30 ft: info on expansion (common practice)", () => {
    const long = (run: number) => ({ id: "l", pitch: 4, outline: [[0, 0], [10, 0], [10, run], [0, run]], eaveEdge: 0 });
    expect(codes({ planes: [long(40)] })).toEqual(expect.arrayContaining(["panel-over-max-length", "panel-long-expansion"]));
    const mid = codes({ planes: [long(30)] }); // 30 × 1.0541 = 31.6 ft
    expect(mid).toContain("panel-long-expansion");
    expect(mid).not.toContain("panel-over-max-length");
  });

  it("fall protection at any slope; steep roofs (> 4 in 12) warned (OSHA 1926.501(b)(13), (b)(11), 1926.500(b))", () => {
    expect(codes({ planes: [rect(4)] })).toContain("fall-protection");
    expect(codes({ planes: [rect(4)] })).not.toContain("steep-roof-fall-protection");
    const steep = find({ planes: [rect(4.5)] }, "steep-roof-fall-protection");
    expect(steep?.reference).toContain("1926.501(b)(11)");
  });

  it("pitches beyond 12/12: the wind figures do not apply (ASCE 7-16 roof figures to 45°)", () => {
    expect(codes({ planes: gableRoof(20, 10, 14) })).toContain("pitch-beyond-wind-figures");
    expect(codes({ planes: gableRoof(20, 10, 12) })).not.toContain("pitch-beyond-wind-figures");
  });

  it("every advisory has a code, a severity, a message, a reference and plane ids", () => {
    const r = run({ site: { existingLayers: 3, tearOff: false, climateZone: "2A", coolRoofRequired: true }, planes: [rect(14)] });
    for (const a of r.advisories) {
      expect(a.code).toMatch(/^[a-z0-9-]+$/);
      expect(["error", "warning", "info"]).toContain(a.severity);
      expect(a.message.length).toBeGreaterThan(20);
      expect(a.reference.length).toBeGreaterThan(3);
      expect(Array.isArray(a.planeIds)).toBe(true);
    }
    // errors first
    const sev = r.advisories.map((a) => a.severity);
    expect(sev.indexOf("error")).toBe(0);
  });
});

describe("how messages name the planes", () => {
  it("uses each plane's name, its id when unnamed, and name and id when two planes share a name", () => {
    expect(planeLabels([{ id: "a", name: "Garage" }, { id: "b", name: "  " }, { id: "c", name: "South slope" }, { id: "d", name: "South slope " }])).toEqual([
      "Garage",
      "b",
      "South slope (c)",
      "South slope (d)",
    ]);
  });

  it("names the planes in the takeoff's messages by name, never by a bare id", () => {
    const planes = [...gableRoof(40, 30, 9, { idPrefix: "house" }), ...gableRoof(20, 16, 9, { idPrefix: "shed", origin: [60, 0] })].map((p, i) =>
      i === 0 ? { ...p, name: "Front", penetrations: [{ kind: "chimney", id: "ch1", widthIn: 40, lengthIn: 24 }] } : p,
    );
    const result = run({ planes });
    const steep = result.advisories.find((a) => a.code === "steep-roof-fall-protection")!;
    // Both buildings have a "North slope": those two carry their ids too; the one "South slope" left does not.
    expect(steep.message).toContain("Steep roof (over 4 in 12): Front, North slope (house-n), South slope, North slope (shed-n).");
    expect(steep.planeIds).toEqual(["house-s", "house-n", "shed-s", "shed-n"]);
    const cricket = result.advisories.find((a) => a.code === "cricket-required")!;
    expect(cricket.message).toContain('chimney "ch1" on Front (40 in wide)');
  });

  it("names at most eight planes and counts the rest, while planeIds lists every one", () => {
    const planes = Array.from({ length: 11 }, (_, i) => ({ id: `p${i}`, label: `Slope ${i}`, pitch: 6 }));
    const steep = fallProtectionAdvisories(planes).find((a) => a.code === "steep-roof-fall-protection")!;
    expect(MAX_NAMED_IN_MESSAGE).toBe(8);
    expect(steep.message).toContain("Steep roof (over 4 in 12): Slope 0, Slope 1, Slope 2, Slope 3, Slope 4, Slope 5, Slope 6, Slope 7 and 3 more.");
    expect(steep.planeIds).toHaveLength(11);
  });
});

describe("message wording", () => {
  it("lists zones in words and agrees the verb with the spacer", () => {
    const one = clipSpacingBattenAdvisory([{ planeId: "a", zones: ["3"] }], 24)[0];
    expect(one.message).toContain("asks for closer spacing in zone 3.");
    const two = clipSpacingBattenAdvisory([{ planeId: "a", zones: ["3", "2"] }, { planeId: "b", zones: ["2"] }], 24)[0];
    expect(two.message).toContain("asks for closer spacing in zones 2 and 3.");
    expect(two.planeIds).toEqual(["a", "b"]);
    expect(ratedAssemblyAdvisory({ required: true, spacerKind: "battens", planeIds: ["a"] })[0].message).toContain("battens between the deck and the panels are not part");
    expect(ratedAssemblyAdvisory({ required: true, spacerKind: "mesh", planeIds: ["a"] })[0].message).toContain("a mesh mat between the deck and the panels is not part");
  });
});
