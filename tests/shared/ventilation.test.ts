import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  aboveDeckChannel,
  climateZoneNumber,
  computeVentilation,
  requiredAtticNfa,
  type ChannelResult,
  type VentilationInput,
} from "@shared/engine/ventilation";

const open = { eaveOpen: true, topOpen: true };

describe("attic net free area", () => {
  it("uses 1/150, or 1/300 under the exception", () => {
    // IRC 2021 R806.2: 1200 ft² × 144 / 150 = 1152 in²; / 300 = 576 in²
    expect(requiredAtticNfa({ ventedAreaSqFt: 1200, exception: false }).requiredSqIn).toBeCloseTo(1152, 10);
    expect(requiredAtticNfa({ ventedAreaSqFt: 1200, exception: true }).requiredSqIn).toBeCloseTo(576, 10);
    // IRC 2021 R806.2: 1500 ft² → 1440 / 720 in²
    expect(requiredAtticNfa({ ventedAreaSqFt: 1500, exception: false }).requiredSqIn).toBeCloseTo(1440, 10);
    expect(requiredAtticNfa({ ventedAreaSqFt: 1500, exception: true }).requiredSqIn).toBeCloseTo(720, 10);
    // IRC 2021 R806.2: 2000 ft² → 1920 / 960 in²
    expect(requiredAtticNfa({ ventedAreaSqFt: 2000, exception: false }).requiredSqIn).toBeCloseTo(1920, 10);
    expect(requiredAtticNfa({ ventedAreaSqFt: 2000, exception: true }).requiredSqIn).toBeCloseTo(960, 10);
  });

  it("splits the requirement evenly between intake and exhaust", () => {
    // common practice, no published source: half low, half high; 1440 / 2 = 720
    const r = requiredAtticNfa({ ventedAreaSqFt: 1500, exception: false });
    expect(r).toEqual({ requiredSqIn: 1440, ratio: 150, intakeRequiredSqIn: 720, exhaustRequiredSqIn: 720 });
    expect(requiredAtticNfa({ ventedAreaSqFt: 1500, exception: true }).ratio).toBe(300);
  });

  it("scales linearly with area (property)", () => {
    // IRC 2021 R806.2: the requirement is a fixed share of the vented space
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1e5, noNaN: true }), (a) => {
        const r150 = requiredAtticNfa({ ventedAreaSqFt: a, exception: false }).requiredSqIn;
        const r300 = requiredAtticNfa({ ventedAreaSqFt: a, exception: true }).requiredSqIn;
        expect(r150).toBeCloseTo((a * 144) / 150, 6);
        expect(r150).toBeCloseTo(2 * r300, 6);
      }),
    );
  });

  it("reads IECC climate zone numbers", () => {
    expect(climateZoneNumber("6A")).toBe(6);
    expect(climateZoneNumber("7")).toBe(7);
    expect(climateZoneNumber("junk")).toBeNull();
  });
});

