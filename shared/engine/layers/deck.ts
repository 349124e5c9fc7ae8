/**
 * Deck sheets to replace: replace → the whole sloped area; repair → the share given; keep → none.
 * Sheets = area × (1 + waste) / sheet area (4 × 8 ft = 32 ft²), rounded once for the job (common practice).
 */
export type DeckAction = "keep" | "repair" | "replace";

export function deckAreaToReplace(slopedAreaSqFt: number, action: DeckAction, repairSharePct: number): number {
  if (action === "replace") return slopedAreaSqFt;
  if (action === "repair") return (slopedAreaSqFt * repairSharePct) / 100;
  return 0;
}
