/**
 * How each edge type is drawn: a colour AND a line pattern AND a weight, so the types stay apart in grey
 * print and for colour-blind readers; every edge is also labelled with its type. Ridgewright's own code.
 */
import type { EdgeType } from "@shared/engine/roof/edge-types";
import { EDGE_TYPES } from "@shared/engine/roof/edge-types";

export interface EdgeStyle {
  label: string;
  /** Short label drawn on the plan. */
  short: string;
  color: string;
  width: number;
  /** SVG stroke-dasharray in px, or undefined for a solid line. */
  dash?: string;
  /** Drawn as two parallel lines. */
  double?: boolean;
  linecap?: "butt" | "round";
  /** Words for the legend: the pattern in plain language. */
  pattern: string;
}

export const EDGE_STYLES: Record<EdgeType, EdgeStyle> = {
  eave: { label: "Eave", short: "eave", color: "#1f5a85", width: 3.5, pattern: "heavy solid", linecap: "butt" },
  rake: { label: "Rake", short: "rake", color: "#6a4a9c", width: 2.5, dash: "10 5", pattern: "dashed" },
  ridge: { label: "Ridge", short: "ridge", color: "#a1352b", width: 1.75, double: true, pattern: "double solid" },
  hip: { label: "Hip", short: "hip", color: "#a86a00", width: 2.5, dash: "14 4 2 4", pattern: "dash-dot" },
  valley: { label: "Valley", short: "valley", color: "#1d7553", width: 3, dash: "0.1 5.5", linecap: "round", pattern: "dotted" },
  transition: { label: "Transition", short: "transition", color: "#9b2f74", width: 2, dash: "18 4 4 4", double: true, pattern: "double dash" },
  sidewall: { label: "Sidewall", short: "sidewall", color: "#36454f", width: 4, dash: "3 3", pattern: "heavy short dash" },
  headwall: { label: "Headwall", short: "headwall", color: "#5c5f16", width: 4, dash: "12 3 3 3 3 3", pattern: "heavy dash-dot-dot" },
};

/** Style of an outline edge whose type the engine could not give (the roof does not compute yet). */
export const UNTYPED_STYLE: EdgeStyle = { label: "Not typed yet", short: "", color: "#737c87", width: 1.5, pattern: "thin solid" };

export const EDGE_TYPE_LIST: readonly EdgeType[] = EDGE_TYPES;

/** One edge segment in screen px, in its type's style. */
export function StyledSegment({
  a,
  b,
  style,
  opacity = 1,
}: {
  a: readonly [number, number];
  b: readonly [number, number];
  style: EdgeStyle;
  opacity?: number;
}) {
  const common = {
    stroke: style.color,
    strokeWidth: style.width,
    strokeDasharray: style.dash,
    strokeLinecap: style.linecap ?? "butt",
    opacity,
    fill: "none",
  } as const;
  if (!style.double) return <line x1={a[0]} y1={a[1]} x2={b[0]} y2={b[1]} {...common} />;
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]) || 1;
  const off = style.width + 0.75;
  const nx = (-(b[1] - a[1]) / len) * off;
  const ny = ((b[0] - a[0]) / len) * off;
  return (
    <g>
      <line x1={a[0] + nx} y1={a[1] + ny} x2={b[0] + nx} y2={b[1] + ny} {...common} />
      <line x1={a[0] - nx} y1={a[1] - ny} x2={b[0] - nx} y2={b[1] - ny} {...common} />
    </g>
  );
}

/** A short sample of the style for the legend. */
export function EdgeSwatch({ style }: { style: EdgeStyle }) {
  return (
    <svg width="40" height="14" viewBox="0 0 40 14" aria-hidden="true" className="shrink-0">
      <StyledSegment a={[2, 7]} b={[38, 7]} style={style} />
    </svg>
  );
}
