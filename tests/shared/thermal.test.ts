import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  airSpaceResistance,
  agedReflectance,
  BUILDING_MATERIAL_EMITTANCE,
  computeThermal,
  coolRoofCheck,
  dewPointC,
  dewPointF,
  effectiveEmittance,
  FOIL_EMITTANCE,
  foilFacesGap,
  isHumidClimateZone,
  solarReflectanceIndex,
  surfaceTemperatureK,
  IP_PER_SI_R,
  type ThermalInput,
} from "@shared/engine/thermal";

const MM = 1 / 25.4; // inches per mm

describe("effective emittance", () => {
  it("matches the handbook's worked values", () => {
    // ASHRAE Handbook—Fundamentals 2021 ch. 26 Table 3 note: 1/E = 1/e1 + 1/e2 − 1
    // 1/E = 1/0.05 + 1/0.90 − 1 = 20 + 1.1111 − 1 = 20.1111 → E = 0.0497
    expect(effectiveEmittance(0.05, 0.9)).toBeCloseTo(0.0497, 4);
    // 1/E = 1.1111 + 1.1111 − 1 = 1.2222 → E = 0.818 (ASHRAE 2021 ch. 26 Table 2: 0.90 / 0.90 → 0.82)
    expect(effectiveEmittance(0.9, 0.9)).toBeCloseTo(0.818, 3);
    // 1/E = 33.333 + 1.1111 − 1 = 33.444 → E = 0.0299
    expect(effectiveEmittance(0.03, 0.9)).toBeCloseTo(0.0299, 4);
  });

  it("uses the handbook's surface emittances for foil and building materials", () => {
    // ASHRAE Handbook—Fundamentals 2021 ch. 26 Table 2: bright aluminium foil 0.05; building materials 0.90
    expect(FOIL_EMITTANCE).toBe(0.05);
    expect(BUILDING_MATERIAL_EMITTANCE).toBe(0.9);
  });

  it("is symmetric and never above the lower face emittance (property)", () => {
    // follows from 1/E = 1/e1 + 1/e2 − 1 with 1/e ≥ 1 (ASHRAE 2021 ch. 26 Table 3 note)
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 1, noNaN: true }), fc.double({ min: 0.01, max: 1, noNaN: true }), (a, b) => {
        const e = effectiveEmittance(a, b);
        expect(e).toBeCloseTo(effectiveEmittance(b, a), 12);
        expect(e).toBeLessThanOrEqual(Math.min(a, b) + 1e-12);
        expect(e).toBeGreaterThan(0);
      }),
    );
  });
});

