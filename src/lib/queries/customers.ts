/** Customers: one key factory and the list query, shared by the Customers screen and the new-job form. */
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";
import type { CustomerDto, ListMeta } from "@shared/schemas/customer";
import { api, toSearch } from "@/lib/api-client";

/** GET /api/customers parameters (absent = server default). */
export type CustomerListRequest = { page?: number; pageSize?: number; q?: string; archived?: "1" };

export const customerKeys = {
  all: ["customers"] as const,
  lists: () => [...customerKeys.all, "list"] as const,
  list: (q: CustomerListRequest) => [...customerKeys.lists(), q] as const,
  detail: (id: number) => [...customerKeys.all, "detail", id] as const,
};

export type CustomerList = { data: CustomerDto[]; meta: ListMeta };

export const customerQueries = {
  list: (q: CustomerListRequest) =>
    queryOptions({
      queryKey: customerKeys.list(q),
      queryFn: ({ signal }) =>
        api<CustomerList>(`/customers${toSearch({ page: q.page, pageSize: q.pageSize, q: q.q, archived: q.archived })}`, {
          signal,
        }),
      placeholderData: keepPreviousData,
    }),
};

export const useCustomers = (q: CustomerListRequest, enabled = true) =>
  useQuery({ ...customerQueries.list(q), enabled });
