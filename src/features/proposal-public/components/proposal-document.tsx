import { Fragment, type ReactNode } from "react";
import {
  formatDate,
  formatMoney,
  formatPercent,
  formatPitch,
  formatSquares,
  type ProposalCompany,
  type ProposalDocDto,
} from "@shared/schemas/proposal";
import { cn } from "@/lib/cn";
import { RoofPlan } from "@/features/proposal-public/components/roof-plan";

export function companyInitials(name: string): string {
  const words = name.trim().split(/\s+/).filter((w) => /\p{L}/u.test(w));
  return ((words[0]?.[0] ?? "") + (words[1]?.[0] ?? "")).toUpperCase() || "·";
}

function CompanyMark({ company }: { company: ProposalCompany }) {
  if (company.logoDataUrl && /^data:image\/(png|jpeg);/.test(company.logoDataUrl)) {
    return <img src={company.logoDataUrl} alt="" className="size-12 shrink-0 rounded-md object-contain" />;
  }
  return (
    <span aria-hidden="true" className="flex size-12 shrink-0 items-center justify-center rounded-md bg-accent-700 text-lg font-bold tracking-tight text-white">
      {companyInitials(company.name)}
    </span>
  );
}

export function Section({ title, children, className, id }: { title: string; children: ReactNode; className?: string; id?: string }) {
  return (
    <section aria-labelledby={id} className={cn("break-inside-avoid-page", className)}>
      <h2 id={id} className="mb-3 text-lg font-semibold tracking-tight text-accent-800">
        {title}
      </h2>
      {children}
    </section>
  );
}

function Bullets({ items }: { items: string[] }) {
  return (
    <ul className="space-y-1.5">
      {items.map((t, i) => (
        <li key={i} className="flex gap-2.5 leading-relaxed">
          <span aria-hidden="true" className="mt-[0.6em] size-1.5 shrink-0 rounded-full bg-accent-500" />
          <span>{t}</span>
        </li>
      ))}
    </ul>
  );
}

/** The company header and the proposal's number and dates. */
export function ProposalHeader({ doc }: { doc: ProposalDocDto }) {
  const c = doc.company;
  const contact = [c.phone, c.email].filter(Boolean) as string[];
  return (
    <header className="flex flex-col gap-4 sm:flex-row sm:items-start sm:justify-between">
      <div className="flex min-w-0 gap-3">
        <CompanyMark company={c} />
        <div className="min-w-0 text-sm text-steel-600">
          <p className="break-words text-xl font-bold leading-tight tracking-tight text-steel-950">{c.name}</p>
          {c.legalName && c.legalName !== c.name && <p>{c.legalName}</p>}
          {c.addressLines.length > 0 && <p>{c.addressLines.join(", ")}</p>}
          {contact.length > 0 && (
            <p className="flex flex-wrap gap-x-3">
              {c.phone && (
                <a className="underline-offset-2 hover:underline" href={`tel:${c.phone.replace(/[^\d+]/g, "")}`}>
                  {c.phone}
                </a>
              )}
              {c.email && (
                <a className="underline-offset-2 hover:underline" href={`mailto:${c.email}`}>
                  {c.email}
                </a>
              )}
            </p>
          )}
          {c.website && <p className="break-all">{c.website}</p>}
          {c.licenceNumber && <p className="font-semibold text-steel-700">Licence {c.licenceNumber}</p>}
        </div>
      </div>
      <dl className="grid shrink-0 grid-cols-3 gap-3 rounded-lg bg-accent-50 px-4 py-3 text-sm sm:w-56 sm:grid-cols-1 sm:gap-2">
        <div>
          <dt className="text-[11px] font-semibold uppercase tracking-wide text-steel-500">Proposal</dt>
          <dd className="font-semibold text-steel-950">
            {doc.proposalNumber}
            {doc.revisionNo > 1 && <span className="font-normal text-steel-600"> · rev. {doc.revisionNo}</span>}
          </dd>
        </div>
        <div>
          <dt className="text-[11px] font-semibold uppercase tracking-wide text-steel-500">Date</dt>
          <dd className="font-semibold text-steel-950">{formatDate(doc.date)}</dd>
        </div>
        <div>
          <dt className="text-[11px] font-semibold uppercase tracking-wide text-steel-500">Valid until</dt>
          <dd className="font-semibold text-steel-950">{formatDate(doc.validUntil)}</dd>
        </div>
      </dl>
    </header>
  );
}

