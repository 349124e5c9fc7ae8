/**
 * The price book as the engine and the pricing see it.
 *
 * - `rulesForCompany`: the engine's `rules` (waste, roll sizes and laps, stock lengths, coverages…) from the
 *   company's active items mapped to material keys. Only fields the price book knows are set; the engine
 *   fills the rest with its defaults. The server computes every stored takeoff with it and the browser
 *   preview fetches the same object (GET /api/price-book/rules), so both agree.
 * - `priceBookForCompany`: the input of shared/pricing's `priceQuote` (items, labour, settings) and a
 *   snapshot (item ids and versions, the price-book version) for a quote revision to keep.
 *
 * Where several items feed one rules field (the engine has one trim stock length, one screw box size,
 * one underlayment waste), the first item in material-key order wins and the others are reported as
 * conflicts by `rulesFromItems` (shown on GET /api/price-book/mapping).
 */
import { QueryTypes, type Transaction } from "sequelize";
import { MATERIAL_KEYS, type MaterialKey } from "../../shared/engine/materials";
import type { PriceBook, PriceBookItem, PitchBand, PricingSettings } from "../../shared/pricing/price-quote";
import type { CatalogItemAttributes } from "../../shared/schemas/price-book";
import { CatalogItem, CatalogItemPrice, LaborRate } from "../models/index";
import { executeBinary } from "../db/sql";
import { getPricingSettings } from "./pricing-settings";

export interface RuleSourceItem {
  id: number;
  sku: string;
  materialKey: string | null;
  purchaseUnit: string;
  coverageUnit: string;
  packCoverage: number;
  wastePct: number | null;
  attributes: CatalogItemAttributes;
}

export interface RulesConflict {
  /** Dotted path in `rules`, e.g. "trim.stockLengthFt". */
  field: string;
  used: { key: string; sku: string; value: number };
  ignored: Array<{ key: string; sku: string; value: number }>;
}

export interface RulesBuild {
  rules: Record<string, unknown>;
  /** Dotted rules path → the item that set it. */
  sources: Record<string, { key: string; sku: string; itemId: number }>;
  conflicts: RulesConflict[];
}

const KEY_ORDER = new Map(Object.keys(MATERIAL_KEYS).map((k, i) => [k, i]));

const ROLL_TARGETS: Partial<Record<MaterialKey, string>> = {
  "underlayment-self-adhered": "underlayment.selfAdhered",
  "underlayment-synthetic": "underlayment.synthetic",
  "underlayment-felt-30": "underlayment.felt30",
  "underlayment-felt-15": "underlayment.felt15",
  // The engine also sizes the valley membrane strip with the ice-barrier roll.
  "ice-barrier": "iceBarrier",
  "spacer-mesh": "mesh",
  "spacer-dimpled": "dimpled",
  "radiant-barrier-foil": "foil",
};

const TRIM_KEYS: MaterialKey[] = [
  "trim-eave",
  "trim-rake",
  "ridge-cap",
  "hip-cap",
  "valley-pan",
  "flashing-sidewall",
  "flashing-headwall",
  "flashing-transition",
];
const BATTEN_KEYS: MaterialKey[] = [
  "batten-1x3",
  "batten-1x4",
  "batten-2x2",
  "batten-2x4",
  "counter-batten-1x3",
  "counter-batten-1x4",
  "counter-batten-2x2",
  "counter-batten-2x4",
];
const SCREW_BOX_KEYS: MaterialKey[] = ["screw-clip", "screw-panel", "screw-trim", "screw-batten"];

function wasteTarget(key: MaterialKey): string | null {
  if (key.startsWith("underlayment-")) return "waste.underlaymentPct";
  if (key === "ice-barrier" || key === "valley-membrane") return "waste.iceBarrierPct";
  if (key === "spacer-mesh") return "waste.meshPct";
  if (key === "spacer-dimpled") return "waste.dimpledPct";
  if (key === "radiant-barrier-foil") return "waste.foilPct";
  if (BATTEN_KEYS.includes(key)) return "waste.battensPct";
  if (key === "clip" || SCREW_BOX_KEYS.includes(key)) return "waste.fastenersPct";
  if (key === "deck-sheet") return "waste.deckPct";
  if (TRIM_KEYS.includes(key)) return "waste.trimPct";
  return null;
}

/** Linear feet per piece: the stock-length attribute, else the pack coverage of a piece bought by the piece and counted in LF. */
const stockLength = (i: RuleSourceItem) =>
  i.attributes.stockLengthFt ?? (i.coverageUnit === "lf" && i.purchaseUnit !== "lf" ? i.packCoverage : undefined);

