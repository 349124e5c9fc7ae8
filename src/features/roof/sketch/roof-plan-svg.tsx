/**
 * The plan-view drawing: grid, planes, typed edges, labels, the outline being drawn, vertex handles,
 * scale bar. Everything is placed with the one `toView` transform (feet → px, y flipped).
 *
 * Speed: planes are memoised components; a vertex drag and a pan live in this component's local state
 * (only the dragged planes re-render per pointer move) and reach the draft once, on pointer up.
 */
import { memo, useCallback, useEffect, useMemo, useRef, useState, type PointerEvent as ReactPointerEvent } from "react";
import type { EdgeType } from "@shared/engine/roof/edge-types";
import type { TakeoffResult } from "@shared/engine/types";
import type { DraftPlane } from "@/features/roof/api/roof-draft";
import { EDGE_STYLES, StyledSegment, UNTYPED_STYLE, type EdgeStyle } from "./edge-styles";
import {
  dist,
  feetInches,
  fromView,
  labelPoint,
  signedArea,
  slopedAreaOf,
  snapPoint,
  toView,
  zoomAt,
  type Pt,
  type View,
} from "./geometry";
import type { Selection, Tool } from "./types";
import { underlayMatrix, type ImageSize, type Placement } from "./underlay-math";

/** Pointer within this many px of a corner snaps to it. */
export const VERTEX_SNAP_PX = 10;

type Move = { planeId: string; index: number };

interface Props {
  planes: DraftPlane[];
  result: TakeoffResult | null;
  view: View;
  onViewChange: (v: View) => void;
  width: number;
  height: number;
  tool: Tool;
  snapStep: number;
  selection: Selection;
  onSelect: (s: Selection) => void;
  drawing: Pt[];
  onDrawPoint: (p: Pt) => void;
  onCloseDrawing: () => void;
  /** Commits moved corners to the draft; `coalesce` joins the previous undo step (later frames of one drag). */
  onMovePoints: (moves: Move[], to: Pt, opts?: { coalesce?: boolean }) => void;
  /**
   * Small roofs: commit the drag once per animation frame (one undo step, coalesced) so the live totals
   * follow it. Large roofs commit on release only; the preview engine is too slow to run per frame.
   */
  liveDrag: boolean;
  refusedPlaneId: string | null;
  readOnly: boolean;
  /** Shown to screen readers as the drawing's description. */
  summary: string;
  /** The plan image under the grid: its placement and the loaded picture (null while it loads). */
  underlay?: { placement: Placement; opacity: number; image: (ImageSize & { url: string }) | null } | null;
  /** "move": a drag moves the underlay; "scale": clicks pick the two points of a known distance. */
  underlayMode?: "move" | "scale" | null;
  /** The scale points clicked so far (plan feet, as the underlay is placed now). */
  scalePoints?: Pt[];
  onUnderlayPoint?: (p: Pt) => void;
  /** Commits an underlay drag: plan feet east and north. */
  onUnderlayMove?: (dxFt: number, dyFt: number) => void;
}

type Drag = { moves: Move[]; from: Pt; to: Pt; pointerId: number; moved: boolean };
type Pan = { start: Pt; dx: number; dy: number; pointerId: number; clearOnClick: boolean };

const pitchText = (p: number) => `${Math.round(p * 100) / 100}/12`;
const areaText = (n: number) => `${Math.round(n).toLocaleString("en-US")} sq ft`;

function niceStep(minFt: number): number {
  for (const s of [1, 2, 5, 10, 20, 25, 50, 100, 200, 500, 1000]) if (s >= minFt) return s;
  return 1000;
}

