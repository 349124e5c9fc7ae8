import { Passport } from "passport";
import { Strategy as LocalStrategy } from "passport-local";
import { User } from "../models/index";
import { DUMMY_HASH, verifyPassword } from "./password";

export const INVALID_CREDENTIALS = "That e-mail and password don't match an active account";

export type SessionUser = Express.User;

export const toSessionUser = (u: User): SessionUser => ({
  id: u.id,
  email: u.email,
  name: u.name,
  role: u.role,
  companyId: u.companyId,
});

/** A session store that reads the session's user with the session (server/session-store.ts). */
export interface UserPrefetch {
  takeUser(sid: string): { id: number; email: string; name: string; role: SessionUser["role"]; companyId: number; active: boolean } | undefined;
}

/** One Passport instance per app (tests build many apps in one process). */
export function createPassport(prefetch?: UserPrefetch): InstanceType<typeof Passport> {
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: "email", passwordField: "password" }, (email, password, done) => {
      (async () => {
        const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
        const ok = await verifyPassword(password, user?.passwordHash ?? DUMMY_HASH);
        if (!user || !ok || !user.active) return done(null, false, { message: INVALID_CREDENTIALS });
        return done(null, toSessionUser(user));
      })().catch(done);
    }),
  );
  passport.serializeUser((user, done) => done(null, (user as SessionUser).id));
  passport.deserializeUser((req: import("node:http").IncomingMessage, id: number, done: (err: unknown, user?: SessionUser | false) => void) => {
    // Reloaded on every request: a deactivated user or a changed role takes effect at once. The session
    // store usually read the user in the same query as the session; otherwise it is one lookup here.
    const row = prefetch?.takeUser((req as { sessionID?: string }).sessionID ?? "");
    if (row && row.id === id) {
      const { active, ...user } = row;
      return done(null, active ? user : false);
    }
    User.findByPk(id)
      .then((u) => done(null, u && u.active ? toSessionUser(u) : false))
      .catch(done);
  });
  return passport;
}