/** The rules values one item gives, as [dotted path, value]. */
export function ruleContributions(item: RuleSourceItem): Array<[string, number]> {
  const key = item.materialKey as MaterialKey | null;
  if (!key || !(key in MATERIAL_KEYS)) return [];
  const a = item.attributes ?? {};
  const out: Array<[string, number | undefined]> = [];
  const roll = ROLL_TARGETS[key];
  if (roll) {
    out.push([`${roll}.rollWidthIn`, a.rollWidthIn], [`${roll}.rollLengthFt`, a.rollLengthFt]);
    out.push([`${roll}.sideLapIn`, a.sideLapIn], [`${roll}.endLapIn`, a.endLapIn]);
  }
  const waste = wasteTarget(key);
  if (waste && item.wastePct !== null && item.wastePct !== undefined) out.push([waste, item.wastePct]);
  if (BATTEN_KEYS.includes(key)) out.push(["battens.stockLengthFt", stockLength(item)]);
  if (TRIM_KEYS.includes(key)) out.push(["trim.stockLengthFt", stockLength(item)], ["trim.endLapIn", a.endLapIn]);
  if (key === "deck-sheet" && item.coverageUnit === "sqft" && item.purchaseUnit !== "sqft") out.push(["deck.sheetSqFt", item.packCoverage]);
  if (SCREW_BOX_KEYS.includes(key) && item.purchaseUnit === "box" && ["ea", "pc"].includes(item.coverageUnit)) {
    // The engine counts screws by whole pieces per box.
    if (Number.isInteger(item.packCoverage) && item.packCoverage >= 1) out.push(["fasteners.screwsPerBox", item.packCoverage]);
  }
  if (key === "screw-panel") {
    out.push(["exposedFastener.screwsPerSquare.field", a.screwsPerSquareField]);
    out.push(["exposedFastener.screwsPerSquare.edge", a.screwsPerSquareEdge]);
    out.push(["exposedFastener.screwsPerSquare.corner", a.screwsPerSquareCorner]);
  }
  if (key === "clip") {
    out.push(["clips.spacingIn.field", a.clipSpacingFieldIn], ["clips.spacingIn.edge", a.clipSpacingEdgeIn]);
    out.push(["clips.spacingIn.corner", a.clipSpacingCornerIn], ["clips.screwsPerClip", a.screwsPerClip]);
  }
  if (key === "sealant-tube" && item.coverageUnit === "lf" && item.purchaseUnit !== "lf") out.push(["sealant.lfPerTube", item.packCoverage]);
  if (key === "butyl-tape") {
    out.push(["butyl.rollLengthFt", a.rollLengthFt ?? (item.coverageUnit === "lf" && item.purchaseUnit !== "lf" ? item.packCoverage : undefined)]);
  }
  if (key === "vent-ridge") out.push(["vents.ridgeNfaPerFtSqIn", a.nfaPerFtSqIn]);
  if (key === "vent-intake") out.push(["vents.intakeNfaPerFtSqIn", a.nfaPerFtSqIn]);
  if (key === "panel-standing-seam" || key === "panel-exposed-fastener") out.push(["panels.maxLengthFt", a.maxLengthFt]);
  return out.filter((c): c is [string, number] => typeof c[1] === "number" && Number.isFinite(c[1]));
}

function setPath(obj: Record<string, unknown>, path: string, value: unknown) {
  const parts = path.split(".");
  let node = obj;
  for (const p of parts.slice(0, -1)) {
    if (typeof node[p] !== "object" || node[p] === null) node[p] = {};
    node = node[p] as Record<string, unknown>;
  }
  node[parts[parts.length - 1]] = value;
}

/** Pure: the engine's rules from mapped items (inactive items must already be left out). */
export function rulesFromItems(items: RuleSourceItem[]): RulesBuild {
  const sorted = items
    .filter((i) => i.materialKey && KEY_ORDER.has(i.materialKey))
    .sort((a, b) => KEY_ORDER.get(a.materialKey!)! - KEY_ORDER.get(b.materialKey!)! || a.id - b.id);
  const rules: Record<string, unknown> = {};
  const sources: RulesBuild["sources"] = {};
  const byField = new Map<string, RulesConflict>();
  for (const item of sorted) {
    for (const [field, value] of ruleContributions(item)) {
      const who = { key: item.materialKey!, sku: item.sku, value };
      const seen = byField.get(field);
      if (!seen) {
        byField.set(field, { field, used: who, ignored: [] });
        setPath(rules, field, value);
        sources[field] = { key: item.materialKey!, sku: item.sku, itemId: item.id };
      } else if (seen.used.value !== value) {
        seen.ignored.push(who);
      }
    }
  }
  const conflicts = [...byField.values()].filter((c) => c.ignored.length > 0);
  return { rules, sources, conflicts };
}

