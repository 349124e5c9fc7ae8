import session from "express-session";
import connectSessionSequelize from "connect-session-sequelize";
import type { Sequelize } from "sequelize";

const SequelizeStore = connectSessionSequelize(session.Store);

/** Sessions live in MariaDB (`sessions`), each row tagged with its user so deactivation can end them. */
/** The store's options; `disableTouch` is supported by the store but missing from its bundled types. */
type StoreOptions = ConstructorParameters<typeof SequelizeStore>[0] & { disableTouch?: boolean };

export function createSessionStore(sequelize: Sequelize, maxAgeMs: number) {
  const options: StoreOptions = {
    db: sequelize,
    table: "Session",
    expiration: maxAgeMs,
    checkExpirationInterval: 15 * 60 * 1000,
    // Sessions do not roll: the expiry is fixed at sign-in, so rewriting it on every request
    // (the store's touch) would be one UPDATE per request for nothing.
    disableTouch: true,
    extendDefaultFields: (defaults: { data: string; expires: Date }, sess: { passport?: { user?: number } }) => ({
      data: defaults.data,
      expires: defaults.expires,
      userId: sess?.passport?.user ?? null,
    }),
  };
  return new SequelizeStore(options);
}
