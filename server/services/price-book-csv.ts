/**
 * Price-book CSV: the export's serializer and the import's parser (pure; no database).
 *
 * File: UTF-8 (a byte-order mark is ignored; a file that is not valid UTF-8 is read as Windows-1252, as older
 * spreadsheet programs save it), comma-separated, CRLF or LF line ends, RFC 4180 quoting. Row 1 holds the
 * column names (any order, case and surrounding spaces ignored); the columns are CSV_COLUMNS, of which
 * CSV_REQUIRED_COLUMNS must be present. Unit costs are in dollars ("12.50"). Rows are numbered as a
 * spreadsheet shows them (the header is row 1); blank rows are skipped.
 *
 * Spreadsheet formula injection: a text cell starting with = + - @ is written with a leading apostrophe,
 * which the import removes again, so a round trip gives back the same text.
 */
import { parse } from "csv-parse/sync";
import { stringify } from "csv-stringify/sync";
import {
  ATTRIBUTE_COLUMNS,
  CSV_BASE_COLUMNS,
  CSV_COLUMNS,
  CSV_REQUIRED_COLUMNS,
  PRICE_BOOK_CSV_MAX_ROWS,
  priceBookCsvRowSchema,
  type AttributeName,
  type CatalogItemDto,
  type CsvRowError,
  type PriceBookCsvRow,
} from "../../shared/schemas/price-book";

const FORMULA_START = /^[=+\-@\t\r]/;
const TEXT_COLUMNS = new Set(["name", "colour"]);

const escapeFormula = (s: string) => (FORMULA_START.test(s) ? `'${s}` : s);
const unescapeFormula = (s: string) => (/^'[=+\-@\t\r]/.test(s) ? s.slice(1) : s);

/** Plain decimal text for a number: 12, 3.5, 0.125 (no exponent, no trailing zeros). */
function decimalText(n: number): string {
  if (Number.isInteger(n)) return String(n);
  return n.toFixed(6).replace(/0+$/, "").replace(/\.$/, "");
}

export const centsToDollars = (cents: number) => `${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, "0")}`;

/** One CSV row (header order) for an item. */
export function itemToCsvCells(i: CatalogItemDto): string[] {
  const base: Record<(typeof CSV_BASE_COLUMNS)[number], string> = {
    sku: i.sku,
    category: i.category,
    name: escapeFormula(i.name),
    purchase_unit: i.purchaseUnit,
    pack_coverage: decimalText(i.packCoverage),
    coverage_unit: i.coverageUnit,
    unit_cost: centsToDollars(i.unitCostCents),
    waste_pct: i.wastePct === null ? "" : decimalText(i.wastePct),
    material_key: i.materialKey ?? "",
    active: i.active ? "yes" : "no",
  };
  const attrs = (Object.entries(ATTRIBUTE_COLUMNS) as Array<[AttributeName, string]>).map(([attr]) => {
    const v = i.attributes[attr];
    if (v === undefined || v === null) return "";
    return typeof v === "number" ? decimalText(v) : escapeFormula(String(v));
  });
  return [...CSV_BASE_COLUMNS.map((c) => base[c]), ...attrs];
}

/** The export: header row and one row per item, CRLF line ends (RFC 4180). */
export function serializePriceBookCsv(items: CatalogItemDto[]): string {
  return stringify([[...CSV_COLUMNS], ...items.map(itemToCsvCells)], { record_delimiter: "\r\n", quoted_match: /^\s|\s$/ });
}

function decode(buf: Buffer): string {
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(buf);
  } catch {
    text = new TextDecoder("windows-1252").decode(buf);
  }
  return text.replace(/^\uFEFF/, "");
}

const normaliseHeader = (h: string) => h.replace(/^\uFEFF/, "").trim().toLowerCase().replace(/[\s-]+/g, "_");

export interface ParsedCsvRow {
  row: number;
  data: PriceBookCsvRow;
}

export interface ParsedCsv {
  rows: ParsedCsvRow[];
  errors: CsvRowError[];
  warnings: string[];
  /** Item attributes whose column the file has; the others are left as they are on existing items. */
  attributesInFile: Set<string>;
}

