import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { LoadFailed } from "@/components/ui/load-failed";
import { LoadingRow } from "@/components/ui/spinner";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { useMaterialMapping } from "@/lib/queries/price-book";
import { categoryLabel } from "@/features/price-book/components/items-tab";
import { formatCents } from "@/lib/money";

/** Each takeoff material key and the active item that prices it; unpriced keys and rule conflicts stand out. */
export function MappingTab() {
  const mapping = useMaterialMapping();
  if (mapping.isPending) {
    return (
      <LoadingRow label="Loading mapping" />
    );
  }
  if (mapping.isError) {
    return (
      <LoadFailed title="The mapping could not be loaded" error={mapping.error} onRetry={() => mapping.refetch()} />
    );
  }
  const { data, conflicts } = mapping.data;
  const unpriced = data.filter((m) => !m.item).length;
  return (
    <div className="space-y-3">
      <p className="text-sm text-steel-600">
        The takeoff counts each material under a key; a quote prices it with the active item linked to that key. To
        change a link, set the item's takeoff material (or import it from CSV).{" "}
        <span className="font-medium text-steel-800">
          {data.length - unpriced} of {data.length} keys priced
        </span>
        {unpriced > 0 && <> · {unpriced} without an item (those materials are listed as missing on quotes)</>}
      </p>
      {conflicts.length > 0 && (
        <Alert tone="caution" title={`${conflicts.length} ${conflicts.length === 1 ? "setting is" : "settings are"} given by more than one item`}>
          <ul className="mt-1 space-y-0.5">
            {conflicts.map((c) => (
              <li key={c.field}>
                <code className="text-xs">{c.field}</code>: using {c.used.value} from <strong>{c.used.sku}</strong> ({c.used.key});
                ignoring{" "}
                {c.ignored.map((i, n) => (
                  <span key={`${i.sku}-${n}`}>
                    {n > 0 && ", "}
                    {i.value} from {i.sku} ({i.key})
                  </span>
                ))}
              </li>
            ))}
          </ul>
        </Alert>
      )}
      <Table aria-label="Takeoff material mapping" className="text-[13px]">
        <THead>
          <tr>
            <Th>Takeoff key</Th>
            <Th className="hidden md:table-cell">Material</Th>
            <Th>Counted in</Th>
            <Th>Priced by</Th>
            <Th className="text-right">Cost</Th>
          </tr>
        </THead>
        <TBody>
          {data.map((m) => (
            <Tr key={m.key}>
              <Td className="py-1.5">
                <code className="whitespace-nowrap text-xs text-steel-800">{m.key}</code>
                <div className="text-xs text-steel-500">{categoryLabel(m.category)}</div>
              </Td>
              <Td className="hidden py-1.5 text-steel-600 md:table-cell">{m.description}</Td>
              <Td className="py-1.5 text-steel-600">{m.unit}</Td>
              <Td className="py-1.5">
                {m.item ? (
                  <>
                    <span className="font-mono text-xs">{m.item.sku}</span> <span className="text-steel-700">{m.item.name}</span>
                  </>
                ) : (
                  <Badge tone="accent">No item: not priced</Badge>
                )}
              </Td>
              <Td className="whitespace-nowrap py-1.5 text-right tabular-nums">
                {m.item ? (
                  <>
                    {formatCents(m.item.unitCostCents)}
                    <span className="text-steel-500">/{m.item.purchaseUnit}</span>
                  </>
                ) : (
                  "—"
                )}
              </Td>
            </Tr>
          ))}
        </TBody>
      </Table>
    </div>
  );
}
