/**
 * `POST /api/payments/webhook`: the payment provider's events. No session, no CSRF: the signature over
 * the raw body (express.raw, mounted before express.json) is checked with the SDK before anything reads
 * it; a bad or missing signature is 400 and changes nothing.
 */
import express, { Router } from "express";
import type { AppContext } from "../app";
import { PaymentsService, paymentsUnavailable } from "../services/payments.service";
import { ProposalsService } from "../services/proposals.service";
import { verifyWebhook, WebhookVerificationError } from "../payments/stripe-client";

export function paymentsWebhookRouter(ctx: AppContext): Router {
  const router = Router();
  const service = ctx.payments
    ? new PaymentsService({
        sequelize: ctx.sequelize,
        stripe: ctx.payments.stripe,
        config: ctx.payments.config,
        publicUrl: ctx.config.publicUrl,
        proposals: new ProposalsService({ sequelize: ctx.sequelize, storage: ctx.storage, config: ctx.config, logger: ctx.logger }),
        logger: ctx.logger,
      })
    : null;

  router.post("/", express.raw({ type: "application/json", limit: "1mb" }), async (req, res) => {
    if (!service || !ctx.payments) throw paymentsUnavailable();
    let event;
    try {
      event = verifyWebhook(ctx.payments.stripe, Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0), req.get("stripe-signature"), ctx.payments.config.webhookSecret);
    } catch (err) {
      if (err instanceof WebhookVerificationError) {
        ctx.logger.warn("payment webhook refused", { reason: err.reason });
        res.status(400).json({ error: { code: err.reason, message: "The webhook signature could not be verified" } });
        return;
      }
      throw err;
    }
    const applied = await service.handleEvent(event);
    res.json({ received: true, duplicate: !applied });
  });

  return router;
}
