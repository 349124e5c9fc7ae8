import { Fragment, useDeferredValue, useMemo, useState, type ReactNode } from "react";
import { Link } from "react-router-dom";
import { computeGapStudy, type GapStudyOption, type GapStudyOptionResult } from "@shared/engine/gap-study";
import type { Advisory } from "@shared/engine/advisory";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { Spinner } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { paths } from "@/config/paths";
import { useMe } from "@/lib/auth";
import { cn } from "@/lib/cn";
import { roofDraftStore } from "../api/roof-draft";
import { useAddQuoteOption, useEngineRules, useJobSite, usePriceItems, usePriceMapping } from "../stack/api";
import { AdvisoryNote, SeverityMark } from "../stack/advisory-note";
import { GapChart } from "../stack/gap-chart";
import { applySpacerOption, completeStack, inchText, planeLabel, planesUsing, SPACER_OPTION_LABELS, spacerOptionOf, stackLabel } from "../stack/model";
import { money, spacerCost, type SpacerCost } from "../stack/spacer-cost";
import { useJobRoof } from "../stack/use-job-roof";
import { SaveBar } from "./save-bar";

const UPLIFT_TEXT = { tested: "As tested", "not-tested-needs-review": "Not the tested assembly: needs review", "not-required": "No rating asked" } as const;

