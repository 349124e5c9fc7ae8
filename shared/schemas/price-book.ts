/**
 * The company price book: catalog items, labour rates, pricing settings, the company profile and the
 * CSV row of the price-book export/import. One schema per form and route (GET/POST/PATCH /api/price-book/*,
 * GET/PUT /api/company).
 *
 * Units. `purchaseUnit` is what the company buys and prices (a roll, a 10 ft piece, a box of 250);
 * `packCoverage` is how much of `coverageUnit` one purchase unit holds (ft² per roll, LF per piece, pieces
 * per box). The takeoff counts each material in the unit of its material key (`MATERIAL_KEYS[key].unit`),
 * so an item mapped to a key must be bought in that unit (pack coverage then only feeds the engine's rules,
 * e.g. ft² per roll) or cover that unit (a box of 100 clips for a key counted in clips).
 */
import { z } from "zod";
import { MATERIAL_CATEGORIES, MATERIAL_KEYS, type MaterialKey } from "../engine/materials";

export const CATALOG_CATEGORIES = [...MATERIAL_CATEGORIES, "accessories", "other"] as const;
export type CatalogCategory = (typeof CATALOG_CATEGORIES)[number];

/** Purchase and coverage units. The engine's material units (lf, roll, pc, ea, box, sheet, tube) are among them. */
export const UNITS = ["lf", "sqft", "square", "roll", "pc", "ea", "box", "sheet", "tube", "bundle", "set", "gal"] as const;
export type Unit = (typeof UNITS)[number];

export const MATERIAL_KEY_LIST = Object.keys(MATERIAL_KEYS) as MaterialKey[];

export const LABOR_KINDS = ["pitch_band", "tear_off_per_layer", "deck_sheet", "other"] as const;
export type LaborKind = (typeof LABOR_KINDS)[number];

export const PRICING_MODES = ["markup", "margin"] as const;
export const TAX_BASES = ["cost", "price"] as const;

/** Largest unit cost accepted, in cents ($1,000,000). */
export const MAX_UNIT_COST_CENTS = 100_000_000;
/** Largest price-book CSV accepted by the import. */
export const PRICE_BOOK_CSV_MAX_BYTES = 1_000_000;
export const PRICE_BOOK_CSV_MAX_ROWS = 5_000;

const num = (what = "Enter a number") => z.number({ error: what });
const positive = num().positive("Must be more than 0");
const nonNegative = num().min(0, "Must not be negative");
const pct = num().min(0, "Must not be negative").max(100, "At most 100");
/** A margin: a price can never be all profit, so below 100. */
const marginPct = num().min(0, "Must not be negative").lt(100, "Must be below 100");
const cents = num("Enter an amount in cents")
  .int("Use whole cents")
  .min(0, "Must not be negative")
  .max(MAX_UNIT_COST_CENTS, "Too large");

/** Optional free text: trimmed; "" or null become null; absent stays absent. */
const optionalText = (max: number) =>
  z
    .string({ error: "Must be text" })
    .trim()
    .max(max, `Use at most ${max} characters`)
    .nullish()
    .transform((v) => (v === undefined ? undefined : v || null));

const requiredText = (max: number) =>
  z.string({ error: "Required" }).trim().min(1, "Required").max(max, `Use at most ${max} characters`);

// ---------------------------------------------------------------------------------------------------
// catalog items
// ---------------------------------------------------------------------------------------------------

/**
 * Item attributes the engine's `rules` use (see server/services/price-book-rules.ts), plus a colour.
 * Unknown attribute names are refused so a typo does not silently leave the engine on its default.
 */
export const catalogItemAttributesSchema = z.strictObject(
  {
    /** Roll goods: width, length and laps (underlayment, ice barrier, mesh, dimpled sheet, foil). */
    rollWidthIn: positive.optional(),
    rollLengthFt: positive.optional(),
    sideLapIn: nonNegative.optional(),
    endLapIn: nonNegative.optional(),
    /** Stock pieces: battens, trim and flashings. */
    stockLengthFt: positive.optional(),
    /** Vents: net free area per linear foot, in². */
    nfaPerFtSqIn: nonNegative.optional(),
    /** Panels. */
    maxLengthFt: positive.optional(),
    coverageWidthIn: positive.optional(),
    gauge: positive.optional(),
    /** Clips: spacing by wind zone (the panel maker's uplift table governs) and screws per clip. */
    clipSpacingFieldIn: positive.optional(),
    clipSpacingEdgeIn: positive.optional(),
    clipSpacingCornerIn: positive.optional(),
    screwsPerClip: num().int("Use a whole number").min(0, "Must not be negative").optional(),
    /** Exposed-fastener screws per square by wind zone. */
    screwsPerSquareField: nonNegative.optional(),
    screwsPerSquareEdge: nonNegative.optional(),
    screwsPerSquareCorner: nonNegative.optional(),
    colour: z.string({ error: "Must be text" }).trim().max(60, "Use at most 60 characters").optional(),
  },
  { error: (iss) => (iss.code === "unrecognized_keys" ? "Unknown attribute" : undefined) },
);
export type CatalogItemAttributes = z.output<typeof catalogItemAttributesSchema>;

