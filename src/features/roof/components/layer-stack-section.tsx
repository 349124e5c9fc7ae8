import { useMemo, useState } from "react";
import { Link } from "react-router-dom";
import { rulesSchema, type Rules } from "@shared/schemas/takeoff";
import type { StackResult } from "@shared/engine/types";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Spinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";
import { cn } from "@/lib/cn";
import { roofDraftStore, type DraftStack, type RoofDoc } from "../api/roof-draft";
import { useEngineRules, useJobSite } from "../stack/api";
import { CrossSection } from "../stack/cross-section";
import { advisoriesForStack } from "../stack/layer-advisories";
import { completeStack, inchText, newStackId, planeLabel, planesNaming, planesUsing, stackLabel } from "../stack/model";
import { StackForm } from "../stack/stack-form";
import { useJobRoof } from "../stack/use-job-roof";
import { useTakeoffPreview } from "../stack/use-preview";
import { SaveBar } from "./save-bar";

const DEFAULT_RULES: Rules = rulesSchema.parse({});

/** The job workspace's Layer stack section: named roof assemblies built from the deck up. */
export function LayerStackSection({ jobId }: { jobId: number }) {
  const { roof, draft, stale, clearStale } = useJobRoof(jobId);
  const site = useJobSite(jobId);
  const rulesQuery = useEngineRules();
  const rules = useMemo(() => (rulesQuery.data ? rulesSchema.safeParse(rulesQuery.data).data ?? DEFAULT_RULES : DEFAULT_RULES), [rulesQuery.data]);
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const preview = useTakeoffPreview(draft?.doc, site.data, rulesQuery.data);

  if (roof.isError) {
    return (
      <Alert tone="error" title="The roof could not be loaded">
        <Button size="sm" variant="secondary" className="mt-1" onClick={() => roof.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }
  if (!draft) return <Spinner label="Loading the roof" className="size-5 text-steel-500" />;

  const doc = draft.doc;
  const update = (edit: (d: RoofDoc) => RoofDoc, coalesce = false) => roofDraftStore.update(jobId, edit, { coalesce });

  const addStack = () => {
    const id = newStackId(doc);
    update((d) => ({
      ...d,
      stacks: [...d.stacks, { id, name: d.stacks.length ? `Assembly ${d.stacks.length + 1}` : "Main assembly" }],
      defaultStackId: d.defaultStackId || id,
    }));
    setSelectedId(id);
  };

  if (!doc.stacks.length) {
    return (
      <div className="space-y-3">
        <SaveBar jobId={jobId} />
        <EmptyState
          title="No layer stacks yet"
          description="A stack is the roof assembly from the deck up: deck, underlayment, spacer, radiant barrier, panels and vents. Start one here; planes without a stack use the default."
          action={<Button onClick={addStack}>Add a stack</Button>}
        />
      </div>
    );
  }

  const selected = doc.stacks.find((s) => s.id === selectedId) ?? doc.stacks.find((s) => s.id === doc.defaultStackId) ?? doc.stacks[0]!;
  const result = preview?.ok ? preview.result : null;
  const stackResult = result?.stacks.find((s) => s.id === selected.id) ?? null;
  const using = planesUsing(doc, selected.id);
  const advisories = advisoriesForStack(
    result?.advisories ?? [],
    using.map((p) => p.id),
    { roofWide: selected.id === doc.defaultStackId || doc.stacks.length === 1 },
  );
  const complete = completeStack(selected);

  return (
    <div className="space-y-3">
      <SaveBar jobId={jobId} />
      {stale && (
        <Alert tone="caution" title="Unsaved edits from an earlier version are kept in this browser" onDismiss={clearStale}>
          <p>The roof was saved since ({stale.changedAt ? new Date(stale.changedAt).toLocaleString() : "earlier"}). Restore your edits over the saved roof?</p>
          <Button
            size="sm"
            variant="secondary"
            className="mt-1"
            onClick={() => {
              update(() => stale.doc);
              clearStale();
            }}
          >
            Restore my edits
          </Button>
        </Alert>
      )}
      <div className="grid grid-cols-[minmax(0,1fr)] gap-3 lg:grid-cols-[13rem_minmax(0,1fr)]">
        <StackList
          doc={doc}
          selectedId={selected.id}
          onSelect={setSelectedId}
          onAdd={addStack}
          counts={Object.fromEntries(doc.stacks.map((s) => [s.id, planesUsing(doc, s.id).length]))}
        />
        <div className="min-w-0 space-y-3">
          <StackHeader
            key={selected.id}
            jobId={jobId}
            doc={doc}
            stack={selected}
            onSelect={setSelectedId}
          />
          <div className="grid gap-3 xl:grid-cols-[minmax(0,1fr)_17rem]">
            <section className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel" aria-label="Cross-section">
              {complete ? (
                <ErrorBoundary what="The cross-section">
                  <CrossSection stack={complete} title={stackLabel(selected)} />
                </ErrorBoundary>
              ) : (
                <p className="text-sm text-steel-600">Fix the highlighted fields to see the cross-section.</p>
              )}
            </section>
            <StackFigures
              result={stackResult}
              planes={using.map((p) => planeLabel(p))}
              previewError={preview && !preview.ok ? preview.reason : null}
              jobId={jobId}
            />
          </div>
          <ErrorBoundary what="The layer forms">
            <StackForm key={selected.id} jobId={jobId} stack={selected} rules={rules} advisories={advisories} />
          </ErrorBoundary>
          <p className="text-xs text-steel-500">
            Findings come from a live preview of the takeoff in this browser{rulesQuery.isError ? " (with the standard rules: the price book's could not be read)" : ""}.
            The panel maker's tested installation details, local codes and licensed professionals govern.
          </p>
        </div>
      </div>
    </div>
  );
}

function StackList({
  doc,
  selectedId,
  onSelect,
  onAdd,
  counts,
}: {
  doc: RoofDoc;
  selectedId: string;
  onSelect: (id: string) => void;
  onAdd: () => void;
  counts: Record<string, number>;
}) {
  return (
    <nav aria-label="Layer stacks" className="rounded-lg border border-steel-200 bg-white p-2 shadow-panel lg:self-start">
      <div className="mb-1 flex items-center justify-between px-1">
        <h2 className="text-xs font-semibold uppercase tracking-wide text-steel-600">Stacks</h2>
        <Button size="sm" variant="ghost" onClick={onAdd}>
          + Add
        </Button>
      </div>
      <ul className="flex gap-1 overflow-x-auto lg:flex-col">
        {doc.stacks.map((s) => {
          const active = s.id === selectedId;
          return (
            <li key={s.id} className="shrink-0">
              <button
                type="button"
                onClick={() => onSelect(s.id)}
                aria-current={active ? "true" : undefined}
                className={cn(
                  "w-full rounded-md px-2 py-1.5 text-left text-sm focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500",
                  active ? "bg-accent-50 text-steel-900 ring-1 ring-inset ring-accent-200" : "text-steel-700 hover:bg-steel-50",
                )}
              >
                <span className="block truncate font-medium">{stackLabel(s)}</span>
                <span className="flex items-center gap-1.5 text-xs text-steel-500">
                  {counts[s.id] ?? 0} {counts[s.id] === 1 ? "plane" : "planes"}
                  {s.id === doc.defaultStackId && <Badge tone="accent">default</Badge>}
                </span>
              </button>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}

function StackHeader({ jobId, doc, stack, onSelect }: { jobId: number; doc: RoofDoc; stack: DraftStack; onSelect: (id: string) => void }) {
  const [problem, setProblem] = useState<string | null>(null);
  const isDefault = stack.id === doc.defaultStackId;
  const update = (edit: (d: RoofDoc) => RoofDoc, coalesce = false) => roofDraftStore.update(jobId, edit, { coalesce });

  const duplicate = () => {
    const id = newStackId(doc);
    const copy = { ...structuredClone(stack), id, name: `${stackLabel(stack)} (copy)` };
    update((d) => ({ ...d, stacks: [...d.stacks, copy] }));
    onSelect(id);
  };

  const remove = () => {
    if (doc.stacks.length === 1) return setProblem("The roof needs at least one stack.");
    const naming = planesNaming(doc, stack.id);
    if (naming.length) {
      return setProblem(
        `Still used by ${naming.length === 1 ? "plane" : "planes"} ${naming.map(planeLabel).join(", ")}. Give ${naming.length === 1 ? "it" : "them"} another stack in Roof sketch first.`,
      );
    }
    if (isDefault) {
      const relying = planesUsing(doc, stack.id);
      if (relying.length) {
        return setProblem(
          `This is the default stack for ${relying.map(planeLabel).join(", ")}. Make another stack the default first.`,
        );
      }
    }
    setProblem(null);
    update((d) => {
      const stacks = d.stacks.filter((s) => s.id !== stack.id);
      return { ...d, stacks, defaultStackId: d.defaultStackId === stack.id ? stacks[0]!.id : d.defaultStackId };
    });
    onSelect(doc.stacks.find((s) => s.id !== stack.id)!.id);
  };

  return (
    <div className="rounded-lg border border-steel-200 bg-white px-3 py-2 shadow-panel">
      <div className="flex flex-wrap items-end gap-2">
        <Field label="Stack name" className="w-64 max-w-full">
          <Input
            value={stack.name ?? ""}
            maxLength={120}
            placeholder={stack.id}
            onChange={(e) => {
              const name = e.target.value;
              update((d) => ({ ...d, stacks: d.stacks.map((s) => (s.id === stack.id ? { ...s, name } : s)) }), true);
            }}
          />
        </Field>
        <span className="pb-1.5 text-xs text-steel-500">id {stack.id}</span>
        <div className="ml-auto flex flex-wrap gap-1.5">
          {isDefault ? (
            <Badge tone="accent" className="self-center">
              Default for planes without a stack
            </Badge>
          ) : (
            <Button size="sm" variant="secondary" onClick={() => update((d) => ({ ...d, defaultStackId: stack.id }))}>
              Make default
            </Button>
          )}
          <Button size="sm" variant="secondary" onClick={duplicate}>
            Duplicate
          </Button>
          <Button size="sm" variant="secondary" onClick={remove}>
            Delete
          </Button>
        </div>
      </div>
      {problem && (
        <Alert tone="caution" className="mt-2" onDismiss={() => setProblem(null)} title="This stack cannot be deleted">
          {problem} <Link className="font-medium underline" to={paths.jobSection(jobId, "roof-sketch")}>Open Roof sketch</Link>
        </Alert>
      )}
    </div>
  );
}

function Fact({ label, children, tone }: { label: string; children: React.ReactNode; tone?: "ok" | "bad" }) {
  return (
    <div className="flex items-baseline justify-between gap-2 border-b border-steel-100 py-1 last:border-0">
      <dt className="text-xs text-steel-600">{label}</dt>
      <dd className={cn("text-right text-sm font-medium tabular-nums", tone === "bad" ? "text-danger-700" : "text-steel-900")}>{children}</dd>
    </div>
  );
}

function StackFigures({
  result,
  planes,
  previewError,
  jobId,
}: {
  result: StackResult | null;
  planes: string[];
  previewError: string | null;
  jobId: number;
}) {
  return (
    <section className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel" aria-label="Stack figures">
      <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-steel-600">Preview</h3>
      {previewError && (
        <p className="mb-2 text-xs text-danger-700" role="alert">
          The preview cannot run: {previewError}
        </p>
      )}
      {!result ? (
        <p className="text-sm text-steel-600">
          No plane uses this stack yet.{" "}
          <Link className="text-accent-700 underline" to={paths.jobSection(jobId, "roof-sketch")}>
            Assign it in Roof sketch
          </Link>
          .
        </p>
      ) : (
        <dl>
          <Fact label="Planes">
            <span className="text-xs font-normal">{planes.join(", ")}</span>
          </Fact>
          <Fact label="Area">{result.squares.toFixed(2)} sq</Fact>
          <Fact label="Deck-to-panel gap">{result.channel.gapIn > 0 ? inchText(result.channel.gapIn) : "none"}</Fact>
          <Fact label="Ventilation channel" tone={result.channel.qualifies ? "ok" : undefined}>
            {result.channel.qualifies ? `qualifies, ${result.channel.channelNfaPerFtSqIn.toFixed(1)} in²/ft` : "does not qualify"}
          </Fact>
          <Fact label="Effective emittance">{result.thermal.effectiveEmittance === null ? "—" : result.thermal.effectiveEmittance.toFixed(3)}</Fact>
          <Fact label="Air-space R, summer">
            {result.thermal.airSpaceRSummer === null
              ? result.thermal.ventilated
                ? "not applicable — ventilated"
                : "—"
              : `R-${result.thermal.airSpaceRSummer.toFixed(2)}${result.thermal.rExtrapolated ? "*" : ""}`}
          </Fact>
          <Fact label="Air-space R, winter">
            {result.thermal.airSpaceRWinter === null
              ? result.thermal.ventilated
                ? "not applicable — ventilated"
                : "—"
              : `R-${result.thermal.airSpaceRWinter.toFixed(2)}${result.thermal.rExtrapolated ? "*" : ""}`}
          </Fact>
          <Fact label="Finish SRI">{Math.round(result.thermal.sri)}</Fact>
          <Fact label="Uplift assembly" tone={result.upliftAssembly === "not-tested-needs-review" ? "bad" : undefined}>
            {result.upliftAssembly === "tested" ? "as tested" : result.upliftAssembly === "not-required" ? "no rating asked" : "needs review"}
          </Fact>
        </dl>
      )}
      {result?.thermal.rExtrapolated && <p className="mt-1 text-[11px] text-steel-500">* below the table's 1/2 in: footnote formula (extrapolated).</p>}
    </section>
  );
}
