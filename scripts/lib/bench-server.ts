/**
 * A throwaway server for benchmarks: the local MariaDB (started or reused, as npm start does), a
 * separate `<name>_bench_engine` database recreated and migrated, one company with an owner, the real app
 * listening on a free port, and a signed-in session (cookie + CSRF token). Never touches the demo data.
 */
import type { Server } from "node:http";
import { loadDotEnv } from "./env";
import { freshBenchDatabase } from "./bench-db";
import { signInOverHttp } from "./bench-http";
import type { createSequelize } from "../../server/db/sequelize";
import { Company, User } from "../../server/models/index";
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
  const bench = await freshBenchDatabase("bench_engine", 20, () => {});
  const { sequelize } = bench;
  const config = { ...bench.config, logLevel: "error" as const };
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

  const headers = await signInOverHttp(url, user.email, BENCH_PASSWORD);

  return {
    url,
    headers,
    sequelize,
    companyId: company.id,
    userId: user.id,
    async close() {
      sessionStore.stopExpiringSessions();
      await new Promise<void>((r) => {
        server.close(() => r());
        server.closeAllConnections();
      });
      await bench.close();
    },
  };
}