export function PlanCanvas(props: Props) {
  const {
    planes,
    result,
    view,
    onViewChange,
    width,
    height,
    tool,
    snapStep,
    selection,
    onSelect,
    drawing,
    onDrawPoint,
    onCloseDrawing,
    onMovePoints,
    refusedPlaneId,
    readOnly,
    summary,
    liveDrag,
    underlay = null,
    underlayMode = null,
    scalePoints = [],
    onUnderlayPoint,
    onUnderlayMove,
  } = props;
  const svgRef = useRef<SVGSVGElement>(null);
  const [hover, setHover] = useState<Pt | null>(null);
  const [drag, setDrag] = useState<Drag | null>(null);
  const [pan, setPan] = useState<Pan | null>(null);
  const [moveDrag, setMoveDrag] = useState<Pan | null>(null);
  const spaceDown = useRef(false);
  /** Live drag: the frame scheduled, the last point committed, whether this drag committed yet. */
  const live = useRef<{ frame: number | null; committed: Pt | null }>({ frame: null, committed: null });
  useEffect(() => () => {
    if (live.current.frame !== null) cancelAnimationFrame(live.current.frame);
  }, []);
  const viewRef = useRef(view);
  viewRef.current = view;

  // Space held: drag anywhere pans.
  useEffect(() => {
    const isField = (t: EventTarget | null) => t instanceof HTMLElement && /^(INPUT|SELECT|TEXTAREA)$/.test(t.tagName);
    const down = (e: KeyboardEvent) => {
      if (e.code !== "Space" || isField(e.target) || e.target instanceof HTMLButtonElement) return;
      spaceDown.current = true;
      e.preventDefault(); // no page scroll while Space pans
    };
    const up = (e: KeyboardEvent) => {
      if (e.code === "Space") spaceDown.current = false;
    };
    window.addEventListener("keydown", down);
    window.addEventListener("keyup", up);
    return () => {
      window.removeEventListener("keydown", down);
      window.removeEventListener("keyup", up);
    };
  }, []);

  // Wheel zoom around the pointer (a native listener: React's wheel listener is passive).
  useEffect(() => {
    const svg = svgRef.current;
    if (!svg) return;
    const onWheel = (e: WheelEvent) => {
      e.preventDefault();
      const rect = svg.getBoundingClientRect();
      const at: Pt = [((e.clientX - rect.left) * width) / (rect.width || width), ((e.clientY - rect.top) * height) / (rect.height || height)];
      onViewChange(zoomAt(viewRef.current, Math.exp(-e.deltaY * 0.0015), at));
    };
    svg.addEventListener("wheel", onWheel, { passive: false });
    return () => svg.removeEventListener("wheel", onWheel);
  }, [width, height, onViewChange]);

  /** Pointer position in viewport px. */
  const localPx = useCallback(
    (e: { clientX: number; clientY: number }): Pt => {
      const rect = svgRef.current!.getBoundingClientRect();
      return [((e.clientX - rect.left) * width) / (rect.width || width), ((e.clientY - rect.top) * height) / (rect.height || height)];
    },
    [width, height],
  );

  /** Snap: a nearby corner first (of any plane or the outline being drawn), else the grid. */
  const snap = useCallback(
    (px: Pt, exclude?: Move[]): Pt => {
      let best: Pt | null = null;
      let bestD = VERTEX_SNAP_PX;
      const skip = new Set(exclude?.map((m) => `${m.planeId}#${m.index}`));
      const consider = (p: readonly [number, number]) => {
        const d = dist(toView(view, p), px);
        if (d <= bestD) {
          bestD = d;
          best = [p[0], p[1]];
        }
      };
      for (const pl of planes) pl.outline.forEach((p, i) => !skip.has(`${pl.id}#${i}`) && consider(p));
      drawing.forEach(consider);
      return best ?? snapPoint(fromView(view, px), snapStep);
    },
    [planes, drawing, view, snapStep],
  );

  /** Shift while drawing: keep the new edge level or plumb on the plan (east–west or north–south). */
  const constrain = (p: Pt, shift: boolean): Pt => {
    const last = drawing[drawing.length - 1];
    if (!shift || !last) return p;
    return Math.abs(p[0] - last[0]) >= Math.abs(p[1] - last[1]) ? [p[0], last[1]] : [last[0], p[1]];
  };

  const onPointerDown = (e: ReactPointerEvent<SVGSVGElement>) => {
    if (e.button !== 0 && e.button !== 1) return;
    const px = localPx(e);
    const target = (e.target as Element).closest?.("[data-hit]") as SVGElement | null;
    const hit = target?.dataset ?? {};
    const capture = () => svgRef.current?.setPointerCapture?.(e.pointerId);
    const startPan = (clearOnClick: boolean) => {
      capture();
      setPan({ start: px, dx: 0, dy: 0, pointerId: e.pointerId, clearOnClick });
    };
    if (e.button === 1 || spaceDown.current) {
      e.preventDefault();
      return startPan(false);
    }
    if (underlayMode === "scale" && !readOnly) return onUnderlayPoint?.(fromView(view, px));
    if (underlayMode === "move" && !readOnly) {
      capture();
      setMoveDrag({ start: px, dx: 0, dy: 0, pointerId: e.pointerId, clearOnClick: false });
      return;
    }
    if (tool === "draw" && !readOnly) {
      const p = constrain(snap(px), e.shiftKey);
      if (drawing.length >= 3 && dist(toView(view, drawing[0]), toView(view, p)) <= VERTEX_SNAP_PX) return onCloseDrawing();
      const last = drawing[drawing.length - 1];
      if (last && last[0] === p[0] && last[1] === p[1]) return;
      return onDrawPoint(p);
    }
    const planeId = hit.planeId;
    if (hit.hit === "vertex" && planeId) {
      const index = Number(hit.index);
      onSelect({ kind: "vertex", planeId, index });
      if (readOnly) return;
      const plane = planes.find((p) => p.id === planeId);
      if (!plane) return;
      const origin = plane.outline[index] as Pt;
      // corners of other planes at the same point move with it (hold Alt to move this one alone)
      const moves: Move[] = e.altKey
        ? [{ planeId, index }]
        : planes.flatMap((pl) => pl.outline.flatMap((p, i) => (dist(p, origin) <= 0.01 ? [{ planeId: pl.id, index: i }] : [])));
      capture();
      setDrag({ moves, from: origin, to: origin, pointerId: e.pointerId, moved: false });
      return;
    }
    if (hit.hit === "edge" && planeId) return onSelect({ kind: "edge", planeId, edge: Number(hit.index) });
    if (hit.hit === "plane" && planeId) return onSelect({ kind: "plane", planeId });
    startPan(true);
  };

  const onPointerMove = (e: ReactPointerEvent<SVGSVGElement>) => {
    const px = localPx(e);
    if (drag && e.pointerId === drag.pointerId) {
      const to = snap(px, drag.moves);
      if (to[0] !== drag.to[0] || to[1] !== drag.to[1]) {
        setDrag({ ...drag, to, moved: true });
        if (liveDrag && typeof requestAnimationFrame === "function") {
          if (live.current.frame !== null) cancelAnimationFrame(live.current.frame);
          live.current.frame = requestAnimationFrame(() => {
            live.current.frame = null;
            onMovePoints(drag.moves, to, { coalesce: live.current.committed !== null });
            live.current.committed = to;
          });
        }
      }
      return;
    }
    if (pan && e.pointerId === pan.pointerId) {
      setPan({ ...pan, dx: px[0] - pan.start[0], dy: px[1] - pan.start[1] });
      return;
    }
    if (moveDrag && e.pointerId === moveDrag.pointerId) {
      setMoveDrag({ ...moveDrag, dx: px[0] - moveDrag.start[0], dy: px[1] - moveDrag.start[1] });
      return;
    }
    if (underlayMode === "scale" && !readOnly) {
      setHover(fromView(view, px));
      return;
    }
    if (tool === "draw" && !readOnly) {
      const p = constrain(snap(px), e.shiftKey);
      if (!hover || hover[0] !== p[0] || hover[1] !== p[1]) setHover(p);
    } else if (hover) setHover(null);
  };

  const endGesture = (e: ReactPointerEvent<SVGSVGElement>, cancelled = false) => {
    if (moveDrag && e.pointerId === moveDrag.pointerId) {
      setMoveDrag(null);
      if (!cancelled && (moveDrag.dx || moveDrag.dy)) onUnderlayMove?.(moveDrag.dx / view.scale, -moveDrag.dy / view.scale);
    }
    if (drag && e.pointerId === drag.pointerId) {
      setDrag(null);
      if (live.current.frame !== null) cancelAnimationFrame(live.current.frame);
      const { committed } = live.current;
      live.current = { frame: null, committed: null };
      const coalesce = committed !== null;
      const target = cancelled ? drag.from : drag.to;
      const last = committed ?? drag.from;
      // one undo step for the whole drag: later commits join the first
      if (drag.moved && (target[0] !== last[0] || target[1] !== last[1])) onMovePoints(drag.moves, target, { coalesce });
    }
    if (pan && e.pointerId === pan.pointerId) {
      setPan(null);
      const moved = Math.hypot(pan.dx, pan.dy) > 3;
      if (moved && !cancelled) onViewChange({ ...view, ox: view.ox + pan.dx, oy: view.oy + pan.dy });
      else if (!moved && pan.clearOnClick) onSelect(null);
    }
  };

  // Outlines being dragged, per plane.
  const dragged = useMemo(() => {
    if (!drag) return null;
    const m = new Map<string, Pt[]>();
    for (const mv of drag.moves) {
      const plane = planes.find((p) => p.id === mv.planeId);
      if (!plane) continue;
      const outline = m.get(mv.planeId) ?? plane.outline.map((p) => [p[0], p[1]] as Pt);
      outline[mv.index] = drag.to;
      m.set(mv.planeId, outline);
    }
    return m;
  }, [drag, planes]);

  const selectedId = selection?.planeId ?? null;
  // the selected plane last, so its edges and corners are on top
  const ordered = useMemo(() => {
    if (!selectedId) return planes;
    const sel = planes.find((p) => p.id === selectedId);
    return sel ? [...planes.filter((p) => p.id !== selectedId), sel] : planes;
  }, [planes, selectedId]);

  const contentTransform = pan ? `translate(${pan.dx} ${pan.dy})` : undefined;
  const liveView = pan ? { ...view, ox: view.ox + pan.dx, oy: view.oy + pan.dy } : view;
  // stable for the whole drag, so the typed edges (memoised) do not re-render per pointer move
  const draggedKey = dragged ? [...dragged.keys()].join("|") : "";
  const draggedIds = useMemo(() => (draggedKey ? new Set(draggedKey.split("|")) : null), [draggedKey]);

  const cursor = pan || moveDrag
    ? "grabbing"
    : underlayMode === "move" && !readOnly
      ? "move"
      : (tool === "draw" || underlayMode === "scale") && !readOnly
        ? "crosshair"
        : drag
          ? "grabbing"
          : "default";
  // the underlay follows a pan like the grid, and a move drag on its own
  const underlayView = moveDrag ? { ...liveView, ox: liveView.ox + moveDrag.dx, oy: liveView.oy + moveDrag.dy } : liveView;

  return (
    <svg
      ref={svgRef}
      role="application"
      aria-label="Roof plan drawing"
      aria-roledescription="plan drawing"
      aria-describedby="roof-plan-summary"
      data-testid="roof-plan"
      width={width}
      height={height}
      viewBox={`0 0 ${width} ${height}`}
      tabIndex={0}
      className="block select-none bg-white outline-none focus-visible:ring-2 focus-visible:ring-inset focus-visible:ring-accent-500"
      style={{ touchAction: "none", cursor }}
      onPointerDown={onPointerDown}
      onPointerMove={onPointerMove}
      onPointerUp={(e) => endGesture(e)}
      onPointerCancel={(e) => endGesture(e, true)}
      onPointerLeave={() => setHover(null)}
    >
      <desc id="roof-plan-summary">{summary}</desc>
      {underlay && <UnderlayLayer underlay={underlay} view={underlayView} />}
      <Grid view={liveView} width={width} height={height} />
      <rect data-hit="background" x={0} y={0} width={width} height={height} fill="transparent" />
      <g transform={contentTransform}>
        {ordered.map((p) => (
          <PlaneBody
            key={p.id}
            plane={p}
            outline={dragged?.get(p.id)}
            view={view}
            selected={p.id === selectedId}
            refused={p.id === refusedPlaneId}
          />
        ))}
        <SelectionHalo plane={planes.find((p) => p.id === selectedId)} outline={selectedId ? dragged?.get(selectedId) : undefined} view={view} />
        <EdgesLayer planes={planes} result={result} view={view} hiddenPlanes={draggedIds} />
        {dragged &&
          [...dragged].map(([id, outline]) => <DraggedEdges key={id} outline={outline} view={view} />)}
        {ordered.map((p) => (
          <PlaneLabel key={p.id} plane={p} outline={dragged?.get(p.id)} view={view} selected={p.id === selectedId} />
        ))}
        <SelectionLayer
          planes={planes}
          selection={selection}
          view={view}
          dragged={dragged}
          readOnly={readOnly}
          tool={tool}
        />
        {tool === "draw" && <DrawingLayer drawing={drawing} hover={hover} view={view} />}
        {underlayMode === "scale" && <ScalePointsLayer points={scalePoints} hover={hover} view={view} />}
      </g>
      <ScaleBar view={liveView} height={height} />
      <g aria-hidden="true" transform={`translate(${width - 28} 30)`}>
        <path d="M0 -14 L6 4 L0 0 L-6 4 Z" fill="#4a515a" />
        <text y={18} textAnchor="middle" fontSize={11} fontWeight={600} fill="#4a515a">
          N
        </text>
      </g>
      {hover && tool === "draw" && (
        <text x={width - 10} y={height - 12} textAnchor="end" fontSize={11} fill="#4a515a" aria-hidden="true">
          x {feetInches(hover[0])} · y {feetInches(hover[1])}
        </text>
      )}
    </svg>
  );
}

