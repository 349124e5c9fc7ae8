/**
 * The Underlay panel of the roof sketch: pick an uploaded plan (an image, or a page of a PDF) or upload
 * one, then set its scale from two clicked points and a typed distance, move, turn, fade, hide or remove
 * it. Every change goes into the roof draft's `underlay` (saved with the roof, one undo step per change;
 * slider drags join one step).
 */
import { useId, useRef, useState } from "react";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import type { Underlay } from "@shared/schemas/roof";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";
import { Spinner } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { errorMessage } from "@/lib/api-client";
import { roofDraftStore } from "@/features/roof/api/roof-draft";
import { attachmentKeys, attachmentQueries, uploadAttachment } from "@/lib/queries/attachments";
import { CommitInput } from "./commit-input";
import { feetInches, parseFeet, type Pt, type View } from "./geometry";
import type { UnderlayImageState } from "./underlay-image";
import {
  feetPerPixel,
  initialPlacement,
  moveUnderlay,
  normaliseDeg,
  resizeUnderlay,
  rotateUnderlay,
  scaleFromTwoPoints,
  MAX_UNDERLAY_WIDTH_FT,
} from "./underlay-math";

export type UnderlayMode = "move" | "scale" | null;

/** What the picker offers: the files the server has as images or PDFs. */
export const PLAN_ACCEPT = "image/jpeg,image/png,image/webp,application/pdf,.pdf";
const PLAN_MIMES = new Set(["image/jpeg", "image/png", "image/webp", "application/pdf"]);

/** Writes the draft's underlay (null removes it: the next save removes it on the server too). */
export function setDraftUnderlay(jobId: number, underlay: Underlay | null, opts?: { coalesce?: boolean }) {
  roofDraftStore.update(jobId, (d) => ({ ...d, underlay }), opts);
}

interface Props {
  jobId: number;
  underlay: Underlay | null;
  image: UnderlayImageState & { retry: () => void };
  view: View;
  canvas: { width: number; height: number };
  mode: UnderlayMode;
  onMode: (m: UnderlayMode) => void;
  scalePoints: Pt[];
  onClearScalePoints: () => void;
  onClose: () => void;
}

