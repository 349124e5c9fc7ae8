import { useMemo, useState } from "react";
import {
  CATALOG_CATEGORIES,
  catalogItemUpdateSchema,
  type CatalogItemDto,
  type CatalogItemUpdate,
} from "@shared/schemas/price-book";
import { ApiError, errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Input } from "@/components/ui/input";
import { LoadFailed } from "@/components/ui/load-failed";
import { Select } from "@/components/ui/select";
import { LoadingRow } from "@/components/ui/spinner";
import { Table, TBody, Td, Th, THead, Tr } from "@/components/ui/table";
import { toast } from "@/components/ui/toast";
import { useCatalogItems } from "@/lib/queries/price-book";
import { isStale, useSetItemActive, useUpdateItem } from "@/features/price-book/api/mutations";
import { AddItemDialog } from "@/features/price-book/components/add-item-dialog";
import { InlineNumberCell } from "@/features/price-book/components/inline-number-cell";
import { PriceHistoryDialog } from "@/features/price-book/components/price-history-dialog";
import { centsToInput, dollarsToCents, formatCents, parseNumber } from "@/lib/money";

type EditableField = "unitCostCents" | "packCoverage" | "wastePct";

const FIELD_LABEL: Record<EditableField, string> = {
  unitCostCents: "cost",
  packCoverage: "pack coverage",
  wastePct: "waste",
};

export const STALE_ITEM_MESSAGE = "changed by someone else, reloaded";

export const categoryLabel = (c: string) => c.charAt(0).toUpperCase() + c.slice(1).replace(/-/g, " ");

