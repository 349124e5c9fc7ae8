import { Router, type Request } from "express";
import type { AppContext } from "../app";
import { requireAuth } from "../middleware/require-auth";
import { renderInstallPacketPdfInWorker } from "../pdf/pdf-worker";
import { InstallPacketService } from "../services/install-packet.service";
import { contentDisposition } from "../services/upload-sniff";
import { parseId } from "./users.routes";

/** `install-packet-job-12-42-larkspur-bend.pdf`: ASCII letters, digits and dashes only. */
export function packetFileName(jobId: number, addressLine: string | undefined): string {
  const slug = (addressLine ?? "")
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 40)
    .replace(/-+$/, "");
  return `install-packet-job-${Math.trunc(jobId)}${slug ? `-${slug}` : ""}.pdf`;
}

/**
 * /api/jobs/:jobId/install-packet (JSON, for the printable page) and /api/jobs/:jobId/install-packet.pdf.
 * Mounted at /jobs/:jobId before the jobs router; every other path falls through. Readable by whoever may
 * read the job: owner, estimator, and the crew assigned to it (others 404); a job without a saved roof
 * answers 409 `no_roof`.
 */
export function installPacketRouter(ctx: AppContext): Router {
  const svc = new InstallPacketService(ctx.sequelize, ctx.storage, ctx.logger);
  const router = Router({ mergeParams: true });
  const jobIdOf = (req: Request) => parseId(String((req.params as { jobId?: string }).jobId), "Job");

  router.get("/install-packet", requireAuth, async (req, res) => {
    const { doc } = await svc.document(jobIdOf(req), req.user!);
    res.set("Cache-Control", "private, no-store");
    res.json({ data: doc });
  });

  router.get("/install-packet.pdf", requireAuth, async (req, res) => {
    const { doc, photos } = await svc.document(jobIdOf(req), req.user!);
    const images = await svc.thumbnails(photos);
    const pdf = await renderInstallPacketPdfInWorker(doc, images);
    res.set({
      "Content-Type": "application/pdf",
      "Content-Disposition": contentDisposition("inline", packetFileName(jobIdOf(req), doc.siteAddressLines[0])),
      "Content-Length": String(pdf.length),
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    });
    res.end(pdf);
  });

  return router;
}
