import { Router } from "express";
import type { AppContext } from "../app";
import { devMailRouter } from "./dev-mail.routes";
import { passwordResetRouter } from "./password-reset.routes";

/** The e-mail routes: `/auth/forgot`, `/auth/reset` and the catcher's `/dev/mail` (one mount in routes/index.ts). */
export function mailRouter(ctx: AppContext): Router {
  const router = Router();
  router.use("/auth", passwordResetRouter(ctx));
  router.use("/dev/mail", devMailRouter(ctx));
  return router;
}
