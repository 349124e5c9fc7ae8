import { useMutation, useQueryClient, type QueryClient } from "@tanstack/react-query";
import type {
  QuoteApproveInput,
  QuoteCreateInput,
  QuoteDetail,
  QuotePatchInput,
  QuoteReturnInput,
  QuoteSubmitInput,
} from "@shared/schemas/quote";
import { api, ApiError } from "@/lib/api-client";
import { jobKeys } from "@/lib/queries/jobs";
import { quoteKeys } from "@/lib/queries/quotes";

/** A changed quote: its detail goes straight into the cache; its job's list and the owner's queue refetch. */
function stored(qc: QueryClient, quote: QuoteDetail) {
  qc.setQueryData(quoteKeys.detail(quote.id), quote);
  return Promise.all([
    qc.invalidateQueries({ queryKey: quoteKeys.job(quote.jobId) }),
    qc.invalidateQueries({ queryKey: quoteKeys.approvals() }),
    qc.invalidateQueries({ queryKey: jobKeys.all }), // the job's quote total and status on the board
  ]);
}

export const isStaleVersion = (e: unknown) => e instanceof ApiError && e.status === 409 && e.code === "stale_version";
export const isNotDraft = (e: unknown) =>
  e instanceof ApiError && e.status === 409 && (e.code === "not_draft" || e.code === "invalid_transition");

const post = (path: string, json?: unknown) =>
  api<{ data: QuoteDetail }>(path, { method: "POST", json: json ?? {} }).then((r) => r.data);

export function useCreateQuote(jobId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: QuoteCreateInput) => post(`/jobs/${jobId}/quotes`, input),
    meta: { handlesError: true },
    onSuccess: (q) => stored(qc, q),
  });
}

export function usePatchQuote(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: QuotePatchInput) =>
      api<{ data: QuoteDetail }>(`/quotes/${id}`, { method: "PATCH", json: input }).then((r) => r.data),
    meta: { handlesError: true }, // the draft form shows field errors and the stale-version prompt
    onSuccess: (q) => stored(qc, q),
  });
}

export function useRecalculateQuote(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (version: number) => post(`/quotes/${id}/recalculate`, { version }),
    meta: { handlesError: true },
    onSuccess: (q) => stored(qc, q),
  });
}

export function useSubmitQuote(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: QuoteSubmitInput) => post(`/quotes/${id}/submit`, input),
    meta: { handlesError: true },
    onSuccess: (q) => stored(qc, q),
  });
}

export function useReviseQuote(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => post(`/quotes/${id}/revise`),
    meta: { handlesError: true },
    onSuccess: (q) => stored(qc, q),
  });
}

export function useApproveQuote(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: QuoteApproveInput) => post(`/quotes/${id}/approve`, input),
    meta: { handlesError: true },
    onSuccess: (q) => stored(qc, q),
  });
}

export function useReturnQuote(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: QuoteReturnInput) => post(`/quotes/${id}/return`, input),
    meta: { handlesError: true },
    onSuccess: (q) => stored(qc, q),
  });
}
