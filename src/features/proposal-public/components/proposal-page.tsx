import type { ReactNode } from "react";
import { formatDate } from "@shared/schemas/proposal";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { publicProposalApi } from "@/features/proposal-public/api/public-api";
import { usePublicProposal } from "@/features/proposal-public/api/queries";
import { AcceptanceForm, AcceptedSummary, DeclinedSummary } from "@/features/proposal-public/components/acceptance-panel";
import { DepositPanel, type ReturnState } from "@/features/proposal-public/components/deposit-panel";
import { ProposalDocument } from "@/features/proposal-public/components/proposal-document";

/** The page's frame: a quiet grey ground, the proposal on a white sheet (plain white on paper). */
function Frame({ children, title }: { children: ReactNode; title: string }) {
  return (
    <div className="min-h-screen bg-steel-100 px-3 py-4 sm:px-6 sm:py-8 print:bg-white print:p-0">
      <title>{title}</title>
      <meta name="robots" content="noindex, nofollow" />
      <meta name="referrer" content="no-referrer" />
      <div className="mx-auto w-full max-w-4xl">{children}</div>
    </div>
  );
}

const Sheet = ({ children }: { children: ReactNode }) => (
  <div className="rounded-xl border border-steel-200 bg-white px-4 py-6 shadow-panel sm:px-10 sm:py-10 print:rounded-none print:border-0 print:p-0 print:shadow-none">
    {children}
  </div>
);

/** Unknown, revoked or expired links all look the same: nothing about the proposal is shown. */
export function InvalidLinkPage() {
  return (
    <Frame title="Link no longer valid">
      <div className="mx-auto mt-[12vh] max-w-md rounded-xl border border-steel-200 bg-white px-6 py-8 text-center shadow-panel">
        <svg viewBox="0 0 24 24" className="mx-auto size-10 text-steel-400" fill="none" stroke="currentColor" strokeWidth="1.5" aria-hidden="true">
          <path d="M10.5 13.5 13.5 10.5M9 7.5l1.6-1.6a4 4 0 0 1 5.6 5.6L14.5 13M15 16.5l-1.6 1.6a4 4 0 0 1-5.6-5.6L9.5 11" strokeLinecap="round" />
          <path d="m4 4 16 16" strokeLinecap="round" />
        </svg>
        <h1 className="mt-4 text-xl font-semibold text-steel-950">This link is no longer valid.</h1>
        <p className="mt-2 text-[15px] leading-relaxed text-steel-600">
          Please contact your contractor. They can send you a new link to your proposal.
        </p>
      </div>
    </Frame>
  );
}

function Toolbar({ token, canAccept }: { token: string; canAccept: boolean }) {
  const link =
    "inline-flex h-9 items-center gap-1.5 rounded-md px-3 text-sm font-medium focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500";
  return (
    <nav aria-label="Proposal actions" className="mb-3 flex flex-wrap items-center justify-end gap-2 print:hidden">
      <a href={publicProposalApi.pdfUrl(token)} className={`${link} border border-steel-300 bg-white text-steel-800 shadow-sm hover:bg-steel-50`} download>
        <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
          <path d="M8 2.5v8M4.5 7.5 8 11l3.5-3.5M3 13.5h10" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
        Download PDF
      </a>
      <button type="button" onClick={() => window.print()} className={`${link} hidden text-steel-700 hover:bg-steel-200 sm:inline-flex`}>
        Print
      </button>
      {canAccept && (
        <a href="#respond" className={`${link} bg-accent-700 text-white shadow-sm hover:bg-accent-800`}>
          Review and accept
          <svg viewBox="0 0 16 16" className="size-4" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
            <path d="M8 3v10M4 9l4 4 4-4" strokeLinecap="round" strokeLinejoin="round" />
          </svg>
        </a>
      )}
    </nav>
  );
}