async function activeMappedItems(companyId: number, transaction?: Transaction) {
  const rows = await CatalogItem.findAll({ where: { companyId, active: true }, order: [["id", "ASC"]], transaction });
  return rows.filter((r) => r.materialKey !== null);
}


/** A rule source item as the database hands it back (decimals may come as text, JSON as text or parsed). */
interface RuleSourceRow {
  id: number | string;
  sku: string;
  materialKey: string;
  purchaseUnit: string;
  coverageUnit: string;
  packCoverage: string | number;
  wastePct: string | number | null;
  attributes: unknown;
}

function toRuleSourceItem(r: RuleSourceRow): RuleSourceItem {
  return {
    id: Number(r.id),
    sku: r.sku,
    materialKey: r.materialKey,
    purchaseUnit: r.purchaseUnit,
    coverageUnit: r.coverageUnit,
    packCoverage: Number(r.packCoverage),
    wastePct: r.wastePct === null ? null : Number(r.wastePct),
    // The mariadb driver may hand JSON back as text.
    attributes: (typeof r.attributes === "string" ? JSON.parse(r.attributes) : (r.attributes ?? {})) as CatalogItemAttributes,
  };
}

/** The last few price books' rules by their items' content (a company edits its price book rarely). */
const rulesMemo = new Map<string, Record<string, unknown>>();
const RULES_MEMO_MAX = 64;

/**
 * `rulesFromItems(items).rules`, kept by the items' content, for the roof save (every save reads the items; the
 * rules only change when they do). Any change to an item gives another key, so nothing needs clearing. The
 * answer is shared between saves: read it, never change it.
 */
export function rulesOfItems(items: RuleSourceItem[]): Record<string, unknown> {
  const key = JSON.stringify(items);
  let rules = rulesMemo.get(key);
  if (!rules) {
    if (rulesMemo.size >= RULES_MEMO_MAX) rulesMemo.clear();
    rules = rulesFromItems(items).rules;
    rulesMemo.set(key, rules);
  }
  return rules;
}

/**
 * The active mapped items as rule sources, read with one plain query: every roof save and every preview
 * takeoff reads them, so only the columns the rules use are read and no model objects are built.
 */
const RULE_SOURCE_ITEMS_SQL = `SELECT id, sku, material_key AS materialKey, purchase_unit AS purchaseUnit, coverage_unit AS coverageUnit,
            pack_coverage AS packCoverage, waste_pct AS wastePct, attributes
       FROM catalog_items
      WHERE company_id = ? AND active = 1 AND material_key IS NOT NULL
      ORDER BY id`;

export async function ruleSourceItems(companyId: number, transaction?: Transaction): Promise<RuleSourceItem[]> {
  const sequelize = CatalogItem.sequelize!;
  // In a transaction (every roof save) on its connection with the binary protocol, without Sequelize's query layer.
  const rows = transaction
    ? await executeBinary<RuleSourceRow[]>(sequelize, transaction, RULE_SOURCE_ITEMS_SQL, [companyId])
    : await sequelize.query<RuleSourceRow>(RULE_SOURCE_ITEMS_SQL, { replacements: [companyId], type: QueryTypes.SELECT, raw: true });
  return rows.map(toRuleSourceItem);
}

/** The full build (rules, where each value came from, conflicts), for the mapping page. */
export async function rulesBuildForCompany(companyId: number, transaction?: Transaction): Promise<RulesBuild> {
  return rulesFromItems(await ruleSourceItems(companyId, transaction));
}

/** The engine's `rules` input from the company's price book (fields the price book does not know are left to the engine). */
export async function rulesForCompany(companyId: number, transaction?: Transaction): Promise<Record<string, unknown>> {
  return (await rulesBuildForCompany(companyId, transaction)).rules;
}

/**
 * Takeoff units per purchase unit, for the pricing. The takeoff counts a material in its key's unit
 * (rolls, pieces, boxes…, already rounded up): an item bought in that unit prices one per unit (its pack
 * coverage, e.g. ft² per roll, went into the rules instead); an item covering that unit (a box of 100 clips,
 * a 20 ft roll of ridge vent) divides by its pack coverage. null: the units do not fit.
 */
export function pricingPackCoverage(item: Pick<RuleSourceItem, "materialKey" | "purchaseUnit" | "coverageUnit" | "packCoverage">): number | null {
  const info = item.materialKey ? (MATERIAL_KEYS as Record<string, { unit: string }>)[item.materialKey] : undefined;
  if (!info) return null;
  if (item.purchaseUnit === info.unit) return 1;
  if (item.coverageUnit === info.unit) return item.packCoverage;
  return null;
}