/** The job workspace's Gap study section: the five spacer options side by side for the chosen planes. */
export function GapStudySection({ jobId }: { jobId: number }) {
  const { roof, draft } = useJobRoof(jobId);
  const me = useMe();
  const office = me.data?.role === "owner" || me.data?.role === "estimator";
  const site = useJobSite(jobId);
  const rules = useEngineRules(office);
  const items = usePriceItems(office);
  const mapping = usePriceMapping(office);
  const addOption = useAddQuoteOption(jobId);
  const [chosen, setChosen] = useState<string[] | null>(null);

  const doc = useDeferredValue(draft?.doc);
  const defaultPlanes = useMemo(() => (doc ? planesUsing(doc, doc.defaultStackId).map((p) => p.id) : []), [doc]);
  const planeIds = useMemo(() => {
    const known = new Set(doc?.planes.map((p) => p.id) ?? []);
    const ids = (chosen ?? (defaultPlanes.length ? defaultPlanes : doc?.planes.map((p) => p.id) ?? [])).filter((id) => known.has(id));
    return ids;
  }, [chosen, defaultPlanes, doc]);

  const study = useMemo(() => {
    if (!doc || !doc.planes.length || !doc.stacks.length || !planeIds.length) return null;
    return computeGapStudy({
      site: site.data ?? {},
      planes: doc.planes,
      stacks: doc.stacks,
      defaultStackId: doc.defaultStackId,
      ...(rules.data ? { rules: rules.data } : {}),
      planeIds,
    });
  }, [doc, site.data, rules.data, planeIds]);

  if (roof.isError) return <Alert tone="error" title="The roof could not be loaded" />;
  if (!draft || !doc) return <Spinner label="Loading the roof" className="size-5 text-steel-500" />;
  if (!doc.planes.length) {
    return (
      <EmptyState
        title="No roof planes yet"
        description="Draw the roof first; the study compares the spacer options on the planes you pick."
        action={
          <Link className="text-sm font-medium text-accent-700 underline" to={paths.jobSection(jobId, "roof-sketch")}>
            Open Roof sketch
          </Link>
        }
      />
    );
  }

  const chosenSet = new Set(planeIds);
  const usedStacks = [...new Set(doc.planes.filter((p) => chosenSet.has(p.id)).map((p) => p.stackId ?? doc.defaultStackId))];
  const currentOptions = new Set(
    usedStacks.map((id) => doc.stacks.find((s) => s.id === id)).flatMap((s) => {
      const c = s ? completeStack(s) : null;
      return c ? [spacerOptionOf(c)] : [];
    }),
  );
  const current = currentOptions.size === 1 ? [...currentOptions][0]! : null;
  const priced = office && items.data && mapping.data;

  const options = study?.ok ? study.options : [];
  const costs = new Map<GapStudyOption, SpacerCost>(
    priced ? options.map((o) => [o.spacer, spacerCost(o.summary.spacerMaterials, o.result.totals.squares, mapping.data!, items.data!)]) : [],
  );

  const useOption = (opt: GapStudyOption) => {
    roofDraftStore.update(jobId, (d) => ({
      ...d,
      stacks: d.stacks.map((s) => (usedStacks.includes(s.id) ? applySpacerOption(s, opt) : s)),
    }));
    const names = usedStacks.map((id) => stackLabel(doc.stacks.find((s) => s.id === id) ?? { id })).join(", ");
    toast.success(`${SPACER_OPTION_LABELS[opt]} applied to ${names}. Save the roof to keep it.`);
  };

  const addAsQuoteOption = (opt: GapStudyOption) =>
    addOption.mutate(
      { label: SPACER_OPTION_LABELS[opt], spec: { spacer: opt } },
      {
        onSuccess: ({ quote, created }) =>
          toast.success(created ? `Quote ${quote.number} started with "${SPACER_OPTION_LABELS[opt]}" as an option.` : `"${SPACER_OPTION_LABELS[opt]}" added to quote ${quote.number}.`),
        onError: (e) => toast.error(`The option was not added: ${e instanceof Error ? e.message : "try again"}`),
      },
    );

  const toggle = (id: string) => setChosen((prev) => {
    const base = new Set(prev ?? planeIds);
    if (base.has(id)) base.delete(id);
    else base.add(id);
    return doc.planes.map((p) => p.id).filter((x) => base.has(x));
  });

  return (
    <div className="space-y-3">
      <SaveBar jobId={jobId} />
      <div className="grid grid-cols-[minmax(0,1fr)] gap-3 lg:grid-cols-[13rem_minmax(0,1fr)]">
        <fieldset className="min-w-0 rounded-lg border border-steel-200 bg-white p-3 shadow-panel lg:self-start">
          <legend className="sr-only">Planes to study</legend>
          <div className="mb-1 flex items-center justify-between">
            <h2 className="text-xs font-semibold uppercase tracking-wide text-steel-600" aria-hidden="true">
              Planes
            </h2>
            <div className="flex gap-1">
              <Button size="sm" variant="ghost" onClick={() => setChosen(doc.planes.map((p) => p.id))}>
                All
              </Button>
              <Button size="sm" variant="ghost" onClick={() => setChosen(null)}>
                Default
              </Button>
            </div>
          </div>
          <ul className="grid grid-cols-2 gap-x-2 sm:grid-cols-3 lg:grid-cols-1">
            {doc.planes.map((p) => {
              const stack = doc.stacks.find((s) => s.id === (p.stackId ?? doc.defaultStackId));
              return (
                <li key={p.id}>
                  <label className="flex items-start gap-2 rounded px-1 py-1 text-sm hover:bg-steel-50">
                    <input type="checkbox" className="mt-0.5 size-4 accent-accent-700" checked={chosenSet.has(p.id)} onChange={() => toggle(p.id)} />
                    <span className="min-w-0">
                      <span className="block truncate text-steel-900">{planeLabel(p)}</span>
                      <span className="block truncate text-xs text-steel-500">{p.pitch}:12 · {stack ? stackLabel(stack) : "?"}</span>
                    </span>
                  </label>
                </li>
              );
            })}
          </ul>
          <p className="mt-2 text-xs text-steel-500">
            The study gives every stack on the chosen planes ({usedStacks.map((id) => stackLabel(doc.stacks.find((s) => s.id === id) ?? { id })).join(", ") || "none"}) each spacer in turn.
          </p>
        </fieldset>

        <div className="min-w-0 space-y-3">
          {!planeIds.length ? (
            <Alert tone="info">Pick at least one plane.</Alert>
          ) : study && !study.ok ? (
            <Alert tone="error" title="The study cannot run">
              {study.reason}
            </Alert>
          ) : (
            <ErrorBoundary what="The gap study">
              <StudyTable
                options={options}
                current={current}
                costs={priced ? costs : null}
                costState={!office ? "hidden" : items.isError || mapping.isError ? "error" : !priced ? "loading" : "ok"}
                onUse={useOption}
                onAdd={addAsQuoteOption}
                adding={addOption.isPending ? (addOption.variables?.spec.spacer ?? null) : null}
              />
              <section className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel" aria-label="Cost and R chart">
                <GapChart
                  showCost={office}
                  rows={options.map((o) => ({
                    label: SPACER_OPTION_LABELS[o.spacer],
                    costPerSquareCents: costs.get(o.spacer)?.perSquareCents ?? null,
                    rSummer: o.summary.airSpaceRSummer,
                    rWinter: o.summary.airSpaceRWinter,
                    ventilated: o.result.stacks.some((s) => s.thermal.ventilated),
                    current: o.spacer === current,
                  }))}
                />
              </section>
            </ErrorBoundary>
          )}
          <p className="text-xs text-steel-500">
            Computed in this browser with the engine the server uses. Air-space R is the ASHRAE Handbook—Fundamentals (2021, ch. 26) enclosed air-space value; a
            gap open at the eave and the top is a ventilated channel, which has none. The panel maker's tested details, local codes and licensed professionals govern.
          </p>
        </div>
      </div>
    </div>
  );
}

