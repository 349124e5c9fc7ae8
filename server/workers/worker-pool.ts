/**
 * A small pool of worker threads for CPU-heavy work (PDF rendering, the engine's takeoff of a roof save), so
 * the event loop goes on serving requests meanwhile.
 *
 * - Each worker starts from worker-boot.mjs, which loads the TypeScript entry through tsx's ESM API (see there
 *   why `execArgv` cannot do it on Node 20). Tested under vitest and under tsx.
 * - A task goes to the least busy worker, started on first use. A worker that stops or fails rejects only its
 *   own waiting tasks and is replaced for the next one.
 * - A worker keeps the process alive only while it has tasks.
 * - An entry that prepares itself (fonts…) posts `{ ready: true }` when done (`waitForReady`); tasks wait for it.
 *
 * Messages: a task is posted as `{ ...task, id }`; the worker answers each with a reply carrying the same `id`,
 * which `run` resolves with as it is (each pool turns replies into its own results and errors).
 */
import { Worker } from "node:worker_threads";
import { createRequire } from "node:module";
import { pathToFileURL } from "node:url";
import { dirname, join } from "node:path";

export interface WorkerPoolOptions {
  /** Number of workers (at least 1). */
  size: number;
  /** The worker's module (TypeScript or JavaScript). */
  entry: URL;
  /** How errors name a worker, e.g. "PDF worker". */
  label: string;
  /** The entry posts `{ ready: true }` once it is set up; tasks are sent after that. */
  waitForReady?: boolean;
}

interface Waiting<R> {
  resolve: (reply: R) => void;
  reject: (err: Error) => void;
}

interface Slot<R> {
  worker: Worker;
  ready: Promise<void>;
  pending: Map<number, Waiting<R>>;
}

const BOOT = new URL("./worker-boot.mjs", import.meta.url);
let tsxApi: string | undefined;
/** tsx's ESM API, as a file URL the bootstrap can import from inside the worker. */
const tsxApiUrl = () =>
  (tsxApi ??= pathToFileURL(join(dirname(createRequire(import.meta.url).resolve("tsx/package.json")), "dist/esm/api/index.mjs")).href);

export class WorkerPool<T extends object, R extends { id: number }> {
  private readonly slots: Array<Slot<R> | null>;
  private nextId = 1;
  private stopped = false;

  constructor(private readonly opts: WorkerPoolOptions) {
    this.slots = Array.from({ length: Math.max(1, Math.trunc(opts.size)) }, () => null);
  }

  get size(): number {
    return this.slots.length;
  }

  /** True once `close` was called. */
  get closed(): boolean {
    return this.stopped;
  }

  /** Sends a task to the least busy worker; resolves with its reply, rejects when that worker stops first. */
  async run(task: T, transfer: readonly ArrayBuffer[] = []): Promise<R> {
    if (this.stopped) throw new Error(`The ${this.opts.label} pool is closed`);
    const slot = this.pick();
    await slot.ready;
    const id = this.nextId++;
    return new Promise<R>((resolve, reject) => {
      slot.pending.set(id, { resolve, reject });
      slot.worker.ref(); // a task on its way keeps the process up, as I/O does
      slot.worker.postMessage({ ...task, id }, [...transfer]);
    }).finally(() => {
      if (slot.pending.size === 0) slot.worker.unref();
    });
  }

  /** Starts every worker now (and waits until they are ready) instead of on first use. */
  async warm(): Promise<void> {
    for (let i = 0; i < this.slots.length; i++) this.slots[i] ??= this.start(i);
    await Promise.all(this.slots.map((s) => s!.ready));
  }

  /** Stops the workers; tasks still waiting fail, and `run` refuses new ones. */
  async close(): Promise<void> {
    this.stopped = true;
    const slots = this.slots.splice(0, this.slots.length, ...this.slots.map(() => null));
    await Promise.all(slots.map((s) => s?.worker.terminate()));
  }

  private pick(): Slot<R> {
    let best = -1;
    for (let i = 0; i < this.slots.length; i++) {
      const s = this.slots[i];
      if (!s) return (this.slots[i] = this.start(i));
      if (best < 0 || s.pending.size < this.slots[best]!.pending.size) best = i;
    }
    return this.slots[best]!;
  }

  private start(index: number): Slot<R> {
    const { label, entry, waitForReady } = this.opts;
    const worker = new Worker(BOOT, {
      execArgv: [],
      name: `${label} ${index + 1}`,
      workerData: { entry: entry.href, tsxApi: tsxApiUrl() },
    });
    worker.unref(); // an idle worker never keeps the process alive
    let isReady!: () => void;
    let notReady!: (err: Error) => void;
    const ready = waitForReady
      ? new Promise<void>((resolve, reject) => ((isReady = resolve), (notReady = reject)))
      : Promise.resolve();
    ready.catch(() => {}); // a worker that never got ready fails its tasks through `run`, not as an unhandled rejection
    const slot: Slot<R> = { worker, ready, pending: new Map() };
    worker.on("message", (m: R | { ready: true }) => {
      if ("ready" in m) return isReady?.();
      const waiting = slot.pending.get(m.id);
      if (!waiting) return;
      slot.pending.delete(m.id);
      waiting.resolve(m);
    });
    const fail = (err: Error) => {
      if (this.slots[index] === slot) this.slots[index] = null; // the next task starts a new worker
      notReady?.(err);
      for (const waiting of slot.pending.values()) waiting.reject(err);
      slot.pending.clear();
    };
    worker.on("error", (err) => fail(new Error(`The ${label} failed: ${err.message}`)));
    worker.on("exit", (code) => fail(new Error(`The ${label} stopped (exit code ${code})`)));
    return slot;
  }
}
