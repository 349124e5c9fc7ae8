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

/** One Passport instance per app (tests build many apps in one process). */
export function createPassport(): InstanceType<typeof Passport> {
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
  passport.deserializeUser((id: number, done) => {
    // Reloaded on every request: a deactivated user or a changed role takes effect at once.
    User.findByPk(id)
      .then((u) => done(null, u && u.active ? toSessionUser(u) : false))
      .catch(done);
  });
  return passport;
}