describe("enclosed air-space resistance", () => {
  const r = (gapIn: number, e: number, heatFlow: "down" | "up", roofAngleDeg = 0) =>
    airSpaceResistance({ gapIn, effectiveEmittance: e, heatFlow, roofAngleDeg });

  it("returns the table's corner values exactly", () => {
    // ASHRAE Handbook—Fundamentals 2021 ch. 26 Table 3, horizontal, heat flow down, 90 °F mean / 10 °F difference:
    // 20 mm (0.75 in), E 0.05 → 3.29 h·ft²·°F/Btu = 3.29 / 5.678 = 0.579 m²·K/W
    const a = r(20 * MM, 0.05, "down");
    expect(a.rIp).toBeCloseTo(3.29, 10);
    expect(a.rSi).toBeCloseTo(3.29 / 5.678, 10);
    expect(a.extrapolated).toBe(false);
    // same table, horizontal down, 90 mm, E 0.03 → 10.05; 13 mm, E 0.82 → 0.79
    expect(r(90 * MM, 0.03, "down").rIp).toBeCloseTo(10.05, 10);
    expect(r(13 * MM, 0.82, "down").rIp).toBeCloseTo(0.79, 10);
    // same table, 45° slope, heat flow down, 40 mm, E 0.05 → 4.54; 90 mm, E 0.2 → 2.50
    expect(r(40 * MM, 0.05, "down", 45).rIp).toBeCloseTo(4.54, 10);
    expect(r(90 * MM, 0.2, "down", 45).rIp).toBeCloseTo(2.5, 10);
    // same table, horizontal, heat flow up, 50 °F mean: 40 mm, E 0.5 → 1.19; 90 mm, E 0.05 → 2.67
    expect(r(40 * MM, 0.5, "up").rIp).toBeCloseTo(1.19, 10);
    expect(r(90 * MM, 0.05, "up").rIp).toBeCloseTo(2.67, 10);
  });

  it("interpolates linearly in thickness", () => {
    // ASHRAE 2021 ch. 26 Table 3, horizontal down, E 0.05: 20 mm 3.29, 40 mm 5.34;
    // 30 mm is halfway: 3.29 + 0.5 × (5.34 − 3.29) = 4.315
    expect(r(30 * MM, 0.05, "down").rIp).toBeCloseTo(4.315, 10);
  });

  it("interpolates linearly in emittance", () => {
    // ASHRAE 2021 ch. 26 Table 3, horizontal up, 20 mm: E 0.2 → 1.70, E 0.5 → 1.14;
    // E 0.35 is halfway: (1.70 + 1.14) / 2 = 1.42
    expect(r(20 * MM, 0.35, "up").rIp).toBeCloseTo(1.42, 10);
  });

  it("interpolates in thickness and emittance together", () => {
    // ASHRAE 2021 ch. 26 Table 3, horizontal down: 20 mm row at E 0.35 = (2.10 + 1.19)/2 = 1.645;
    // 40 mm row at E 0.35 = (2.78 + 1.42)/2 = 2.10; 30 mm = (1.645 + 2.10)/2 = 1.8725
    expect(r(30 * MM, 0.35, "down").rIp).toBeCloseTo(1.8725, 10);
  });

  it("interpolates heat flow down in roof angle between the horizontal and 45° rows", () => {
    // ASHRAE 2021 ch. 26 Table 3, down, 40 mm, E 0.05: horizontal 5.34, 45° 4.54;
    // at 22.5°: (5.34 + 4.54) / 2 = 4.94
    expect(r(40 * MM, 0.05, "down", 22.5).rIp).toBeCloseTo(4.94, 10);
    // angle clamped to 0..45: 60° uses the 45° row (4.54), −5° the horizontal row (5.34)
    expect(r(40 * MM, 0.05, "down", 60).rIp).toBeCloseTo(4.54, 10);
    expect(r(40 * MM, 0.05, "down", -5).rIp).toBeCloseTo(5.34, 10);
  });

  it("uses the horizontal heat-flow-up rows at every angle", () => {
    // ASHRAE 2021 ch. 26 Table 3, horizontal up, 40 mm, E 0.05 → 2.38 (applied to sloped roofs too)
    expect(r(40 * MM, 0.05, "up", 0).rIp).toBeCloseTo(2.38, 10);
    expect(r(40 * MM, 0.05, "up", 45).rIp).toBeCloseTo(2.38, 10);
  });

  it("clamps thickness above 90 mm and emittance to 0.03..0.82", () => {
    // ASHRAE 2021 ch. 26 Table 3 stops at 90 mm: a 5 in gap takes the 90 mm, E 0.82 value 1.02 (horizontal down)
    const thick = r(5, 0.82, "down");
    expect(thick.rIp).toBeCloseTo(1.02, 10);
    expect(thick.clampedThickness).toBe(true);
    // E 0.9 is outside the table's columns: the E 0.82 column is used (20 mm horizontal down → 0.85)
    const hiE = r(20 * MM, 0.9, "down");
    expect(hiE.rIp).toBeCloseTo(0.85, 10);
    expect(hiE.clampedEmittance).toBe(true);
    // E 0.01 → the E 0.03 column (20 mm horizontal down → 3.52)
    expect(r(20 * MM, 0.01, "down").rIp).toBeCloseTo(3.52, 10);
  });

  it("uses the table footnote formula below 13 mm and marks it extrapolated", () => {
    // ASHRAE 2021 ch. 26 Table 3 footnote: R = 1/(h_c + E·h_r), h_c = 21.8(1 + 0.00274 t_m)/l, h_r ≈ 0.227((t_m+273)/100)³
    // Summer, gap 0.25 in = 6.35 mm, t_m = 90 °F = 32.22 °C, E = 0.82:
    //   h_c = 21.8 × (1 + 0.00274 × 32.22) / 6.35 = 21.8 × 1.08829 / 6.35 = 3.7362
    //   h_r = 0.227 × 3.0522³ = 0.227 × 28.435 = 6.4547
    //   R = 1 / (3.7362 + 0.82 × 6.4547) = 1 / 9.0290 = 0.11075 m²·K/W × 5.678 = 0.6289 h·ft²·°F/Btu
    const s = r(0.25, 0.82, "down", 20);
    expect(s.extrapolated).toBe(true);
    expect(s.rSi).toBeCloseTo(0.11075, 4);
    expect(s.rIp).toBeCloseTo(0.6289, 3);
    // Winter, 6.35 mm, t_m = 50 °F = 10 °C, E = 0.0497:
    //   h_c = 21.8 × 1.0274 / 6.35 = 3.5271; h_r = 0.227 × 2.83³ = 5.1450
    //   R = 1 / (3.5271 + 0.0497 × 5.1450) = 1 / 3.7828 = 0.26435 m²·K/W × 5.678 = 1.5010
    const w = r(0.25, 0.0497, "up");
    expect(w.extrapolated).toBe(true);
    expect(w.rSi).toBeCloseTo(0.26435, 4);
    expect(w.rIp).toBeCloseTo(1.501, 3);
  });

  it("gives 0 with no gap", () => {
    expect(r(0, 0.82, "down")).toMatchObject({ rIp: 0, rSi: 0, extrapolated: false });
    expect(r(-1, 0.82, "up").rIp).toBe(0);
  });

  it("converts with 1 m²·K/W = 5.678 h·ft²·°F/Btu", () => {
    // ASHRAE Handbook—Fundamentals 2021 ch. 26 (R-value conversion factor 5.678)
    expect(IP_PER_SI_R).toBe(5.678);
  });

  it("never beats still air's conduction limit (table values are h·ft²·°F/Btu, property)", () => {
    // Still air conducts about 0.025 W/(m·K) near room temperature (from memory); with k ≥ 0.020 W/(m·K),
    // no radiation and no convection, R(SI) ≤ l / 0.020. The table's 10.05 read as m²·K/W would break this.
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 3.5, noNaN: true }),
        fc.double({ min: 0.03, max: 0.82, noNaN: true }),
        fc.constantFrom<"down" | "up">("down", "up"),
        fc.double({ min: 0, max: 45, noNaN: true }),
        (gapIn, e, flow, angle) => {
          const res = r(gapIn, e, flow, angle);
          expect(res.rSi).toBeLessThanOrEqual((gapIn * 0.0254) / 0.02);
        },
      ),
    );
  });

  it("is non-increasing in emittance (property)", () => {
    // every row of ASHRAE 2021 ch. 26 Table 3 falls as E rises; the footnote formula does too
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.constantFrom<"down" | "up">("down", "up"),
        fc.double({ min: 0, max: 60, noNaN: true }),
        (gapIn, e1, e2, flow, angle) => {
          const [lo, hi] = e1 <= e2 ? [e1, e2] : [e2, e1];
          expect(r(gapIn, hi, flow, angle).rIp).toBeLessThanOrEqual(r(gapIn, lo, flow, angle).rIp + 1e-12);
        },
      ),
    );
  });
});

