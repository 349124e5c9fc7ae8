import { queryOptions, useQuery } from "@tanstack/react-query";
import type { JobDto } from "@shared/schemas/job";
import type { ProposalDto } from "@shared/schemas/proposal-api";
import type { QuoteSummary } from "@shared/schemas/quote";
import { api } from "@/lib/api-client";

export const proposalKeys = {
  all: ["proposals"] as const,
  job: (jobId: number) => [...proposalKeys.all, "job", jobId] as const,
};

/**
 * The job's quotes and the job itself, as the Pricing section and the job header load them. A feature does
 * not import another, so the minimal queries are repeated here, under the same keys so the cache is shared.
 */
const sharedKeys = {
  jobQuotes: (jobId: number) => ["quotes", "job", jobId] as const,
  job: (jobId: number) => ["jobs", "detail", jobId] as const,
};

export const proposalQueries = {
  job: (jobId: number) =>
    queryOptions({
      queryKey: proposalKeys.job(jobId),
      queryFn: ({ signal }) => api<{ data: ProposalDto[] }>(`/jobs/${jobId}/proposals`, { signal }).then((r) => r.data),
    }),
  jobQuotes: (jobId: number) =>
    queryOptions({
      queryKey: sharedKeys.jobQuotes(jobId),
      queryFn: ({ signal }) => api<{ data: QuoteSummary[] }>(`/jobs/${jobId}/quotes`, { signal }).then((r) => r.data),
    }),
  jobDetail: (jobId: number) =>
    queryOptions({
      queryKey: sharedKeys.job(jobId),
      queryFn: ({ signal }) => api<{ data: JobDto }>(`/jobs/${jobId}`, { signal }).then((r) => r.data),
    }),
};

export const useJobProposals = (jobId: number) => useQuery(proposalQueries.job(jobId));
export const useJobQuotesForProposal = (jobId: number) => useQuery(proposalQueries.jobQuotes(jobId));
export const useJobForProposal = (jobId: number) => useQuery(proposalQueries.jobDetail(jobId));

/** What the proposal section touches when a proposal goes out: the list here, the quotes' status, the job's status and progress. */
export const invalidatedBySend = (jobId: number) => [proposalKeys.job(jobId), ["quotes"], ["jobs"]] as const;
