/**
 * Renders one page of a PDF plan to a PNG data URL in the browser with pdfjs-dist. Loaded on demand
 * (`import("./pdf-page")`), so the library and its worker are fetched only when a PDF is placed.
 */
import { GlobalWorkerOptions, getDocument } from "pdfjs-dist/build/pdf.mjs";
import workerUrl from "pdfjs-dist/build/pdf.worker.min.mjs?url";
import type { UnderlayImage } from "./underlay-image";

GlobalWorkerOptions.workerSrc = workerUrl;

/** The rendered page's longer side, px: sharp enough to trace, small enough to keep in memory. */
export const PDF_RENDER_LONG_SIDE = 2400;

export async function renderPdfPage(data: ArrayBuffer, pageNumber: number): Promise<UnderlayImage> {
  const doc = await getDocument({ data: new Uint8Array(data) }).promise;
  try {
    const pageCount = doc.numPages;
    if (pageNumber < 1 || pageNumber > pageCount)
      throw new Error(`This PDF has ${pageCount} ${pageCount === 1 ? "page" : "pages"}; pick a page from 1 to ${pageCount}.`);
    const page = await doc.getPage(pageNumber);
    const base = page.getViewport({ scale: 1 });
    const scale = Math.min(4, PDF_RENDER_LONG_SIDE / Math.max(base.width, base.height));
    const viewport = page.getViewport({ scale });
    const canvas = document.createElement("canvas");
    canvas.width = Math.round(viewport.width);
    canvas.height = Math.round(viewport.height);
    const ctx = canvas.getContext("2d");
    if (!ctx) throw new Error("This browser cannot draw the PDF page.");
    ctx.fillStyle = "white"; // plan sheets are drawn on white; transparent pages would vanish on the grid
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    await page.render({ canvas, canvasContext: ctx, viewport }).promise;
    const url = canvas.toDataURL("image/png");
    page.cleanup();
    return { url, width: canvas.width, height: canvas.height, pageCount, pdf: true };
  } finally {
    void doc.destroy();
  }
}
