import { useCallback, useState } from "react";
import { Link, useSearchParams } from "react-router-dom";
import { useQueryClient } from "@tanstack/react-query";
import { REVISABLE_STATUSES, type QuoteDetail, type QuoteSummary } from "@shared/schemas/quote";
import { ApiError, errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { paths } from "@/config/paths";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { LoadFailed } from "@/components/ui/load-failed";
import { LoadingRow, Spinner } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { useMe } from "@/lib/auth";
import { formatCents, formatDateTime } from "@/lib/money";
import { quoteKeys, useJobQuotes, useQuote, useQuoteRevision } from "@/lib/queries/quotes";
import { isStaleVersion, useCreateQuote, useRecalculateQuote, useReviseQuote, useSubmitQuote } from "@/features/quotes/api/mutations";
import { DraftEditor } from "@/features/quotes/components/draft-editor";
import { OptionLinesList, OptionsComparison } from "@/features/quotes/components/options-comparison";
import { StatusBadge } from "@/features/quotes/components/quote-bits";

/** The job workspace's Pricing section: the job's quotes, the current revision, its options and the draft editor. */
export function PricingSection({ jobId }: { jobId: number }) {
  const { data: me } = useMe();
  const quotes = useJobQuotes(jobId);
  const create = useCreateQuote(jobId);
  const [params, setParams] = useSearchParams();
  const [createError, setCreateError] = useState<ApiError | Error | null>(null);

  if (me && me.role === "crew") return null; // crew never see prices (the tab is hidden from them too)

  const list = quotes.data ?? [];
  const wanted = Number(params.get("quote"));
  const selected: QuoteSummary | undefined = list.find((q) => q.id === wanted) ?? list.find((q) => !q.archived) ?? list[0];

  const select = (id: number) =>
    setParams(
      (p) => {
        const n = new URLSearchParams(p);
        n.set("quote", String(id));
        return n;
      },
      { replace: true },
    );

  const newQuote = async () => {
    setCreateError(null);
    try {
      const q = await create.mutateAsync({});
      toast.success(`Quote ${q.number} created from the saved roof.`);
      select(q.id);
    } catch (e) {
      setCreateError(e as Error);
    }
  };

  const noRoof = createError instanceof ApiError && createError.code === "no_roof";

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <h2 className="text-base font-semibold text-steel-900">Pricing</h2>
        {list.length > 0 && (
          <nav aria-label="Quotes of this job" className="flex flex-wrap gap-1">
            {list.map((q) => (
              <button
                key={q.id}
                type="button"
                onClick={() => select(q.id)}
                aria-current={selected?.id === q.id ? "true" : undefined}
                className={cn(
                  "flex items-center gap-2 rounded-md border px-2 py-1 text-sm focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500",
                  selected?.id === q.id ? "border-accent-600 bg-accent-50 text-steel-900" : "border-steel-200 bg-white text-steel-700 hover:bg-steel-50",
                  q.archived && "opacity-60",
                )}
              >
                <span className="font-mono text-xs font-semibold">{q.number}</span>
                <StatusBadge status={q.status} />
                <span className="tabular-nums text-steel-600">{formatCents(q.totalCents, { whole: true })}</span>
                {q.archived && <span className="text-xs text-steel-500">archived</span>}
              </button>
            ))}
          </nav>
        )}
        <Button variant={list.length ? "secondary" : "primary"} className="ml-auto" loading={create.isPending} onClick={() => void newQuote()}>
          New quote
        </Button>
      </div>

      {createError && (
        <Alert tone={noRoof ? "caution" : "error"} title={noRoof ? "Draw and save the roof first" : "The quote was not created"} onDismiss={() => setCreateError(null)}>
          {noRoof ? (
            <>
              A quote is priced from the job's saved roof.{" "}
              <Link className="font-medium underline" to={paths.jobSection(jobId, "roof-sketch")}>
                Open the roof sketch
              </Link>
              , save it, then come back.
            </>
          ) : (
            errorMessage(createError)
          )}
        </Alert>
      )}

      {quotes.isPending ? (
        <LoadingRow label="Loading quotes" text="Loading quotes…" />
      ) : quotes.isError ? (
        <LoadFailed title="The quotes could not be loaded" error={quotes.error} onRetry={() => quotes.refetch()} />
      ) : !selected ? (
        <EmptyState
          title="No quote yet"
          description="A new quote prices the saved roof with your price book: one option as designed, which you can copy into spacer and foil alternatives."
        />
      ) : (
        <ErrorBoundary key={selected.id} what="This quote">
          <QuotePanel quoteId={selected.id} />
        </ErrorBoundary>
      )}
    </div>
  );
}