/** The plan image, under the grid; it never takes the pointer. */
function UnderlayLayer({ underlay, view }: { underlay: NonNullable<Props["underlay"]>; view: View }) {
  const { image, placement, opacity } = underlay;
  if (!image) return null;
  const m = underlayMatrix(view, placement, image);
  return (
    <image
      data-testid="underlay-image"
      href={image.url}
      x={0}
      y={0}
      width={image.width}
      height={image.height}
      preserveAspectRatio="none"
      transform={`matrix(${m.join(" ")})`}
      opacity={opacity}
      pointerEvents="none"
      aria-hidden="true"
    />
  );
}

/** The points picked to set the underlay's scale, and the line to the pointer while picking the second. */
function ScalePointsLayer({ points, hover, view }: { points: Pt[]; hover: Pt | null; view: View }) {
  const pts = points.map((p) => toView(view, p));
  const h = hover && points.length === 1 ? toView(view, hover) : null;
  const mark = (p: Pt, i: number) => (
    <g key={i}>
      <circle cx={p[0]} cy={p[1]} r={6} fill="none" stroke="#7a3b1f" strokeWidth={1.5} />
      <path d={`M ${p[0] - 10} ${p[1]} h 20 M ${p[0]} ${p[1] - 10} v 20`} stroke="#7a3b1f" strokeWidth={1} />
      <text x={p[0] + 9} y={p[1] - 9} fontSize={11} fontWeight={600} fill="#7a3b1f" stroke="white" strokeWidth={3} paintOrder="stroke">
        {i + 1}
      </text>
    </g>
  );
  return (
    <g pointerEvents="none" data-testid="scale-points">
      {pts.length === 2 && <line x1={pts[0][0]} y1={pts[0][1]} x2={pts[1][0]} y2={pts[1][1]} stroke="#7a3b1f" strokeWidth={2} />}
      {h && pts[0] && <line x1={pts[0][0]} y1={pts[0][1]} x2={h[0]} y2={h[1]} stroke="#7a3b1f" strokeWidth={1.5} strokeDasharray="5 4" />}
      {pts.map(mark)}
    </g>
  );
}

