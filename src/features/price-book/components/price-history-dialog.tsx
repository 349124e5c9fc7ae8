import type { CatalogItemDto } from "@shared/schemas/price-book";
import { errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Spinner } from "@/components/ui/spinner";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { usePriceHistory } from "@/lib/queries/price-book";
import { formatCents, formatDateTime } from "@/lib/money";

/** Every recorded cost, pack coverage and waste of one item, newest first. */
export function PriceHistoryDialog({ item, onClose }: { item: CatalogItemDto | null; onClose: () => void }) {
  const history = usePriceHistory(item?.id ?? null);
  const rows = [...(history.data ?? [])].sort((a, b) => b.version - a.version);
  return (
    <Dialog
      open={item !== null}
      onClose={onClose}
      className="max-w-xl"
      title={item ? `Price history · ${item.sku}` : "Price history"}
      description={item?.name}
      footer={
        <Button variant="secondary" onClick={onClose}>
          Close
        </Button>
      }
    >
      {history.isPending ? (
        <div className="flex items-center gap-2 text-steel-500">
          <Spinner label="Loading price history" /> Loading…
        </div>
      ) : history.isError ? (
        <Alert tone="error" title="The history could not be loaded">
          {errorMessage(history.error)}
        </Alert>
      ) : rows.length === 0 ? (
        <p className="text-sm text-steel-600">No price changes recorded yet.</p>
      ) : (
        <Table aria-label="Price history">
          <THead>
            <Tr>
              <Th>Version</Th>
              <Th>Changed</Th>
              <Th className="text-right">Cost</Th>
              <Th className="text-right">Pack</Th>
              <Th className="text-right">Waste</Th>
            </Tr>
          </THead>
          <TBody>
            {rows.map((p) => (
              <Tr key={p.version}>
                <Td className="py-1.5 tabular-nums">v{p.version}</Td>
                <Td className="whitespace-nowrap py-1.5 text-steel-600">{formatDateTime(p.createdAt)}</Td>
                <Td className="py-1.5 text-right tabular-nums">{formatCents(p.unitCostCents)}</Td>
                <Td className="py-1.5 text-right tabular-nums">{p.packCoverage}</Td>
                <Td className="py-1.5 text-right tabular-nums">{p.wastePct === null ? "default" : `${p.wastePct}%`}</Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      )}
    </Dialog>
  );
}
