import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  bandForPitch,
  priceQuote,
  roundCents,
  squaresByBand,
  type PriceBook,
  type PricingSettings,
  type QuoteOptionInput,
} from "@shared/pricing/price-quote";

// Pricing is arithmetic on the company's own price book: the checks below are hand-worked from the money
// rules documented in shared/pricing/price-quote.ts (no published source applies).

const settings: PricingSettings = {
  pricingMode: "markup",
  markupPct: 35,
  targetMarginPct: 40,
  minMarginPct: 20,
  taxRatePct: 7.25,
  taxBasis: "cost",
  depositPct: 30,
};

const book = (s: Partial<PricingSettings> = {}): PriceBook => ({
  items: [
    { id: "i1", key: "panel-ss-24ga", name: "Standing seam panel, 24 ga", unit: "lf", packCoverage: 1, unitCostCents: 650 },
    { id: "i2", key: "underlayment-synthetic", name: "Synthetic underlayment roll", unit: "roll", packCoverage: 10, unitCostCents: 12_500 },
    { id: "i3", key: "screw-pancake", name: "Pancake-head screws, box of 250", unit: "box", packCoverage: 250, unitCostCents: 3_999 },
    { id: "i4", key: "trim-ridge", name: "Ridge cap, 10 ft", unit: "piece", packCoverage: 10, unitCostCents: 2_750, wastePct: 10 },
  ],
  labor: {
    pitchBands: [
      { id: "b-0-4", minPitch: 0, maxPitch: 4, centsPerSquare: 9_000 },
      { id: "b-4-8", minPitch: 4, maxPitch: 8, centsPerSquare: 11_000 },
      { id: "b-8-12", minPitch: 8, maxPitch: 12, centsPerSquare: 14_500 },
      { id: "b-12", minPitch: 12, maxPitch: null, centsPerSquare: 19_000 },
    ],
    tearOffPerSquarePerLayerCents: 4_500,
    deckSheetCents: 4_200,
  },
  settings: { ...settings, ...s },
});

const fullOption: QuoteOptionInput = {
  id: "opt-a",
  label: "Standing seam over synthetic",
  squares: 25.3,
  materials: [
    { key: "panel-ss-24ga", quantity: 1234.5, unit: "lf" },
    { key: "underlayment-synthetic", quantity: 25.3, unit: "square" },
    { key: "screw-pancake", quantity: 1010, unit: "each" },
    { key: "trim-ridge", quantity: 42, unit: "lf", wasteIncluded: false },
    { key: "vent-ridge", quantity: 38, unit: "lf" },
  ],
  squaresByPitchBand: { "b-4-8": 20.5, "b-8-12": 4.8 },
  tearOffSquares: 25.3,
  tearOffLayers: 2,
  deckSheetsReplaced: 6,
  manualLines: [
    { description: "Reattach gutters", quantity: 2, unitPriceCents: 15_000, taxable: false },
    { description: "Skylight flashing kit", quantity: 1, unitPriceCents: 22_500, unitCostCents: 14_000, taxable: true },
  ],
  discount: { amountCents: 50_000, reason: "repeat customer" },
};

