/**
 * A small typesetter over pdfkit: our own line breaking and page flow, so every height is measured
 * before anything is drawn (no text cut at a page end) and each character is drawn with a font face that
 * has its glyph (Inter ships as unicode-range subsets; see fonts.ts).
 *
 * Coordinates are PDF points from the top-left of the page (pdfkit's convention).
 */
import PDFDocument from "pdfkit";
import { FONT_WEIGHTS, faceFor, type FontFace, type FontFamily, type FontWeight } from "./fonts";

export type Doc = PDFKit.PDFDocument;

export interface TextStyle {
  weight?: FontWeight;
  size?: number;
  color?: string;
  /** Line height as a multiple of the size. */
  leading?: number;
}

export interface Run {
  face: FontFace;
  text: string;
}

export const COLORS = {
  ink: "#1d262d",
  muted: "#5a6872",
  faint: "#8c99a3",
  accent: "#1f5670",
  accentLight: "#e6eff4",
  copper: "#b7612a",
  rule: "#d3dbe1",
  zebra: "#f5f8fa",
  cautionFill: "#fff7e8",
  cautionLine: "#d69a2d",
  okFill: "#eaf6ee",
  okLine: "#3f8f5a",
  link: "#1b5fa8",
} as const;

/**
 * Caches shared by every document of a process: measured widths (per face, size and text) and pdfkit's
 * per-font layout cache (the shaped glyph runs of each word, already scaled). Both depend only on the
 * font, so a second PDF shapes no word the first one shaped. Bounded: cleared past a size.
 */
const WIDTHS = new Map<string, number>();
const LAYOUTS = new Map<string, Record<string, unknown>>();
const MAX_CACHED = 50_000;

/** Look-alikes for characters outside Inter's fontsource subsets. */
const SUBSTITUTES: Record<string, string> = {
  "→": "->",
  "←": "<-",
  "↑": "^",
  "↓": "v",
  "✓": "v",
  "✔": "v",
  "≥": ">=",
  "≤": "<=",
  "≈": "~",
  "⚠": "!",
};

export class Typesetter {
  private readonly widths = WIDTHS;
  private readonly used = new Set<string>();

  constructor(
    readonly doc: Doc,
    readonly family: FontFamily,
  ) {
    if (WIDTHS.size > MAX_CACHED) WIDTHS.clear();
    for (const w of FONT_WEIGHTS)
      for (const f of family.faces[w]) doc.registerFont(f.name, f.src as unknown as PDFKit.Mixins.PDFFontSource);
  }

  /** Selects a face; on its first use in this document, points pdfkit's layout cache at the shared one. */
  private select(face: FontFace, size: number): Doc {
    this.doc.font(face.name).fontSize(size);
    if (!this.used.has(face.name)) {
      this.used.add(face.name);
      // pdfkit keeps shaped words in EmbeddedFont.layoutCache (a private field): share it between documents.
      const font = (this.doc as unknown as { _font?: { layoutCache?: Record<string, unknown> } })._font;
      if (font && font.layoutCache && typeof face.src !== "string") {
        let shared = LAYOUTS.get(face.name);
        if (!shared || Object.keys(shared).length > MAX_CACHED) {
          shared = Object.create(null) as Record<string, unknown>;
          LAYOUTS.set(face.name, shared);
        }
        font.layoutCache = shared;
      }
    }
    return this.doc;
  }

