/**
 * The engine in a worker thread (see ./engine-pool.ts): each task's reply is the stored takeoff's JSON text
 * and squares, or the engine's refusal (sent as its parts, so the pool rethrows the same 400), or an error.
 */
import { parentPort } from "node:worker_threads";
import { runEngineTask, type EngineTask } from "./engine-pool";

const port = parentPort;
if (!port) throw new Error("engine-worker.ts runs as a worker thread (see engine-pool.ts)");
port.on("message", (task: EngineTask) => port.postMessage(runEngineTask(task)));
