/**
 * `npm start`: the whole product on one machine. Starts (or reuses) a local MariaDB in .data/ unless
 * DATABASE_URL or DB_HOST names another one, migrates, seeds the demo data once, builds the client
 * and serves client and API from one Express process. Ctrl-C or SIGTERM stops what it started.
 */
import { spawnSync } from "node:child_process";
import { loadDotEnv } from "./lib/env";
import { startLocalMariaDb, type LocalDb } from "./lib/mariadb";
import { hasExternalDatabase, loadConfig } from "../server/config";
import { startServer } from "../server/index";
import { DEMO_PASSWORD, DEMO_USERS } from "../server/db/seeders/demo";

loadDotEnv();
process.env.NODE_ENV ??= "development";

async function main() {
  let localDb: LocalDb | null = null;
  const stops: Array<() => Promise<void>> = [];
  let stopping = false;
  const stopAll = async (code: number) => {
    if (stopping) return;
    stopping = true;
    console.log("\nStopping…");
    for (const stop of stops.reverse()) await stop().catch((e) => console.error(e));
    process.exit(code);
  };
  process.once("SIGINT", () => void stopAll(0));
  process.once("SIGTERM", () => void stopAll(0));

  try {
    if (!hasExternalDatabase()) {
      localDb = await startLocalMariaDb({
        base: process.env.DB_DIR ?? ".data/mariadb",
        port: Number(process.env.DB_PORT ?? 3307),
        database: process.env.DB_NAME ?? "ridgewright",
        user: "app",
      });
      const db = localDb;
      stops.push(() => db.stop());
      Object.assign(process.env, {
        DB_HOST: db.host,
        DB_PORT: String(db.port),
        DB_NAME: db.database,
        DB_USER: db.user,
        DB_PASSWORD: db.password,
      });
      console.log(`MariaDB ${db.started ? "started" : "reused"} on 127.0.0.1:${db.port} (data in .data/mariadb)`);
    } else {
      console.log("Using the database named by DATABASE_URL / DB_HOST.");
    }

    if (process.env.SKIP_BUILD !== "1") {
      console.log("Building the client…");
      const r = spawnSync("node_modules/.bin/vite", ["build", "--logLevel", "warn"], { stdio: "inherit" });
      if (r.status !== 0) throw new Error("The client build failed");
    }

    const config = loadConfig();
    const server = await startServer(config);
    stops.push(() => server.close());

    console.log(`\nRidgewright is running at ${server.url}`);
    if (server.mailCatcher) {
      console.log(`E-mail is caught, not delivered: SMTP on 127.0.0.1:${server.mailCatcher.port}, inbox at ${server.url}/dev/mail`);
    } else {
      console.log("E-mail goes out through SMTP_URL.");
    }
    if (server.paymentFake) {
      console.log(`Payments go to the local test payment service at ${server.paymentFake.url} (test cards only; nothing is charged)`);
    } else {
      console.log("Payments go to the hosted payment service (STRIPE_SECRET_KEY).");
    }
    if (config.seedDemo) {
      console.log(`Demo sign-ins (demo data only), password "${DEMO_PASSWORD}":`);
      for (const u of DEMO_USERS) console.log(`  ${u.role.padEnd(10)} ${u.email}`);
    }
    console.log("Press Ctrl-C to stop.");
  } catch (err) {
    console.error(err instanceof Error ? err.message : err);
    await stopAll(1);
  }
}

void main();
