/**
 * Roof planes as CSV: one row per plane, for importing measurements from a spreadsheet and exporting a
 * roof. Pure (no Node or DOM), so the browser previews a file exactly as the server will read it.
 *
 * Columns (header row required; names are case-insensitive; only name, pitch and shape are required):
 *   name       plane name (up to 120 characters)
 *   pitch      rise per 12 of run: `6` or `6/12` (0–24)
 *   shape      rectangle | triangle | trapezoid | outline
 *   x, y       plan position (ft) of the eave's left end (the shape's lower-left corner); default 0
 *   width      rectangle: width along the eave; triangle and trapezoid: the eave (bottom) width (ft)
 *   depth      plan depth from the eave to the top (ft): the ridge, or the apex of a triangle
 *   top_width  trapezoid only: the top (ridge) width, centred over the eave (ft)
 *   rotation   degrees anticlockwise about (x, y); default 0
 *   outline    outline only: corners in plan feet, `"x1 y1; x2 y2; x3 y3"` (at least 3)
 *   eave_edge  the eave's edge number (edge i runs from corner i to corner i + 1); default 0, which for
 *              rectangle, triangle and trapezoid is the bottom edge
 *   stack      the layer stack id; blank = the roof's default stack
 * Blank lines are skipped; a UTF-8 byte-order mark and Windows line ends are accepted.
 */
import { z } from "zod";
import { MAX_PLANES, planeSchema } from "./schemas/takeoff";
import { isGeometryError, planeGeometry } from "./engine/roof/geometry";

export const ROOF_CSV_COLUMNS = [
  "name",
  "pitch",
  "shape",
  "x",
  "y",
  "width",
  "depth",
  "top_width",
  "rotation",
  "outline",
  "eave_edge",
  "stack",
] as const;
export type RoofCsvColumn = (typeof ROOF_CSV_COLUMNS)[number];
export const ROOF_CSV_REQUIRED: readonly RoofCsvColumn[] = ["name", "pitch", "shape"];
export const ROOF_CSV_SHAPES = ["rectangle", "triangle", "trapezoid", "outline"] as const;
export type RoofCsvShape = (typeof ROOF_CSV_SHAPES)[number];
/** Largest file the import reads. */
export const ROOF_CSV_MAX_BYTES = 1024 * 1024;

export type CsvPlane = z.output<typeof planeSchema>;

export interface RoofCsvError {
  /** Spreadsheet row number (the header is row 1). */
  row: number;
  /** A column name, or "file" / "row" for problems of the whole file or row. */
  column: string;
  message: string;
}

export interface RoofCsvResult {
  planes: CsvPlane[];
  /** The row number of each plane. */
  rows: number[];
  errors: RoofCsvError[];
}

export interface RoofCsvOptions {
  /** Plane ids already in the roof (new ids avoid them). */
  existingIds?: readonly string[];
  /** Stack ids the `stack` column may name; when given, any other is an error. */
  stackIds?: readonly string[];
  /** Prefix of the new plane ids (default "csv"). */
  idPrefix?: string;
  /** Planes already in the roof (the total may not pass MAX_PLANES). */
  existingCount?: number;
}

// ---------------------------------------------------------------------------------------------------
// CSV text (RFC 4180)
// ---------------------------------------------------------------------------------------------------

