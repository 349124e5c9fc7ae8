/**
 * The app alone, in its own process, for benchmarks: the database from the environment (DB_*), no demo
 * seed, no mail, listening on PORT (0 = any free port). Prints `listening <port>` when ready and stops
 * on SIGTERM. The benchmark's load generator runs in the parent, so the two do not share one core.
 *
 * CLIENT_DIR serves the built client from that folder too. Started with an IPC channel (one process), it also
 * sends `{ listening: port }` and answers `{ mem: true, gc? }` with its memory use (after a full collection when
 * `gc` is set and node runs with --expose-gc), for the load benchmark.
 *
 * WORKERS=n (default 1) runs n copies of the app behind one port with node:cluster, as one would run a
 * process per core in production (sessions, rate limits and background work live in MariaDB, so the
 * copies behave as one server).
 */
import cluster from "node:cluster";
import type { AddressInfo } from "node:net";
import { loadConfig } from "../../server/config";
import { createSequelize } from "../../server/db/sequelize";
import { initModels } from "../../server/models/index";
import { createSessionStore } from "../../server/session-store";
import { createApp } from "../../server/app";
import { createLogger } from "../../server/logger";

const workers = Math.max(1, Math.trunc(Number(process.env.WORKERS ?? 1)) || 1);

if (workers > 1 && cluster.isPrimary) {
  let ready = 0;
  let port = 0;
  for (let i = 0; i < workers; i++) cluster.fork();
  cluster.on("message", (_worker, msg: { listening?: number }) => {
    if (typeof msg?.listening !== "number") return;
    port = msg.listening;
    if (++ready === workers) console.log(`listening ${port}`);
  });
  cluster.on("exit", (_w, code, signal) => {
    if (!stopping) {
      console.error(`a worker stopped (${signal ?? code}); stopping`);
      process.exit(1);
    }
  });
  let stopping = false;
  process.once("SIGTERM", () => {
    stopping = true;
    for (const w of Object.values(cluster.workers ?? {})) w?.process.kill("SIGTERM");
    const wait = setInterval(() => {
      if (Object.keys(cluster.workers ?? {}).length === 0) {
        clearInterval(wait);
        process.exit(0);
      }
    }, 50);
  });
} else {
  const config = loadConfig();
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  const sessionStore = createSessionStore(sequelize, config.sessionMaxAgeMs);
  const noMail = { send: async () => ({ messageId: "<bench@example.com>" }) };
  const clientDir = process.env.CLIENT_DIR || undefined;
  const app = createApp({ config, logger: createLogger("error"), sequelize, sessionStore, mailer: noMail, clientDir });
  const server = app.listen(config.port, "127.0.0.1", () => {
    const port = (server.address() as AddressInfo).port;
    if (process.send) process.send({ listening: port }); // the cluster's primary, or a parent with IPC
    if (!cluster.isWorker) console.log(`listening ${port}`);
  });
  if (process.send && !cluster.isWorker) {
    process.on("message", (m: { mem?: boolean; gc?: boolean }) => {
      if (!m?.mem) return;
      if (m.gc) (globalThis as { gc?: () => void }).gc?.();
      const mu = process.memoryUsage();
      process.send!({ mem: { rss: mu.rss, heapUsed: mu.heapUsed, heapTotal: mu.heapTotal, external: mu.external } });
    });
  }
  process.once("SIGTERM", () => {
    server.closeAllConnections();
    server.close(() => {
      sessionStore.stopExpiringSessions();
      void sequelize.close().then(() => process.exit(0));
    });
  });
}
