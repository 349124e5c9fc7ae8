import { useId, useState, type FormEvent } from "react";
import { formatDateTimeUtc, formatMoney, type ProposalDocDto } from "@shared/schemas/proposal";
import { ApiError, errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Textarea } from "@/components/ui/textarea";
import type { PublicOption, PublicProposal } from "@/features/proposal-public/api/public-api";
import { useAcceptProposal, useDeclineProposal } from "@/features/proposal-public/api/queries";

const CheckIcon = ({ className }: { className?: string }) => (
  <svg viewBox="0 0 16 16" className={className} fill="none" stroke="currentColor" strokeWidth="2" aria-hidden="true">
    <path d="m3.5 8.5 3 3 6-7" strokeLinecap="round" strokeLinejoin="round" />
  </svg>
);

/** The options the homeowner can choose from (the API's list; the document's when it sent none). */
export function choosableOptions(p: PublicProposal): PublicOption[] {
  if (p.options?.length) return p.options;
  return p.doc.options.map(({ id, label, totalCents, depositCents, priceCents, taxCents }) => ({
    id: Number(id),
    label,
    totalCents,
    depositCents,
    priceCents,
    taxCents,
  }));
}

function refusal(err: unknown): string {
  if (err instanceof ApiError) {
    if (err.status === 404) return "This link is no longer valid. Please contact your contractor.";
    if (err.status === 409) return err.message && err.message !== "The request failed (409)." ? err.message : "This proposal has already been answered.";
    if (err.status === 429) return "Too many attempts from here. Wait a few minutes and try again.";
  }
  return errorMessage(err);
}

type Errors = { option?: string; name?: string; consent?: string };

/** Choose an option, type the full name, agree, accept; or decline with a reason. */
export function AcceptanceForm({ token, proposal }: { token: string; proposal: PublicProposal }) {
  const options = choosableOptions(proposal);
  const doc = proposal.doc;
  const [optionId, setOptionId] = useState<number | null>(options.length === 1 ? options[0]!.id : null);
  const [name, setName] = useState("");
  const [consent, setConsent] = useState(false);
  const [errors, setErrors] = useState<Errors>({});
  const [declining, setDeclining] = useState(false);
  const [reason, setReason] = useState("");
  const [reasonError, setReasonError] = useState<string>();
  const accept = useAcceptProposal(token);
  const decline = useDeclineProposal(token);
  const groupId = useId();
  const consentId = useId();

  const submitAccept = (e: FormEvent) => {
    e.preventDefault();
    const next: Errors = {};
    if (!optionId) next.option = "Choose one of the options.";
    if (name.trim().length < 2) next.name = "Type your full name.";
    if (!consent) next.consent = "Tick the box to agree before you accept.";
    setErrors(next);
    if (Object.keys(next).length) {
      const first = next.option ? `${groupId}-opt-0` : next.name ? `${groupId}-name` : consentId;
      document.getElementById(first)?.focus();
      return;
    }
    accept.mutate({ optionId: optionId!, signerName: name.trim(), consent: true });
  };

  const submitDecline = (e: FormEvent) => {
    e.preventDefault();
    if (reason.trim().length < 2) {
      setReasonError("Tell us briefly why, so your contractor knows.");
      document.getElementById(`${groupId}-reason`)?.focus();
      return;
    }
    setReasonError(undefined);
    decline.mutate(reason.trim());
  };

  const chosen = options.find((o) => o.id === optionId);

  return (
    <div className="space-y-5">
      <form onSubmit={submitAccept} noValidate aria-label="Accept this proposal" className="space-y-5">
        {accept.isError && <Alert tone="error">{refusal(accept.error)}</Alert>}
        <fieldset aria-describedby={errors.option ? `${groupId}-opt-error` : undefined}>
          <legend className="mb-2 text-sm font-semibold text-steel-900">
            {options.length > 1 ? "1. Choose your option" : "1. Your option"}
          </legend>
          <div role="radiogroup" aria-label="Options" className="grid gap-2">
            {options.map((o, i) => {
              const checked = o.id === optionId;
              return (
                <label
                  key={o.id}
                  className={cn(
                    "flex cursor-pointer items-start gap-3 rounded-lg border bg-white px-3.5 py-3 transition-colors",
                    "has-[:focus-visible]:ring-2 has-[:focus-visible]:ring-accent-500",
                    checked ? "border-accent-700 bg-accent-50 ring-1 ring-accent-700" : "border-steel-300 hover:border-steel-400",
                  )}
                >
                  <input
                    id={`${groupId}-opt-${i}`}
                    type="radio"
                    name="option"
                    value={o.id}
                    checked={checked}
                    onChange={() => setOptionId(o.id)}
                    className="mt-1 size-4 shrink-0 accent-accent-700"
                  />
                  <span className="min-w-0 flex-1">
                    <span className="block font-semibold text-steel-950">
                      {options.length > 1 && `${i + 1}. `}
                      {o.label}
                    </span>
                    <span className="mt-0.5 flex flex-wrap gap-x-4 text-sm tabular-nums text-steel-600">
                      <span>
                        Total <strong className="text-steel-950">{formatMoney(o.totalCents)}</strong>
                      </span>
                      <span>Deposit {formatMoney(o.depositCents)}</span>
                    </span>
                  </span>
                  {checked && <CheckIcon className="mt-1 size-4 shrink-0 text-accent-700" />}
                </label>
              );
            })}
          </div>
          {errors.option && (
            <p id={`${groupId}-opt-error`} className="mt-1.5 text-sm text-danger-700">
              {errors.option}
            </p>
          )}
        </fieldset>

        <div className="flex flex-col gap-1.5">
          <label htmlFor={`${groupId}-name`} className="text-sm font-semibold text-steel-900">
            2. Type your full name
          </label>
          <input
            id={`${groupId}-name`}
            value={name}
            onChange={(e) => setName(e.target.value)}
            autoComplete="name"
            maxLength={200}
            aria-invalid={errors.name ? true : undefined}
            aria-describedby={`${groupId}-name-hint${errors.name ? ` ${groupId}-name-error` : ""}`}
            className={cn(
              "h-12 w-full rounded-md border bg-white px-3 text-[16px] text-steel-950 shadow-sm",
              "focus:border-accent-600 focus:outline-none focus:ring-2 focus:ring-accent-500/40",
              errors.name ? "border-danger-600" : "border-steel-300",
            )}
          />
          {errors.name && (
            <p id={`${groupId}-name-error`} className="text-sm text-danger-700">
              {errors.name}
            </p>
          )}
          <p id={`${groupId}-name-hint`} className="text-sm text-steel-500">
            Typing your name here is your electronic signature.
          </p>
        </div>

        <div>
          <label htmlFor={consentId} className="flex cursor-pointer items-start gap-3 text-[15px] leading-snug text-steel-800">
            <input
              id={consentId}
              type="checkbox"
              checked={consent}
              onChange={(e) => setConsent(e.target.checked)}
              aria-invalid={errors.consent ? true : undefined}
              aria-describedby={errors.consent ? `${consentId}-error` : undefined}
              className="mt-0.5 size-5 shrink-0 accent-accent-700"
            />
            <span>
              I agree to this proposal from {doc.company.name}
              {chosen ? `, option “${chosen.label}” at ${formatMoney(chosen.totalCents)}` : ""}, with its deposit, payment terms,
              exclusions and warranty, and I understand that typing my name is my signature.
            </span>
          </label>
          {errors.consent && (
            <p id={`${consentId}-error`} className="ml-8 mt-1 text-sm text-danger-700">
              {errors.consent}
            </p>
          )}
        </div>

        <Button type="submit" size="lg" className="h-12 w-full text-base sm:w-auto sm:px-8" loading={accept.isPending}>
          {accept.isPending ? "Accepting…" : "Accept proposal"}
        </Button>
      </form>

      <div className="border-t border-steel-200 pt-4">
        {!declining ? (
          <button
            type="button"
            onClick={() => setDeclining(true)}
            className="rounded text-sm font-medium text-steel-600 underline underline-offset-2 hover:text-steel-900 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
          >
            Not going ahead? Decline this proposal
          </button>
        ) : (
          <form onSubmit={submitDecline} noValidate aria-label="Decline this proposal" className="space-y-3">
            {decline.isError && <Alert tone="error">{refusal(decline.error)}</Alert>}
            <Field label="Why are you declining?" error={reasonError} id={`${groupId}-reason`} hint="Your contractor will read this. A sentence is enough.">
              <Textarea value={reason} onChange={(e) => setReason(e.target.value)} rows={3} maxLength={2000} className="text-[16px]" />
            </Field>
            <div className="flex flex-wrap gap-2">
              <Button type="submit" variant="secondary" loading={decline.isPending}>
                Decline proposal
              </Button>
              <Button type="button" variant="ghost" onClick={() => setDeclining(false)} disabled={decline.isPending}>
                Cancel
              </Button>
            </div>
          </form>
        )}
      </div>
    </div>
  );
}

