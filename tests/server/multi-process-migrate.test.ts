/**
 * Two server processes started at the same moment on an empty database (a first deployment, or a rolling
 * one with a new migration): both must come up, with every migration applied exactly once and the demo data
 * (when seeded) written once.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createMailCatcher, type MailCatcher } from "../../server/mail/catcher";
import { loadConfig } from "../../server/config";
import { createSequelize } from "../../server/db/sequelize";
import { migrations } from "../../server/db/migrations/index";
import { DEMO_COMPANY, DEMO_USERS } from "../../server/db/seeders/demo";
import { startServerProcess, type ServerProcess } from "../helpers/server-process";

const config = loadConfig();
const database = `${config.db.database}_mp`; // the test user may create databases named <test db>_*
const admin = createSequelize({ ...config.db, database: "" });
let catcher: MailCatcher;
const servers: ServerProcess[] = [];

beforeAll(async () => {
  await admin.query(`DROP DATABASE IF EXISTS \`${database}\``);
  await admin.query(`CREATE DATABASE \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  catcher = createMailCatcher({ port: 0 });
  await catcher.listen();
});

afterAll(async () => {
  await Promise.all(servers.map((s) => s.stop()));
  await catcher?.close();
  await admin.query(`DROP DATABASE IF EXISTS \`${database}\``);
  await admin.close();
}, 30_000);

describe("two processes starting together on an empty database", () => {
  it("both start; each migration is applied once and the demo data is seeded once", async () => {
    const env = {
      NODE_ENV: "test",
      DB_NAME: database,
      PORT: "0",
      HOST: "127.0.0.1",
      LOG_LEVEL: "warn",
      SMTP_URL: `smtp://127.0.0.1:${catcher.port}`,
      PAYMENTS_USE_FAKE: "true",
      PAYMENT_FAKE_PORT: "0",
      RW_SEED_DEMO: "1",
    };
    const started = await Promise.allSettled([startServerProcess(env), startServerProcess(env)]);
    for (const r of started) if (r.status === "fulfilled") servers.push(r.value);
    const failures = started.flatMap((r) => (r.status === "rejected" ? [String((r.reason as Error).message).slice(0, 2_000)] : []));
    expect(failures).toEqual([]);
    const [rows] = await admin.query(`SELECT name FROM \`${database}\`.schema_migrations ORDER BY name`);
    expect((rows as Array<{ name: string }>).map((r) => r.name)).toEqual(migrations.map((m) => m.name));
    for (const s of servers) expect((await fetch(`${s.url}/api/health`)).status).toBe(200);
    // The demo data was seeded once (a second seed would have failed on the unique e-mails, or doubled it).
    const [companies] = await admin.query(`SELECT COUNT(*) AS n FROM \`${database}\`.companies WHERE name = ?`, { replacements: [DEMO_COMPANY] });
    expect(Number((companies as Array<{ n: number }>)[0].n)).toBe(1);
    const [users] = await admin.query(`SELECT COUNT(*) AS n FROM \`${database}\`.users WHERE email = ?`, { replacements: [DEMO_USERS[0].email] });
    expect(Number((users as Array<{ n: number }>)[0].n)).toBe(1);
  }, 120_000);
});