function Grid({ view, width, height }: { view: View; width: number; height: number }) {
  const minor = niceStep(12 / view.scale);
  const major = minor * (minor === 25 ? 4 : 5);
  const minorPx = minor * view.scale;
  const majorPx = major * view.scale;
  const mod = (a: number, m: number) => ((a % m) + m) % m;
  return (
    <g aria-hidden="true" pointerEvents="none">
      <defs>
        <pattern id="rw-grid-minor" width={minorPx} height={minorPx} patternUnits="userSpaceOnUse" x={mod(view.ox, minorPx)} y={mod(view.oy, minorPx)}>
          <path d={`M ${minorPx} 0 L 0 0 0 ${minorPx}`} fill="none" stroke="#eceef0" strokeWidth={1} />
        </pattern>
        <pattern id="rw-grid-major" width={majorPx} height={majorPx} patternUnits="userSpaceOnUse" x={mod(view.ox, majorPx)} y={mod(view.oy, majorPx)}>
          <rect width={majorPx} height={majorPx} fill="url(#rw-grid-minor)" />
          <path d={`M ${majorPx} 0 L 0 0 0 ${majorPx}`} fill="none" stroke="#d9dde1" strokeWidth={1} />
        </pattern>
      </defs>
      <rect width={width} height={height} fill="url(#rw-grid-major)" />
      {/* plan origin */}
      <path d={`M ${view.ox - 6} ${view.oy} h 12 M ${view.ox} ${view.oy - 6} v 12`} stroke="#939ba5" strokeWidth={1} />
    </g>
  );
}