  /** Splits text into runs, each drawable with one face. Whitespace stays in the current run. */
  runs(text: string, weight: FontWeight = "regular"): Run[] {
    const out: Run[] = [];
    let cur: FontFace | null = null;
    let buf = "";
    for (const raw of text) {
      // A character no face has (the fontsource subsets leave out arrows and some symbols) is written
      // with look-alike characters that are there, rather than drawn as a box.
      const sub = SUBSTITUTES[raw];
      const ch = sub !== undefined && !faceFor(this.family, weight, raw.codePointAt(0)!).covered ? sub : raw;
      if (ch.length > 1 || ch !== raw) {
        for (const c of ch) {
          const f: FontFace = faceFor(this.family, weight, c.codePointAt(0)!).face;
          if (f === cur) buf += c;
          else {
            if (cur && buf) out.push({ face: cur, text: buf });
            cur = f;
            buf = c;
          }
        }
        continue;
      }
      const cp = ch.codePointAt(0)!;
      if (cur && (cur.has(cp) || cp === 32)) {
        buf += ch;
        continue;
      }
      const f: FontFace = faceFor(this.family, weight, cp).face;
      if (f === cur) {
        buf += ch;
        continue;
      }
      if (cur && buf) out.push({ face: cur, text: buf });
      cur = f;
      buf = ch;
    }
    if (cur && buf) out.push({ face: cur, text: buf });
    return out;
  }

  private runWidth(face: FontFace, text: string, size: number): number {
    const key = `${face.name}|${size}|${text}`;
    let w = this.widths.get(key);
    if (w === undefined) {
      w = this.select(face, size).widthOfString(text);
      this.widths.set(key, w);
    }
    return w;
  }

  width(text: string, style: TextStyle = {}): number {
    const size = style.size ?? 10;
    let w = 0;
    for (const r of this.runs(text, style.weight)) w += this.runWidth(r.face, r.text, size);
    return w;
  }

  lineHeight(style: TextStyle = {}): number {
    return (style.size ?? 10) * (style.leading ?? 1.35);
  }

  /** Breaks text into lines no wider than maxWidth; "\n" starts a new line; over-long words are split. */
  wrap(text: string, maxWidth: number, style: TextStyle = {}): string[] {
    const lines: string[] = [];
    const space = this.width(" ", style);
    for (const para of text.split("\n")) {
      const words = para.split(/ +/).filter((w) => w.length > 0);
      let line = "";
      let lineW = 0;
      for (const word of words) {
        const w = this.width(word, style);
        if (line && lineW + space + w <= maxWidth) {
          line += " " + word;
          lineW += space + w;
          continue;
        }
        if (line) lines.push(line);
        if (w <= maxWidth) {
          line = word;
          lineW = w;
          continue;
        }
        // A word wider than the line (a long URL or name): split it by characters.
        let chunk = "";
        for (const ch of word) {
          if (chunk && this.width(chunk + ch, style) > maxWidth) {
            lines.push(chunk);
            chunk = "";
          }
          chunk += ch;
        }
        line = chunk;
        lineW = this.width(chunk, style);
      }
      lines.push(line);
    }
    return lines;
  }

  height(text: string, maxWidth: number, style: TextStyle = {}): number {
    return this.wrap(text, maxWidth, style).length * this.lineHeight(style);
  }

  /** Draws one line (no wrapping) with its top at y. */
  line(
    text: string,
    x: number,
    y: number,
    style: TextStyle = {},
    opts: { align?: "left" | "right" | "center"; width?: number; link?: string; underline?: boolean } = {},
  ): number {
    const size = style.size ?? 10;
    const runs = this.runs(text, style.weight);
    let total = 0;
    const widths = runs.map((r) => {
      const w = this.runWidth(r.face, r.text, size);
      total += w;
      return w;
    });
    let cx = x;
    if (opts.align === "right" && opts.width !== undefined) cx = x + opts.width - total;
    if (opts.align === "center" && opts.width !== undefined) cx = x + (opts.width - total) / 2;
    // Baseline offset from the top of the line box: half the extra leading above the text.
    const top = y + (this.lineHeight(style) - size * 1.2) / 2;
    this.doc.fillColor(style.color ?? COLORS.ink);
    runs.forEach((r, i) => {
      this.select(r.face, size).text(r.text, cx, top, {
        lineBreak: false,
        link: opts.link ?? undefined,
        underline: opts.underline ?? false,
      });
      cx += widths[i];
    });
    return total;
  }

