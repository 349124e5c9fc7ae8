/**
 * Quote pricing: turns takeoff quantities and a price book into priced lines, per option.
 * Pure: no I/O, no clock. Money is integer cents everywhere.
 *
 * Money rules
 * 1. Materials. Each takeoff material is matched to the first price-book item with the same `key`.
 *    A material with no item (and no unit-cost override) gets no line; its key goes to `missingItems`.
 *    Purchase quantity = ceil(takeoff quantity / packCoverage). The takeoff's quantities already include
 *    waste, so the item's `wastePct` is NOT applied again; it is applied (quantity × (1 + wastePct/100)
 *    before dividing by the pack coverage) only to a material marked `wasteIncluded: false`.
 * 2. Line cost = round(quantity × unit cost), to the cent, per line (half-cent rounds up).
 * 3. Line price, per line, rounded to the cent: markup mode cost × (1 + markupPct/100); margin mode
 *    cost / (1 − targetMarginPct/100).
 * 4. Labour by pitch band: `squaresByPitchBand` (band id → squares) when given; else `planes` (each
 *    plane's squares go to the band of its pitch); else all `squares` in the band of `pitch`; else all
 *    squares in the lowest band, flagged `laborBandAssumed`. A band holds pitches p with
 *    minPitch ≤ p < maxPitch (maxPitch null: no upper bound). Squares whose pitch or band id has no band
 *    go to `missingItems` as "labor:<band id or pitch>". Labour lines are keyed "labor:<band id>".
 * 5. Tear-off = squares × (per-square-per-layer rate × layers), keyed "tearoff"; layers default 1.
 *    Deck replacement = sheets × sheet price, keyed "deck".
 * 6. Manual lines carry a selling price. Their cost is `unitCostCents` when given, else taken equal to
 *    the price (no assumed profit, so the margin check stays conservative). Their price is
 *    round(quantity × unitPriceCents) and is not marked up again.
 * 7. Overrides match a line's key. `quantity` replaces the line's (purchase) quantity; `unitCostCents`
 *    replaces the unit cost (and lets a material without a price-book item be priced, per takeoff unit).
 *    The reason is kept on the line; `hasOverrides` is true when any override was applied. Overrides that
 *    match no line are listed in `unmatchedOverrides`.
 * 8. Tax = round(Σ taxable base × taxRatePct/100), once per option. Taxable lines: materials, and manual
 *    lines marked taxable. The base is each line's cost (taxBasis "cost", the contractor pays tax on
 *    materials bought) or its price (taxBasis "price", tax charged on the sale).
 * 9. A discount is a line with price −amountCents and cost 0. It lowers the price and the margin but not
 *    the tax: tax is figured on the undiscounted taxable lines (a discount on the whole job is not
 *    allocated to taxable materials).
 * 10. priceCents = Σ line prices (after the discount, before tax); totalCents = priceCents + taxCents.
 *    marginPct = (priceCents − costCents) / priceCents × 100 (0 when the price is 0 or less);
 *    belowMinMargin when marginPct < minMarginPct.
 * 11. Deposit = depositPct of the total, rounded to the whole dollar (nearest 100 cents).
 */

export interface QuoteMaterial {
  key: string;
  quantity: number;
  unit: string;
  description?: string;
  /** Default true: the takeoff quantity already includes waste. */
  wasteIncluded?: boolean;
}

export interface QuoteManualLine {
  description: string;
  quantity: number;
  unitPriceCents: number;
  taxable: boolean;
  /** What the line costs the contractor, per unit; default: the unit price. */
  unitCostCents?: number;
}

export interface QuoteOverride {
  key: string;
  unitCostCents?: number;
  quantity?: number;
  reason: string;
}

export interface QuoteOptionInput {
  id: string;
  label: string;
  materials: QuoteMaterial[];
  squares: number;
  squaresByPitchBand?: Record<string, number>;
  /** Each plane's pitch and squares, to split labour by pitch band. */
  planes?: Array<{ pitch: number; squares: number }>;
  /** Pitch of the whole roof, when neither squaresByPitchBand nor planes is given. */
  pitch?: number;
  tearOffSquares?: number;
  tearOffLayers?: number;
  deckSheetsReplaced?: number;
  manualLines?: QuoteManualLine[];
  overrides?: QuoteOverride[];
  discount?: { amountCents: number; reason: string };
}

export interface PriceBookItem {
  id: string;
  /** The takeoff material key it prices. */
  key: string;
  name: string;
  unit: string;
  /** Takeoff units per purchase unit (1 for "each"). */
  packCoverage: number;
  unitCostCents: number;
  wastePct?: number;
}

export interface PitchBand {
  id: string;
  minPitch: number;
  maxPitch: number | null;
  centsPerSquare: number;
}

export interface PricingSettings {
  pricingMode: "markup" | "margin";
  markupPct: number;
  targetMarginPct: number;
  minMarginPct: number;
  taxRatePct: number;
  taxBasis: "cost" | "price";
  depositPct: number;
}