function QuotePanel({ quoteId }: { quoteId: number }) {
  const qc = useQueryClient();
  const quote = useQuote(quoteId);
  const [viewing, setViewing] = useState<number | null>(null);
  const [dirty, setDirty] = useState(false);
  const past = useQuoteRevision(quoteId, viewing);
  const reload = useCallback(() => qc.refetchQueries({ queryKey: quoteKeys.detail(quoteId), exact: true }), [qc, quoteId]);

  if (quote.isPending) {
    return (
      <LoadingRow label="Loading quote" text="Loading quote…" />
    );
  }
  if (quote.isError) {
    return (
      <LoadFailed title="The quote could not be loaded" error={quote.error} onRetry={() => quote.refetch()} />
    );
  }

  const q = quote.data;
  const rev = q.revision;
  const showingPast = viewing !== null && viewing !== rev.revisionNo;
  const shown = showingPast ? past.data : rev;

  return (
    <div className="grid grid-cols-1 gap-3 xl:grid-cols-[minmax(0,1fr)_16rem]">
      <div className="min-w-0 space-y-3">
        <QuoteHeader quote={q} dirty={dirty} onReload={reload} />
        {showingPast ? (
          <Alert tone="info" title={`Revision ${viewing} (read-only)`}>
            This is how revision {viewing} was priced; it no longer changes.{" "}
            <button type="button" className="font-medium underline" onClick={() => setViewing(null)}>
              Back to the current revision
            </button>
          </Alert>
        ) : null}
        {showingPast && past.isPending ? (
          <Spinner label="Loading revision" />
        ) : showingPast && past.isError ? (
          <Alert tone="error">{errorMessage(past.error)}</Alert>
        ) : shown ? (
          <>
            {shown.options.length === 0 ? (
              <EmptyState title="No options" description="Add an option to price this quote." />
            ) : (
              <OptionsComparison revision={shown} showLines={false} />
            )}
            {!showingPast && rev.status === "draft" && (
              <div className="space-y-2">
                <h3 className="pt-2 text-sm font-semibold text-steel-900">Edit the draft</h3>
                <DraftEditor quoteId={q.id} revision={rev} onReload={reload} onDirtyChange={setDirty} />
              </div>
            )}
            {shown.options.length > 0 && <OptionLinesList revision={shown} />}
            {(showingPast || rev.status !== "draft") && shown.notes && (
              <section className="rounded-lg border border-steel-200 bg-white p-3 text-sm shadow-panel">
                <h3 className="text-xs font-semibold uppercase tracking-wide text-steel-600">Notes to the owner</h3>
                <p className="mt-1 whitespace-pre-wrap text-steel-800">{shown.notes}</p>
              </section>
            )}
          </>
        ) : null}
      </div>
      <RevisionHistory quote={q} viewing={viewing ?? rev.revisionNo} onView={(n) => setViewing(n === rev.revisionNo ? null : n)} />
    </div>
  );
}

