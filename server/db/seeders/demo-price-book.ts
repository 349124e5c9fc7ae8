/**
 * The demo company's price book: invented items (generic names, invented SKUs, plausible prices), an item for
 * every takeoff material key, labour rates, pricing settings and the company profile. No real brands.
 */
import type { Sequelize, Transaction } from "sequelize";
import { MATERIAL_KEYS, type MaterialKey } from "../../../shared/engine/materials";
import type { CatalogCategory, CatalogItemAttributes, PricingSettingsInput, Unit } from "../../../shared/schemas/price-book";
import { CatalogItem, CatalogItemPrice, Company, CompanySettings, LaborRate } from "../../models/index";

interface SeedItem {
  sku: string;
  category: CatalogCategory;
  name: string;
  purchaseUnit: Unit;
  packCoverage: number;
  coverageUnit: Unit;
  unitCostCents: number;
  wastePct: number | null;
  materialKey: MaterialKey | null;
  attributes: CatalogItemAttributes;
}

/** Net ft² a roll covers after its laps (the engine's own count). */
const netSqFt = (w: number, l: number, side: number, end: number) => Number((((w - side) / 12) * (l - end / 12)).toFixed(2));

const roll = (
  sku: string,
  category: CatalogCategory,
  name: string,
  key: MaterialKey,
  cents: number,
  wastePct: number | null,
  a: { rollWidthIn: number; rollLengthFt: number; sideLapIn: number; endLapIn: number },
): SeedItem => ({
  sku,
  category,
  name,
  purchaseUnit: "roll",
  packCoverage: netSqFt(a.rollWidthIn, a.rollLengthFt, a.sideLapIn, a.endLapIn),
  coverageUnit: "sqft",
  unitCostCents: cents,
  wastePct,
  materialKey: key,
  attributes: a,
});

/** A stock-length piece (trim, flashing, batten) sold by the piece. */
const piece = (sku: string, category: CatalogCategory, name: string, key: MaterialKey, cents: number, lengthFt: number, extra: CatalogItemAttributes = {}): SeedItem => ({
  sku,
  category,
  name,
  purchaseUnit: "pc",
  packCoverage: lengthFt,
  coverageUnit: "lf",
  unitCostCents: cents,
  wastePct: null,
  materialKey: key,
  attributes: { stockLengthFt: lengthFt, ...extra },
});

const each = (sku: string, category: CatalogCategory, name: string, key: MaterialKey | null, cents: number): SeedItem => ({
  sku,
  category,
  name,
  purchaseUnit: "ea",
  packCoverage: 1,
  coverageUnit: "ea",
  unitCostCents: cents,
  wastePct: null,
  materialKey: key,
  attributes: {},
});

const screwBox = (sku: string, name: string, key: MaterialKey, cents: number, extra: CatalogItemAttributes = {}): SeedItem => ({
  sku,
  category: "fasteners",
  name,
  purchaseUnit: "box",
  packCoverage: 250,
  coverageUnit: "ea",
  unitCostCents: cents,
  wastePct: 5,
  materialKey: key,
  attributes: extra,
});

// Trim stock 10 ft, 3 in end laps (common practice, no published source).
const TRIM = { endLapIn: 3, colour: "matte charcoal" };