export interface PriceBook {
  items: PriceBookItem[];
  labor: { pitchBands: PitchBand[]; tearOffPerSquarePerLayerCents: number; deckSheetCents: number };
  settings: PricingSettings;
}

export interface PriceQuoteInput {
  options: QuoteOptionInput[];
  priceBook: PriceBook;
}

export type QuoteLineKind = "material" | "labor" | "tearoff" | "deck" | "manual" | "discount";

export interface QuoteLine {
  kind: QuoteLineKind;
  key?: string;
  description: string;
  quantity: number;
  unit: string;
  unitCostCents: number;
  costCents: number;
  priceCents: number;
  taxable: boolean;
  override?: { reason: string };
}

export interface QuoteOptionResult {
  id: string;
  label: string;
  lines: QuoteLine[];
  costCents: number;
  /** Before tax, after the discount. */
  priceCents: number;
  taxCents: number;
  totalCents: number;
  marginPct: number;
  depositCents: number;
  belowMinMargin: boolean;
  hasOverrides: boolean;
  missingItems: string[];
  unmatchedOverrides: string[];
  /** True when no pitch information was given and all squares were priced in the lowest band. */
  laborBandAssumed: boolean;
}

export interface PriceQuoteResult {
  options: QuoteOptionResult[];
}

/** Round to the nearest cent, half away from zero, tolerant of binary float noise (e.g. 1.005 × 100). */
export function roundCents(x: number): number {
  if (!Number.isFinite(x)) throw new RangeError(`not a finite amount: ${x}`);
  const s = Math.sign(x);
  return (s * Math.round(Math.abs(x) + 1e-7)) || 0;
}

function assertCents(x: number, what: string) {
  if (!Number.isInteger(x)) throw new RangeError(`${what} must be integer cents, got ${x}`);
}

/** The band holding pitch p: minPitch ≤ p < maxPitch (null maxPitch: no upper bound). */
export function bandForPitch(bands: PitchBand[], p: number): PitchBand | undefined {
  return bands.find((b) => p >= b.minPitch && (b.maxPitch === null || p < b.maxPitch));
}

/** Sum the planes' squares by pitch band; planes whose pitch has no band are summed under "pitch-<p>". */
export function squaresByBand(planes: Array<{ pitch: number; squares: number }>, bands: PitchBand[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const pl of planes) {
    const band = bandForPitch(bands, pl.pitch);
    const id = band ? band.id : `pitch-${pl.pitch}`;
    out[id] = (out[id] ?? 0) + pl.squares;
  }
  return out;
}

export function linePrice(costCents: number, settings: PricingSettings): number {
  if (settings.pricingMode === "markup") return roundCents(costCents * (1 + settings.markupPct / 100));
  const m = settings.targetMarginPct / 100;
  if (!(m < 1)) throw new RangeError("target margin must be below 100 %");
  return roundCents(costCents / (1 - m));
}

