/**
 * Data the Layer stack and Gap study sections read besides the roof: the job's site (for the engine
 * preview), the price book's engine rules, active items and takeoff-key mapping, and the quotes the Gap study
 * adds an option to. The queries and keys are the app's shared ones (src/lib/queries), so the other screens'
 * caches are shared, not duplicated.
 */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { jobQueries } from "@/lib/queries/jobs";
import { priceBookQueries } from "@/lib/queries/price-book";
import { quoteKeys } from "@/lib/queries/quotes";

export const useJobSite = (jobId: number) => useQuery({ ...jobQueries.detail(jobId), select: (j) => j.site });
/** The engine rules of the company's price book; `enabled: false` for crew (the route answers 403). */
export const useEngineRules = (enabled = true) => useQuery({ ...priceBookQueries.rules(), enabled, retry: false });
export const usePriceItems = (enabled = true) => useQuery({ ...priceBookQueries.activeItems(), enabled });
/** The takeoff-key mapping rows (the Price book screen's query, without its conflict list). */
export const usePriceMapping = (enabled = true) =>
  useQuery({ ...priceBookQueries.mapping(), enabled, staleTime: 60_000, select: (r) => r.data });

// ---- quotes (contract: GET/POST /api/jobs/:jobId/quotes, GET/PATCH /api/quotes/:id) ----------------

export type QuoteSpec = { spacer?: "none" | "battens" | "counter-battens" | "mesh" | "dimpled"; foil?: boolean; stackId?: string };

interface QuoteSummary {
  id: number;
  number: string;
  status: string;
  archived: boolean;
  updatedAt: string;
}

interface QuoteDetail {
  id: number;
  number: string;
  status: string;
  revision: { version: number; status: string; options: { id: number | string; label: string; spec: QuoteSpec }[] };
}

export const MAX_QUOTE_OPTIONS = 5;

/**
 * Adds `{ label, spec }` as an option of the job's current draft quote (PATCH with the existing options
 * kept), or starts a quote with "As designed" plus this option when the job has no draft.
 */
export function useAddQuoteOption(jobId: number) {
  const qc = useQueryClient();
  return useMutation({
    meta: { handlesError: true },
    mutationFn: async (option: { label: string; spec: QuoteSpec }) => {
      const list = await api<{ data: QuoteSummary[] }>(`/jobs/${jobId}/quotes`).then((r) => r.data);
      const draft = [...list]
        .filter((q) => !q.archived && q.status === "draft")
        .sort((a, b) => b.updatedAt.localeCompare(a.updatedAt))[0];
      if (!draft) {
        const created = await api<{ data: QuoteDetail }>(`/jobs/${jobId}/quotes`, {
          method: "POST",
          json: { options: [{ label: "As designed", spec: {} }, option] },
        }).then((r) => r.data);
        return { quote: created, created: true };
      }
      const detail = await api<{ data: QuoteDetail }>(`/quotes/${draft.id}`).then((r) => r.data);
      const existing = detail.revision.options;
      if (existing.length >= MAX_QUOTE_OPTIONS) {
        throw new Error(`Quote ${detail.number} already has ${MAX_QUOTE_OPTIONS} options, the most a quote can carry.`);
      }
      const updated = await api<{ data: QuoteDetail }>(`/quotes/${draft.id}`, {
        method: "PATCH",
        json: {
          version: detail.revision.version,
          options: [...existing.map((o) => ({ id: o.id, label: o.label, spec: o.spec })), option],
        },
      }).then((r) => r.data);
      return { quote: updated, created: false };
    },
    onSuccess: ({ quote }) => {
      qc.setQueryData(quoteKeys.detail(quote.id), quote);
      return qc.invalidateQueries({ queryKey: quoteKeys.all });
    },
  });
}