/** Splits CSV text into records (quoted cells may hold commas, quotes and line breaks). */
export function parseCsvRecords(text: string): { records: string[][]; lines: number[]; error?: { line: number; message: string } } {
  const src = text.replace(/^\uFEFF/, "");
  const records: string[][] = [];
  const lines: number[] = [];
  let record: string[] = [];
  let cell = "";
  let quoted = false;
  let line = 1;
  let recordLine = 1;
  let i = 0;
  const endRecord = () => {
    record.push(cell);
    records.push(record);
    lines.push(recordLine);
    record = [];
    cell = "";
  };
  while (i < src.length) {
    const ch = src[i]!;
    if (quoted) {
      if (ch === '"') {
        if (src[i + 1] === '"') {
          cell += '"';
          i += 2;
          continue;
        }
        quoted = false;
        i++;
        const next = src[i];
        if (next !== undefined && next !== "," && next !== "\n" && next !== "\r") {
          return { records, lines, error: { line, message: "A closing quote must end its cell (write a quote inside a quoted cell as \"\")" } };
        }
        continue;
      }
      if (ch === "\n") line++;
      cell += ch;
      i++;
      continue;
    }
    if (ch === '"' && cell.trim() === "") {
      quoted = true;
      cell = "";
      i++;
      continue;
    }
    if (ch === ",") {
      record.push(cell);
      cell = "";
      i++;
      continue;
    }
    if (ch === "\r" || ch === "\n") {
      endRecord();
      i += ch === "\r" && src[i + 1] === "\n" ? 2 : 1;
      line++;
      recordLine = line;
      continue;
    }
    cell += ch;
    i++;
  }
  if (quoted) return { records, lines, error: { line: recordLine, message: "A quoted cell is never closed" } };
  if (cell !== "" || record.length > 0) endRecord();
  return { records, lines };
}

