/**
 * The office's proposal routes: the quote's PDF, sending it to the homeowner, and a job's proposals.
 * Owners and estimators; signed out → 401; crew and other companies → 404 (the quote is not theirs to see).
 */
import { Router, type Request, type RequestHandler } from "express";
import { proposalSendSchema } from "../../shared/schemas/proposal-api";
import type { AppContext } from "../app";
import { notFound, unauthorized } from "../errors";
import { ProposalsService } from "../services/proposals.service";
import { parseId } from "./users.routes";
import { optionalBody } from "../middleware/json-body";

/** 401 signed out; 404 for crew (proposals carry prices, and crew may not know the quote exists). */
const officeOr404 =
  (what: string): RequestHandler =>
  (req, _res, next) => {
    if (!req.isAuthenticated() || !req.user) return next(unauthorized());
    if (req.user.role !== "owner" && req.user.role !== "estimator") return next(notFound(what));
    next();
  };

const proposalsService = (ctx: Pick<AppContext, "sequelize" | "storage" | "config" | "logger">) =>
  new ProposalsService({ sequelize: ctx.sequelize, storage: ctx.storage, config: ctx.config, logger: ctx.logger });

export const sendPdf = (res: import("express").Response, pdf: Buffer, filename: string, disposition: "inline" | "attachment" = "inline") => {
  res
    .status(200)
    .set({
      "Content-Type": "application/pdf",
      "Content-Length": String(pdf.length),
      "Content-Disposition": `${disposition}; filename="${filename}"`,
      "Cache-Control": "private, no-store",
      "X-Content-Type-Options": "nosniff",
    })
    .end(pdf);
};

/** /api/quotes/:id/pdf and /api/quotes/:id/send (mounted on /quotes beside the quotes router). */
export function quoteProposalsRouter(ctx: Pick<AppContext, "sequelize" | "storage" | "config" | "logger">): Router {
  const proposals = proposalsService(ctx);
  const router = Router();
  const office = officeOr404("Quote");
  const quoteIdOf = (req: Request) => parseId(String(req.params.id), "Quote");

  router.get("/:id/pdf", office, async (req, res) => {
    const { pdf, filename } = await proposals.officePdf(quoteIdOf(req), req.user!);
    sendPdf(res, pdf, filename);
  });

  router.post("/:id/send", office, async (req, res) => {
    const id = quoteIdOf(req);
    const input = proposalSendSchema.parse(optionalBody(req));
    const p = await proposals.send(id, input, req.user!);
    const [dto] = await proposals.present([p]);
    res.status(201).json({ data: dto });
  });

  return router;
}

/** /api/jobs/:jobId/proposals: the job's proposals, newest first. */
export function jobProposalsRouter(ctx: Pick<AppContext, "sequelize" | "storage" | "config" | "logger">): Router {
  const proposals = proposalsService(ctx);
  const router = Router({ mergeParams: true });
  router.get("/", officeOr404("Job"), async (req, res) => {
    const jobId = parseId(String((req.params as Record<string, string>).jobId), "Job");
    res.json({ data: await proposals.listForJob(jobId, req.user!) });
  });
  return router;
}
