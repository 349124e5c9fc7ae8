import { beforeEach, describe, expect, it } from "vitest";
import { truncateAll, testSequelize } from "../helpers/db";
import { buildCompany, buildUser } from "../helpers/factories";
import { buildCatalogItem } from "../helpers/price-book-factories";
import {
  itemPricesAt,
  priceBookForCompany,
  pricingPackCoverage,
  rulesForCompany,
  rulesFromItems,
  rulesOfItems,
  type RuleSourceItem,
} from "../../server/services/price-book-rules";
import { PriceBookService } from "../../server/services/price-book.service";
import { DEMO_PRICE_BOOK, demoUnmappedKeys, seedDemoPriceBook } from "../../server/db/seeders/demo-price-book";
import { rulesSchema, takeoffInputSchema } from "../../shared/schemas/takeoff";
import { computeTakeoff } from "../../shared/engine/takeoff";
import { priceQuote } from "../../shared/pricing/price-quote";
import { MATERIAL_KEYS } from "../../shared/engine/materials";
import { CatalogItem, Company, CompanySettings, LaborRate } from "../../server/models/index";

beforeEach(truncateAll);

const source = (o: Partial<RuleSourceItem>): RuleSourceItem => ({
  id: 1,
  sku: "X",
  materialKey: null,
  purchaseUnit: "roll",
  coverageUnit: "sqft",
  packCoverage: 1000,
  wastePct: null,
  attributes: {},
  ...o,
});

