/**
 * The roof sketch editor: toolbar, plan drawing or plane table, inspector, live totals, save with the
 * roof's version (409 → "changed by someone else"). Edits go to the shared roof draft as intents.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { useQueryClient } from "@tanstack/react-query";
import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Input } from "@/components/ui/input";
import { Select } from "@/components/ui/select";
import { toast } from "@/components/ui/toast";
import { ApiError, errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { useSaveRoof } from "@/features/roof/api/mutations";
import { roofQueries } from "@/lib/queries/roof";
import { roofDraftStore, type RoofDraft } from "@/features/roof/api/roof-draft";
import { applyIntent, newIdPrefix, planeFromOutline, uniqueName, type SketchIntent } from "./edits";
import { boundsOf, dist, fitView, planArea, selfCrosses, SNAP_STEPS, zoomAt, type Pt, type View } from "./geometry";
import { HelpDialog } from "./help-dialog";
import { PlanCanvas } from "./roof-plan-svg";
import { PlaneInspector } from "./plane-inspector";
import { PlaneTable } from "./plane-table";
import { useTakeoffPreview } from "./preview";
import { generateShape, QuickShapeForm, type QuickShape } from "./quick-shape-form";
import { TotalsPanel } from "./totals-panel";
import type { Selection, Tool } from "./types";
import { useUnderlayImage } from "./underlay-image";
import { moveUnderlay } from "./underlay-math";
import { setDraftUnderlay, UnderlayPanel, type UnderlayMode } from "./underlay-panel";

/** Up to this many planes a vertex drag updates the draft (and the live totals) every frame. */
export const LIVE_DRAG_MAX_PLANES = 24;

/** The drawing's size before the page has been measured (and in tests). */
export const DEFAULT_CANVAS = { width: 800, height: 560 } as const;

const isField = (t: EventTarget | null) =>
  t instanceof HTMLElement && (/^(INPUT|SELECT|TEXTAREA)$/.test(t.tagName) || t.isContentEditable);

