import { useState } from "react";
import type { ProposalDto, ProposalLinkStatus } from "@shared/schemas/proposal-api";
import { formatMoney } from "@shared/schemas/proposal";
import type { QuoteStatus, QuoteSummary } from "@shared/schemas/quote";
import { cn } from "@/lib/cn";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadFailed } from "@/components/ui/load-failed";
import { Spinner } from "@/components/ui/spinner";
import { useJobForProposal, useJobProposals, useJobQuotesForProposal } from "@/features/proposals/api/queries";
import { ProposalProgressSteps, formatWhen } from "@/features/proposals/components/proposal-progress-steps";
import { SendProposalDialog } from "@/features/proposals/components/send-proposal-dialog";

/** Only an approved quote, or one already sent (a resend), can go to the homeowner. */
export const canSendQuote = (status: QuoteStatus) => status === "approved" || status === "sent";

const QUOTE_STATUS_WORDS: Record<QuoteStatus, string> = {
  draft: "Draft",
  in_review: "Waiting for approval",
  approved: "Approved",
  sent: "Sent",
  accepted: "Accepted",
  declined: "Declined",
  expired: "Expired",
};

const whyNot = (status: QuoteStatus): string | null => {
  if (canSendQuote(status)) return null;
  if (status === "draft") return "Submit the quote for approval on the Pricing tab; it can be sent once approved.";
  if (status === "in_review") return "The owner has to approve this quote before it can be sent.";
  if (status === "accepted") return "The homeowner accepted this quote; there is nothing more to send.";
  if (status === "declined" || status === "expired") return "Make a new revision on the Pricing tab, have it approved, then send it.";
  return null;
};

const LINK_STATUS: Record<ProposalLinkStatus, { label: string; tone: "neutral" | "accent" | "ok" | "muted" }> = {
  active: { label: "Link active", tone: "accent" },
  revoked: { label: "Replaced by a newer link", tone: "muted" },
  accepted: { label: "Accepted", tone: "ok" },
  declined: { label: "Declined", tone: "neutral" },
  expired: { label: "Expired", tone: "muted" },
};

const PdfIcon = () => (
  <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.5" aria-hidden="true">
    <path d="M4 1.75h5.5L12.5 4.75v9.5H4z M9.5 1.75v3h3" strokeLinejoin="round" />
  </svg>
);

function QuoteRow({ quote, onSend }: { quote: QuoteSummary; onSend: () => void }) {
  const reason = whyNot(quote.status);
  const sendable = canSendQuote(quote.status);
  return (
    <li className="flex flex-col gap-3 px-4 py-3 md:flex-row md:items-center md:justify-between">
      <div className="min-w-0">
        <p className="flex flex-wrap items-center gap-2">
          <span className="font-semibold text-steel-900">{quote.number}</span>
          <span className="text-sm text-steel-500">revision {quote.revisionNo}</span>
          <Badge tone={quote.status === "approved" || quote.status === "sent" ? "accent" : quote.status === "accepted" ? "ok" : "neutral"}>
            {QUOTE_STATUS_WORDS[quote.status]}
          </Badge>
        </p>
        <p className="mt-0.5 text-sm text-steel-600">
          {quote.options.length === 1 ? "1 option" : `${quote.options.length} options`}
          {quote.options.length > 0 && ` · ${quote.options.map((o) => `${o.label} ${formatMoney(o.totalCents)}`).join(" · ")}`}
        </p>
        {reason && <p className="mt-1 text-xs text-steel-500">{reason}</p>}
      </div>
      <div className="flex shrink-0 flex-wrap gap-2">
        <a
          href={`/api/quotes/${quote.id}/pdf`}
          target="_blank"
          rel="noopener"
          className="inline-flex h-8 items-center gap-1.5 rounded-md border border-steel-300 bg-white px-3 text-sm font-medium text-steel-800 shadow-sm hover:bg-steel-50 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
        >
          <PdfIcon />
          Preview PDF
          <span className="sr-only">(opens in a new tab)</span>
        </a>
        <Button onClick={onSend} disabled={!sendable} aria-describedby={undefined} title={reason ?? undefined}>
          {quote.status === "sent" ? "Send again…" : "Send to homeowner…"}
        </Button>
      </div>
    </li>
  );
}