export interface PriceBookSnapshot {
  priceBookVersion: number;
  takenAt: string;
  items: Array<{ id: number; sku: string; version: number; materialKey: string }>;
  laborRateIds: number[];
}

export interface PriceBookForQuote {
  priceBook: PriceBook;
  snapshot: PriceBookSnapshot;
  /** Material keys with no active item (the pricing lists them as missing when the takeoff uses them). */
  unmappedKeys: string[];
  /** Labour the pricing needs but the company has no rate for. */
  missingLabor: Array<"pitch_band" | "tear_off_per_layer" | "deck_sheet">;
}

/** The pricing input (shared/pricing `PriceBook`) and what a quote revision keeps to show which prices it used. */
export async function priceBookForCompany(companyId: number, transaction?: Transaction): Promise<PriceBookForQuote> {
  const [items, rates, settings] = await Promise.all([
    activeMappedItems(companyId, transaction),
    LaborRate.findAll({ where: { companyId }, order: [["sortOrder", "ASC"], ["id", "ASC"]], transaction }),
    getPricingSettings(companyId, transaction),
  ]);
  const priced: Array<{ row: CatalogItem; item: PriceBookItem }> = [];
  for (const row of items) {
    const packCoverage = pricingPackCoverage(row);
    if (packCoverage === null || !(packCoverage > 0)) continue;
    const item: PriceBookItem = {
      id: String(row.id),
      key: row.materialKey!,
      name: row.name,
      unit: row.purchaseUnit,
      packCoverage,
      unitCostCents: row.unitCostCents,
    };
    if (row.wastePct !== null) item.wastePct = row.wastePct;
    priced.push({ row, item });
  }
  const pitchBands: PitchBand[] = rates
    .filter((r) => r.kind === "pitch_band" && r.minPitch !== null)
    .sort((a, b) => a.minPitch! - b.minPitch!)
    .map((r) => ({ id: String(r.id), minPitch: r.minPitch!, maxPitch: r.maxPitch, centsPerSquare: r.centsPerUnit }));
  const tearOff = rates.find((r) => r.kind === "tear_off_per_layer");
  const deck = rates.find((r) => r.kind === "deck_sheet");
  const missingLabor: PriceBookForQuote["missingLabor"] = [];
  if (pitchBands.length === 0) missingLabor.push("pitch_band");
  if (!tearOff) missingLabor.push("tear_off_per_layer");
  if (!deck) missingLabor.push("deck_sheet");
  const pricing: PricingSettings = {
    pricingMode: settings.pricingMode,
    markupPct: settings.markupPct,
    targetMarginPct: settings.targetMarginPct,
    minMarginPct: settings.minMarginPct,
    taxRatePct: settings.taxRatePct,
    taxBasis: settings.taxBasis,
    depositPct: settings.depositPct,
  };
  const mappedKeys = new Set(priced.map((p) => p.item.key));
  return {
    priceBook: {
      items: priced.map((p) => p.item),
      labor: {
        pitchBands,
        tearOffPerSquarePerLayerCents: tearOff?.centsPerUnit ?? 0,
        deckSheetCents: deck?.centsPerUnit ?? 0,
      },
      settings: pricing,
    },
    snapshot: {
      priceBookVersion: settings.priceBookVersion,
      takenAt: new Date().toISOString(),
      items: priced.map((p) => ({ id: p.row.id, sku: p.row.sku, version: p.row.version, materialKey: p.row.materialKey! })),
      laborRateIds: rates.map((r) => r.id),
    },
    unmappedKeys: Object.keys(MATERIAL_KEYS).filter((k) => !mappedKeys.has(k)),
    missingLabor,
  };
}

/**
 * The prices of items as of the versions a snapshot recorded (from the price history): what a quote made
 * then used, whatever the items cost now. Items without history at that version are left out.
 */
export async function itemPricesAt(
  items: Array<{ id: number; version: number }>,
  transaction?: Transaction,
): Promise<Map<number, { version: number; unitCostCents: number; packCoverage: number; wastePct: number | null }>> {
  const out = new Map<number, { version: number; unitCostCents: number; packCoverage: number; wastePct: number | null }>();
  if (items.length === 0) return out;
  const rows = await CatalogItemPrice.findAll({
    where: { itemId: items.map((i) => i.id) },
    order: [["itemId", "ASC"], ["version", "ASC"]],
    transaction,
  });
  const wanted = new Map(items.map((i) => [i.id, i.version]));
  for (const r of rows) {
    if (r.version > (wanted.get(r.itemId) ?? 0)) continue;
    out.set(r.itemId, { version: r.version, unitCostCents: r.unitCostCents, packCoverage: r.packCoverage, wastePct: r.wastePct });
  }
  return out;
}