describe("priceQuote, markup mode, a full option worked by hand", () => {
  const [q] = priceQuote({ options: [fullOption], priceBook: book() }).options;
  const line = (key: string) => q.lines.find((l) => l.key === key)!;

  it("buys materials in purchase units without adding waste twice", () => {
    // panel: ceil(1234.5 / 1) = 1235 lf × 650 = 802,750 ¢; price × 1.35 = 1,083,712.5 → 1,083,713 ¢
    expect(line("panel-ss-24ga")).toMatchObject({ kind: "material", quantity: 1235, unit: "lf", unitCostCents: 650, costCents: 802_750, priceCents: 1_083_713, taxable: true });
    // underlayment: ceil(25.3 / 10) = 3 rolls × 12,500 = 37,500 ¢; × 1.35 = 50,625 ¢
    expect(line("underlayment-synthetic")).toMatchObject({ quantity: 3, costCents: 37_500, priceCents: 50_625 });
    // screws: ceil(1010 / 250) = ceil(4.04) = 5 boxes × 3,999 = 19,995 ¢; × 1.35 = 26,993.25 → 26,993 ¢
    expect(line("screw-pancake")).toMatchObject({ quantity: 5, costCents: 19_995, priceCents: 26_993 });
    // ridge cap marked without waste: 42 × 1.10 = 46.2 lf / 10 = 4.62 → 5 pieces × 2,750 = 13,750 ¢; × 1.35 = 18,562.5 → 18,563 ¢
    expect(line("trim-ridge")).toMatchObject({ quantity: 5, costCents: 13_750, priceCents: 18_563 });
    // no price-book item for the ridge vent: listed, no line
    expect(q.missingItems).toEqual(["vent-ridge"]);
    expect(q.lines.some((l) => l.key === "vent-ridge")).toBe(false);
  });

  it("prices labour by pitch band, tear-off by layer and deck sheets", () => {
    // 20.5 sq × 11,000 = 225,500 ¢; × 1.35 = 304,425 ¢
    expect(line("labor:b-4-8")).toMatchObject({ kind: "labor", quantity: 20.5, unitCostCents: 11_000, costCents: 225_500, priceCents: 304_425, taxable: false });
    // 4.8 sq × 14,500 = 69,600 ¢; × 1.35 = 93,960 ¢
    expect(line("labor:b-8-12")).toMatchObject({ costCents: 69_600, priceCents: 93_960 });
    // tear-off: 25.3 sq × (4,500 × 2 layers = 9,000) = 227,700 ¢; × 1.35 = 307,395 ¢
    expect(line("tearoff")).toMatchObject({ kind: "tearoff", quantity: 25.3, unitCostCents: 9_000, costCents: 227_700, priceCents: 307_395 });
    // deck: 6 × 4,200 = 25,200 ¢; × 1.35 = 34,020 ¢
    expect(line("deck")).toMatchObject({ kind: "deck", quantity: 6, costCents: 25_200, priceCents: 34_020 });
  });

  it("keeps manual lines at their own price and adds the discount line", () => {
    const manual = q.lines.filter((l) => l.kind === "manual");
    // gutters: 2 × 15,000 = 30,000 ¢ price, cost taken equal to price
    expect(manual[0]).toMatchObject({ costCents: 30_000, priceCents: 30_000, taxable: false });
    // skylight kit: price 22,500 ¢, cost 14,000 ¢, taxable
    expect(manual[1]).toMatchObject({ costCents: 14_000, priceCents: 22_500, taxable: true });
    const d = q.lines.find((l) => l.kind === "discount")!;
    expect(d).toMatchObject({ costCents: 0, priceCents: -50_000, taxable: false });
    expect(d.description).toMatch(/repeat customer/);
  });

  it("totals cost, price, tax, margin and deposit", () => {
    // cost: 802,750 + 37,500 + 19,995 + 13,750 + 225,500 + 69,600 + 227,700 + 25,200 + 30,000 + 14,000 = 1,465,995 ¢
    expect(q.costCents).toBe(1_465_995);
    // price: 1,083,713 + 50,625 + 26,993 + 18,563 + 304,425 + 93,960 + 307,395 + 34,020 + 30,000 + 22,500 − 50,000 = 1,922,194 ¢
    expect(q.priceCents).toBe(1_922_194);
    // tax on cost of taxable lines: (873,995 materials + 14,000 kit) × 7.25 % = 887,995 × 0.0725 = 64,379.6375 → 64,380 ¢
    // (the discount does not reduce the tax)
    expect(q.taxCents).toBe(64_380);
    // total: 1,922,194 + 64,380 = 1,986,574 ¢
    expect(q.totalCents).toBe(1_986_574);
    // margin: (1,922,194 − 1,465,995) / 1,922,194 = 456,199 / 1,922,194 = 23.733 %
    expect(q.marginPct).toBeCloseTo(23.733, 3);
    expect(q.belowMinMargin).toBe(false);
    // deposit: 30 % × 1,986,574 = 595,972.2 ¢ = $5,959.72 → $5,960 = 596,000 ¢
    expect(q.depositCents).toBe(596_000);
    expect(q.hasOverrides).toBe(false);
    expect(q.laborBandAssumed).toBe(false);
    // every amount is integer cents
    for (const l of q.lines) {
      expect(Number.isInteger(l.costCents)).toBe(true);
      expect(Number.isInteger(l.priceCents)).toBe(true);
    }
  });

  it("taxes the price instead of the cost when the basis is price", () => {
    const [p] = priceQuote({ options: [fullOption], priceBook: book({ taxBasis: "price" }) }).options;
    // taxable prices: 1,083,713 + 50,625 + 26,993 + 18,563 + 22,500 = 1,202,394 ¢ × 7.25 % = 87,173.565 → 87,174 ¢
    expect(p.taxCents).toBe(87_174);
    expect(p.totalCents).toBe(1_922_194 + 87_174);
  });
});