/**
 * Parses and validates a price-book CSV: every row is checked, and every problem is reported with its
 * spreadsheet row number and column. Duplicate SKUs (letter case ignored, as the database compares them)
 * are reported on the later row.
 */
export function parsePriceBookCsv(buf: Buffer): ParsedCsv {
  const errors: CsvRowError[] = [];
  const warnings: string[] = [];
  let records: string[][];
  try {
    records = parse(decode(buf), { relax_column_count: true, skip_empty_lines: false, trim: false }) as string[][];
  } catch (err) {
    const e = err as { message?: string; lines?: number };
    return {
      rows: [],
      errors: [{ row: typeof e.lines === "number" ? e.lines : 1, column: "file", message: `The file is not valid CSV: ${e.message ?? "unreadable"}` }],
      warnings,
      attributesInFile: new Set(),
    };
  }
  const isBlank = (r: string[]) => r.every((c) => c.trim() === "");
  const headerIndex = records.findIndex((r) => !isBlank(r));
  if (headerIndex < 0) return { rows: [], errors: [{ row: 1, column: "file", message: "The file is empty" }], warnings, attributesInFile: new Set() };
  const header = records[headerIndex].map(normaliseHeader);
  const headerRow = headerIndex + 1;
  const known = new Set<string>(CSV_COLUMNS);
  const seen = new Map<string, number>();
  header.forEach((h, i) => {
    if (!h) return;
    if (seen.has(h)) errors.push({ row: headerRow, column: h, message: "This column appears twice" });
    else seen.set(h, i);
    if (!known.has(h)) warnings.push(`Column "${h}" is not a price-book column and was ignored`);
  });
  for (const c of CSV_REQUIRED_COLUMNS) {
    if (!seen.has(c)) errors.push({ row: headerRow, column: c, message: "Missing column" });
  }
  const attributesInFile = new Set(Object.entries(ATTRIBUTE_COLUMNS).filter(([, column]) => seen.has(column)).map(([attr]) => attr));
  if (errors.length) return { rows: [], errors, warnings, attributesInFile };

  const rows: ParsedCsvRow[] = [];
  const skuRow = new Map<string, number>();
  let dataRows = 0;
  for (let r = headerIndex + 1; r < records.length; r++) {
    const cells = records[r];
    const rowNo = r + 1;
    if (isBlank(cells)) continue;
    if (++dataRows > PRICE_BOOK_CSV_MAX_ROWS) {
      errors.push({ row: rowNo, column: "file", message: `At most ${PRICE_BOOK_CSV_MAX_ROWS} items per file` });
      break;
    }
    if (cells.length > header.length && cells.slice(header.length).some((c) => c.trim() !== "")) {
      errors.push({ row: rowNo, column: "row", message: `This row has ${cells.length} cells but the header has ${header.length} columns` });
      continue;
    }
    const obj: Record<string, string> = {};
    for (const [name, idx] of seen) {
      if (!known.has(name)) continue;
      const raw = cells[idx] ?? "";
      obj[name] = TEXT_COLUMNS.has(name) ? unescapeFormula(raw) : raw;
    }
    const parsed = priceBookCsvRowSchema.safeParse(obj);
    if (!parsed.success) {
      const byColumn = new Set<string>();
      for (const issue of parsed.error.issues) {
        const column = String(issue.path[0] ?? "row");
        if (byColumn.has(column)) continue;
        byColumn.add(column);
        errors.push({ row: rowNo, column, message: issue.message });
      }
      continue;
    }
    const skuKey = parsed.data.sku.toLowerCase();
    const first = skuRow.get(skuKey);
    if (first !== undefined) {
      errors.push({ row: rowNo, column: "sku", message: `Same SKU as row ${first}` });
      continue;
    }
    skuRow.set(skuKey, rowNo);
    rows.push({ row: rowNo, data: parsed.data });
  }
  if (!errors.length && rows.length === 0) errors.push({ row: headerRow + 1, column: "file", message: "The file has no item rows" });
  return { rows, errors, warnings, attributesInFile };
}
