import { useEffect, useId, useState } from "react";
import { formatBytes, type AttachmentDto } from "@shared/schemas/attachment";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Spinner } from "@/components/ui/spinner";
import { cn } from "@/lib/cn";

export type ItemPermissions = {
  /** Caption (office: any file; crew: their own photos). */
  caption: boolean;
  /** The proposal and crew flags (office). */
  flags: boolean;
  delete: boolean;
};

export type AttachmentChange = { caption?: string; showInProposal?: boolean; forCrew?: boolean; kind?: "photo" | "plan" | "document" };

type ItemProps = {
  item: AttachmentDto;
  can: ItemPermissions;
  onChange: (input: AttachmentChange) => void;
  onDelete: () => void;
};

/** A caption saved when the field loses focus or on Enter; Escape puts the saved one back. */
function CaptionField({ item, onSave, disabled }: { item: AttachmentDto; onSave: (caption: string) => void; disabled: boolean }) {
  const [value, setValue] = useState(item.caption);
  useEffect(() => setValue(item.caption), [item.caption]);
  const save = () => {
    if (value.trim() !== item.caption) onSave(value.trim());
  };
  return (
    <input
      value={value}
      disabled={disabled}
      maxLength={500}
      placeholder={disabled ? "" : "Add a caption"}
      aria-label={`Caption for ${item.originalName}`}
      onChange={(e) => setValue(e.target.value)}
      onBlur={save}
      onKeyDown={(e) => {
        if (e.key === "Enter") e.currentTarget.blur();
        if (e.key === "Escape") setValue(item.caption);
      }}
      className="h-10 w-full rounded-md border border-transparent bg-transparent px-2 text-sm text-steel-900 placeholder:text-steel-400 hover:border-steel-300 focus-visible:border-accent-600 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500/30 disabled:text-steel-700 sm:h-8"
    />
  );
}

/** A labelled checkbox with a large touch target. */
function Toggle({ label, checked, onChange, disabled }: { label: string; checked: boolean; onChange: (v: boolean) => void; disabled?: boolean }) {
  const id = useId();
  return (
    <label htmlFor={id} className={cn("flex min-h-10 cursor-pointer items-center gap-2 text-sm text-steel-800 sm:min-h-7", disabled && "cursor-default opacity-70")}>
      <input
        id={id}
        type="checkbox"
        checked={checked}
        disabled={disabled}
        onChange={(e) => onChange(e.target.checked)}
        className="h-5 w-5 accent-accent-700 focus-visible:outline focus-visible:outline-2 focus-visible:outline-accent-600 sm:h-4 sm:w-4"
      />
      {label}
    </label>
  );
}

function StatusBadge({ item }: { item: AttachmentDto }) {
  if (item.status === "processing") return <Badge tone="neutral">Converting…</Badge>;
  if (item.status === "failed") return <Badge tone="muted">Conversion failed</Badge>;
  return null;
}

/** A photo (or image plan) card: thumbnail, caption, flags, delete. */
export function PhotoCard({ item, can, onChange, onDelete }: ItemProps) {
  return (
    <li className="flex flex-col overflow-hidden rounded-lg border border-steel-200 bg-white shadow-panel">
      <a
        href={item.status === "ready" ? item.fileUrl : undefined}
        target="_blank"
        rel="noreferrer"
        className="relative block aspect-[4/3] bg-steel-100 focus-visible:outline focus-visible:outline-2 focus-visible:outline-accent-600"
        aria-label={`Open ${item.originalName}`}
      >
        {item.thumbUrl ? (
          <img src={item.thumbUrl} alt={item.caption || item.originalName} loading="lazy" className="h-full w-full object-cover" />
        ) : (
          <span className="flex h-full items-center justify-center text-sm text-steel-600">
            {item.status === "processing" ? <Spinner label="Converting the photo" /> : "No preview"}
          </span>
        )}
        {item.kind === "plan" && <Badge tone="accent" className="absolute left-2 top-2">Plan</Badge>}
      </a>
      <div className="flex flex-1 flex-col gap-1 p-2">
        <div className="flex items-center justify-between gap-2">
          <span className="truncate text-xs text-steel-600" title={item.originalName}>
            {item.originalName}
          </span>
          <StatusBadge item={item} />
        </div>
        {item.status === "failed" && item.error && (
          <p role="alert" className="text-xs text-danger-700">
            {item.error}
          </p>
        )}
        <CaptionField item={item} disabled={!can.caption} onSave={(caption) => onChange({ caption })} />
        {can.flags && (
          <div className="flex flex-col gap-0 sm:gap-0.5">
            <Toggle label="Show in proposal" checked={item.showInProposal} onChange={(v) => onChange({ showInProposal: v })} />
            <Toggle label="For the crew" checked={item.forCrew} onChange={(v) => onChange({ forCrew: v })} />
            <Toggle label="Plan drawing" checked={item.kind === "plan"} onChange={(v) => onChange({ kind: v ? "plan" : "photo" })} />
          </div>
        )}
        {!can.flags && item.forCrew && <p className="text-xs text-steel-600">Shared with the crew</p>}
        {can.delete && (
          <div className="mt-auto flex justify-end pt-1">
            <Button variant="ghost" className="h-10 sm:h-7" size="sm" onClick={onDelete} aria-label={`Delete ${item.originalName}`}>
              Delete
            </Button>
          </div>
        )}
      </div>
    </li>
  );
}

