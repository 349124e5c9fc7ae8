/**
 * A throwaway server for benchmarks: the local MariaDB (started or reused, as npm start does), a
 * separate `<name>_bench` database recreated and migrated, one company with an owner, the real app
 * listening on a free port, and a signed-in session (cookie + CSRF token). Never touches the demo data.
 */
import type { Server } from "node:http";
import { startLocalMariaDb, type LocalDb } from "./mariadb";
import { loadDotEnv } from "./env";
import { loadConfig } from "../../server/config";
import { createSequelize } from "../../server/db/sequelize";
import { createMigrator } from "../../server/db/migrator";
import { initModels, Company, User } from "../../server/models/index";
import { hashPassword } from "../../server/auth/password";
import { createSessionStore } from "../../server/session-store";
import { createApp } from "../../server/app";
import { createLogger } from "../../server/logger";
import { createMemoryMailer } from "../../server/mail/mailer";

export interface BenchServer {
  url: string;
  headers: Record<string, string>;
  sequelize: ReturnType<typeof createSequelize>;
  companyId: number;
  userId: number;
  close(): Promise<void>;
}

const BENCH_PASSWORD = "bench-password-123";

export async function startBenchServer(): Promise<BenchServer> {
  loadDotEnv();
  process.env.NODE_ENV ??= "development";
  let db: LocalDb | null = null;
  const base = process.env.DATABASE_URL || process.env.DB_HOST ? null : process.env.DB_DIR ?? ".data/mariadb";
  const name = `${process.env.DB_NAME ?? "ridgewright"}_bench`;
  if (base) {
    db = await startLocalMariaDb({ base, port: Number(process.env.DB_PORT ?? 3307), database: process.env.DB_NAME ?? "ridgewright", user: "app", log: () => {} });
    Object.assign(process.env, { DB_HOST: db.host, DB_PORT: String(db.port), DB_USER: db.user, DB_PASSWORD: db.password });
  }
  const config = { ...loadConfig(), logLevel: "error" as const };
  const admin = createSequelize({ ...config.db, database: "" });
  await admin.query(`DROP DATABASE IF EXISTS \`${name}\``);
  await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.close();
  config.db = { ...config.db, database: name, poolMax: 20 };
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  await createMigrator(sequelize).up();
  const company = await Company.create({ name: "Bench Roofing (benchmark data)" });
  const user = await User.create({
    companyId: company.id,
    email: "bench.owner@example.com",
    name: "Bench Owner",
    role: "owner",
    passwordHash: await hashPassword(BENCH_PASSWORD, 4),
  });
  const sessionStore = createSessionStore(sequelize, config.sessionMaxAgeMs);
  const app = createApp({ config, logger: createLogger("error"), sequelize, sessionStore, mailer: createMemoryMailer() });
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, "127.0.0.1", () => resolve(s));
  });
  const addr = server.address();
  const url = `http://127.0.0.1:${typeof addr === "object" && addr ? addr.port : 0}`;

  // Sign in as a browser would: a CSRF token for the anonymous session, the login, a fresh token.
  let cookie = "";
  const call = async (path: string, init: RequestInit = {}) => {
    const res = await fetch(url + path, { ...init, headers: { ...(init.headers as Record<string, string>), cookie } });
    const set = res.headers.get("set-cookie");
    if (set) cookie = set.split(";")[0];
    return res;
  };
  const token1 = ((await (await call("/api/auth/csrf")).json()) as { token: string }).token;
  const login = await call("/api/auth/login", {
    method: "POST",
    headers: { "content-type": "application/json", "x-csrf-token": token1 },
    body: JSON.stringify({ email: user.email, password: BENCH_PASSWORD }),
  });
  if (login.status !== 200) throw new Error(`bench sign-in failed with ${login.status}`);
  const token = ((await (await call("/api/auth/csrf")).json()) as { token: string }).token;

  return {
    url,
    headers: { cookie, "x-csrf-token": token, "content-type": "application/json" },
    sequelize,
    companyId: company.id,
    userId: user.id,
    async close() {
      sessionStore.stopExpiringSessions();
      await new Promise<void>((r) => {
        server.close(() => r());
        server.closeAllConnections();
      });
      await sequelize.close();
      await db?.stop();
    },
  };
}