describe("rulesFromItems (pure)", () => {
  it("turns roll sizes, laps and waste into the engine's rules and leaves the rest to the engine's defaults", () => {
    const { rules, conflicts } = rulesFromItems([
      source({ id: 1, materialKey: "underlayment-synthetic", wastePct: 12, attributes: { rollWidthIn: 54, rollLengthFt: 200, sideLapIn: 5, endLapIn: 8 } }),
      source({ id: 2, materialKey: "spacer-mesh", wastePct: 15, attributes: { rollWidthIn: 40, rollLengthFt: 60 } }),
    ]);
    expect(rules).toEqual({
      underlayment: { synthetic: { rollWidthIn: 54, rollLengthFt: 200, sideLapIn: 5, endLapIn: 8 } },
      waste: { underlaymentPct: 12, meshPct: 15 },
      mesh: { rollWidthIn: 40, rollLengthFt: 60 },
    });
    expect(conflicts).toEqual([]);
    const parsed = rulesSchema.parse(rules);
    expect(parsed.underlayment.synthetic).toEqual({ rollWidthIn: 54, rollLengthFt: 200, sideLapIn: 5, endLapIn: 8 });
    expect(parsed.mesh).toEqual({ rollWidthIn: 40, rollLengthFt: 60, sideLapIn: 0, endLapIn: 0 }); // laps: the engine's default
    expect(parsed.underlayment.selfAdhered.rollWidthIn).toBe(36); // no item: the engine's default
    expect(parsed.waste.iceBarrierPct).toBe(5);
  });

  it("takes stock lengths, coverages and counts from pack coverage where the item is sold that way", () => {
    const { rules } = rulesFromItems([
      source({ id: 1, materialKey: "trim-eave", purchaseUnit: "pc", coverageUnit: "lf", packCoverage: 10.5, attributes: { endLapIn: 4 } }),
      source({ id: 2, materialKey: "batten-1x4", purchaseUnit: "pc", coverageUnit: "lf", packCoverage: 12, wastePct: 8 }),
      source({ id: 3, materialKey: "deck-sheet", purchaseUnit: "sheet", coverageUnit: "sqft", packCoverage: 32 }),
      source({ id: 4, materialKey: "screw-trim", purchaseUnit: "box", coverageUnit: "ea", packCoverage: 500, wastePct: 3 }),
      source({ id: 5, materialKey: "sealant-tube", purchaseUnit: "tube", coverageUnit: "lf", packCoverage: 30 }),
      source({ id: 6, materialKey: "butyl-tape", purchaseUnit: "roll", coverageUnit: "lf", packCoverage: 45 }),
      source({ id: 7, materialKey: "vent-ridge", purchaseUnit: "roll", coverageUnit: "lf", packCoverage: 20, attributes: { nfaPerFtSqIn: 12.5 } }),
      source({ id: 8, materialKey: "clip", purchaseUnit: "box", coverageUnit: "ea", packCoverage: 100, attributes: { clipSpacingFieldIn: 20, clipSpacingEdgeIn: 12, clipSpacingCornerIn: 8, screwsPerClip: 3 } }),
      source({ id: 9, materialKey: "screw-panel", purchaseUnit: "box", coverageUnit: "ea", packCoverage: 500, attributes: { screwsPerSquareField: 70, screwsPerSquareEdge: 90, screwsPerSquareCorner: 110 } }),
      source({ id: 10, materialKey: "panel-standing-seam", purchaseUnit: "lf", coverageUnit: "lf", packCoverage: 1, attributes: { maxLengthFt: 45 } }),
    ]);
    const r = rulesSchema.parse(rules);
    expect(r.trim).toMatchObject({ stockLengthFt: 10.5, endLapIn: 4 });
    expect(r.battens.stockLengthFt).toBe(12);
    expect(r.waste.battensPct).toBe(8);
    expect(r.deck.sheetSqFt).toBe(32);
    expect(r.fasteners.screwsPerBox).toBe(500);
    expect(r.waste.fastenersPct).toBe(3);
    expect(r.sealant.lfPerTube).toBe(30);
    expect(r.butyl.rollLengthFt).toBe(45);
    expect(r.vents.ridgeNfaPerFtSqIn).toBe(12.5);
    expect(r.clips).toEqual({ spacingIn: { field: 20, edge: 12, corner: 8 }, screwsPerClip: 3 });
    expect(r.exposedFastener.screwsPerSquare).toEqual({ field: 70, edge: 90, corner: 110 });
    expect(r.panels.maxLengthFt).toBe(45);
    expect(r.fasteners.clipsPerBox).toBe(1); // clips stay counted each; the item's box of 100 is applied in pricing
  });

  it("lets the first key (in material-key order) win when items disagree, and reports the others", () => {
    const { rules, conflicts } = rulesFromItems([
      source({ id: 9, sku: "F30", materialKey: "underlayment-felt-30", wastePct: 15 }),
      source({ id: 3, sku: "SYN", materialKey: "underlayment-synthetic", wastePct: 10 }),
      source({ id: 4, sku: "SA", materialKey: "underlayment-self-adhered", wastePct: 10 }),
    ]);
    expect((rules.waste as Record<string, number>).underlaymentPct).toBe(10);
    expect(conflicts).toEqual([
      { field: "waste.underlaymentPct", used: { key: "underlayment-synthetic", sku: "SYN", value: 10 }, ignored: [{ key: "underlayment-felt-30", sku: "F30", value: 15 }] },
    ]);
  });

  it("rulesOfItems gives rulesFromItems' rules, and the new ones as soon as an item changes", () => {
    const items = [
      source({ id: 1, materialKey: "underlayment-synthetic", wastePct: 12, attributes: { rollWidthIn: 54, rollLengthFt: 200 } }),
      source({ id: 2, materialKey: "batten-1x4", purchaseUnit: "pc", coverageUnit: "lf", packCoverage: 12, wastePct: 8 }),
    ];
    const first = rulesOfItems(items);
    expect(first).toEqual(rulesFromItems(items).rules);
    expect(rulesOfItems(structuredClone(items))).toBe(first); // the same items (read again): the rules kept
    const edited = [items[0]!, { ...items[1]!, packCoverage: 16 }];
    const second = rulesOfItems(edited);
    expect(second).toEqual(rulesFromItems(edited).rules);
    expect(second).not.toEqual(first);
    const inactive = [items[0]!]; // an item made inactive is no longer read
    expect(rulesOfItems(inactive)).toEqual(rulesFromItems(inactive).rules);
    expect(rulesOfItems(inactive)).not.toEqual(first);
  });

  it("ignores unmapped items and unknown keys", () => {
    expect(rulesFromItems([source({ materialKey: null, wastePct: 50 }), source({ materialKey: "gutter", wastePct: 50 })]).rules).toEqual({});
  });
});

describe("pricingPackCoverage", () => {
  it.each([
    ["bought in the key's unit: one per unit", { materialKey: "underlayment-synthetic", purchaseUnit: "roll", coverageUnit: "sqft", packCoverage: 914.83 }, 1],
    ["covers the key's unit: divide by the pack", { materialKey: "clip", purchaseUnit: "box", coverageUnit: "ea", packCoverage: 100 }, 100],
    ["ridge vent by the 20 ft roll for a key counted in lf", { materialKey: "vent-ridge", purchaseUnit: "roll", coverageUnit: "lf", packCoverage: 20 }, 20],
    ["screws: the takeoff already counts boxes", { materialKey: "screw-panel", purchaseUnit: "box", coverageUnit: "ea", packCoverage: 250 }, 1],
    ["units that do not fit", { materialKey: "clip", purchaseUnit: "roll", coverageUnit: "sqft", packCoverage: 5 }, null],
  ] as const)("%s", (_what, item, expected) => {
    expect(pricingPackCoverage(item)).toBe(expected);
  });
});

