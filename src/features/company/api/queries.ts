import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import type { CompanyDto, CompanyProfileInput } from "@shared/schemas/price-book";
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

export function useSaveCompany() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CompanyProfileInput) =>
      api<{ data: CompanyDto }>("/company", { method: "PUT", json: input }).then((r) => r.data),
    meta: { handlesError: true }, // the profile form shows the errors on its fields
    onSuccess: (company) => qc.setQueryData(companyKeys.detail(), company),
  });
}
