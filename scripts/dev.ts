/**
 * `npm run dev`: the local MariaDB, the API server restarted on change (tsx watch) and the Vite dev
 * server with /api proxied to it. Ctrl-C stops all three.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { loadDotEnv } from "./lib/env";
import { startLocalMariaDb, type LocalDb } from "./lib/mariadb";
import { hasExternalDatabase } from "../server/config";

loadDotEnv();
process.env.NODE_ENV ??= "development";

let db: LocalDb | null = null;
if (!hasExternalDatabase()) {
  db = await startLocalMariaDb({
    base: process.env.DB_DIR ?? ".data/mariadb",
    port: Number(process.env.DB_PORT ?? 3307),
    database: process.env.DB_NAME ?? "ridgewright",
    user: "app",
  });
  Object.assign(process.env, {
    DB_HOST: db.host,
    DB_PORT: String(db.port),
    DB_NAME: db.database,
    DB_USER: db.user,
    DB_PASSWORD: db.password,
  });
}

const children: ChildProcess[] = [
  spawn("node_modules/.bin/tsx", ["watch", "--clear-screen=false", "server/index.ts"], { stdio: "inherit", env: process.env }),
  spawn("node_modules/.bin/vite", [], { stdio: "inherit", env: process.env }),
];

let stopping = false;
async function stop() {
  if (stopping) return;
  stopping = true;
  for (const c of children) c.kill("SIGTERM");
  await db?.stop();
  process.exit(0);
}
process.once("SIGINT", () => void stop());
process.once("SIGTERM", () => void stop());
for (const c of children) c.on("exit", () => void stop());
