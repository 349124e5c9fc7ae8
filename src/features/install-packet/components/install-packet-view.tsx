import type { ReactNode } from "react";
import type { InstallArea, InstallPacketDocDto, InstallPlane, ZoneFastenerRow } from "@shared/schemas/install-packet";
import { formatDate, formatFeetInches, formatInchesAsFeet, formatPitch, formatSquares } from "@shared/schemas/proposal";
import { zoneListText } from "@shared/engine/format";
import { cn } from "@/lib/cn";
import { attachmentThumbUrl } from "@/features/install-packet/api/queries";
import { ZoneDiagram, ZoneLegend } from "@/features/install-packet/components/zone-diagram";
import { ZONE_FILL } from "@/features/install-packet/lib/zones";

/** "17' 2\" (206 in)": the cut length as the crew reads it off the tape and as the brake operator enters it. */
export const cutLength = (inches: number) => `${formatInchesAsFeet(inches)} (${inches} in)`;

function Section({ title, children, className, id }: { title: string; children: ReactNode; className?: string; id?: string }) {
  const headingId = id ? `${id}-title` : undefined;
  return (
    <section aria-labelledby={headingId} className={cn("space-y-2", className)}>
      <h2 id={headingId} className="text-base font-semibold text-accent-800">
        {title}
      </h2>
      {children}
    </section>
  );
}

const cell = "border-b border-steel-100 px-2 py-1 align-top";
const head = "border-b border-steel-300 bg-steel-50 px-2 py-1 text-left text-[11px] font-semibold uppercase tracking-wide text-steel-600";
const num = "text-right tabular-nums";