const KIND_LABEL: Record<AttachmentDto["kind"], string> = { photo: "Photo", plan: "Plan", document: "Document", csv: "CSV" };

/** A document row: name, kind, size, date, download, the crew flag, delete. */
export function DocumentRow({ item, can, onChange, onDelete }: ItemProps) {
  const date = new Date(item.createdAt).toLocaleDateString(undefined, { year: "numeric", month: "short", day: "numeric" });
  return (
    <li className="flex flex-col gap-2 px-3 py-2 sm:flex-row sm:items-center sm:gap-3">
      <div className="min-w-0 flex-1">
        <div className="flex items-center gap-2">
          <Badge tone={item.kind === "plan" ? "accent" : "neutral"}>{KIND_LABEL[item.kind]}</Badge>
          <span className="truncate text-sm font-medium text-steel-900" title={item.originalName}>
            {item.originalName}
          </span>
        </div>
        <p className="mt-0.5 text-xs text-steel-600">
          {formatBytes(item.size)} · {date}
          {item.uploadedBy ? ` · ${item.uploadedBy.name}` : ""}
        </p>
        <CaptionField item={item} disabled={!can.caption} onSave={(caption) => onChange({ caption })} />
      </div>
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
        {can.flags && <Toggle label="For the crew" checked={item.forCrew} onChange={(v) => onChange({ forCrew: v })} />}
        {can.flags && item.mime === "application/pdf" && (
          <Toggle label="Plan set" checked={item.kind === "plan"} onChange={(v) => onChange({ kind: v ? "plan" : "document" })} />
        )}
        {can.flags && item.kind === "plan" && (
          <Toggle label="Show in proposal" checked={item.showInProposal} onChange={(v) => onChange({ showInProposal: v })} />
        )}
        <a
          href={`${item.fileUrl}&download=1`}
          className="inline-flex h-10 items-center rounded-md border border-steel-300 bg-white px-3 text-sm font-medium text-steel-800 shadow-sm hover:bg-steel-50 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500 sm:h-8"
          aria-label={`Download ${item.originalName}`}
        >
          Download
        </a>
        {can.delete && (
          <Button variant="ghost" className="h-10 sm:h-8" onClick={onDelete} aria-label={`Delete ${item.originalName}`}>
            Delete
          </Button>
        )}
      </div>
    </li>
  );
}

/** Asks before deleting: the file is removed from the server, not archived. */
export function ConfirmDelete({ item, busy, onCancel, onConfirm }: { item: AttachmentDto | null; busy: boolean; onCancel: () => void; onConfirm: () => void }) {
  return (
    <Dialog
      open={item !== null}
      onClose={onCancel}
      busy={busy}
      title="Delete this file?"
      description={item ? `"${item.originalName}" will be removed from the job for everyone. This can't be undone.` : undefined}
      footer={
        <>
          <Button variant="secondary" onClick={onCancel} disabled={busy} data-autofocus>
            Keep it
          </Button>
          <Button variant="danger" onClick={onConfirm} loading={busy}>
            Delete file
          </Button>
        </>
      }
    />
  );
}
