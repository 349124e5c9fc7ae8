import { useMemo } from "react";
import { Link, useNavigate } from "react-router-dom";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { APPROVAL_REASON_MIN, quoteReturnSchema, type QuoteDetail, type QuoteReturnInput, type RevisionDetail } from "@shared/schemas/quote";
import { ApiError, errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { paths } from "@/config/paths";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { LoadFailed } from "@/components/ui/load-failed";
import { Textarea } from "@/components/ui/textarea";
import { LoadingRow } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { PageHeader } from "@/components/layout/page-header";
import { formatCents, formatDateTime, formatPct } from "@/lib/money";
import { useApprovalsQueue, useQuote } from "@/lib/queries/quotes";
import { useApproveQuote, useReturnQuote } from "@/features/quotes/api/mutations";
import { OptionsComparison } from "@/features/quotes/components/options-comparison";
import { StatusBadge } from "@/features/quotes/components/quote-bits";


/** Why the owner must write a reason to approve: options below the minimum margin, overrides. */
export function approvalReasons(rev: RevisionDetail): string[] {
  const out: string[] = [];
  for (const o of rev.options) {
    if (o.belowMinMargin)
      out.push(`“${o.label}” has a ${formatPct(o.totals.marginPct)} margin, below the ${formatPct(rev.minMarginPct, 0)} minimum.`);
    if (o.hasOverrides) {
      const n = o.lines.filter((l) => l.overrideReason).length;
      out.push(`“${o.label}” has ${n === 1 ? "a line" : `${n} lines`} priced by a manual override.`);
    }
  }
  if (rev.needsApprovalReason && out.length === 0) out.push("The pricing rules ask for a reason on this quote.");
  return out;
}

/** `/approvals/:quoteId`: the owner's review of one submitted quote. */
export function ApprovalReview({ quoteId }: { quoteId: number }) {
  const quote = useQuote(quoteId);
  const queue = useApprovalsQueue();
  const entry = queue.data?.find((q) => q.quoteId === quoteId);

  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-1 text-xs text-steel-500">
        <Link to={paths.approvals} className="hover:text-steel-800 hover:underline">
          Approvals
        </Link>{" "}
        / review
      </nav>
      {quote.isPending ? (
        <LoadingRow label="Loading quote" />
      ) : quote.isError ? (
        <LoadFailed title="The quote could not be loaded" error={quote.error} onRetry={() => quote.refetch()} />
      ) : (
        <ReviewBody quote={quote.data} customer={entry ? `${entry.customerName} · ${entry.siteAddress}` : null} />
      )}
    </>
  );
}

function ReviewBody({ quote, customer }: { quote: QuoteDetail; customer: string | null }) {
  const rev = quote.revision;
  const optionLabel = (id: number | null) => (id === null ? "All options" : (rev.options.find((o) => o.id === id)?.label ?? `Option ${id}`));
  const inReview = rev.status === "in_review";

  return (
    <>
      <title>{`Review ${quote.number} · Ridgewright`}</title>
      <PageHeader
        title={
          <span className="flex flex-wrap items-center gap-2">
            Review {quote.number} <span className="text-sm font-normal text-steel-500">revision {rev.revisionNo}</span>
            <StatusBadge status={rev.status} />
          </span>
        }
        description={
          <>
            {customer && <span className="font-medium text-steel-800">{customer} · </span>}
            Submitted {formatDateTime(rev.submittedAt)} by {rev.submittedBy?.name ?? rev.createdBy?.name ?? "—"} ·{" "}
            <Link to={`${paths.jobSection(quote.jobId, "pricing")}?quote=${quote.id}`} className="text-accent-700 hover:underline">
              open the job
            </Link>
          </>
        }
      />
      {!inReview && (
        <Alert tone="info" className="mb-3" title="Not waiting for review">
          This quote is {rev.status.replace("_", " ")}; there is nothing to approve or return.
        </Alert>
      )}
      <div className="grid grid-cols-1 gap-4 xl:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-3">
          <OptionsComparison revision={rev} showLines />
        </div>
        <div className="space-y-3">
          <section className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel" aria-labelledby="rv-notes">
            <h2 id="rv-notes" className="text-xs font-semibold uppercase tracking-wide text-steel-600">
              Estimator's notes
            </h2>
            <p className={cn("mt-1 whitespace-pre-wrap text-sm", rev.notes ? "text-steel-900" : "text-steel-500")}>
              {rev.notes || "No notes."}
            </p>
          </section>
          <section className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel" aria-labelledby="rv-overrides">
            <h2 id="rv-overrides" className="text-xs font-semibold uppercase tracking-wide text-steel-600">
              Overrides and discount
            </h2>
            {rev.overrides.length === 0 && !rev.discount ? (
              <p className="mt-1 text-sm text-steel-500">None: every line is priced from the price book.</p>
            ) : (
              <ul className="mt-1 divide-y divide-steel-100 text-sm">
                {rev.overrides.map((o, i) => (
                  <li key={`${o.key}-${i}`} className="py-1.5">
                    <p className="text-steel-900">
                      <code className="text-xs">{o.key}</code> <span className="text-xs text-steel-500">({optionLabel(o.optionId)})</span>
                    </p>
                    <p className="text-xs text-steel-600">
                      {o.unitCostCents !== undefined && <>unit cost {formatCents(o.unitCostCents)} </>}
                      {o.quantity !== undefined && <>quantity {o.quantity}</>}
                    </p>
                    <p className="text-sm text-accent-800">Reason: {o.reason}</p>
                  </li>
                ))}
                {rev.discount && (
                  <li className="py-1.5">
                    <p className="text-steel-900">Discount {formatCents(rev.discount.amountCents)}</p>
                    <p className="text-sm text-accent-800">Reason: {rev.discount.reason}</p>
                  </li>
                )}
              </ul>
            )}
          </section>
          {inReview && <DecisionForms quote={quote} />}
        </div>
      </div>
    </>
  );
}

