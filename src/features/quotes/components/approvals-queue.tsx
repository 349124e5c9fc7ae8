import { useMemo } from "react";
import { Link, useNavigate } from "react-router-dom";
import { paths } from "@/config/paths";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadFailed } from "@/components/ui/load-failed";
import { LoadingRow } from "@/components/ui/spinner";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { formatCents, formatDateTime } from "@/lib/money";
import { useApprovalsQueue } from "@/lib/queries/quotes";
import { MarginText } from "@/features/quotes/components/quote-bits";

/** How long ago, in words ("3 days"), for the queue's waiting column. */
export function waited(iso: string, now = Date.now()): string {
  const mins = Math.max(0, Math.round((now - new Date(iso).getTime()) / 60_000));
  if (mins < 60) return `${mins} min`;
  const hours = Math.round(mins / 60);
  if (hours < 48) return `${hours} h`;
  return `${Math.round(hours / 24)} days`;
}

/** The owner's queue: quotes in review, oldest submitted first, as a dense table. */
export function ApprovalsQueue() {
  const queue = useApprovalsQueue();
  const navigate = useNavigate();
  const rows = useMemo(
    () => [...(queue.data ?? [])].sort((a, b) => new Date(a.submittedAt).getTime() - new Date(b.submittedAt).getTime()),
    [queue.data],
  );

  if (queue.isPending) {
    return (
      <LoadingRow label="Loading the queue" />
    );
  }
  if (queue.isError) {
    return (
      <LoadFailed title="The queue could not be loaded" error={queue.error} onRetry={() => queue.refetch()} />
    );
  }
  if (rows.length === 0) {
    return (
      <EmptyState
        title="Nothing waiting for review"
        description="When an estimator submits a quote, it appears here with its totals, margin and any overrides."
      />
    );
  }

  return (
    <Table aria-label="Quotes waiting for approval" className="text-[13px]">
      <THead>
        <tr>
          <Th>Quote</Th>
          <Th>Customer / site</Th>
          <Th className="hidden md:table-cell">Estimator</Th>
          <Th>Submitted</Th>
          <Th>Options and totals</Th>
          <Th>Lowest margin</Th>
          <Th className="text-right">Overrides</Th>
        </tr>
      </THead>
      <TBody>
        {rows.map((r) => (
          <Tr
            key={r.quoteId}
            className="cursor-pointer align-top"
            onClick={(e) => {
              if ((e.target as HTMLElement).closest("a")) return;
              navigate(`${paths.approvals}/${r.quoteId}`);
            }}
          >
            <Td className="whitespace-nowrap py-1.5">
              <Link
                to={`${paths.approvals}/${r.quoteId}`}
                className="font-mono text-xs font-semibold text-accent-700 underline-offset-2 hover:underline focus-visible:rounded focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
              >
                {r.number}
              </Link>
              <span className="ml-1 text-xs text-steel-500">R{r.revisionNo}</span>
            </Td>
            <Td className="py-1.5">
              <span className="block font-medium text-steel-900">{r.customerName}</span>
              <span className="block text-xs text-steel-500">{r.siteAddress}</span>
            </Td>
            <Td className="hidden py-1.5 md:table-cell">{r.estimator?.name ?? r.submittedBy?.name ?? "—"}</Td>
            <Td className="whitespace-nowrap py-1.5">
              <span className="block">{formatDateTime(r.submittedAt)}</span>
              <span className="block text-xs text-steel-500">waiting {waited(r.submittedAt)}</span>
            </Td>
            <Td className="py-1.5">
              <ul className="space-y-0.5">
                {r.options.map((o, i) => (
                  <li key={`${o.label}-${i}`} className="flex justify-between gap-3 whitespace-nowrap">
                    <span className="truncate text-steel-700">{o.label}</span>
                    <span className="tabular-nums text-steel-900">{formatCents(o.totalCents, { whole: true })}</span>
                  </li>
                ))}
              </ul>
            </Td>
            <Td className="py-1.5">
              <MarginText marginPct={r.lowestMarginPct} minMarginPct={r.minMarginPct} />
            </Td>
            <Td className="py-1.5 text-right tabular-nums">
              {r.overridesCount > 0 ? <span className="font-semibold text-accent-800">{r.overridesCount}</span> : <span className="text-steel-400">0</span>}
            </Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}
