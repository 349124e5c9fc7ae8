import type { Server } from "node:http";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { loadConfig, type Config } from "./config";
import { createLogger, type Logger } from "./logger";
import { createSequelize } from "./db/sequelize";
import { createMigrator } from "./db/migrator";
import { initModels } from "./models/index";
import { createSessionStore } from "./session-store";
import { createApp } from "./app";
import { seedDemo } from "./db/seeders/demo";

export interface RunningServer {
  server: Server;
  url: string;
  close(): Promise<void>;
}

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

/** The only place that listens: config → db → migrations → (demo seed) → createApp().listen(). */
export async function startServer(config: Config = loadConfig(), logger: Logger = createLogger(config.logLevel)): Promise<RunningServer> {
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  await sequelize.authenticate();
  const migrated = await createMigrator(sequelize).up();
  if (migrated.length) logger.info(`applied ${migrated.length} migration(s)`);
  if (config.seedDemo) {
    const seeded = await seedDemo(sequelize, { bcryptRounds: config.bcryptRounds });
    if (seeded) logger.info("demo data seeded");
  }
  const sessionStore = createSessionStore(sequelize, config.sessionMaxAgeMs);
  const app = createApp({ config, logger, sequelize, sessionStore, clientDir: path.join(root, "dist") });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.port, config.host, () => resolve(s));
    s.on("error", reject);
  });
  const addr = server.address();
  const port = typeof addr === "object" && addr ? addr.port : config.port;
  return {
    server,
    url: `http://localhost:${port}`,
    async close() {
      sessionStore.stopExpiringSessions();
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      await sequelize.close();
    },
  };
}

// `tsx server/index.ts` runs the server on its own (the database must be reachable).
if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  startServer()
    .then((s) => {
      console.log(`Ridgewright is listening on ${s.url}`);
      const stop = () => s.close().then(() => process.exit(0));
      process.once("SIGINT", stop);
      process.once("SIGTERM", stop);
    })
    .catch((err) => {
      console.error(err);
      process.exit(1);
    });
}