function ScaleBar({ view, height }: { view: View; height: number }) {
  const ft = niceStep(90 / view.scale);
  const px = ft * view.scale;
  const x = 16;
  const y = height - 18;
  return (
    <g aria-label={`Scale: the bar is ${ft} feet`} role="img" pointerEvents="none">
      <rect x={x - 6} y={y - 20} width={px + 44} height={30} rx={4} fill="white" opacity={0.85} />
      <rect x={x} y={y - 4} width={px / 2} height={5} fill="#3d434b" />
      <rect x={x + px / 2} y={y - 4} width={px / 2} height={5} fill="white" stroke="#3d434b" strokeWidth={1} />
      <text x={x} y={y - 8} fontSize={10} fill="#3d434b">
        0
      </text>
      <text x={x + px} y={y - 8} fontSize={10} fill="#3d434b" textAnchor="middle">
        {ft} ft
      </text>
    </g>
  );
}

const PlaneBody = memo(function PlaneBody({
  plane,
  outline,
  view,
  selected,
  refused,
}: {
  plane: DraftPlane;
  outline?: Pt[];
  view: View;
  selected: boolean;
  refused: boolean;
}) {
  const pts = (outline ?? plane.outline).map((p) => toView(view, p));
  const d = `M ${pts.map((p) => `${p[0]} ${p[1]}`).join(" L ")} Z`;
  return (
    <g>
      <path
        d={d}
        data-hit="plane"
        data-plane-id={plane.id}
        fill={refused ? "#fdf3f2" : selected ? "#f5e3d6" : "#eef1f4"}
        fillOpacity={selected ? 0.9 : 0.8}
        stroke={refused ? "#b42318" : "#bcc2c9"}
        strokeWidth={refused ? 2 : 1}
        strokeDasharray={refused ? "6 4" : undefined}
      >
        <title>{plane.name || plane.id}</title>
      </path>
      {pts.map((a, i) => {
        const b = pts[(i + 1) % pts.length];
        return (
          <line
            key={i}
            data-hit="edge"
            data-plane-id={plane.id}
            data-index={i}
            x1={a[0]}
            y1={a[1]}
            x2={b[0]}
            y2={b[1]}
            stroke="transparent"
            strokeWidth={12}
            strokeLinecap="round"
            style={{ cursor: "pointer" }}
          />
        );
      })}
    </g>
  );
});

