/**
 * The sketch's edits as intents applied to the roof document. Each returns a new document (or the same
 * one when nothing changes, so the draft store records no empty undo step). Adding planes also adds the
 * default layer stack when the roof has none yet, so the engine can compute.
 */
import type { EdgeType } from "@shared/engine/roof/edge-types";
import type { DraftPlane, DraftStack, RoofDoc } from "@/features/roof/api/roof-draft";
import { defaultEaveEdge, roundFt, type Pt } from "./geometry";

export type Penetration = NonNullable<DraftPlane["penetrations"]>[number];

export type SketchIntent =
  | { type: "addPlanes"; planes: DraftPlane[] }
  | { type: "deletePlane"; planeId: string }
  | { type: "movePoints"; moves: { planeId: string; index: number }[]; to: Pt }
  | { type: "setOutline"; planeId: string; outline: Pt[] }
  | { type: "deleteVertex"; planeId: string; index: number }
  | { type: "insertVertex"; planeId: string; afterIndex: number; at: Pt }
  | { type: "setPitch"; planeId: string; pitch: number }
  | { type: "setEave"; planeId: string; edge: number }
  | { type: "rename"; planeId: string; name: string }
  | { type: "setStack"; planeId: string; stackId: string | null }
  | { type: "setEdgeType"; planeId: string; edge: number; edgeType: EdgeType | null }
  | { type: "setPlaneField"; planeId: string; field: "baseElevationFt" | "eaveOverhangIn"; value: number }
  | { type: "addPenetration"; planeId: string; penetration: Penetration }
  | { type: "removePenetration"; planeId: string; index: number };

/** The stack a roof gets when it has none: plain standing seam on synthetic high-temp underlayment. */
export function defaultStack(id = "main"): DraftStack {
  return {
    id,
    name: "Main roof",
    underlayment: { kind: "synthetic", highTemp: true },
    spacer: { kind: "none" },
    radiantBarrier: { kind: "none" },
    panel: { system: "standing-seam", coverageWidthIn: 16, gauge: 24, solarReflectance: 0.3, thermalEmittance: 0.85 },
  };
}

/** The document with a default stack added (and made the default) when it has no stacks. */
export function withDefaultStack(doc: RoofDoc): RoofDoc {
  if (doc.stacks.length > 0) {
    if (doc.defaultStackId && doc.stacks.some((s) => s.id === doc.defaultStackId)) return doc;
    return { ...doc, defaultStackId: doc.stacks[0]!.id };
  }
  const stack = defaultStack();
  return { ...doc, stacks: [stack], defaultStackId: stack.id };
}

/** An id not used by any plane of the document: `${prefix}-${n}`. */
export function newPlaneId(doc: RoofDoc, prefix = "plane"): string {
  const used = new Set(doc.planes.map((p) => p.id));
  let n = doc.planes.length + 1;
  while (used.has(`${prefix}-${n}`)) n++;
  return `${prefix}-${n}`;
}

/** A free prefix for a generator's ids (they add their own suffixes). */
export function newIdPrefix(doc: RoofDoc, base: string): string {
  const used = doc.planes.map((p) => p.id);
  let n = 1;
  while (used.some((id) => id.startsWith(`${base}${n}-`))) n++;
  return `${base}${n}`;
}

/** A name not used yet: "South slope", "South slope 2", … */
export function uniqueName(doc: RoofDoc, name: string): string {
  const used = new Set(doc.planes.map((p) => p.name ?? ""));
  if (!used.has(name)) return name;
  let n = 2;
  while (used.has(`${name} ${n}`)) n++;
  return `${name} ${n}`;
}

/** A plane from a clicked outline: named "Plane N", the eave on its longest valid edge. */
export function planeFromOutline(doc: RoofDoc, outline: Pt[], pitch: number): DraftPlane {
  const id = newPlaneId(doc);
  return {
    id,
    name: uniqueName(doc, `Plane ${doc.planes.length + 1}`),
    pitch,
    outline: outline.map(([x, y]) => [roundFt(x), roundFt(y)] as Pt),
    eaveEdge: defaultEaveEdge(outline),
    edgeTypes: {},
    penetrations: [],
  };
}

const mapPlane = (doc: RoofDoc, planeId: string, f: (p: DraftPlane) => DraftPlane): RoofDoc => {
  let changed = false;
  const planes = doc.planes.map((p) => {
    if (p.id !== planeId) return p;
    const next = f(p);
    if (next !== p) changed = true;
    return next;
  });
  return changed ? { ...doc, planes } : doc;
};