export const DEMO_PRICE_BOOK: SeedItem[] = [
  // Panels: priced per linear foot, ordered to the inch.
  {
    sku: "QM-SS24-16-CHR",
    category: "panels",
    name: "Standing-seam panel, 24 ga, 16 in coverage, matte charcoal",
    purchaseUnit: "lf",
    packCoverage: 1,
    coverageUnit: "lf",
    unitCostCents: 585,
    wastePct: null,
    materialKey: "panel-standing-seam",
    attributes: { coverageWidthIn: 16, gauge: 24, maxLengthFt: 40, colour: "matte charcoal" },
  },
  {
    sku: "QM-RIB29-36-UNP",
    category: "panels",
    name: "Exposed-fastener rib panel, 29 ga, 36 in coverage, unpainted metallic coating",
    purchaseUnit: "lf",
    packCoverage: 1,
    coverageUnit: "lf",
    unitCostCents: 345,
    wastePct: null,
    materialKey: "panel-exposed-fastener",
    attributes: { coverageWidthIn: 36, gauge: 29, maxLengthFt: 40 },
  },
  {
    sku: "QM-SS24-16-SLT",
    category: "panels",
    name: "Standing-seam panel, 24 ga, 16 in coverage, slate grey (special order)",
    purchaseUnit: "lf",
    packCoverage: 1,
    coverageUnit: "lf",
    unitCostCents: 612,
    wastePct: null,
    materialKey: null,
    attributes: { coverageWidthIn: 16, gauge: 24, colour: "slate grey" },
  },
  // Underlayment and membranes (roll sizes: common practice; laps for felt after the NRCA metal roof manual).
  roll("QM-UL-SYN-48", "underlayment", "Synthetic underlayment, 48 in × 250 ft roll", "underlayment-synthetic", 11800, 10, { rollWidthIn: 48, rollLengthFt: 250, sideLapIn: 4, endLapIn: 6 }),
  roll("QM-UL-SA-HT36", "underlayment", "Self-adhered high-temperature membrane, 36 in × 65 ft roll", "underlayment-self-adhered", 13500, 10, { rollWidthIn: 36, rollLengthFt: 65, sideLapIn: 3.5, endLapIn: 6 }),
  roll("QM-UL-F30", "underlayment", "No. 30 asphalt-saturated felt, 36 in × 72 ft roll", "underlayment-felt-30", 3800, 10, { rollWidthIn: 36, rollLengthFt: 72, sideLapIn: 2, endLapIn: 6 }),
  roll("QM-UL-F15", "underlayment", "No. 15 asphalt-saturated felt, 36 in × 144 ft roll", "underlayment-felt-15", 3200, 10, { rollWidthIn: 36, rollLengthFt: 144, sideLapIn: 2, endLapIn: 6 }),
  roll("QM-IB-36", "ice-barrier", "Ice barrier membrane, smooth, 36 in × 65 ft roll", "ice-barrier", 9500, 5, { rollWidthIn: 36, rollLengthFt: 65, sideLapIn: 3.5, endLapIn: 6 }),
  {
    ...roll("QM-VM-36", "flashing", "Valley membrane strip, self-adhered, 36 in × 65 ft roll", "valley-membrane", 12800, null, { rollWidthIn: 36, rollLengthFt: 65, sideLapIn: 3.5, endLapIn: 6 }),
  },
  // Spacer layers.
  roll("QM-SP-MESH-39", "spacer", "3D ventilation mesh mat, about 0.3 in, 39 in × 75 ft roll", "spacer-mesh", 26500, 10, { rollWidthIn: 39, rollLengthFt: 75, sideLapIn: 0, endLapIn: 0 }),
  roll("QM-SP-DIMP-48", "spacer", "Dimpled spacer sheet, about 0.4 in, 48 in × 50 ft roll", "spacer-dimpled", 14500, 10, { rollWidthIn: 48, rollLengthFt: 50, sideLapIn: 0, endLapIn: 0 }),
  piece("QM-BT-1X3-8", "spacer", "Batten, 1x3 kiln-dried spruce, 8 ft", "batten-1x3", 320, 8),
  piece("QM-BT-1X4-8", "spacer", "Batten, 1x4 kiln-dried spruce, 8 ft", "batten-1x4", 440, 8),
  piece("QM-BT-2X2-8", "spacer", "Batten, 2x2 kiln-dried spruce, 8 ft", "batten-2x2", 360, 8),
  piece("QM-BT-2X4-8", "spacer", "Batten, 2x4 kiln-dried spruce, 8 ft", "batten-2x4", 510, 8),
  piece("QM-CB-1X3-8", "spacer", "Counter-batten, 1x3 kiln-dried spruce, 8 ft", "counter-batten-1x3", 320, 8),
  piece("QM-CB-1X4-8", "spacer", "Counter-batten, 1x4 kiln-dried spruce, 8 ft", "counter-batten-1x4", 440, 8),
  piece("QM-CB-2X2-8", "spacer", "Counter-batten, 2x2 kiln-dried spruce, 8 ft", "counter-batten-2x2", 360, 8),
  piece("QM-CB-2X4-8", "spacer", "Counter-batten, 2x4 kiln-dried spruce, 8 ft", "counter-batten-2x4", 510, 8),
  roll("QM-RB-FOIL-48", "radiant-barrier", "Radiant barrier foil, double-sided, 48 in × 125 ft roll", "radiant-barrier-foil", 11500, 10, { rollWidthIn: 48, rollLengthFt: 125, sideLapIn: 2, endLapIn: 6 }),
  // Deck.
  {
    sku: "QM-DK-PLY-12",
    category: "deck",
    name: "Roof deck sheet, 1/2 in plywood, 4 × 8 ft",
    purchaseUnit: "sheet",
    packCoverage: 32,
    coverageUnit: "sqft",
    unitCostCents: 3400,
    wastePct: 10,
    materialKey: "deck-sheet",
    attributes: {},
  },
  // Trim and flashings, 24 ga, matte charcoal, 10 ft stock.
  piece("QM-TR-EAVE-10", "trim", "Eave trim / drip edge, 24 ga, 10 ft, matte charcoal", "trim-eave", 1850, 10, TRIM),
  piece("QM-TR-RAKE-10", "trim", "Rake trim, 24 ga, 10 ft, matte charcoal", "trim-rake", 2400, 10, TRIM),
  piece("QM-TR-RIDGE-10", "trim", "Ridge cap, 24 ga, 10 ft, matte charcoal", "ridge-cap", 3800, 10, TRIM),
  piece("QM-TR-HIP-10", "trim", "Hip cap, 24 ga, 10 ft, matte charcoal", "hip-cap", 3800, 10, TRIM),
  piece("QM-FL-VALLEY-10", "flashing", "Valley pan, 24 ga, 10 ft, matte charcoal", "valley-pan", 5200, 10, TRIM),
  piece("QM-FL-SIDE-10", "flashing", "Sidewall flashing, 24 ga, 10 ft, matte charcoal", "flashing-sidewall", 2600, 10, TRIM),
  piece("QM-FL-HEAD-10", "flashing", "Headwall flashing, 24 ga, 10 ft, matte charcoal", "flashing-headwall", 2600, 10, TRIM),
  piece("QM-FL-TRANS-10", "flashing", "Transition flashing, 24 ga, 10 ft, matte charcoal", "flashing-transition", 3400, 10, TRIM),
  each("QM-FL-CHIM-SET", "flashing", "Chimney flashing set (apron, steps, back pan), 24 ga", "flashing-chimney", 14500),
  each("QM-FL-SKY-SET", "flashing", "Skylight curb flashing set, 24 ga", "skylight-curb-flashing", 12000),
  // Closures.
  each("QM-CL-EAVE", "closures", "Eave closure, foam, profiled for 16 in standing seam", "closure-eave", 110),
  each("QM-CL-RIDGE", "closures", "Ridge and hip closure, metal, profiled", "closure-ridge", 135),
  each("QM-CL-VENT", "closures", "Vented closure, mesh-faced", "closure-vented", 240),
  // Fasteners: clips by the box of 100 (the takeoff counts clips each), screws by the box of 250.
  {
    sku: "QM-FX-CLIP-100",
    category: "fasteners",
    name: "Standing-seam clip, fixed, box of 100",
    purchaseUnit: "box",
    packCoverage: 100,
    coverageUnit: "ea",
    unitCostCents: 6200,
    wastePct: 5,
    materialKey: "clip",
    // Clip spacing by zone and screws per clip: common practice; the panel maker's uplift table governs.
    attributes: { clipSpacingFieldIn: 24, clipSpacingEdgeIn: 16, clipSpacingCornerIn: 12, screwsPerClip: 2 },
  },
  screwBox("QM-FX-SCR-CLIP", "Clip screw, #10 × 1 in pancake head, box of 250", "screw-clip", 2400),
  // Exposed-fastener screws per square by zone: 80 / 100 / 120 (from memory; the panel maker's schedule governs).
  screwBox("QM-FX-SCR-PANEL", "Panel screw, #10 × 1-1/2 in with sealing washer, box of 250", "screw-panel", 3200, {
    screwsPerSquareField: 80,
    screwsPerSquareEdge: 100,
    screwsPerSquareCorner: 120,
  }),
  screwBox("QM-FX-SCR-TRIM", "Trim stitch screw, #14 × 7/8 in, painted, box of 250", "screw-trim", 2200),
  screwBox("QM-FX-SCR-BATTEN", "Structural wood screw, 3 in, coated, box of 250", "screw-batten", 3800),
  // Sealants.
  {
    sku: "QM-SE-TUBE-10",
    category: "sealants",
    name: "Sealant tube, 10 oz, non-curing, about 25 ft of bead",
    purchaseUnit: "tube",
    packCoverage: 25,
    coverageUnit: "lf",
    unitCostCents: 950,
    wastePct: null,
    materialKey: "sealant-tube",
    attributes: {},
  },
  {
    sku: "QM-SE-BUTYL-50",
    category: "sealants",
    name: "Butyl tape, 1 in × 50 ft roll",
    purchaseUnit: "roll",
    packCoverage: 50,
    coverageUnit: "lf",
    unitCostCents: 1400,
    wastePct: null,
    materialKey: "butyl-tape",
    attributes: { rollLengthFt: 50 },
  },
  // Penetrations.
  each("QM-PB-03", "penetrations", "Pipe boot, pipes up to 3 in, high-temperature", "pipe-boot-3in", 1400),
  each("QM-PB-06", "penetrations", "Pipe boot, pipes over 3 in up to 6 in, high-temperature", "pipe-boot-6in", 1900),
  each("QM-PB-09", "penetrations", "Pipe boot, pipes over 6 in up to 9 in, high-temperature", "pipe-boot-9in", 2800),
  each("QM-PB-13", "penetrations", "Pipe boot, pipes over 9 in up to 13 in, high-temperature", "pipe-boot-13in", 4200),
  // Ventilation (net free area per foot: product-dependent, common practice values).
  {
    sku: "QM-VT-RIDGE-20",
    category: "ventilation",
    name: "Ridge vent, profiled for metal, 20 ft roll",
    purchaseUnit: "roll",
    packCoverage: 20,
    coverageUnit: "lf",
    unitCostCents: 5800,
    wastePct: null,
    materialKey: "vent-ridge",
    attributes: { nfaPerFtSqIn: 18 },
  },
  {
    sku: "QM-VT-INTAKE-10",
    category: "ventilation",
    name: "Eave intake vent strip, 10 ft",
    purchaseUnit: "pc",
    packCoverage: 10,
    coverageUnit: "lf",
    unitCostCents: 1600,
    wastePct: null,
    materialKey: "vent-intake",
    attributes: { nfaPerFtSqIn: 9 },
  },
  // Extras for manual lines.
  each("QM-AC-SNOWGUARD", "accessories", "Snow guard, clamp-on, for standing seam", null, 1150),
];

