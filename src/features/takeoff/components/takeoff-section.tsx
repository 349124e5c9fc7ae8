import type { ReactNode } from "react";
import { Link } from "react-router-dom";
import type { TakeoffResult } from "@shared/engine/types";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { ErrorBoundary } from "@/components/ui/error-boundary";
import { Spinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";
import { useRoof, useStoredTakeoff } from "@/lib/queries/roof";
import { cutListCsv, downloadCsv, takeoffCsv } from "../csv";
import { AdvisoryList, SeverityIcon } from "./advisory-list";
import { CutList } from "./cut-list";
import { MaterialsTable } from "./materials-table";
import { ThermalFigures, VentilationBalance } from "./ventilation-thermal";
import { WindZonesPanel } from "./wind-zones";

type Props = {
  jobId: number;
  /** True when the roof has unsaved changes in this browser (the numbers below are from the last save). */
  unsavedRoof?: boolean;
};

/** The job workspace's Takeoff section: the numbers of the last SAVED roof, as the server stored them. */
export function TakeoffSection({ jobId, unsavedRoof = false }: Props) {
  const takeoff = useStoredTakeoff(jobId);
  const roof = useRoof(jobId);

  if (takeoff.isPending) return <Spinner label="Loading the takeoff" className="size-5 text-steel-500" />;
  if (takeoff.isError) {
    return (
      <Alert tone="error" title="The takeoff could not be loaded">
        <Button size="sm" variant="secondary" className="mt-1" onClick={() => takeoff.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }
  const t = takeoff.data;
  if (!t) {
    return (
      <EmptyState
        title="No saved roof yet"
        description="The takeoff is worked out when the roof is saved. Draw the planes and save them."
        action={
          <Link to={paths.jobSection(jobId, "roof-sketch")} className="text-sm font-medium text-accent-700 underline">
            Open Roof sketch
          </Link>
        }
      />
    );
  }
  const planeNames = new Map(t.planes.map((p) => [p.id, p.name ? `${p.name} (${p.id})` : p.id]));
  const stackNames = new Map((roof.data?.stacks ?? []).map((s) => [s.id, s.name?.trim() || s.id]));
  const counts = { error: 0, warning: 0, info: 0 };
  for (const a of t.advisories) counts[a.severity]++;
  const stamp = new Date().toISOString().slice(0, 10);

  return (
    <div className="space-y-5">
      {unsavedRoof && (
        <Alert tone="caution" title="Showing the last saved roof">
          The roof has unsaved changes in this browser; these numbers are from the last save
          {roof.data?.version ? ` (version ${roof.data.version})` : ""}.{" "}
          <Link className="font-medium underline" to={paths.jobSection(jobId, "roof-sketch")}>
            Save the roof
          </Link>{" "}
          to update them.
        </Alert>
      )}
      <Summary t={t} counts={counts}>
        <Button size="sm" variant="secondary" onClick={() => downloadCsv(`job-${jobId}-takeoff-${stamp}.csv`, takeoffCsv(t))}>
          Export takeoff CSV
        </Button>
        <Button size="sm" variant="secondary" onClick={() => downloadCsv(`job-${jobId}-cut-list-${stamp}.csv`, cutListCsv(t))}>
          Export cut list CSV
        </Button>
      </Summary>

      <Part title="Materials" note="Purchase units, waste included, rounded up once for the job. Open a row's basis to see how the number was reached.">
        <ErrorBoundary what="The materials">
          <MaterialsTable materials={t.materials} />
        </ErrorBoundary>
      </Part>
      <Part title="Panel cut list" note="Ordered lengths per plane, to the inch.">
        <ErrorBoundary what="The cut list">
          <CutList planes={t.planes} />
        </ErrorBoundary>
      </Part>
      <Part title="Fasteners by wind zone">
        <ErrorBoundary what="The wind zones">
          <WindZonesPanel takeoff={t} />
        </ErrorBoundary>
      </Part>
      <Part title="Ventilation">
        <ErrorBoundary what="The ventilation balance">
          <VentilationBalance takeoff={t} />
        </ErrorBoundary>
      </Part>
      <Part title="Thermal">
        <ErrorBoundary what="The thermal figures">
          <ThermalFigures takeoff={t} stackNames={stackNames} />
        </ErrorBoundary>
      </Part>
      <Part title={`Advisories (${t.advisories.length})`} note="Local codes, the panel maker's tested installation details and licensed professionals govern.">
        <AdvisoryList advisories={t.advisories} planeNames={planeNames} />
      </Part>
    </div>
  );
}

function Summary({ t, counts, children }: { t: TakeoffResult; counts: Record<"error" | "warning" | "info", number>; children: ReactNode }) {
  const items: [string, string][] = [
    ["Squares", t.totals.squares.toFixed(2)],
    ["Sloped area", `${Math.round(t.totals.slopedAreaSqFt).toLocaleString("en-US")} ft²`],
    ["Planes", String(t.planes.length)],
    ["Panels", `${t.totals.panelCount} · ${Math.round(t.totals.panelLengthFt).toLocaleString("en-US")} ft`],
    ["Eave / ridge", `${t.edgeTotals.eaveLf.toFixed(0)} / ${t.edgeTotals.ridgeLf.toFixed(0)} LF`],
    ["Rake / hip / valley", `${t.edgeTotals.rakeLf.toFixed(0)} / ${t.edgeTotals.hipLf.toFixed(0)} / ${t.edgeTotals.valleyLf.toFixed(0)} LF`],
  ];
  return (
    <div className="flex flex-wrap items-center gap-x-6 gap-y-2 rounded-lg border border-steel-200 bg-white px-4 py-3 shadow-panel">
      <dl className="flex flex-wrap gap-x-6 gap-y-2">
        {items.map(([k, v]) => (
          <div key={k}>
            <dt className="text-xs text-steel-500">{k}</dt>
            <dd className="text-sm font-semibold tabular-nums text-steel-900">{v}</dd>
          </div>
        ))}
        <div>
          <dt className="text-xs text-steel-500">Advisories</dt>
          <dd className="flex gap-2 text-sm font-semibold">
            <span className="inline-flex items-center gap-0.5 text-danger-700">
              <SeverityIcon severity="error" />
              {counts.error} <span className="sr-only">errors</span>
            </span>
            <span className="inline-flex items-center gap-0.5 text-caution-700">
              <SeverityIcon severity="warning" />
              {counts.warning} <span className="sr-only">warnings</span>
            </span>
            <span className="inline-flex items-center gap-0.5 text-steel-600">
              <SeverityIcon severity="info" />
              {counts.info} <span className="sr-only">notes</span>
            </span>
          </dd>
        </div>
      </dl>
      <div className="ml-auto flex flex-wrap gap-2">{children}</div>
    </div>
  );
}

function Part({ title, note, children }: { title: string; note?: string; children: ReactNode }) {
  return (
    <section aria-label={title} className="space-y-2">
      <div className="flex flex-wrap items-baseline gap-x-3">
        <h3 className="text-base font-semibold text-steel-900">{title}</h3>
        {note && <p className="text-xs text-steel-500">{note}</p>}
      </div>
      {children}
    </section>
  );
}