describe("rulesForCompany", () => {
  it("gives, for the demo price book, rules the takeoff schema accepts, with the price book's values", async () => {
    const company = await buildCompany();
    expect(await seedDemoPriceBook(testSequelize(), company.id)).toBe(true);
    const rules = await rulesForCompany(company.id);
    const parsed = rulesSchema.safeParse(rules);
    expect(parsed.success).toBe(true);
    const r = parsed.data!;
    expect(r.underlayment.synthetic).toEqual({ rollWidthIn: 48, rollLengthFt: 250, sideLapIn: 4, endLapIn: 6 });
    expect(r.underlayment.felt30).toEqual({ rollWidthIn: 36, rollLengthFt: 72, sideLapIn: 2, endLapIn: 6 });
    expect(r.iceBarrier).toMatchObject({ rollWidthIn: 36, rollLengthFt: 65, sideLapIn: 3.5, endLapIn: 6, insideWallIn: 24 });
    expect(r.trim).toMatchObject({ stockLengthFt: 10, endLapIn: 3 });
    expect(r.battens.stockLengthFt).toBe(8);
    expect(r.fasteners.screwsPerBox).toBe(250);
    expect(r.deck.sheetSqFt).toBe(32);
    expect(r.sealant.lfPerTube).toBe(25);
    expect(r.butyl.rollLengthFt).toBe(50);
    expect(r.vents).toEqual({ ridgeNfaPerFtSqIn: 18, intakeNfaPerFtSqIn: 9 });
    expect(r.waste).toMatchObject({ underlaymentPct: 10, iceBarrierPct: 5, meshPct: 10, dimpledPct: 10, foilPct: 10, fastenersPct: 5, deckPct: 10 });
    // A roof computes with them.
    const input = {
      site: {},
      planes: [{ id: "a", pitch: 4, outline: [[0, 0], [20, 0], [20, 10], [0, 10]], eaveEdge: 0 }],
      stacks: [{ id: "s" }],
      defaultStackId: "s",
      rules,
    };
    expect(takeoffInputSchema.safeParse(input).success).toBe(true);
    const out = computeTakeoff(input);
    expect(out.ok).toBe(true);
  });

  it("the demo price book maps every material key, with no conflicting values", async () => {
    expect(demoUnmappedKeys()).toEqual([]);
    const company = await buildCompany();
    await seedDemoPriceBook(testSequelize(), company.id);
    const { unmappedKeys, priceBook } = await priceBookForCompany(company.id);
    expect(unmappedKeys).toEqual([]);
    expect(priceBook.items.map((i) => i.key).sort()).toEqual(Object.keys(MATERIAL_KEYS).sort());
    const { rulesBuildForCompany } = await import("../../server/services/price-book-rules");
    expect((await rulesBuildForCompany(company.id)).conflicts).toEqual([]);
    // Safe to run twice.
    expect(await seedDemoPriceBook(testSequelize(), company.id)).toBe(false);
    expect(await CatalogItem.count({ where: { companyId: company.id } })).toBe(DEMO_PRICE_BOOK.length);
  });

  it("uses only the company's own active items", async () => {
    const company = await buildCompany();
    await buildCatalogItem(company.id, { materialKey: "trim-eave", packCoverage: 12, attributes: { stockLengthFt: 12 }, active: false });
    await buildCatalogItem((await buildCompany()).id, { materialKey: "trim-eave", packCoverage: 14, attributes: { stockLengthFt: 14 } });
    expect(await rulesForCompany(company.id)).toEqual({});
    await buildCatalogItem(company.id, { materialKey: "trim-rake", packCoverage: 10.5, attributes: { stockLengthFt: 10.5 } });
    expect(await rulesForCompany(company.id)).toEqual({ trim: { stockLengthFt: 10.5 } });
  });
});

