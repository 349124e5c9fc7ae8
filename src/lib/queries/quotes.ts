/** Quotes: one key factory and the queries Pricing, Approvals, Proposals and the Gap study share. */
import { queryOptions, useQuery } from "@tanstack/react-query";
import type { ApprovalQueueItem, QuoteDetail, QuoteSummary, RevisionDetail } from "@shared/schemas/quote";
import { api } from "@/lib/api-client";

export const quoteKeys = {
  all: ["quotes"] as const,
  jobLists: () => [...quoteKeys.all, "job"] as const,
  job: (jobId: number) => [...quoteKeys.jobLists(), jobId] as const,
  detail: (id: number) => [...quoteKeys.all, "detail", id] as const,
  revision: (id: number, revisionNo: number) => [...quoteKeys.all, "detail", id, "revision", revisionNo] as const,
  approvals: () => [...quoteKeys.all, "approvals"] as const,
};

export const quoteQueries = {
  job: (jobId: number) =>
    queryOptions({
      queryKey: quoteKeys.job(jobId),
      queryFn: ({ signal }) => api<{ data: QuoteSummary[] }>(`/jobs/${jobId}/quotes`, { signal }).then((r) => r.data),
    }),
  detail: (id: number) =>
    queryOptions({
      queryKey: quoteKeys.detail(id),
      queryFn: ({ signal }) => api<{ data: QuoteDetail }>(`/quotes/${id}`, { signal }).then((r) => r.data),
    }),
  /** A past revision (frozen once it left draft, so it never goes stale). */
  revision: (id: number, revisionNo: number) =>
    queryOptions({
      queryKey: quoteKeys.revision(id, revisionNo),
      queryFn: ({ signal }) =>
        api<{ data: RevisionDetail }>(`/quotes/${id}/revisions/${revisionNo}`, { signal }).then((r) => r.data),
      staleTime: Infinity,
    }),
  approvals: () =>
    queryOptions({
      queryKey: quoteKeys.approvals(),
      queryFn: ({ signal }) => api<{ data: ApprovalQueueItem[] }>("/approvals", { signal }).then((r) => r.data),
    }),
};

export const useJobQuotes = (jobId: number) => useQuery(quoteQueries.job(jobId));
export const useQuote = (id: number | null) => useQuery({ ...quoteQueries.detail(id ?? 0), enabled: id !== null });
export const useQuoteRevision = (id: number, revisionNo: number | null) =>
  useQuery({ ...quoteQueries.revision(id, revisionNo ?? 0), enabled: revisionNo !== null });
export const useApprovalsQueue = () => useQuery(quoteQueries.approvals());
