/**
 * A whole Ridgewright server in a child process, as `tsx server/index.ts` runs it (startServer: migrations,
 * sessions in MariaDB, the outbox worker, the proposal scheduler, the payment webhook route and the local
 * payment fake), for tests that need several real processes on one database.
 *
 * Parent side: `startServerProcess(env)` spawns this file with Node + tsx, waits for its READY line and
 * returns its URL and a `stop()`. Every child is killed when the parent exits, and a child exits by itself
 * when its stdin closes (the parent died without cleaning up), so no server outlives the test run.
 *
 * Child side (this file run directly): loads the config from the environment (no demo seed unless
 * RW_SEED_DEMO=1), starts the
 * server and prints `RW_READY {json}` on stdout; SIGTERM closes it cleanly.
 */
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";

const thisFile = fileURLToPath(import.meta.url);
const root = path.resolve(path.dirname(thisFile), "../..");
const READY = "RW_READY ";

export interface ServerProcess {
  url: string;
  port: number;
  pid: number;
  child: ChildProcess;
  /** Everything the child wrote to stderr so far (for failure messages). */
  stderr(): string;
  /** Everything it wrote, stdout and stderr. */
  output(): string;
  exited(): boolean;
  /** Sends `signal` (SIGTERM by default) and waits for the process to end; SIGKILL after `graceMs`. */
  kill(signal?: NodeJS.Signals, graceMs?: number): Promise<void>;
  /** SIGTERM, then SIGKILL if it has not exited within 10 s. */
  stop(): Promise<void>;
}

const children = new Set<ChildProcess>();
let exitHookInstalled = false;

function killAllNow() {
  for (const c of children) {
    if (c.exitCode === null && c.signalCode === null) {
      try {
        c.kill("SIGKILL");
      } catch {
        // already gone
      }
    }
  }
  children.clear();
}

function installExitHook() {
  if (exitHookInstalled) return;
  exitHookInstalled = true;
  process.once("exit", killAllNow); // synchronous: runs even when the worker is torn down
}

/** Starts a server child process with the test environment plus `env`; resolves once it listens. */
export async function startServerProcess(env: Record<string, string>, timeoutMs = 60_000): Promise<ServerProcess> {
  installExitHook();
  const child = spawn(process.execPath, ["--import", "tsx", thisFile], {
    cwd: root,
    env: { ...process.env, ...env, RW_SERVER_PROCESS: "1" },
    stdio: ["pipe", "pipe", "pipe"],
  });
  children.add(child);
  let err = "";
  let out = "";
  let all = "";
  child.stderr!.setEncoding("utf8").on("data", (d: string) => {
    err = (err + d).slice(-20_000);
    all = (all + d).slice(-40_000);
  });
  child.stdout!.setEncoding("utf8").on("data", (d: string) => {
    all = (all + d).slice(-40_000);
  });
  const exited = new Promise<void>((resolve) => child.once("exit", () => resolve()));
  const ready = await new Promise<{ url: string; port: number }>((resolve, reject) => {
    const timer = setTimeout(() => {
      child.kill("SIGKILL");
      reject(new Error(`server process did not start within ${timeoutMs} ms\n${err}`));
    }, timeoutMs);
    child.stdout!.on("data", (d: string) => {
      out += d;
      const line = out.split("\n").find((l) => l.startsWith(READY));
      if (line) {
        clearTimeout(timer);
        resolve(JSON.parse(line.slice(READY.length)) as { url: string; port: number });
      }
    });
    child.once("exit", (code, signal) => {
      clearTimeout(timer);
      reject(new Error(`server process exited before it was ready (code ${code}, signal ${signal})\n${err}`));
    });
  });
  const isExited = () => child.exitCode !== null || child.signalCode !== null;
  const kill = async (signal: NodeJS.Signals = "SIGTERM", graceMs = 10_000) => {
    if (!isExited()) {
      child.kill(signal);
      const timer = setTimeout(() => child.kill("SIGKILL"), graceMs);
      await exited;
      clearTimeout(timer);
    }
    children.delete(child);
  };
  return {
    ...ready,
    pid: child.pid!,
    child,
    stderr: () => err,
    output: () => all,
    exited: isExited,
    kill,
    stop: () => kill("SIGTERM"),
  };
}

async function runChild() {
  const { loadConfig } = await import("../../server/config");
  const { createLogger } = await import("../../server/logger");
  const { startServer } = await import("../../server/index");
  const config = { ...loadConfig(), seedDemo: process.env.RW_SEED_DEMO === "1" };
  const running = await startServer(config, createLogger(config.logLevel));
  const port = Number(new URL(running.url).port);
  process.stdout.write(`${READY}${JSON.stringify({ url: `http://127.0.0.1:${port}`, port })}\n`);
  let closing = false;
  const stop = (code: number) => {
    if (closing) return;
    closing = true;
    running
      .close()
      .catch(() => undefined)
      .finally(() => process.exit(code));
    setTimeout(() => process.exit(code), 8_000).unref();
  };
  process.once("SIGTERM", () => stop(0));
  process.once("SIGINT", () => stop(0));
  // The parent keeps our stdin open; when it closes, the parent is gone.
  process.stdin.on("end", () => stop(0));
  process.stdin.on("error", () => stop(0));
  process.stdin.resume();
}

if (process.argv[1] && path.resolve(process.argv[1]) === thisFile && process.env.RW_SERVER_PROCESS === "1") {
  runChild().catch((e) => {
    console.error(e);
    process.exit(1);
  });
}
