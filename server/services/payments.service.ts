/**
 * Deposits: a Checkout Session for an accepted proposal's deposit, and the provider's webhooks.
 *
 * - A deposit is asked for only after acceptance (409 otherwise) and never twice once paid (409). One
 *   open payment row (pending or failed) per proposal is reused, with the idempotency key
 *   `deposit-<proposal token hash prefix>-<paymentId>`, so a double click or a retried request never makes a second session.
 * - A payment becomes paid only from a verified `checkout.session.completed` (payment_status paid) or
 *   `checkout.session.async_payment_succeeded` webhook, never from the browser coming back.
 * - Each event id is recorded in payment_events in the same transaction as the change it causes; the
 *   unique index makes a replayed (or concurrently repeated) event change nothing. A paid row never moves
 *   back (an older failure or expiry arriving late is recorded and ignored).
 */
import type Stripe from "stripe";
import { UniqueConstraintError, type Sequelize, type Transaction } from "sequelize";
import { formatMoney } from "../../shared/schemas/proposal";
import { conflict, HttpError } from "../errors";
import type { Logger } from "../logger";
import { emailLayout, escapeHtml } from "../mail/templates";
import { Company, Customer, Job, Payment, PaymentEvent, Proposal, Quote, QuoteOption } from "../models/index";
import type { PaymentConfig } from "../payments/config";
import { createDepositCheckout } from "../payments/stripe-client";
import { recordAudit } from "./audit.service";
import { enqueueEmail } from "./outbox.service";
import { ProposalsService, proposalLink } from "./proposals.service";

export interface PaymentsDeps {
  sequelize: Sequelize;
  stripe: Stripe;
  config: PaymentConfig;
  publicUrl: string;
  proposals: ProposalsService;
  logger?: Logger;
}

const num = (v: string | number | null | undefined) => (v === null || v === undefined ? 0 : Number(v));

export const paymentsUnavailable = () => new HttpError(503, "payments_unavailable", "Card payments are not set up on this server");

export class PaymentsService {
  constructor(private readonly deps: PaymentsDeps) {}

  /** POST /api/proposals/:token/deposit → the payment page's URL. */
  async startDeposit(token: string): Promise<{ url: string; paymentId: number }> {
    const { sequelize, stripe, publicUrl, proposals } = this.deps;
    const proposal = await proposals.byToken(token);
    if (proposal.status !== "accepted") {
      throw conflict("not_accepted", "Accept the proposal first; the deposit follows the acceptance", { currentStatus: proposal.status });
    }
    // The row is chosen (or created) under the proposal's lock, so two requests share one row.
    const { payment, description, email } = await sequelize.transaction(async (t) => {
      const p = await Proposal.findByPk(proposal.id, { transaction: t, lock: t.LOCK.UPDATE });
      if (!p) throw conflict("not_accepted", "Accept the proposal first", { currentStatus: "unknown" });
      const rows = await Payment.findAll({ where: { proposalId: p.id }, order: [["id", "DESC"]], transaction: t });
      if (rows.some((r) => r.status === "paid")) throw conflict("already_paid", "The deposit is already paid; thank you", { currentStatus: "paid" });
      const option = await QuoteOption.findByPk(p.acceptedOptionId!, { transaction: t });
      const quote = await Quote.findByPk(p.quoteId, { attributes: ["number"], transaction: t });
      const job = await Job.findByPk(p.jobId, { transaction: t });
      const customer = job ? await Customer.findByPk(job.customerId, { attributes: ["email"], transaction: t }) : null;
      const amount = num(option?.depositCents);
      if (!option || amount <= 0) throw conflict("no_deposit", "This proposal asks for no deposit", { currentStatus: p.status });
      let row = rows.find((r) => r.status === "pending" || r.status === "failed");
      if (!row) {
        row = await Payment.create(
          { companyId: p.companyId, proposalId: p.id, jobId: p.jobId, kind: "deposit", amountCents: amount, currency: "usd", status: "pending" },
          { transaction: t },
        );
      }
      const site = [job?.siteAddressLine1, job?.siteCity].filter(Boolean).join(", ");
      return {
        payment: row,
        description: `Deposit: ${option.label}, proposal ${quote?.number ?? p.id}${site ? `, ${site}` : ""}`,
        email: customer?.email ?? p.sentTo,
      };
    });
    const link = proposalLink(publicUrl, token);
    const session = await createDepositCheckout(stripe, {
      amountCents: num(payment.amountCents),
      currency: payment.currency,
      description,
      customerEmail: email,
      successUrl: `${link}?deposit=processing`,
      cancelUrl: `${link}?deposit=cancelled`,
      metadata: { proposalId: String(proposal.id), paymentId: String(payment.id) },
      clientReferenceId: `payment-${payment.id}`,
      // Stable for this payment row; the proposal's random token hash keeps it unique across databases
      // (ids start again after a reset, and the provider remembers keys for a day).
      idempotencyKey: `deposit-${proposal.tokenHash.slice(0, 24)}-${payment.id}`,
    });
    if (payment.providerSessionId !== session.id) {
      await Payment.update({ providerSessionId: session.id }, { where: { id: payment.id } });
    }
    return { url: session.url, paymentId: payment.id };
  }