function DecisionForms({ quote }: { quote: QuoteDetail }) {
  const rev = quote.revision;
  const navigate = useNavigate();
  const approve = useApproveQuote(quote.id);
  const ret = useReturnQuote(quote.id);
  const reasons = approvalReasons(rev);
  const needs = rev.needsApprovalReason;

  const approveSchema = useMemo(
    () =>
      z.object({
        reason: needs
          ? z
              .string()
              .trim()
              .min(APPROVAL_REASON_MIN, `Write why you approve it anyway (at least ${APPROVAL_REASON_MIN} characters)`)
              .max(1000, "Use at most 1000 characters")
          : z.string().trim().max(1000, "Use at most 1000 characters"),
      }),
    [needs],
  );
  const a = useForm<{ reason: string }>({ resolver: zodResolver(approveSchema), defaultValues: { reason: "" } });
  const r = useForm<z.input<typeof quoteReturnSchema>, unknown, QuoteReturnInput>({
    resolver: zodResolver(quoteReturnSchema),
    defaultValues: { comment: "" },
  });

  const handle = (setError: (m: string) => void, fieldName: string) => (err: unknown) => {
    if (err instanceof ApiError && err.fields?.[fieldName]) setError(err.fields[fieldName]);
    else setError(errorMessage(err));
  };

  const onApprove = a.handleSubmit(async ({ reason }) => {
    try {
      await approve.mutateAsync(reason ? { reason } : {});
      toast.success(`${quote.number} approved.`);
      navigate(paths.approvals);
    } catch (err) {
      handle((m) => a.setError("reason", { message: m }), "reason")(err);
    }
  });
  const onReturn = r.handleSubmit(async (values) => {
    try {
      await ret.mutateAsync(values);
      toast.success(`${quote.number} returned to the estimator.`);
      navigate(paths.approvals);
    } catch (err) {
      handle((m) => r.setError("comment", { message: m }), "comment")(err);
    }
  });

  return (
    <>
      <form onSubmit={onApprove} noValidate className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel" aria-labelledby="rv-approve">
        <h2 id="rv-approve" className="text-sm font-semibold text-steel-900">
          Approve
        </h2>
        {needs && reasons.length > 0 && (
          <div className="mt-2 rounded border border-caution-200 bg-caution-50 px-2 py-1.5 text-xs text-caution-700">
            <p className="font-semibold">A reason is required because:</p>
            <ul className="mt-0.5 list-disc pl-4">
              {reasons.map((x) => (
                <li key={x}>{x}</li>
              ))}
            </ul>
          </div>
        )}
        <Field
          label={needs ? "Reason for approving (required)" : "Reason (optional)"}
          error={a.formState.errors.reason?.message}
          className="mt-2"
        >
          <Textarea rows={2} {...a.register("reason")} />
        </Field>
        <Button type="submit" className="mt-2 w-full" loading={a.formState.isSubmitting}>
          Approve {quote.number}
        </Button>
      </form>

      <form onSubmit={onReturn} noValidate className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel" aria-labelledby="rv-return">
        <h2 id="rv-return" className="text-sm font-semibold text-steel-900">
          Return to the estimator
        </h2>
        <Field label="What should change? (required)" error={r.formState.errors.comment?.message} className="mt-2">
          <Textarea rows={3} {...r.register("comment")} />
        </Field>
        <Button type="submit" variant="secondary" className="mt-2 w-full" loading={r.formState.isSubmitting}>
          Return with comment
        </Button>
      </form>
    </>
  );
}
