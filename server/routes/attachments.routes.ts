import { Router, type Request } from "express";
import { pipeline } from "node:stream/promises";
import { Readable } from "node:stream";
import {
  UPLOAD_MAX_FILES,
  attachmentListQuerySchema,
  attachmentUpdateSchema,
  attachmentUploadFieldsSchema,
} from "../../shared/schemas/attachment";
import type { AppContext } from "../app";
import { requireAuth, requireRole } from "../middleware/require-auth";
import { presentAttachment } from "../presenters/attachment.presenter";
import { AttachmentsService } from "../services/attachments.service";
import { JobsService } from "../services/jobs.service";
import { contentDisposition } from "../services/upload-sniff";
import { requireBody } from "./auth.routes";
import { receiveFiles } from "./upload";
import { parseId } from "./users.routes";

const services = new WeakMap<AppContext, AttachmentsService>();

/** One service per app, so HEIC conversions queue one after another. */
export function attachmentsService(ctx: AppContext): AttachmentsService {
  let svc = services.get(ctx);
  if (!svc) {
    svc = new AttachmentsService(ctx.sequelize, ctx.storage, { logger: ctx.logger });
    services.set(ctx, svc);
  }
  return svc;
}

const anyRole = requireRole("owner", "estimator", "crew");

/** /api/jobs/:jobId/attachments: list and upload. */
export function jobAttachmentsRouter(ctx: AppContext): Router {
  const svc = attachmentsService(ctx);
  const jobs = new JobsService(ctx.sequelize);
  const receive = receiveFiles({ field: "file", maxFiles: UPLOAD_MAX_FILES, maxBytes: ctx.config.uploads.maxBytes });
  const router = Router({ mergeParams: true });
  router.use(requireAuth);
  const jobIdOf = (req: Request) => parseId(String((req.params as { jobId?: string }).jobId), "Job");

  router.get("/", async (req, res) => {
    const query = attachmentListQuerySchema.parse(req.query);
    const rows = await svc.list(jobIdOf(req), query, req.user!);
    res.json({ data: rows.map(presentAttachment), meta: { page: 1, pageSize: rows.length, total: rows.length } });
  });

  /** Multipart: `file` (1–10), optional `caption`, optional `kind=plan`. 201 `{ data: [attachment, …] }`. */
  router.post("/", anyRole, async (req, res) => {
    const jobId = jobIdOf(req);
    await jobs.get(jobId, req.user!); // 404 before reading the body
    const files = await receive(req, res);
    const fields = attachmentUploadFieldsSchema.parse(req.body ?? {});
    const rows = await svc.upload(jobId, files, fields, req.user!);
    res.status(201).json({ data: rows.map(presentAttachment) });
  });

  return router;
}

/** /api/attachments/:id: read, change, delete, and the bytes. */
export function attachmentsRouter(ctx: AppContext): Router {
  const svc = attachmentsService(ctx);
  const router = Router();
  router.use(requireAuth);
  const idOf = (req: Request) => parseId(String(req.params.id), "File");

  router.get("/:id", async (req, res) => {
    res.json({ data: presentAttachment(await svc.get(idOf(req), req.user!)) });
  });

  router.patch("/:id", anyRole, async (req, res) => {
    const id = idOf(req);
    await svc.get(id, req.user!); // 404 before validation
    const input = attachmentUpdateSchema.parse(requireBody(req));
    res.json({ data: presentAttachment(await svc.update(id, input, req.user!)) });
  });

  router.delete("/:id", anyRole, async (req, res) => {
    await svc.remove(idOf(req), req.user!);
    res.status(204).end();
  });

  for (const variant of ["file", "thumb"] as const) {
    /** The bytes with their checked type; `?download=1` asks the browser to save rather than show. */
    router.get(`/:id/${variant}`, async (req, res) => {
      const { attachment: a, body, mime } = await svc.open(idOf(req), variant, req.user!);
      const inline = req.query.download !== "1" && (mime.startsWith("image/") || mime === "application/pdf");
      const name = variant === "thumb" ? `thumb-${a.originalName.replace(/\.[^.]*$/, "")}.jpg` : a.originalName;
      res.set({
        "Content-Type": mime.startsWith("text/") ? `${mime}; charset=utf-8` : mime,
        "Content-Disposition": contentDisposition(inline ? "inline" : "attachment", name),
        "X-Content-Type-Options": "nosniff",
        "Cache-Control": "private, max-age=86400",
        "Cross-Origin-Resource-Policy": "same-origin",
      });
      if (Buffer.isBuffer(body)) {
        res.send(body);
        return;
      }
      await pipeline(body as Readable, res);
    });
  }

  return router;
}
