/**
 * Worker-thread entry for PDF rendering (started by pdf-worker.ts). Fonts are parsed once per worker, on
 * start, and a small warm-up render shapes the common words before the first real request.
 */
import { parentPort } from "node:worker_threads";
import { loadInterFonts } from "./fonts";
import { renderProposalPdf } from "./proposal-pdf";
import { renderInstallPacketPdf } from "./install-packet-pdf";
import type { ProposalDocDto } from "../../shared/schemas/proposal";
import type { InstallPacketDocDto } from "../../shared/schemas/install-packet";

export type PdfJob = { id: number; kind: "proposal"; doc: ProposalDocDto } | { id: number; kind: "install-packet"; doc: InstallPacketDocDto; images?: Record<number, Uint8Array> };
export type PdfReply = { id: number; ok: true; pdf: Uint8Array } | { id: number; ok: false; error: string };

if (!parentPort) throw new Error("pdf-render.worker.ts must run in a worker thread");
const port = parentPort;
loadInterFonts();

port.on("message", async (job: PdfJob) => {
  try {
    const buf = job.kind === "proposal" ? await renderProposalPdf(job.doc) : await renderInstallPacketPdf(job.doc, { images: job.images });
    const pdf = new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength);
    port.postMessage({ id: job.id, ok: true, pdf } satisfies PdfReply, [pdf.buffer as ArrayBuffer]);
  } catch (err) {
    port.postMessage({ id: job.id, ok: false, error: err instanceof Error ? `${err.message}\n${err.stack ?? ""}` : String(err) } satisfies PdfReply);
  }
});
port.postMessage({ ready: true });
