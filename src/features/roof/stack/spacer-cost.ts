/**
 * Cost per square of a spacer option's own materials (mats, battens, counter-battens, their screws) from
 * the price book: for each material, the item mapped to its key; purchase quantity = ceil(takeoff
 * quantity ÷ the item's pack coverage); cost = purchase quantity × unit cost. The same rule as the
 * quote's material lines (shared/pricing/price-quote.ts rule 1), without labour, markup or tax.
 */
import type { MaterialLine } from "@shared/engine/materials";
import type { CatalogItemDto, MaterialMappingDto } from "@shared/schemas/price-book";

export interface SpacerCost {
  cents: number;
  perSquareCents: number | null;
  /** Material keys with no priced item. */
  missing: string[];
}

export function spacerCost(materials: MaterialLine[], squares: number, mapping: MaterialMappingDto[], items: CatalogItemDto[]): SpacerCost {
  const byKey = new Map(mapping.map((m) => [m.key as string, m.item]));
  const byId = new Map(items.map((i) => [i.id, i]));
  let cents = 0;
  const missing: string[] = [];
  for (const m of materials) {
    const mapped = byKey.get(m.key);
    if (!mapped) {
      missing.push(m.key);
      continue;
    }
    const pack = byId.get(mapped.id)?.packCoverage ?? 1;
    const qty = Math.ceil(m.quantity / (pack > 0 ? pack : 1) - 1e-9);
    cents += qty * mapped.unitCostCents;
  }
  return { cents, perSquareCents: squares > 0 ? Math.round(cents / squares) : null, missing };
}

export const money = (cents: number) =>
  (cents / 100).toLocaleString("en-US", { style: "currency", currency: "USD", minimumFractionDigits: 2 });
