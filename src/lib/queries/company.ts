/** The company profile: one key factory, shared with the price book (its settings change what the profile shows). */
import { queryOptions, useQuery } from "@tanstack/react-query";
import type { CompanyDto } from "@shared/schemas/price-book";
import { api } from "@/lib/api-client";

export const companyKeys = {
  all: ["company"] as const,
  detail: () => [...companyKeys.all, "detail"] as const,
};

export const companyQueries = {
  detail: () =>
    queryOptions({
      queryKey: companyKeys.detail(),
      queryFn: ({ signal }) => api<{ data: CompanyDto }>("/company", { signal }).then((r) => r.data),
    }),
};

export const useCompany = () => useQuery(companyQueries.detail());