function priceOption(opt: QuoteOptionInput, book: PriceBook): QuoteOptionResult {
  const { settings } = book;
  const lines: QuoteLine[] = [];
  const missingItems: string[] = [];
  const overrides = new Map<string, QuoteOverride>();
  for (const o of opt.overrides ?? []) {
    if (o.unitCostCents !== undefined) assertCents(o.unitCostCents, `override ${o.key} unit cost`);
    overrides.set(o.key, o);
  }
  const used = new Set<string>();

  /** Build a costed line, applying any override for its key. */
  const costed = (
    kind: QuoteLineKind,
    key: string,
    description: string,
    quantity: number,
    unit: string,
    unitCostCents: number,
    taxable: boolean,
  ): QuoteLine => {
    const o = overrides.get(key);
    let q = quantity;
    let u = unitCostCents;
    let override: { reason: string } | undefined;
    if (o && (o.quantity !== undefined || o.unitCostCents !== undefined)) {
      if (o.quantity !== undefined) q = o.quantity;
      if (o.unitCostCents !== undefined) u = o.unitCostCents;
      override = { reason: o.reason };
      used.add(key);
    }
    const costCents = roundCents(q * u);
    const line: QuoteLine = { kind, key, description, quantity: q, unit, unitCostCents: u, costCents, priceCents: linePrice(costCents, settings), taxable };
    if (override) line.override = override;
    return line;
  };

  // 1. Materials.
  for (const m of opt.materials) {
    const item = book.items.find((i) => i.key === m.key);
    if (!item) {
      const o = overrides.get(m.key);
      if (o?.unitCostCents !== undefined) {
        lines.push(costed("material", m.key, m.description ?? m.key, Math.ceil(m.quantity - 1e-9), m.unit, o.unitCostCents, true));
      } else {
        missingItems.push(m.key);
      }
      continue;
    }
    assertCents(item.unitCostCents, `price-book item ${item.id} unit cost`);
    if (!(item.packCoverage > 0)) throw new RangeError(`price-book item ${item.id} needs a positive pack coverage`);
    const withWaste = m.wasteIncluded === false ? m.quantity * (1 + (item.wastePct ?? 0) / 100) : m.quantity;
    // The small tolerance keeps float noise (e.g. 30.000000000000004) from buying an extra pack.
    const purchase = Math.max(0, Math.ceil(withWaste / item.packCoverage - 1e-9));
    lines.push(costed("material", m.key, item.name, purchase, item.unit, item.unitCostCents, true));
  }

  // 4. Labour by pitch band.
  const bands = book.labor.pitchBands;
  let laborBandAssumed = false;
  let bySquares: Record<string, number>;
  if (opt.squaresByPitchBand) bySquares = opt.squaresByPitchBand;
  else if (opt.planes && opt.planes.length > 0) bySquares = squaresByBand(opt.planes, bands);
  else if (opt.pitch !== undefined) {
    const band = bandForPitch(bands, opt.pitch);
    bySquares = { [band ? band.id : `pitch-${opt.pitch}`]: opt.squares };
  } else {
    const lowest = [...bands].sort((a, b) => a.minPitch - b.minPitch)[0];
    bySquares = lowest ? { [lowest.id]: opt.squares } : {};
    laborBandAssumed = opt.squares > 0;
    if (!lowest && opt.squares > 0) missingItems.push("labor");
  }
  for (const band of bands) {
    const sq = bySquares[band.id];
    if (sq === undefined || !(sq > 0)) continue;
    assertCents(band.centsPerSquare, `pitch band ${band.id} rate`);
    const maxTxt = band.maxPitch === null ? "and up" : `to under ${band.maxPitch}/12`;
    lines.push(costed("labor", `labor:${band.id}`, `Installation labour, pitch ${band.minPitch}/12 ${maxTxt}`, sq, "square", band.centsPerSquare, false));
  }
  for (const id of Object.keys(bySquares)) {
    if (!bands.some((b) => b.id === id) && bySquares[id] > 0) missingItems.push(`labor:${id}`);
  }

  // 5. Tear-off and deck.
  if (opt.tearOffSquares && opt.tearOffSquares > 0) {
    const layers = Math.max(1, Math.floor(opt.tearOffLayers ?? 1));
    assertCents(book.labor.tearOffPerSquarePerLayerCents, "tear-off rate");
    lines.push(
      costed("tearoff", "tearoff", `Tear-off, ${layers} layer${layers > 1 ? "s" : ""}`, opt.tearOffSquares, "square", book.labor.tearOffPerSquarePerLayerCents * layers, false),
    );
  }
  if (opt.deckSheetsReplaced && opt.deckSheetsReplaced > 0) {
    assertCents(book.labor.deckSheetCents, "deck sheet price");
    lines.push(costed("deck", "deck", "Deck sheets replaced", opt.deckSheetsReplaced, "sheet", book.labor.deckSheetCents, false));
  }

  // 6. Manual lines (sold at their own price).
  for (const ml of opt.manualLines ?? []) {
    assertCents(ml.unitPriceCents, `manual line "${ml.description}" price`);
    const unitCost = ml.unitCostCents ?? ml.unitPriceCents;
    assertCents(unitCost, `manual line "${ml.description}" cost`);
    lines.push({
      kind: "manual",
      description: ml.description,
      quantity: ml.quantity,
      unit: "each",
      unitCostCents: unitCost,
      costCents: roundCents(ml.quantity * unitCost),
      priceCents: roundCents(ml.quantity * ml.unitPriceCents),
      taxable: ml.taxable,
    });
  }

  // 8. Tax, on the undiscounted taxable lines.
  const taxBase = lines.filter((l) => l.taxable).reduce((s, l) => s + (settings.taxBasis === "cost" ? l.costCents : l.priceCents), 0);
  const taxCents = roundCents((taxBase * settings.taxRatePct) / 100);

  // 9. Discount.
  if (opt.discount && opt.discount.amountCents !== 0) {
    assertCents(opt.discount.amountCents, "discount");
    lines.push({
      kind: "discount",
      description: `Discount: ${opt.discount.reason}`,
      quantity: 1,
      unit: "each",
      unitCostCents: 0,
      costCents: 0,
      priceCents: -Math.abs(opt.discount.amountCents),
      taxable: false,
    });
  }

  const costCents = lines.reduce((s, l) => s + l.costCents, 0);
  const priceCents = lines.reduce((s, l) => s + l.priceCents, 0);
  const totalCents = priceCents + taxCents;
  const marginPct = priceCents > 0 ? ((priceCents - costCents) / priceCents) * 100 : 0;
  const depositCents = Math.round((totalCents * settings.depositPct) / 100 / 100 + 1e-9) * 100;
  const unmatchedOverrides = [...overrides.keys()].filter((k) => !used.has(k));

  return {
    id: opt.id,
    label: opt.label,
    lines,
    costCents,
    priceCents,
    taxCents,
    totalCents,
    marginPct,
    depositCents,
    belowMinMargin: marginPct < settings.minMarginPct,
    hasOverrides: used.size > 0,
    missingItems,
    unmatchedOverrides,
    laborBandAssumed,
  };
}

export function priceQuote(input: PriceQuoteInput): PriceQuoteResult {
  return { options: input.options.map((o) => priceOption(o, input.priceBook)) };
}
