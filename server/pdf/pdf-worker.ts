/**
 * Renders PDFs off the main thread: a small pool (default 2, at most 4) of worker threads (WorkerPool), each
 * parsing the fonts once before it says it is ready. A request goes to the least busy worker; a worker that
 * dies is replaced and its requests fail. Tested under vitest (tests/server/proposal-pdf.test.ts) and under tsx
 * (scripts/bench-pdf.ts).
 */
import { WorkerPool } from "../workers/worker-pool";
import type { ProposalDocDto } from "../../shared/schemas/proposal";
import type { InstallPacketDocDto } from "../../shared/schemas/install-packet";
import type { PdfReply } from "./pdf-render.worker";

type JobInput = { kind: "proposal"; doc: ProposalDocDto } | { kind: "install-packet"; doc: InstallPacketDocDto; images?: Record<number, Uint8Array> };

export class PdfWorkerPool {
  private readonly pool: WorkerPool<JobInput, PdfReply>;

  constructor(size = 2) {
    this.pool = new WorkerPool({
      size: Math.min(size, 4),
      entry: new URL("./pdf-render.worker.ts", import.meta.url),
      label: "PDF worker",
      waitForReady: true,
    });
  }

  async render(job: JobInput): Promise<Buffer> {
    const reply = await this.pool.run(job);
    if (!reply.ok) throw new Error(`PDF worker: ${reply.error}`);
    return Buffer.from(reply.pdf.buffer, reply.pdf.byteOffset, reply.pdf.byteLength);
  }

  /** Starts the workers now (fonts parsed) instead of on the first request. */
  warm(): Promise<void> {
    return this.pool.warm();
  }

  close(): Promise<void> {
    return this.pool.close();
  }
}

let shared: PdfWorkerPool | null = null;

/** The process-wide pool (created on first use). */
export function pdfWorkerPool(): PdfWorkerPool {
  if (!shared) shared = new PdfWorkerPool(2);
  return shared;
}

export function renderProposalPdfInWorker(doc: ProposalDocDto): Promise<Buffer> {
  return pdfWorkerPool().render({ kind: "proposal", doc });
}

/** `images`: photo bytes (JPEG/PNG) by attachment id for the packet's photo slots. */
export function renderInstallPacketPdfInWorker(doc: InstallPacketDocDto, images?: Record<number, Uint8Array>): Promise<Buffer> {
  return pdfWorkerPool().render({ kind: "install-packet", doc, images });
}

/** Stops the shared pool (tests, shutdown). */
export async function closePdfWorkers(): Promise<void> {
  if (shared) await shared.close();
  shared = null;
}
