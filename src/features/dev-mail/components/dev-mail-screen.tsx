import { useState } from "react";
import { useSearchParams } from "react-router-dom";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadFailed } from "@/components/ui/load-failed";
import { Spinner } from "@/components/ui/spinner";
import { PageHeader } from "@/components/layout/page-header";
import { attachmentUrl, recipients, useDevMail, type CaughtMail } from "@/features/dev-mail/api/queries";

function formatWhen(iso: string | undefined): string {
  if (!iso) return "";
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return d.toLocaleString(undefined, { month: "short", day: "numeric", hour: "2-digit", minute: "2-digit" });
}

function formatSize(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(bytes < 10 * 1024 ? 1 : 0)} KB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

const PaperclipIcon = () => (
  <svg viewBox="0 0 16 16" className="size-3.5 shrink-0" fill="none" stroke="currentColor" strokeWidth="1.5" aria-hidden="true">
    <path d="m13 7.5-5.3 5.3a3.2 3.2 0 0 1-4.5-4.5l5.6-5.6a2.1 2.1 0 0 1 3 3l-5.5 5.5a1 1 0 0 1-1.5-1.5L10 4.5" strokeLinecap="round" />
  </svg>
);

function MessageView({ mail }: { mail: CaughtMail }) {
  const [view, setView] = useState<"html" | "text">(mail.html ? "html" : "text");
  const tab = (v: "html" | "text", label: string, disabled = false) => (
    <button
      type="button"
      role="tab"
      aria-selected={view === v}
      disabled={disabled}
      onClick={() => setView(v)}
      className={cn(
        "-mb-px border-b-2 px-3 py-1.5 text-sm font-medium focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500 disabled:cursor-not-allowed disabled:text-steel-400",
        view === v ? "border-accent-700 text-steel-900" : "border-transparent text-steel-600 hover:text-steel-900",
      )}
    >
      {label}
    </button>
  );
  return (
    <article aria-label={`E-mail: ${mail.subject}`} className="flex min-h-0 flex-col rounded-lg border border-steel-200 bg-white shadow-panel">
      <header className="space-y-1 border-b border-steel-100 px-4 py-3">
        <h2 className="text-base font-semibold text-steel-950">{mail.subject || "(no subject)"}</h2>
        <dl className="grid grid-cols-[4rem_1fr] gap-x-2 text-sm">
          {mail.from && (
            <>
              <dt className="text-steel-500">From</dt>
              <dd className="truncate text-steel-800">{mail.from}</dd>
            </>
          )}
          <dt className="text-steel-500">To</dt>
          <dd className="break-words text-steel-800">{recipients(mail.to)}</dd>
          {mail.cc && mail.cc.length > 0 && (
            <>
              <dt className="text-steel-500">Cc</dt>
              <dd className="break-words text-steel-800">{mail.cc.join(", ")}</dd>
            </>
          )}
          {mail.date && (
            <>
              <dt className="text-steel-500">Date</dt>
              <dd className="text-steel-800">
                <time dateTime={mail.date}>{new Date(mail.date).toLocaleString()}</time>
              </dd>
            </>
          )}
        </dl>
        {mail.attachments.length > 0 && (
          <ul aria-label="Attachments" className="flex flex-wrap gap-2 pt-1">
            {mail.attachments.map((a, i) => (
              <li key={i}>
                <a
                  href={attachmentUrl(mail.id, i)}
                  download={a.filename}
                  className="inline-flex items-center gap-1.5 rounded-md border border-steel-300 bg-white px-2 py-1 text-xs font-medium text-steel-800 hover:bg-steel-50 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
                >
                  <PaperclipIcon />
                  {a.filename}
                  <span className="font-normal text-steel-500">· {formatSize(a.size)}</span>
                </a>
              </li>
            ))}
          </ul>
        )}
      </header>
      <div role="tablist" aria-label="Show the e-mail as" className="flex gap-1 border-b border-steel-200 px-3">
        {tab("html", "HTML", !mail.html)}
        {tab("text", "Text")}
      </div>
      {view === "html" && mail.html ? (
        // sandbox="": no scripts, no forms, no same-origin access; the e-mail is shown, never run
        <iframe title="HTML view of the e-mail" sandbox="" srcDoc={mail.html} className="h-[60vh] w-full rounded-b-lg bg-white" />
      ) : (
        <pre className="h-[60vh] overflow-auto whitespace-pre-wrap break-words px-4 py-3 font-mono text-xs leading-relaxed text-steel-800">
          {mail.text || "(no text part)"}
        </pre>
      )}
    </article>
  );
}