interface DrawnEdge {
  key: string;
  a: Pt;
  b: Pt;
  type: EdgeType | null;
  lengthFt: number;
  /** Screen-space unit normal toward the owning plane's inside. */
  inward: Pt;
}

/** Inward normal of edge a→b (plan) in screen space. */
function inwardScreen(a: readonly [number, number], b: readonly [number, number], ccw: boolean): Pt {
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]) || 1;
  // left of a→b in plan is the inside for counter-clockwise outlines
  const nx = (-(b[1] - a[1]) / len) * (ccw ? 1 : -1);
  const ny = ((b[0] - a[0]) / len) * (ccw ? 1 : -1);
  return [nx, -ny]; // y flipped on screen
}

/** The typed edges: from the engine's result (shared pieces drawn once), else the raw outlines. */
const EdgesLayer = memo(function EdgesLayer({
  planes,
  result,
  view,
  hiddenPlanes,
}: {
  planes: DraftPlane[];
  result: TakeoffResult | null;
  view: View;
  hiddenPlanes: Set<string> | null;
}) {
  const edges = useMemo(() => {
    const out: DrawnEdge[] = [];
    const current = new Map(planes.map((p) => [p.id, p]));
    const seen = new Set<string>();
    const k = (p: readonly [number, number]) => `${Math.round(p[0] * 100)},${Math.round(p[1] * 100)}`;
    const covered = new Set<string>();
    if (result) {
      for (const rp of result.planes) {
        const plane = current.get(rp.id);
        if (!plane) continue;
        covered.add(rp.id);
        const ccw = signedArea(plane.outline) > 0;
        for (const e of rp.edges) {
          const key = [k(e.from), k(e.to)].sort().join("|");
          if (seen.has(key)) continue;
          seen.add(key);
          out.push({ key: `${rp.id}:${e.index}:${e.part}`, a: e.from, b: e.to, type: e.type, lengthFt: e.trueLengthFt, inward: inwardScreen(e.from, e.to, ccw) });
        }
      }
    }
    for (const plane of planes) {
      if (covered.has(plane.id)) continue;
      const ccw = signedArea(plane.outline) > 0;
      plane.outline.forEach((a, i) => {
        const b = plane.outline[(i + 1) % plane.outline.length];
        const key = [k(a), k(b)].sort().join("|");
        if (seen.has(key)) return;
        seen.add(key);
        out.push({
          key: `${plane.id}:${i}:raw`,
          a: [a[0], a[1]],
          b: [b[0], b[1]],
          type: (plane.edgeTypes?.[String(i)] as EdgeType | undefined) ?? null,
          lengthFt: dist(a, b),
          inward: inwardScreen(a, b, ccw),
        });
      });
    }
    return { out, ownerOf: (key: string) => key.split(":")[0] };
  }, [planes, result]);

  return (
    <g pointerEvents="none">
      {edges.out.map((e) => {
        if (hiddenPlanes?.has(edges.ownerOf(e.key))) return null;
        const style: EdgeStyle = e.type ? EDGE_STYLES[e.type] : UNTYPED_STYLE;
        const a = toView(view, e.a);
        const b = toView(view, e.b);
        return <StyledSegment key={e.key} a={a} b={b} style={style} />;
      })}
      {/* lengths only when the plan is large enough to read them (below 5 px/ft they pile up) */}
      {view.scale >= 5 &&
        edges.out.map((e) => {
        if (hiddenPlanes?.has(edges.ownerOf(e.key))) return null;
        const a = toView(view, e.a);
        const b = toView(view, e.b);
        return <EdgeLabel key={`l-${e.key}`} a={a} b={b} inward={e.inward} text={`${e.type ? EDGE_STYLES[e.type].short + " " : ""}${feetInches(e.lengthFt)}`} />;
        })}
    </g>
  );
});