const needsQuotes = /[",\r\n]|^\s|\s$/;
const quoteCell = (v: string) => (needsQuotes.test(v) ? `"${v.replace(/"/g, '""')}"` : v);
/** Spreadsheet programs run a cell starting with these as a formula: such names are written with a leading '. */
const FORMULA_START = /^[=+\-@\t\r]/;

/** Numbers as short decimals (at most 3 places, no trailing zeros). */
export function formatNumber(n: number): string {
  const r = Math.round(n * 1000) / 1000;
  return Object.is(r, -0) ? "0" : String(r);
}

// ---------------------------------------------------------------------------------------------------
// export
// ---------------------------------------------------------------------------------------------------

/** The roof's planes as CSV (every plane as an outline), header first, CRLF line ends. */
export function roofToCsv(planes: ReadonlyArray<Pick<CsvPlane, "name" | "pitch" | "outline" | "eaveEdge"> & { stackId?: string }>): string {
  const lines = [ROOF_CSV_COLUMNS.join(",")];
  for (const p of planes) {
    const name = FORMULA_START.test(p.name) ? `'${p.name}` : p.name;
    const cells: Record<RoofCsvColumn, string> = {
      name,
      pitch: formatNumber(p.pitch),
      shape: "outline",
      x: "",
      y: "",
      width: "",
      depth: "",
      top_width: "",
      rotation: "",
      outline: p.outline.map(([x, y]) => `${formatNumber(x)} ${formatNumber(y)}`).join("; "),
      eave_edge: String(p.eaveEdge),
      stack: p.stackId ?? "",
    };
    lines.push(ROOF_CSV_COLUMNS.map((c) => quoteCell(cells[c])).join(","));
  }
  return lines.join("\r\n") + "\r\n";
}

// ---------------------------------------------------------------------------------------------------
// import
// ---------------------------------------------------------------------------------------------------

const NUM_RE = /^[-+]?(\d+(\.\d*)?|\.\d+)$/;

/** `6`, `6/12`, `4.5 / 12` → rise per 12; null when not a pitch. */
export function parsePitch(raw: string): number | null {
  const m = raw.trim().match(/^([-+]?(?:\d+(?:\.\d*)?|\.\d+))\s*(?:(?:\/|:|in)\s*12)?$/i);
  return m ? Number(m[1]) : null;
}

/** `"x1 y1; x2 y2; …"` (a comma between x and y also works) → corners, or a message. */
export function parseOutline(raw: string): [number, number][] | string {
  const parts = raw.split(";").map((s) => s.trim()).filter((s) => s !== "");
  const pts: [number, number][] = [];
  for (let i = 0; i < parts.length; i++) {
    const xy = parts[i]!.split(/[\s,]+/).filter(Boolean);
    if (xy.length !== 2 || !NUM_RE.test(xy[0]!) || !NUM_RE.test(xy[1]!)) {
      return `Corner ${i + 1} ("${parts[i]}") is not two numbers: write corners as "x1 y1; x2 y2; x3 y3" in feet`;
    }
    pts.push([Number(xy[0]), Number(xy[1])]);
  }
  if (pts.length < 3) return `A plane needs at least 3 corners (found ${pts.length}); write them as "x1 y1; x2 y2; x3 y3"`;
  return pts;
}

const round3 = (n: number) => {
  const r = Math.round(n * 1000) / 1000;
  return Object.is(r, -0) ? 0 : r;
};

/** The shape's corners before placing: eave (edge 0) along the bottom from (0, 0). */
function shapeCorners(shape: Exclude<RoofCsvShape, "outline">, w: number, d: number, top: number): [number, number][] {
  if (shape === "rectangle") return [[0, 0], [w, 0], [w, d], [0, d]];
  if (shape === "triangle") return [[0, 0], [w, 0], [w / 2, d]];
  const inset = (w - top) / 2;
  return [[0, 0], [w, 0], [w - inset, d], [inset, d]];
}

/** Rotates (anticlockwise, degrees) about the origin, then moves the origin to (x, y). */
function place(pts: [number, number][], x: number, y: number, rotationDeg: number): [number, number][] {
  const a = (rotationDeg * Math.PI) / 180;
  const c = Math.cos(a);
  const s = Math.sin(a);
  return pts.map(([px, py]) => [round3(x + px * c - py * s), round3(y + px * s + py * c)]);
}

/** A free id `${prefix}-${n}`. */
function idMaker(existing: readonly string[], prefix: string) {
  const used = new Set(existing);
  let n = 1;
  return () => {
    while (used.has(`${prefix}-${n}`)) n++;
    const id = `${prefix}-${n}`;
    used.add(id);
    return id;
  };
}

const SCHEMA_COLUMN: Record<string, RoofCsvColumn> = {
  name: "name",
  pitch: "pitch",
  outline: "outline",
  eaveEdge: "eave_edge",
  stackId: "stack",
};

/**
 * Reads and checks every row; returns the planes of the good rows and every problem by row and column.
 * Nothing should be saved while `errors` is not empty.
 */
export function parseRoofCsv(text: string, options: RoofCsvOptions = {}): RoofCsvResult {
  const errors: RoofCsvError[] = [];
  const planes: CsvPlane[] = [];
  const rowNumbers: number[] = [];
  const parsed = parseCsvRecords(text);
  if (parsed.error) return { planes, rows: rowNumbers, errors: [{ row: parsed.error.line, column: "file", message: `The file is not valid CSV: ${parsed.error.message}` }] };
  const { records, lines } = parsed;
  const blank = (r: string[]) => r.every((c) => c.trim() === "");
  const headerIndex = records.findIndex((r) => !blank(r));
  if (headerIndex < 0) return { planes, rows: rowNumbers, errors: [{ row: 1, column: "file", message: "The file is empty" }] };

  const headerRow = lines[headerIndex]!;
  const header = records[headerIndex]!.map((h) => h.trim().toLowerCase().replace(/[\s-]+/g, "_"));
  const at = new Map<RoofCsvColumn, number>();
  header.forEach((h, i) => {
    if (h === "") return;
    if (!(ROOF_CSV_COLUMNS as readonly string[]).includes(h)) {
      errors.push({ row: headerRow, column: h, message: `Unknown column; the columns are ${ROOF_CSV_COLUMNS.join(", ")}` });
    } else if (at.has(h as RoofCsvColumn)) {
      errors.push({ row: headerRow, column: h, message: "This column appears twice" });
    } else at.set(h as RoofCsvColumn, i);
  });
  for (const c of ROOF_CSV_REQUIRED) if (!at.has(c)) errors.push({ row: headerRow, column: c, message: "Missing column" });
  if (errors.length) return { planes, rows: rowNumbers, errors };

  const nextId = idMaker(options.existingIds ?? [], options.idPrefix ?? "csv");
  const stackIds = options.stackIds ? new Set(options.stackIds) : null;
  const room = MAX_PLANES - (options.existingCount ?? 0);
  let count = 0;

  for (let r = headerIndex + 1; r < records.length; r++) {
    const cells = records[r]!;
    if (blank(cells)) continue;
    const row = lines[r]!;
    count++;
    if (count > room) {
      errors.push({ row, column: "file", message: `A roof may have at most ${MAX_PLANES} planes${options.existingCount ? ` (it has ${options.existingCount})` : ""}` });
      break;
    }
    if (cells.length > header.length && cells.slice(header.length).some((c) => c.trim() !== "")) {
      errors.push({ row, column: "row", message: `This row has ${cells.length} cells but the header has ${header.length} columns` });
      continue;
    }
    const rowErrors: RoofCsvError[] = [];
    const fail = (column: RoofCsvColumn | "row", message: string) => rowErrors.push({ row, column, message });
    const cell = (c: RoofCsvColumn) => {
      const i = at.get(c);
      return i === undefined ? "" : (cells[i] ?? "").trim();
    };
    const num = (c: RoofCsvColumn, opts: { required?: boolean; min?: number; minExclusive?: number; max?: number; fallback?: number }) => {
      const raw = cell(c);
      if (raw === "") {
        if (opts.required) fail(c, "Required for this shape");
        return opts.fallback;
      }
      if (!NUM_RE.test(raw)) {
        fail(c, `"${raw}" is not a number (feet, with a decimal point: 12.5)`);
        return undefined;
      }
      const n = Number(raw);
      if (opts.minExclusive !== undefined && !(n > opts.minExclusive)) fail(c, `Must be more than ${opts.minExclusive}`);
      else if (opts.min !== undefined && n < opts.min) fail(c, `Must be at least ${opts.min}`);
      else if (opts.max !== undefined && n > opts.max) fail(c, `Must be at most ${opts.max}`);
      return n;
    };
    const mustBeBlank = (c: RoofCsvColumn, shape: string) => {
      if (cell(c) !== "") fail(c, `Not used for a ${shape}; leave it blank`);
    };

    // name (a leading ' that protected a formula-like name in a spreadsheet is dropped)
    let name = cell("name");
    if (/^'[=+\-@]/.test(name)) name = name.slice(1);

    // pitch
    let pitch: number | undefined;
    const pitchRaw = cell("pitch");
    if (pitchRaw === "") fail("pitch", "Required: rise per 12, such as 6 or 6/12");
    else {
      const p = parsePitch(pitchRaw);
      if (p === null) fail("pitch", `"${pitchRaw}" is not a pitch: write the rise per 12, such as 6 or 6/12`);
      else pitch = p;
    }

    // shape and corners
    const shapeRaw = cell("shape").toLowerCase();
    let outline: [number, number][] | undefined;
    let shape: RoofCsvShape | undefined;
    if (shapeRaw === "") fail("shape", `Required: ${ROOF_CSV_SHAPES.join(", ")}`);
    else if (!(ROOF_CSV_SHAPES as readonly string[]).includes(shapeRaw)) {
      fail("shape", `"${cell("shape")}" is not a shape: use ${ROOF_CSV_SHAPES.join(", ")}`);
    } else shape = shapeRaw as RoofCsvShape;

    if (shape === "outline") {
      for (const c of ["x", "y", "width", "depth", "top_width", "rotation"] as const) mustBeBlank(c, "plane given by its outline");
      const raw = cell("outline");
      if (raw === "") fail("outline", 'Required for an outline: corners in feet, "x1 y1; x2 y2; x3 y3"');
      else {
        const pts = parseOutline(raw);
        if (typeof pts === "string") fail("outline", pts);
        else outline = pts;
      }
    } else if (shape) {
      mustBeBlank("outline", shape);
      const x = num("x", { fallback: 0, min: -100_000, max: 100_000 });
      const y = num("y", { fallback: 0, min: -100_000, max: 100_000 });
      const w = num("width", { required: true, minExclusive: 0, max: 10_000 });
      const d = num("depth", { required: true, minExclusive: 0, max: 10_000 });
      const rot = num("rotation", { fallback: 0, min: -360, max: 360 });
      let top = 0;
      if (shape === "trapezoid") {
        const t = num("top_width", { required: true, minExclusive: 0, max: 10_000 });
        if (t !== undefined && w !== undefined && t >= w) fail("top_width", "Must be less than the width (use a rectangle when they are equal)");
        top = t ?? 0;
      } else mustBeBlank("top_width", shape);
      if (rowErrors.length === 0 && x !== undefined && y !== undefined && w !== undefined && d !== undefined && rot !== undefined) {
        outline = place(shapeCorners(shape, w, d, top), x, y, rot);
      }
    }

    // eave edge
    let eaveEdge = 0;
    const eaveRaw = cell("eave_edge");
    if (eaveRaw !== "") {
      if (!/^\d+$/.test(eaveRaw)) fail("eave_edge", `"${eaveRaw}" is not an edge number (0, 1, 2, …)`);
      else {
        eaveEdge = Number(eaveRaw);
        if (outline && eaveEdge >= outline.length) fail("eave_edge", `The eave edge must be an edge number from 0 to ${outline.length - 1}`);
      }
    }

    // stack
    const stack = cell("stack");
    if (stack !== "" && stackIds && !stackIds.has(stack)) {
      const known = [...stackIds];
      fail("stack", `Unknown layer stack "${stack}"${known.length ? ` (this roof has ${known.map((s) => `"${s}"`).join(", ")})` : ""}`);
    }

    if (rowErrors.length === 0 && outline && pitch !== undefined) {
      const candidate = { id: nextId(), name, pitch, outline, eaveEdge, ...(stack ? { stackId: stack } : {}) };
      const checked = planeSchema.safeParse(candidate);
      if (!checked.success) {
        const seen = new Set<string>();
        for (const issue of checked.error.issues) {
          const key = String(issue.path[0] ?? "row");
          const column: RoofCsvColumn | "row" = key === "outline" && shape !== "outline" ? "shape" : (SCHEMA_COLUMN[key] ?? "row");
          if (seen.has(column)) continue;
          seen.add(column);
          fail(column, issue.message);
        }
      } else {
        const g = planeGeometry(checked.data, 0);
        if (isGeometryError(g)) {
          const key = String(g.path[2] ?? "outline");
          const column: RoofCsvColumn | "row" =
            key === "eaveEdge" ? "eave_edge" : key === "pitch" ? "pitch" : shape === "outline" ? "outline" : "shape";
          fail(column, g.reason);
        } else {
          planes.push(checked.data);
          rowNumbers.push(row);
        }
      }
    }
    errors.push(...rowErrors);
  }
  if (errors.length === 0 && planes.length === 0) {
    errors.push({ row: headerRow + 1, column: "file", message: "The file has no plane rows" });
  }
  return { planes, rows: rowNumbers, errors };
}

/** The layer stack a roof gets when planes are imported into a roof that has none (as the sketch does). */
export function defaultImportStack(id = "main") {
  return {
    id,
    name: "Main roof",
    underlayment: { kind: "synthetic" as const, highTemp: true },
    spacer: { kind: "none" as const },
    radiantBarrier: { kind: "none" as const },
    panel: { system: "standing-seam" as const, coverageWidthIn: 16, gauge: 24, solarReflectance: 0.3, thermalEmittance: 0.85 },
  };
}
