/**
 * Browser journeys run against the real built client and server: a database of their own on the test
 * MariaDB (`<test db>_e2e`, demo data seeded), the mail catcher and the payment fake in-process, on free
 * ports. The URL is handed to the tests with `provide`.
 */
import { createServer } from "node:net";
import { spawnSync } from "node:child_process";
import type { TestProject } from "vitest/node";
import { ensureChromium } from "../../scripts/lib/chromium";
import { loadConfig } from "../../server/config";
import { createSequelize } from "../../server/db/sequelize";
import type { RunningServer } from "../../server/index";
import { startTestMariaDb, testEnv } from "../helpers/test-db";
import type { LocalDb } from "../../scripts/lib/mariadb";

let server: RunningServer | null = null;
let db: LocalDb | null = null;

const freePort = () =>
  new Promise<number>((resolve, reject) => {
    const s = createServer();
    s.listen(0, "127.0.0.1", () => {
      const addr = s.address();
      const port = typeof addr === "object" && addr ? addr.port : 0;
      s.close(() => resolve(port));
    });
    s.on("error", reject);
  });

export async function setup(project: TestProject) {
  try {
    await start(project);
  } catch (err) {
    // vitest does not run teardown when setup throws: stop what was started, or the run never exits
    await teardown();
    throw err;
  }
}

async function start(project: TestProject) {
  ensureChromium();
  if (!(process.env.DB_PORT && process.env.NODE_ENV === "test")) {
    db = await startTestMariaDb(() => {});
    Object.assign(process.env, testEnv(db));
  }
  if (process.env.E2E_SKIP_BUILD !== "1") {
    const r = spawnSync("node_modules/.bin/vite", ["build", "--logLevel", "error"], { stdio: "inherit" });
    if (r.status !== 0) throw new Error("The client build for the browser tests failed");
  }
  const port = await freePort();
  const database = `${process.env.DB_NAME ?? "ridgewright_test"}_e2e`;
  const env = {
    ...process.env,
    NODE_ENV: "development" as const, // the real product as npm start runs it: demo data, plain-http cookies
    PORT: String(port),
    HOST: "127.0.0.1",
    PUBLIC_URL: `http://127.0.0.1:${port}`,
    DB_NAME: database,
    MAIL_CATCHER_PORT: "0",
    MAIL_CATCHER_DIR: "", // memory only: a fresh inbox for each run's fresh database, apart from npm start's .data/mail
    PAYMENT_FAKE_PORT: "0",
    OUTBOX_POLL_MS: "500",
    LOG_LEVEL: "warn",
    STORAGE_DIR: ".test-data/e2e-storage",
  };
  const config = loadConfig(env);
  const admin = createSequelize({ ...config.db, database: "" });
  await admin.query(`DROP DATABASE IF EXISTS \`${database}\``);
  await admin.query(`CREATE DATABASE \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.close();
  const { startServer } = await import("../../server/index");
  server = await startServer(config);
  project.provide("baseUrl", `http://127.0.0.1:${port}`);
}

export async function teardown() {
  await server?.close();
  server = null;
  await db?.stop();
  db = null;
}

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
  }
}