function Parties({ doc }: { doc: ProposalDocDto }) {
  const h = doc.homeowner;
  const box = "rounded-lg border border-steel-200 px-4 py-3";
  const label = "mb-1 text-[11px] font-semibold uppercase tracking-wide text-steel-500";
  return (
    <div className="grid gap-3 sm:grid-cols-2">
      <div className={box}>
        <p className={label}>Prepared for</p>
        <p className="break-words text-base font-semibold text-steel-950">{h.name}</p>
        {h.addressLines.map((l, i) => (
          <p key={i}>{l}</p>
        ))}
        {[h.phone, h.email].filter(Boolean).map((l, i) => (
          <p key={i} className="text-sm text-steel-600">
            {l}
          </p>
        ))}
      </div>
      <div className={box}>
        <p className={label}>Project site</p>
        {doc.siteAddressLines.length ? (
          doc.siteAddressLines.map((l, i) => (
            <p key={i} className={i === 0 ? "text-base font-semibold text-steel-950" : undefined}>
              {l}
            </p>
          ))
        ) : (
          <p>Same as the homeowner's address</p>
        )}
      </div>
    </div>
  );
}

function Scope({ doc }: { doc: ProposalDocDto }) {
  return (
    <Section title="Scope of work" id="scope">
      <p className="mb-3 text-sm text-steel-600">
        About {formatSquares(doc.scope.totalSquares)} squares of roof (one square is 100 square feet of roof surface).
      </p>
      {doc.scope.preparation.length > 0 && <Bullets items={doc.scope.preparation} />}
      <div className="mt-5 space-y-6">
        {doc.scope.areas.map((area) => (
          <div key={area.stackId} className="break-inside-avoid-page">
            <h3 className="text-base font-semibold text-steel-950">
              {area.title} <span className="font-normal text-steel-500">· {formatSquares(area.squares)} squares</span>
            </h3>
            <p className="mt-0.5 text-sm text-steel-600">
              Planes:{" "}
              {area.planes.map((p, i) => (
                <Fragment key={p.id}>
                  {i > 0 && ", "}
                  <span className="whitespace-nowrap">
                    {p.number}. {p.name}
                  </span>{" "}
                  <span className="whitespace-nowrap">
                    ({formatPitch(p.pitch)}, {formatSquares(p.squares)} sq)
                  </span>
                </Fragment>
              ))}
            </p>
            <p className="mt-3 text-xs font-semibold uppercase tracking-wide text-accent-700">From the deck up</p>
            <ol className="mt-2 divide-y divide-steel-100 border-y border-steel-100">
              {area.layers.map((layer, i) => (
                <li key={i} className="grid gap-1 py-2.5 sm:grid-cols-[11rem_1fr] sm:gap-4">
                  <p className="flex gap-2 font-semibold text-steel-900">
                    <span className="w-4 shrink-0 text-accent-600 tabular-nums">{i + 1}</span>
                    {layer.title}
                  </p>
                  <p className="pl-6 leading-relaxed text-steel-800 sm:pl-0">{layer.sentences.join(" ")}</p>
                </li>
              ))}
            </ol>
          </div>
        ))}
      </div>
    </Section>
  );
}

function Options({ doc, chosenId }: { doc: ProposalDocDto; chosenId: string | null }) {
  const many = doc.options.length > 1;
  return (
    <Section title="Your options and prices" id="options">
      {many && (
        <p className="mb-3 text-sm text-steel-600">
          Each option is the complete roof described above, with the differences listed. Choose one when you accept.
        </p>
      )}
      <ol className="grid gap-3 lg:grid-cols-2">
        {doc.options.map((o, i) => {
          const chosen = o.id === chosenId;
          return (
            <li
              key={o.id}
              className={cn(
                "flex flex-col rounded-lg border px-4 py-3 break-inside-avoid",
                chosen ? "border-ok-600 bg-ok-50 ring-1 ring-ok-600" : "border-steel-200 bg-white",
              )}
            >
              <h3 className="text-base font-semibold text-steel-950">
                {many && <span className="text-accent-700">{i + 1}. </span>}
                {o.label}
                {chosen && (
                  <span className="ml-2 inline-flex items-center gap-1 rounded bg-ok-600 px-1.5 py-0.5 align-middle text-xs font-semibold text-white">
                    <svg viewBox="0 0 16 16" className="size-3" fill="none" stroke="currentColor" strokeWidth="2.2" aria-hidden="true">
                      <path d="m3.5 8.5 3 3 6-7" strokeLinecap="round" strokeLinejoin="round" />
                    </svg>
                    Chosen
                  </span>
                )}
              </h3>
              {o.differences.length > 0 && (
                <ul className="mt-1.5 space-y-1 text-sm text-steel-700">
                  {o.differences.map((d, k) => (
                    <li key={k} className="flex gap-2">
                      <span aria-hidden="true" className="text-steel-400">
                        –
                      </span>
                      <span>{d}</span>
                    </li>
                  ))}
                </ul>
              )}
              <dl className="mt-auto grid grid-cols-2 gap-x-3 gap-y-1 border-t border-steel-100 pt-2.5 text-sm tabular-nums sm:grid-cols-4 [&>div]:mt-2.5">
                <div>
                  <dt className="text-xs text-steel-500">Price</dt>
                  <dd>{formatMoney(o.priceCents)}</dd>
                </div>
                <div>
                  <dt className="text-xs text-steel-500">Tax</dt>
                  <dd className="text-steel-600">{formatMoney(o.taxCents)}</dd>
                </div>
                <div>
                  <dt className="text-xs text-steel-500">Total</dt>
                  <dd className="font-bold text-steel-950">{formatMoney(o.totalCents)}</dd>
                </div>
                <div>
                  <dt className="whitespace-nowrap text-xs text-steel-500">Deposit ({formatPercent(doc.depositPct)})</dt>
                  <dd className="font-semibold text-accent-700">{formatMoney(o.depositCents)}</dd>
                </div>
              </dl>
            </li>
          );
        })}
      </ol>
      <p className="mt-3 text-sm text-steel-600">
        Prices include all labour, materials, disposal and cleanup described in the scope of work. Tax is figured as the law of
        your area requires.
      </p>
    </Section>
  );
}

