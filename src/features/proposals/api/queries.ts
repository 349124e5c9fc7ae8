import { queryOptions, useQuery } from "@tanstack/react-query";
import type { ProposalDto } from "@shared/schemas/proposal-api";
import { api } from "@/lib/api-client";
import { jobKeys, jobQueries } from "@/lib/queries/jobs";
import { quoteKeys, quoteQueries } from "@/lib/queries/quotes";

export const proposalKeys = {
  all: ["proposals"] as const,
  job: (jobId: number) => [...proposalKeys.all, "job", jobId] as const,
};

export const proposalQueries = {
  job: (jobId: number) =>
    queryOptions({
      queryKey: proposalKeys.job(jobId),
      queryFn: ({ signal }) => api<{ data: ProposalDto[] }>(`/jobs/${jobId}/proposals`, { signal }).then((r) => r.data),
    }),
  /** The job's quotes and the job itself: the shared queries the Pricing section and the job header use. */
  jobQuotes: (jobId: number) => quoteQueries.job(jobId),
  jobDetail: (jobId: number) => jobQueries.detail(jobId),
};

export const useJobProposals = (jobId: number) => useQuery(proposalQueries.job(jobId));
export const useJobQuotesForProposal = (jobId: number) => useQuery(proposalQueries.jobQuotes(jobId));
export const useJobForProposal = (jobId: number) => useQuery(proposalQueries.jobDetail(jobId));

/** What the proposal section touches when a proposal goes out: the list here, the quotes' status, the job's status and progress. */
export const invalidatedBySend = (jobId: number) => [proposalKeys.job(jobId), quoteKeys.all, jobKeys.all] as const;