export function SketchEditor({ jobId, draft, readOnly, canReadRules }: { jobId: number; draft: RoofDraft; readOnly: boolean; canReadRules: boolean }) {
  const doc = draft.doc;
  const planes = doc.planes;
  const qc = useQueryClient();
  const save = useSaveRoof(jobId);

  const [tool, setTool] = useState<Tool>("select");
  const [snapIdx, setSnapIdx] = useState(0);
  const snapStep = SNAP_STEPS[snapIdx].value;
  const [selection, setSelection] = useState<Selection>(null);
  const [drawing, setDrawing] = useState<Pt[]>([]);
  const [newPitch, setNewPitch] = useState("6");
  const [mode, setMode] = useState<"drawing" | "table">("drawing");
  const [helpOpen, setHelpOpen] = useState(false);
  const [quickOpen, setQuickOpen] = useState(false);
  const [conflict, setConflict] = useState(false);
  const [size, setSize] = useState<{ width: number; height: number }>(DEFAULT_CANVAS);
  const [view, setView] = useState<View>(() => fitView(boundsOf(planes.map((p) => p.outline)), DEFAULT_CANVAS.width, DEFAULT_CANVAS.height));
  const viewTouched = useRef(false);
  const canvasBox = useRef<HTMLDivElement>(null);
  const [underlayOpen, setUnderlayOpen] = useState(false);
  const [underlayMode, setUnderlayModeState] = useState<UnderlayMode>(null);
  const [scalePoints, setScalePoints] = useState<Pt[]>([]);
  const underlay = doc.underlay ?? null;
  const underlayImage = useUnderlayImage(underlay?.src, underlay?.page ?? 1);
  const setUnderlayMode = useCallback((m: UnderlayMode) => {
    setUnderlayModeState(m);
    setScalePoints([]);
    if (m) {
      setTool("select");
      setDrawing([]);
    }
  }, []);
  // the underlay removed (or undone away): leave its modes
  useEffect(() => {
    if (!underlay && underlayMode) setUnderlayMode(null);
  }, [underlay, underlayMode, setUnderlayMode]);

  const { preview, refusedPlaneId, pending } = useTakeoffPreview(jobId, doc, canReadRules);
  const result = preview?.ok ? preview.result : null;

  // selection that no longer exists (after undo or delete) is dropped
  const selectedPlane = selection ? planes.find((p) => p.id === selection.planeId) ?? null : null;
  const validSelection: Selection =
    selection && selectedPlane && (selection.kind === "plane" || (selection.kind === "edge" ? selection.edge : selection.index) < selectedPlane.outline.length)
      ? selection
      : selectedPlane
        ? { kind: "plane", planeId: selectedPlane.id }
        : null;

  const dispatch = useCallback(
    (intent: SketchIntent, opts?: { coalesce?: boolean }) => {
      if (readOnly) return;
      roofDraftStore.update(jobId, (d) => applyIntent(d, intent), opts);
    },
    [jobId, readOnly],
  );

  // Measure the drawing area; the height follows the width (tablet portrait included).
  useEffect(() => {
    const el = canvasBox.current;
    if (!el || typeof ResizeObserver === "undefined") return;
    const ro = new ResizeObserver(() => {
      const width = Math.max(320, Math.floor(el.clientWidth));
      const height = Math.round(Math.min(680, Math.max(420, width * 0.68)));
      setSize((s) => (s.width === width && s.height === height ? s : { width, height }));
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, [mode]);

  const fit = useCallback(() => {
    setView(fitView(boundsOf(roofDraftStore.get(jobId)?.doc.planes.map((p) => p.outline) ?? []), size.width, size.height));
  }, [jobId, size.width, size.height]);

  // Until the user zooms or pans, keep the roof fitted to the measured size.
  useEffect(() => {
    if (!viewTouched.current) fit();
  }, [fit]);

  const changeView = useCallback((v: View) => {
    viewTouched.current = true;
    setView(v);
  }, []);

  const zoomBy = (f: number) => changeView(zoomAt(view, f, [size.width / 2, size.height / 2]));

  const closeDrawing = useCallback(() => {
    if (drawing.length < 3) {
      toast.info("A plane needs at least 3 corners.");
      return;
    }
    if (planArea(drawing) < 0.01) {
      toast.error("Those corners lie on one line, so the outline has no area. Add a corner off the line.");
      return;
    }
    if (selfCrosses(drawing)) {
      toast.error("That outline crosses itself. Move or remove a corner, then close it again.");
      return;
    }
    const pitch = Number(newPitch);
    const current = roofDraftStore.get(jobId)!.doc;
    const plane = planeFromOutline(current, drawing, Number.isFinite(pitch) && pitch >= 0 && pitch <= 24 ? pitch : 6);
    dispatch({ type: "addPlanes", planes: [plane] });
    setDrawing([]);
    setTool("select");
    setSelection({ kind: "plane", planeId: plane.id });
  }, [drawing, newPitch, jobId, dispatch]);

  const addQuickShape = (v: QuickShape): string | null => {
    const current = roofDraftStore.get(jobId)!.doc;
    let generated;
    try {
      generated = generateShape(v, newIdPrefix(current, v.shape === "l-shape" ? "ell" : v.shape));
    } catch (e) {
      return e instanceof Error ? e.message : "Those sizes don't make a roof";
    }
    const named = { ...current, planes: [...current.planes] };
    const added = generated.map((g) => {
      const p = { ...g, name: uniqueName(named, g.name), edgeTypes: {}, penetrations: [] };
      named.planes.push(p);
      return p;
    });
    dispatch({ type: "addPlanes", planes: added });
    setQuickOpen(false);
    setSelection(null);
    viewTouched.current = false;
    setView(fitView(boundsOf(named.planes.map((p) => p.outline)), size.width, size.height));
    return null;
  };

  const doSave = useCallback(async () => {
    if (readOnly || save.isPending) return;
    if (!roofDraftStore.get(jobId)?.doc.planes.length) {
      toast.info("Draw a roof plane before saving.");
      return;
    }
    try {
      await save.mutateAsync();
      setConflict(false);
      toast.success("Roof saved.");
    } catch (e) {
      if (e instanceof ApiError && e.status === 409) {
        setConflict(true);
        return;
      }
      toast.error(`Not saved: ${errorMessage(e)} Your drawing is kept in this browser.`);
    }
  }, [readOnly, save, jobId]);

  const reloadTheirs = async () => {
    try {
      const fresh = await qc.fetchQuery({ ...roofQueries.detail(jobId), staleTime: 0 });
      roofDraftStore.replaceWithServer({ ...fresh, jobId });
      setConflict(false);
      setSelection(null);
      toast.info("Loaded the roof as it was last saved.");
    } catch (e) {
      toast.error(errorMessage(e));
    }
  };

  const overwrite = async () => {
    try {
      const fresh = await qc.fetchQuery({ ...roofQueries.detail(jobId), staleTime: 0 });
      roofDraftStore.rebase(jobId, fresh.version);
      setConflict(false);
      await doSave();
    } catch (e) {
      toast.error(errorMessage(e));
    }
  };

  // ---- keyboard ----
  const lastNudge = useRef<{ key: string; at: number } | null>(null);
  const onKey = (e: KeyboardEvent) => {
    const mod = e.ctrlKey || e.metaKey;
    const key = e.key.length === 1 ? e.key.toLowerCase() : e.key;
    if (mod && key === "s") {
      e.preventDefault();
      if (readOnly) return;
      // a field being typed in commits on blur (synchronously), so the save includes it
      if (isField(document.activeElement)) (document.activeElement as HTMLElement).blur();
      void doSave();
      return;
    }
    if (isField(e.target) || helpOpen || quickOpen || document.querySelector('[role="dialog"]')) return;
    if (mod && key === "z") {
      e.preventDefault();
      if (readOnly) return;
      if (e.shiftKey) roofDraftStore.redo(jobId);
      else roofDraftStore.undo(jobId);
      return;
    }
    if (mod && key === "y") {
      e.preventDefault();
      if (!readOnly) roofDraftStore.redo(jobId);
      return;
    }
    if (mod || e.altKey) return;
    const sel = validSelection;
    switch (key) {
      case "?":
        setHelpOpen(true);
        break;
      case "v":
        setUnderlayMode(null);
        setTool("select");
        setDrawing([]);
        break;
      case "d":
        if (!readOnly) {
          setUnderlayMode(null);
          setTool("draw");
          setMode("drawing");
        }
        break;
      case "g":
        setSnapIdx((i) => (i + 1) % SNAP_STEPS.length);
        break;
      case "+":
      case "=":
        zoomBy(1.25);
        break;
      case "-":
      case "_":
        zoomBy(0.8);
        break;
      case "0":
        viewTouched.current = false;
        fit();
        break;
      case "Enter":
        if (tool === "draw" && drawing.length && !(e.target instanceof HTMLButtonElement)) {
          e.preventDefault();
          closeDrawing();
        }
        break;
      case "Escape":
        if (underlayMode) setUnderlayMode(null);
        else if (tool === "draw" && drawing.length) setDrawing([]);
        else if (tool === "draw") setTool("select");
        else setSelection(null);
        break;
      case "Backspace":
      case "Delete":
        if (tool === "draw" && drawing.length) {
          e.preventDefault();
          setDrawing((d) => d.slice(0, -1));
          break;
        }
        if (readOnly || !sel) break;
        e.preventDefault();
        if (sel.kind === "vertex") dispatch({ type: "deleteVertex", planeId: sel.planeId, index: sel.index });
        else {
          dispatch({ type: "deletePlane", planeId: sel.planeId });
          setSelection(null);
        }
        break;
      case "e":
        if (!readOnly && sel?.kind === "edge") dispatch({ type: "setEave", planeId: sel.planeId, edge: sel.edge });
        break;
      case "ArrowLeft":
      case "ArrowRight":
      case "ArrowUp":
      case "ArrowDown": {
        if (readOnly || sel?.kind !== "vertex" || !selectedPlane) break;
        e.preventDefault();
        const step = snapStep;
        const [dx, dy] = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, step], ArrowDown: [0, -step] }[key];
        const from = selectedPlane.outline[sel.index];
        const moves = planes.flatMap((pl) => pl.outline.flatMap((p, i) => (dist(p, from) <= 0.01 ? [{ planeId: pl.id, index: i }] : [])));
        const nudgeKey = `${sel.planeId}#${sel.index}`;
        const now = Date.now();
        const coalesce = lastNudge.current?.key === nudgeKey && now - lastNudge.current.at < 1500;
        lastNudge.current = { key: nudgeKey, at: now };
        dispatch({ type: "movePoints", moves, to: [from[0] + dx, from[1] + dy] }, { coalesce });
        break;
      }
    }
  };
  const onKeyRef = useRef(onKey);
  onKeyRef.current = onKey;
  useEffect(() => {
    const h = (e: KeyboardEvent) => onKeyRef.current(e);
    window.addEventListener("keydown", h);
    return () => window.removeEventListener("keydown", h);
  }, []);

  const onMovePoints = useCallback(
    (moves: { planeId: string; index: number }[], to: Pt, opts?: { coalesce?: boolean }) => dispatch({ type: "movePoints", moves, to }, opts),
    [dispatch],
  );
  const onDrawPoint = useCallback((p: Pt) => setDrawing((d) => [...d, p]), []);
  const onUnderlayPoint = useCallback((p: Pt) => setScalePoints((ps) => (ps.length >= 2 ? [p] : [...ps, p])), []);
  const onUnderlayMove = useCallback(
    (dx: number, dy: number) => {
      const u = roofDraftStore.get(jobId)?.doc.underlay;
      if (u && !readOnly) setDraftUnderlay(jobId, { ...u, ...moveUnderlay(u, dx, dy) });
    },
    [jobId, readOnly],
  );
  const canvasUnderlay = useMemo(
    () =>
      underlay?.visible
        ? { placement: underlay, opacity: underlay.opacity, image: underlayImage.status === "ready" ? underlayImage.image : null }
        : null,
    [underlay, underlayImage],
  );

  const refusedPlane = refusedPlaneId ? planes.find((p) => p.id === refusedPlaneId) ?? null : null;
  const summary = useMemo(
    () =>
      `${planes.length} roof ${planes.length === 1 ? "plane" : "planes"}${planes.length ? `: ${planes.map((p) => `${p.name || p.id} at ${p.pitch}/12`).join(", ")}` : ""}. Use the table view to edit by numbers.`,
    [planes],
  );

  const canUndo = draft.past.length > 0;
  const canRedo = draft.future.length > 0;

  return (
    <div className="space-y-3">
      {conflict && (
        <Alert tone="caution" title="Changed by someone else">
          <p>Someone saved this roof after you started editing. Your drawing is still here and kept in this browser.</p>
          <div className="mt-2 flex flex-wrap gap-2">
            <Button size="sm" variant="secondary" onClick={reloadTheirs}>
              Reload theirs (discard mine)
            </Button>
            <Button size="sm" variant="secondary" onClick={() => setConflict(false)}>
              Keep editing
            </Button>
            <Button size="sm" variant="secondary" onClick={overwrite}>
              Overwrite with mine
            </Button>
          </div>
        </Alert>
      )}

      <div role="toolbar" aria-label="Sketch tools" className="flex flex-wrap items-center gap-2 rounded-lg border border-steel-200 bg-white px-2 py-1.5 shadow-panel">
        {!readOnly && (
          <>
            <div className="flex rounded-md border border-steel-300 p-0.5" role="group" aria-label="Tool">
              <ToolButton active={tool === "select" && !underlayMode} onClick={() => (setUnderlayMode(null), setTool("select"), setDrawing([]))} title="Select (V)">
                Select
              </ToolButton>
              <ToolButton
                active={tool === "draw"}
                onClick={() => {
                  setUnderlayMode(null);
                  setTool("draw");
                  setMode("drawing");
                  setSelection(null);
                }}
                title="Draw a plane (D)"
              >
                Draw plane
              </ToolButton>
            </div>
            <Button variant="secondary" size="sm" onClick={() => setQuickOpen(true)}>
              Quick shape…
            </Button>
            <Button
              variant={underlayOpen ? "primary" : "secondary"}
              size="sm"
              aria-expanded={underlayOpen}
              aria-controls="sketch-underlay-panel"
              onClick={() => {
                setMode("drawing");
                setUnderlayOpen((o) => !o);
                if (underlayOpen) setUnderlayMode(null);
              }}
              title="Trace over a plan drawing"
            >
              Underlay
            </Button>
            <Sep />
            <Button variant="ghost" size="sm" onClick={() => roofDraftStore.undo(jobId)} disabled={!canUndo} title="Undo (Ctrl+Z)">
              Undo
            </Button>
            <Button variant="ghost" size="sm" onClick={() => roofDraftStore.redo(jobId)} disabled={!canRedo} title="Redo (Ctrl+Shift+Z)">
              Redo
            </Button>
            <Sep />
            <label className="flex items-center gap-1.5 text-xs text-steel-700">
              Snap
              <Select value={String(snapIdx)} onChange={(e) => setSnapIdx(Number(e.target.value))} className="w-20" aria-label="Snap to grid">
                {SNAP_STEPS.map((s, i) => (
                  <option key={s.label} value={i}>
                    {s.label}
                  </option>
                ))}
              </Select>
            </label>
          </>
        )}
        {mode === "drawing" && (
          <div className="flex items-center" role="group" aria-label="Zoom">
            <Button variant="ghost" size="sm" onClick={() => zoomBy(0.8)} aria-label="Zoom out" title="Zoom out (−)">
              −
            </Button>
            <Button variant="ghost" size="sm" onClick={() => ((viewTouched.current = false), fit())} title="Fit the roof (0)">
              Fit
            </Button>
            <Button variant="ghost" size="sm" onClick={() => zoomBy(1.25)} aria-label="Zoom in" title="Zoom in (+)">
              +
            </Button>
          </div>
        )}
        <Sep />
        <div className="flex rounded-md border border-steel-300 p-0.5" role="group" aria-label="View">
          <ToolButton active={mode === "drawing"} onClick={() => setMode("drawing")}>
            Drawing
          </ToolButton>
          <ToolButton
            active={mode === "table"}
            onClick={() => {
              setMode("table");
              setTool("select");
              setDrawing([]);
            }}
          >
            Table
          </ToolButton>
        </div>
        <Button variant="ghost" size="sm" onClick={() => setHelpOpen(true)} aria-label="Keyboard shortcuts" title="Keyboard shortcuts (?)">
          ?
        </Button>
        <div className="ml-auto flex items-center gap-2">
          {readOnly ? (
            <Badge tone="muted">Read only</Badge>
          ) : (
            <>
              <span aria-live="polite">
                {save.isPending ? (
                  <Badge tone="neutral">Saving…</Badge>
                ) : draft.dirty ? (
                  <Badge tone="accent">Unsaved changes</Badge>
                ) : draft.baseVersion === 0 ? (
                  <Badge tone="muted">Not saved yet</Badge>
                ) : (
                  <Badge tone="ok">Saved</Badge>
                )}
              </span>
              <Button
                size="sm"
                onClick={() => void doSave()}
                loading={save.isPending}
                disabled={planes.length === 0 || (!draft.dirty && draft.baseVersion > 0)}
                title={planes.length === 0 ? "Draw a plane first" : "Save (Ctrl+S)"}
              >
                Save
              </Button>
            </>
          )}
        </div>
      </div>

      {mode === "drawing" ? (
        <div className="grid items-start gap-3 lg:grid-cols-[minmax(0,1fr)_21rem]">
          <div ref={canvasBox} className="relative min-w-0 overflow-hidden rounded-lg border border-steel-200 bg-white shadow-panel">
          {underlayMode && !readOnly && (
            <div role="status" className="absolute left-2 right-12 top-2 rounded-md border border-accent-200 bg-accent-50/95 px-3 py-1.5 text-xs text-accent-900 shadow-sm">
              {underlayMode === "move"
                ? "Drag to move the plan underlay · Esc when done"
                : scalePoints.length < 2
                  ? `Setting the scale: click point ${scalePoints.length + 1} of 2 on the plan · Esc cancels`
                  : "Type the real distance between the two points in the Underlay panel"}
            </div>
          )}
          {tool === "draw" && !readOnly && (
            <div className="absolute left-2 right-12 top-2 flex flex-wrap items-center gap-x-3 gap-y-1 rounded-md border border-accent-200 bg-accent-50/95 px-3 py-1.5 text-xs text-accent-900 shadow-sm">
              <span>
                Click the corners · close on the first corner or <kbd className="font-semibold">Enter</kbd> · <kbd className="font-semibold">Esc</kbd> cancels ·{" "}
                <kbd className="font-semibold">Backspace</kbd> drops the last corner
              </span>
              <label className="flex items-center gap-1.5 text-xs">
                Pitch for new planes
                <span className="w-16">
                  <Input value={newPitch} onChange={(e) => setNewPitch(e.target.value)} inputMode="decimal" className="h-7" aria-label="Pitch for new planes (rise in 12)" />
                </span>
                /12
              </label>
              {drawing.length > 0 && (
                <span className="text-xs">
                  {drawing.length} {drawing.length === 1 ? "corner" : "corners"}
                  {drawing.length >= 3 && (
                    <button type="button" className="ml-2 font-medium underline" onClick={closeDrawing}>
                      Close outline
                    </button>
                  )}
                </span>
              )}
            </div>
          )}
            <PlanCanvas
              planes={planes}
              result={result}
              view={view}
              onViewChange={changeView}
              width={size.width}
              height={size.height}
              tool={readOnly ? "select" : tool}
              snapStep={snapStep}
              selection={validSelection}
              onSelect={setSelection}
              drawing={drawing}
              onDrawPoint={onDrawPoint}
              onCloseDrawing={closeDrawing}
              onMovePoints={onMovePoints}
              liveDrag={planes.length <= LIVE_DRAG_MAX_PLANES}
              refusedPlaneId={refusedPlaneId}
              readOnly={readOnly}
              summary={summary}
              underlay={canvasUnderlay}
              underlayMode={readOnly ? null : underlayMode}
              scalePoints={scalePoints}
              onUnderlayPoint={onUnderlayPoint}
              onUnderlayMove={onUnderlayMove}
            />
          </div>
          <aside className="space-y-3" aria-label="Plane details and totals">
            {underlayOpen && !readOnly && (
              <div id="sketch-underlay-panel" className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel">
                <UnderlayPanel
                  jobId={jobId}
                  underlay={underlay}
                  image={underlayImage}
                  view={view}
                  canvas={size}
                  mode={underlayMode}
                  onMode={setUnderlayMode}
                  scalePoints={scalePoints}
                  onClearScalePoints={() => setScalePoints([])}
                  onClose={() => {
                    setUnderlayOpen(false);
                    setUnderlayMode(null);
                  }}
                />
              </div>
            )}
            <div className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel">
              {validSelection && selectedPlane ? (
                <PlaneInspector
                  key={selectedPlane.id}
                  plane={selectedPlane}
                  planeResult={result?.planes.find((p) => p.id === selectedPlane.id) ?? null}
                  stacks={doc.stacks}
                  defaultStackId={doc.defaultStackId}
                  selection={validSelection}
                  onSelect={setSelection}
                  dispatch={dispatch}
                  readOnly={readOnly}
                />
              ) : (
                <NothingSelected count={planes.length} readOnly={readOnly} onQuick={() => setQuickOpen(true)} onDraw={() => setTool("draw")} />
              )}
            </div>
            <div className="rounded-lg border border-steel-200 bg-white p-3 shadow-panel">
              <TotalsPanel
                preview={preview}
                pending={pending}
                refusedPlaneName={refusedPlane ? refusedPlane.name || refusedPlane.id : null}
                onShowRefused={refusedPlane ? () => setSelection({ kind: "plane", planeId: refusedPlane.id }) : null}
                note={canReadRules ? null : "Computed with the standard rules (the price book's rules are for owners and estimators)."}
              />
            </div>
          </aside>
        </div>
      ) : (
        <div className="space-y-3">
          <PlaneTable
            planes={planes}
            stacks={doc.stacks}
            defaultStackId={doc.defaultStackId}
            result={result}
            refusedPlaneId={refusedPlaneId}
            selectedId={validSelection?.planeId ?? null}
            onSelect={(id) => {
              setSelection({ kind: "plane", planeId: id });
              setMode("drawing");
            }}
            dispatch={dispatch}
            readOnly={readOnly}
          />
          <div className="max-w-xl rounded-lg border border-steel-200 bg-white p-3 shadow-panel">
            <TotalsPanel
              preview={preview}
              pending={pending}
              refusedPlaneName={refusedPlane ? refusedPlane.name || refusedPlane.id : null}
              onShowRefused={null}
              note={null}
            />
          </div>
        </div>
      )}

      <HelpDialog open={helpOpen} onClose={() => setHelpOpen(false)} />
      <Dialog open={quickOpen} onClose={() => setQuickOpen(false)} title="Add a quick shape" description="Planes on a rectangle, placed by its lower-left (south-west) corner." className="max-w-xl">
        <QuickShapeForm onAdd={addQuickShape} onCancel={() => setQuickOpen(false)} />
      </Dialog>
    </div>
  );
}

function ToolButton({ active, children, onClick, title }: { active: boolean; children: React.ReactNode; onClick: () => void; title?: string }) {
  return (
    <button
      type="button"
      aria-pressed={active}
      title={title}
      onClick={onClick}
      className={cn(
        "h-7 rounded px-2.5 text-xs font-medium transition-colors focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500",
        active ? "bg-steel-800 text-white" : "text-steel-700 hover:bg-steel-100",
      )}
    >
      {children}
    </button>
  );
}

const Sep = () => <span className="mx-0.5 hidden h-5 w-px bg-steel-200 sm:block" aria-hidden="true" />;

function NothingSelected({ count, readOnly, onQuick, onDraw }: { count: number; readOnly: boolean; onQuick: () => void; onDraw: () => void }) {
  if (readOnly)
    return <p className="text-sm text-steel-600">{count ? "Click a plane to see its pitch, eave, corners and edges." : "No roof has been drawn for this job yet."}</p>;
  if (!count)
    return (
      <div className="space-y-2 text-sm text-steel-700">
        <h2 className="text-sm font-semibold text-steel-900">Start the roof</h2>
        <p>Add a gable, hip or shed from a rectangle, or outline a plane corner by corner.</p>
        <div className="flex gap-2">
          <Button size="sm" onClick={onQuick}>
            Quick shape…
          </Button>
          <Button size="sm" variant="secondary" onClick={onDraw}>
            Draw a plane
          </Button>
        </div>
      </div>
    );
  return (
    <div className="space-y-1 text-sm text-steel-700">
      <h2 className="text-sm font-semibold text-steel-900">Nothing selected</h2>
      <p>Click a plane to set its pitch, eave and layer stack; click an edge to type it or set its length; drag a corner to move it.</p>
      <p className="text-xs text-steel-500">Press ? for the keyboard shortcuts.</p>
    </div>
  );
}