function QuoteHeader({ quote, dirty, onReload }: { quote: QuoteDetail; dirty: boolean; onReload: () => Promise<unknown> }) {
  const rev = quote.revision;
  const submit = useSubmitQuote(quote.id);
  const revise = useReviseQuote(quote.id);
  const recalc = useRecalculateQuote(quote.id);
  const [problem, setProblem] = useState<{ text: string; stale: boolean } | null>(null);
  const [confirmRevise, setConfirmRevise] = useState(false);

  const fail = (e: unknown) =>
    setProblem({
      text: isStaleVersion(e) ? "Someone else changed this draft. Load the latest version and try again." : errorMessage(e),
      stale: isStaleVersion(e),
    });

  const doSubmit = () => {
    setProblem(null);
    submit.mutateAsync({ version: rev.version }).then(() => toast.success(`${quote.number} sent to the owner for approval.`), fail);
  };
  const doRecalc = () => {
    setProblem(null);
    recalc.mutateAsync(rev.version).then(() => toast.success("Re-priced from the current roof and price book."), fail);
  };
  const doRevise = () => {
    setProblem(null);
    revise.mutateAsync().then((q) => {
      setConfirmRevise(false);
      toast.success(`Revision ${q.revision.revisionNo} started as a draft.`);
    }, fail);
  };

  const returned = rev.status === "draft" && rev.returnComment;
  const revisable = REVISABLE_STATUSES.includes(rev.status);

  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center gap-x-3 gap-y-2 rounded-lg border border-steel-200 bg-white px-3 py-2 shadow-panel">
        <div className="min-w-0">
          <p className="flex items-center gap-2 text-sm">
            <span className="font-mono font-semibold text-steel-900">{quote.number}</span>
            <span className="text-steel-500">revision {rev.revisionNo}</span>
            <StatusBadge status={rev.status} />
          </p>
          <p className="text-xs text-steel-500">
            Priced from roof version {rev.roofVersion}
            {rev.priceBookVersion !== null && <> and price-book version {rev.priceBookVersion}</>} · minimum margin{" "}
            {rev.minMarginPct}% · by {rev.createdBy?.name ?? "—"}, {formatDateTime(rev.createdAt)}
          </p>
        </div>
        <div className="ml-auto flex flex-wrap gap-2">
          {rev.status === "draft" && (
            <>
              <Button variant="secondary" size="sm" loading={recalc.isPending} disabled={dirty} onClick={doRecalc}>
                Re-price
              </Button>
              <Button size="sm" loading={submit.isPending} disabled={dirty} onClick={doSubmit} title={dirty ? "Save your changes first" : undefined}>
                Submit for approval
              </Button>
            </>
          )}
          {revisable && !confirmRevise && (
            <Button size="sm" variant="secondary" onClick={() => setConfirmRevise(true)}>
              Revise
            </Button>
          )}
        </div>
      </div>

      {rev.status === "draft" && dirty && (
        <p className="text-xs text-steel-600">Save your changes before you re-price or submit.</p>
      )}

      {problem && (
        <Alert tone="error" title="That did not work" onDismiss={() => setProblem(null)}>
          {problem.text}
          {problem.stale && (
            <Button size="sm" variant="secondary" className="ml-2" onClick={() => void onReload().then(() => setProblem(null))}>
              Load the latest version
            </Button>
          )}
        </Alert>
      )}

      {returned && (
        <div role="status" className="rounded-lg border-2 border-caution-200 bg-caution-50 px-4 py-3">
          <p className="text-sm font-semibold text-caution-700">
            Returned by {rev.returnedBy?.name ?? "the owner"}
            {rev.returnedAt && <span className="font-normal"> on {formatDateTime(rev.returnedAt)}</span>}
          </p>
          <p className="mt-1 whitespace-pre-wrap text-base text-steel-900">“{rev.returnComment}”</p>
          <p className="mt-1 text-xs text-steel-600">Make the changes below, save, and submit again.</p>
        </div>
      )}

      {rev.status === "in_review" && (
        <Alert tone="info" title="Waiting for the owner's review">
          Submitted {formatDateTime(rev.submittedAt)}
          {rev.submittedBy && <> by {rev.submittedBy.name}</>}. It can't be edited while in review; the owner approves it or
          returns it with a comment.
        </Alert>
      )}

      {rev.status === "approved" && (
        <Alert tone="success" title={`Approved by ${rev.approvedBy?.name ?? "the owner"} on ${formatDateTime(rev.approvedAt)}`}>
          {rev.approvalReason ? <>Reason: {rev.approvalReason}</> : "Ready for the proposal."}
        </Alert>
      )}

      {confirmRevise && (
        <Alert tone="caution" title={`Start revision ${rev.revisionNo + 1}?`}>
          <p>
            A new draft copies this revision's options, manual lines, overrides and discount, and re-prices them from the
            job's current roof and price book. Revision {rev.revisionNo} stays exactly as it was {rev.status === "approved" ? "approved" : rev.status}; the new
            draft needs approval again.
          </p>
          <div className="mt-2 flex gap-2">
            <Button size="sm" loading={revise.isPending} onClick={doRevise}>
              Start revision {rev.revisionNo + 1}
            </Button>
            <Button size="sm" variant="ghost" onClick={() => setConfirmRevise(false)}>
              Cancel
            </Button>
          </div>
        </Alert>
      )}
    </div>
  );
}

function RevisionHistory({ quote, viewing, onView }: { quote: QuoteDetail; viewing: number; onView: (n: number) => void }) {
  const revs = [...quote.revisions].sort((a, b) => b.revisionNo - a.revisionNo);
  return (
    <aside aria-labelledby="rev-history" className="h-fit rounded-lg border border-steel-200 bg-white p-3 shadow-panel">
      <h3 id="rev-history" className="text-xs font-semibold uppercase tracking-wide text-steel-600">
        Revisions
      </h3>
      <ol className="mt-2 space-y-1">
        {revs.map((r) => (
          <li key={r.id}>
            <button
              type="button"
              onClick={() => onView(r.revisionNo)}
              aria-current={viewing === r.revisionNo ? "true" : undefined}
              className={cn(
                "flex w-full items-center gap-2 rounded px-2 py-1.5 text-left text-sm focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500",
                viewing === r.revisionNo ? "bg-steel-100" : "hover:bg-steel-50",
              )}
            >
              <span className="w-7 font-mono text-xs text-steel-500">R{r.revisionNo}</span>
              <StatusBadge status={r.status} />
              <span className="ml-auto tabular-nums text-steel-700">{formatCents(r.totalCents, { whole: true })}</span>
            </button>
            <p className="pl-11 text-[11px] text-steel-500">{formatDateTime(r.createdAt)}</p>
          </li>
        ))}
      </ol>
      <p className="mt-2 text-[11px] leading-4 text-steel-500">
        A revision is frozen once it leaves draft. Revise an approved or sent quote to change it.
      </p>
    </aside>
  );
}