describe("priceQuote, margin mode with overrides", () => {
  const option: QuoteOptionInput = {
    id: "opt-b",
    label: "With overrides",
    squares: 10,
    pitch: 9,
    materials: [
      { key: "panel-ss-24ga", quantity: 100, unit: "lf" },
      { key: "screw-pancake", quantity: 300, unit: "each" },
      { key: "snow-guard", quantity: 12, unit: "each", description: "Snow guard" },
    ],
    overrides: [
      { key: "panel-ss-24ga", unitCostCents: 600, reason: "supplier promotion" },
      { key: "screw-pancake", quantity: 3, reason: "extra box for trim" },
      { key: "snow-guard", unitCostCents: 1_250, reason: "quoted by phone" },
      { key: "not-on-this-job", quantity: 1, reason: "stale" },
    ],
  };
  const [q] = priceQuote({ options: [option], priceBook: book({ pricingMode: "margin", targetMarginPct: 40, taxBasis: "price", taxRatePct: 8, minMarginPct: 45 }) }).options;
  const line = (key: string) => q.lines.find((l) => l.key === key)!;

  it("applies overrides and keeps their reasons", () => {
    // panel: 100 lf × 600 (override) = 60,000 ¢; margin 40 %: 60,000 / 0.6 = 100,000 ¢
    expect(line("panel-ss-24ga")).toMatchObject({ quantity: 100, unitCostCents: 600, costCents: 60_000, priceCents: 100_000, override: { reason: "supplier promotion" } });
    // screws: 3 boxes (override; the takeoff needs ceil(300/250) = 2) × 3,999 = 11,997 ¢; / 0.6 = 19,995 ¢
    expect(line("screw-pancake")).toMatchObject({ quantity: 3, costCents: 11_997, priceCents: 19_995, override: { reason: "extra box for trim" } });
    // no price-book item, but a unit cost override: 12 × 1,250 = 15,000 ¢; / 0.6 = 25,000 ¢
    expect(line("snow-guard")).toMatchObject({ quantity: 12, costCents: 15_000, priceCents: 25_000 });
    expect(q.missingItems).toEqual([]);
    expect(q.hasOverrides).toBe(true);
    expect(q.unmatchedOverrides).toEqual(["not-on-this-job"]);
  });

  it("puts all squares in the band of the given pitch", () => {
    // pitch 9 is in the 8–12 band: 10 sq × 14,500 = 145,000 ¢; / 0.6 = 241,666.67 → 241,667 ¢
    expect(line("labor:b-8-12")).toMatchObject({ quantity: 10, costCents: 145_000, priceCents: 241_667 });
  });

  it("totals in margin mode", () => {
    // cost: 60,000 + 11,997 + 15,000 + 145,000 = 231,997 ¢
    expect(q.costCents).toBe(231_997);
    // price: 100,000 + 19,995 + 25,000 + 241,667 = 386,662 ¢
    expect(q.priceCents).toBe(386_662);
    // tax on material prices: (100,000 + 19,995 + 25,000) × 8 % = 144,995 × 0.08 = 11,599.6 → 11,600 ¢
    expect(q.taxCents).toBe(11_600);
    expect(q.totalCents).toBe(398_262);
    // margin: (386,662 − 231,997) / 386,662 = 154,665 / 386,662 = 40.00005 % (per-line rounding)
    expect(q.marginPct).toBeCloseTo(40.00005, 4);
    // below the 45 % floor
    expect(q.belowMinMargin).toBe(true);
    // deposit: 30 % × 398,262 = 119,478.6 ¢ → $1,194.79 → $1,195 = 119,500 ¢
    expect(q.depositCents).toBe(119_500);
  });

  it("rejects a target margin of 100 %", () => {
    expect(() => priceQuote({ options: [option], priceBook: book({ pricingMode: "margin", targetMarginPct: 100 }) })).toThrow(RangeError);
  });
});

