import { WorkerPool } from "../workers/worker-pool";
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

/** A reply as the caller's result: the takeoff, or the engine's refusal as the same HttpError, or an error. */
function settle(reply: EngineReply): ComputedTakeoff {
  if (reply.ok) return { json: reply.json, squares: reply.squares };
  if ("http" in reply) throw new HttpError(reply.http.status, reply.http.code, reply.http.message, reply.http.fields);
  throw new Error(`The takeoff could not be computed: ${reply.error}`);
}

const WORKER_URL = new URL("./engine-worker.ts", import.meta.url);

/**
 * Stored takeoffs computed in worker threads (WorkerPool), so the engine's milliseconds per roof (and serialising
 * its result) do not hold up the event loop: while one roof is computed, the server goes on answering other
 * requests and talking to MariaDB, and on a machine with more than one core the two run side by side. Measured
 * with `npm run bench:api` (20 connections saving 12-plane roofs on 2 cores): about 15 % more saves a second
 * than computing them on the event loop.
 *
 * A worker that dies fails only its own waiting tasks (with an error, a 500) and is replaced for the next task.
 * Size 0 computes on the event loop (the same result), as does a closed pool.
 */
export class EnginePool {
  private readonly pool: WorkerPool<Omit<EngineTask, "id">, EngineReply> | null;

  constructor(
    readonly size: number,
    workerUrl: URL = WORKER_URL,
  ) {
    this.pool = size >= 1 ? new WorkerPool({ size, entry: workerUrl, label: "engine worker" }) : null;
  }

  /** The engine's takeoff of a parsed roof document for the job's site and the company's rules. */
  async storedTakeoff(doc: RoofDocument, site: unknown, rules: Record<string, unknown>): Promise<ComputedTakeoff> {
    const task = { doc, site, rules };
    return settle(this.pool && !this.pool.closed ? await this.pool.run(task) : runEngineTask({ ...task, id: 0 }));
  }

  /** Stops the workers; tasks still waiting fail, later tasks are computed on the event loop. */
  async close(): Promise<void> {
    await this.pool?.close();
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