function EdgeLabel({ a, b, inward, text }: { a: Pt; b: Pt; inward: Pt; text: string }) {
  const len = dist(a, b);
  if (len < Math.max(64, text.length * 6.2 + 8)) return null; // only where the label fits along the edge
  let angle = (Math.atan2(b[1] - a[1], b[0] - a[0]) * 180) / Math.PI;
  if (angle > 90) angle -= 180;
  if (angle < -90) angle += 180;
  const mx = (a[0] + b[0]) / 2 + inward[0] * 11;
  const my = (a[1] + b[1]) / 2 + inward[1] * 11;
  return (
    <text
      x={mx}
      y={my}
      transform={`rotate(${angle} ${mx} ${my})`}
      textAnchor="middle"
      dominantBaseline="central"
      fontSize={10.5}
      fill="#2b3036"
      stroke="white"
      strokeWidth={3}
      paintOrder="stroke"
      strokeLinejoin="round"
    >
      {text}
    </text>
  );
}

/** While dragging: the moving planes' outlines with live lengths (typed again on release). */
function DraggedEdges({ outline, view }: { outline: Pt[]; view: View }) {
  const ccw = signedArea(outline) > 0;
  return (
    <g pointerEvents="none">
      {outline.map((p, i) => {
        const q = outline[(i + 1) % outline.length];
        const a = toView(view, p);
        const b = toView(view, q);
        return (
          <g key={i}>
            <line x1={a[0]} y1={a[1]} x2={b[0]} y2={b[1]} stroke="#7a3b1f" strokeWidth={1.5} />
            <EdgeLabel a={a} b={b} inward={inwardScreen(p, q, ccw)} text={feetInches(dist(p, q))} />
          </g>
        );
      })}
    </g>
  );
}

const PlaneLabel = memo(function PlaneLabel({
  plane,
  outline,
  view,
  selected,
}: {
  plane: DraftPlane;
  outline?: Pt[];
  view: View;
  selected: boolean;
}) {
  const o = outline ?? (plane.outline as Pt[]);
  const spot = useMemo(() => labelPoint(o), [o]);
  const c = toView(view, spot.at);
  const room = spot.clearance * view.scale * 2; // px across the label's free circle
  const area = slopedAreaOf(o, plane.pitch);
  const n = plane.penetrations?.length ?? 0;
  const name = plane.name || plane.id;
  const detail = `${pitchText(plane.pitch)} · ${areaText(area)}${n ? ` · ${n} ${n === 1 ? "penetration" : "penetrations"}` : ""}`;
  // rough text widths (px) at 12 px and 11 px Inter
  const showName = name.length * 6.8 < room * 1.05 && room > 34;
  const showDetail = detail.length * 5.9 < room * 1.15;
  // uphill arrow: perpendicular to the eave, toward the inside
  const e = plane.eaveEdge < o.length ? plane.eaveEdge : 0;
  const up = inwardScreen(o[e], o[(e + 1) % o.length], signedArea(o) > 0);
  const lines = (showName ? 1 : 0) + 1;
  const top = c[1] - (lines === 2 ? 6 : -4);
  const ay = c[1] + (lines === 2 ? 26 : 18);
  return (
    <g pointerEvents="none" fontFamily="Inter, system-ui, sans-serif">
      {showName && (
        <text x={c[0]} y={top} textAnchor="middle" fontSize={12} fontWeight={600} fill={selected ? "#522a19" : "#1a1d21"} stroke="white" strokeWidth={3} paintOrder="stroke">
          {name}
        </text>
      )}
      <text x={c[0]} y={showName ? c[1] + 9 : c[1] + 4} textAnchor="middle" fontSize={11} fill="#3d434b" stroke="white" strokeWidth={3} paintOrder="stroke">
        {showDetail ? detail : pitchText(plane.pitch)}
      </text>
      {room > 90 && (
        <g transform={`translate(${c[0]} ${ay})`} opacity={0.7}>
          <line x1={-up[0] * 8} y1={-up[1] * 8} x2={up[0] * 8} y2={up[1] * 8} stroke="#4a515a" strokeWidth={1.25} />
          <path
            d={`M ${up[0] * 10} ${up[1] * 10} L ${up[0] * 4 - up[1] * 4} ${up[1] * 4 + up[0] * 4} L ${up[0] * 4 + up[1] * 4} ${up[1] * 4 - up[0] * 4} Z`}
            fill="#4a515a"
          />
        </g>
      )}
    </g>
  );
});

