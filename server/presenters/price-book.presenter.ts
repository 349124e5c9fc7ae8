import type { CatalogItemDto, CatalogItemPriceDto, LaborRateDto } from "../../shared/schemas/price-book";
import type { CatalogItem, CatalogItemPrice, LaborRate } from "../models/index";

export const presentCatalogItem = (i: CatalogItem): CatalogItemDto => ({
  id: i.id,
  sku: i.sku,
  category: i.category,
  name: i.name,
  purchaseUnit: i.purchaseUnit,
  packCoverage: i.packCoverage,
  coverageUnit: i.coverageUnit,
  unitCostCents: i.unitCostCents,
  wastePct: i.wastePct,
  materialKey: i.materialKey,
  attributes: i.attributes ?? {},
  active: i.active,
  version: i.version,
  createdAt: i.createdAt.toISOString(),
  updatedAt: i.updatedAt.toISOString(),
});

export const presentCatalogItemPrice = (p: CatalogItemPrice): CatalogItemPriceDto => ({
  version: p.version,
  unitCostCents: p.unitCostCents,
  packCoverage: p.packCoverage,
  wastePct: p.wastePct,
  changedById: p.changedBy,
  createdAt: p.createdAt.toISOString(),
});

export const presentLaborRate = (r: LaborRate): LaborRateDto => ({
  id: r.id,
  kind: r.kind,
  label: r.label,
  minPitch: r.minPitch,
  maxPitch: r.maxPitch,
  centsPerUnit: r.centsPerUnit,
  unit: r.unit,
});
