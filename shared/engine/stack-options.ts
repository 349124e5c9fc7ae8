/**
 * One assembly turned into another choice: the spacer swapped (as the gap study and quote options do) and
 * the radiant barrier switched on or off. Battens keep the stack's batten settings (size, spacing); a mat
 * keeps its thickness and open fraction when it stays the same kind.
 */
import type { StackInput } from "../schemas/takeoff";

export const SPACER_OPTIONS = ["none", "battens", "counter-battens", "mesh", "dimpled"] as const;
export type SpacerOption = (typeof SPACER_OPTIONS)[number];

export function applySpacerAndFoil(stack: StackInput, spec: { spacer?: SpacerOption; foil?: boolean }): StackInput {
  let s = stack;
  if (spec.spacer) {
    const sp = s.spacer;
    const keep = (kind: "mesh" | "dimpled") => (sp.kind === kind ? { thicknessIn: sp.thicknessIn, openFraction: sp.openFraction } : {});
    switch (spec.spacer) {
      case "none":
        s = { ...s, spacer: { ...sp, kind: "none" } };
        break;
      case "battens":
        s = { ...s, spacer: { kind: "battens", battens: { ...sp.battens, counterBattens: false } } };
        break;
      case "counter-battens":
        s = { ...s, spacer: { kind: "battens", battens: { ...sp.battens, counterBattens: true } } };
        break;
      case "mesh":
      case "dimpled":
        s = { ...s, spacer: { kind: spec.spacer, battens: sp.battens, ...keep(spec.spacer) } };
        break;
    }
  }
  if (spec.foil !== undefined) s = { ...s, radiantBarrier: { ...s.radiantBarrier, kind: spec.foil ? "foil" : "none" } };
  return s;
}