export function UnderlayPanel({ jobId, underlay, image, view, canvas, mode, onMode, scalePoints, onClearScalePoints, onClose }: Props) {
  const qc = useQueryClient();
  const plans = useQuery(attachmentQueries.plans(jobId));
  const fileRef = useRef<HTMLInputElement>(null);
  const [uploading, setUploading] = useState<number | null>(null);
  const [distance, setDistance] = useState("");
  const [distanceError, setDistanceError] = useState<string | null>(null);
  const [fieldError, setFieldError] = useState<string | null>(null);
  const lastChange = useRef<{ key: string; at: number } | null>(null);
  const ids = useId();

  const usable = (plans.data ?? []).filter((a) => PLAN_MIMES.has(a.mime) && a.status === "ready");
  const current = underlay ? usable.find((a) => samePath(a.fileUrl, underlay.src)) ?? null : null;
  const size = image.status === "ready" ? image.image : null;
  const isPdf = size?.pdf ?? current?.mime === "application/pdf";

  /** One undo step per field, whatever the number of slider moves in a row. */
  const change = (key: string, next: Underlay) => {
    const now = Date.now();
    const coalesce = lastChange.current?.key === key && now - lastChange.current.at < 1500;
    lastChange.current = { key, at: now };
    setDraftUnderlay(jobId, next, { coalesce });
  };
  const patch = (key: string, p: Partial<Underlay>) => underlay && change(key, { ...underlay, ...p });

  const place = (src: string, what = "Plan") => {
    lastChange.current = null;
    if (underlay) {
      // another plan (or file) in the same place: keep the scale, position and look
      setDraftUnderlay(jobId, { ...underlay, src, page: 1 });
      return;
    }
    setDraftUnderlay(jobId, { src, page: 1, ...initialPlacement(view, canvas), opacity: 0.6, visible: true });
    toast.info(`${what} placed under the sketch. Set its scale next: click two points whose distance you know.`);
  };

  const upload = async (file: File) => {
    setUploading(0);
    try {
      const [a] = await uploadAttachment(jobId, file, { kind: "plan", onProgress: (f) => setUploading(f) });
      if (!a) throw new Error("The server kept no file.");
      await qc.invalidateQueries({ queryKey: attachmentKeys.list(jobId) });
      if (underlay) toast.success(`${a.originalName} uploaded; it replaces the plan under the sketch.`);
      place(a.fileUrl, `${a.originalName} uploaded and`);
    } catch (e) {
      toast.error(`Not uploaded: ${errorMessage(e)}`);
    } finally {
      setUploading(null);
      if (fileRef.current) fileRef.current.value = "";
    }
  };

  const applyScale = () => {
    if (!underlay || scalePoints.length < 2) return;
    const d = parseFeet(distance);
    if (d === null || d <= 0) {
      setDistanceError("Enter the distance in feet, such as 20' or 20' 6\".");
      return;
    }
    const r = scaleFromTwoPoints(underlay, scalePoints[0], scalePoints[1], d);
    if (!r.ok) {
      setDistanceError(r.error);
      return;
    }
    lastChange.current = null;
    setDraftUnderlay(jobId, { ...underlay, ...r.placement });
    setDistance("");
    setDistanceError(null);
    onClearScalePoints();
    onMode(null);
    toast.success(`Scale set: the plan is ${feetInches(r.placement.widthFt)} wide.`);
  };

  const startScale = () => {
    setDistance("");
    setDistanceError(null);
    onClearScalePoints();
    onMode(mode === "scale" ? null : "scale");
  };

  const feetField = (text: string) => {
    const v = parseFeet(text);
    return v === null ? { ok: false as const, error: "Enter feet, such as 12.5 or 12' 6\"" } : { ok: true as const };
  };

  return (
    <section aria-labelledby={`${ids}-title`} className="space-y-3" data-testid="underlay-panel">
      <div className="flex items-center justify-between">
        <h2 id={`${ids}-title`} className="text-sm font-semibold text-steel-900">
          Plan underlay
        </h2>
        <Button variant="ghost" size="sm" onClick={onClose} aria-label="Close the underlay panel">
          Close
        </Button>
      </div>
      <p className="text-xs text-steel-600">Trace a plan drawing: place it under the grid, set its scale, then draw the planes over it.</p>

      <div className="space-y-2">
        <label className="flex flex-col gap-1 text-xs font-medium text-steel-700">
          Plan file
          <Select
            value={current ? String(current.id) : underlay ? "other" : ""}
            onChange={(e) => {
              const a = usable.find((x) => String(x.id) === e.target.value);
              if (a) place(a.fileUrl);
            }}
            disabled={plans.isPending}
          >
            <option value="" disabled>
              {plans.isPending ? "Loading plans…" : usable.length ? "Choose an uploaded plan…" : "No plans uploaded yet"}
            </option>
            {underlay && !current && (
              <option value="other" disabled>
                The plan in use
              </option>
            )}
            {usable.map((a) => (
              <option key={a.id} value={a.id}>
                {a.originalName}
                {a.mime === "application/pdf" ? " (PDF)" : ""}
              </option>
            ))}
          </Select>
        </label>
        {plans.isError && <p className="text-xs text-danger-700">The plans could not be listed: {errorMessage(plans.error)}</p>}
        <div className="flex flex-wrap items-center gap-2">
          <input
            ref={fileRef}
            type="file"
            accept={PLAN_ACCEPT}
            className="sr-only"
            tabIndex={-1}
            aria-label="Plan image or PDF to upload"
            data-testid="underlay-file"
            onChange={(e) => {
              const f = e.target.files?.[0];
              if (f) void upload(f);
            }}
          />
          <Button size="sm" variant="secondary" onClick={() => fileRef.current?.click()} loading={uploading !== null}>
            Upload a plan…
          </Button>
          {uploading !== null && (
            <span className="text-xs text-steel-600" aria-live="polite">
              Uploading {Math.round(uploading * 100)}%
            </span>
          )}
        </div>
        <p className="text-xs text-steel-500">JPEG, PNG or WebP images, or a PDF (pick the page).</p>
      </div>

      {underlay && (
        <>
          {isPdf && (
            <label className="flex items-center gap-2 text-xs font-medium text-steel-700">
              Page
              <span className="w-20">
                <CommitInput
                  value={String(underlay.page ?? 1)}
                  inputMode="numeric"
                  className="h-7"
                  aria-label="PDF page"
                  parse={(t) => (/^\d+$/.test(t.trim()) && Number(t) >= 1 ? { ok: true } : { ok: false, error: "Enter a page number" })}
                  onCommit={(t) => patch("page", { page: Number(t) })}
                />
              </span>
              {size?.pdf && <span className="font-normal text-steel-500">of {size.pageCount}</span>}
            </label>
          )}

          <div aria-live="polite" className="text-xs text-steel-600">
            {image.status === "loading" && (
              <span className="flex items-center gap-1">
                <Spinner /> {isPdf ? "Rendering the page…" : "Loading the plan…"}
              </span>
            )}
            {image.status === "ready" && (
              <span>
                {image.image.width} × {image.image.height} px · 1 px = {pixelText(feetPerPixel(underlay, image.image))} ·{" "}
                {feetInches(underlay.widthFt)} × {feetInches((underlay.widthFt * image.image.height) / image.image.width)}
              </span>
            )}
          </div>
          {image.status === "error" && (
            <Alert tone="error" title="The plan can't be shown">
              <p>{image.error}</p>
              <Button size="sm" variant="secondary" className="mt-2" onClick={image.retry}>
                Try again
              </Button>
            </Alert>
          )}

          <label className="flex items-center gap-2 text-sm text-steel-800">
            <input type="checkbox" checked={underlay.visible} onChange={(e) => patch("visible", { visible: e.target.checked })} className="size-4 accent-accent-700" />
            Show the plan
          </label>

          <div className="space-y-1">
            <div className="flex justify-between text-xs font-medium text-steel-700">
              <label htmlFor={`${ids}-opacity`}>Opacity</label>
              <output htmlFor={`${ids}-opacity`}>{Math.round(underlay.opacity * 100)}%</output>
            </div>
            <input
              id={`${ids}-opacity`}
              type="range"
              min={0.05}
              max={1}
              step={0.05}
              value={underlay.opacity}
              onChange={(e) => patch("opacity", { opacity: Number(e.target.value) })}
              className="w-full accent-accent-700"
            />
          </div>

          <div className="space-y-1">
            <div className="flex items-center justify-between gap-2">
              <label htmlFor={`${ids}-rotation`} className="text-xs font-medium text-steel-700">
                Rotation (degrees, counter-clockwise)
              </label>
              <span className="w-20">
                <CommitInput
                  id={`${ids}-rotation`}
                  value={String(underlay.rotationDeg)}
                  inputMode="decimal"
                  className="h-7"
                  parse={(t) => (Number.isFinite(Number(t)) && t.trim() !== "" ? { ok: true } : { ok: false, error: "Enter degrees" })}
                  onCommit={(t) => change("rotation", { ...underlay, ...rotateUnderlay(underlay, normaliseDeg(Number(t)), aspectOf(image)) })}
                />
              </span>
            </div>
            <input
              type="range"
              aria-label="Rotation slider"
              min={-180}
              max={180}
              step={0.5}
              value={underlay.rotationDeg}
              onChange={(e) => change("rotation", { ...underlay, ...rotateUnderlay(underlay, Number(e.target.value), aspectOf(image)) })}
              className="w-full accent-accent-700"
            />
          </div>

          <div className="space-y-2 rounded-md border border-steel-200 bg-steel-50 p-2">
            <div className="flex items-center justify-between gap-2">
              <h3 className="text-xs font-semibold text-steel-800">Scale</h3>
              <Button size="sm" variant={mode === "scale" ? "primary" : "secondary"} onClick={startScale} aria-pressed={mode === "scale"}>
                {mode === "scale" ? "Cancel" : "Set scale from two points"}
              </Button>
            </div>
            {mode === "scale" && scalePoints.length < 2 && (
              <p className="text-xs text-accent-900" aria-live="polite">
                Click point {scalePoints.length + 1} of 2 on the plan: two points whose real distance you know (a dimensioned wall, a scale bar).
              </p>
            )}
            {mode === "scale" && scalePoints.length === 2 && (
              <form
                className="space-y-1"
                onSubmit={(e) => {
                  e.preventDefault();
                  applyScale();
                }}
              >
                <label htmlFor={`${ids}-distance`} className="text-xs font-medium text-steel-700">
                  Real distance between the points
                </label>
                <div className="flex gap-2">
                  <Input
                    id={`${ids}-distance`}
                    value={distance}
                    autoFocus
                    placeholder={`e.g. 20' 6"`}
                    onChange={(e) => setDistance(e.target.value)}
                    aria-invalid={distanceError ? true : undefined}
                    aria-describedby={distanceError ? `${ids}-distance-error` : undefined}
                  />
                  <Button type="submit" size="md">
                    Apply
                  </Button>
                </div>
                {distanceError && (
                  <p id={`${ids}-distance-error`} className="text-xs text-danger-700">
                    {distanceError}
                  </p>
                )}
              </form>
            )}
            <label className="flex items-center justify-between gap-2 text-xs font-medium text-steel-700">
              Plan width
              <span className="w-28">
                <CommitInput
                  value={feetInches(underlay.widthFt)}
                  className="h-7"
                  aria-label="Plan width (feet)"
                  parse={(t) => {
                    const v = parseFeet(t);
                    return v !== null && v > 0 && v <= MAX_UNDERLAY_WIDTH_FT ? { ok: true } : { ok: false, error: "Enter a width in feet" };
                  }}
                  onParseError={setFieldError}
                  onCommit={(t) => change("width", { ...underlay, ...resizeUnderlay(underlay, parseFeet(t)!) })}
                />
              </span>
            </label>
          </div>

          <div className="space-y-2">
            <div className="flex items-center justify-between gap-2">
              <h3 className="text-xs font-semibold text-steel-800">Position (lower-left corner)</h3>
              <Button size="sm" variant={mode === "move" ? "primary" : "secondary"} aria-pressed={mode === "move"} onClick={() => onMode(mode === "move" ? null : "move")}>
                {mode === "move" ? "Done moving" : "Move by dragging"}
              </Button>
            </div>
            {mode === "move" && <p className="text-xs text-accent-900">Drag anywhere on the drawing to move the plan.</p>}
            <div className="grid grid-cols-2 gap-2">
              {(["x (east)", "y (north)"] as const).map((label, i) => (
                <label key={label} className="flex flex-col gap-1 text-xs font-medium text-steel-700">
                  {label}
                  <CommitInput
                    value={feetInches(underlay.originFt[i]!)}
                    className="h-7"
                    aria-label={`Plan position ${label}, feet`}
                    parse={feetField}
                    onParseError={setFieldError}
                    onCommit={(t) => {
                      const v = parseFeet(t)!;
                      const d = v - underlay.originFt[i]!;
                      change(`origin-${i}`, { ...underlay, ...moveUnderlay(underlay, i === 0 ? d : 0, i === 1 ? d : 0) });
                    }}
                  />
                </label>
              ))}
            </div>
            {fieldError && <p className="text-xs text-danger-700">{fieldError}</p>}
          </div>

          <div className="flex justify-end border-t border-steel-200 pt-2">
            <Button
              size="sm"
              variant="ghost"
              className="text-danger-700"
              onClick={() => {
                onMode(null);
                lastChange.current = null;
                setDraftUnderlay(jobId, null);
              }}
            >
              Remove the underlay
            </Button>
          </div>
          <p className="text-xs text-steel-500">
            A plan's scale may be off (copies, prints fitted to the page): check a second known length on the plan before relying on the traced sizes, and measure on site before ordering.
          </p>
        </>
      )}
      {!underlay && <p className="text-xs text-steel-500">The underlay is saved with the roof when you save it.</p>}
    </section>
  );
}

function aspectOf(image: UnderlayImageState): number | null {
  return image.status === "ready" && image.image.width > 0 ? image.image.height / image.image.width : null;
}

/** The same file, whatever its cache-busting query (`?v=…`). */
const samePath = (a: string, b: string) => a.split("?")[0] === b.split("?")[0];

/** Plan length of one image pixel: inches below a foot ("0.60 in"), else feet and inches. */
const pixelText = (ft: number) => (ft < 1 ? `${(ft * 12).toFixed(2)} in` : feetInches(ft));