function Terms({ doc }: { doc: ProposalDocDto }) {
  const deposits = doc.options.map((o) => o.depositCents);
  const first = doc.options[0]!;
  return (
    <>
      <Section title="Deposit and payment" id="payment">
        <p className="mb-2 font-semibold text-steel-900">
          {doc.options.length === 1
            ? `Deposit due on acceptance: ${formatMoney(first.depositCents)} (${formatPercent(doc.depositPct)} of ${formatMoney(first.totalCents)}).`
            : `Deposit due on acceptance: ${formatPercent(doc.depositPct)} of the option you choose (from ${formatMoney(Math.min(...deposits))} to ${formatMoney(Math.max(...deposits))}, as listed above).`}
        </p>
        <Bullets items={doc.paymentTerms} />
        <p className="mt-3 font-semibold text-accent-800">This proposal is valid until {formatDate(doc.validUntil)}.</p>
      </Section>
      <div className="grid gap-8 md:grid-cols-2">
        <Section title="Not included" id="exclusions">
          <Bullets items={doc.exclusions} />
        </Section>
        <Section title="Warranty" id="warranty">
          <Bullets items={doc.warranty} />
        </Section>
      </div>
    </>
  );
}

/** The safety and code cautions, set off in their own box. */
function Cautions({ cautions }: { cautions: ProposalDocDto["cautions"] }) {
  return (
    <aside
      aria-labelledby="cautions"
      className="break-inside-avoid rounded-lg border border-caution-200 border-l-[6px] border-l-caution-700 bg-caution-50 px-4 py-4 sm:px-5"
    >
      <h2 id="cautions" className="flex items-center gap-2 text-lg font-semibold text-caution-700">
        <svg viewBox="0 0 20 20" className="size-5 shrink-0" fill="currentColor" aria-hidden="true">
          <path d="M10 2.5 1.5 17h17L10 2.5Zm-.9 5h1.8v4.8H9.1V7.5Zm0 6.2h1.8v1.8H9.1v-1.8Z" />
        </svg>
        Safety and codes
      </h2>
      <dl className="mt-3 space-y-3">
        {cautions.items.map((c, i) => (
          <div key={i}>
            <dt className="font-semibold text-steel-950">{c.title}</dt>
            <dd className="leading-relaxed text-steel-800">{c.text}</dd>
          </div>
        ))}
      </dl>
      <p className="mt-4 border-t border-caution-200 pt-3 font-semibold text-steel-900">{cautions.governs}</p>
    </aside>
  );
}

/** The whole proposal as the PDF shows it, from the company header to the cautions. */
export function ProposalDocument({ doc, chosenId }: { doc: ProposalDocDto; chosenId: string | null }) {
  return (
    <article className="space-y-8 text-[15px] leading-relaxed text-steel-800 print:space-y-6 print:text-[11pt]">
      <ProposalHeader doc={doc} />
      <div className="border-t-[3px] border-accent-700 pt-5">
        <h1 className="text-2xl font-bold tracking-tight text-accent-800 sm:text-3xl">
          {doc.status === "draft" || doc.status === "in_review" ? "Metal roof proposal (draft)" : "Metal roof proposal"}
        </h1>
      </div>
      <Parties doc={doc} />
      <p className="leading-relaxed">{doc.introduction}</p>
      <Scope doc={doc} />
      {doc.plan.planes.length > 0 && (
        <Section title="Roof plan" id="plan">
          <p className="mb-3 text-sm text-steel-600">
            Plan view (looking down), north up. Numbers match the planes in the scope of work; the copper line marks each
            eave, and the small arrow points down the slope.
          </p>
          <RoofPlan planes={doc.plan.planes} />
        </Section>
      )}
      <Options doc={doc} chosenId={chosenId} />
      <Terms doc={doc} />
      <Cautions cautions={doc.cautions} />
    </article>
  );
}