/** `/dev/mail`: the local mail catcher's inbox (owners and estimators, only while no SMTP server is configured). */
export function DevMailScreen() {
  const q = useDevMail();
  const [params, setParams] = useSearchParams();
  const wanted = params.get("id");

  const header = (
    <PageHeader
      title="Test inbox"
      description="E-mail the app sends while no mail server is set up is caught here instead of going out."
      actions={
        <Button variant="secondary" size="sm" onClick={() => q.refetch()} loading={q.isFetching && !q.isPending} disabled={q.isError && q.error instanceof ApiError && q.error.status === 404}>
          Refresh
        </Button>
      }
    />
  );

  if (q.isPending) return <>{header}<Spinner label="Loading the inbox" /></>;
  if (q.isError) {
    if (q.error instanceof ApiError && q.error.status === 404) {
      return (
        <>
          {header}
          <EmptyState
            title="No local inbox"
            description="E-mail goes to a real server (SMTP_URL is set); there is no local inbox."
          />
        </>
      );
    }
    return (
      <>
        {header}
        <LoadFailed title="The inbox could not be loaded" error={q.error} onRetry={() => q.refetch()} />
      </>
    );
  }

  const list = [...q.data].sort((a, b) => (b.date ?? "").localeCompare(a.date ?? ""));
  const selected = list.find((m) => m.id === wanted) ?? list[0];

  return (
    <>
      <title>Test inbox · Ridgewright</title>
      {header}
      {list.length === 0 ? (
        <EmptyState title="No e-mail yet" description="Send a proposal or ask for a password reset; the message shows up here within a few seconds." />
      ) : (
        <div className="grid gap-4 lg:grid-cols-[22rem_1fr]">
          <nav aria-label="Caught e-mails" className="overflow-hidden rounded-lg border border-steel-200 bg-white shadow-panel">
            <ul className="max-h-[75vh] divide-y divide-steel-100 overflow-y-auto">
              {list.map((m) => {
                const active = m.id === selected?.id;
                return (
                  <li key={m.id}>
                    <button
                      type="button"
                      aria-current={active ? "true" : undefined}
                      onClick={() => setParams({ id: m.id }, { replace: true })}
                      className={cn(
                        "block w-full border-l-[3px] px-3 py-2.5 text-left focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-inset focus-visible:ring-accent-500",
                        active ? "border-l-accent-700 bg-accent-50" : "border-l-transparent hover:bg-steel-50",
                      )}
                    >
                      <span className="flex items-baseline justify-between gap-2">
                        <span className="truncate text-sm font-medium text-steel-900">{recipients(m.to)}</span>
                        <time dateTime={m.date} className="shrink-0 text-xs tabular-nums text-steel-500">
                          {formatWhen(m.date)}
                        </time>
                      </span>
                      <span className="mt-0.5 block truncate text-sm text-steel-700">{m.subject || "(no subject)"}</span>
                      {m.attachments.length > 0 && (
                        <span className="mt-0.5 flex items-center gap-1 text-xs text-steel-500">
                          <PaperclipIcon />
                          {m.attachments.length === 1 ? m.attachments[0]!.filename : `${m.attachments.length} attachments`}
                        </span>
                      )}
                    </button>
                  </li>
                );
              })}
            </ul>
          </nav>
          {selected && <MessageView key={selected.id} mail={selected} />}
        </div>
      )}
    </>
  );
}
