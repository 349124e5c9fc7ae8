import { Router } from "express";
import type { AppContext } from "../app";
import { authRouter } from "./auth.routes";
import { usersRouter } from "./users.routes";
import { calcRouter } from "./calc.routes";
import { customersRouter } from "./customers.routes";
import { jobsRouter } from "./jobs.routes";
import { auditRouter } from "./audit.routes";
import { priceBookRouter } from "./price-book.routes";
import { companyRouter } from "./company.routes";
import { mailRouter } from "./mail.routes";
import { jobQuotesRouter, quotesRouter } from "./quotes.routes";
import { approvalsRouter } from "./approvals.routes";
import { attachmentsRouter, jobAttachmentsRouter } from "./attachments.routes";
import { roofImportRouter } from "./roof-import.routes";
import { jobProposalsRouter, quoteProposalsRouter } from "./proposals.routes";
import { installPacketRouter } from "./install-packet.routes";

/** Every session-authenticated API route; mounted behind the session, passport and CSRF middleware. */
export function apiRouter(ctx: AppContext): Router {
  const router = Router();
  router.use("/auth", authRouter({ passport: ctx.passport, users: ctx.services.users, config: ctx.config, sequelize: ctx.sequelize }));
  router.use("/users", usersRouter(ctx.services.users));
  router.use("/calc", calcRouter());
  router.use("/customers", customersRouter(ctx));
  router.use("/jobs/:jobId/quotes", jobQuotesRouter(ctx)); // before /jobs: the job's quotes
  router.use("/jobs/:jobId/attachments", jobAttachmentsRouter(ctx)); // before /jobs: the job's files
  router.use("/jobs/:jobId/roof", roofImportRouter(ctx)); // before /jobs: import/export.csv only, the rest falls through
  router.use("/jobs/:jobId", installPacketRouter(ctx)); // before /jobs: install-packet(.pdf) only, the rest falls through
  router.use("/jobs/:jobId/proposals", jobProposalsRouter(ctx)); // before /jobs: the job's proposals
  router.use("/jobs", jobsRouter(ctx));
  router.use("/audit", auditRouter(ctx));
  router.use("/price-book", priceBookRouter(ctx));
  router.use("/company", companyRouter(ctx));
  router.use("/quotes", quotesRouter(ctx));
  router.use("/quotes", quoteProposalsRouter(ctx)); // /quotes/:id/pdf and /quotes/:id/send
  router.use("/approvals", approvalsRouter(ctx));
  router.use("/attachments", attachmentsRouter(ctx));
  router.use(mailRouter(ctx)); // /auth/forgot, /auth/reset, /dev/mail
  return router;
}
