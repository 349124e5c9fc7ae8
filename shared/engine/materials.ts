/**
 * Material keys: stable kebab-case strings the price book maps its items to. Each has a category, the
 * unit the takeoff's quantity is in (already rounded up to purchase units, waste included) and a
 * description. Pipe boots add the size range to the key: `pipe-boot-3in`, `pipe-boot-6in` …
 */
export const MATERIAL_CATEGORIES = [
  "panels",
  "underlayment",
  "ice-barrier",
  "spacer",
  "radiant-barrier",
  "deck",
  "trim",
  "flashing",
  "closures",
  "fasteners",
  "sealants",
  "penetrations",
  "ventilation",
] as const;
export type MaterialCategory = (typeof MATERIAL_CATEGORIES)[number];

export interface MaterialKeyInfo {
  category: MaterialCategory;
  unit: string;
  description: string;
}

export const MATERIAL_KEYS = {
  "panel-standing-seam": { category: "panels", unit: "lf", description: "Standing-seam panels, ordered to the inch (linear feet of panel)" },
  "panel-exposed-fastener": { category: "panels", unit: "lf", description: "Exposed-fastener rib panels, ordered to the inch (linear feet of panel)" },
  "underlayment-synthetic": { category: "underlayment", unit: "roll", description: "Synthetic underlayment" },
  "underlayment-self-adhered": { category: "underlayment", unit: "roll", description: "Self-adhered underlayment membrane" },
  "underlayment-felt-30": { category: "underlayment", unit: "roll", description: "No. 30 asphalt-saturated felt" },
  "underlayment-felt-15": { category: "underlayment", unit: "roll", description: "No. 15 asphalt-saturated felt" },
  "ice-barrier": { category: "ice-barrier", unit: "roll", description: "Self-adhered ice barrier at the eaves" },
  "spacer-mesh": { category: "spacer", unit: "roll", description: "3D drainage/ventilation mesh mat" },
  "spacer-dimpled": { category: "spacer", unit: "roll", description: "Dimpled spacer sheet" },
  "batten-1x3": { category: "spacer", unit: "pc", description: "1x3 battens (stock lengths)" },
  "batten-1x4": { category: "spacer", unit: "pc", description: "1x4 battens (stock lengths)" },
  "batten-2x2": { category: "spacer", unit: "pc", description: "2x2 battens (stock lengths)" },
  "batten-2x4": { category: "spacer", unit: "pc", description: "2x4 battens (stock lengths)" },
  "counter-batten-1x3": { category: "spacer", unit: "pc", description: "1x3 counter-battens (stock lengths)" },
  "counter-batten-1x4": { category: "spacer", unit: "pc", description: "1x4 counter-battens (stock lengths)" },
  "counter-batten-2x2": { category: "spacer", unit: "pc", description: "2x2 counter-battens (stock lengths)" },
  "counter-batten-2x4": { category: "spacer", unit: "pc", description: "2x4 counter-battens (stock lengths)" },
  "radiant-barrier-foil": { category: "radiant-barrier", unit: "roll", description: "Foil radiant barrier" },
  "deck-sheet": { category: "deck", unit: "sheet", description: "Roof deck sheets (4 × 8 ft) to replace" },
  "trim-eave": { category: "trim", unit: "pc", description: "Eave trim / drip edge (stock lengths)" },
  "trim-rake": { category: "trim", unit: "pc", description: "Rake trim (stock lengths)" },
  "ridge-cap": { category: "trim", unit: "pc", description: "Ridge cap (stock lengths)" },
  "hip-cap": { category: "trim", unit: "pc", description: "Hip cap (stock lengths)" },
  "valley-pan": { category: "flashing", unit: "pc", description: "Valley pan (stock lengths)" },
  "valley-membrane": { category: "flashing", unit: "roll", description: "36 in self-adhered membrane strip under valleys" },
  "flashing-sidewall": { category: "flashing", unit: "pc", description: "Sidewall flashing (stock lengths)" },
  "flashing-headwall": { category: "flashing", unit: "pc", description: "Headwall flashing (stock lengths)" },
  "flashing-transition": { category: "flashing", unit: "pc", description: "Transition (change-of-slope) flashing (stock lengths)" },
  "flashing-chimney": { category: "flashing", unit: "ea", description: "Chimney flashing set" },
  "skylight-curb-flashing": { category: "flashing", unit: "ea", description: "Skylight curb flashing set" },
  "closure-eave": { category: "closures", unit: "ea", description: "Eave closures, one per panel" },
  "closure-ridge": { category: "closures", unit: "ea", description: "Ridge and hip closures, one per panel end" },
  "closure-vented": { category: "closures", unit: "ea", description: "Vented closures where the gap under the panels is ventilated" },
  clip: { category: "fasteners", unit: "ea", description: "Standing-seam panel clips" },
  "screw-clip": { category: "fasteners", unit: "box", description: "Clip screws" },
  "screw-panel": { category: "fasteners", unit: "box", description: "Exposed-fastener panel screws" },
  "screw-trim": { category: "fasteners", unit: "box", description: "Trim fasteners" },
  "screw-batten": { category: "fasteners", unit: "box", description: "Batten and counter-batten fasteners" },
  "sealant-tube": { category: "sealants", unit: "tube", description: "Sealant tubes" },
  "butyl-tape": { category: "sealants", unit: "roll", description: "Butyl tape sealant" },
  "pipe-boot-3in": { category: "penetrations", unit: "ea", description: "Pipe boot for pipes up to 3 in" },
  "pipe-boot-6in": { category: "penetrations", unit: "ea", description: "Pipe boot for pipes over 3 in up to 6 in" },
  "pipe-boot-9in": { category: "penetrations", unit: "ea", description: "Pipe boot for pipes over 6 in up to 9 in" },
  "pipe-boot-13in": { category: "penetrations", unit: "ea", description: "Pipe boot for pipes over 9 in up to 13 in" },
  "vent-ridge": { category: "ventilation", unit: "lf", description: "Ridge (exhaust) vent" },
  "vent-intake": { category: "ventilation", unit: "lf", description: "Eave (intake) vent" },
} as const satisfies Record<string, MaterialKeyInfo>;
export type MaterialKey = keyof typeof MATERIAL_KEYS;

export interface MaterialLine {
  key: MaterialKey;
  category: MaterialCategory;
  description: string;
  /** In purchase units (rolls, pieces, boxes …), waste included, rounded up once for the job. */
  quantity: number;
  unit: string;
  /** How the number was reached, in words. */
  basis: string;
}

export function materialLine(key: MaterialKey, quantity: number, basis: string, description?: string): MaterialLine {
  const info: MaterialKeyInfo = MATERIAL_KEYS[key];
  return { key, category: info.category, description: description ?? info.description, quantity, unit: info.unit, basis };
}

/** Pipe-boot size range for a pipe's outside diameter (common practice: boots cover a range of sizes). */
export function pipeBootKey(diameterIn: number | undefined): MaterialKey {
  const d = diameterIn ?? 3;
  if (d <= 3) return "pipe-boot-3in";
  if (d <= 6) return "pipe-boot-6in";
  if (d <= 9) return "pipe-boot-9in";
  return "pipe-boot-13in";
}
