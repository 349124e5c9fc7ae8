import session from "express-session";
import connectSessionSequelize from "connect-session-sequelize";
import type { Sequelize } from "sequelize";

const SequelizeStore = connectSessionSequelize(session.Store);

/** Sessions live in MariaDB (`sessions`), each row tagged with its user so deactivation can end them. */
export function createSessionStore(sequelize: Sequelize, maxAgeMs: number) {
  return new SequelizeStore({
    db: sequelize,
    table: "Session",
    expiration: maxAgeMs,
    checkExpirationInterval: 15 * 60 * 1000,
    extendDefaultFields: (defaults: { data: string; expires: Date }, sess: { passport?: { user?: number } }) => ({
      data: defaults.data,
      expires: defaults.expires,
      userId: sess?.passport?.user ?? null,
    }),
  });
}
