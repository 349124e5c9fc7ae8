import { Router, type Request, type Response, type NextFunction } from "express";
import { rateLimit, ipKeyGenerator } from "express-rate-limit";
import { changePasswordInputSchema, loginInputSchema } from "../../shared/schemas/auth";
import { HttpError, badRequest } from "../errors";
import { INVALID_CREDENTIALS, type createPassport } from "../auth/passport";
import { csrfToken } from "../middleware/csrf";
import { requireAuth } from "../middleware/require-auth";
import { presentSessionUser } from "../presenters/user.presenter";
import { User } from "../models/index";
import type { UsersService } from "../services/users.service";
import type { Config } from "../config";
import type { Sequelize } from "sequelize";
import { sharedRateLimitStore } from "../middleware/rate-limit-store";

type PassportInstance = ReturnType<typeof createPassport>;

/** The body, or a 400 that says there was none (no JSON body parser matched). */
export function requireBody(req: Request): unknown {
  if (req.body === undefined) throw badRequest("Send a JSON body with Content-Type: application/json");
  return req.body;
}

const loginKey = (req: Request) => {
  const email = typeof req.body?.email === "string" ? req.body.email.trim().toLowerCase() : "";
  return `${ipKeyGenerator(req.ip ?? "0.0.0.0")}|${email}`;
};

/** `sequelize` puts the sign-in limiter's counts in the database, shared by every server process. */
export function authRouter(deps: { passport: PassportInstance; users: UsersService; config: Config; sequelize?: Sequelize }): Router {
  const { passport, users, config } = deps;
  const router = Router();

  // Failed sign-ins only, per IP and e-mail together; a successful sign-in resets the count.
  const loginLimiter = rateLimit({
    windowMs: config.loginWindowMs,
    limit: config.loginMaxFailures,
    keyGenerator: loginKey,
    store: sharedRateLimitStore(deps.sequelize, "login"),
    skipSuccessfulRequests: true,
    standardHeaders: "draft-8",
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({
        error: { code: "rate_limited", message: "Too many failed sign-ins; wait a few minutes and try again" },
      });
    },
  });

  router.get("/csrf", (req, res) => {
    res.set("Cache-Control", "no-store").json({ token: csrfToken(req) });
  });

  router.post("/login", loginLimiter, async (req: Request, res: Response, next: NextFunction) => {
    const input = loginInputSchema.parse(requireBody(req));
    req.body = input; // passport-local reads the normalised values
    const user = await new Promise<Express.User | false>((resolve, reject) => {
      passport.authenticate("local", { session: false }, (err: unknown, u: Express.User | false) =>
        err ? reject(err) : resolve(u),
      )(req, res, next);
    });
    if (!user) throw new HttpError(401, "invalid_credentials", INVALID_CREDENTIALS);
    // passport 0.7 regenerates the session here: a new id, so a planted id is worthless.
    await new Promise<void>((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
    await User.update({ lastLoginAt: new Date() }, { where: { id: user.id } });
    await loginLimiter.resetKey(loginKey(req));
    res.json({ user: presentSessionUser(user) });
  });

  router.post("/logout", async (req, res) => {
    if (req.isAuthenticated()) {
      await new Promise<void>((resolve, reject) => req.logout((err) => (err ? reject(err) : resolve())));
    }
    res.status(204).end();
  });

  router.get("/me", requireAuth, (req, res) => {
    res.json({ user: presentSessionUser(req.user!) });
  });

  router.post("/password", requireAuth, async (req, res) => {
    const input = changePasswordInputSchema.parse(requireBody(req));
    await users.changeOwnPassword(req.user!, input.currentPassword, input.newPassword, req.sessionID);
    res.status(204).end();
  });

  return router;
}