describe("Solar Reflectance Index", () => {
  it("finds the standard black and white surface temperatures", () => {
    // ASTM E1980-11, medium wind hc = 12: standard black (0.05 / 0.90) Tb ≈ 355.6 K, white (0.80 / 0.90) Tw ≈ 317.8 K
    expect(Math.abs(surfaceTemperatureK(0.05, 0.9) - 355.6)).toBeLessThanOrEqual(0.1);
    expect(Math.abs(surfaceTemperatureK(0.8, 0.9) - 317.8)).toBeLessThanOrEqual(0.1);
  });

  it("solves the surface energy balance", () => {
    // ASTM E1980-11: αI = εσ(Ts⁴ − Tsky⁴) + hc(Ts − Ta), I 1000, Ta 310, Tsky 300, σ 5.66961e-8
    const ts = surfaceTemperatureK(0.3, 0.85, 12);
    const residual = 0.7 * 1000 - (0.85 * 5.66961e-8 * (ts ** 4 - 300 ** 4) + 12 * (ts - 310));
    expect(Math.abs(residual)).toBeLessThan(1e-6);
  });

  it("gives 0 for black, 100 for white and 5 for the worked example", () => {
    // ASTM E1980-11: the standard black is SRI 0, the standard white SRI 100
    expect(solarReflectanceIndex(0.05, 0.9)).toBeCloseTo(0, 8);
    expect(solarReflectanceIndex(0.8, 0.9)).toBeCloseTo(100, 8);
    // ASTM E1980-11 worked example: reflectance 0.09, emittance 0.90 → SRI 5.0
    expect(Math.abs(solarReflectanceIndex(0.09, 0.9) - 5)).toBeLessThanOrEqual(0.5);
  });

  it("rises with reflectance (property)", () => {
    // ASTM E1980-11: a more reflective surface runs cooler, so its SRI is higher
    fc.assert(
      fc.property(fc.double({ min: 0, max: 0.95, noNaN: true }), fc.double({ min: 0.01, max: 0.04, noNaN: true }), fc.double({ min: 0.1, max: 1, noNaN: true }), (rho, d, eps) => {
        expect(solarReflectanceIndex(rho + d, eps)).toBeGreaterThan(solarReflectanceIndex(rho, eps));
      }),
    );
  });
});