function counts(list: Advisory[]) {
  return {
    error: list.filter((a) => a.severity === "error").length,
    warning: list.filter((a) => a.severity === "warning").length,
    info: list.filter((a) => a.severity === "info").length,
  };
}

function Row({ label, children, hint }: { label: string; children: ReactNode; hint?: string }) {
  return (
    <tr className="border-t border-steel-100 align-top">
      <th scope="row" className="w-36 bg-steel-50/60 px-3 py-1.5 text-left text-xs font-medium text-steel-700">
        {label}
        {hint && <span className="block font-normal text-steel-500">{hint}</span>}
      </th>
      {children}
    </tr>
  );
}

function StudyTable({
  options,
  current,
  costs,
  costState,
  onUse,
  onAdd,
  adding,
}: {
  options: GapStudyOptionResult[];
  current: GapStudyOption | null;
  costs: Map<GapStudyOption, SpacerCost> | null;
  costState: "hidden" | "error" | "loading" | "ok";
  onUse: (o: GapStudyOption) => void;
  onAdd: (o: GapStudyOption) => void;
  adding: string | null;
}) {
  const cell = (o: GapStudyOptionResult, content: ReactNode, className?: string) => (
    <td key={o.spacer} className={cn("px-3 py-1.5 text-sm text-steel-800", o.spacer === current && "bg-accent-50/60", className)}>
      {content}
    </td>
  );
  return (
    <div className="relative overflow-x-auto rounded-lg border border-steel-200 bg-white shadow-panel">
      <table className="w-full min-w-[760px] border-collapse text-left" aria-label="Spacer options side by side">
        <thead>
          <tr className="bg-steel-50">
            <th scope="col" className="w-40 px-3 py-2 text-xs font-semibold uppercase tracking-wide text-steel-600">
              Option
            </th>
            {options.map((o) => (
              <th key={o.spacer} scope="col" className={cn("px-3 py-2 text-sm font-semibold text-steel-900", o.spacer === current && "bg-accent-50")}>
                {SPACER_OPTION_LABELS[o.spacer]}
                {o.spacer === current && <span className="ml-1 text-xs font-normal text-accent-800">(now)</span>}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="tabular-nums">
          <Row label="Gap, deck to panel">{options.map((o) => cell(o, o.summary.gapIn > 0 ? inchText(o.summary.gapIn) : "none"))}</Row>
          <Row label="Channel" hint="≥ 3/4 in, continuous, open at both ends">
            {options.map((o) =>
              cell(
                o,
                o.summary.qualifies ? (
                  <span className="font-medium text-ok-700">✓ Qualifies · {o.summary.channelNfaPerFtSqIn.toFixed(1)} in²/ft</span>
                ) : (
                  <span className="text-steel-600">
                    ✗ Does not qualify
                    {o.summary.continuous ? ` (${inchText(o.summary.channelHeightIn)} high)` : o.spacer === "none" ? "" : " (closed by battens)"}
                  </span>
                ),
              ),
            )}
          </Row>
          <Row label="Effective emittance">{options.map((o) => cell(o, o.summary.effectiveEmittance === null ? "—" : o.summary.effectiveEmittance.toFixed(3)))}</Row>
          <Row label="Air-space R, summer">{options.map((o) => cell(o, rText(o.summary.airSpaceRSummer, o)))}</Row>
          <Row label="Air-space R, winter">{options.map((o) => cell(o, rText(o.summary.airSpaceRWinter, o)))}</Row>
          <Row label="Tested uplift assembly">
            {options.map((o) =>
              cell(o, <span className={o.summary.upliftAssembly === "not-tested-needs-review" ? "font-medium text-danger-700" : undefined}>{UPLIFT_TEXT[o.summary.upliftAssembly]}</span>),
            )}
          </Row>
          <Row label="Spacer materials">
            {options.map((o) =>
              cell(
                o,
                o.summary.spacerMaterials.length ? (
                  <ul className="space-y-0.5 text-xs">
                    {o.summary.spacerMaterials.map((m) => (
                      <li key={m.key} title={m.basis}>
                        <span className="font-medium">{m.quantity}</span> {m.unit} · {m.description}
                      </li>
                    ))}
                  </ul>
                ) : (
                  <span className="text-xs text-steel-500">none</span>
                ),
              ),
            )}
          </Row>
          {costState !== "hidden" && (
            <Row label="Spacer cost per square" hint="price book, materials only">
              {options.map((o) => {
                const c = costs?.get(o.spacer);
                return cell(
                  o,
                  costState === "error" ? (
                    <span className="text-xs text-danger-700">price book unavailable</span>
                  ) : !c ? (
                    <Spinner />
                  ) : (
                    <span>
                      <span className="font-semibold">{c.perSquareCents === null ? "—" : money(c.perSquareCents)}</span>
                      <span className="block text-xs text-steel-500">{money(c.cents)} total</span>
                      {c.missing.length > 0 && <span className="block text-xs text-caution-700">no price: {c.missing.join(", ")}</span>}
                    </span>
                  ),
                );
              })}
            </Row>
          )}
          <Row label="Advisories">
            {options.map((o) => {
              const n = counts(o.summary.advisories);
              return cell(
                o,
                <details>
                  <summary className="cursor-pointer whitespace-nowrap text-xs">
                    <span className="inline-flex gap-x-2">
                      {n.error > 0 && <SeverityMark severity="error" className="text-danger-700" />}
                      {n.error > 0 && <span>{n.error}</span>}
                      {n.warning > 0 && <SeverityMark severity="warning" className="text-caution-700" />}
                      {n.warning > 0 && <span>{n.warning}</span>}
                      <span className="text-steel-500">{o.summary.advisories.length} in all</span>
                    </span>
                  </summary>
                  <ul className="mt-1 space-y-1">
                    {o.summary.advisories.map((a, i) => (
                      <Fragment key={a.code + i}>
                        <AdvisoryNote advisory={a} compact />
                      </Fragment>
                    ))}
                  </ul>
                </details>,
              );
            })}
          </Row>
          <Row label="">
            {options.map((o) =>
              cell(
                o,
                <div className="flex flex-col items-start gap-1">
                  <Button size="sm" variant={o.spacer === current ? "ghost" : "secondary"} disabled={o.spacer === current} onClick={() => onUse(o.spacer)}>
                    Use this option<span className="sr-only">: {SPACER_OPTION_LABELS[o.spacer]}</span>
                  </Button>
                  {costState !== "hidden" && (
                    <Button size="sm" variant="ghost" loading={adding === o.spacer} onClick={() => onAdd(o.spacer)}>
                      Add as quote option<span className="sr-only">: {SPACER_OPTION_LABELS[o.spacer]}</span>
                    </Button>
                  )}
                </div>,
              ),
            )}
          </Row>
        </tbody>
      </table>
    </div>
  );
}

function rText(r: number | null, o: GapStudyOptionResult) {
  if (r !== null) return `R-${r.toFixed(2)}`;
  if (o.summary.gapIn > 0 && o.result.stacks.some((s) => s.thermal.ventilated)) return <span className="text-xs text-steel-600">not applicable — ventilated</span>;
  return <span className="text-xs text-steel-500">no air space</span>;
}
