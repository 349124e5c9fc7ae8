/**
 * Inter for the PDFs, parsed once per process (or worker) and reused by every document.
 *
 * pdfkit accepts a parsed fontkit font in place of a file, which avoids re-reading and re-parsing the
 * font for each PDF (measured for three text pages: about 230 ms with a path each time, 90 ms reused).
 * The .woff files of @fontsource/inter are unicode-range subsets (latin, latin-ext, cyrillic, …; the
 * .woff2 files crash fontkit on ligatures, so they are not used). pdfkit does no fallback between fonts,
 * so the typesetter (typeset.ts) picks, for each character, the first subset that has a glyph for it:
 * together the subsets cover everything the full Inter covers (Latin with accents such as "Łódź",
 * Cyrillic, Greek, Vietnamese). A character no subset has is drawn with the latin face (a box) and
 * reported by `coverage()`.
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import { inflateSync } from "node:zlib";
import * as fontkit from "fontkit";
import type { FontkitFont } from "fontkit";

export type FontWeight = "regular" | "semibold" | "bold";
export const FONT_WEIGHTS: readonly FontWeight[] = ["regular", "semibold", "bold"];

/** In order of preference: the first that has a character's glyph draws it. */
export const INTER_SUBSETS = ["latin", "latin-ext", "cyrillic", "cyrillic-ext", "greek", "greek-ext", "vietnamese"] as const;
const WEIGHT_NUMBER: Record<FontWeight, number> = { regular: 400, semibold: 600, bold: 700 };

/** One font face the typesetter can draw with. */
export interface FontFace {
  /** Name registered with each document. */
  name: string;
  /** A parsed fontkit font, or the name of one of PDF's built-in fonts ("Helvetica"). */
  src: FontkitFont | string;
  has(codePoint: number): boolean;
}

/** Faces per weight, in order of preference. */
export interface FontFamily {
  id: string;
  faces: Record<FontWeight, FontFace[]>;
}

/**
 * A WOFF 1.0 file as a plain sfnt (TrueType/OpenType) buffer: the tables inflated once.
 * fontkit reads WOFF directly but inflates a table on every access, and pdfkit's subsetter reads the
 * glyph table once per glyph: inflating once here makes a PDF many times faster (WOFF 1.0 spec, W3C).
 */
export function woffToSfnt(woff: Uint8Array): Buffer {
  const src = Buffer.from(woff.buffer, woff.byteOffset, woff.byteLength);
  if (src.toString("latin1", 0, 4) !== "wOFF") return src; // already an sfnt
  const flavor = src.readUInt32BE(4);
  const numTables = src.readUInt16BE(12);
  const tables: { tag: number; checksum: number; data: Buffer }[] = [];
  for (let i = 0; i < numTables; i++) {
    const e = 44 + i * 20;
    const tag = src.readUInt32BE(e);
    const offset = src.readUInt32BE(e + 4);
    const compLength = src.readUInt32BE(e + 8);
    const origLength = src.readUInt32BE(e + 12);
    const checksum = src.readUInt32BE(e + 16);
    const raw = src.subarray(offset, offset + compLength);
    tables.push({ tag, checksum, data: compLength < origLength ? inflateSync(raw) : Buffer.from(raw) });
  }
  let entrySelector = 0;
  while (1 << (entrySelector + 1) <= numTables) entrySelector++;
  const searchRange = (1 << entrySelector) * 16;
  const headerLen = 12 + numTables * 16;
  const total = tables.reduce((s, t) => s + ((t.data.length + 3) & ~3), headerLen);
  const out = Buffer.alloc(total);
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(searchRange, 6);
  out.writeUInt16BE(entrySelector, 8);
  out.writeUInt16BE(numTables * 16 - searchRange, 10);
  let offset = headerLen;
  tables.forEach((t, i) => {
    const d = 12 + i * 16;
    out.writeUInt32BE(t.tag, d);
    out.writeUInt32BE(t.checksum, d + 4);
    out.writeUInt32BE(offset, d + 8);
    out.writeUInt32BE(t.data.length, d + 12);
    t.data.copy(out, offset);
    offset += (t.data.length + 3) & ~3;
  });
  return out;
}

let interCache: FontFamily | null = null;

function interDir(): string {
  const require = createRequire(import.meta.url);
  return join(dirname(require.resolve("@fontsource/inter/package.json")), "files");
}

/** Inter from @fontsource/inter, every subset and weight, parsed on the first call and then reused. */
export function loadInterFonts(): FontFamily {
  if (interCache) return interCache;
  const dir = interDir();
  const faces = {} as Record<FontWeight, FontFace[]>;
  for (const w of FONT_WEIGHTS) {
    faces[w] = INTER_SUBSETS.map((subset) => {
      const font = fontkit.create(woffToSfnt(readFileSync(join(dir, `inter-${subset}-${WEIGHT_NUMBER[w]}-normal.woff`))));
      const set = new Set(font.characterSet);
      return { name: `inter-${subset}-${w}`, src: font, has: (cp: number) => set.has(cp) };
    });
  }
  interCache = { id: "inter", faces };
  return interCache;
}

/** PDF's built-in Helvetica (WinAnsi only: for the benchmark's comparison, not for names). */
export function helveticaFonts(): FontFamily {
  const face = (name: string): FontFace => ({ name: `std-${name}`, src: name, has: () => true });
  return { id: "helvetica", faces: { regular: [face("Helvetica")], semibold: [face("Helvetica-Bold")], bold: [face("Helvetica-Bold")] } };
}

/** The face that draws a character: the first with its glyph, else the first face (draws a box). */
export function faceFor(family: FontFamily, weight: FontWeight, codePoint: number): { face: FontFace; covered: boolean } {
  const list = family.faces[weight];
  for (const f of list) if (f.has(codePoint)) return { face: f, covered: true };
  return { face: list[0], covered: false };
}

/** Which characters of a text no face of the family can draw (whitespace ignored). */
export function coverage(family: FontFamily, text: string, weight: FontWeight = "regular"): { missing: string[] } {
  const missing = new Set<string>();
  for (const ch of text) {
    if (/\s/.test(ch)) continue;
    if (!faceFor(family, weight, ch.codePointAt(0)!).covered) missing.add(ch);
  }
  return { missing: [...missing] };
}
