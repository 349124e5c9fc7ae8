import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { ProposalDto, ProposalSendInput } from "@shared/schemas/proposal-api";
import { api } from "@/lib/api-client";
import { invalidatedBySend } from "@/features/proposals/api/queries";

/** `POST /api/quotes/:id/send` → 201 with the new proposal (409 unless the quote is approved or already sent). */
export function useSendProposal(jobId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ quoteId, input }: { quoteId: number; input: ProposalSendInput }) =>
      api<{ data: ProposalDto }>(`/quotes/${quoteId}/send`, { method: "POST", json: input }).then((r) => r.data),
    meta: { handlesError: true },
    onSuccess: () => Promise.all(invalidatedBySend(jobId).map((queryKey) => qc.invalidateQueries({ queryKey: [...queryKey] }))),
  });
}