/** What was accepted, by whom and when. */
export function AcceptedSummary({ proposal }: { proposal: PublicProposal }) {
  const a = proposal.accepted;
  const d = proposal.doc.acceptance;
  const label = a?.optionLabel ?? d?.optionLabel;
  const signer = a?.signerName ?? d?.signerName;
  const at = a?.at ?? d?.acceptedAt;
  return (
    <div className="rounded-lg border border-ok-200 bg-ok-50 px-4 py-3 text-ok-700">
      <p className="flex items-center gap-2 text-base font-semibold">
        <CheckIcon className="size-5" />
        Proposal accepted — thank you
      </p>
      <dl className="mt-1.5 grid gap-x-6 gap-y-0.5 text-sm text-steel-800 sm:grid-cols-[auto_1fr]">
        {signer && (
          <>
            <dt className="text-steel-600">Signed by</dt>
            <dd className="font-semibold">{signer}</dd>
          </>
        )}
        {at && (
          <>
            <dt className="text-steel-600">Accepted</dt>
            <dd>{formatDateTimeUtc(at)}</dd>
          </>
        )}
        {label && (
          <>
            <dt className="text-steel-600">Option chosen</dt>
            <dd>{label}</dd>
          </>
        )}
      </dl>
      <p className="mt-2 text-sm text-steel-700">A signed copy is on its way to your e-mail; you can also download it above.</p>
    </div>
  );
}

export function DeclinedSummary({ proposal, doc }: { proposal: PublicProposal; doc: ProposalDocDto }) {
  const d = proposal.declined;
  const contact = [doc.company.phone, doc.company.email].filter(Boolean).join(" or ");
  return (
    <div className="rounded-lg border border-steel-300 bg-steel-50 px-4 py-3">
      <p className="text-base font-semibold text-steel-900">You declined this proposal{d?.at ? ` on ${formatDateTimeUtc(d.at)}` : ""}.</p>
      {d?.reason && <p className="mt-1 text-sm text-steel-700">Your reason: “{d.reason}”</p>}
      <p className="mt-2 text-sm text-steel-700">
        Thank you for letting us know. If you change your mind or want a different option, contact {doc.company.name}
        {contact ? ` at ${contact}` : ""}.
      </p>
    </div>
  );
}
