/**
 * The app alone, in its own process, for benchmarks: the database from the environment (DB_*), no demo
 * seed, no mail, listening on PORT (0 = any free port). Prints `listening <port>` when ready and stops
 * on SIGTERM. The benchmark's load generator runs in the parent, so the two do not share one core.
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
  const app = createApp({ config, logger: createLogger("error"), sequelize, sessionStore, mailer: noMail });
  const server = app.listen(config.port, "127.0.0.1", () => {
    const port = (server.address() as AddressInfo).port;
    if (cluster.isWorker) process.send!({ listening: port });
    else console.log(`listening ${port}`);
  });
  process.once("SIGTERM", () => {
    server.closeAllConnections();
    server.close(() => {
      sessionStore.stopExpiringSessions();
      void sequelize.close().then(() => process.exit(0));
    });
  });
}