/** `/p/:token`: the homeowner's proposal, acceptance and deposit. */
export function ProposalPage({ token, returned }: { token: string; returned: ReturnState }) {
  const q = usePublicProposal(token, returned === "processing");

  if (q.isPending) {
    return (
      <Frame title="Your proposal">
        <div className="flex min-h-[60vh] items-center justify-center text-steel-500">
          <Spinner className="size-7" label="Loading your proposal" />
        </div>
      </Frame>
    );
  }
  if (q.isError) {
    if (q.error instanceof ApiError && (q.error.status === 404 || q.error.status === 410)) return <InvalidLinkPage />;
    const limited = q.error instanceof ApiError && q.error.status === 429;
    return (
      <Frame title="Your proposal">
        <div role="alert" className="mx-auto mt-[12vh] max-w-md rounded-xl border border-steel-200 bg-white px-6 py-8 text-center shadow-panel">
          <h1 className="text-xl font-semibold text-steel-950">We couldn't open your proposal just now</h1>
          <p className="mt-2 text-[15px] text-steel-600">
            {limited ? "Too many requests from here. Wait a few minutes, then try again." : errorMessage(q.error)}
          </p>
          <Button variant="secondary" className="mt-4" onClick={() => q.refetch()}>
            Try again
          </Button>
        </div>
      </Frame>
    );
  }

  const p = q.data;
  const doc = p.doc;
  const accepted = p.status === "accepted" || p.accepted !== null || doc.acceptance !== null;
  const declined = !accepted && (p.status === "declined" || p.declined !== null);
  const open = !accepted && !declined;
  const chosen = p.accepted?.optionId ?? doc.acceptance?.optionId;
  const chosenId = chosen == null ? null : String(chosen);
  // back from the payment page, or paid: the deposit's state leads the page; otherwise it follows the acceptance
  const depositOnTop = returned !== null || p.deposit?.status === "paid";
  const contact = [doc.company.phone, doc.company.email].filter(Boolean).join(" or ");

  return (
    <Frame title={`Proposal ${doc.proposalNumber} · ${doc.company.name}`}>
      <Toolbar token={token} canAccept={open} />
      {accepted && depositOnTop && (
        <div className="mb-4 print:hidden">
          <DepositPanel token={token} proposal={p} returned={returned} />
        </div>
      )}
      <Sheet>
        <ProposalDocument doc={doc} chosenId={chosenId} />

        <section id="respond" aria-labelledby="respond-title" className="mt-10 scroll-mt-4 rounded-xl border-2 border-accent-700 px-3.5 py-5 sm:px-6 print:break-inside-avoid">
          <h2 id="respond-title" className="text-xl font-bold tracking-tight text-accent-800">
            {accepted ? "Accepted" : declined ? "Declined" : "Accept this proposal"}
          </h2>
          <div className="mt-4 space-y-4">
            {accepted && <AcceptedSummary proposal={p} />}
            {accepted && !depositOnTop && (
              <div className="print:hidden">
                <DepositPanel token={token} proposal={p} returned={returned} />
              </div>
            )}
            {declined && <DeclinedSummary proposal={p} doc={doc} />}
            {open && (
              <>
                <p className="text-[15px] text-steel-700">
                  This proposal is valid until <strong>{formatDate(doc.validUntil)}</strong>. Choose{" "}
                  {doc.options.length > 1 ? "an option" : "the option"}, type your full name and confirm; you can pay the deposit
                  by card right after.
                </p>
                <div className="print:hidden">
                  <AcceptanceForm token={token} proposal={p} />
                </div>
                <p className="hidden print:block">To accept, open your proposal page: {doc.acceptUrl}</p>
              </>
            )}
          </div>
        </section>
      </Sheet>
      <footer className="mt-4 px-1 pb-6 text-center text-sm text-steel-600 print:hidden">
        <p>
          Questions? Contact {doc.company.name}
          {contact ? ` at ${contact}` : ""}.
        </p>
        <p className="mt-1 text-xs text-steel-500">This page is private to you; please don't share its link.</p>
      </footer>
    </Frame>
  );
}