  /** Draws wrapped text from y; returns the y below it. */
  block(text: string, x: number, y: number, width: number, style: TextStyle = {}, opts: { align?: "left" | "right" | "center"; link?: string } = {}): number {
    const lh = this.lineHeight(style);
    for (const l of this.wrap(text, width, style)) {
      this.line(l, x, y, style, { ...opts, width });
      y += lh;
    }
    return y;
  }
}

export interface FlowOptions {
  margins: { top: number; bottom: number; left: number; right: number };
  /** Drawn on each page after the first (a running header); returns the y where content starts. */
  onNewPage?: (flow: Flow) => number;
}

/** The page flow: a cursor that moves down and starts a new page when the next piece does not fit. */
export class Flow {
  y: number;
  readonly left: number;
  readonly width: number;
  readonly bottom: number;
  readonly pageWidth: number;
  readonly pageHeight: number;

  constructor(
    readonly ts: Typesetter,
    private readonly opts: FlowOptions,
  ) {
    const doc = ts.doc;
    doc.addPage({ size: "LETTER", margins: { top: 0, bottom: 0, left: 0, right: 0 } });
    this.pageWidth = doc.page.width;
    this.pageHeight = doc.page.height;
    this.left = opts.margins.left;
    this.width = this.pageWidth - opts.margins.left - opts.margins.right;
    this.bottom = this.pageHeight - opts.margins.bottom;
    this.y = opts.margins.top;
  }

  get doc(): Doc {
    return this.ts.doc;
  }

  get remaining(): number {
    return this.bottom - this.y;
  }

  newPage(): void {
    this.doc.addPage({ size: "LETTER", margins: { top: 0, bottom: 0, left: 0, right: 0 } });
    this.y = this.opts.margins.top;
    if (this.opts.onNewPage) this.y = this.opts.onNewPage(this);
  }

  /** Starts a new page unless `height` fits below the cursor. */
  ensure(height: number): void {
    if (this.y + height > this.bottom) this.newPage();
  }

  gap(h: number): void {
    this.y += h;
  }

  /** Wrapped text that may continue on the next page, line by line. */
  text(text: string, style: TextStyle = {}, opts: { indent?: number; width?: number; after?: number; link?: string } = {}): void {
    const x = this.left + (opts.indent ?? 0);
    const width = opts.width ?? this.width - (opts.indent ?? 0);
    const lh = this.ts.lineHeight(style);
    for (const l of this.ts.wrap(text, width, style)) {
      this.ensure(lh);
      this.ts.line(l, x, this.y, style, { width, link: opts.link });
      this.y += lh;
    }
    this.y += opts.after ?? 0;
  }

  /** A bullet list item: the bullet, then text wrapped beside it. */
  bullet(text: string, style: TextStyle = {}, opts: { indent?: number; after?: number; marker?: string } = {}): void {
    const indent = opts.indent ?? 0;
    const x = this.left + indent;
    const markerW = 12;
    const width = this.width - indent - markerW;
    const lh = this.ts.lineHeight(style);
    const lines = this.ts.wrap(text, width, style);
    lines.forEach((l, i) => {
      this.ensure(lh * (i === 0 ? Math.min(2, lines.length) : 1));
      if (i === 0) this.ts.line(opts.marker ?? "•", x, this.y, { ...style, color: COLORS.accent });
      this.ts.line(l, x + markerW, this.y, style, { width });
      this.y += lh;
    });
    this.y += opts.after ?? 2;
  }

  /** A section heading kept with at least `keep` points of what follows. */
  heading(text: string, opts: { size?: number; keep?: number; before?: number; color?: string } = {}): void {
    const size = opts.size ?? 13;
    const style: TextStyle = { weight: "bold", size, color: opts.color ?? COLORS.accent, leading: 1.25 };
    if (this.y > this.opts.margins.top + 1) this.y += opts.before ?? 14;
    const h = this.ts.height(text, this.width, style);
    this.ensure(h + (opts.keep ?? 40));
    this.y = this.ts.block(text, this.left, this.y, this.width, style);
    this.y += 4;
  }

