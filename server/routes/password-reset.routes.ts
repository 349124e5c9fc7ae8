import { Router, type Request } from "express";
import { rateLimit } from "express-rate-limit";
import { forgotPasswordInputSchema, resetPasswordInputSchema } from "../../shared/schemas/auth";
import type { AppContext } from "../app";
import { PasswordResetService } from "../services/password-reset.service";
import { requireBody } from "./auth.routes";
import { sharedRateLimitStore } from "../middleware/rate-limit-store";

/** Forgot-password requests per IP and window (each may send an e-mail). */
export const FORGOT_PER_IP = 5;
/** Reset attempts per IP and window (a token has 256 bits; this only keeps the noise down). */
export const RESET_PER_IP = 20;
const WINDOW_MS = 15 * 60_000;

/** Counts live in the database (`prefix` keeps each limiter's apart), shared by every server process. */
const limiter = (ctx: AppContext, prefix: string, limit: number, message: string) =>
  rateLimit({
    windowMs: WINDOW_MS,
    limit,
    store: sharedRateLimitStore(ctx.sequelize, prefix, ctx.logger),
    standardHeaders: "draft-8",
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: "rate_limited", message } });
    },
  });

/**
 * `POST /api/auth/forgot` and `POST /api/auth/reset`. Both sit behind the session and CSRF middleware
 * like every POST: the client fetches /api/auth/csrf first (no sign-in needed).
 */
export function passwordResetRouter(ctx: AppContext): Router {
  const service = new PasswordResetService(ctx.sequelize, {
    bcryptRounds: ctx.config.bcryptRounds,
    publicUrl: ctx.config.publicUrl,
  });
  const router = Router();

  // 202 whether or not the e-mail belongs to an account, so the answer reveals nothing.
  router.post(
    "/forgot",
    limiter(ctx, "forgot", FORGOT_PER_IP, "Too many reset requests from here; wait a few minutes and try again"),
    async (req: Request, res) => {
      const input = forgotPasswordInputSchema.parse(requireBody(req));
      await service.request(input.email, { ip: req.ip });
      res.status(202).json({
        message: "If that e-mail belongs to an account, a link to reset the password is on its way.",
      });
    },
  );

  router.post(
    "/reset",
    limiter(ctx, "reset", RESET_PER_IP, "Too many attempts from here; wait a few minutes and try again"),
    async (req: Request, res) => {
      const input = resetPasswordInputSchema.parse(requireBody(req));
      await service.reset(input.token, input.password, req.sessionID);
      res.status(204).end();
    },
  );

  return router;
}
