import type { JobProposalProgress } from "@shared/schemas/proposal-api";
import { cn } from "@/lib/cn";

/** The latest proposal's progress, when the jobs API sends it (`proposal` on the list item and the detail). */
export const proposalOf = (job: object): JobProposalProgress | null =>
  ((job as { proposal?: JobProposalProgress | null }).proposal ?? null);

type Stage = { key: string; label: string; icon: "sent" | "viewed" | "check" | "cross" | "clock" | "paid"; tone: "plain" | "ok" | "bad" | "muted" };

/** Where the proposal stands, in one word or two (the furthest step reached). */
export function proposalStage(p: JobProposalProgress): Stage {
  if (p.depositStatus === "paid") return { key: "paid", label: "Deposit paid", icon: "paid", tone: "ok" };
  if (p.acceptedAt || p.status === "accepted") return { key: "accepted", label: "Accepted", icon: "check", tone: "ok" };
  if (p.declinedAt || p.status === "declined") return { key: "declined", label: "Declined", icon: "cross", tone: "bad" };
  if (p.status === "expired") return { key: "expired", label: "Expired", icon: "clock", tone: "muted" };
  if (p.viewedAt) return { key: "viewed", label: "Viewed", icon: "viewed", tone: "plain" };
  return { key: "sent", label: "Sent", icon: "sent", tone: "plain" };
}

function Icon({ name, className }: { name: Stage["icon"]; className?: string }) {
  const common = { viewBox: "0 0 16 16", className: cn("size-3.5 shrink-0", className), fill: "none", stroke: "currentColor", strokeWidth: 1.6, "aria-hidden": true } as const;
  switch (name) {
    case "sent":
      return (
        <svg {...common}>
          <path d="M2 8 14 2.5 10.5 14 8 9.5 2 8Z M8 9.5l6-7" strokeLinejoin="round" />
        </svg>
      );
    case "viewed":
      return (
        <svg {...common}>
          <path d="M1.5 8S4 3.5 8 3.5 14.5 8 14.5 8 12 12.5 8 12.5 1.5 8 1.5 8Z" />
          <circle cx="8" cy="8" r="2" />
        </svg>
      );
    case "check":
      return (
        <svg {...common} strokeWidth={2}>
          <path d="m3.5 8.5 3 3 6-7" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
      );
    case "cross":
      return (
        <svg {...common} strokeWidth={2}>
          <path d="m4.5 4.5 7 7m0-7-7 7" strokeLinecap="round" />
        </svg>
      );
    case "clock":
      return (
        <svg {...common}>
          <circle cx="8" cy="8" r="6" />
          <path d="M8 4.5V8l2.5 1.5" strokeLinecap="round" />
        </svg>
      );
    case "paid":
      return (
        <svg {...common}>
          <rect x="1.5" y="4" width="13" height="8.5" rx="1.5" />
          <path d="M1.5 7h13" />
          <path d="m9 10 1.2 1.2L12.5 9" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
      );
  }
}

const toneClass: Record<Stage["tone"], string> = {
  plain: "text-steel-700",
  ok: "text-ok-700",
  bad: "text-danger-700",
  muted: "text-steel-500",
};

const shortDate = (iso: string | null) =>
  iso ? new Date(iso).toLocaleDateString(undefined, { month: "short", day: "numeric" }) : "";

/** The board's compact cell: an icon and the stage's word (the word carries the meaning, not the colour). */
export function ProposalProgressBadge({ progress }: { progress: JobProposalProgress | null }) {
  if (!progress) return <span className="text-steel-400">—</span>;
  const s = proposalStage(progress);
  const deposit = s.key === "accepted" && progress.depositStatus !== "paid" ? "deposit due" : null;
  return (
    <span className={cn("inline-flex items-center gap-1 whitespace-nowrap text-xs font-medium", toneClass[s.tone])} title={`Proposal: ${s.label}${deposit ? `, ${deposit}` : ""}`}>
      <Icon name={s.icon} />
      {s.label}
      {deposit && <span className="font-normal text-steel-500">· {deposit}</span>}
    </span>
  );
}

/** The job header's line: sent → viewed → accepted/declined → deposit, with dates; steps not reached are greyed and say so. */
export function ProposalProgressLine({ progress }: { progress: JobProposalProgress }) {
  const declined = Boolean(progress.declinedAt) || progress.status === "declined";
  const accepted = Boolean(progress.acceptedAt) || progress.status === "accepted";
  const steps: { label: string; done: boolean; icon: Stage["icon"]; bad?: boolean }[] = [
    { label: `Sent ${shortDate(progress.sentAt)}`, done: true, icon: "sent" },
    { label: progress.viewedAt ? `Viewed ${shortDate(progress.viewedAt)}` : "Not viewed", done: Boolean(progress.viewedAt), icon: "viewed" },
    declined
      ? { label: `Declined ${shortDate(progress.declinedAt)}`, done: true, icon: "cross", bad: true }
      : accepted
        ? { label: `Accepted ${shortDate(progress.acceptedAt)}`, done: true, icon: "check" }
        : progress.status === "expired"
          ? { label: "Expired", done: true, icon: "clock", bad: true }
          : { label: "Not answered", done: false, icon: "check" },
  ];
  if (!declined && progress.status !== "expired") {
    steps.push({
      label: progress.depositStatus === "paid" ? "Deposit paid" : progress.depositStatus === "failed" ? "Deposit failed" : "Deposit not paid",
      done: progress.depositStatus === "paid",
      icon: "paid",
      bad: progress.depositStatus === "failed",
    });
  }
  return (
    <div className="flex flex-wrap items-center gap-x-1 gap-y-1 text-xs" aria-label="Proposal progress" role="group">
      <span className="mr-1 font-medium uppercase tracking-wide text-steel-500">Proposal</span>
      {steps.map((st, i) => (
        <span key={i} className="inline-flex items-center gap-1">
          {i > 0 && (
            <span aria-hidden="true" className="mx-0.5 text-steel-300">
              →
            </span>
          )}
          <span
            className={cn(
              "inline-flex items-center gap-1 rounded px-1.5 py-0.5 ring-1 ring-inset",
              st.bad ? "bg-danger-50 text-danger-700 ring-danger-200" : st.done ? "bg-ok-50 text-ok-700 ring-ok-200" : "bg-white text-steel-500 ring-steel-200",
            )}
          >
            <Icon name={st.icon} />
            {st.label}
          </span>
        </span>
      ))}
    </div>
  );
}
