/**
 * The app's side of payments: one SDK instance, the deposit Checkout Session and webhook verification.
 * The same code reaches the local test payment service (`fakeHost`) or the hosted service (no `fakeHost`).
 */
import Stripe from "stripe";

export type PaymentClient = Stripe;
export type PaymentEvent = Stripe.Event;

export interface PaymentClientConfig {
  secretKey: string;
  /** The local fake; omit to use the hosted service. */
  fakeHost?: { host: string; port: number; protocol: "http" };
  /** Per-request timeout; the SDK's default is 80 s. */
  timeoutMs?: number;
}

export function createPaymentClient(config: PaymentClientConfig): Stripe {
  if (config.fakeHost) {
    return new Stripe(config.secretKey, {
      host: config.fakeHost.host,
      port: config.fakeHost.port,
      protocol: config.fakeHost.protocol,
      maxNetworkRetries: 0,
      telemetry: false,
      timeout: config.timeoutMs ?? 10_000,
    });
  }
  // Hosted service: the SDK retries network faults with idempotency keys, which the service honours.
  return new Stripe(config.secretKey, { maxNetworkRetries: 2, telemetry: false, timeout: config.timeoutMs ?? 30_000 });
}

export interface DepositCheckoutInput {
  /** In the currency's smallest unit (cents). */
  amountCents: number;
  /** ISO 4217, e.g. "usd". */
  currency: string;
  /** Shown to the payer as the line item, e.g. "Deposit: standing-seam roof, 12 Example Lane". */
  description: string;
  customerEmail?: string | null;
  /** May contain `{CHECKOUT_SESSION_ID}`, which the service replaces. */
  successUrl: string;
  cancelUrl: string;
  /** Strings only; copied onto the session and its PaymentIntent (e.g. { proposalId, paymentId }). */
  metadata: Record<string, string>;
  /** Our own reference, e.g. the payment row's id. */
  clientReferenceId?: string;
  /** The same key for the same deposit attempt, so a retried request never makes a second session. */
  idempotencyKey: string;
}

/** Creates a hosted Checkout Session for a deposit; returns its id and the payment page URL. */
export async function createDepositCheckout(stripe: Stripe, input: DepositCheckoutInput): Promise<{ id: string; url: string }> {
  if (!Number.isInteger(input.amountCents) || input.amountCents <= 0) throw new RangeError("amountCents must be a positive whole number");
  if (!/^[a-z]{3}$/i.test(input.currency)) throw new RangeError("currency must be a three-letter ISO 4217 code");
  if (!input.idempotencyKey) throw new RangeError("idempotencyKey is required");
  const session = await stripe.checkout.sessions.create(
    {
      mode: "payment",
      line_items: [
        {
          quantity: 1,
          price_data: {
            currency: input.currency.toLowerCase(),
            unit_amount: input.amountCents,
            product_data: { name: input.description.slice(0, 250) },
          },
        },
      ],
      success_url: input.successUrl,
      cancel_url: input.cancelUrl,
      ...(input.customerEmail ? { customer_email: input.customerEmail } : {}),
      ...(input.clientReferenceId ? { client_reference_id: input.clientReferenceId } : {}),
      metadata: input.metadata,
      payment_intent_data: { metadata: input.metadata, description: input.description.slice(0, 250) },
    },
    { idempotencyKey: input.idempotencyKey },
  );
  if (!session.url) throw new Error(`Checkout Session ${session.id} came back without a payment page URL`);
  return { id: session.id, url: session.url };
}

export type WebhookFailure = "missing_signature" | "bad_signature" | "too_old" | "not_raw_body";

/** Why a webhook was refused; the route answers 400 and changes nothing. */
export class WebhookVerificationError extends Error {
  override readonly name = "WebhookVerificationError";
  constructor(
    readonly reason: WebhookFailure,
    message: string,
  ) {
    super(message);
  }
}

export interface VerifyWebhookOptions {
  /** Oldest accepted signature timestamp, in seconds (the SDK's default is 300). */
  toleranceSec?: number;
  /** For tests: the receive time in ms. */
  now?: number;
}

/**
 * Verifies a webhook's `Stripe-Signature` over the exact raw body with the SDK's check and returns the Event.
 * Give it the untouched bytes (`express.raw({ type: "application/json" })` mounted before `express.json`).
 */
export function verifyWebhook(
  stripe: Stripe,
  rawBody: Buffer | string,
  signatureHeader: string | string[] | undefined,
  secret: string,
  options: VerifyWebhookOptions = {},
): Stripe.Event {
  if (!Buffer.isBuffer(rawBody) && typeof rawBody !== "string") {
    throw new WebhookVerificationError("not_raw_body", "The webhook body was parsed before verification; mount the raw body parser first");
  }
  if (typeof signatureHeader !== "string" || signatureHeader.trim() === "") {
    throw new WebhookVerificationError("missing_signature", "The Stripe-Signature header is missing");
  }
  const tolerance = options.toleranceSec ?? stripe.webhooks.DEFAULT_TOLERANCE;
  try {
    // First the signature alone (tolerance 0 skips the age check), so a forged body never reads as "too old".
    stripe.webhooks.constructEvent(rawBody, signatureHeader, secret, 0, undefined, options.now);
  } catch (err) {
    throw new WebhookVerificationError("bad_signature", `Webhook signature check failed: ${(err as Error).message.split("\n")[0]}`);
  }
  try {
    return stripe.webhooks.constructEvent(rawBody, signatureHeader, secret, tolerance, undefined, options.now);
  } catch (err) {
    throw new WebhookVerificationError("too_old", `Webhook signature is too old: ${(err as Error).message.split("\n")[0]}`);
  }
}