describe("cool-roof checks", () => {
  it("estimates aged reflectance", () => {
    // California Title 24 estimate: aged = 0.2 + 0.7 (ρ − 0.2); 0.30 → 0.2 + 0.07 = 0.27; 0.20 → 0.20
    expect(agedReflectance(0.3)).toBeCloseTo(0.27, 12);
    expect(agedReflectance(0.2)).toBeCloseTo(0.2, 12);
  });

  it("passes a light finish and fails a dark one", () => {
    // Title 24 steep slope: aged SR ≥ 0.20 with TE ≥ 0.75, or SRI ≥ 16; former ENERGY STAR steep slope: initial SR ≥ 0.25
    // 0.30 / 0.85: aged 0.27 ≥ 0.20 with 0.85 ≥ 0.75 → Title 24 met; initial 0.30 ≥ 0.25 → ENERGY STAR met
    const light = coolRoofCheck({ solarReflectance: 0.3, thermalEmittance: 0.85 });
    expect(light).toMatchObject({ title24SteepSlope: true, energyStarSteepSlope: true, meets: true, agedEstimated: true });
    // 0.10 / 0.85: aged 0.2 + 0.7 × (−0.10) = 0.13 < 0.20; aged SRI ≈ 10 < 16 → not met; initial 0.10 < 0.25
    const dark = coolRoofCheck({ solarReflectance: 0.1, thermalEmittance: 0.85 });
    expect(dark.agedSolarReflectance).toBeCloseTo(0.13, 12);
    expect(dark.agedSri).toBeLessThan(16);
    expect(dark).toMatchObject({ title24SteepSlope: false, energyStarSteepSlope: false, meets: false });
  });

  it("lets a low-emittance finish pass Title 24 only through SRI", () => {
    // Title 24: aged SR 0.40 with TE 0.50 fails the TE ≥ 0.75 branch; SRI(0.40, 0.50) ≈ 32 ≥ 16 passes
    const bare = coolRoofCheck({ solarReflectance: 0.4, thermalEmittance: 0.5, agedKnown: true });
    expect(bare.agedSri).toBeGreaterThanOrEqual(16);
    expect(bare.title24SteepSlope).toBe(true);
    // aged 0.40 ≥ 0.25, and initial ≥ aged, so the former ENERGY STAR level is met
    expect(bare.energyStarSteepSlope).toBe(true);
    // aged known at 0.22: the initial value is unknown, the ENERGY STAR result is unknown
    expect(coolRoofCheck({ solarReflectance: 0.22, thermalEmittance: 0.9, agedKnown: true }).energyStarSteepSlope).toBeNull();
  });
});

describe("dew point", () => {
  it("matches the Magnus formula check values", () => {
    // Alduchov & Eskridge 1996 (Magnus, a 17.625, b 243.04 °C): 80 °F / 80 % → 73.3 °F
    expect(dewPointF(80, 80)).toBeCloseTo(73.3, 1);
    // 70 °F / 50 % → 50.5 °F
    expect(dewPointF(70, 50)).toBeCloseTo(50.5, 1);
    // 20 °C / 50 % → 9.26 °C
    expect(dewPointC(20, 50)).toBeCloseTo(9.26, 2);
    // saturated air: dew point equals air temperature
    expect(dewPointC(25, 100)).toBeCloseTo(25, 10);
  });

  it("rejects impossible humidity", () => {
    expect(() => dewPointC(20, 0)).toThrow(RangeError);
    expect(() => dewPointC(20, 120)).toThrow(RangeError);
  });
});