/** Laps must leave some of the roll: a lap as wide as the roll would make every roll cover nothing. */
export function attributeIssues(a: Partial<CatalogItemAttributes>): Array<{ path: AttributeName; message: string }> {
  const out: Array<{ path: AttributeName; message: string }> = [];
  if (a.sideLapIn !== undefined && a.rollWidthIn !== undefined && a.sideLapIn >= a.rollWidthIn)
    out.push({ path: "sideLapIn", message: "The side lap must be less than the roll width" });
  if (a.endLapIn !== undefined && a.rollLengthFt !== undefined && a.endLapIn / 12 >= a.rollLengthFt)
    out.push({ path: "endLapIn", message: "The end lap must be less than the roll length" });
  return out;
}

/** Attribute name → CSV column, in export order. */
export const ATTRIBUTE_COLUMNS = {
  rollWidthIn: "roll_width_in",
  rollLengthFt: "roll_length_ft",
  sideLapIn: "side_lap_in",
  endLapIn: "end_lap_in",
  stockLengthFt: "stock_length_ft",
  nfaPerFtSqIn: "nfa_per_ft_sq_in",
  maxLengthFt: "max_length_ft",
  coverageWidthIn: "coverage_width_in",
  gauge: "gauge",
  clipSpacingFieldIn: "clip_spacing_field_in",
  clipSpacingEdgeIn: "clip_spacing_edge_in",
  clipSpacingCornerIn: "clip_spacing_corner_in",
  screwsPerClip: "screws_per_clip",
  screwsPerSquareField: "screws_per_square_field",
  screwsPerSquareEdge: "screws_per_square_edge",
  screwsPerSquareCorner: "screws_per_square_corner",
  colour: "colour",
} as const satisfies Record<keyof CatalogItemAttributes, string>;
export type AttributeName = keyof typeof ATTRIBUTE_COLUMNS;

/**
 * Why an item cannot price a material key, or null when it can: the takeoff counts the key in its own
 * unit, so the item must be bought in that unit or cover it.
 */
export function unitMismatch(key: string | null | undefined, purchaseUnit: string, coverageUnit: string): string | null {
  if (!key) return null;
  const info = (MATERIAL_KEYS as Record<string, { unit: string }>)[key];
  if (!info) return "Unknown material key";
  if (purchaseUnit === info.unit || coverageUnit === info.unit) return null;
  return `The takeoff counts this material in "${info.unit}": buy it by the ${info.unit} or set the coverage unit to ${info.unit}`;
}

const itemFields = {
  sku: z
    .string({ error: "Required" })
    .trim()
    .min(1, "Required")
    .max(40, "Use at most 40 characters")
    .regex(/^[A-Za-z0-9][A-Za-z0-9._\-/]*$/, "Use letters, digits and . _ - / only"),
  category: z.enum(CATALOG_CATEGORIES, { error: "Pick a category" }),
  name: requiredText(200),
  purchaseUnit: z.enum(UNITS, { error: "Pick a unit" }),
  /** Coverage units per purchase unit. */
  packCoverage: positive.max(1_000_000, "Too large"),
  coverageUnit: z.enum(UNITS, { error: "Pick a unit" }),
  unitCostCents: cents,
  /** Waste the engine adds for this material, percent; null: the engine's default. */
  wastePct: pct.nullable(),
  /** The takeoff material key this item prices; null: not used by the takeoff (manual lines only). */
  materialKey: z.enum(MATERIAL_KEY_LIST as [MaterialKey, ...MaterialKey[]], { error: "Unknown material key" }).nullable(),
  attributes: catalogItemAttributesSchema,
};

