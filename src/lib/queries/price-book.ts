/**
 * The company's price book: one key factory and its queries, shared by the Price book screen and the roof's
 * Layer stack, Gap study and sketch preview (engine rules, active items, the takeoff-key mapping).
 */
import { queryOptions, useQuery } from "@tanstack/react-query";
import type {
  CatalogItemDto,
  CatalogItemPriceDto,
  LaborRateDto,
  MaterialMappingDto,
  PricingSettingsDto,
} from "@shared/schemas/price-book";
import type { Rules } from "@shared/schemas/takeoff";
import { api } from "@/lib/api-client";

/** A field of the engine's rules set by two items; the first one wins (GET /api/price-book/mapping). */
export interface MappingConflict {
  field: string;
  used: { key: string; sku: string; value: number };
  ignored: Array<{ key: string; sku: string; value: number }>;
}

export const priceBookKeys = {
  all: ["price-book"] as const,
  /** Every item, active and archived: the screen filters by category, text and archived in the browser. */
  items: () => [...priceBookKeys.all, "items"] as const,
  /** The active items only (the Gap study prices spacer options with them); under `items`, so item changes reach it. */
  activeItems: () => [...priceBookKeys.items(), "list", {}] as const,
  prices: (id: number) => [...priceBookKeys.all, "items", id, "prices"] as const,
  mapping: () => [...priceBookKeys.all, "mapping"] as const,
  labor: () => [...priceBookKeys.all, "labor"] as const,
  settings: () => [...priceBookKeys.all, "settings"] as const,
  /** The engine rules from the price book (GET /api/price-book/rules), read by the roof's previews. */
  rules: () => [...priceBookKeys.all, "rules"] as const,
};

export const priceBookQueries = {
  items: () =>
    queryOptions({
      queryKey: priceBookKeys.items(),
      queryFn: ({ signal }) =>
        api<{ data: CatalogItemDto[] }>("/price-book/items?archived=all", { signal }).then((r) => r.data),
    }),
  activeItems: () =>
    queryOptions({
      queryKey: priceBookKeys.activeItems(),
      queryFn: ({ signal }) => api<{ data: CatalogItemDto[] }>("/price-book/items", { signal }).then((r) => r.data),
      staleTime: 60_000,
    }),
  prices: (id: number) =>
    queryOptions({
      queryKey: priceBookKeys.prices(id),
      queryFn: ({ signal }) =>
        api<{ data: CatalogItemPriceDto[] }>(`/price-book/items/${id}/prices`, { signal }).then((r) => r.data),
    }),
  mapping: () =>
    queryOptions({
      queryKey: priceBookKeys.mapping(),
      queryFn: ({ signal }) =>
        api<{ data: MaterialMappingDto[]; conflicts?: MappingConflict[] }>("/price-book/mapping", { signal }).then((r) => ({
          data: r.data,
          conflicts: r.conflicts ?? [],
        })),
    }),
  labor: () =>
    queryOptions({
      queryKey: priceBookKeys.labor(),
      queryFn: ({ signal }) => api<{ data: LaborRateDto[] }>("/price-book/labor", { signal }).then((r) => r.data),
    }),
  settings: () =>
    queryOptions({
      queryKey: priceBookKeys.settings(),
      queryFn: ({ signal }) => api<{ data: PricingSettingsDto }>("/price-book/settings", { signal }).then((r) => r.data),
    }),
  rules: () =>
    queryOptions({
      queryKey: priceBookKeys.rules(),
      queryFn: ({ signal }) => api<{ data: Rules }>("/price-book/rules", { signal }).then((r) => r.data),
      staleTime: 5 * 60_000,
    }),
};

export const useCatalogItems = () => useQuery(priceBookQueries.items());
export const usePriceHistory = (id: number | null) =>
  useQuery({ ...priceBookQueries.prices(id ?? 0), enabled: id !== null });
export const useMaterialMapping = () => useQuery(priceBookQueries.mapping());
export const useLaborRates = () => useQuery(priceBookQueries.labor());
export const usePricingSettings = () => useQuery(priceBookQueries.settings());
