import { Router } from "express";
import type { AppContext } from "../app";
import { companyProfileSchema } from "../../shared/schemas/price-book";
import { requireAuth, requireRole } from "../middleware/require-auth";
import { CompanyService } from "../services/company.service";
import { requireBody } from "./auth.routes";

/** /api/company: everyone signed in reads the name and contact; the owner edits the profile. */
export function companyRouter(ctx: AppContext): Router {
  const svc = new CompanyService(ctx.sequelize);
  const router = Router();
  router.use(requireAuth);

  router.get("/", async (req, res) => {
    const c = await svc.get(req.user!);
    res.json({ data: await svc.present(c, req.user!) });
  });

  router.put("/", requireRole("owner"), async (req, res) => {
    const input = companyProfileSchema.parse(requireBody(req));
    const c = await svc.updateProfile(input, req.user!);
    res.json({ data: await svc.present(c, req.user!) });
  });

  return router;
}