describe("priceBookForCompany", () => {
  it("gives shared/pricing the demo price book, and a quote priced with it checks out by hand", async () => {
    const company = await buildCompany();
    await seedDemoPriceBook(testSequelize(), company.id);
    const { priceBook, snapshot, missingLabor } = await priceBookForCompany(company.id);
    expect(missingLabor).toEqual([]);
    expect(priceBook.settings).toEqual({
      pricingMode: "margin",
      markupPct: 50,
      targetMarginPct: 35,
      minMarginPct: 25,
      taxRatePct: 7,
      taxBasis: "cost",
      depositPct: 30,
    });
    expect(priceBook.labor.pitchBands.map((b) => [b.minPitch, b.maxPitch, b.centsPerSquare])).toEqual([
      [0, 7, 19500],
      [7, 10, 23500],
      [10, 13, 28500],
      [13, null, 34500],
    ]);
    expect(priceBook.labor.tearOffPerSquarePerLayerCents).toBe(6500);
    expect(priceBook.labor.deckSheetCents).toBe(2800);
    const clip = priceBook.items.find((i) => i.key === "clip")!;
    expect(clip).toMatchObject({ unit: "box", packCoverage: 100, unitCostCents: 6200, wastePct: 5 });
    const syn = priceBook.items.find((i) => i.key === "underlayment-synthetic")!;
    expect(syn).toMatchObject({ unit: "roll", packCoverage: 1, unitCostCents: 11800 });
    expect(snapshot.items).toHaveLength(priceBook.items.length);
    expect(snapshot.items.every((i) => i.version === 1)).toBe(true);
    expect(snapshot.priceBookVersion).toBe(1);

    const result = priceQuote({
      priceBook,
      options: [
        {
          id: "a",
          label: "Standard",
          materials: [
            { key: "underlayment-synthetic", quantity: 3, unit: "roll" },
            { key: "clip", quantity: 250, unit: "ea" },
          ],
          squares: 10,
          pitch: 6,
        },
      ],
    });
    const o = result.options[0];
    // Synthetic: 3 rolls × $118.00 = $354.00 cost; price 35400 / (1 − 0.35) = 54461.54 → 54462.
    // Clips: ceil(250 / 100) = 3 boxes × $62.00 = $186.00; price 18600 / 0.65 = 28615.38 → 28615.
    // Labour: 10 squares at 6/12 (band under 7/12) × $195.00 = $1,950.00; price 195000 / 0.65 = 300000.
    expect(o.lines.map((l) => [l.key, l.quantity, l.costCents, l.priceCents])).toEqual([
      ["underlayment-synthetic", 3, 35400, 54462],
      ["clip", 3, 18600, 28615],
      [`labor:${priceBook.labor.pitchBands[0].id}`, 10, 195000, 300000],
    ]);
    // Tax 7 % on materials at cost: (35400 + 18600) × 0.07 = 3780.
    expect(o.taxCents).toBe(3780);
    expect(o.costCents).toBe(249000);
    expect(o.priceCents).toBe(383077);
    expect(o.totalCents).toBe(386857);
    // Deposit 30 % of 386857 = 116057.1 → to the whole dollar 116100.
    expect(o.depositCents).toBe(116100);
  });

  it("reports missing labour and uses the default settings for a company with nothing saved", async () => {
    const company = await buildCompany();
    const { priceBook, missingLabor, unmappedKeys } = await priceBookForCompany(company.id);
    expect(missingLabor).toEqual(["pitch_band", "tear_off_per_layer", "deck_sheet"]);
    expect(priceBook.items).toEqual([]);
    expect(unmappedKeys).toHaveLength(Object.keys(MATERIAL_KEYS).length);
    expect(priceBook.settings.pricingMode).toBe("margin");
    expect(await CompanySettings.count()).toBe(0);
    expect(await LaborRate.count()).toBe(0);
  });

  it("a quote's snapshot keeps the prices it was made with after the price changes", async () => {
    const company = await buildCompany();
    await seedDemoPriceBook(testSequelize(), company.id);
    const owner = await buildUser({ companyId: company.id, role: "owner" });
    const { snapshot } = await priceBookForCompany(company.id);
    const clipRef = snapshot.items.find((i) => i.materialKey === "clip")!;
    const svc = new PriceBookService(testSequelize());
    await svc.updateItem(clipRef.id, { unitCostCents: 7100, version: clipRef.version }, { id: owner.id, email: owner.email, name: owner.name, role: "owner", companyId: company.id });
    const now = await priceBookForCompany(company.id);
    expect(now.priceBook.items.find((i) => i.key === "clip")!.unitCostCents).toBe(7100);
    expect(now.snapshot.items.find((i) => i.id === clipRef.id)!.version).toBe(2);
    expect(now.snapshot.priceBookVersion).toBeGreaterThan(snapshot.priceBookVersion);
    const then = await itemPricesAt(snapshot.items);
    expect(then.get(clipRef.id)).toEqual({ version: 1, unitCostCents: 6200, packCoverage: 100, wastePct: 5 });
    const latest = await itemPricesAt(now.snapshot.items);
    expect(latest.get(clipRef.id)!.unitCostCents).toBe(7100);
  });

  it("seeds the demo company profile", async () => {
    const company = await buildCompany();
    await seedDemoPriceBook(testSequelize(), company.id);
    const c = (await Company.findByPk(company.id))!;
    expect(c).toMatchObject({ city: "Harlow Bend", email: "office@example.com", proposalPrefix: "QSS-", nextProposalNumber: 1001 });
    expect(c.warranty).toMatch(/local building codes/);
  });
});