/** Re-keys edge overrides after a corner is inserted at / removed from position `at`. */
function shiftEdgeTypes(types: DraftPlane["edgeTypes"], at: number, delta: 1 | -1): DraftPlane["edgeTypes"] {
  if (!types) return types;
  const out: Record<string, EdgeType> = {};
  for (const [k, v] of Object.entries(types)) {
    const i = Number(k);
    if (delta === -1 && (i === at || i === at - 1)) continue; // the two edges at the removed corner merge
    out[String(i >= at ? i + delta : i)] = v;
  }
  return out;
}

export function applyIntent(doc: RoofDoc, intent: SketchIntent): RoofDoc {
  switch (intent.type) {
    case "addPlanes":
      if (!intent.planes.length) return doc;
      return withDefaultStack({ ...doc, planes: [...doc.planes, ...intent.planes] });
    case "deletePlane":
      return doc.planes.some((p) => p.id === intent.planeId) ? { ...doc, planes: doc.planes.filter((p) => p.id !== intent.planeId) } : doc;
    case "movePoints": {
      const [x, y] = [roundFt(intent.to[0]), roundFt(intent.to[1])];
      const byPlane = new Map<string, Set<number>>();
      for (const m of intent.moves) {
        if (!byPlane.has(m.planeId)) byPlane.set(m.planeId, new Set());
        byPlane.get(m.planeId)!.add(m.index);
      }
      let changed = false;
      const planes = doc.planes.map((p) => {
        const idx = byPlane.get(p.id);
        if (!idx) return p;
        const outline = p.outline.map((pt, i) => {
          if (!idx.has(i) || (pt[0] === x && pt[1] === y)) return pt;
          changed = true;
          return [x, y] as Pt;
        });
        return { ...p, outline };
      });
      return changed ? { ...doc, planes } : doc;
    }
    case "setOutline":
      return mapPlane(doc, intent.planeId, (p) => ({ ...p, outline: intent.outline.map(([x, y]) => [roundFt(x), roundFt(y)] as Pt) }));
    case "deleteVertex":
      return mapPlane(doc, intent.planeId, (p) => {
        const n = p.outline.length;
        if (n <= 3) return p; // a plane keeps at least three corners
        const outline = p.outline.filter((_, i) => i !== intent.index);
        let eave = p.eaveEdge;
        if (eave >= intent.index && eave > 0) eave -= 1;
        return { ...p, outline, eaveEdge: Math.min(eave, outline.length - 1), edgeTypes: shiftEdgeTypes(p.edgeTypes, intent.index, -1) };
      });
    case "insertVertex":
      return mapPlane(doc, intent.planeId, (p) => {
        const at = intent.afterIndex + 1;
        const outline = [...p.outline.slice(0, at), [roundFt(intent.at[0]), roundFt(intent.at[1])] as Pt, ...p.outline.slice(at)];
        return { ...p, outline, eaveEdge: p.eaveEdge >= at ? p.eaveEdge + 1 : p.eaveEdge, edgeTypes: shiftEdgeTypes(p.edgeTypes, at, 1) };
      });
    case "setPitch":
      if (!Number.isFinite(intent.pitch)) return doc;
      return mapPlane(doc, intent.planeId, (p) => (p.pitch === intent.pitch ? p : { ...p, pitch: intent.pitch }));
    case "setEave":
      return mapPlane(doc, intent.planeId, (p) => (p.eaveEdge === intent.edge ? p : { ...p, eaveEdge: intent.edge }));
    case "rename":
      return mapPlane(doc, intent.planeId, (p) => (p.name === intent.name ? p : { ...p, name: intent.name }));
    case "setStack":
      return mapPlane(doc, intent.planeId, (p) => {
        if ((p.stackId ?? null) === intent.stackId) return p;
        const { stackId: _old, ...rest } = p;
        return intent.stackId ? { ...rest, stackId: intent.stackId } : rest;
      });
    case "setEdgeType":
      return mapPlane(doc, intent.planeId, (p) => {
        const types = { ...(p.edgeTypes ?? {}) };
        const key = String(intent.edge);
        if ((types[key] ?? null) === intent.edgeType) return p;
        if (intent.edgeType) types[key] = intent.edgeType;
        else delete types[key];
        return { ...p, edgeTypes: types };
      });
    case "setPlaneField":
      if (!Number.isFinite(intent.value)) return doc;
      return mapPlane(doc, intent.planeId, (p) => (p[intent.field] === intent.value ? p : { ...p, [intent.field]: intent.value }));
    case "addPenetration":
      return mapPlane(doc, intent.planeId, (p) => ({ ...p, penetrations: [...(p.penetrations ?? []), intent.penetration] }));
    case "removePenetration":
      return mapPlane(doc, intent.planeId, (p) => ({ ...p, penetrations: (p.penetrations ?? []).filter((_, i) => i !== intent.index) }));
  }
}
