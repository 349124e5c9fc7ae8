import { useMutation, useQueryClient, type QueryClient } from "@tanstack/react-query";
import type { CustomerDto, CustomerFormValues } from "@shared/schemas/customer";
import { api } from "@/lib/api-client";
import { customerKeys } from "@/lib/queries/customers";
import { jobKeys } from "@/lib/queries/jobs";

/** A customer's name shows on the jobs board and in each job's header, so those refetch too. */
function afterCustomerChange(qc: QueryClient, customer: CustomerDto) {
  qc.setQueryData(customerKeys.detail(customer.id), customer);
  return Promise.all([
    qc.invalidateQueries({ queryKey: customerKeys.lists() }),
    qc.invalidateQueries({ queryKey: jobKeys.lists() }),
    qc.invalidateQueries({ queryKey: jobKeys.details() }),
  ]);
}

export function useCreateCustomer() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CustomerFormValues) =>
      api<{ data: CustomerDto }>("/customers", { method: "POST", json: input }).then((r) => r.data),
    meta: { handlesError: true }, // the form shows the errors on its fields
    onSuccess: (c) => {
      qc.setQueryData(customerKeys.detail(c.id), c);
      return qc.invalidateQueries({ queryKey: customerKeys.lists() });
    },
  });
}

export function useUpdateCustomer() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: CustomerFormValues }) =>
      api<{ data: CustomerDto }>(`/customers/${id}`, { method: "PATCH", json: changes }).then((r) => r.data),
    meta: { handlesError: true },
    onSuccess: (c) => afterCustomerChange(qc, c),
  });
}

/** Archive (true) or restore (false). Failures become a toast. */
export function useSetCustomerArchived() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, archived }: { id: number; archived: boolean }) =>
      api<{ data: CustomerDto }>(`/customers/${id}/${archived ? "archive" : "restore"}`, { method: "POST" }).then(
        (r) => r.data,
      ),
    onSuccess: (c) => afterCustomerChange(qc, c),
  });
}
