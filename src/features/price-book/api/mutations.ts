import { useMutation, useQueryClient } from "@tanstack/react-query";
import type {
  CatalogItemDto,
  CatalogItemInput,
  CatalogItemUpdate,
  CsvRowError,
  LaborRateDto,
  LaborRatesInput,
  PriceBookImportPreview,
  PricingSettingsDto,
  PricingSettingsInput,
} from "@shared/schemas/price-book";
import { api, ApiError } from "@/lib/api-client";
import { companyKeys } from "@/lib/queries/company";
import { priceBookKeys } from "@/lib/queries/price-book";

const replaceItem = (list: CatalogItemDto[] | undefined, item: CatalogItemDto) =>
  list ? (list.some((i) => i.id === item.id) ? list.map((i) => (i.id === item.id ? item : i)) : [...list, item]) : list;

/** The 409 a stale `version` answers with. */
export const isStale = (e: unknown) => e instanceof ApiError && e.status === 409 && e.code === "stale_version";

/**
 * PATCH one item with the version it was loaded at. The cell shows the new value at once (optimistic);
 * a failure puts the old list back, and a stale version reloads the list from the server.
 */
export function useUpdateItem() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: CatalogItemUpdate }) =>
      api<{ data: CatalogItemDto }>(`/price-book/items/${id}`, { method: "PATCH", json: changes }).then((r) => r.data),
    meta: { handlesError: true }, // the items table shows the refusal beside the row
    onMutate: async ({ id, changes }) => {
      await qc.cancelQueries({ queryKey: priceBookKeys.items() });
      const before = qc.getQueryData<CatalogItemDto[]>(priceBookKeys.items());
      const { version: _v, ...fields } = changes;
      qc.setQueryData<CatalogItemDto[]>(priceBookKeys.items(), (list) =>
        list?.map((i) => (i.id === id ? ({ ...i, ...fields } as CatalogItemDto) : i)),
      );
      return { before };
    },
    onError: (err, _vars, ctx) => {
      if (ctx?.before) qc.setQueryData(priceBookKeys.items(), ctx.before);
      if (isStale(err)) return qc.invalidateQueries({ queryKey: priceBookKeys.items() });
    },
    onSuccess: (item) => {
      qc.setQueryData<CatalogItemDto[]>(priceBookKeys.items(), (list) => replaceItem(list, item));
      void qc.invalidateQueries({ queryKey: priceBookKeys.prices(item.id) });
      void qc.invalidateQueries({ queryKey: priceBookKeys.mapping() });
    },
  });
}

export function useCreateItem() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CatalogItemInput) =>
      api<{ data: CatalogItemDto }>("/price-book/items", { method: "POST", json: input }).then((r) => r.data),
    meta: { handlesError: true }, // the dialog puts the errors on its fields
    onSuccess: (item) => {
      qc.setQueryData<CatalogItemDto[]>(priceBookKeys.items(), (list) => replaceItem(list, item));
      void qc.invalidateQueries({ queryKey: priceBookKeys.mapping() });
    },
  });
}

/** Archive (active → false) or restore an item. */
export function useSetItemActive() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, active }: { id: number; active: boolean }) =>
      api<{ data: CatalogItemDto }>(`/price-book/items/${id}/${active ? "restore" : "archive"}`, { method: "POST" }).then(
        (r) => r.data,
      ),
    meta: { handlesError: true },
    onSuccess: (item) => {
      qc.setQueryData<CatalogItemDto[]>(priceBookKeys.items(), (list) => replaceItem(list, item));
      void qc.invalidateQueries({ queryKey: priceBookKeys.mapping() });
    },
  });
}

export function useSaveLabor() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: LaborRatesInput) =>
      api<{ data: LaborRateDto[] }>("/price-book/labor", { method: "PUT", json: input }).then((r) => r.data),
    meta: { handlesError: true },
    onSuccess: (rows) => qc.setQueryData(priceBookKeys.labor(), rows),
  });
}

export function useSaveSettings() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: PricingSettingsInput) =>
      api<{ data: PricingSettingsDto }>("/price-book/settings", { method: "PUT", json: input }).then((r) => r.data),
    meta: { handlesError: true },
    onSuccess: (settings) => {
      qc.setQueryData(priceBookKeys.settings(), settings);
      return qc.invalidateQueries({ queryKey: companyKeys.all });
    },
  });
}

/** The import answer: a preview (or the committed result), and the row errors when a commit was refused. */
export type ImportOutcome = PriceBookImportPreview;

export class ImportRefused extends ApiError {
  constructor(
    status: number,
    code: string,
    message: string,
    fields: Record<string, string> | undefined,
    readonly errors: CsvRowError[],
    readonly preview: PriceBookImportPreview | null,
  ) {
    super(status, code, message, fields);
  }
}

/**
 * POST the CSV as multipart (field `file`). The JSON api() helper cannot send a file, so this one request
 * uses fetch itself, with the session's CSRF token from GET /api/auth/csrf.
 */
export async function uploadPriceBookCsv(file: File, commit: boolean): Promise<PriceBookImportPreview> {
  const { token } = await api<{ token: string }>("/auth/csrf");
  const body = new FormData();
  body.append("file", file);
  let res: Response;
  try {
    res = await fetch(`/api/price-book/import${commit ? "?commit=1" : ""}`, {
      method: "POST",
      headers: { Accept: "application/json", "X-CSRF-Token": token },
      body,
      credentials: "same-origin",
    });
  } catch {
    throw new ApiError(0, "network", "Can't reach the server. Check your connection and try again.");
  }
  let parsed: unknown = null;
  try {
    parsed = await res.json();
  } catch {
    // not JSON
  }
  if (res.ok) return (parsed as { data: PriceBookImportPreview }).data;
  const b = (parsed ?? {}) as {
    error?: { code?: string; message?: string; fields?: Record<string, string> };
    errors?: CsvRowError[];
    data?: PriceBookImportPreview;
  };
  throw new ImportRefused(
    res.status,
    b.error?.code ?? "http_error",
    b.error?.message ?? `The upload failed (${res.status}).`,
    b.error?.fields,
    b.errors ?? b.data?.errors ?? [],
    b.data ?? null,
  );
}

export function useImportCsv() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ file, commit }: { file: File; commit: boolean }) => uploadPriceBookCsv(file, commit),
    meta: { handlesError: true },
    onSuccess: (result) => {
      if (result.committed) return qc.invalidateQueries({ queryKey: priceBookKeys.all });
    },
  });
}
