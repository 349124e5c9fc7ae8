import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { publicProposalApi, type AcceptInput, type PublicProposal } from "@/features/proposal-public/api/public-api";

export const publicProposalKeys = {
  all: ["public-proposal"] as const,
  detail: (token: string) => [...publicProposalKeys.all, token] as const,
};

/** How often the page asks again while a deposit payment is being confirmed by the payment service. */
export const DEPOSIT_POLL_MS = 2500;

export const publicProposalQueries = {
  detail: (token: string) =>
    queryOptions({
      queryKey: publicProposalKeys.detail(token),
      queryFn: ({ signal }) => publicProposalApi.get(token, signal),
      staleTime: 60_000,
      refetchOnWindowFocus: false,
    }),
};

/** The proposal; while `poll` is set it asks again until the deposit is paid. */
export function usePublicProposal(token: string, poll = false) {
  return useQuery({
    ...publicProposalQueries.detail(token),
    refetchInterval: (q) => (poll && q.state.data?.deposit?.status !== "paid" ? DEPOSIT_POLL_MS : false),
  });
}

function useRefreshAfter<T>(token: string, fn: (v: T) => Promise<unknown>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    meta: { handlesError: true },
    onSuccess: () => qc.invalidateQueries({ queryKey: publicProposalKeys.detail(token) }),
  });
}

export const useAcceptProposal = (token: string) =>
  useRefreshAfter<AcceptInput>(token, (input) => publicProposalApi.accept(token, input));

export const useDeclineProposal = (token: string) =>
  useRefreshAfter<string>(token, (reason) => publicProposalApi.decline(token, reason));

export function useStartDeposit(token: string) {
  return useMutation({ mutationFn: () => publicProposalApi.deposit(token), meta: { handlesError: true } });
}

export type { PublicProposal };
