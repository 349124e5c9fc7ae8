import session from "express-session";
import connectSessionSequelize from "connect-session-sequelize";
import type { Sequelize } from "sequelize";
import { selectRows, sqlDateTime } from "./db/sql";
import type { Role } from "../shared/auth/roles";

const SequelizeStore = connectSessionSequelize(session.Store);

/** The store's options; `disableTouch` is supported by the store but missing from its bundled types. */
type StoreOptions = ConstructorParameters<typeof SequelizeStore>[0] & { disableTouch?: boolean };

/** The signed-in user as read with the session row (see `SessionStore.get`). */
export interface PrefetchedUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  companyId: number;
  active: boolean;
}

interface SessionRow {
  data: string | null;
  userId: number | null;
  email: string | null;
  name: string | null;
  role: Role | null;
  companyId: number | null;
  active: number | boolean | null;
}

/** Entries a request never collected (it failed between reading the session and Passport) are dropped. */
const MAX_PREFETCHED = 5_000;

/**
 * Sessions live in MariaDB (`sessions`), each row tagged with its user so deactivation can end them.
 *
 * Reading a session is the one query every signed-in request makes, so it is a single SELECT straight through
 * the driver (`selectRows`: no Sequelize row handling) that also brings the session's user (a LEFT
 * JOIN on `users`): Passport's deserializer then takes that row (`takeUser`) instead of querying again.
 * The user is still read fresh on every request, so a deactivation or a role change takes effect at once.
 * Expired rows are never returned, even before the periodic clean-up deletes them.
 */
export class SessionStore extends SequelizeStore {
  private readonly prefetched = new Map<string, PrefetchedUser>();

  constructor(
    private readonly sequelize: Sequelize,
    options: StoreOptions,
  ) {
    super(options);
  }

  override get(sid: string, fn: (err: unknown, session?: session.SessionData | null) => void): void {
    selectRows<SessionRow>(
      this.sequelize,
      `SELECT s.data, u.id AS userId, u.email, u.name, u.role, u.company_id AS companyId, u.active
         FROM sessions s LEFT JOIN users u ON u.id = s.user_id
        WHERE s.sid = ? AND (s.expires IS NULL OR s.expires > ?)`,
      [sid, sqlDateTime(new Date())],
    )
      .then((rows) => {
        const row = rows[0];
        this.prefetched.delete(sid);
        if (!row?.data) return fn(null, null);
        if (row.userId !== null && row.role !== null) {
          if (this.prefetched.size >= MAX_PREFETCHED) this.prefetched.clear();
          this.prefetched.set(sid, {
            id: Number(row.userId),
            email: row.email ?? "",
            name: row.name ?? "",
            role: row.role,
            companyId: Number(row.companyId),
            active: Boolean(row.active),
          });
        }
        fn(null, JSON.parse(row.data) as session.SessionData);
      })
      .catch((err: unknown) => fn(err));
  }

  /** The user read with this request's session, once (undefined when there was none). */
  takeUser(sid: string): PrefetchedUser | undefined {
    const user = this.prefetched.get(sid);
    this.prefetched.delete(sid);
    return user;
  }
}

export function createSessionStore(sequelize: Sequelize, maxAgeMs: number): SessionStore {
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
  return new SessionStore(sequelize, options);
}
