import { useRef, type KeyboardEvent } from "react";
import { useSearchParams } from "react-router-dom";
import { cn } from "@/lib/cn";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { PageHeader } from "@/components/layout/page-header";
import { CsvTab } from "@/features/price-book/components/csv-tab";
import { ItemsTab } from "@/features/price-book/components/items-tab";
import { LabourTab } from "@/features/price-book/components/labour-tab";
import { MappingTab } from "@/features/price-book/components/mapping-tab";
import { SettingsTab } from "@/features/price-book/components/settings-tab";

const TABS = [
  { id: "items", label: "Items" },
  { id: "mapping", label: "Takeoff mapping" },
  { id: "labour", label: "Labour" },
  { id: "settings", label: "Pricing settings" },
  { id: "csv", label: "CSV import / export" },
] as const;
type TabId = (typeof TABS)[number]["id"];

/** The price book: owners edit, estimators read. The tab is in the URL (`?tab=labour`). */
export function PriceBookScreen({ canEdit }: { canEdit: boolean }) {
  const [params, setParams] = useSearchParams();
  const raw = params.get("tab");
  const tab: TabId = TABS.some((t) => t.id === raw) ? (raw as TabId) : "items";
  const refs = useRef<Record<string, HTMLButtonElement | null>>({});

  const select = (id: TabId) => {
    setParams(
      (p) => {
        const next = new URLSearchParams(p);
        if (id === "items") next.delete("tab");
        else next.set("tab", id);
        return next;
      },
      { replace: true },
    );
  };

  const onKeyDown = (e: KeyboardEvent) => {
    const i = TABS.findIndex((t) => t.id === tab);
    let n = -1;
    if (e.key === "ArrowRight") n = (i + 1) % TABS.length;
    else if (e.key === "ArrowLeft") n = (i - 1 + TABS.length) % TABS.length;
    else if (e.key === "Home") n = 0;
    else if (e.key === "End") n = TABS.length - 1;
    if (n < 0) return;
    e.preventDefault();
    select(TABS[n]!.id);
    refs.current[TABS[n]!.id]?.focus();
  };

  return (
    <>
      <PageHeader
        title="Price book"
        description={
          canEdit
            ? "What you pay for materials and labour, and how quotes turn cost into price."
            : "Your company's unit costs, labour rates and pricing settings (read-only; the owner edits them)."
        }
      />
      <div role="tablist" aria-label="Price book sections" className="mb-4 flex gap-1 overflow-x-auto border-b border-steel-200" onKeyDown={onKeyDown}>
        {TABS.map((t) => (
          <button
            key={t.id}
            ref={(el) => {
              refs.current[t.id] = el;
            }}
            type="button"
            role="tab"
            id={`pb-tab-${t.id}`}
            aria-selected={tab === t.id}
            aria-controls={`pb-panel-${t.id}`}
            tabIndex={tab === t.id ? 0 : -1}
            onClick={() => select(t.id)}
            className={cn(
              "-mb-px whitespace-nowrap border-b-2 px-3 py-2 text-sm font-medium focus-visible:outline focus-visible:outline-2 focus-visible:outline-accent-600",
              tab === t.id ? "border-accent-700 text-steel-900" : "border-transparent text-steel-600 hover:text-steel-900",
            )}
          >
            {t.label}
          </button>
        ))}
      </div>
      <div role="tabpanel" id={`pb-panel-${tab}`} aria-labelledby={`pb-tab-${tab}`}>
        <ErrorBoundary key={tab} what={`The ${TABS.find((t) => t.id === tab)!.label.toLowerCase()} section`}>
          {tab === "items" && <ItemsTab canEdit={canEdit} />}
          {tab === "mapping" && <MappingTab />}
          {tab === "labour" && <LabourTab canEdit={canEdit} />}
          {tab === "settings" && <SettingsTab canEdit={canEdit} />}
          {tab === "csv" && <CsvTab canEdit={canEdit} />}
        </ErrorBoundary>
      </div>
    </>
  );
}