/**
 * Labour per square by pitch band. Steeper tiers are trade practice for slower, harnessed work on steep
 * roofs (common practice, not a code requirement). A band holds pitches p with minPitch ≤ p < maxPitch.
 */
export const DEMO_LABOR = [
  { kind: "pitch_band" as const, label: "Walkable, up to 6/12 (under 7/12)", minPitch: 0, maxPitch: 7, centsPerUnit: 19500, unit: "square" },
  { kind: "pitch_band" as const, label: "Steep, 7/12 to 9/12 (under 10/12)", minPitch: 7, maxPitch: 10, centsPerUnit: 23500, unit: "square" },
  { kind: "pitch_band" as const, label: "Very steep, 10/12 to 12/12 (under 13/12)", minPitch: 10, maxPitch: 13, centsPerUnit: 28500, unit: "square" },
  { kind: "pitch_band" as const, label: "Over 12/12", minPitch: 13, maxPitch: null, centsPerUnit: 34500, unit: "square" },
  { kind: "tear_off_per_layer" as const, label: "Tear-off and disposal, per layer", minPitch: null, maxPitch: null, centsPerUnit: 6500, unit: "square" },
  { kind: "deck_sheet" as const, label: "Deck sheet replacement labour, per 4 × 8 ft sheet", minPitch: null, maxPitch: null, centsPerUnit: 2800, unit: "sheet" },
  { kind: "other" as const, label: "Extra dumpster haul", minPitch: null, maxPitch: null, centsPerUnit: 45000, unit: "load" },
];

