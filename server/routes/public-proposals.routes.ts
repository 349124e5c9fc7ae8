/**
 * The homeowner's proposal routes, `/api/proposals/:token…`: no sign-in, no session and no CSRF token (they
 * are mounted before that middleware); the token in the path is the credential. Rate-limited per IP.
 * An unknown, revoked or expired token is one 404 with one body.
 */
import { Router, type Request } from "express";
import { rateLimit } from "express-rate-limit";
import { proposalAcceptSchema, proposalDeclineSchema } from "../../shared/schemas/proposal-api";
import type { AppContext } from "../app";
import { PaymentsService, paymentsUnavailable } from "../services/payments.service";
import { ProposalsService } from "../services/proposals.service";
import { requireBody } from "./auth.routes";
import { sendPdf } from "./proposals.routes";
import { optionalBody } from "../middleware/json-body";
import { sharedRateLimitStore } from "../middleware/rate-limit-store";

/** Requests per IP per window on these routes: reads (page, PDF) and writes (accept, decline, deposit). */
export const PUBLIC_READS_PER_IP = 120;
export const PUBLIC_WRITES_PER_IP = 30;
const WINDOW_MS = 15 * 60_000;

/** Counts live in the database (`prefix` keeps each limiter's apart), shared by every server process. */
const limiter = (ctx: AppContext, prefix: string, limit: number) =>
  rateLimit({
    windowMs: WINDOW_MS,
    limit,
    store: sharedRateLimitStore(ctx.sequelize, prefix, ctx.logger),
    standardHeaders: "draft-8",
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({ error: { code: "rate_limited", message: "Too many requests; wait a few minutes and try again" } });
    },
  });

export function publicProposalsRouter(ctx: AppContext): Router {
  const proposals = new ProposalsService({ sequelize: ctx.sequelize, storage: ctx.storage, config: ctx.config, logger: ctx.logger });
  const payments = ctx.payments
    ? new PaymentsService({ sequelize: ctx.sequelize, stripe: ctx.payments.stripe, config: ctx.payments.config, publicUrl: ctx.config.publicUrl, proposals, logger: ctx.logger })
    : null;
  const reads = limiter(ctx, "proposal-reads", PUBLIC_READS_PER_IP);
  const writes = limiter(ctx, "proposal-writes", PUBLIC_WRITES_PER_IP);
  const router = Router();
  const tokenOf = (req: Request) => String(req.params.token);

  router.use((_req, res, next) => {
    res.set({ "Cache-Control": "no-store", "Referrer-Policy": "no-referrer" });
    next();
  });

  router.get("/:token", reads, async (req, res) => {
    res.json({ data: await proposals.view(tokenOf(req)) });
  });

  router.get("/:token/pdf", reads, async (req, res) => {
    const { pdf, filename } = await proposals.publicPdf(tokenOf(req));
    sendPdf(res, pdf, filename, "attachment");
  });

  router.post("/:token/accept", writes, async (req, res) => {
    const token = tokenOf(req);
    await proposals.byToken(token); // 404 before reading the body
    const input = proposalAcceptSchema.parse(requireBody(req));
    await proposals.accept(token, input, { ip: req.ip ?? null, userAgent: req.get("user-agent") ?? null });
    res.json({ data: await proposals.publicDto(await proposals.byToken(token), token) });
  });

  router.post("/:token/decline", writes, async (req, res) => {
    const token = tokenOf(req);
    await proposals.byToken(token);
    const input = proposalDeclineSchema.parse(optionalBody(req));
    await proposals.decline(token, input);
    res.json({ data: await proposals.publicDto(await proposals.byToken(token), token) });
  });

  router.post("/:token/deposit", writes, async (req, res) => {
    const token = tokenOf(req);
    await proposals.byToken(token);
    if (!payments) throw paymentsUnavailable();
    const { url } = await payments.startDeposit(token);
    res.json({ url });
  });

  return router;
}
