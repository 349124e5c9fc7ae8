/**
 * Renders PDFs off the main thread: a small pool (default 2) of worker threads, each parsing the fonts
 * once. A request goes to the least busy worker; a worker that dies is replaced and its requests fail.
 *
 * TypeScript in a worker: on Node 20, `new Worker(url, { execArgv: ["--import", "tsx"] })` does not work:
 * the loader registered by --import does not reach the worker's module loading ("Unknown file extension
 * .ts"), whether the parent runs under tsx (npm start) or vitest (checked on Node 20.20). So each worker
 * starts a plain-JavaScript bootstrap (pdf-worker-boot.mjs) that registers tsx's ESM hooks from inside
 * the worker (`tsx/esm/api` register()) and then imports the TypeScript entry (pdf-render.worker.ts).
 * Tested under vitest (tests/server/proposal-pdf.test.ts) and under tsx (scripts/bench-pdf.ts).
 */
import { Worker } from "node:worker_threads";
import { createRequire } from "node:module";
import { pathToFileURL } from "node:url";
import { dirname, join } from "node:path";
import type { ProposalDocDto } from "../../shared/schemas/proposal";
import type { InstallPacketDocDto } from "../../shared/schemas/install-packet";
import type { PdfJob, PdfReply } from "./pdf-render.worker";

interface Slot {
  worker: Worker;
  ready: Promise<void>;
  pending: Map<number, { resolve: (b: Buffer) => void; reject: (e: Error) => void }>;
}

type JobInput = { kind: "proposal"; doc: ProposalDocDto } | { kind: "install-packet"; doc: InstallPacketDocDto; images?: Record<number, Uint8Array> };

export class PdfWorkerPool {
  private slots: (Slot | null)[];
  private nextId = 1;
  private closed = false;

  constructor(private readonly size = 2) {
    this.slots = Array.from({ length: Math.max(1, Math.min(size, 4)) }, () => null);
  }

  private start(): Slot {
    const tsxDir = dirname(createRequire(import.meta.url).resolve("tsx/package.json"));
    const worker = new Worker(new URL("./pdf-worker-boot.mjs", import.meta.url), {
      execArgv: [],
      workerData: {
        entry: new URL("./pdf-render.worker.ts", import.meta.url).href,
        tsxApi: pathToFileURL(join(tsxDir, "dist/esm/api/index.mjs")).href,
      },
    });
    worker.unref();
    const pending: Slot["pending"] = new Map();
    const ready = new Promise<void>((resolve, reject) => {
      const onMessage = (m: PdfReply | { ready: true }) => {
        if ("ready" in m) {
          resolve();
          return;
        }
        const p = pending.get(m.id);
        if (!p) return;
        pending.delete(m.id);
        if (m.ok) p.resolve(Buffer.from(m.pdf.buffer, m.pdf.byteOffset, m.pdf.byteLength));
        else p.reject(new Error(`PDF worker: ${m.error}`));
      };
      worker.on("message", onMessage);
      worker.once("error", reject);
    });
    const slot: Slot = { worker, ready, pending };
    const fail = (err: Error) => {
      for (const p of pending.values()) p.reject(err);
      pending.clear();
      const i = this.slots.indexOf(slot);
      if (i >= 0) this.slots[i] = null; // replaced on the next request
    };
    worker.on("error", (e) => fail(e instanceof Error ? e : new Error(String(e))));
    worker.on("exit", (code) => fail(new Error(`PDF worker exited with code ${code}`)));
    return slot;
  }

  private pick(): Slot {
    let best = -1;
    for (let i = 0; i < this.slots.length; i++) {
      const s = this.slots[i];
      if (!s) {
        this.slots[i] = this.start();
        return this.slots[i]!;
      }
      if (best < 0 || s.pending.size < this.slots[best]!.pending.size) best = i;
    }
    return this.slots[best]!;
  }

  async render(job: JobInput): Promise<Buffer> {
    if (this.closed) throw new Error("The PDF worker pool is closed");
    const slot = this.pick();
    await slot.ready;
    const id = this.nextId++;
    return new Promise<Buffer>((resolve, reject) => {
      slot.pending.set(id, { resolve, reject });
      slot.worker.ref();
      slot.worker.postMessage({ id, ...job } as PdfJob);
    }).finally(() => {
      if (slot.pending.size === 0) slot.worker.unref();
    });
  }

  /** Starts the workers now (fonts parsed) instead of on the first request. */
  async warm(): Promise<void> {
    for (let i = 0; i < this.slots.length; i++) if (!this.slots[i]) this.slots[i] = this.start();
    await Promise.all(this.slots.map((s) => s!.ready));
  }

  async close(): Promise<void> {
    this.closed = true;
    await Promise.all(this.slots.map((s) => s?.worker.terminate()));
    this.slots = this.slots.map(() => null);
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
