import { formatDateTimeUtc, formatMoney } from "@shared/schemas/proposal";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import type { DepositState, PublicProposal } from "@/features/proposal-public/api/public-api";
import { useStartDeposit } from "@/features/proposal-public/api/queries";
import { choosableOptions } from "@/features/proposal-public/components/acceptance-panel";

/** What came back in the URL from the payment page. */
export type ReturnState = "processing" | "cancelled" | null;

/** Goes to the payment page (a separate function so tests can watch it instead of leaving the page). */
export const leaveForPayment = { go: (url: string) => window.location.assign(url) };

function depositAmount(p: PublicProposal): number | null {
  if (p.deposit) return p.deposit.amountCents;
  const id = p.accepted?.optionId ?? p.doc.acceptance?.optionId;
  return choosableOptions(p).find((o) => String(o.id) === String(id))?.depositCents ?? null;
}

/** After acceptance: pay the deposit, wait for the payment service's confirmation, or see that it arrived. */
export function DepositPanel({ token, proposal, returned }: { token: string; proposal: PublicProposal; returned: ReturnState }) {
  const start = useStartDeposit(token);
  const amount = depositAmount(proposal);
  const status = proposal.deposit?.status;
  const paidAt = (proposal.deposit as DepositState | null)?.paidAt;

  if (status === "paid") {
    return (
      <div role="status" className="rounded-lg border border-ok-200 bg-ok-50 px-4 py-3 text-ok-700">
        <p className="flex items-center gap-2 text-base font-semibold">
          <svg viewBox="0 0 16 16" className="size-5" fill="none" stroke="currentColor" strokeWidth="2" aria-hidden="true">
            <path d="m3.5 8.5 3 3 6-7" strokeLinecap="round" strokeLinejoin="round" />
          </svg>
          Deposit received — thank you
        </p>
        <p className="mt-1 text-sm text-steel-700">
          {amount !== null && `${formatMoney(amount)} paid`}
          {paidAt ? ` on ${formatDateTimeUtc(paidAt)}` : ""}. A receipt is on its way to
          your e-mail, and your contractor will be in touch to schedule the work.
        </p>
      </div>
    );
  }

  if (returned === "processing") {
    return (
      <div role="status" className="flex items-start gap-3 rounded-lg border border-steel-200 bg-steel-50 px-4 py-3">
        <Spinner className="mt-0.5 size-5 text-accent-700" />
        <div>
          <p className="text-base font-semibold text-steel-900">Processing your payment…</p>
          <p className="mt-0.5 text-sm text-steel-600">
            We're waiting for the payment service to confirm it. This page updates by itself, and we'll e-mail you once the
            deposit is received. There's no need to pay again.
          </p>
        </div>
      </div>
    );
  }

  const pay = () =>
    start.mutate(undefined, {
      onSuccess: (url) => leaveForPayment.go(url),
    });

  return (
    <div className="space-y-3">
      {returned === "cancelled" && (
        <Alert tone="info" title="The payment was not completed">
          Nothing was charged. You can pay the deposit whenever you're ready.
        </Alert>
      )}
      {status === "failed" && returned !== "cancelled" && (
        <Alert tone="caution" title="The last payment attempt didn't go through">
          Nothing was charged. You can try again with the same or another card.
        </Alert>
      )}
      {start.isError && (
        <Alert tone="error">
          {start.error instanceof ApiError && start.error.status === 409 ? start.error.message : errorMessage(start.error)}
        </Alert>
      )}
      <div className="flex flex-col gap-3 rounded-lg border border-accent-200 bg-accent-50 px-4 py-4 sm:flex-row sm:items-center sm:justify-between">
        <div>
          <p className="text-base font-semibold text-steel-950">Next step: the deposit</p>
          <p className="text-sm text-steel-600">
            {amount !== null ? `${formatMoney(amount)}, ` : ""}paid securely by card on the payment service's page.
          </p>
        </div>
        <Button size="lg" className="h-12 text-base sm:px-6" onClick={pay} loading={start.isPending}>
          {start.isPending ? "Opening the payment page…" : "Pay the deposit"}
        </Button>
      </div>
    </div>
  );
}