  /**
   * Applies one verified event. Returns false when the event id was seen before (nothing changes).
   * Event and change commit together: a crash between them leaves neither, and the provider's retry
   * applies both.
   */
  async handleEvent(event: Stripe.Event): Promise<boolean> {
    try {
      return await this.deps.sequelize.transaction(async (t) => {
        const row = await PaymentEvent.create({ eventId: event.id, type: event.type, paymentId: null, receivedAt: new Date(), processedAt: null }, { transaction: t });
        const paymentId = await this.apply(event, t);
        await row.update({ paymentId, processedAt: new Date() }, { transaction: t });
        return true;
      });
    } catch (err) {
      if (err instanceof UniqueConstraintError) return false; // a replay: the first delivery did it all
      throw err;
    }
  }

  private async findPayment(obj: { metadata?: Record<string, string> | null; id?: string }, by: "session" | "intent", t: Transaction): Promise<Payment | null> {
    const where = by === "session" ? { providerSessionId: obj.id } : { providerPaymentIntentId: obj.id };
    let p = obj.id ? await Payment.findOne({ where, transaction: t, lock: t.LOCK.UPDATE }) : null;
    const metaId = Number(obj.metadata?.paymentId);
    if (!p && Number.isInteger(metaId) && metaId > 0) {
      p = await Payment.findByPk(metaId, { transaction: t, lock: t.LOCK.UPDATE });
      // Only with the matching proposal (and session, when the row has one): never another row's event.
      if (p && String(p.proposalId) !== obj.metadata?.proposalId) p = null;
      if (p && by === "session" && p.providerSessionId && p.providerSessionId !== obj.id) p = null;
    }
    return p;
  }

  private async apply(event: Stripe.Event, t: Transaction): Promise<number | null> {
    switch (event.type) {
      case "checkout.session.completed":
      case "checkout.session.async_payment_succeeded": {
        const s = event.data.object as Stripe.Checkout.Session;
        const p = await this.findPayment(s, "session", t);
        if (!p) return null;
        if (s.payment_status !== "paid") return p.id; // e.g. a delayed method: wait for async_payment_succeeded
        if (p.status === "paid") return p.id;
        const intent = typeof s.payment_intent === "string" ? s.payment_intent : (s.payment_intent?.id ?? null);
        await p.update({ status: "paid", paidAt: new Date(), providerSessionId: p.providerSessionId ?? s.id, providerPaymentIntentId: intent, lastError: null }, { transaction: t });
        await recordAudit(
          { companyId: p.companyId, actorId: null, entityType: "payment", entityId: p.id, jobId: p.jobId, action: "paid", changes: { amountCents: num(p.amountCents), eventId: event.id } },
          t,
        );
        await this.paidNotice(p, t);
        return p.id;
      }
      case "checkout.session.async_payment_failed":
      case "payment_intent.payment_failed": {
        const obj = event.data.object as Stripe.PaymentIntent | Stripe.Checkout.Session;
        const p = await this.findPayment(obj, event.type === "payment_intent.payment_failed" ? "intent" : "session", t);
        if (!p || p.status === "paid" || p.status === "expired") return p?.id ?? null; // never backwards
        const err = event.type === "payment_intent.payment_failed" ? (obj as Stripe.PaymentIntent).last_payment_error?.message : "The payment failed";
        const intent = event.type === "payment_intent.payment_failed" ? (obj as Stripe.PaymentIntent).id : p.providerPaymentIntentId;
        await p.update({ status: "failed", lastError: (err ?? "The payment failed").slice(0, 1000), providerPaymentIntentId: intent }, { transaction: t });
        return p.id;
      }
      case "checkout.session.expired": {
        const s = event.data.object as Stripe.Checkout.Session;
        const p = await this.findPayment(s, "session", t);
        if (!p || p.status === "paid") return p?.id ?? null;
        await p.update({ status: "expired" }, { transaction: t });
        return p.id;
      }
      case "payment_intent.succeeded":
      case "payment_intent.requires_action": {
        // Recorded; the session's completion is what marks a deposit paid.
        const pi = event.data.object as Stripe.PaymentIntent;
        const p = await this.findPayment(pi, "intent", t);
        if (p && !p.providerPaymentIntentId) await p.update({ providerPaymentIntentId: pi.id }, { transaction: t });
        return p?.id ?? null;
      }
      default:
        return null;
    }
  }

