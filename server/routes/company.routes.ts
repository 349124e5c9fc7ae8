import { Router } from "express";
import type { AppContext } from "../app";
import { companyProfileSchema } from "../../shared/schemas/price-book";
import { requireAuth, requireRole } from "../middleware/require-auth";
import { CompanyLogoService, CompanyService, LOGO_MAX_BYTES } from "../services/company.service";
import { receiveFiles } from "./upload";
import { requireBody } from "./auth.routes";
import { badRequest, notFound } from "../errors";

/** /api/company: everyone signed in reads the name and contact; the owner edits the profile. */
export function companyRouter(ctx: AppContext): Router {
  const svc = new CompanyService(ctx.sequelize);
  const logos = new CompanyLogoService(ctx.sequelize, ctx.storage);
  const receiveLogo = receiveFiles({ field: "file", maxFiles: 1, maxBytes: LOGO_MAX_BYTES });
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

  /** The logo printed on proposals: PNG, to everyone signed in in the company; 404 when there is none. */
  router.get("/logo", async (req, res) => {
    const png = await logos.read(req.user!.companyId);
    if (!png) throw notFound("Logo");
    res.set({ "Content-Type": "image/png", "Cache-Control": "private, no-cache", "X-Content-Type-Options": "nosniff" }).send(png);
  });

  /** Multipart `file` (PNG, JPEG or WebP up to 2 MB), resized and kept as PNG. */
  router.put("/logo", requireRole("owner"), async (req, res) => {
    const [file] = await receiveLogo(req, res);
    if (!file) throw badRequest("Choose an image file", { file: "Choose an image file" });
    const c = await logos.set(file.buffer, req.user!);
    res.json({ data: await svc.present(c, req.user!) });
  });

  router.delete("/logo", requireRole("owner"), async (req, res) => {
    await logos.remove(req.user!);
    res.status(204).end();
  });

  return router;
}
