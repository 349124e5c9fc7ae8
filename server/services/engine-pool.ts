import { Worker } from "node:worker_threads";
import { HttpError } from "../errors";
import type { RoofDocument } from "../../shared/schemas/roof";
import { computeStoredTakeoffOfParsed, takeoffSquares } from "./roof-takeoff";

/** A stored takeoff to compute: what `computeStoredTakeoffOfParsed` takes. */
export interface EngineTask {
  id: number;
  doc: RoofDocument;
  site: unknown;
  rules: Record<string, unknown>;
}

/** The worker's answer: the takeoff's JSON text and squares, an engine refusal (400) or another error. */
export type EngineReply =
  | { id: number; ok: true; json: string; squares: number | null }
  | { id: number; ok: false; http: { status: number; code: string; message: string; fields?: Record<string, string> } }
  | { id: number; ok: false; error: string };

/** A computed stored takeoff: its JSON text (as stored and answered) and jobs.squares. */
export interface ComputedTakeoff {
  json: string;
  squares: number | null;
}

interface Slot {
  worker: Worker;
  pending: Map<number, { resolve: (r: ComputedTakeoff) => void; reject: (e: Error) => void }>;
}

/** Computes one task (in a worker, or on the event loop for a pool of size 0): its reply, never a throw. */
export function runEngineTask(task: EngineTask): EngineReply {
  try {
    const takeoff = computeStoredTakeoffOfParsed(task.doc, task.site, task.rules);
    return { id: task.id, ok: true, json: JSON.stringify(takeoff), squares: takeoffSquares(takeoff) };
  } catch (err) {
    return err instanceof HttpError
      ? { id: task.id, ok: false, http: { status: err.status, code: err.code, message: err.message, fields: err.fields } }
      : { id: task.id, ok: false, error: err instanceof Error ? (err.stack ?? err.message) : String(err) };
  }
}

/** A reply as the caller's result: the takeoff, the engine's refusal as the same HttpError, or an error. */
function settle(reply: EngineReply, resolve: (r: ComputedTakeoff) => void, reject: (e: Error) => void): void {
  if (reply.ok) resolve({ json: reply.json, squares: reply.squares });
  else if ("http" in reply) reject(new HttpError(reply.http.status, reply.http.code, reply.http.message, reply.http.fields));
  else reject(new Error(`The takeoff could not be computed: ${reply.error}`));
}

const WORKER_URL = new URL("./engine-worker.ts", import.meta.url);

/**
 * The worker's entry: the TypeScript sources are loaded through tsx, as the server's own are (a worker does
 * not inherit the parent's module loader); a compiled `.js` entry is imported as it is.
 */
function bootstrap(url: URL): string {
  const load = `import(${JSON.stringify(url.href)})`;
  return url.pathname.endsWith(".ts") ? `import("tsx/esm/api").then(({ register }) => { register(); return ${load}; })` : load;
}

/**
 * Stored takeoffs computed in worker threads, so the engine's milliseconds per roof (and serialising its result)
 * do not hold up the event loop: while one roof is computed, the server goes on answering other requests and
 * talking to MariaDB, and on a machine with more than one core the two run side by side. Measured with
 * `npm run bench:api` (20 connections saving 12-plane roofs on 2 cores): about 15 % more saves a second than
 * computing them on the event loop.
 *
 * Tasks go to the worker with the fewest waiting. A worker that dies fails only its own waiting tasks (with
 * an error, a 500) and is replaced for the next task. Size 0 computes on the event loop (the same result).
 */
export class EnginePool {
  private readonly slots: Array<Slot | null>;
  private nextId = 1;
  private closed = false;

  constructor(
    readonly size: number,
    private readonly workerUrl: URL = WORKER_URL,
  ) {
    this.slots = Array.from({ length: Math.max(0, Math.trunc(size)) }, () => null);
  }

  /** The engine's takeoff of a parsed roof document for the job's site and the company's rules. */
  storedTakeoff(doc: RoofDocument, site: unknown, rules: Record<string, unknown>): Promise<ComputedTakeoff> {
    if (this.slots.length === 0 || this.closed) {
      return new Promise((resolve, reject) => settle(runEngineTask({ id: 0, doc, site, rules }), resolve, reject));
    }
    const slot = this.pickSlot();
    const id = this.nextId++;
    return new Promise<ComputedTakeoff>((resolve, reject) => {
      if (slot.pending.size === 0) slot.worker.ref(); // a task on its way keeps the process up, as I/O does
      slot.pending.set(id, { resolve, reject });
      const task: EngineTask = { id, doc, site, rules };
      slot.worker.postMessage(task);
    });
  }

  /** Stops the workers; tasks still waiting fail, later tasks are computed on the event loop. */
  async close(): Promise<void> {
    this.closed = true;
    const slots = this.slots.splice(0, this.slots.length, ...this.slots.map(() => null));
    await Promise.all(slots.map((s) => s?.worker.terminate()));
  }

  private pickSlot(): Slot {
    let best = -1;
    for (let i = 0; i < this.slots.length; i++) {
      const s = this.slots[i];
      if (!s) {
        best = i;
        break;
      }
      if (best < 0 || s.pending.size < this.slots[best]!.pending.size) best = i;
    }
    return this.slots[best] ?? (this.slots[best] = this.startWorker(best));
  }

  private startWorker(index: number): Slot {
    const worker = new Worker(bootstrap(this.workerUrl), { eval: true, name: `engine-${index + 1}` });
    worker.unref(); // an idle worker never keeps the process alive
    const slot: Slot = { worker, pending: new Map() };
    worker.on("message", (reply: EngineReply) => {
      const waiting = slot.pending.get(reply.id);
      if (!waiting) return;
      slot.pending.delete(reply.id);
      if (slot.pending.size === 0) slot.worker.unref();
      settle(reply, waiting.resolve, waiting.reject);
    });
    const fail = (err: Error) => {
      if (this.slots[index] === slot) this.slots[index] = null; // the next task starts a new worker
      for (const waiting of slot.pending.values()) waiting.reject(err);
      slot.pending.clear();
    };
    worker.on("error", (err) => fail(new Error(`The engine worker failed: ${err.message}`)));
    worker.on("exit", (code) => fail(new Error(`The engine worker stopped (exit code ${code})`)));
    return slot;
  }
}

let shared: EnginePool | null = null;

/** The server's pool (ENGINE_WORKERS workers, see config), made on first use. */
export function enginePool(): EnginePool {
  return (shared ??= new EnginePool(1));
}

/** Sizes the server's pool (from ENGINE_WORKERS at start-up); a pool of another size is closed and replaced. */
export function configureEnginePool(size: number): void {
  if (shared?.size === size) return;
  void shared?.close();
  shared = new EnginePool(size);
}