/** The price book's items: a dense table, filtered in the browser, edited in place by owners. */
export function ItemsTab({ canEdit }: { canEdit: boolean }) {
  const items = useCatalogItems();
  const update = useUpdateItem();
  const setActive = useSetItemActive();
  const [q, setQ] = useState("");
  const [category, setCategory] = useState("");
  const [showArchived, setShowArchived] = useState(false);
  const [adding, setAdding] = useState(false);
  const [historyFor, setHistoryFor] = useState<CatalogItemDto | null>(null);
  const [notice, setNotice] = useState<{ tone: "error" | "caution"; title: string; body: string } | null>(null);

  const rows = useMemo(() => {
    const needle = q.trim().toLowerCase();
    return (items.data ?? [])
      .filter((i) => (showArchived ? true : i.active))
      .filter((i) => !category || i.category === category)
      .filter(
        (i) =>
          !needle ||
          i.sku.toLowerCase().includes(needle) ||
          i.name.toLowerCase().includes(needle) ||
          (i.materialKey ?? "").includes(needle),
      )
      .sort((a, b) => Number(b.active) - Number(a.active) || a.category.localeCompare(b.category) || a.sku.localeCompare(b.sku));
  }, [items.data, q, category, showArchived]);

  const archivedCount = (items.data ?? []).filter((i) => !i.active).length;

  const save = async (item: CatalogItemDto, field: EditableField, text: string): Promise<string | null> => {
    const value = field === "unitCostCents" ? dollarsToCents(text) : parseNumber(text);
    if (value === null && field !== "wastePct") return "Required";
    const changes = { [field]: value, version: item.version } as CatalogItemUpdate;
    const check = catalogItemUpdateSchema.safeParse(changes);
    if (!check.success) return check.error.issues[0]?.message ?? "Check this value";
    setNotice(null);
    try {
      await update.mutateAsync({ id: item.id, changes: check.data });
      toast.success(`${item.sku}: ${FIELD_LABEL[field]} saved.`);
      return null;
    } catch (err) {
      if (isStale(err)) {
        setNotice({
          tone: "caution",
          title: `${item.sku} was ${STALE_ITEM_MESSAGE}`,
          body: `Your ${FIELD_LABEL[field]} (${text.trim() || "blank"}) was not saved. Check the current values and enter it again.`,
        });
        return null;
      }
      if (err instanceof ApiError && err.fields) return err.fields[field] ?? Object.values(err.fields)[0] ?? err.message;
      return errorMessage(err);
    }
  };

  const toggleActive = (item: CatalogItemDto) =>
    setActive.mutateAsync({ id: item.id, active: !item.active }).then(
      (saved) => toast.success(saved.active ? `${saved.sku} restored.` : `${saved.sku} archived; new quotes won't use it.`),
      (err: unknown) =>
        setNotice({ tone: "error", title: `${item.sku} could not be ${item.active ? "archived" : "restored"}`, body: errorMessage(err) }),
    );

  if (items.isPending) {
    return (
      <LoadingRow label="Loading items" text="Loading items…" />
    );
  }
  if (items.isError) {
    return (
      <LoadFailed title="The items could not be loaded" error={items.error} onRetry={() => items.refetch()} />
    );
  }

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-2">
        <div className="w-64 max-w-full">
          <label htmlFor="pb-search" className="sr-only">
            Search items
          </label>
          <Input
            id="pb-search"
            type="search"
            placeholder="Search SKU, name or material key"
            value={q}
            onChange={(e) => setQ(e.target.value)}
          />
        </div>
        <div className="w-44">
          <label htmlFor="pb-category" className="sr-only">
            Category
          </label>
          <Select id="pb-category" value={category} onChange={(e) => setCategory(e.target.value)}>
            <option value="">All categories</option>
            {CATALOG_CATEGORIES.map((c) => (
              <option key={c} value={c}>
                {categoryLabel(c)}
              </option>
            ))}
          </Select>
        </div>
        <label className="flex h-8 items-center gap-1.5 text-sm text-steel-700">
          <input
            type="checkbox"
            className="size-4 rounded border-steel-300 accent-accent-700"
            checked={showArchived}
            onChange={(e) => setShowArchived(e.target.checked)}
          />
          Show archived ({archivedCount})
        </label>
        <p className="ml-auto text-xs text-steel-500" aria-live="polite">
          {rows.length} of {items.data.length} items
        </p>
        {canEdit && <Button onClick={() => setAdding(true)}>Add item</Button>}
      </div>

      {canEdit && (
        <p className="text-xs text-steel-500">
          Click a cost, pack coverage or waste figure to change it; Enter or leaving the cell saves, Escape undoes. Each
          change is kept in the item's price history.
        </p>
      )}

      {notice && (
        <Alert tone={notice.tone} title={notice.title} onDismiss={() => setNotice(null)}>
          {notice.body}
        </Alert>
      )}

      {rows.length === 0 ? (
        <EmptyState
          title={items.data.length === 0 ? "No items yet" : "No items match"}
          description={
            items.data.length === 0
              ? "Add the panels, trim, fasteners and underlayment you buy, or import them from a CSV file."
              : "Try another search or category."
          }
        />
      ) : (
        <Table aria-label="Price book items" className="text-[13px]">
          <THead>
            <Tr>
              <Th>SKU</Th>
              <Th>Name</Th>
              <Th className="hidden lg:table-cell">Category</Th>
              <Th className="hidden xl:table-cell">Takeoff key</Th>
              <Th className="text-right">Cost / unit</Th>
              <Th className="text-right">Pack coverage</Th>
              <Th className="text-right">Waste</Th>
              <Th className="hidden lg:table-cell">Status</Th>
              <Th>
                <span className="sr-only">Actions</span>
              </Th>
            </Tr>
          </THead>
          <TBody>
            {rows.map((item) => (
              <Tr key={item.id} className={cn(!item.active && "bg-steel-50 text-steel-500")}>
                <Td className="whitespace-nowrap py-1 font-mono text-xs">{item.sku}</Td>
                <Td className="min-w-[13rem] py-1">
                  <span className={cn("line-clamp-2 leading-snug", !item.active && "text-steel-500")}>{item.name}</span>
                  <span className="mt-0.5 flex flex-wrap items-center gap-1 xl:hidden">
                    {item.materialKey && <code className="text-[11px] text-steel-500">{item.materialKey}</code>}
                    {!item.active && (
                      <Badge tone="muted" className="lg:hidden">
                        Archived
                      </Badge>
                    )}
                  </span>
                </Td>
                <Td className="hidden whitespace-nowrap py-1 text-steel-600 lg:table-cell">{categoryLabel(item.category)}</Td>
                <Td className="hidden py-1 xl:table-cell">
                  {item.materialKey ? (
                    <code className="whitespace-nowrap rounded bg-steel-100 px-1 py-0.5 text-xs text-steel-700">{item.materialKey}</code>
                  ) : (
                    <span className="text-xs text-steel-400">manual only</span>
                  )}
                </Td>
                <Td className="py-1 text-right">
                  {canEdit ? (
                    <InlineNumberCell
                      className="ml-auto w-[8.5rem]"
                      label={`Cost per ${item.purchaseUnit} of ${item.sku}`}
                      value={centsToInput(item.unitCostCents)}
                      prefix="$"
                      suffix={`/${item.purchaseUnit}`}
                      onCommit={(t) => save(item, "unitCostCents", t)}
                    />
                  ) : (
                    <span className="tabular-nums">
                      {formatCents(item.unitCostCents)}
                      <span className="text-steel-500">/{item.purchaseUnit}</span>
                    </span>
                  )}
                </Td>
                <Td className="py-1 text-right">
                  {canEdit ? (
                    <InlineNumberCell
                      className="ml-auto w-[7rem]"
                      label={`Pack coverage of ${item.sku}`}
                      value={String(item.packCoverage)}
                      suffix={` ${item.coverageUnit}`}
                      onCommit={(t) => save(item, "packCoverage", t)}
                    />
                  ) : (
                    <span className="tabular-nums">
                      {item.packCoverage} <span className="text-steel-500">{item.coverageUnit}</span>
                    </span>
                  )}
                </Td>
                <Td className="py-1 text-right">
                  {canEdit ? (
                    <InlineNumberCell
                      className="ml-auto w-[5.5rem]"
                      label={`Waste percent of ${item.sku}`}
                      value={item.wastePct === null ? "" : String(item.wastePct)}
                      placeholder="default"
                      suffix={item.wastePct === null ? undefined : "%"}
                      onCommit={(t) => save(item, "wastePct", t)}
                    />
                  ) : (
                    <span className="tabular-nums">{item.wastePct === null ? "default" : `${item.wastePct}%`}</span>
                  )}
                </Td>
                <Td className="hidden whitespace-nowrap py-1 lg:table-cell">
                  {item.active ? <Badge tone="ok">Active</Badge> : <Badge tone="muted">Archived</Badge>}
                </Td>
                <Td className="whitespace-nowrap py-1 text-right">
                  <div className="flex justify-end gap-1">
                    <Button variant="ghost" size="sm" onClick={() => setHistoryFor(item)} aria-label={`Price history of ${item.sku}`}>
                      History
                    </Button>
                    {canEdit && (
                      <Button
                        variant="ghost"
                        size="sm"
                        loading={setActive.isPending && setActive.variables?.id === item.id}
                        onClick={() => void toggleActive(item)}
                        aria-label={`${item.active ? "Archive" : "Restore"} ${item.sku}`}
                      >
                        {item.active ? "Archive" : "Restore"}
                      </Button>
                    )}
                  </div>
                </Td>
              </Tr>
            ))}
          </TBody>
        </Table>
      )}

      {canEdit && <AddItemDialog open={adding} onClose={() => setAdding(false)} />}
      <PriceHistoryDialog item={historyFor} onClose={() => setHistoryFor(null)} />
    </div>
  );
}
