/**
 * Stack helpers shared by the Layer stack and Gap study sections: complete a stack with the schema's
 * defaults, name it, find the planes that use it, apply a spacer option, and make new ids.
 */
import { stackSchema, type StackInput } from "@shared/schemas/takeoff";
import type { GapStudyOption } from "@shared/engine/gap-study";
import type { DraftPlane, DraftStack, RoofDoc } from "../api/roof-draft";

export type Stack = StackInput;

/** The stack with every default filled in (the engine's view of it); null when it does not parse. */
export function completeStack(s: DraftStack): Stack | null {
  const r = stackSchema.safeParse(s);
  return r.success ? r.data : null;
}

export const stackLabel = (s: { id: string; name?: string | undefined }) => (s.name?.trim() ? s.name.trim() : s.id);

export const planeLabel = (p: { id: string; name?: string | undefined }) => (p.name?.trim() ? `${p.name.trim()} (${p.id})` : p.id);

/** Planes that use a stack: those naming it, plus those naming none when it is the default. */
export function planesUsing(doc: RoofDoc, stackId: string): DraftPlane[] {
  return doc.planes.filter((p) => (p.stackId ?? doc.defaultStackId) === stackId);
}

/** Planes naming this stack explicitly (the ones that block deleting it). */
export function planesNaming(doc: RoofDoc, stackId: string): DraftPlane[] {
  return doc.planes.filter((p) => p.stackId === stackId);
}

export function newStackId(doc: RoofDoc, base = "stack"): string {
  const taken = new Set(doc.stacks.map((s) => s.id));
  for (let i = doc.stacks.length + 1; ; i++) {
    const id = `${base}-${i}`;
    if (!taken.has(id)) return id;
  }
}

/** The spacer of a gap-study option written into a stack (battens keep the stack's batten settings). */
export function applySpacerOption(stack: DraftStack, option: GapStudyOption): DraftStack {
  const sp = stack.spacer ?? {};
  const battens = sp.battens ?? {};
  switch (option) {
    case "none":
      return { ...stack, spacer: { ...sp, kind: "none" } };
    case "battens":
      return { ...stack, spacer: { ...sp, kind: "battens", battens: { ...battens, counterBattens: false } } };
    case "counter-battens":
      return { ...stack, spacer: { ...sp, kind: "battens", battens: { ...battens, counterBattens: true } } };
    case "mesh":
    case "dimpled": {
      const same = sp.kind === option;
      return {
        ...stack,
        spacer: { kind: option, battens, ...(same ? { thicknessIn: sp.thicknessIn, openFraction: sp.openFraction } : {}) },
      };
    }
  }
}

export const SPACER_OPTION_LABELS: Record<GapStudyOption, string> = {
  none: "No spacer",
  battens: "Battens",
  "counter-battens": "Battens on counter-battens",
  mesh: "3D mesh mat",
  dimpled: "Dimpled sheet",
};

/** A gap-study option's label for the stack's current spacer. */
export function spacerOptionOf(s: Stack): GapStudyOption {
  if (s.spacer.kind === "battens") return s.spacer.battens.counterBattens ? "counter-battens" : "battens";
  return s.spacer.kind;
}

/** Inches as the trade writes small sizes: 0.75 → 3/4 in, 1.5 → 1-1/2 in; other values in decimals. */
export function inchText(x: number): string {
  const whole = Math.floor(x + 1e-9);
  const frac = x - whole;
  const eighths = Math.round(frac * 16);
  if (Math.abs(frac * 16 - eighths) < 1e-6 && x > 0) {
    if (eighths === 0) return `${whole} in`;
    let n = eighths;
    let d = 16;
    while (n % 2 === 0) {
      n /= 2;
      d /= 2;
    }
    return whole ? `${whole}-${n}/${d} in` : `${n}/${d} in`;
  }
  return `${Number(x.toFixed(2))} in`;
}
