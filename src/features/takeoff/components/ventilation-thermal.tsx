import type { TakeoffResult } from "@shared/engine/types";
import { cn } from "@/lib/cn";

const sqin = (x: number) => `${Math.round(x).toLocaleString("en-US")} in²`;

function Bar({ label, required, provided, max }: { label: string; required: number; provided: number; max: number }) {
  const W = 100;
  const short = provided < required - 0.5;
  return (
    <div className="grid grid-cols-[5rem_minmax(0,1fr)_9rem] items-center gap-2 text-sm">
      <span className="text-steel-700">{label}</span>
      <svg viewBox={`0 0 ${W} 18`} preserveAspectRatio="none" className="h-5 w-full" aria-hidden="true">
        <rect width={W} height={18} className="fill-steel-50" />
        <rect width={(Math.min(provided, max) / max) * W} y={3} height={12} className={short ? "fill-caution-200" : "fill-steel-600"} />
        <line x1={(required / max) * W} x2={(required / max) * W} y1={0} y2={18} className="stroke-accent-700" strokeWidth={1.5} vectorEffect="non-scaling-stroke" />
      </svg>
      <span className={cn("text-right text-xs tabular-nums", short ? "font-semibold text-caution-700" : "text-steel-700")}>
        {sqin(provided)} / {sqin(required)} {short ? "short" : "✓"}
      </span>
    </div>
  );
}

/** Attic ventilation balance (required vs provided, intake vs exhaust) and the above-deck channel facts. */
export function VentilationBalance({ takeoff }: { takeoff: TakeoffResult }) {
  const v = takeoff.ventilation;
  const max = Math.max(v.intakeRequiredSqIn, v.exhaustRequiredSqIn, v.intakeProvidedSqIn, v.exhaustProvidedSqIn, 1) * 1.05;
  const ad = v.aboveDeck;
  return (
    <div className="grid gap-3 lg:grid-cols-2">
      <section className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel" aria-label="Attic ventilation">
        <h4 className="mb-1 text-sm font-semibold text-steel-900">Under the deck</h4>
        {v.mode === "unvented" ? (
          <p className="text-sm text-steel-700">Unvented attic (IRC R806.5): no vent area is required; the unvented-attic rules apply instead.</p>
        ) : (
          <>
            <p className="mb-2 text-xs text-steel-600">
              {v.mode === "cathedral" ? "Vaulted ceiling" : "Vented attic"}: {v.ventedAreaSqFt.toFixed(0)} ft²
              {v.ventedAreaEstimated ? " (estimated from the roof's plan area)" : ""} ÷ {v.ratio} = {sqin(v.requiredNfaSqIn)} net free area, half at the intake and half at
              the exhaust (IRC {v.codeEdition} R806.2).
            </p>
            <div className="space-y-1.5" role="group" aria-label="Required vs provided">
              <Bar label="Intake" required={v.intakeRequiredSqIn} provided={v.intakeProvidedSqIn} max={max} />
              <Bar label="Exhaust" required={v.exhaustRequiredSqIn} provided={v.exhaustProvidedSqIn} max={max} />
            </div>
            <p className="mt-2 text-xs text-steel-500">
              Bars: provided; copper line: required. Intake {v.intakeLf.toFixed(0)} LF of eave, exhaust {v.exhaustLf.toFixed(0)} LF of ridge vent.{" "}
              {v.balanced ? "Intake is at least the exhaust (balanced)." : "Intake is less than the exhaust: not balanced."}
            </p>
          </>
        )}
      </section>
      <section className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel" aria-label="Above-deck channel">
        <h4 className="mb-1 text-sm font-semibold text-steel-900">Above the deck</h4>
        <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-4">
          <Fact label="Gap">{ad.gapIn > 0 ? `${ad.gapIn.toFixed(2)} in` : "none"}</Fact>
          <Fact label="Channel height">{ad.channelHeightIn.toFixed(2)} in</Fact>
          <Fact label="Continuous">{ad.continuous ? "yes" : "no"}</Fact>
          <Fact label="Qualifies">{ad.qualifies ? `yes, ${ad.channelNfaPerFtSqIn.toFixed(1)} in²/ft` : "no"}</Fact>
        </dl>
        {ad.reasons.length > 0 && (
          <ul className="mt-2 list-disc space-y-0.5 pl-5 text-xs text-steel-600">
            {ad.reasons.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        )}
        <p className="mt-2 text-xs text-steel-500">
          A channel needs at least 3/4 in, unbroken and open at the eave and the top (California Title 24 2008 re-roof alternative; ORNL). It never counts toward
          the attic's vent area.
        </p>
      </section>
    </div>
  );
}

function Fact({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div>
      <dt className="text-xs text-steel-500">{label}</dt>
      <dd className="font-medium tabular-nums text-steel-900">{children}</dd>
    </div>
  );
}

const rText = (r: number | null, ventilated: boolean, gap: number) =>
  r !== null ? `R-${r.toFixed(2)}` : ventilated ? "not applicable — ventilated" : gap > 0 ? "—" : "no air space";

/** Thermal figures per stack: gap, effective emittance, air-space R, SRI, cool roof and dew point. */
export function ThermalFigures({ takeoff, stackNames }: { takeoff: TakeoffResult; stackNames: Map<string, string> }) {
  const dp = takeoff.thermal.dewPoint;
  return (
    <div className="space-y-2">
      <div className="overflow-x-auto rounded-lg border border-steel-200 bg-white shadow-panel">
        <table className="w-full text-left text-sm" aria-label="Thermal figures">
          <thead className="border-b border-steel-200 bg-steel-50 text-xs uppercase tracking-wide text-steel-600">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">Stack</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Gap</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Eff. emittance</th>
              <th scope="col" className="px-3 py-2 font-semibold">R summer</th>
              <th scope="col" className="px-3 py-2 font-semibold">R winter</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">SRI</th>
              <th scope="col" className="px-3 py-2 font-semibold">Cool roof</th>
            </tr>
          </thead>
          <tbody className="divide-y divide-steel-100 tabular-nums">
            {takeoff.stacks.map((s) => {
              const t = s.thermal;
              return (
                <tr key={s.id}>
                  <th scope="row" className="px-3 py-1.5 font-medium text-steel-900">
                    {stackNames.get(s.id) ?? s.name ?? s.id}
                    <span className="block text-xs font-normal text-steel-500">{s.squares.toFixed(2)} sq</span>
                  </th>
                  <td className="px-3 py-1.5 text-right">{t.gapIn > 0 ? `${t.gapIn.toFixed(2)} in` : "none"}</td>
                  <td className="px-3 py-1.5 text-right">{t.effectiveEmittance === null ? "—" : t.effectiveEmittance.toFixed(3)}</td>
                  <td className="px-3 py-1.5">{rText(t.airSpaceRSummer, t.ventilated, t.gapIn)}</td>
                  <td className="px-3 py-1.5">{rText(t.airSpaceRWinter, t.ventilated, t.gapIn)}</td>
                  <td className="px-3 py-1.5 text-right">{Math.round(t.sri)}</td>
                  <td className="px-3 py-1.5">{t.coolRoof === null ? "not asked" : t.coolRoof.meets ? "meets" : "falls short"}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-steel-500">{takeoff.thermal.rNote}</p>
      <p className="text-sm text-steel-700">
        <span className="font-medium">Dew point check: </span>
        {dp === null
          ? "not a humid climate zone (or no zone given): no condensation caution."
          : `${dp.note} ${dp.condensationPossible ? "Condensation under the panels is possible: give it a drainage path and a drying gap." : "The panel stays above the dew point."}`}
      </p>
    </div>
  );
}