describe("above-deck channel", () => {
  it("counter-battens make the channel: 1x4 at 24 in", () => {
    // t × 12 × (1 − w/s) with NIST PS 20 1x4 = 0.75 × 3.5 in: 0.75 × 12 × (1 − 3.5/24) = 9 × 0.854167 = 7.6875 in²/ft
    const c = aboveDeckChannel({ kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: true } }, open);
    expect(c.channelNfaPerFtSqIn).toBeCloseTo(7.69, 2);
    // gap = counter-batten + batten = 0.75 + 0.75 = 1.5 in (NIST PS 20 dressed 1x)
    expect(c.gapIn).toBeCloseTo(1.5, 12);
    expect(c.channelHeightIn).toBeCloseTo(0.75, 12);
    expect(c.continuous).toBe(true);
    // California Title 24 (2008) re-roof alternative / ORNL: at least 3/4 in, open at both ends → qualifies
    expect(c.qualifies).toBe(true);
    expect(c.reasons).toEqual([]);
  });

  it("uses the counter-batten's own size and spacing when given", () => {
    // NIST PS 20: 2x2 = 1.5 × 1.5 in; at 16 in: 1.5 × 12 × (1 − 1.5/16) = 18 × 0.90625 = 16.3125 in²/ft
    // gap = 1.5 (2x2) + 0.75 (1x3 batten) = 2.25 in
    const c = aboveDeckChannel(
      { kind: "battens", battens: { nominal: "1x3", spacingIn: 12, counterBattens: true, counterBattenNominal: "2x2", counterBattenSpacingIn: 16 } },
      open,
    );
    expect(c.channelNfaPerFtSqIn).toBeCloseTo(16.3125, 10);
    expect(c.gapIn).toBeCloseTo(2.25, 12);
    expect(c.channelHeightIn).toBeCloseTo(1.5, 12);
  });

  it("horizontal battens alone block the channel", () => {
    // horizontal battens close the air path at every row (California Title 24 2008 re-roof alternative requires a continuous 3/4 in space)
    const c = aboveDeckChannel({ kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: false } }, open);
    expect(c.continuous).toBe(false);
    expect(c.channelNfaPerFtSqIn).toBe(0);
    // NIST PS 20: 1x = 3/4 in
    expect(c.gapIn).toBe(0.75);
    expect(c.qualifies).toBe(false);
    expect(c.blockedByBattens).toBe(true);
    expect(c.reasons.join(" ")).toMatch(/counter-battens/);
  });

  it("mesh and dimpled sheet are continuous but too thin to qualify", () => {
    // mesh 0.3 in (common practice), open fraction 0.8 (from memory): 0.3 × 12 × 0.8 = 2.88 in²/ft
    const mesh = aboveDeckChannel({ kind: "mesh" }, open);
    expect(mesh.gapIn).toBeCloseTo(0.3, 12);
    expect(mesh.channelNfaPerFtSqIn).toBeCloseTo(2.88, 10);
    expect(mesh.continuous).toBe(true);
    // California Title 24 (2008) / ORNL: below 3/4 in does not qualify
    expect(mesh.qualifies).toBe(false);
    expect(mesh.reasons.join(" ")).toMatch(/3\/4 in/);
    // dimpled 0.4 in (common practice), open fraction 0.6 (from memory): 0.4 × 12 × 0.6 = 2.88 in²/ft
    const dimpled = aboveDeckChannel({ kind: "dimpled" }, open);
    expect(dimpled.gapIn).toBeCloseTo(0.4, 12);
    expect(dimpled.channelNfaPerFtSqIn).toBeCloseTo(2.88, 10);
    // a thick mat given by the stack: 1.0 × 12 × 0.5 = 6 in²/ft and qualifies (≥ 3/4 in)
    const thick = aboveDeckChannel({ kind: "mesh", thicknessIn: 1, openFraction: 0.5 }, open);
    expect(thick.channelNfaPerFtSqIn).toBeCloseTo(6, 10);
    expect(thick.qualifies).toBe(true);
  });

  it("a channel closed at either end does not qualify", () => {
    // California Title 24 (2008) re-roof alternative / ORNL: air must enter at the eave and leave at the top
    const spacer = { kind: "battens" as const, battens: { nominal: "1x4" as const, spacingIn: 24, counterBattens: true } };
    const noEave = aboveDeckChannel(spacer, { eaveOpen: false, topOpen: true });
    expect(noEave.qualifies).toBe(false);
    expect(noEave.reasons.join(" ")).toMatch(/eave/);
    const noTop = aboveDeckChannel(spacer, { eaveOpen: true, topOpen: false });
    expect(noTop.qualifies).toBe(false);
    expect(noTop.reasons.join(" ")).toMatch(/top/);
  });

  it("no spacer: no gap", () => {
    const c = aboveDeckChannel({ kind: "none" }, open);
    expect(c).toMatchObject({ gapIn: 0, channelHeightIn: 0, continuous: false, qualifies: false, channelNfaPerFtSqIn: 0 });
    expect(c.reasons.length).toBeGreaterThan(0);
  });
});

const noChannel: ChannelResult = aboveDeckChannel({ kind: "none" }, open);

/** 1500 ft² attic, one 40 ft ridge, 80 ft of eave, 9 in²/ft intake and 18 in²/ft exhaust products. */
const scenario = (over: Partial<VentilationInput> = {}, site: Partial<VentilationInput["site"]> = {}): VentilationInput => ({
  site: { atticType: "vented", atticFloorAreaSqFt: 1500, ...site },
  roofPlanAreaSqFt: 1800,
  ridgeLf: 40,
  ridgeSegments: 1,
  hipLf: 0,
  headwallLf: 0,
  eaveLf: 80,
  intakeNfaPerFtSqIn: 9,
  exhaustNfaPerFtSqIn: 18,
  aboveDeckClaimed: false,
  channel: noChannel,
  planeIds: ["a", "b"],
  ...over,
});
const codes = (r: ReturnType<typeof computeVentilation>) => r.advisories.map((a) => a.code);

