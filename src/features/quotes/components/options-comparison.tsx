import type { OptionSpec, QuoteLineDto, QuoteLineKind, QuoteOptionDto, RevisionDetail } from "@shared/schemas/quote";
import { cn } from "@/lib/cn";
import { formatCents } from "@/lib/money";
import { MarginText } from "@/features/quotes/components/quote-bits";

export const KIND_LABEL: Record<QuoteLineKind, string> = {
  material: "Materials",
  labor: "Labour",
  tearoff: "Tear-off",
  deck: "Deck replacement",
  manual: "Manual lines",
  discount: "Discount",
};
const KINDS: QuoteLineKind[] = ["material", "labor", "tearoff", "deck", "manual", "discount"];

export const SPACER_LABEL: Record<string, string> = {
  none: "No spacer",
  battens: "Battens",
  "counter-battens": "Counter-battens",
  mesh: "3D mesh mat",
  dimpled: "Dimpled sheet",
};

export function specText(spec: OptionSpec): string {
  const parts: string[] = [];
  if (spec.spacer) parts.push(SPACER_LABEL[spec.spacer] ?? spec.spacer);
  if (spec.foil !== undefined) parts.push(spec.foil ? "with foil" : "no foil");
  if (spec.stackId) parts.push(`assembly ${spec.stackId}`);
  return parts.length ? parts.join(", ") : "As designed";
}

const sumBy = (lines: QuoteLineDto[], kind: QuoteLineKind, f: "costCents" | "priceCents") =>
  lines.filter((l) => l.kind === kind).reduce((s, l) => s + l[f], 0);

const fmtQty = (q: number) => (Number.isInteger(q) ? String(q) : q.toFixed(2).replace(/0+$/, "").replace(/\.$/, ""));

/**
 * The options of one revision side by side: what each changes, its cost by kind, price, margin against the
 * minimum, tax, total and deposit; then each option's line items.
 */
