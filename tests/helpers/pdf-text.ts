/**
 * Text of a PDF through pdfjs-dist (legacy build for Node): one string per page, items on the same line
 * joined (no space where two runs touch, as a word drawn in two font subsets does), lines joined by "\n".
 */
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";

interface Item {
  str: string;
  transform: number[];
  width: number;
}

export async function pdfPages(pdf: Buffer | Uint8Array): Promise<string[]> {
  const data = new Uint8Array(pdf.buffer.slice(pdf.byteOffset, pdf.byteOffset + pdf.byteLength));
  const task = getDocument({ data, useSystemFonts: false, isEvalSupported: false, verbosity: 0 });
  const doc = await task.promise;
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const content = await page.getTextContent();
    const items = (content.items as Item[]).filter((it) => typeof it.str === "string" && it.str.length > 0);
    const lines = new Map<number, Item[]>();
    for (const it of items) {
      const y = Math.round(it.transform[5]);
      const key = [...lines.keys()].find((k) => Math.abs(k - y) <= 2) ?? y;
      if (!lines.has(key)) lines.set(key, []);
      lines.get(key)!.push(it);
    }
    const text = [...lines.entries()]
      .sort((a, b) => b[0] - a[0])
      .map(([, its]) => {
        its.sort((a, b) => a.transform[4] - b.transform[4]);
        let s = "";
        let end = -Infinity;
        for (const it of its) {
          const x = it.transform[4];
          if (s && x - end > 1.5) s += " ";
          s += it.str;
          end = x + it.width;
        }
        return s;
      })
      .join("\n");
    pages.push(text);
  }
  await doc.destroy();
  return pages;
}

/** All pages' text in one string. */
export async function pdfText(pdf: Buffer | Uint8Array): Promise<string> {
  return (await pdfPages(pdf)).join("\n");
}

/** Every text item with its page size, for checks that nothing is drawn past the page edges. */
export async function pdfItems(pdf: Buffer | Uint8Array): Promise<{ page: number; str: string; x: number; y: number; width: number; pageWidth: number; pageHeight: number }[]> {
  const data = new Uint8Array(pdf.buffer.slice(pdf.byteOffset, pdf.byteOffset + pdf.byteLength));
  const doc = await getDocument({ data, isEvalSupported: false, verbosity: 0 }).promise;
  const out: { page: number; str: string; x: number; y: number; width: number; pageWidth: number; pageHeight: number }[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const [, , pageWidth, pageHeight] = page.view;
    const content = await page.getTextContent();
    for (const it of content.items as Item[]) {
      if (typeof it.str !== "string" || !it.str.trim()) continue;
      out.push({ page: i, str: it.str, x: it.transform[4], y: it.transform[5], width: it.width, pageWidth, pageHeight });
    }
  }
  await doc.destroy();
  return out;
}

/** Whitespace collapsed, so a sentence wrapped over lines still matches. */
export const squash = (s: string) => s.replace(/\s+/g, " ").trim();
