import { Op, type Sequelize, type Transaction, type WhereOptions } from "sequelize";
import { MATERIAL_KEYS } from "../../shared/engine/materials";
import {
  PRICE_FIELDS,
  attributeIssues,
  itemUnitIssues,
  type CatalogItemAttributes,
  type CatalogItemInput,
  type CatalogItemListQuery,
  type CatalogItemUpdate,
  type CsvRowError,
  type LaborRatesInput,
  type MaterialMappingDto,
  type PriceBookImportPreview,
  type PricingSettingsInput,
} from "../../shared/schemas/price-book";
import { CatalogItem, CatalogItemPrice, LaborRate } from "../models/index";
import { HttpError, badRequest, conflict, notFound } from "../errors";
import { recordAudit } from "./audit.service";
import { bumpPriceBookVersion, getPricingSettings, savePricingSettings } from "./pricing-settings";
import { rulesBuildForCompany } from "./price-book-rules";
import { parsePriceBookCsv, serializePriceBookCsv } from "./price-book-csv";
import { presentCatalogItem } from "../presenters/price-book.presenter";

type Actor = Express.User;

const ITEM_FIELDS = [
  "sku",
  "category",
  "name",
  "purchaseUnit",
  "packCoverage",
  "coverageUnit",
  "unitCostCents",
  "wastePct",
  "materialKey",
  "attributes",
] as const;
type ItemField = (typeof ITEM_FIELDS)[number];
type ItemValues = Pick<CatalogItem, ItemField>;

const sameValue = (a: unknown, b: unknown) => JSON.stringify(a ?? null) === JSON.stringify(b ?? null);

/** Attributes compared without regard to key order. */
const canonicalAttributes = (a: CatalogItemAttributes) =>
  Object.fromEntries(Object.entries(a ?? {}).filter(([, v]) => v !== undefined).sort(([x], [y]) => x.localeCompare(y)));

function diff(before: ItemValues, after: ItemValues): Record<string, { from: unknown; to: unknown }> {
  const out: Record<string, { from: unknown; to: unknown }> = {};
  for (const f of ITEM_FIELDS) {
    const a = f === "attributes" ? canonicalAttributes(before.attributes) : before[f];
    const b = f === "attributes" ? canonicalAttributes(after.attributes) : after[f];
    if (!sameValue(a, b)) out[f] = { from: a, to: b };
  }
  return out;
}

const skuTaken = () => new HttpError(409, "sku_taken", "Another item already has this SKU", { sku: "Another item already has this SKU" });

const keyTaken = (holder: CatalogItem) => {
  const msg = `Already priced by ${holder.sku} (${holder.name}); change that item first`;
  return new HttpError(409, "material_key_taken", msg, { materialKey: msg }, { holderId: holder.id });
};

export class PriceBookService {
  constructor(private readonly sequelize: Sequelize) {}

  // ---- items ---------------------------------------------------------------------------------------

  listItems(query: CatalogItemListQuery, actor: Actor) {
    const where: WhereOptions<CatalogItem> & Record<string | symbol, unknown> = { companyId: actor.companyId };
    if (query.archived === "1" || query.archived === "true") where.active = false;
    else if (query.archived !== "all") where.active = true;
    if (query.category) where.category = query.category;
    if (query.q) {
      const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
      where[Op.or] = [{ sku: { [Op.like]: like } }, { name: { [Op.like]: like } }, { materialKey: { [Op.like]: like } }];
    }
    return CatalogItem.findAll({ where, order: [["category", "ASC"], ["name", "ASC"], ["id", "ASC"]] });
  }

  async getItem(id: number, actor: Actor, transaction?: Transaction, lock = false): Promise<CatalogItem> {
    const item = await CatalogItem.findOne({
      where: { id, companyId: actor.companyId },
      transaction,
      lock: lock && transaction ? transaction.LOCK.UPDATE : undefined,
    });
    if (!item) throw notFound("Item");
    return item;
  }

  async priceHistory(id: number, actor: Actor) {
    await this.getItem(id, actor);
    return CatalogItemPrice.findAll({ where: { itemId: id }, order: [["version", "DESC"]] });
  }

  private async assertSkuFree(companyId: number, sku: string, exceptId: number | null, transaction: Transaction) {
    const where: Record<string | symbol, unknown> = { companyId, sku };
    if (exceptId) where.id = { [Op.ne]: exceptId };
    if (await CatalogItem.findOne({ where, transaction })) throw skuTaken();
  }

