import { randomUUID } from "node:crypto";
import type { CatalogItemFormValues, LaborRateInput } from "../../shared/schemas/price-book";
import { CatalogItem, CatalogItemPrice, CompanySettings, LaborRate } from "../../server/models/index";
import { DEFAULT_PRICING_SETTINGS, type PricingSettingsInput } from "../../shared/schemas/price-book";

/** A valid POST /api/price-book/items body (a trim piece sold by the 10 ft piece). */
export function catalogItemInput(overrides: Partial<CatalogItemFormValues> = {}): CatalogItemFormValues {
  return {
    sku: `T-${randomUUID().slice(0, 8)}`,
    category: "trim",
    name: "Eave trim, 24 ga, 10 ft, matte charcoal",
    purchaseUnit: "pc",
    packCoverage: 10,
    coverageUnit: "lf",
    unitCostCents: 1850,
    wastePct: null,
    materialKey: null,
    attributes: { stockLengthFt: 10, endLapIn: 3 },
    ...overrides,
  };
}

/** A catalog item row with its first price-history row, as the service writes them. */
export async function buildCatalogItem(companyId: number, overrides: Partial<CatalogItemFormValues> & { active?: boolean } = {}) {
  const { active = true, ...rest } = overrides;
  const input = catalogItemInput(rest);
  const item = await CatalogItem.create({
    companyId,
    sku: input.sku,
    category: input.category as CatalogItem["category"],
    name: input.name,
    purchaseUnit: input.purchaseUnit as CatalogItem["purchaseUnit"],
    packCoverage: input.packCoverage,
    coverageUnit: input.coverageUnit as CatalogItem["coverageUnit"],
    unitCostCents: input.unitCostCents,
    wastePct: input.wastePct ?? null,
    materialKey: input.materialKey ?? null,
    attributes: input.attributes ?? {},
    active,
    version: 1,
  });
  await CatalogItemPrice.create({
    itemId: item.id,
    version: 1,
    unitCostCents: item.unitCostCents,
    packCoverage: item.packCoverage,
    wastePct: item.wastePct,
    changedBy: null,
  });
  return item;
}

export async function buildLaborRate(companyId: number, overrides: Partial<LaborRateInput> = {}) {
  return LaborRate.create({
    companyId,
    kind: "pitch_band",
    label: "Under 7/12",
    minPitch: 0,
    maxPitch: 7,
    centsPerUnit: 19500,
    unit: "square",
    ...overrides,
  });
}

export async function buildPricingSettings(companyId: number, overrides: Partial<PricingSettingsInput> = {}) {
  return CompanySettings.create({ companyId, ...DEFAULT_PRICING_SETTINGS, ...overrides });
}
