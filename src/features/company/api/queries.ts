import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { CompanyDto, CompanyProfileInput } from "@shared/schemas/price-book";
import { api } from "@/lib/api-client";
import { companyKeys } from "@/lib/queries/company";
import { uploadFiles } from "@/lib/upload";

export function useSaveCompany() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CompanyProfileInput) =>
      api<{ data: CompanyDto }>("/company", { method: "PUT", json: input }).then((r) => r.data),
    meta: { handlesError: true }, // the profile form shows the errors on its fields
    onSuccess: (company) => qc.setQueryData(companyKeys.detail(), company),
  });
}

/** Uploads (PUT) or removes (DELETE) the logo printed on proposals; errors are shown beside the control. */
export function useCompanyLogo() {
  const qc = useQueryClient();
  const upload = useMutation({
    mutationFn: (file: File) => {
      const form = new FormData();
      form.append("file", file);
      return uploadFiles<{ data: CompanyDto }>("/company/logo", form, { method: "PUT" }).then((r) => r.data);
    },
    meta: { handlesError: true },
    onSuccess: (company) => qc.setQueryData(companyKeys.detail(), company),
  });
  const remove = useMutation({
    mutationFn: () => api<void>("/company/logo", { method: "DELETE" }),
    meta: { handlesError: true },
    onSuccess: () => qc.invalidateQueries({ queryKey: companyKeys.detail() }),
  });
  return { upload, remove };
}
