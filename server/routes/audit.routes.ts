import { Router } from "express";
import { auditListQuerySchema } from "../../shared/schemas/audit";
import type { AppContext } from "../app";
import { requireRole } from "../middleware/require-auth";
import { presentAuditEvent } from "../presenters/audit.presenter";
import { AuditLogService } from "../services/audit-log.service";

/** GET /api/audit: the company's audit log, newest first, for owners. */
export function auditRouter(ctx: Pick<AppContext, "sequelize">): Router {
  const audit = new AuditLogService(ctx.sequelize);
  const router = Router();
  router.use(requireRole("owner"));

  router.get("/", async (req, res) => {
    const query = auditListQuerySchema.parse(req.query);
    const { rows, count } = await audit.listForCompany(query, req.user!);
    res.json({ data: rows.map(presentAuditEvent), meta: { page: query.page, pageSize: query.pageSize, total: count } });
  });

  return router;
}