export const DEMO_SETTINGS: PricingSettingsInput = {
  pricingMode: "margin",
  markupPct: 50,
  targetMarginPct: 35,
  minMarginPct: 25,
  taxRatePct: 7,
  taxBasis: "cost",
  depositPct: 30,
  proposalValidityDays: 30,
};

export const DEMO_PROFILE = {
  legalName: "Quillmoor Standing Seam Company LLC",
  licenceNumber: "RC-4471-QM",
  addressLine1: "418 Tamsin Ridge Road",
  addressLine2: "Unit 2",
  city: "Harlow Bend",
  region: "VT",
  postalCode: "05999",
  phone: "(802) 555-0143",
  email: "office@example.com",
  website: "https://quillmoor.example.com",
  proposalPrefix: "QSS-",
  nextProposalNumber: 1001,
  proposalTerms:
    "Prices hold for the validity period shown. A deposit of the stated percentage is due on acceptance; the balance is due on completion. " +
    "Work is scheduled on receipt of the deposit and as weather allows. Changes requested after acceptance are priced in writing before the work is done. " +
    "Hidden damage found after tear-off (rotted deck, framing) is repaired at the unit prices in this proposal, with your approval first.",
  exclusions:
    "Not included unless listed: structural framing repairs, gutters and downspouts, electrical work near the roof (service masts, solar), " +
    "interior repairs, permits where the homeowner pulls them, and removal of hazardous materials.",
  warranty:
    "Workmanship is warranted for 10 years from completion. Panel finish and coating warranties are the manufacturer's and pass to the homeowner. " +
    "Installation follows the panel maker's tested installation details; local building codes and the authority having jurisdiction govern.",
};