describe("foil facing the gap", () => {
  it("faces the gap only on the deck facing up or under the panels facing down, with a gap", () => {
    // ASTM C1158; DOE radiant barrier fact sheet: a radiant barrier works only facing an air space
    expect(foilFacesGap("on-deck", "up", 0.75)).toBe(true);
    expect(foilFacesGap("under-panels", "down", 0.75)).toBe(true);
    expect(foilFacesGap("on-deck", "down", 0.75)).toBe(false);
    expect(foilFacesGap("under-panels", "up", 0.75)).toBe(false);
    expect(foilFacesGap("on-deck", "up", 0)).toBe(false);
    expect(foilFacesGap("under-panels", "down", 0)).toBe(false);
  });
});

describe("computeThermal", () => {
  const base: ThermalInput = {
    gapIn: 20 / 25.4,
    gapVentilated: false,
    pitch: 0,
    foil: null,
    panelUndersideEmittance: 0.9,
    solarReflectance: 0.3,
    thermalEmittance: 0.85,
  };

  it("reports no R without a gap", () => {
    const { result } = computeThermal({ ...base, gapIn: 0 });
    expect(result.gapIn).toBe(0);
    expect(result.effectiveEmittance).toBeNull();
    expect(result.airSpaceRSummer).toBeNull();
    expect(result.airSpaceRWinter).toBeNull();
    expect(result.rNote).toMatch(/no air space/i);
  });

  it("reports no R for a ventilated gap and says why", () => {
    // ASHRAE 2021 ch. 26 Table 3 applies to enclosed air spaces only
    const { result } = computeThermal({ ...base, gapVentilated: true });
    expect(result.ventilated).toBe(true);
    expect(result.airSpaceRSummer).toBeNull();
    expect(result.airSpaceRWinter).toBeNull();
    expect(result.rNote).toMatch(/not an enclosed air space/);
    // 1/E = 1/0.9 + 1/0.9 − 1 → 0.818 (ASHRAE 2021 ch. 26 Table 3 note): emittance still reported
    expect(result.effectiveEmittance).toBeCloseTo(0.818, 3);
  });

  it("bounds the gap by deck and panel underside, foil replacing the face it sits on", () => {
    // ASHRAE 2021 ch. 26 Table 3 note: 0.05 vs 0.90 → 0.0497
    const onDeck = computeThermal({ ...base, foil: { emittance: 0.05, facesGap: true, position: "on-deck" } });
    expect(onDeck.result.effectiveEmittance).toBeCloseTo(0.0497, 4);
    // foil under the panels with a 0.90 deck is the same pair
    const underPanels = computeThermal({ ...base, foil: { emittance: 0.05, facesGap: true, position: "under-panels" } });
    expect(underPanels.result.effectiveEmittance).toBeCloseTo(0.0497, 4);
    // a foil that faces nothing gives no radiant credit: 0.90 vs 0.90 → 0.818
    const blind = computeThermal({ ...base, foil: { emittance: 0.05, facesGap: false } });
    expect(blind.result.effectiveEmittance).toBeCloseTo(0.818, 3);
    // a foil-faced deck under a low-emittance panel underside: 1/E = 1/0.05 + 1/0.3 − 1 = 22.333 → 0.04478
    const both = computeThermal({ ...base, panelUndersideEmittance: 0.3, foil: { emittance: 0.05, facesGap: true } });
    expect(both.result.effectiveEmittance).toBeCloseTo(1 / 22.3333333, 6);
  });

  it("interpolates summer R for the enclosed gap at the roof's angle", () => {
    // 20 mm gap, flat roof, foil on deck: E = 0.04972; ASHRAE 2021 ch. 26 Table 3 horizontal down 20 mm:
    // E 0.03 → 3.52, E 0.05 → 3.29; at E 0.04972: 3.52 + (0.04972 − 0.03)/0.02 × (3.29 − 3.52) = 3.52 − 0.9862 × 0.23 = 3.2932
    const { result } = computeThermal({ ...base, foil: { emittance: 0.05, facesGap: true } });
    expect(result.airSpaceRSummer).toBeCloseTo(3.2932, 3);
    // horizontal up, 20 mm: E 0.03 → 2.27, E 0.05 → 2.21: 2.27 − 0.9862 × 0.06 = 2.2108
    expect(result.airSpaceRWinter).toBeCloseTo(2.2108, 3);
    expect(result.airSpaceRSummerSi).toBeCloseTo(3.2932 / 5.678, 3);
    expect(result.rExtrapolated).toBe(false);
  });

  it("takes the roof angle from the pitch", () => {
    // rafter geometry: angle = atan(pitch / 12); 12/12 → 45°
    const steep = computeThermal({ ...base, gapIn: 40 / 25.4, pitch: 12, foil: { emittance: 0.05, facesGap: true } });
    expect(steep.result.roofAngleDeg).toBeCloseTo(45, 10);
    // ASHRAE 2021 ch. 26 Table 3, 45° down, 40 mm: E 0.03 → 5.05, E 0.05 → 4.54: 5.05 − 0.9862 × 0.51 = 4.5470
    expect(steep.result.airSpaceRSummer).toBeCloseTo(4.547, 3);
  });

  it("marks a thin gap's R as extrapolated", () => {
    // 0.3 in mesh = 7.6 mm < 13 mm: ASHRAE 2021 ch. 26 Table 3 footnote formula
    const { result } = computeThermal({ ...base, gapIn: 0.3 });
    expect(result.rExtrapolated).toBe(true);
    expect(result.rNote).toMatch(/extrapolated/);
  });

  it("reports SRI and aged reflectance of the finish", () => {
    const { result } = computeThermal(base);
    // ASTM E1980-11 with the finish's 0.30 / 0.85
    expect(result.sri).toBeCloseTo(solarReflectanceIndex(0.3, 0.85), 10);
    // Title 24 estimate: 0.2 + 0.7 × 0.1 = 0.27
    expect(result.agedSolarReflectance).toBeCloseTo(0.27, 12);
    expect(result.coolRoof).toBeNull();
  });

  it("warns when cool roofing is asked for and the finish falls short", () => {
    // Title 24 steep slope: aged 0.2 + 0.7 × (0.10 − 0.2) = 0.13 < 0.20 and aged SRI < 16 → not met
    const { result, advisories } = computeThermal({ ...base, solarReflectance: 0.1, coolRoofRequired: true, planeIds: ["p1"] });
    expect(result.coolRoof?.meets).toBe(false);
    const a = advisories.find((x) => x.code === "cool-roof-not-met");
    expect(a).toBeDefined();
    expect(a!.severity).toBe("warning");
    expect(a!.reference).toMatch(/Title 24/);
    expect(a!.reference).toMatch(/ENERGY STAR/);
    expect(a!.planeIds).toEqual(["p1"]);
    // a light finish meets both: no advisory
    const ok = computeThermal({ ...base, coolRoofRequired: true });
    expect(ok.advisories.some((x) => x.code === "cool-roof-not-met")).toBe(false);
  });

  it("cautions about condensation in humid climate zones", () => {
    // IECC moisture regime A, zones 0–4 are humid; 5A, 4C and 2B are not treated as humid here
    expect(isHumidClimateZone("2A")).toBe(true);
    expect(isHumidClimateZone("4a")).toBe(true);
    expect(isHumidClimateZone("5A")).toBe(false);
    expect(isHumidClimateZone("4C")).toBe(false);
    expect(isHumidClimateZone("2B")).toBe(false);
    expect(isHumidClimateZone(undefined)).toBe(false);

    const { result, advisories } = computeThermal({ ...base, climateZone: "2A" });
    // Alduchov & Eskridge 1996: 80 °F / 80 % → 73.3 °F; panel at 80 − 15 = 65 °F (10–20 °F night-sky
    // undercooling: metal construction industry education material; 80 °F / 80 % and 15 °F: common practice)
    expect(result.dewPoint).not.toBeNull();
    expect(result.dewPoint!.dewPointF).toBeCloseTo(73.3, 1);
    expect(result.dewPoint!.panelNightTempF).toBe(65);
    expect(result.dewPoint!.condensationPossible).toBe(true);
    const a = advisories.find((x) => x.code === "condensation-risk");
    expect(a?.severity).toBe("info");
    expect(a?.reference).toMatch(/Alduchov & Eskridge 1996/);
    expect(a?.message).toMatch(/drain/);
    expect(a?.message).toMatch(/dry/);

    const dry = computeThermal({ ...base, climateZone: "5B" });
    expect(dry.result.dewPoint).toBeNull();
    expect(dry.advisories.some((x) => x.code === "condensation-risk")).toBe(false);
  });
});
