import { Router } from "express";
import type { AppContext } from "../app";
import { requireRole } from "../middleware/require-auth";
import { QuotesService } from "../services/quotes.service";

/** GET /api/approvals: the owner's queue of quotes in review, oldest submitted first. */
export function approvalsRouter(ctx: Pick<AppContext, "sequelize">): Router {
  const quotes = new QuotesService(ctx.sequelize);
  const router = Router();
  router.get("/", requireRole("owner"), async (req, res) => {
    res.json({ data: await quotes.approvalsQueue(req.user!) });
  });
  return router;
}
