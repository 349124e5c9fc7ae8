/**
 * CSV export of the stored takeoff and the panel cut list, built in the browser. Fields are quoted when
 * they hold a comma, a quote, a line break or leading/trailing spaces (RFC 4180: quotes doubled); a
 * field starting with = + - @ is prefixed with ' so spreadsheet programs do not run it as a formula.
 */
import type { TakeoffResult } from "@shared/engine/types";
import { MATERIAL_CATEGORIES } from "@shared/engine/materials";

export type CsvValue = string | number | null | undefined;

export function csvField(v: CsvValue): string {
  if (v === null || v === undefined) return "";
  let s = typeof v === "number" ? (Number.isFinite(v) ? String(v) : "") : v;
  if (typeof v === "string" && /^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]|^\s|\s$/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export const toCsv = (rows: CsvValue[][]) => rows.map((r) => r.map(csvField).join(",")).join("\r\n") + "\r\n";

const categoryOrder = (c: string) => {
  const i = (MATERIAL_CATEGORIES as readonly string[]).indexOf(c);
  return i < 0 ? 99 : i;
};

export function takeoffCsv(t: TakeoffResult): string {
  const rows: CsvValue[][] = [["category", "key", "description", "quantity", "unit", "basis"]];
  const sorted = [...t.materials].sort((a, b) => categoryOrder(a.category) - categoryOrder(b.category));
  for (const m of sorted) rows.push([m.category, m.key, m.description, m.quantity, m.unit, m.basis]);
  return toCsv(rows);
}

/** Whole inches as feet and inches: 127 → 10' 7". */
export function feetInches(inches: number): string {
  const ft = Math.floor(inches / 12);
  const inch = Math.round(inches - ft * 12);
  return `${ft}' ${inch}"`;
}

export function cutListCsv(t: TakeoffResult): string {
  const rows: CsvValue[][] = [["plane_id", "plane_name", "system", "coverage_in", "length_in", "length_ft_in", "count"]];
  for (const p of t.planes) {
    for (const c of p.panels.cutList) {
      rows.push([p.id, p.name, p.panels.system, p.panels.coverageWidthIn, c.lengthIn, feetInches(c.lengthIn), c.count]);
    }
  }
  return toCsv(rows);
}

/** Starts a download of `text` as a UTF-8 CSV file (with a byte-order mark for spreadsheet programs). */
export function downloadCsv(filename: string, text: string) {
  const blob = new Blob(["\uFEFF", text], { type: "text/csv;charset=utf-8" });
  const url = URL.createObjectURL(blob);
  const a = document.createElement("a");
  a.href = url;
  a.download = filename;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 0);
}
