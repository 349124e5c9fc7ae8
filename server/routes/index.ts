import { Router } from "express";
import type { AppContext } from "../app";
import { authRouter } from "./auth.routes";
import { usersRouter } from "./users.routes";
import { calcRouter } from "./calc.routes";

/** Every session-authenticated API route; mounted behind the session, passport and CSRF middleware. */
export function apiRouter(ctx: AppContext): Router {
  const router = Router();
  router.use("/auth", authRouter({ passport: ctx.passport, users: ctx.services.users, config: ctx.config }));
  router.use("/users", usersRouter(ctx.services.users));
  router.use("/calc", calcRouter());
  return router;
}