export function OptionsComparison({
  revision,
  showLines = true,
  linesOpen = false,
}: {
  revision: RevisionDetail;
  showLines?: boolean;
  /** Open each option's line items at first (otherwise a click on the option's bar opens them). */
  linesOpen?: boolean;
}) {
  const opts = revision.options;
  const kindsUsed = KINDS.filter((k) => opts.some((o) => o.lines.some((l) => l.kind === k)));
  const row = "border-t border-steel-100";
  const th = "whitespace-nowrap py-1.5 pl-3 pr-4 text-left text-xs font-medium text-steel-600";
  const td = "py-1.5 px-3 text-right tabular-nums";
  return (
    <div className="space-y-4">
      <div className="overflow-x-auto rounded-lg border border-steel-200 bg-white shadow-panel">
        <table className="w-full border-collapse text-sm" aria-label="Options compared">
          <thead className="bg-steel-50">
            <tr>
              <th scope="col" className="w-40 py-2 pl-3 text-left text-xs font-semibold uppercase tracking-wide text-steel-600">
                <span className="sr-only">Figure</span>
              </th>
              {opts.map((o, i) => (
                <th key={o.id} scope="col" className="min-w-40 px-3 py-2 text-right align-bottom">
                  <span className="block text-xs font-normal text-steel-500">Option {String.fromCharCode(65 + i)}</span>
                  <span className="block text-sm font-semibold text-steel-900">{o.label}</span>
                  <span className="block text-xs font-normal text-steel-500">{specText(o.spec)}</span>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            <tr className={row}>
              <th scope="row" className={th}>
                Roof
              </th>
              {opts.map((o) => (
                <td key={o.id} className={cn(td, "text-xs text-steel-600")}>
                  <span className="block">
                    {o.takeoffSummary.squares.toFixed(1)} sq · {o.takeoffSummary.panelCount} panels
                  </span>
                  {(o.takeoffSummary.advisories.error > 0 || o.takeoffSummary.advisories.warning > 0) && (
                    <span className="block">
                      {o.takeoffSummary.advisories.error > 0 && (
                        <span className="text-danger-700">
                          {o.takeoffSummary.advisories.error} {o.takeoffSummary.advisories.error === 1 ? "error" : "errors"}
                        </span>
                      )}
                      {o.takeoffSummary.advisories.error > 0 && o.takeoffSummary.advisories.warning > 0 && " · "}
                      {o.takeoffSummary.advisories.warning > 0 && (
                        <span className="text-caution-700">
                          {o.takeoffSummary.advisories.warning} {o.takeoffSummary.advisories.warning === 1 ? "warning" : "warnings"}
                        </span>
                      )}
                    </span>
                  )}
                </td>
              ))}
            </tr>
            {kindsUsed.map((k) => (
              <tr key={k} className={row}>
                <th scope="row" className={cn(th, "font-normal")}>
                  {KIND_LABEL[k]} {k === "discount" ? "(price)" : "cost"}
                </th>
                {opts.map((o) => (
                  <td key={o.id} className={cn(td, "text-steel-700")}>
                    {k === "discount" ? formatCents(sumBy(o.lines, k, "priceCents")) : formatCents(sumBy(o.lines, k, "costCents"))}
                  </td>
                ))}
              </tr>
            ))}
            <tr className="border-t border-steel-200">
              <th scope="row" className={cn(th, "text-steel-800")}>
                Cost
              </th>
              {opts.map((o) => (
                <td key={o.id} className={cn(td, "font-medium")}>
                  {formatCents(o.totals.costCents)}
                </td>
              ))}
            </tr>
            <tr className={row}>
              <th scope="row" className={cn(th, "text-steel-800")}>
                Price before tax
              </th>
              {opts.map((o) => (
                <td key={o.id} className={cn(td, "font-medium")}>
                  {formatCents(o.totals.priceCents)}
                </td>
              ))}
            </tr>
            <tr className={row}>
              <th scope="row" className={cn(th, "text-steel-800")}>
                Margin
              </th>
              {opts.map((o) => (
                <td key={o.id} className={td}>
                  <MarginText marginPct={o.totals.marginPct} minMarginPct={revision.minMarginPct} />
                </td>
              ))}
            </tr>
            <tr className={row}>
              <th scope="row" className={th}>
                Tax
              </th>
              {opts.map((o) => (
                <td key={o.id} className={td}>
                  {formatCents(o.totals.taxCents)}
                </td>
              ))}
            </tr>
            <tr className="border-t border-steel-300 bg-steel-50/70">
              <th scope="row" className={cn(th, "text-sm font-semibold text-steel-900")}>
                Total
              </th>
              {opts.map((o) => (
                <td key={o.id} className={cn(td, "text-base font-semibold text-steel-950")}>
                  {formatCents(o.totals.totalCents)}
                </td>
              ))}
            </tr>
            <tr className={row}>
              <th scope="row" className={th}>
                Deposit
              </th>
              {opts.map((o) => (
                <td key={o.id} className={td}>
                  {formatCents(o.totals.depositCents)}
                </td>
              ))}
            </tr>
            {opts.some((o) => o.hasOverrides || o.missingItems.length > 0 || o.unmatchedOverrides.length > 0) && (
              <tr className={row}>
                <th scope="row" className={th}>
                  Check
                </th>
                {opts.map((o) => (
                  <td key={o.id} className={cn(td, "text-xs")}>
                    <OptionFlags option={o} />
                  </td>
                ))}
              </tr>
            )}
          </tbody>
        </table>
      </div>

      {showLines && <OptionLinesList revision={revision} open={linesOpen} />}
    </div>
  );
}

/** Every option's line items, one under the other, each folded behind its bar unless `open`. */
export function OptionLinesList({ revision, open = false }: { revision: RevisionDetail; open?: boolean }) {
  return (
    <div className="space-y-2">
      <h3 className="text-xs font-semibold uppercase tracking-wide text-steel-600">Line items</h3>
      {revision.options.map((o, i) => (
        <OptionLines key={o.id} option={o} letter={String.fromCharCode(65 + i)} open={open} />
      ))}
    </div>
  );
}

function OptionFlags({ option }: { option: QuoteOptionDto }) {
  const flags: Array<{ text: string; title?: string; tone: string }> = [];
  if (option.hasOverrides) flags.push({ text: "Has overrides", tone: "text-accent-800" });
  if (option.missingItems.length)
    flags.push({
      text: `${option.missingItems.length} not priced`,
      title: option.missingItems.join(", "),
      tone: "text-danger-700",
    });
  if (option.unmatchedOverrides.length)
    flags.push({ text: `${option.unmatchedOverrides.length} override(s) match no line`, tone: "text-caution-700" });
  if (!flags.length) return <span className="text-steel-400">—</span>;
  return (
    <span className="flex flex-col items-end gap-0.5">
      {flags.map((f) => (
        <span key={f.text} className={f.tone} title={f.title}>
          {f.text}
        </span>
      ))}
    </span>
  );
}

/** One option's priced lines, grouped by kind; overridden lines show their reason. */
export function OptionLines({ option, letter, open = false }: { option: QuoteOptionDto; letter: string; open?: boolean }) {
  const groups = KINDS.map((k) => ({ kind: k, lines: option.lines.filter((l) => l.kind === k) })).filter((g) => g.lines.length);
  return (
    <details open={open} className="group rounded-lg border border-steel-200 bg-white shadow-panel">
      <summary className="flex cursor-pointer list-none items-baseline justify-between gap-2 rounded-lg px-3 py-2 hover:bg-steel-50 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500">
        <span className="text-sm font-semibold text-steel-900">
          <span aria-hidden="true" className="mr-1 inline-block text-steel-400 transition-transform group-open:rotate-90">
            ▸
          </span>
          Option {letter} · {option.label}{" "}
          <span className="font-normal text-steel-500">({option.lines.length} lines)</span>
        </span>
        <span className="text-sm tabular-nums text-steel-700">{formatCents(option.totals.totalCents)}</span>
      </summary>
      {option.missingItems.length > 0 && (
        <p className="mx-3 mb-2 rounded border border-danger-200 bg-danger-50 px-2 py-1 text-xs text-danger-700">
          Not priced (no price-book item): {option.missingItems.join(", ")}
        </p>
      )}
      <div className="overflow-x-auto border-t border-steel-100">
        <table className="w-full border-collapse text-[13px]" aria-label={`Lines of option ${letter}`}>
          <thead>
            <tr className="text-xs text-steel-500">
              <th scope="col" className="py-1.5 pl-3 text-left font-medium">
                Item
              </th>
              <th scope="col" className="px-2 py-1.5 text-right font-medium">
                Qty
              </th>
              <th scope="col" className="px-2 py-1.5 text-right font-medium">
                Unit cost
              </th>
              <th scope="col" className="px-2 py-1.5 text-right font-medium">
                Cost
              </th>
              <th scope="col" className="py-1.5 pl-2 pr-3 text-right font-medium">
                Price
              </th>
            </tr>
          </thead>
          {groups.map((g) => (
            <tbody key={g.kind}>
              <tr className="bg-steel-50">
                <th colSpan={5} scope="colgroup" className="py-1 pl-3 text-left text-[11px] font-semibold uppercase tracking-wide text-steel-600">
                  {KIND_LABEL[g.kind]}
                </th>
              </tr>
              {g.lines.map((l) => (
                <tr key={l.id} className={cn("border-t border-steel-100 align-top", l.overrideReason && "bg-accent-50/60")}>
                  <td className="py-1 pl-3">
                    <span className="text-steel-800">{l.description}</span>
                    {l.taxable && <span className="ml-1 text-[11px] text-steel-500">(taxable)</span>}
                    {l.overrideReason && (
                      <span className="mt-0.5 block text-xs text-accent-800">
                        <strong className="font-semibold">Override:</strong> {l.overrideReason}
                      </span>
                    )}
                  </td>
                  <td className="whitespace-nowrap px-2 py-1 text-right tabular-nums text-steel-700">
                    {fmtQty(l.quantity)} <span className="text-steel-500">{l.unit}</span>
                  </td>
                  <td className="whitespace-nowrap px-2 py-1 text-right tabular-nums text-steel-700">{formatCents(l.unitCostCents)}</td>
                  <td className="whitespace-nowrap px-2 py-1 text-right tabular-nums text-steel-700">{formatCents(l.costCents)}</td>
                  <td className="whitespace-nowrap py-1 pl-2 pr-3 text-right tabular-nums text-steel-900">{formatCents(l.priceCents)}</td>
                </tr>
              ))}
            </tbody>
          ))}
        </table>
      </div>
    </details>
  );
}