interface UnitFields {
  materialKey?: string | null;
  purchaseUnit?: string;
  coverageUnit?: string;
  packCoverage?: number;
}

/** The unit rules for a complete item (create, or an update merged with the stored row). */
export function itemUnitIssues(v: UnitFields): Array<{ path: string; message: string }> {
  const out: Array<{ path: string; message: string }> = [];
  if (!v.purchaseUnit || !v.coverageUnit) return out;
  if (v.purchaseUnit === v.coverageUnit && v.packCoverage !== undefined && v.packCoverage !== 1) {
    out.push({ path: "packCoverage", message: "When the purchase unit and the coverage unit are the same, the pack coverage is 1" });
  }
  const mismatch = unitMismatch(v.materialKey, v.purchaseUnit, v.coverageUnit);
  if (mismatch) out.push({ path: "materialKey", message: mismatch });
  return out;
}

export const catalogItemInputSchema = z
  .object({
    ...itemFields,
    wastePct: itemFields.wastePct.default(null),
    materialKey: itemFields.materialKey.default(null),
    attributes: itemFields.attributes.default({}),
  })
  .superRefine((v, ctx) => {
    for (const i of itemUnitIssues(v)) ctx.addIssue({ code: "custom", path: [i.path], message: i.message });
    for (const i of attributeIssues(v.attributes)) ctx.addIssue({ code: "custom", path: ["attributes", i.path], message: i.message });
  });
export type CatalogItemInput = z.output<typeof catalogItemInputSchema>;
export type CatalogItemFormValues = z.input<typeof catalogItemInputSchema>;

/** PATCH: any subset of the fields, and the `version` the client loaded (a stale version answers 409). */
export const catalogItemUpdateSchema = z
  .object({
    sku: itemFields.sku.optional(),
    category: itemFields.category.optional(),
    name: itemFields.name.optional(),
    purchaseUnit: itemFields.purchaseUnit.optional(),
    packCoverage: itemFields.packCoverage.optional(),
    coverageUnit: itemFields.coverageUnit.optional(),
    unitCostCents: itemFields.unitCostCents.optional(),
    wastePct: itemFields.wastePct.optional(),
    materialKey: itemFields.materialKey.optional(),
    attributes: itemFields.attributes.optional(),
    version: num("Required").int("Use a whole number").min(1, "Versions start at 1"),
  })
  .refine((v) => Object.entries(v).some(([k, x]) => k !== "version" && x !== undefined), { message: "Nothing to change" });
export type CatalogItemUpdate = z.output<typeof catalogItemUpdateSchema>;

/** The fields whose change writes a price-history row. */
export const PRICE_FIELDS = ["unitCostCents", "packCoverage", "wastePct"] as const;

export const catalogItemListQuerySchema = z.object({
  /** `1`: archived (inactive) items only; `all`: both; absent: active items only. */
  archived: z.enum(["1", "0", "all", "true", "false"], { error: "Use 1, 0 or all" }).optional(),
  category: z.enum(CATALOG_CATEGORIES, { error: "Pick a category" }).optional(),
  q: z.string().trim().max(120, "Use at most 120 characters").optional(),
});
export type CatalogItemListQuery = z.output<typeof catalogItemListQuerySchema>;