describe("computeVentilation", () => {
  it("works a gable attic by hand", () => {
    // IRC 2021 R806.2: 1500 × 144 / 150 = 1440 in², 720 low and 720 high (half each: common practice)
    // exhaust LF = 40 − 1 − 1 = 38 ft (1 ft short of each ridge end: common practice) → 38 × 18 = 684 in²
    // intake = 80 × 9 = 720 in²
    const out = computeVentilation(scenario());
    expect(out.result).toMatchObject({
      mode: "attic",
      ventedAreaSqFt: 1500,
      ventedAreaEstimated: false,
      ratio: 150,
      requiredNfaSqIn: 1440,
      intakeRequiredSqIn: 720,
      exhaustRequiredSqIn: 720,
      exhaustLf: 38,
      intakeLf: 80,
      exhaustProvidedSqIn: 684,
      intakeProvidedSqIn: 720,
      balanced: true,
    });
    // 684 < 720 → short (IRC 2021 R806.2)
    const short = out.advisories.find((a) => a.code === "ventilation-short");
    expect(short?.severity).toBe("warning");
    expect(short?.reference).toMatch(/R806\.2/);
    expect(short?.planeIds).toEqual(["a", "b"]);
    expect(codes(out)).not.toContain("ventilation-unbalanced");
  });

  it("passes with enough ridge and flags intake below exhaust", () => {
    // two ridges 30 + 20 ft: 50 − 2 × 2 = 46 ft × 18 = 828 in² ≥ 720; intake 70 × 10 = 700 < 720 → short;
    // intake 700 < exhaust 828 → unbalanced (common practice)
    const out = computeVentilation(scenario({ ridgeLf: 50, ridgeSegments: 2, eaveLf: 70, intakeNfaPerFtSqIn: 10 }));
    expect(out.result.exhaustLf).toBe(46);
    expect(out.result.exhaustProvidedSqIn).toBe(828);
    expect(out.result.balanced).toBe(false);
    expect(codes(out)).toContain("ventilation-short");
    const un = out.advisories.find((a) => a.code === "ventilation-unbalanced");
    expect(un?.severity).toBe("info");
    expect(un?.reference).toBe("common practice");
    // enough of both: 46 × 18 = 828 and 100 × 9 = 900 → nothing short or unbalanced
    const ok = computeVentilation(scenario({ ridgeLf: 50, ridgeSegments: 2, eaveLf: 100 }));
    expect(codes(ok)).not.toContain("ventilation-short");
    expect(codes(ok)).not.toContain("ventilation-unbalanced");
  });

  it("estimates the vented area from the roof plan when the attic area is missing", () => {
    // IRC 2021 R806.2 on the plan area: 1800 × 144 / 150 = 1728 in²
    const out = computeVentilation(scenario({}, { atticFloorAreaSqFt: undefined }));
    expect(out.result.ventedAreaSqFt).toBe(1800);
    expect(out.result.ventedAreaEstimated).toBe(true);
    expect(out.result.requiredNfaSqIn).toBeCloseTo(1728, 10);
    expect(out.advisories.find((a) => a.code === "vent-area-estimated")?.severity).toBe("info");
  });

  it("counts hips and headwalls only when marked vented", () => {
    // exhaust LF = 38 (ridge) + 30 (hips, vented) + 10 (headwall, not vented) = 68 ft
    const out = computeVentilation(scenario({ hipLf: 30, headwallLf: 10, ventHips: true }));
    expect(out.result.exhaustLf).toBe(68);
    const both = computeVentilation(scenario({ hipLf: 30, headwallLf: 10, ventHips: true, ventHeadwalls: true }));
    expect(both.result.exhaustLf).toBe(78);
  });

  it("warns when a hip roof's ridge cannot carry the exhaust", () => {
    // common practice: 12 ft ridge → 10 ft × 18 = 180 in² < 720 in² needed high
    const out = computeVentilation(scenario({ ridgeLf: 12, hipLf: 60 }));
    const a = out.advisories.find((x) => x.code === "hip-ridge-too-short-for-exhaust");
    expect(a?.severity).toBe("warning");
    expect(a?.reference).toBe("common practice");
    // vented hips carrying the rest: 10 + 60 = 70 ft × 18 = 1260 ≥ 720 → no warning
    const vented = computeVentilation(scenario({ ridgeLf: 12, hipLf: 60, ventHips: true }));
    expect(codes(vented)).not.toContain("hip-ridge-too-short-for-exhaust");
    // a gable (no hips) does not raise it
    expect(codes(computeVentilation(scenario({ ridgeLf: 12 })))).not.toContain("hip-ridge-too-short-for-exhaust");
  });

  it("checks the exception's upper-vent share and vapor retarder", () => {
    // IRC 2021 R806.2 exception: 1500 × 144 / 300 = 720 in²; upper vents 40–50 % = 288–360 in²
    // exhaust 38 × 18 = 684 in² = 95 % → outside 40–50 %
    const out = computeVentilation(scenario({}, { ventException: true }));
    expect(out.result.ratio).toBe(300);
    expect(out.result.requiredNfaSqIn).toBe(720);
    const share = out.advisories.find((a) => a.code === "vent-exception-exhaust-share");
    expect(share?.severity).toBe("warning");
    expect(share?.reference).toMatch(/R806\.2 exception/);
    // exhaust 18 ft × 18 = 324 in² = 45 % (inside), intake 80 × 9 = 720: total 1044 ≥ 720 → no share or short warning
    const good = computeVentilation(scenario({ ridgeLf: 20 }, { ventException: true }));
    expect(good.result.exhaustProvidedSqIn).toBe(324);
    expect(codes(good)).not.toContain("vent-exception-exhaust-share");
    expect(codes(good)).not.toContain("ventilation-short");
    // IRC 2021 R806.2 exception: climate zones 6–8 need a Class I or II vapor retarder
    const cold = computeVentilation(scenario({ ridgeLf: 20 }, { ventException: true, climateZone: "6A" }));
    expect(cold.advisories.find((a) => a.code === "vent-exception-vapor-retarder")?.severity).toBe("warning");
    const coldOk = computeVentilation(scenario({ ridgeLf: 20 }, { ventException: true, climateZone: "6A", vaporRetarder: true }));
    expect(codes(coldOk)).not.toContain("vent-exception-vapor-retarder");
    const mild = computeVentilation(scenario({ ridgeLf: 20 }, { ventException: true, climateZone: "4A" }));
    expect(codes(mild)).not.toContain("vent-exception-vapor-retarder");
  });

  it("requires no net free area for an unvented attic", () => {
    // IRC 2021 R806.5: unvented attic assemblies need no vent area
    const out = computeVentilation(scenario({}, { atticType: "unvented" }));
    expect(out.result).toMatchObject({ mode: "unvented", requiredNfaSqIn: 0, intakeRequiredSqIn: 0, exhaustRequiredSqIn: 0, ratio: null });
    expect(codes(out)).not.toContain("ventilation-short");
    expect(codes(out)).not.toContain("vent-area-estimated");
  });

  it("treats a cathedral ceiling as vented space", () => {
    // IRC 2021 R806.2 over the rafter-space area, R806.3 1 in air space: 1500 × 144 / 150 = 1440
    const out = computeVentilation(scenario({}, { atticType: "cathedral" }));
    expect(out.result.mode).toBe("cathedral");
    expect(out.result.requiredNfaSqIn).toBe(1440);
    expect(out.advisories.find((a) => a.code === "cathedral-vent-space")?.reference).toMatch(/R806\.3/);
  });

  it("errors when claimed above-deck ventilation is blocked or does not qualify", () => {
    const battens = aboveDeckChannel({ kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: false } }, open);
    const blocked = computeVentilation(scenario({ aboveDeckClaimed: true, channel: battens }));
    const b = blocked.advisories.find((a) => a.code === "channel-blocked-by-battens");
    expect(b?.severity).toBe("error");
    // one finding for the batten case, not two
    expect(codes(blocked)).not.toContain("channel-does-not-qualify");

    const mesh = aboveDeckChannel({ kind: "mesh" }, open);
    const thin = computeVentilation(scenario({ aboveDeckClaimed: true, channel: mesh }));
    const t = thin.advisories.find((a) => a.code === "channel-does-not-qualify");
    expect(t?.severity).toBe("error");
    // California Title 24 (2008) re-roof alternative; ORNL 3/4 in
    expect(t?.reference).toMatch(/Title 24 \(2008\)/);
    expect(t?.reference).toMatch(/ORNL/);
    expect(thin.result.aboveDeck).toMatchObject({ gapIn: 0.3, continuous: true, qualifies: false });

    // not claimed: no error
    expect(codes(computeVentilation(scenario({ channel: mesh })))).not.toContain("channel-does-not-qualify");
  });

  it("never counts the channel toward the attic's vent area", () => {
    // IRC 2021 R806.3 (vents below the deck with 1 in air space) / R806.5 (unvented)
    const cb = aboveDeckChannel({ kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: true } }, open);
    const out = computeVentilation(scenario({ aboveDeckClaimed: true, channel: cb }));
    // the channel's 7.69 in²/ft × 80 ft eave adds nothing: intake stays 80 × 9 = 720
    expect(out.result.intakeProvidedSqIn).toBe(720);
    expect(out.result.aboveDeck.qualifies).toBe(true);
    const a = out.advisories.find((x) => x.code === "channel-not-attic-ventilation");
    expect(a?.severity).toBe("info");
    expect(a?.reference).toMatch(/R806\.3/);
    expect(codes(out)).not.toContain("channel-does-not-qualify");
  });
});