function SelectionLayer({
  planes,
  selection,
  view,
  dragged,
  readOnly,
  tool,
}: {
  planes: DraftPlane[];
  selection: Selection;
  view: View;
  dragged: Map<string, Pt[]> | null;
  readOnly: boolean;
  tool: Tool;
}) {
  if (!selection) return null;
  const plane = planes.find((p) => p.id === selection.planeId);
  if (!plane) return null;
  const o = dragged?.get(plane.id) ?? (plane.outline as Pt[]);
  const pts = o.map((p) => toView(view, p));
  return (
    <g>
      {selection.kind === "edge" && pts[selection.edge] && (
        <line
          x1={pts[selection.edge][0]}
          y1={pts[selection.edge][1]}
          x2={pts[(selection.edge + 1) % pts.length][0]}
          y2={pts[(selection.edge + 1) % pts.length][1]}
          stroke="#7a3b1f"
          strokeWidth={5}
          strokeLinecap="round"
          pointerEvents="none"
          data-testid="selected-edge"
        />
      )}
      {tool === "select" &&
        pts.map((p, i) => {
          const active = selection.kind === "vertex" && selection.index === i;
          return (
            <g key={i}>
              <rect
                data-hit="vertex"
                data-plane-id={plane.id}
                data-index={i}
                x={p[0] - (active ? 6 : 5)}
                y={p[1] - (active ? 6 : 5)}
                width={active ? 12 : 10}
                height={active ? 12 : 10}
                fill={active ? "#7a3b1f" : "white"}
                stroke="#7a3b1f"
                strokeWidth={1.5}
                style={{ cursor: readOnly ? "pointer" : "move" }}
              >
                <title>{`Corner ${i + 1}`}</title>
              </rect>
              {/* a larger invisible target for fingers */}
              <circle data-hit="vertex" data-plane-id={plane.id} data-index={i} cx={p[0]} cy={p[1]} r={12} fill="transparent" />
            </g>
          );
        })}
    </g>
  );
}

/** Under the typed edges: a soft copper band around the selected plane and a stronger one on its eave. */
function SelectionHalo({ plane, outline, view }: { plane: DraftPlane | undefined; outline?: Pt[]; view: View }) {
  if (!plane) return null;
  const pts = (outline ?? (plane.outline as Pt[])).map((p) => toView(view, p));
  const eave = plane.eaveEdge;
  const a = pts[eave];
  const b = pts[(eave + 1) % pts.length];
  return (
    <g pointerEvents="none">
      <path d={`M ${pts.map((p) => `${p[0]} ${p[1]}`).join(" L ")} Z`} fill="none" stroke="#dd9d76" strokeOpacity={0.55} strokeWidth={8} strokeLinejoin="round" />
      {a && b && <line x1={a[0]} y1={a[1]} x2={b[0]} y2={b[1]} stroke="#b96236" strokeOpacity={0.45} strokeWidth={12} />}
    </g>
  );
}

function DrawingLayer({ drawing, hover, view }: { drawing: Pt[]; hover: Pt | null; view: View }) {
  const pts = drawing.map((p) => toView(view, p));
  const h = hover ? toView(view, hover) : null;
  const last = drawing[drawing.length - 1];
  const closing = h && pts.length >= 3 && dist(h, pts[0]) <= VERTEX_SNAP_PX;
  return (
    <g pointerEvents="none" data-testid="drawing-outline">
      {pts.length > 1 && (
        <polyline points={pts.map((p) => p.join(",")).join(" ")} fill="none" stroke="#7a3b1f" strokeWidth={2} />
      )}
      {h && pts.length > 0 && (
        <line x1={pts[pts.length - 1][0]} y1={pts[pts.length - 1][1]} x2={h[0]} y2={h[1]} stroke="#7a3b1f" strokeWidth={1.5} strokeDasharray="5 4" />
      )}
      {h && pts.length > 0 && last && hover && (
        <EdgeLabel a={pts[pts.length - 1]} b={h} inward={[0, -1]} text={feetInches(dist(last, hover))} />
      )}
      {pts.map((p, i) => (
        <circle key={i} cx={p[0]} cy={p[1]} r={i === 0 ? (closing ? 8 : 5) : 3.5} fill={i === 0 ? "#f5e3d6" : "#7a3b1f"} stroke="#7a3b1f" strokeWidth={1.5} />
      ))}
      {h && (
        <g>
          <circle cx={h[0]} cy={h[1]} r={4} fill="none" stroke="#b96236" strokeWidth={1.5} />
          <path d={`M ${h[0] - 9} ${h[1]} h 5 M ${h[0] + 4} ${h[1]} h 5 M ${h[0]} ${h[1] - 9} v 5 M ${h[0]} ${h[1] + 4} v 5`} stroke="#b96236" strokeWidth={1} />
        </g>
      )}
    </g>
  );
}