export const catalogItemDtoSchema = z.object({
  id: z.number().int(),
  sku: z.string(),
  category: z.enum(CATALOG_CATEGORIES),
  name: z.string(),
  purchaseUnit: z.enum(UNITS),
  packCoverage: z.number(),
  coverageUnit: z.enum(UNITS),
  unitCostCents: z.number().int(),
  wastePct: z.number().nullable(),
  materialKey: z.string().nullable(),
  attributes: catalogItemAttributesSchema,
  active: z.boolean(),
  version: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type CatalogItemDto = z.infer<typeof catalogItemDtoSchema>;

export interface CatalogItemPriceDto {
  version: number;
  unitCostCents: number;
  packCoverage: number;
  wastePct: number | null;
  changedById: number | null;
  createdAt: string;
}

/** GET /api/price-book/mapping: each material key, its description and the active item pricing it. */
export interface MaterialMappingDto {
  key: MaterialKey;
  category: string;
  unit: string;
  description: string;
  item: { id: number; sku: string; name: string; purchaseUnit: string; unitCostCents: number } | null;
}

// ---------------------------------------------------------------------------------------------------
// labour rates
// ---------------------------------------------------------------------------------------------------

const pitch = num().min(0, "Pitch must be 0 or more").max(24, "Pitch must be at most 24");

export const laborRateInputSchema = z
  .object({
    kind: z.enum(LABOR_KINDS, { error: "Pick a kind" }),
    label: requiredText(120),
    /** Pitch bands only: the band holds pitches p with minPitch ≤ p < maxPitch (rise per 12). */
    minPitch: pitch.nullable().default(null),
    /** null: no upper bound. */
    maxPitch: pitch.nullable().default(null),
    centsPerUnit: cents,
    unit: z.string({ error: "Required" }).trim().min(1, "Required").max(20, "Use at most 20 characters"),
  })
  .superRefine((v, ctx) => {
    if (v.kind === "pitch_band") {
      if (v.minPitch === null) ctx.addIssue({ code: "custom", path: ["minPitch"], message: "Required for a pitch band" });
      else if (v.maxPitch !== null && v.maxPitch <= v.minPitch)
        ctx.addIssue({ code: "custom", path: ["maxPitch"], message: "Must be above the lowest pitch" });
    }
  });
export type LaborRateInput = z.output<typeof laborRateInputSchema>;

/** PUT /api/price-book/labor: the whole list of rates replaces the stored one. */
export const laborRatesInputSchema = z
  .object({ rates: z.array(laborRateInputSchema, { error: "Required" }).max(100, "At most 100 rates") })
  .superRefine((v, ctx) => {
    for (const kind of ["tear_off_per_layer", "deck_sheet"] as const) {
      const idx = v.rates.map((r, i) => (r.kind === kind ? i : -1)).filter((i) => i >= 0);
      for (const i of idx.slice(1)) ctx.addIssue({ code: "custom", path: ["rates", i, "kind"], message: "Only one rate of this kind" });
    }
    const bands = v.rates.map((r, i) => ({ r, i })).filter(({ r }) => r.kind === "pitch_band" && r.minPitch !== null);
    for (const a of bands) {
      for (const b of bands) {
        if (b.i <= a.i) continue;
        const aMax = a.r.maxPitch ?? Infinity;
        const bMax = b.r.maxPitch ?? Infinity;
        if (a.r.minPitch! < bMax && b.r.minPitch! < aMax) {
          ctx.addIssue({ code: "custom", path: ["rates", b.i, "minPitch"], message: `Overlaps the pitch band in row ${a.i + 1}` });
        }
      }
    }
  });
export type LaborRatesInput = z.output<typeof laborRatesInputSchema>;

export interface LaborRateDto {
  id: number;
  kind: LaborKind;
  label: string;
  minPitch: number | null;
  maxPitch: number | null;
  centsPerUnit: number;
  unit: string;
}

// ---------------------------------------------------------------------------------------------------
// pricing settings
// ---------------------------------------------------------------------------------------------------

export const pricingSettingsSchema = z
  .object({
    pricingMode: z.enum(PRICING_MODES, { error: "Pick markup or margin" }),
    markupPct: pct,
    targetMarginPct: marginPct,
    minMarginPct: marginPct,
    taxRatePct: pct,
    /** Tax on materials figured on their cost (the contractor pays it) or on their selling price. */
    taxBasis: z.enum(TAX_BASES, { error: "Pick cost or price" }),
    depositPct: pct,
    proposalValidityDays: num().int("Use a whole number").min(1, "At least 1 day").max(365, "At most 365 days"),
  })
  .superRefine((v, ctx) => {
    if (v.pricingMode === "margin" && v.targetMarginPct < v.minMarginPct) {
      ctx.addIssue({ code: "custom", path: ["targetMarginPct"], message: "Set the target at or above the minimum margin" });
    }
  });
export type PricingSettingsInput = z.output<typeof pricingSettingsSchema>;

export const DEFAULT_PRICING_SETTINGS: PricingSettingsInput = {
  pricingMode: "margin",
  markupPct: 40,
  targetMarginPct: 30,
  minMarginPct: 20,
  taxRatePct: 0,
  taxBasis: "cost",
  depositPct: 30,
  proposalValidityDays: 30,
};

export type PricingSettingsDto = PricingSettingsInput & { priceBookVersion: number };

// ---------------------------------------------------------------------------------------------------
// company profile
// ---------------------------------------------------------------------------------------------------

const optionalEmail = z
  .string({ error: "Must be text" })
  .trim()
  .toLowerCase()
  .max(254, "Too long")
  .nullish()
  .transform((v) => (v === undefined ? undefined : v || null))
  .pipe(z.email("Enter a valid e-mail address").nullish());

const optionalUrl = z
  .string({ error: "Must be text" })
  .trim()
  .max(200, "Use at most 200 characters")
  .nullish()
  .transform((v) => (v === undefined ? undefined : v || null))
  .pipe(z.url({ protocol: /^https?$/, error: "Enter a web address starting with http:// or https://" }).nullish());

/** PUT /api/company: the profile printed on proposals and e-mails (owner). Omitted optional fields become empty. */
export const companyProfileSchema = z.object({
  name: requiredText(160),
  legalName: optionalText(200),
  licenceNumber: optionalText(60),
  addressLine1: optionalText(160),
  addressLine2: optionalText(160),
  city: optionalText(80),
  region: optionalText(80),
  postalCode: optionalText(20),
  phone: optionalText(40),
  email: optionalEmail,
  website: optionalUrl,
  proposalTerms: optionalText(20_000),
  exclusions: optionalText(20_000),
  warranty: optionalText(20_000),
  /** Printed before the proposal number, e.g. "QSS-". */
  proposalPrefix: z
    .string({ error: "Must be text" })
    .trim()
    .max(12, "Use at most 12 characters")
    .regex(/^[A-Za-z0-9\-_/]*$/, "Use letters, digits and - _ / only")
    .default(""),
  nextProposalNumber: num().int("Use a whole number").min(1, "At least 1").max(99_999_999, "Too large").optional(),
});
export type CompanyProfileInput = z.output<typeof companyProfileSchema>;
export type CompanyProfileFormValues = z.input<typeof companyProfileSchema>;

/** What every signed-in user sees (name and contact for the app's header, the crew packet, e-mails). */
export interface CompanyContactDto {
  id: number;
  name: string;
  legalName: string | null;
  licenceNumber: string | null;
  addressLine1: string | null;
  addressLine2: string | null;
  city: string | null;
  region: string | null;
  postalCode: string | null;
  phone: string | null;
  email: string | null;
  website: string | null;
  /** Where the client fetches the logo (GET /api/company/logo), or null when there is none. */
  logoUrl: string | null;
}

/** Owners and estimators also get the proposal texts, numbering and the pricing settings. */
export interface CompanyDto extends CompanyContactDto {
  proposalTerms?: string | null;
  exclusions?: string | null;
  warranty?: string | null;
  proposalPrefix?: string;
  nextProposalNumber?: number;
  settings?: PricingSettingsDto;
}

// ---------------------------------------------------------------------------------------------------
// CSV
// ---------------------------------------------------------------------------------------------------

/** The export's columns, in order. Attribute columns follow the item's own columns. */
export const CSV_BASE_COLUMNS = [
  "sku",
  "category",
  "name",
  "purchase_unit",
  "pack_coverage",
  "coverage_unit",
  "unit_cost",
  "waste_pct",
  "material_key",
  "active",
] as const;
export const CSV_REQUIRED_COLUMNS = ["sku", "category", "name", "purchase_unit", "pack_coverage", "unit_cost"] as const;
export const CSV_COLUMNS = [...CSV_BASE_COLUMNS, ...Object.values(ATTRIBUTE_COLUMNS)] as const;

const blankToUndefined = (v: unknown) => (typeof v === "string" && v.trim() === "" ? undefined : v);

/** A decimal number written in a cell ("12", "3.5"); thousands separators allowed ("1,250.5"). */
const csvNumber = (check: z.ZodNumber) =>
  z.preprocess(
    (v) => {
      if (typeof v !== "string") return v;
      const s = v.trim();
      if (/^-?\d{1,3}(,\d{3})+(\.\d+)?$/.test(s)) return Number(s.replace(/,/g, ""));
      return /^-?(\d+(\.\d*)?|\.\d+)$/.test(s) ? Number(s) : v;
    },
    check,
  );

/** A dollar amount with at most two decimals ("12.5", "$1,234.00") → integer cents. */
export const csvMoneyToCents = z.preprocess(
  (v) => (typeof v === "string" ? v.trim().replace(/^\$/, "") : v),
  z
    .string({ error: "Required" })
    .min(1, "Required")
    .regex(/^(\d{1,3}(,\d{3})+|\d+)(\.\d{1,2})?$/, "Enter an amount in dollars, e.g. 12.50")
    .transform((s) => {
      const [whole, frac = ""] = s.replace(/,/g, "").split(".");
      return Number(whole) * 100 + Number((frac + "00").slice(0, 2));
    })
    .pipe(z.number().max(MAX_UNIT_COST_CENTS, "Too large")),
);

export const csvBoolean = z.preprocess(
  (v) => (typeof v === "string" ? v.trim().toLowerCase() : v),
  z
    .enum(["", "1", "0", "true", "false", "yes", "no", "y", "n"], { error: "Use yes or no" })
    .transform((v) => v === "" || ["1", "true", "yes", "y"].includes(v)),
);

const csvAttributeShape = Object.fromEntries(
  (Object.entries(ATTRIBUTE_COLUMNS) as Array<[AttributeName, string]>).map(([attr, column]) => {
    const inner = catalogItemAttributesSchema.shape[attr];
    const schema =
      attr === "colour"
        ? z.preprocess(blankToUndefined, z.string().trim().max(60, "Use at most 60 characters").optional())
        : z.preprocess(blankToUndefined, csvNumber((inner as z.ZodOptional<z.ZodNumber>).unwrap()).optional());
    return [column, schema];
  }),
) as Record<string, z.ZodType>;

/**
 * One data row of the price-book CSV (cells as strings, keyed by column name). Blank optional cells
 * mean: no waste override, no material key, active, no attribute.
 */
export const priceBookCsvRowSchema = z
  .object({
    sku: itemFields.sku,
    category: z.preprocess((v) => (typeof v === "string" ? v.trim().toLowerCase() : v), itemFields.category),
    name: itemFields.name,
    purchase_unit: z.preprocess((v) => (typeof v === "string" ? v.trim().toLowerCase() : v), itemFields.purchaseUnit),
    pack_coverage: csvNumber(itemFields.packCoverage),
    coverage_unit: z.preprocess(
      (v) => (typeof v === "string" ? v.trim().toLowerCase() || undefined : v),
      itemFields.coverageUnit.optional(),
    ),
    unit_cost: csvMoneyToCents,
    waste_pct: z.preprocess(blankToUndefined, csvNumber(pct).optional()),
    material_key: z.preprocess(
      (v) => (typeof v === "string" ? v.trim().toLowerCase() || undefined : v),
      z.enum(MATERIAL_KEY_LIST as [MaterialKey, ...MaterialKey[]], { error: "Unknown material key" }).optional(),
    ),
    active: z.preprocess((v) => (v === undefined ? "" : v), csvBoolean),
    ...csvAttributeShape,
  })
  .transform((r) => {
    const attributes: Record<string, unknown> = {};
    for (const [attr, column] of Object.entries(ATTRIBUTE_COLUMNS)) {
      const v = (r as Record<string, unknown>)[column];
      if (v !== undefined) attributes[attr] = v;
    }
    return {
      sku: r.sku,
      category: r.category,
      name: r.name,
      purchaseUnit: r.purchase_unit,
      packCoverage: r.pack_coverage,
      coverageUnit: r.coverage_unit ?? r.purchase_unit,
      unitCostCents: r.unit_cost,
      wastePct: r.waste_pct ?? null,
      materialKey: r.material_key ?? null,
      active: r.active,
      attributes: attributes as CatalogItemAttributes,
    };
  })
  .superRefine((v, ctx) => {
    const column: Record<string, string> = { packCoverage: "pack_coverage", materialKey: "material_key" };
    for (const i of itemUnitIssues(v)) ctx.addIssue({ code: "custom", path: [column[i.path] ?? i.path], message: i.message });
    for (const i of attributeIssues(v.attributes)) ctx.addIssue({ code: "custom", path: [ATTRIBUTE_COLUMNS[i.path]], message: i.message });
  });
export type PriceBookCsvRow = z.output<typeof priceBookCsvRowSchema>;

export interface CsvRowError {
  /** Spreadsheet row number: the header is row 1, the first item row 2. */
  row: number;
  column: string;
  message: string;
}

export interface PriceBookImportPreview {
  valid: boolean;
  committed: boolean;
  errors: CsvRowError[];
  warnings: string[];
  rows: Array<{ row: number; sku: string; action: "create" | "update" | "unchanged"; changes: string[] }>;
  summary: { create: number; update: number; unchanged: number };
}