function ProposalCard({ p }: { p: ProposalDto }) {
  const s = LINK_STATUS[p.status] ?? { label: p.status, tone: "neutral" as const };
  return (
    <li aria-label={`Proposal, revision ${p.revisionNo}, sent to ${p.sentTo}`} className={cn("space-y-3 px-4 py-4", p.status === "revoked" && "opacity-75")}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <p className="flex flex-wrap items-center gap-2">
          <span className="font-semibold text-steel-900">Revision {p.revisionNo}</span>
          <span className="text-sm text-steel-600">to {p.sentTo}</span>
          <Badge tone={s.tone}>{s.label}</Badge>
        </p>
        <p className="text-xs text-steel-500">
          {p.status === "active" ? `Link valid until ${formatWhen(p.expiresAt)}` : `Sent ${formatWhen(p.sentAt)}`}
        </p>
      </div>
      <ProposalProgressSteps p={p} />
      {p.acceptedAt && (
        <p className="text-sm text-steel-700">
          Signed by <strong>{p.signerName ?? "the homeowner"}</strong>
          {p.acceptedOptionLabel && (
            <>
              {" "}
              for <strong>{p.acceptedOptionLabel}</strong>
            </>
          )}
          .
        </p>
      )}
      {p.declinedAt && (
        <p className="text-sm text-steel-700">
          Reason given: {p.declineReason ? <q className="italic">{p.declineReason}</q> : <span className="text-steel-500">none</span>}
        </p>
      )}
    </li>
  );
}

/** The job workspace's Proposal section: the quote's PDF, sending it to the homeowner, and how each proposal went. */
export function ProposalSection({ jobId }: { jobId: number }) {
  const quotes = useJobQuotesForProposal(jobId);
  const proposals = useJobProposals(jobId);
  const job = useJobForProposal(jobId);
  const [sending, setSending] = useState<QuoteSummary | null>(null);

  const live = (quotes.data ?? []).filter((q) => !q.archived);

  return (
    <div className="space-y-5">
      <section aria-labelledby="proposal-quotes" className="rounded-lg border border-steel-200 bg-white shadow-panel">
        <header className="border-b border-steel-100 px-4 py-3">
          <h2 id="proposal-quotes" className="text-base font-semibold text-steel-900">
            Quote to send
          </h2>
          <p className="text-sm text-steel-600">Preview the proposal PDF the homeowner receives, then send it with a private link.</p>
        </header>
        {quotes.isPending ? (
          <div className="px-4 py-6">
            <Spinner label="Loading the quotes" />
          </div>
        ) : quotes.isError ? (
          <div className="p-4">
            <LoadFailed title="The quotes could not be loaded" error={quotes.error} onRetry={() => quotes.refetch()} />
          </div>
        ) : live.length === 0 ? (
          <EmptyState
            className="m-4"
            title="No quote yet"
            description="Price the job on the Pricing tab and have the quote approved; then it can be sent from here."
          />
        ) : (
          <ul className="divide-y divide-steel-100">
            {live.map((q) => (
              <QuoteRow key={q.id} quote={q} onSend={() => setSending(q)} />
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="proposal-history" className="rounded-lg border border-steel-200 bg-white shadow-panel">
        <header className="border-b border-steel-100 px-4 py-3">
          <h2 id="proposal-history" className="text-base font-semibold text-steel-900">
            Sent proposals
          </h2>
        </header>
        {proposals.isPending ? (
          <div className="px-4 py-6">
            <Spinner label="Loading the proposals" />
          </div>
        ) : proposals.isError ? (
          <div className="p-4">
            <LoadFailed title="The proposals could not be loaded" error={proposals.error} onRetry={() => proposals.refetch()} />
          </div>
        ) : proposals.data.length === 0 ? (
          <p className="px-4 py-6 text-sm text-steel-600">Nothing sent yet. Once you send the proposal, you'll see here when the homeowner opens, accepts or declines it, and the deposit.</p>
        ) : (
          <ul className="divide-y divide-steel-100">
            {proposals.data.map((p) => (
              <ProposalCard key={p.id} p={p} />
            ))}
          </ul>
        )}
      </section>

      {sending && (
        <SendProposalDialog
          open
          onClose={() => setSending(null)}
          jobId={jobId}
          quote={sending}
          defaultTo={job.data?.customer.email ?? ""}
        />
      )}
    </div>
  );
}