async function seed(companyId: number, transaction: Transaction): Promise<boolean> {
  if (await CatalogItem.count({ where: { companyId }, transaction })) return false;
  for (const s of DEMO_PRICE_BOOK) {
    const item = await CatalogItem.create({ companyId, ...s, active: true, version: 1 }, { transaction });
    await CatalogItemPrice.create(
      { itemId: item.id, version: 1, unitCostCents: item.unitCostCents, packCoverage: item.packCoverage, wastePct: item.wastePct, changedBy: null },
      { transaction },
    );
  }
  await LaborRate.bulkCreate(
    DEMO_LABOR.map((r, i) => ({ companyId, ...r, sortOrder: i })),
    { transaction },
  );
  await CompanySettings.upsert({ companyId, ...DEMO_SETTINGS, priceBookVersion: 1 }, { transaction });
  await Company.update(DEMO_PROFILE, { where: { id: companyId }, transaction });
  return true;
}

/**
 * Seeds the demo price book, labour rates, pricing settings and profile for one company. Safe to run twice
 * (returns false when the company already has items). Pass the caller's transaction when the company was
 * created in one that has not committed yet.
 */
export async function seedDemoPriceBook(sequelize: Sequelize, companyId: number, transaction?: Transaction): Promise<boolean> {
  if (transaction) return seed(companyId, transaction);
  return sequelize.transaction((t) => seed(companyId, t));
}

/** Every material key has a demo item (checked by the tests). */
export const demoUnmappedKeys = () => Object.keys(MATERIAL_KEYS).filter((k) => !DEMO_PRICE_BOOK.some((i) => i.materialKey === k));
