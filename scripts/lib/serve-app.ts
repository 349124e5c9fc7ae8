/**
 * The app alone, in its own process, for benchmarks: the database from the environment (DB_*), no demo
 * seed, no mail, listening on PORT (0 = any free port). Prints `listening <port>` when ready and stops
 * on SIGTERM. The benchmark's load generator runs in the parent, so the two do not share one core.
 */
import type { AddressInfo } from "node:net";
import { loadConfig } from "../../server/config";
import { createSequelize } from "../../server/db/sequelize";
import { initModels } from "../../server/models/index";
import { createSessionStore } from "../../server/session-store";
import { createApp } from "../../server/app";
import { createLogger } from "../../server/logger";

const config = loadConfig();
const sequelize = createSequelize(config.db);
initModels(sequelize);
const sessionStore = createSessionStore(sequelize, config.sessionMaxAgeMs);
const noMail = { send: async () => ({ messageId: "<bench@example.com>" }) };
const app = createApp({ config, logger: createLogger("error"), sequelize, sessionStore, mailer: noMail });
const server = app.listen(config.port, "127.0.0.1", () => {
  console.log(`listening ${(server.address() as AddressInfo).port}`);
});
process.once("SIGTERM", () => {
  server.closeAllConnections();
  server.close(() => {
    sessionStore.stopExpiringSessions();
    void sequelize.close().then(() => process.exit(0));
  });
});