  /** The receipt to the homeowner and the notice to the estimator when the deposit is paid (in the webhook's transaction). */
  private async paidNotice(p: Payment, t: Transaction) {
    const proposal = await Proposal.findByPk(p.proposalId, { transaction: t });
    const job = await Job.findByPk(p.jobId, { transaction: t });
    if (!proposal || !job) return;
    const [quote, customer, company] = await Promise.all([
      Quote.findByPk(proposal.quoteId, { attributes: ["number"], transaction: t }),
      Customer.findByPk(job.customerId, { attributes: ["name", "email"], transaction: t }),
      Company.findByPk(p.companyId, { attributes: ["name"], transaction: t }),
    ]);
    const homeowner = customer?.email ?? proposal.sentTo;
    if (homeowner) {
      const amount = formatMoney(num(p.amountCents));
      const from = company?.name ?? "your roofing contractor";
      const subject = `Receipt: deposit of ${amount} for proposal ${quote?.number ?? ""}`;
      const text = [
        `Thank you${customer?.name ? `, ${customer.name}` : ""}. ${from} received your deposit of ${amount} for proposal ${quote?.number ?? ""}.`,
        "",
        "Keep this e-mail as your receipt. Your contractor will be in touch to schedule the work.",
      ].join("\n");
      const html = emailLayout(
        subject,
        `<p>Thank you${customer?.name ? `, ${escapeHtml(customer.name)}` : ""}. ${escapeHtml(from)} received your deposit of <strong>${escapeHtml(amount)}</strong> for proposal ${escapeHtml(quote?.number ?? "")}.</p>
<p>Keep this e-mail as your receipt. Your contractor will be in touch to schedule the work.</p>`,
      );
      await enqueueEmail({ to: homeowner, subject, text, html }, { transaction: t, companyId: p.companyId, kind: "deposit_receipt" });
    }
    const to = await this.deps.proposals.estimatorEmail(job, proposal, t);
    if (!to) return;
    const subject = `Deposit paid: ${quote?.number ?? ""} by ${customer?.name ?? "the homeowner"}`;
    const amount = formatMoney(num(p.amountCents));
    const jobUrl = `${this.deps.publicUrl.replace(/\/+$/, "")}/jobs/${job.id}`;
    const text = [`${customer?.name ?? "The homeowner"} paid the deposit of ${amount} for proposal ${quote?.number ?? ""}.`, "", `The job: ${jobUrl}`].join("\n");
    const html = emailLayout(
      subject,
      `<p>${escapeHtml(customer?.name ?? "The homeowner")} paid the deposit of ${escapeHtml(amount)} for proposal ${escapeHtml(quote?.number ?? "")}.</p>
<p><a href="${escapeHtml(jobUrl)}">Open the job</a></p>`,
    );
    await enqueueEmail({ to, subject, text, html }, { transaction: t, companyId: p.companyId, kind: "deposit_paid" });
  }
}