  private async assertKeyFree(companyId: number, key: string | null, exceptId: number | null, transaction: Transaction) {
    if (!key) return;
    const where: Record<string | symbol, unknown> = { companyId, materialKey: key, active: true };
    if (exceptId) where.id = { [Op.ne]: exceptId };
    const holder = await CatalogItem.findOne({ where, transaction });
    if (holder) throw keyTaken(holder);
  }

  private writePrice(item: CatalogItem, actor: Actor, transaction: Transaction) {
    return CatalogItemPrice.create(
      {
        itemId: item.id,
        version: item.version,
        unitCostCents: item.unitCostCents,
        packCoverage: item.packCoverage,
        wastePct: item.wastePct,
        changedBy: actor.id,
      },
      { transaction },
    );
  }

  async createItem(input: CatalogItemInput, actor: Actor): Promise<CatalogItem> {
    return this.sequelize.transaction(async (transaction) => {
      await bumpPriceBookVersion(actor.companyId, transaction); // also serialises this company's price-book writes
      await this.assertSkuFree(actor.companyId, input.sku, null, transaction);
      await this.assertKeyFree(actor.companyId, input.materialKey, null, transaction);
      const item = await CatalogItem.create({ companyId: actor.companyId, ...input, active: true, version: 1 }, { transaction });
      await this.writePrice(item, actor, transaction);
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "catalog_item",
          entityId: item.id,
          action: "created",
          changes: { sku: item.sku, name: item.name, unitCostCents: item.unitCostCents, materialKey: item.materialKey },
        },
        transaction,
      );
      return item;
    });
  }

  /**
   * Optimistic update: the client sends the version it loaded; another version answers 409 with the current
   * one. An accepted change adds 1 to the version; a change of cost, pack coverage or waste also writes a
   * price-history row at the new version.
   */
  async updateItem(id: number, input: CatalogItemUpdate, actor: Actor): Promise<CatalogItem> {
    return this.sequelize.transaction(async (transaction) => {
      await bumpPriceBookVersion(actor.companyId, transaction);
      const item = await this.getItem(id, actor, transaction, true);
      if (input.version !== item.version) {
        throw conflict("stale_version", "Someone else changed this item; reload it and try again", { currentVersion: item.version });
      }
      const before: ItemValues = Object.fromEntries(ITEM_FIELDS.map((f) => [f, item[f]])) as unknown as ItemValues;
      const after: ItemValues = { ...before };
      for (const f of ITEM_FIELDS) if (input[f] !== undefined) (after as Record<string, unknown>)[f] = input[f];
      const issues = [
        ...itemUnitIssues(after),
        ...attributeIssues(after.attributes).map((i) => ({ path: `attributes.${i.path}`, message: i.message })),
      ];
      if (issues.length) throw badRequest("Please check the highlighted fields", Object.fromEntries(issues.map((i) => [i.path, i.message])));
      const changes = diff(before, after);
      if (Object.keys(changes).length === 0) {
        // Nothing changed: no new version, and the price-book version bump above is undone with the rollback.
        throw new NoChange(item);
      }
      if (changes.sku) await this.assertSkuFree(actor.companyId, after.sku, item.id, transaction);
      if (changes.materialKey && item.active) await this.assertKeyFree(actor.companyId, after.materialKey, item.id, transaction);
      await item.update({ ...after, version: item.version + 1 }, { transaction });
      const priceChanged = PRICE_FIELDS.some((f) => f in changes);
      if (priceChanged) await this.writePrice(item, actor, transaction);
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "catalog_item",
          entityId: item.id,
          action: priceChanged ? "price_changed" : "updated",
          changes: { ...changes, version: { from: input.version, to: item.version } },
        },
        transaction,
      );
      return item;
    }).catch((err: unknown) => {
      if (err instanceof NoChange) return err.item;
      throw err;
    });
  }

  /** Archive (active=false) or restore an item; a restored item's material key must still be free. */
  async setActive(id: number, active: boolean, actor: Actor): Promise<CatalogItem> {
    return this.sequelize.transaction(async (transaction) => {
      await bumpPriceBookVersion(actor.companyId, transaction);
      const item = await this.getItem(id, actor, transaction, true);
      if (item.active === active) return item;
      if (active) await this.assertKeyFree(actor.companyId, item.materialKey, item.id, transaction);
      await item.update({ active, version: item.version + 1 }, { transaction });
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "catalog_item",
          entityId: item.id,
          action: active ? "restored" : "archived",
          changes: { sku: item.sku, version: item.version },
        },
        transaction,
      );
      return item;
    });
  }

  // ---- mapping -------------------------------------------------------------------------------------

  async mapping(actor: Actor) {
    const items = await CatalogItem.findAll({ where: { companyId: actor.companyId, active: true, materialKey: { [Op.ne]: null } } });
    const byKey = new Map(items.map((i) => [i.materialKey!, i]));
    const data: MaterialMappingDto[] = (Object.entries(MATERIAL_KEYS) as Array<[keyof typeof MATERIAL_KEYS, (typeof MATERIAL_KEYS)[keyof typeof MATERIAL_KEYS]]>).map(
      ([key, info]) => {
        const i = byKey.get(key);
        return {
          key,
          category: info.category,
          unit: info.unit,
          description: info.description,
          item: i ? { id: i.id, sku: i.sku, name: i.name, purchaseUnit: i.purchaseUnit, unitCostCents: i.unitCostCents } : null,
        };
      },
    );
    const build = await rulesBuildForCompany(actor.companyId);
    return { data, conflicts: build.conflicts };
  }

  // ---- labour --------------------------------------------------------------------------------------

  listLabor(actor: Actor) {
    return LaborRate.findAll({ where: { companyId: actor.companyId }, order: [["sortOrder", "ASC"], ["id", "ASC"]] });
  }

  async replaceLabor(input: LaborRatesInput, actor: Actor) {
    await this.sequelize.transaction(async (transaction) => {
      await bumpPriceBookVersion(actor.companyId, transaction);
      const before = await LaborRate.findAll({ where: { companyId: actor.companyId }, order: [["sortOrder", "ASC"], ["id", "ASC"]], transaction });
      await LaborRate.destroy({ where: { companyId: actor.companyId }, transaction });
      await LaborRate.bulkCreate(
        input.rates.map((r, i) => ({
          companyId: actor.companyId,
          kind: r.kind,
          label: r.label,
          minPitch: r.kind === "pitch_band" ? r.minPitch : null,
          maxPitch: r.kind === "pitch_band" ? r.maxPitch : null,
          centsPerUnit: r.centsPerUnit,
          unit: r.unit,
          sortOrder: i,
        })),
        { transaction },
      );
      const summary = (rs: Array<{ kind: string; label: string; centsPerUnit: number }>) =>
        rs.map((r) => `${r.kind}: ${r.label} = ${r.centsPerUnit}`);
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "labor_rates",
          entityId: actor.companyId,
          action: "replaced",
          changes: { from: summary(before), to: summary(input.rates) },
        },
        transaction,
      );
    });
    return this.listLabor(actor);
  }

  // ---- settings ------------------------------------------------------------------------------------

  getSettings(actor: Actor) {
    return getPricingSettings(actor.companyId);
  }

  async putSettings(input: PricingSettingsInput, actor: Actor) {
    return this.sequelize.transaction(async (transaction) => {
      const { before, after } = await savePricingSettings(actor.companyId, input, transaction);
      const changes: Record<string, unknown> = {};
      for (const k of Object.keys(input) as Array<keyof PricingSettingsInput>) {
        if (before[k] !== after[k]) changes[k] = { from: before[k], to: after[k] };
      }
      await recordAudit(
        { companyId: actor.companyId, actorId: actor.id, entityType: "pricing_settings", entityId: actor.companyId, action: "updated", changes },
        transaction,
      );
      return after;
    });
  }

  // ---- CSV -----------------------------------------------------------------------------------------

  async exportCsv(actor: Actor): Promise<string> {
    const items = await CatalogItem.findAll({
      where: { companyId: actor.companyId },
      order: [["active", "DESC"], ["category", "ASC"], ["sku", "ASC"]],
    });
    return serializePriceBookCsv(items.map(presentCatalogItem));
  }

  /**
   * Checks a CSV and, with `commit`, saves it: items are matched by SKU (created or updated, never
   * deleted), all in one transaction, and nothing is saved when any row is wrong.
   */
  async importCsv(buf: Buffer, commit: boolean, actor: Actor): Promise<PriceBookImportPreview> {
    const parsed = parsePriceBookCsv(buf);
    const run = async (transaction: Transaction) => {
      if (commit) await bumpPriceBookVersion(actor.companyId, transaction);
      const existing = await CatalogItem.findAll({
        where: { companyId: actor.companyId },
        transaction,
        lock: commit ? transaction.LOCK.UPDATE : undefined,
      });
      const bySku = new Map(existing.map((i) => [i.sku.toLowerCase(), i]));
      const errors: CsvRowError[] = [...parsed.errors];
      const rows: PriceBookImportPreview["rows"] = [];
      const plan: Array<{ row: number; item: CatalogItem | null; values: ItemValues & { active: boolean }; changes: Record<string, unknown> }> = [];
      for (const r of parsed.rows) {
        const item = bySku.get(r.data.sku.toLowerCase()) ?? null;
        const values = { ...r.data };
        if (!item) {
          plan.push({ row: r.row, item: null, values, changes: {} });
          rows.push({ row: r.row, sku: values.sku, action: "create", changes: [] });
          continue;
        }
        const before: ItemValues = Object.fromEntries(ITEM_FIELDS.map((f) => [f, item[f]])) as unknown as ItemValues;
        // A column the file does not have leaves that attribute as it is (a blank cell clears it).
        const kept = Object.entries(item.attributes ?? {}).filter(([attr]) => !parsed.attributesInFile.has(attr));
        values.attributes = { ...Object.fromEntries(kept), ...values.attributes } as typeof values.attributes;
        const changes: Record<string, unknown> = diff(before, values);
        if (item.active !== values.active) changes.active = { from: item.active, to: values.active };
        plan.push({ row: r.row, item, values, changes });
        rows.push({ row: r.row, sku: item.sku, action: Object.keys(changes).length ? "update" : "unchanged", changes: Object.keys(changes) });
      }
      // One active item per material key, counting the items the file leaves alone.
      const inFile = new Set(plan.filter((p) => p.item).map((p) => p.item!.id));
      const holders = new Map<string, string>();
      for (const i of existing) if (!inFile.has(i.id) && i.active && i.materialKey) holders.set(i.materialKey, `item ${i.sku}, which the file does not change`);
      for (const p of plan) {
        const key = p.values.materialKey;
        if (!key || !p.values.active) continue;
        const holder = holders.get(key);
        if (holder) errors.push({ row: p.row, column: "material_key", message: `Already priced by ${holder}` });
        else holders.set(key, `row ${p.row}`);
      }
      errors.sort((a, b) => a.row - b.row);
      const summary = {
        create: rows.filter((r) => r.action === "create").length,
        update: rows.filter((r) => r.action === "update").length,
        unchanged: rows.filter((r) => r.action === "unchanged").length,
      };
      const preview: PriceBookImportPreview = { valid: errors.length === 0, committed: false, errors, warnings: parsed.warnings, rows, summary };
      if (!commit || errors.length) return preview;

      // Free the keys that move first, so the unique active-key index never sees two holders mid-way.
      for (const p of plan) {
        if (p.item && p.item.materialKey && (p.changes.materialKey || p.changes.active)) {
          await p.item.update({ materialKey: null }, { transaction });
        }
      }
      for (const p of plan) {
        if (!p.item) {
          const item = await CatalogItem.create({ companyId: actor.companyId, ...p.values, version: 1 }, { transaction });
          await this.writePrice(item, actor, transaction);
          continue;
        }
        if (Object.keys(p.changes).length === 0) continue;
        await p.item.update({ ...p.values, version: p.item.version + 1 }, { transaction });
        if (PRICE_FIELDS.some((f) => f in p.changes)) await this.writePrice(p.item, actor, transaction);
      }
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "price_book",
          entityId: actor.companyId,
          action: "csv_imported",
          changes: {
            created: rows.filter((r) => r.action === "create").map((r) => r.sku),
            updated: rows.filter((r) => r.action === "update").map((r) => ({ sku: r.sku, fields: r.changes })),
          },
        },
        transaction,
      );
      return { ...preview, committed: true };
    };
    if (!commit) return run(undefined as unknown as Transaction);
    return this.sequelize.transaction(run);
  }
}

/** Thrown inside a transaction to roll back a no-op update and hand back the item as it is. */
class NoChange extends Error {
  constructor(readonly item: CatalogItem) {
    super("no change");
  }
}
