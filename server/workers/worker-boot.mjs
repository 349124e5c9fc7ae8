// Bootstrap of the worker threads of WorkerPool (worker-pool.ts), in plain JavaScript so Node can start it
// without a loader. On Node 20 a loader passed to a Worker with `execArgv: ["--import", "tsx"]` does not reach
// the worker's own module loading ("Unknown file extension .ts"), under tsx and under vitest alike; tsx's ESM
// API registered from inside the worker does. Then the entry is imported (a compiled `.js` one as it is).
import { workerData } from "node:worker_threads";

const { entry, tsxApi } = workerData;
if (entry.endsWith(".ts")) {
  const { register } = await import(tsxApi);
  register();
}
await import(entry);
