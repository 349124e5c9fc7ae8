import type { ReactNode } from "react";
import type { ProposalDto } from "@shared/schemas/proposal-api";
import { formatMoney } from "@shared/schemas/proposal";
import { cn } from "@/lib/cn";

export function formatWhen(iso: string | null | undefined): string {
  if (!iso) return "";
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleString(undefined, { month: "short", day: "numeric", year: "numeric", hour: "numeric", minute: "2-digit" });
}

const Done = () => (
  <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="2.2" aria-hidden="true">
    <path d="m3.5 8.5 3 3 6-7" strokeLinecap="round" strokeLinejoin="round" />
  </svg>
);
const Cross = () => (
  <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="2.2" aria-hidden="true">
    <path d="m4.5 4.5 7 7m0-7-7 7" strokeLinecap="round" />
  </svg>
);
const Open = () => (
  <svg viewBox="0 0 16 16" className="size-3.5" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden="true">
    <circle cx="8" cy="8" r="4.5" strokeDasharray="2 2" />
  </svg>
);

type StepState = "done" | "stopped" | "waiting";

function Step({ state, label, detail }: { state: StepState; label: string; detail: ReactNode }) {
  return (
    <li className="flex min-w-0 items-start gap-2">
      <span
        className={cn(
          "mt-0.5 flex size-5 shrink-0 items-center justify-center rounded-full",
          state === "done" && "bg-ok-600 text-white",
          state === "stopped" && "bg-danger-600 text-white",
          state === "waiting" && "border border-steel-300 bg-white text-steel-400",
        )}
      >
        {state === "done" ? <Done /> : state === "stopped" ? <Cross /> : <Open />}
      </span>
      <span className="min-w-0">
        <span className={cn("block text-sm font-medium", state === "waiting" ? "text-steel-500" : "text-steel-900")}>{label}</span>
        <span className="block text-xs text-steel-500">{detail}</span>
      </span>
    </li>
  );
}

const DEPOSIT_WORDS: Record<string, string> = { pending: "Started, not paid yet", paid: "Paid", failed: "Payment failed", expired: "Payment page expired" };

/** Sent → viewed → accepted or declined → deposit, each with its time, in words and icons. */
export function ProposalProgressSteps({ p }: { p: ProposalDto }) {
  const decided = p.acceptedAt ? "accepted" : p.declinedAt ? "declined" : null;
  const dep = p.deposit;
  return (
    <ol aria-label="Progress" className="grid gap-3 sm:grid-cols-4">
      <Step state="done" label="Sent" detail={formatWhen(p.sentAt)} />
      <Step state={p.viewedAt ? "done" : "waiting"} label={p.viewedAt ? "Viewed" : "Not viewed yet"} detail={p.viewedAt ? formatWhen(p.viewedAt) : "—"} />
      {decided === "declined" ? (
        <Step state="stopped" label="Declined" detail={formatWhen(p.declinedAt)} />
      ) : (
        <Step
          state={decided ? "done" : "waiting"}
          label={decided ? "Accepted" : p.status === "expired" ? "Expired unanswered" : "Not answered yet"}
          detail={decided ? formatWhen(p.acceptedAt) : p.status === "expired" ? formatWhen(p.expiresAt) : `Link valid until ${formatWhen(p.expiresAt)}`}
        />
      )}
      {decided !== "declined" && (
        <Step
          state={dep?.status === "paid" ? "done" : dep?.status === "failed" ? "stopped" : "waiting"}
          label={dep ? `Deposit: ${DEPOSIT_WORDS[dep.status] ?? dep.status}` : "Deposit not paid yet"}
          detail={dep ? `${formatMoney(dep.amountCents)}${dep.paidAt ? ` · ${formatWhen(dep.paidAt)}` : ""}` : decided ? "Waiting for the homeowner" : "After acceptance"}
        />
      )}
    </ol>
  );
}
