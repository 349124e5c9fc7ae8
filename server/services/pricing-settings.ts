import type { Transaction } from "sequelize";
import { DEFAULT_PRICING_SETTINGS, type PricingSettingsDto, type PricingSettingsInput } from "../../shared/schemas/price-book";
import { CompanySettings } from "../models/index";

export const presentSettings = (s: CompanySettings): PricingSettingsDto => ({
  pricingMode: s.pricingMode,
  markupPct: s.markupPct,
  targetMarginPct: s.targetMarginPct,
  minMarginPct: s.minMarginPct,
  taxRatePct: s.taxRatePct,
  taxBasis: s.taxBasis,
  depositPct: s.depositPct,
  proposalValidityDays: s.proposalValidityDays,
  priceBookVersion: s.priceBookVersion,
});

/** The company's pricing settings; the defaults (price-book version 1) while none were saved. */
export async function getPricingSettings(companyId: number, transaction?: Transaction): Promise<PricingSettingsDto> {
  const row = await CompanySettings.findByPk(companyId, { transaction });
  return row ? presentSettings(row) : { ...DEFAULT_PRICING_SETTINGS, priceBookVersion: 1 };
}

/** The settings row, created with the defaults when missing, locked for the transaction. */
export async function lockSettingsRow(companyId: number, transaction: Transaction): Promise<CompanySettings> {
  // A locking read of a missing row takes a gap lock, and two writers that both insert after one
  // deadlock. So the row is created first, outside the transaction (two racing inserts: the loser's
  // is ignored), and only then locked: concurrent writers queue on the one row.
  const exists = await CompanySettings.count({ where: { companyId }, transaction });
  if (!exists) await CompanySettings.bulkCreate([{ companyId, ...DEFAULT_PRICING_SETTINGS }], { ignoreDuplicates: true });
  return (await CompanySettings.findByPk(companyId, { transaction, lock: transaction.LOCK.UPDATE }))!;
}

/**
 * Adds 1 to the company's price-book version. Every write to items, labour rates or settings calls it in its
 * transaction; the row lock also serialises concurrent price-book writes of one company.
 */
export async function bumpPriceBookVersion(companyId: number, transaction: Transaction): Promise<number> {
  const row = await lockSettingsRow(companyId, transaction);
  await row.increment("priceBookVersion", { by: 1, transaction });
  await row.reload({ transaction });
  return row.priceBookVersion;
}

export async function savePricingSettings(companyId: number, input: PricingSettingsInput, transaction: Transaction) {
  const row = await lockSettingsRow(companyId, transaction);
  const before = presentSettings(row);
  await row.update({ ...input, priceBookVersion: row.priceBookVersion + 1 }, { transaction });
  return { before, after: presentSettings(row) };
}