describe("labour by pitch band", () => {
  const base = { id: "c", label: "c", materials: [] };

  it("splits the planes' squares by band, minimum inclusive and maximum exclusive", () => {
    const bands = book().labor.pitchBands;
    // pitch 4 belongs to the 4–8 band, pitch 12 to the 12-and-up band
    expect(bandForPitch(bands, 4)?.id).toBe("b-4-8");
    expect(bandForPitch(bands, 3.99)?.id).toBe("b-0-4");
    expect(bandForPitch(bands, 12)?.id).toBe("b-12");
    expect(squaresByBand([{ pitch: 3, squares: 5 }, { pitch: 4, squares: 2.5 }, { pitch: 12, squares: 1 }, { pitch: 5, squares: 0.5 }], bands)).toEqual({
      "b-0-4": 5,
      "b-4-8": 3,
      "b-12": 1,
    });
    const [q] = priceQuote({ options: [{ ...base, squares: 9, planes: [{ pitch: 3, squares: 5 }, { pitch: 4, squares: 3 }, { pitch: 12, squares: 1 }] }], priceBook: book() }).options;
    // 5 × 9,000 = 45,000; 3 × 11,000 = 33,000; 1 × 19,000 = 19,000 → cost 97,000 ¢
    expect(q.lines.map((l) => [l.key, l.costCents])).toEqual([
      ["labor:b-0-4", 45_000],
      ["labor:b-4-8", 33_000],
      ["labor:b-12", 19_000],
    ]);
    expect(q.costCents).toBe(97_000);
    // no taxable lines → no tax; price 97,000 × 1.35 = 130,950 ¢
    expect(q.taxCents).toBe(0);
    expect(q.priceCents).toBe(130_950);
  });

  it("falls back to the lowest band when no pitch is given, and flags it", () => {
    const [q] = priceQuote({ options: [{ ...base, squares: 2 }], priceBook: book() }).options;
    // 2 × 9,000 = 18,000 ¢
    expect(q.lines[0]).toMatchObject({ key: "labor:b-0-4", costCents: 18_000 });
    expect(q.laborBandAssumed).toBe(true);
  });

  it("lists squares in an unknown band as missing", () => {
    const [q] = priceQuote({ options: [{ ...base, squares: 3, squaresByPitchBand: { zzz: 3 } }], priceBook: book() }).options;
    expect(q.lines).toEqual([]);
    expect(q.missingItems).toEqual(["labor:zzz"]);
  });
});

describe("money helpers", () => {
  it("rounds half-cents up and ignores float noise", () => {
    expect(roundCents(2.5)).toBe(3);
    expect(roundCents(2.4999)).toBe(2);
    // 1.005 × 100 = 100.49999999999999 in binary floating point, still half a cent above 100
    expect(roundCents(1.005 * 100)).toBe(101);
    expect(roundCents(-2.5)).toBe(-3);
  });

  it("rejects non-integer cents in the price book", () => {
    const b = book();
    b.items[0] = { ...b.items[0], unitCostCents: 6.5 };
    expect(() => priceQuote({ options: [fullOption], priceBook: b })).toThrow(/integer cents/);
  });

  it("always buys enough packs, and never a whole extra one (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 1e5, noNaN: true }), fc.integer({ min: 1, max: 500 }), (qty, pack) => {
        const b = book();
        b.items = [{ id: "x", key: "k", name: "k", unit: "pack", packCoverage: pack, unitCostCents: 100 }];
        const [q] = priceQuote({ options: [{ id: "p", label: "p", squares: 0, materials: [{ key: "k", quantity: qty, unit: "each" }] }], priceBook: b }).options;
        const bought = q.lines[0].quantity;
        expect(Number.isInteger(bought)).toBe(true);
        expect(bought * pack).toBeGreaterThanOrEqual(qty - 1e-6);
        expect((bought - 1) * pack).toBeLessThan(qty);
        // markup ≥ 0 → price ≥ cost, integer cents
        expect(q.priceCents).toBeGreaterThanOrEqual(q.costCents);
        expect(Number.isInteger(q.totalCents)).toBe(true);
      }),
    );
  });
});
