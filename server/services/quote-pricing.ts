/**
 * From a roof, a site, the engine's rules and a price book to priced quote options. The takeoff of an
 * option is the engine's result for the roof with the option's spec applied to its assemblies
 * (shared/schemas/quote.ts applySpecToRoof); its pricing is shared/pricing's priceQuote with:
 * - materials: the takeoff's material lines (purchase units, waste included);
 * - labour: each plane's squares in the band of its pitch;
 * - tear-off: all squares × the site's existing layers, when the site says the old roof comes off;
 * - deck: the takeoff's deck sheets to replace;
 * - the revision's manual lines, overrides (an option's own override wins over one for every option)
 *   and discount.
 */
import { computeTakeoff, type TakeoffResult } from "../../shared/engine/takeoff";
import { priceQuote, type PriceBook, type QuoteOptionInput, type QuoteOptionResult } from "../../shared/pricing/price-quote";
import type { JobSite } from "../../shared/schemas/job";
import {
  applySpecToRoof,
  type DiscountInput,
  type ManualLineInput,
  type OptionSpec,
  type OverrideInput,
  type TakeoffSummary,
} from "../../shared/schemas/quote";
import type { RoofDocument } from "../../shared/schemas/roof";
import { badRequest } from "../errors";
import type { PriceBookSnapshot } from "./price-book-rules";

/** What a revision keeps of the roof: the document without its underlay. */
export type RoofSnapshot = Pick<RoofDocument, "planes" | "stacks" | "defaultStackId">;

/** What a revision keeps of the price book: the pricing input, the engine's rules and which items it used. */
export interface FrozenPriceBook {
  priceBook: PriceBook;
  rules: Record<string, unknown>;
  snapshot: PriceBookSnapshot;
  unmappedKeys: string[];
  missingLabor: string[];
}

export interface RevisionInputs {
  manualLines: ManualLineInput[];
  overrides: OverrideInput[];
  discount: DiscountInput | null;
}

export const EMPTY_INPUTS: RevisionInputs = { manualLines: [], overrides: [], discount: null };

/**
 * The engine's takeoff of the roof with the option applied. A refusal is a 400 at `fieldPrefix`
 * (e.g. "options.1.spec"), since the stored roof itself computed when it was saved.
 */
export function optionTakeoff(roof: RoofSnapshot, site: JobSite, rules: Record<string, unknown>, spec: OptionSpec, fieldPrefix: string): TakeoffResult {
  const applied = applySpecToRoof(roof, spec);
  if ("error" in applied) throw badRequest("Please check the highlighted fields", { [`${fieldPrefix}.stackId`]: applied.error });
  const out = computeTakeoff({ site, ...applied, rules });
  if (!out.ok) {
    const where = out.path.length ? ` (${out.path.join(".")})` : "";
    throw badRequest("This option cannot be computed for the roof", { [fieldPrefix]: `${out.reason}${where}` });
  }
  return out.result;
}

export function takeoffSummary(t: TakeoffResult): TakeoffSummary {
  const advisories = { error: 0, warning: 0, info: 0 };
  for (const a of t.advisories ?? []) advisories[a.severity] += 1;
  return { squares: t.totals?.squares ?? 0, panelCount: t.totals?.panelCount ?? 0, advisories };
}

export interface OptionToPrice {
  /** The option's row id (manual lines and overrides name it). */
  id: number;
  label: string;
  takeoff: TakeoffResult;
}

/** The priceQuote input of one option. */
export function pricingOption(o: OptionToPrice, site: JobSite, inputs: RevisionInputs): QuoteOptionInput {
  const t = o.takeoff;
  const squares = t.totals.squares;
  const overrides = new Map<string, OverrideInput>();
  for (const ov of inputs.overrides) if (ov.optionId === null) overrides.set(ov.key, ov);
  for (const ov of inputs.overrides) if (ov.optionId === o.id) overrides.set(ov.key, ov); // the option's own wins
  const tearOff = site.tearOff && site.existingLayers > 0;
  return {
    id: String(o.id),
    label: o.label,
    materials: t.materials.map((m) => ({ key: m.key, quantity: m.quantity, unit: m.unit, description: m.description })),
    squares,
    planes: t.planes.map((p) => ({ pitch: p.pitch, squares: p.squares })),
    tearOffSquares: tearOff ? squares : 0,
    tearOffLayers: tearOff ? site.existingLayers : 1,
    deckSheetsReplaced: t.totals.deckSheets,
    manualLines: inputs.manualLines
      .filter((m) => m.optionId === null || m.optionId === o.id)
      .map((m) => ({ description: m.description, quantity: m.quantity, unitPriceCents: m.unitPriceCents, unitCostCents: m.unitCostCents, taxable: m.taxable })),
    overrides: [...overrides.values()].map((ov) => ({ key: ov.key, unitCostCents: ov.unitCostCents, quantity: ov.quantity, reason: ov.reason })),
    discount: inputs.discount ?? undefined,
  };
}

/** Prices every option with the given price book (integer cents, the money rules of shared/pricing). */
export function priceOptions(options: OptionToPrice[], site: JobSite, inputs: RevisionInputs, book: PriceBook): QuoteOptionResult[] {
  return priceQuote({ options: options.map((o) => pricingOption(o, site, inputs)), priceBook: book }).options;
}
