/**
 * The engine worker, except that a task whose site is "exit" ends the worker thread at once (as a crash
 * would): for the engine pool's tests. Every other task gets the real worker's answer.
 */
import { parentPort } from "node:worker_threads";
import { runEngineTask, type EngineTask } from "../../server/services/engine-pool";

parentPort!.on("message", (task: EngineTask) => {
  if (task.site === "exit") process.exit(3); // in a worker thread this ends the thread only
  parentPort!.postMessage(runEngineTask(task));
});
