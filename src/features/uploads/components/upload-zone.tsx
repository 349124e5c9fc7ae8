import { useId, useRef, useState, type DragEvent } from "react";
import { UPLOAD_ACCEPT, UPLOAD_MAX_BYTES, formatBytes } from "@shared/schemas/attachment";
import { Button } from "@/components/ui/button";
import { cn } from "@/lib/cn";
import type { UploadItem } from "../lib/use-upload-queue";

type Props = {
  onFiles: (files: File[]) => void;
  /** Crew: photos only, with a camera button first. */
  photosOnly?: boolean;
};

/** A drop zone with a file picker (several files) and, on phones, a button that opens the camera. */
export function UploadZone({ onFiles, photosOnly = false }: Props) {
  const pickerRef = useRef<HTMLInputElement>(null);
  const cameraRef = useRef<HTMLInputElement>(null);
  const [over, setOver] = useState(false);
  const hintId = useId();

  const take = (list: FileList | null) => {
    if (list && list.length) onFiles(Array.from(list));
  };
  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setOver(false);
    take(e.dataTransfer.files);
  };

  return (
    <div
      onDragOver={(e) => {
        e.preventDefault();
        e.dataTransfer.dropEffect = "copy";
        setOver(true);
      }}
      onDragLeave={(e) => {
        if (!e.currentTarget.contains(e.relatedTarget as Node | null)) setOver(false);
      }}
      onDrop={onDrop}
      data-testid="upload-zone"
      className={cn(
        "flex flex-col items-center gap-3 rounded-lg border-2 border-dashed px-4 py-6 text-center transition-colors",
        over ? "border-accent-600 bg-accent-50" : "border-steel-300 bg-white",
      )}
    >
      <p className="text-sm font-medium text-steel-800">
        {over ? "Drop to upload" : photosOnly ? "Add site photos" : "Drop photos, plan sets, PDFs or CSV files here"}
      </p>
      <div className={cn("flex w-full flex-col gap-2 sm:w-auto sm:flex-row", !photosOnly && "sm:flex-row-reverse")}>
        {/* the camera: first for the crew; for the office only on touch screens (phones, tablets) */}
        <Button
          size="lg"
          variant={photosOnly ? "primary" : "secondary"}
          className={cn("w-full sm:w-auto", !photosOnly && "hidden [@media(pointer:coarse)]:inline-flex")}
          onClick={() => cameraRef.current?.click()}
        >
          Take a photo
        </Button>
        <Button size="lg" variant={photosOnly ? "secondary" : "primary"} className="w-full sm:w-auto" onClick={() => pickerRef.current?.click()}>
          {photosOnly ? "Choose photos" : "Choose files"}
        </Button>
      </div>
      <p id={hintId} className="text-xs text-steel-600">
        {photosOnly ? "JPEG, PNG, WebP or HEIC" : "Photos (JPEG, PNG, WebP, HEIC), PDF and CSV"} · up to {formatBytes(UPLOAD_MAX_BYTES)} each ·
        several at once
      </p>
      <input
        ref={pickerRef}
        type="file"
        multiple
        accept={photosOnly ? "image/*" : UPLOAD_ACCEPT}
        className="sr-only"
        aria-label={photosOnly ? "Choose photos" : "Choose files"}
        aria-describedby={hintId}
        tabIndex={-1}
        onChange={(e) => {
          take(e.currentTarget.files);
          e.currentTarget.value = "";
        }}
      />
      <input
        ref={cameraRef}
        type="file"
        accept="image/*"
        capture="environment"
        className="sr-only"
        aria-label="Take a photo"
        tabIndex={-1}
        onChange={(e) => {
          take(e.currentTarget.files);
          e.currentTarget.value = "";
        }}
      />
    </div>
  );
}

type QueueProps = {
  items: UploadItem[];
  onCancel: (key: string) => void;
  onDismiss: (key: string) => void;
  onClear: () => void;
};

/** Each file on its way up: a progress bar while sending, then done or the reason it failed. */
export function UploadQueue({ items, onCancel, onDismiss, onClear }: QueueProps) {
  if (items.length === 0) return null;
  const finished = items.some((i) => i.state === "done" || i.state === "failed");
  return (
    <section aria-label="Uploads" className="rounded-lg border border-steel-200 bg-white shadow-panel">
      <div className="flex items-center justify-between border-b border-steel-100 px-3 py-2">
        <h3 className="text-sm font-semibold text-steel-900">Uploads</h3>
        {finished && (
          <Button size="sm" variant="ghost" onClick={onClear}>
            Clear finished
          </Button>
        )}
      </div>
      <ul className="divide-y divide-steel-100">
        {items.map((i) => {
          const pct = Math.round(i.progress * 100);
          return (
            <li key={i.key} className="flex items-center gap-3 px-3 py-2">
              <div className="min-w-0 flex-1">
                <div className="flex items-baseline justify-between gap-2">
                  <span className="truncate text-sm text-steel-900" title={i.name}>
                    {i.name}
                  </span>
                  <span className="shrink-0 text-xs text-steel-600">
                    {i.state === "waiting" && "Waiting"}
                    {i.state === "sending" && `${pct}%`}
                    {i.state === "done" && "Uploaded"}
                    {i.state === "failed" && "Not uploaded"}
                  </span>
                </div>
                {(i.state === "sending" || i.state === "waiting") && (
                  <div
                    role="progressbar"
                    aria-label={`Uploading ${i.name}`}
                    aria-valuemin={0}
                    aria-valuemax={100}
                    aria-valuenow={pct}
                    className="mt-1 h-1.5 overflow-hidden rounded-full bg-steel-100"
                  >
                    <div className="h-full bg-accent-600 transition-[width]" style={{ width: `${pct}%` }} />
                  </div>
                )}
                {i.state === "failed" && (
                  <p role="alert" className="mt-0.5 text-xs text-danger-700">
                    {i.error}
                  </p>
                )}
              </div>
              {i.state === "waiting" || i.state === "sending" ? (
                <Button size="sm" variant="ghost" className="h-10 sm:h-7" onClick={() => onCancel(i.key)} aria-label={`Cancel ${i.name}`}>
                  Cancel
                </Button>
              ) : (
                <Button size="sm" variant="ghost" className="h-10 sm:h-7" onClick={() => onDismiss(i.key)} aria-label={`Dismiss ${i.name}`}>
                  Dismiss
                </Button>
              )}
            </li>
          );
        })}
      </ul>
    </section>
  );
}
