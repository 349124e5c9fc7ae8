import { Sequelize } from "sequelize";
import type { Config } from "../config";

/**
 * How long the app waits on the database before a request gives up with 503 (server/middleware/error-handler.ts)
 * instead of hanging:
 * - connectTimeout: a new connection must finish its handshake within 3 s (a local or LAN MariaDB does it in
 *   milliseconds; a host that accepts TCP but does not answer is caught here);
 * - acquire: a request waits at most 6 s for a free pooled connection;
 * - socketTimeout: a connection on which nothing arrives for 10 s is dropped (fatal for that connection
 *   only). This is what ends a query sent to a server that has frozen or whose host has vanished without
 *   closing the socket; without it the request waits for TCP to give up, which takes many minutes.
 *   No statement of the app runs anywhere near 10 s; a long one-off job (a large ALTER TABLE) can pass a
 *   longer `socketTimeoutMs`, or 0 for none.
 * Connections that died while the database was away are found invalid and replaced by the pool, so the
 * server recovers by itself when the database is back.
 */
export const DB_TIMEOUTS = { connectMs: 3_000, acquireMs: 6_000, socketMs: 10_000 };

export function createSequelize(db: Config["db"], opts: { socketTimeoutMs?: number } = {}): Sequelize {
  return new Sequelize({
    dialect: "mariadb",
    host: db.host,
    port: db.port,
    database: db.database,
    username: db.user,
    password: db.password,
    // DB_LOG_SQL=1 prints every statement with its time (for looking at what a request sends; never in production).
    logging: process.env.DB_LOG_SQL === "1" ? (sql: string, ms?: number) => console.error(`[sql ${ms ?? "?"} ms] ${sql.length > 300 ? `${sql.slice(0, 300)}… (${sql.length} chars)` : sql}`) : false,
    benchmark: process.env.DB_LOG_SQL === "1",
    pool: { max: db.poolMax, min: 0, acquire: DB_TIMEOUTS.acquireMs, idle: 10_000 },
    dialectOptions: { connectTimeout: DB_TIMEOUTS.connectMs, socketTimeout: opts.socketTimeoutMs ?? DB_TIMEOUTS.socketMs },
    timezone: "+00:00",
    define: { underscored: true },
  });
}
