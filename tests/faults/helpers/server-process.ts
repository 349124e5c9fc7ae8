/**
 * The real server (server/index.ts, as `npm start` runs it) in a child process of its own, on the drills'
 * database: one plain `node --import tsx` process (no wrapper), so a signal reaches the server itself.
 */
import { spawn, type ChildProcess } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { faultsEnv, type FaultsDb } from "./faults-db";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "../../..");

export interface ServerProcess {
  url: string;
  pid: number;
  child: ChildProcess;
  /** Everything the server wrote (stdout and stderr), for failure messages. */
  output(): string;
  exited(): boolean;
  /** Sends a signal and waits for the process to end. */
  kill(signal?: NodeJS.Signals): Promise<void>;
}

export async function startServerProcess(db: FaultsDb, env: Record<string, string> = {}): Promise<ServerProcess> {
  const child = spawn(process.execPath, ["--import", "tsx", "server/index.ts"], {
    cwd: root,
    env: {
      ...process.env,
      ...faultsEnv(db),
      PORT: "0",
      HOST: "127.0.0.1",
      LOG_LEVEL: "warn",
      MAIL_CATCHER_PORT: "0",
      MAIL_CATCHER_DIR: "",
      PAYMENT_FAKE_PORT: "0",
      STORAGE_DIR: ".test-data/faults/storage",
      ...env,
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let out = "";
  child.stdout!.on("data", (d: Buffer) => (out += d.toString()));
  child.stderr!.on("data", (d: Buffer) => (out += d.toString()));
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the server did not listen within 60 s:\n${out}`)), 60_000);
    const onData = () => {
      const m = /listening on (http:\/\/\S+)/.exec(out);
      if (m) {
        clearTimeout(timer);
        resolve(m[1].replace("localhost", "127.0.0.1"));
      }
    };
    child.stdout!.on("data", onData);
    child.once("exit", (code, signal) => {
      clearTimeout(timer);
      reject(new Error(`the server exited (${code ?? signal}) before listening:\n${out}`));
    });
  });
  const exit = new Promise<void>((resolve) => child.once("exit", () => resolve()));
  return {
    url,
    pid: child.pid!,
    child,
    output: () => out,
    exited: () => child.exitCode !== null || child.signalCode !== null,
    async kill(signal: NodeJS.Signals = "SIGTERM") {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      // An orderly stop that does not finish in 20 s becomes a SIGKILL (a drill may have left it stuck).
      const timer = setTimeout(() => child.kill("SIGKILL"), 20_000);
      await exit;
      clearTimeout(timer);
    },
  };
}