  rule(color: string = COLORS.rule, weight = 0.6): void {
    this.doc.save().moveTo(this.left, this.y).lineTo(this.left + this.width, this.y).lineWidth(weight).strokeColor(color).stroke().restore();
  }
}

/** A new PDF document that collects its bytes; call `finish()` after drawing. */
export function newDocument(info: { title: string; author: string; subject?: string; created?: Date }) {
  const doc = new PDFDocument({
    autoFirstPage: false,
    bufferPages: true,
    size: "LETTER",
    info: {
      Title: info.title,
      Author: info.author,
      Subject: info.subject ?? "",
      Creator: "Ridgewright",
      Producer: "Ridgewright",
      CreationDate: info.created ?? new Date(),
    },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("data", (c: Buffer) => chunks.push(c));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  return {
    doc,
    finish(): Promise<Buffer> {
      doc.end();
      return done;
    },
  };
}

/** Draws "Page N of M" (and a left note) on every buffered page. */
export function drawPageFooters(ts: Typesetter, margins: { left: number; right: number; bottom: number }, leftNote: string): void {
  const doc = ts.doc;
  const range = doc.bufferedPageRange();
  const total = range.count;
  for (let i = range.start; i < range.start + total; i++) {
    doc.switchToPage(i);
    const w = doc.page.width - margins.left - margins.right;
    const y = doc.page.height - margins.bottom + 18;
    doc.save().moveTo(margins.left, y - 6).lineTo(margins.left + w, y - 6).lineWidth(0.5).strokeColor(COLORS.rule).stroke().restore();
    const style: TextStyle = { size: 8, color: COLORS.muted };
    const pageText = `Page ${i - range.start + 1} of ${total}`;
    const pw = ts.width(pageText, style);
    const note = ts.wrap(leftNote, w - pw - 24, style)[0] ?? "";
    ts.line(note, margins.left, y, style);
    ts.line(pageText, margins.left, y, style, { align: "right", width: w });
  }
}

/** A closed polygon path (PDF points). */
export function polygonPath(doc: Doc, pts: readonly (readonly [number, number])[]): Doc {
  doc.moveTo(pts[0][0], pts[0][1]);
  for (let i = 1; i < pts.length; i++) doc.lineTo(pts[i][0], pts[i][1]);
  return doc.closePath();
}

/** The original Ridgewright-drawn company mark: a rounded tile with a ridge line and panel seams, plus initials. */
export function drawCompanyMark(ts: Typesetter, x: number, y: number, size: number, name: string): void {
  const doc = ts.doc;
  doc.save();
  doc.roundedRect(x, y, size, size, size * 0.18).fill(COLORS.accent);
  // Roof: a low gable with three seams, in white; a copper eave line.
  const s = size;
  const peak: [number, number] = [x + s * 0.5, y + s * 0.2];
  const l: [number, number] = [x + s * 0.14, y + s * 0.52];
  const r: [number, number] = [x + s * 0.86, y + s * 0.52];
  polygonPath(doc, [peak, r, l]).fill("#ffffff");
  doc.lineWidth(s * 0.025).strokeColor(COLORS.accent);
  for (const f of [0.32, 0.5, 0.68]) {
    const topY = f === 0.5 ? peak[1] + s * 0.06 : y + s * (0.2 + Math.abs(f - 0.5) * 0.64 + 0.06);
    doc.moveTo(x + s * f, topY).lineTo(x + s * f, y + s * 0.5).stroke();
  }
  doc.moveTo(l[0], l[1] + s * 0.04).lineTo(r[0], r[1] + s * 0.04).lineWidth(s * 0.045).strokeColor(COLORS.copper).stroke();
  doc.restore();
  const initials =
    name
      .split(/\s+/)
      .filter((w) => /^\p{L}/u.test(w))
      .slice(0, 2)
      .map((w) => w[0].toUpperCase())
      .join("") || "R";
  const style: TextStyle = { weight: "bold", size: s * 0.24, color: "#ffffff", leading: 1 };
  ts.line(initials, x, y + s * 0.62, style, { align: "center", width: s });
}