function FastenerTable({ rows, showSpacing, caption }: { rows: ZoneFastenerRow[]; showSpacing: boolean; caption: string }) {
  return (
    <table className="w-full border-collapse text-[13px]">
      <caption className="sr-only">{caption}</caption>
      <thead>
        <tr>
          <th scope="col" className={head}>Zone</th>
          {showSpacing && <th scope="col" className={cn(head, "text-right")}>Clip spacing</th>}
          <th scope="col" className={cn(head, "text-right")}>Clips</th>
          <th scope="col" className={cn(head, "text-right")}>Screws</th>
          <th scope="col" className={cn(head, "text-right")}>Clip line</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.zone}>
            <th scope="row" className={cn(cell, "whitespace-nowrap text-left font-normal")}>
              <span className="mr-1.5 inline-block size-2.5 border border-steel-400 align-middle" style={{ background: ZONE_FILL[r.zone] }} aria-hidden="true" />
              Zone {r.zone}
            </th>
            {showSpacing && <td className={cn(cell, num)}>{r.spacingIn ? `${Number(r.spacingIn.toFixed(1))} in` : "—"}</td>}
            <td className={cn(cell, num)}>{r.clips}</td>
            <td className={cn(cell, num)}>{r.screws}</td>
            <td className={cn(cell, num)}>{formatFeetInches(r.lineFt)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function PlaneBlock({ plane }: { plane: InstallPlane }) {
  return (
    <article aria-labelledby={`plane-${plane.id}`} className="packet-keep rounded-md border border-steel-200 p-3">
      <h4 id={`plane-${plane.id}`} className="text-sm font-semibold text-steel-900">
        {plane.number}. {plane.name}
      </h4>
      <p className="text-xs text-steel-500">
        {formatPitch(plane.pitch)} · {formatSquares(plane.squares)} sq · {plane.panelCount} panels, {Number(plane.coverageWidthIn.toFixed(2))} in coverage
      </p>
      <div className="mt-2 grid gap-3 sm:grid-cols-[minmax(0,14rem)_minmax(0,1fr)]">
        <figure className="m-0">
          <ZoneDiagram plane={plane} className="h-40 w-full rounded border border-steel-200 bg-white" />
          <figcaption className="mt-1 text-[11px] text-steel-500">a = {formatFeetInches(plane.zoneDiagram.zone2PlanFt)} (plan) · north up</figcaption>
        </figure>
        <div className="min-w-0 space-y-3">
          <table className="w-full border-collapse text-[13px]">
            <caption className="mb-1 text-left text-xs font-semibold text-steel-700">Cut list, plane {plane.number}</caption>
            <thead>
              <tr>
                <th scope="col" className={head}>Panel length</th>
                <th scope="col" className={cn(head, "text-right")}>Count</th>
              </tr>
            </thead>
            <tbody>
              {plane.cutList.map((c) => (
                <tr key={c.lengthIn}>
                  <td className={cn(cell, "tabular-nums")}>{cutLength(c.lengthIn)}</td>
                  <td className={cn(cell, num, "font-semibold")}>{c.count}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <FastenerTable rows={plane.fasteners} showSpacing={plane.system === "standing-seam"} caption={`Fasteners by zone, plane ${plane.number}`} />
          {plane.spacingLimitedByBattens.length > 0 && (
            <p className="text-xs font-semibold text-caution-700">
              Batten spacing sets the clip spacing in {zoneListText(plane.spacingLimitedByBattens)}: check the panel maker's schedule.
            </p>
          )}
        </div>
      </div>
    </article>
  );
}

function AreaBlock({ area, planes, index }: { area: InstallArea; planes: InstallPlane[]; index: number }) {
  return (
    <Section id={`area-${index}`} title={`Layer stack in install order: ${area.title}`} className={cn("packet-area", index > 0 && "packet-break")}>
      <p className="text-xs text-steel-500">
        {formatSquares(area.squares)} squares · {area.planeNames.map((n, i) => `${area.planeNumbers[i]}. ${n}`).join(", ")}
      </p>
      <ol className="space-y-2">
        {area.steps.map((s, i) => (
          <li key={`${s.title}-${i}`} className="packet-keep">
            <p className="font-semibold text-accent-800">
              {i + 1}. {s.title}
            </p>
            <p className="pl-4 text-steel-800">{s.text}</p>
            {s.notes.length > 0 && (
              <ul className="mt-0.5 space-y-0.5 pl-4">
                {s.notes.map((n) => (
                  <li key={n} className="flex gap-1.5 text-[13px] font-medium text-caution-700">
                    <span aria-hidden="true" className="font-bold">!</span>
                    <span>{n}</span>
                  </li>
                ))}
              </ul>
            )}
          </li>
        ))}
      </ol>
      {planes.length > 0 && (
        <div className="space-y-2 pt-1">
          <h3 className="text-sm font-semibold text-steel-800">Planes in this area: cut list and fasteners by wind zone</h3>
          {planes.map((p) => (
            <PlaneBlock key={p.id} plane={p} />
          ))}
        </div>
      )}
    </Section>
  );
}

function MaterialTable({ rows, caption }: { rows: InstallPacketDocDto["trim"]; caption: string }) {
  if (rows.length === 0) return <p className="text-sm text-steel-500">None.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-[13px]">
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr>
            <th scope="col" className={head}>Item</th>
            <th scope="col" className={cn(head, "text-right")}>Qty</th>
            <th scope="col" className={head}>How counted</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((m) => (
            <tr key={m.description}>
              <td className={cell}>{m.description}</td>
              <td className={cn(cell, num, "whitespace-nowrap font-semibold")}>
                {m.quantity} {m.unit}
              </td>
              <td className={cn(cell, "text-xs text-steel-500")}>{m.basis}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** The crew's install packet as a page: the same content, in the same order, as the PDF. */
export function InstallPacketView({ doc }: { doc: InstallPacketDocDto }) {
  const byNumber = new Map(doc.planes.map((p) => [p.number, p]));
  const listed = new Set(doc.areas.flatMap((a) => a.planeNumbers));
  const unlisted = doc.planes.filter((p) => !listed.has(p.number));
  const lowSlope = doc.planes.some((p) => p.zoneDiagram.model === "low-slope");
  return (
    <article className="install-packet space-y-6 text-sm text-steel-900" aria-labelledby="packet-title">
      <header className="space-y-2">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h1 id="packet-title" className="text-xl font-semibold tracking-tight text-accent-800">
            Install packet
          </h1>
          <p className="text-xs text-steel-500">
            {[doc.company.name, doc.company.phone, doc.company.licenceNumber ? `Licence ${doc.company.licenceNumber}` : null].filter(Boolean).join(" · ")}
          </p>
        </div>
        <dl className="grid grid-cols-[6rem_minmax(0,1fr)] gap-x-3 gap-y-1 rounded-md bg-accent-50 px-3 py-2 print:bg-transparent print:px-0">
          {(
            [
              ["Job", `${doc.reference}${doc.optionLabel ? ` · option: ${doc.optionLabel}` : ""}`],
              ["Date", formatDate(doc.date)],
              ["Homeowner", [doc.customerName, doc.customerPhone].filter(Boolean).join(" · ") || "—"],
              ["Site", doc.siteAddressLines.join(", ") || "—"],
              ["Crew", doc.crew.join(", ") || "—"],
            ] as const
          ).map(([k, v]) => (
            <div key={k} className="contents">
              <dt className="text-[11px] font-semibold uppercase tracking-wide text-steel-500">{k}</dt>
              <dd className={cn("min-w-0 break-words", k === "Site" && "font-semibold")}>{v}</dd>
            </div>
          ))}
        </dl>
      </header>

      <Section id="safety" title="Safety first">
        <div className="packet-keep rounded-md border border-caution-200 bg-caution-50 px-3 py-2">
          <ul className="space-y-1.5">
            {doc.cautions.items.map((c) => (
              <li key={c.title}>
                <span className="font-semibold text-caution-700">{c.title}. </span>
                <span className="text-steel-800">{c.text}</span>
              </li>
            ))}
          </ul>
          <p className="mt-2 font-semibold text-steel-900">{doc.cautions.governs}</p>
        </div>
      </Section>

      <Section id="before" title="Before you start">
        <ul className="list-disc space-y-1 pl-5">
          {doc.preparation.map((p) => (
            <li key={p}>{p}</li>
          ))}
        </ul>
        <p className="text-xs text-steel-500">{doc.windNote}</p>
        <ZoneLegend lowSlope={lowSlope} />
      </Section>

      {doc.areas.map((a, i) => (
        <AreaBlock
          key={a.stackId}
          area={a}
          index={i}
          planes={a.planeNumbers.map((n) => byNumber.get(n)).filter((p): p is InstallPlane => Boolean(p))}
        />
      ))}
      {unlisted.length > 0 && (
        <Section id="other-planes" title="Other planes" className="packet-break">
          {unlisted.map((p) => (
            <PlaneBlock key={p.id} plane={p} />
          ))}
        </Section>
      )}

      <Section id="totals" title="Fasteners, whole roof" className="packet-break">
        <div className="max-w-xl">
          <FastenerTable rows={doc.fastenerTotals} showSpacing={false} caption="Fasteners by zone, whole roof" />
        </div>
      </Section>

      <Section id="trim" title="Trim pieces">
        <MaterialTable rows={doc.trim} caption="Trim pieces" />
      </Section>
      <Section id="other" title="Other materials">
        <MaterialTable rows={doc.otherMaterials} caption="Other materials" />
      </Section>

      <Section id="photos" title="Photos for the crew">
        {doc.photoSlots.length === 0 ? (
          <p className="text-sm text-steel-500">No photos flagged for the crew yet.</p>
        ) : (
          <ul className="grid grid-cols-1 gap-3 sm:grid-cols-2 lg:grid-cols-4 print:grid-cols-3">
            {doc.photoSlots.map((s, i) => (
              <li key={s.attachmentId ?? `slot-${i}`} className="packet-keep">
                <figure className="m-0">
                  {s.attachmentId != null ? (
                    <img
                      src={attachmentThumbUrl(s.attachmentId)}
                      alt={s.caption}
                      className="aspect-[4/3] w-full rounded border border-steel-200 bg-steel-50 object-cover"
                    />
                  ) : (
                    <div className="flex aspect-[4/3] items-center justify-center rounded border border-dashed border-steel-300 text-xs text-steel-400">Photo</div>
                  )}
                  <figcaption className="mt-1 text-[13px] text-steel-800">{s.caption}</figcaption>
                </figure>
              </li>
            ))}
          </ul>
        )}
      </Section>

      {doc.advisories.length > 0 && (
        <Section id="checks" title="Checks from the takeoff">
          <ul className="space-y-1">
            {doc.advisories.map((a) => (
              <li key={a.message} className="text-[13px]">
                <span className={cn("font-semibold", a.severity === "error" ? "text-danger-700" : "text-caution-700")}>
                  {a.severity === "error" ? "Must fix" : "Check"}:
                </span>{" "}
                {a.message} <span className="text-steel-500">({a.reference})</span>
              </li>
            ))}
          </ul>
        </Section>
      )}

      <p className="border-t border-steel-200 pt-3 font-semibold">{doc.cautions.governs}</p>
    </article>
  );
}
