import { Router, type Request } from "express";
import { z } from "zod";
import {
  quoteApproveSchema,
  quoteCreateSchema,
  quoteListQuerySchema,
  quotePatchSchema,
  quoteRecalculateSchema,
  quoteReturnSchema,
  quoteSubmitSchema,
} from "../../shared/schemas/quote";
import type { AppContext } from "../app";
import { notFound } from "../errors";
import { requireRole } from "../middleware/require-auth";
import { presentQuoteDetail, presentQuoteSummary, presentRevision } from "../presenters/quote.presenter";
import { QuotesService } from "../services/quotes.service";
import { requireBody } from "./auth.routes";
import { optionalBody } from "../middleware/json-body";
import { parseId } from "./users.routes";

/** Owners and estimators; crew get 403 on every quote route (quotes carry prices). */
const office = requireRole("owner", "estimator");
const ownerOnly = requireRole("owner");

const quoteIdOf = (req: Request) => parseId(String(req.params.id), "Quote");

/** The body, or `{}` when none was sent (routes whose body fields are all optional). */
const bodyOrEmpty = (req: Request): unknown => optionalBody(req);

/**
 * /api/quotes/:id and its transitions. Every handler checks role (router-level) and company (404 from the
 * service's find) before it reads the body, then calls the service and presents the quote again.
 */
export function quotesRouter(ctx: Pick<AppContext, "sequelize">): Router {
  const quotes = new QuotesService(ctx.sequelize);
  const router = Router();

  const detail = async (id: number, req: Request) => {
    const { quote, rev, revisions } = await quotes.detail(id, req.user!);
    return { data: presentQuoteDetail(quote, rev, revisions) };
  };

  router.get("/:id", office, async (req, res) => {
    res.json(await detail(quoteIdOf(req), req));
  });

  router.get("/:id/revisions/:revisionNo", office, async (req, res) => {
    const id = quoteIdOf(req);
    const no = z.coerce.number().int().positive().max(100_000).safeParse(req.params.revisionNo);
    if (!no.success) throw notFound("Revision");
    res.json({ data: presentRevision(await quotes.revision(id, no.data, req.user!)) });
  });

  router.patch("/:id", office, async (req, res) => {
    const id = quoteIdOf(req);
    await quotes.find(id, req.user!);
    await quotes.patch(id, quotePatchSchema.parse(requireBody(req)), req.user!);
    res.json(await detail(id, req));
  });

  router.post("/:id/recalculate", office, async (req, res) => {
    const id = quoteIdOf(req);
    await quotes.find(id, req.user!);
    await quotes.recalculate(id, quoteRecalculateSchema.parse(requireBody(req)), req.user!);
    res.json(await detail(id, req));
  });

  router.post("/:id/submit", office, async (req, res) => {
    const id = quoteIdOf(req);
    await quotes.find(id, req.user!);
    await quotes.submit(id, quoteSubmitSchema.parse(requireBody(req)), req.user!);
    res.json(await detail(id, req));
  });

  router.post("/:id/approve", ownerOnly, async (req, res) => {
    const id = quoteIdOf(req);
    await quotes.find(id, req.user!);
    await quotes.approve(id, quoteApproveSchema.parse(bodyOrEmpty(req)), req.user!);
    res.json(await detail(id, req));
  });

  router.post("/:id/return", ownerOnly, async (req, res) => {
    const id = quoteIdOf(req);
    await quotes.find(id, req.user!);
    await quotes.returnToDraft(id, quoteReturnSchema.parse(requireBody(req)), req.user!);
    res.json(await detail(id, req));
  });

  router.post("/:id/revise", office, async (req, res) => {
    const id = quoteIdOf(req);
    await quotes.revise(id, req.user!);
    res.status(201).json(await detail(id, req));
  });

  router.post("/:id/archive", office, async (req, res) => {
    const id = quoteIdOf(req);
    await quotes.setArchived(id, true, req.user!);
    res.json(await detail(id, req));
  });

  router.post("/:id/restore", office, async (req, res) => {
    const id = quoteIdOf(req);
    await quotes.setArchived(id, false, req.user!);
    res.json(await detail(id, req));
  });

  return router;
}

/** /api/jobs/:jobId/quotes: the job's quotes and a new quote (mounted with the job id in the path). */
export function jobQuotesRouter(ctx: Pick<AppContext, "sequelize">): Router {
  const quotes = new QuotesService(ctx.sequelize);
  const router = Router({ mergeParams: true });
  const jobIdOf = (req: Request) => parseId(String((req.params as Record<string, string>).jobId), "Job");

  router.get("/", office, async (req, res) => {
    const jobId = jobIdOf(req);
    const query = quoteListQuerySchema.parse(req.query);
    const rows = await quotes.listForJob(jobId, query, req.user!);
    res.json({ data: rows.map((r) => presentQuoteSummary(r.quote, r.rev)) });
  });

  router.post("/", office, async (req, res) => {
    const jobId = jobIdOf(req);
    await quotes.assertJob(jobId, req.user!);
    const input = quoteCreateSchema.parse(bodyOrEmpty(req));
    const id = await quotes.create(jobId, input, req.user!);
    const { quote, rev, revisions } = await quotes.detail(id, req.user!);
    res.status(201).json({ data: presentQuoteDetail(quote, rev, revisions) });
  });

  return router;
}
