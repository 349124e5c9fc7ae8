/**
 * A local stand-in for the hosted payment service, for development, tests and drills.
 *
 * It answers the few API calls the app makes through the official `stripe` SDK (pointed here with
 * `host`/`port`/`protocol: "http"`), in the same wire format: form-encoded request bodies with bracketed
 * keys, `Authorization: Bearer sk_test_…`, `Idempotency-Key`, JSON objects and JSON errors of the form
 * `{ error: { type, message, code?, param? } }`. It serves a plain hosted-style TEST payment page at
 * `/pay/:sessionId` with test-card outcomes and sends signed webhook events to `webhookUrl`, signed the way
 * the provider signs them (`Stripe-Signature: t=<unix>,v1=<hex HMAC-SHA256("<t>.<raw body>")>`), so the
 * app verifies them with the SDK's own `webhooks.constructEvent`.
 *
 * Everything is kept in memory; nothing here moves money. Only test keys (`sk_test_…`) are accepted.
 */
import express, { type Express, type NextFunction, type Request, type Response } from "express";
import { createHmac, randomBytes } from "node:crypto";
import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import Stripe from "stripe";

// ---------------------------------------------------------------------------------------------------------
// Public API

export interface PaymentFakeOptions {
  /** 0 picks a free port. */
  port?: number;
  /** Always a loopback address; defaults to 127.0.0.1. */
  host?: string;
  /** Where signed webhook events are POSTed; without it events are only recorded. */
  webhookUrl?: string;
  /** The signing secret shared with the app (`STRIPE_WEBHOOK_SECRET`), e.g. `whsec_local_fake`. */
  webhookSecret: string;
  /** Base URL the browser uses to reach the fake (for session `url`s); defaults to http://host:port. */
  publicUrl?: string;
  /** When set, only this exact secret key is accepted; otherwise any `sk_test_…` key is. */
  apiKey?: string;
  /** Waits between webhook attempts after a failure; its length + 1 is the number of attempts. */
  webhookRetryDelaysMs?: number[];
  /** Per-attempt timeout for a webhook POST. */
  webhookTimeoutMs?: number;
  /** false: record events but do not send them (drills send them with `deliver`). Default true. */
  deliverWebhooks?: boolean;
  log?: (message: string) => void;
}

/** A webhook event exactly as it was (or would be) sent. */
export interface FakeEvent {
  id: string;
  object: "event";
  api_version: string;
  created: number;
  data: { object: Record<string, unknown>; previous_attributes?: Record<string, unknown> };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: string;
}

export interface DeliveryAttempt {
  eventId: string;
  type: string;
  attempt: number;
  at: number;
  /** HTTP status from the receiver, or null when the request itself failed. */
  status: number | null;
  error: string | null;
  ok: boolean;
}

export interface DeliveryResult {
  eventId: string;
  delivered: boolean;
  attempts: number;
  lastStatus: number | null;
}

export interface PaymentFake {
  port: number;
  /** Base URL of the fake, e.g. http://127.0.0.1:12111 */
  url: string;
  /** The Express app (for supertest-style use without a port). */
  app: Express;
  close(): Promise<void>;
  /** Every event created so far, oldest first (copies). */
  events(): FakeEvent[];
  /** Every webhook delivery attempt so far, oldest first. */
  deliveries(): DeliveryAttempt[];
  /** Sends an already-sent event again: same id, same body, a fresh signature. */
  redeliver(eventId: string): Promise<DeliveryResult>;
  /** Sends the given events in the given order (e.g. reversed, for out-of-order drills). */
  deliver(eventIds: string[]): Promise<DeliveryResult[]>;
  setWebhookUrl(url: string | undefined): void;
  /** Resolves once every queued webhook delivery (with its retries) has finished. */
  idle(): Promise<void>;
}

/** Test card numbers the hosted page understands (the provider's published test numbers). */
export const TEST_CARDS = {
  succeeds: "4242 4242 4242 4242",
  declined: "4000 0000 0000 0002",
  authenticationRequired: "4000 0027 6000 3184",
} as const;

/** Test payment-method ids accepted by `POST /v1/payment_intents` with `confirm=true`. */
const TEST_PAYMENT_METHODS: Record<string, CardOutcome> = {
  pm_card_visa: "succeeds",
  pm_card_chargeDeclined: "declined",
  pm_card_visa_chargeDeclined: "declined",
  pm_card_authenticationRequired: "authentication_required",
  pm_card_threeDSecure2Required: "authentication_required",
};

const MIN_AMOUNT = 50; // the provider's minimum charge in the smallest unit for USD-like currencies
const ZERO_DECIMAL = new Set(["bif", "clp", "djf", "gnf", "jpy", "kmf", "krw", "mga", "pyg", "rwf", "ugx", "vnd", "vuv", "xaf", "xof", "xpf"]);

// ---------------------------------------------------------------------------------------------------------
// In-memory objects (the subset of fields the app reads, in the provider's names)

type CardOutcome = "succeeds" | "declined" | "authentication_required";

interface PaymentError {
  type: string;
  code: string;
  decline_code?: string;
  message: string;
  payment_method?: Record<string, unknown> | null;
}

interface PaymentIntentRecord {
  id: string;
  object: "payment_intent";
  amount: number;
  amount_capturable: number;
  amount_received: number;
  canceled_at: number | null;
  cancellation_reason: string | null;
  capture_method: "automatic";
  client_secret: string;
  confirmation_method: "automatic";
  created: number;
  currency: string;
  description: string | null;
  last_payment_error: PaymentError | null;
  latest_charge: string | null;
  livemode: false;
  metadata: Record<string, string>;
  next_action: Record<string, unknown> | null;
  payment_method: string | null;
  payment_method_types: string[];
  receipt_email: string | null;
  status: "requires_payment_method" | "requires_confirmation" | "requires_action" | "processing" | "succeeded" | "canceled";
  /** Fake-only bookkeeping, never serialized. */
  _sessionId?: string;
  _returnUrl?: string | null;
}

interface LineItemRecord {
  name: string;
  description: string | null;
  unitAmount: number;
  quantity: number;
}

interface SessionRecord {
  id: string;
  object: "checkout.session";
  amount_subtotal: number;
  amount_total: number;
  cancel_url: string | null;
  client_reference_id: string | null;
  created: number;
  currency: string;
  customer: null;
  customer_details: { email: string | null; name: string | null } | null;
  customer_email: string | null;
  expires_at: number;
  livemode: false;
  metadata: Record<string, string>;
  mode: "payment";
  payment_intent: string;
  payment_method_types: string[];
  payment_status: "unpaid" | "paid";
  status: "open" | "complete" | "expired";
  success_url: string | null;
  ui_mode: "hosted";
  url: string | null;
  _lineItems?: LineItemRecord[];
}

class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: { type: string; message: string; code?: string; param?: string; decline_code?: string; payment_intent?: unknown },
  ) {
    super(body.message);
  }
}

const invalid = (message: string, param?: string, code = "parameter_invalid") =>
  new ApiError(400, { type: "invalid_request_error", message, param, code });
const missing = (param: string) =>
  new ApiError(400, { type: "invalid_request_error", code: "parameter_missing", param, message: `Missing required param: ${param}.` });
const noSuch = (what: string, id: string, param: string) =>
  new ApiError(404, { type: "invalid_request_error", code: "resource_missing", param, message: `No such ${what}: '${id}'` });

// ---------------------------------------------------------------------------------------------------------
// Small helpers

const ALNUM = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz";
function randomId(prefix: string, length = 24): string {
  const bytes = randomBytes(length);
  let s = "";
  for (const b of bytes) s += ALNUM[b % ALNUM.length];
  return `${prefix}${s}`;
}

const nowSec = () => Math.floor(Date.now() / 1000);

/** Public view of a record: fake-only fields (leading underscore) dropped, deep-copied. */
function present<T extends object>(record: T): Record<string, unknown> {
  return JSON.parse(JSON.stringify(record, (k, v) => (k.startsWith("_") ? undefined : v))) as Record<string, unknown>;
}

/** qs turns `a[0]`… into arrays only up to its array limit; accept both shapes. */
function asList(value: unknown): unknown[] | undefined {
  if (value === undefined) return undefined;
  if (Array.isArray(value)) return value;
  if (value && typeof value === "object") {
    const entries = Object.entries(value as Record<string, unknown>);
    if (entries.every(([k]) => /^\d+$/.test(k))) return entries.sort(([a], [b]) => Number(a) - Number(b)).map(([, v]) => v);
  }
  return undefined;
}

const asObject = (value: unknown): Record<string, unknown> | undefined =>
  value && typeof value === "object" && !Array.isArray(value) ? (value as Record<string, unknown>) : undefined;

function optString(body: Record<string, unknown>, key: string, param = key): string | null {
  const v = body[key];
  if (v === undefined || v === "") return null;
  if (typeof v !== "string") throw invalid(`Invalid string: ${param}`, param);
  return v;
}

function parseInteger(value: unknown, param: string): number {
  if (typeof value !== "string" || !/^-?\d+$/.test(value)) throw invalid(`Invalid integer: ${String(value)}`, param, "parameter_invalid_integer");
  return Number(value);
}

function parseBool(value: unknown, param: string): boolean {
  if (value === undefined || value === "") return false;
  if (value === "true") return true;
  if (value === "false") return false;
  throw invalid(`Invalid boolean: ${String(value)}`, param);
}

function parseMetadata(value: unknown, param: string): Record<string, string> {
  if (value === undefined || value === "") return {};
  const obj = asObject(value);
  if (!obj) throw invalid("Invalid hash", param);
  const out: Record<string, string> = {};
  const keys = Object.keys(obj);
  if (keys.length > 50) throw invalid("Metadata can have at most 50 keys.", param);
  for (const key of keys) {
    const v = obj[key];
    if (typeof v !== "string") throw invalid("Metadata values must be strings.", `${param}[${key}]`);
    if (key.length > 40) throw invalid("Metadata keys can be at most 40 characters long.", `${param}[${key}]`);
    if (v.length > 500) throw invalid("Metadata values can be at most 500 characters long.", `${param}[${key}]`);
    if (v !== "") out[key] = v;
  }
  return out;
}

function parseCurrency(value: unknown, param: string): string {
  if (typeof value !== "string" || value === "") throw missing(param);
  if (!/^[a-zA-Z]{3}$/.test(value)) throw invalid(`Invalid currency: ${value}.`, param);
  return value.toLowerCase();
}

function parseUrl(value: string | null, param: string): string | null {
  if (value === null) return null;
  try {
    const u = new URL(value.replace(/\{CHECKOUT_SESSION_ID\}/g, "x"));
    if (u.protocol !== "http:" && u.protocol !== "https:") throw new Error("scheme");
  } catch {
    throw invalid("Not a valid URL", param, "url_invalid");
  }
  return value;
}

export function formatMoney(amount: number, currency: string): string {
  const value = ZERO_DECIMAL.has(currency) ? amount : amount / 100;
  try {
    return new Intl.NumberFormat("en-US", { style: "currency", currency: currency.toUpperCase() }).format(value);
  } catch {
    return `${value.toFixed(ZERO_DECIMAL.has(currency) ? 0 : 2)} ${currency.toUpperCase()}`;
  }
}

function luhnValid(digits: string): boolean {
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    let d = Number(digits[digits.length - 1 - i]);
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return digits.length >= 12 && sum % 10 === 0;
}

function cardOutcome(number: string): CardOutcome | "unknown" | "incorrect" {
  const digits = number.replace(/[\s-]/g, "");
  if (!/^\d+$/.test(digits) || !luhnValid(digits)) return "incorrect";
  if (digits === TEST_CARDS.succeeds.replace(/ /g, "")) return "succeeds";
  if (digits === TEST_CARDS.declined.replace(/ /g, "")) return "declined";
  if (digits === TEST_CARDS.authenticationRequired.replace(/ /g, "")) return "authentication_required";
  return "unknown";
}

const escapeHtml = (s: string) =>
  s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");

/** Stable fingerprint of a parsed body, independent of key order. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(",")}]`;
  if (value && typeof value === "object") {
    const obj = value as Record<string, unknown>;
    return `{${Object.keys(obj).sort().map((k) => `${JSON.stringify(k)}:${canonical(obj[k])}`).join(",")}}`;
  }
  return JSON.stringify(value ?? null);
}

/** Signs a payload the way the provider does: `t=<unix>,v1=<hex HMAC-SHA256 of "<t>.<payload>">`. */
export function signWebhookPayload(payload: string, secret: string, timestamp = nowSec()): string {
  const v1 = createHmac("sha256", secret).update(`${timestamp}.${payload}`, "utf8").digest("hex");
  return `t=${timestamp},v1=${v1}`;
}

// ---------------------------------------------------------------------------------------------------------
// The fake

export async function startPaymentFake(options: PaymentFakeOptions): Promise<PaymentFake> {
  const host = options.host ?? "127.0.0.1";
  const log = options.log ?? (() => {});
  const retryDelays = options.webhookRetryDelaysMs ?? [250, 1_000, 3_000];
  const webhookTimeoutMs = options.webhookTimeoutMs ?? 10_000;
  const autoDeliver = options.deliverWebhooks ?? true;
  let webhookUrl = options.webhookUrl;
  let publicUrl = options.publicUrl?.replace(/\/+$/, "") ?? "";
  let closed = false;

  const sessions = new Map<string, SessionRecord>();
  const intents = new Map<string, PaymentIntentRecord>();
  const events: Array<{ event: FakeEvent; body: string }> = [];
  const eventsById = new Map<string, { event: FakeEvent; body: string }>();
  const attempts: DeliveryAttempt[] = [];
  const idempotency = new Map<string, { fingerprint: string; status: number; body: unknown }>();
  const inFlight = new Set<AbortController>();
  let queue: Promise<unknown> = Promise.resolve();
  const sleepers = new Set<() => void>();
  /** A wait that ends early when the fake closes. */
  const sleep = (ms: number) =>
    new Promise<void>((resolve) => {
      const done = () => {
        clearTimeout(timer);
        sleepers.delete(done);
        resolve();
      };
      const timer = setTimeout(done, ms);
      sleepers.add(done);
    });

  // --- events and webhook delivery ------------------------------------------------------------------------

  function emit(type: string, object: object) {
    const event: FakeEvent = {
      id: randomId("evt_"),
      object: "event",
      api_version: Stripe.API_VERSION,
      created: nowSec(),
      data: { object: present(object) },
      livemode: false,
      pending_webhooks: webhookUrl ? 1 : 0,
      request: { id: null, idempotency_key: null },
      type,
    };
    // The provider sends pretty-printed JSON; the signature covers these exact bytes.
    const entry = { event, body: JSON.stringify(event, null, 2) };
    events.push(entry);
    eventsById.set(event.id, entry);
    if (autoDeliver) enqueue(event.id);
  }

  function enqueue(eventId: string): Promise<DeliveryResult> {
    const run = queue.then(() => deliverWithRetries(eventId));
    queue = run.catch(() => undefined);
    return run;
  }

  async function deliverOnce(entry: { event: FakeEvent; body: string }, attempt: number): Promise<DeliveryAttempt> {
    const record: DeliveryAttempt = { eventId: entry.event.id, type: entry.event.type, attempt, at: Date.now(), status: null, error: null, ok: false };
    const url = webhookUrl;
    if (!url) {
      record.error = "no webhook URL configured";
      attempts.push(record);
      return record;
    }
    const controller = new AbortController();
    inFlight.add(controller);
    const timer = setTimeout(() => controller.abort(new Error("timed out")), webhookTimeoutMs);
    try {
      const res = await fetch(url, {
        method: "POST",
        headers: {
          "content-type": "application/json; charset=utf-8",
          "user-agent": "RidgewrightPaymentFake/1.0 (local test webhooks)",
          "stripe-signature": signWebhookPayload(entry.body, options.webhookSecret),
        },
        body: entry.body,
        signal: controller.signal,
      });
      await res.arrayBuffer().catch(() => undefined);
      record.status = res.status;
      record.ok = res.status >= 200 && res.status < 300;
      if (!record.ok) record.error = `HTTP ${res.status}`;
    } catch (err) {
      record.error = err instanceof Error ? err.message : String(err);
    } finally {
      clearTimeout(timer);
      inFlight.delete(controller);
    }
    attempts.push(record);
    log(`webhook ${entry.event.type} ${entry.event.id} attempt ${attempt}: ${record.ok ? "ok" : record.error}`);
    return record;
  }

  async function deliverWithRetries(eventId: string): Promise<DeliveryResult> {
    const entry = eventsById.get(eventId);
    if (!entry) throw new Error(`No such event: ${eventId}`);
    let last: DeliveryAttempt | null = null;
    for (let i = 0; i <= retryDelays.length && !closed; i++) {
      if (i > 0) await sleep(retryDelays[i - 1]);
      if (closed) break;
      last = await deliverOnce(entry, i + 1);
      if (last.ok || !webhookUrl) break;
    }
    return { eventId, delivered: Boolean(last?.ok), attempts: last?.attempt ?? 0, lastStatus: last?.status ?? null };
  }

  // --- payment processing ---------------------------------------------------------------------------------

  function cardDetails(outcome: CardOutcome) {
    const last4 = { succeeds: "4242", declined: "0002", authentication_required: "3184" }[outcome];
    return { id: randomId("pm_"), type: "card", card: { brand: "visa", last4, exp_month: 12, exp_year: new Date().getFullYear() + 3 } };
  }

  function succeed(pi: PaymentIntentRecord) {
    pi.status = "succeeded";
    pi.amount_received = pi.amount;
    pi.last_payment_error = null;
    pi.next_action = null;
    pi.latest_charge = randomId("ch_");
    emit("payment_intent.succeeded", pi);
    const session = pi._sessionId ? sessions.get(pi._sessionId) : undefined;
    if (session && session.status === "open") {
      session.status = "complete";
      session.payment_status = "paid";
      session.url = null;
      session.customer_details = { email: session.customer_email, name: null };
      emit("checkout.session.completed", session);
    }
  }

  function fail(pi: PaymentIntentRecord, error: PaymentError) {
    pi.status = "requires_payment_method";
    pi.last_payment_error = error;
    pi.next_action = null;
    pi.payment_method = null;
    emit("payment_intent.payment_failed", pi);
  }

  /** One payment attempt with a test card; updates the PaymentIntent and sends the events. */
  function attempt(pi: PaymentIntentRecord, outcome: CardOutcome, returnUrl: string | null): PaymentIntentRecord["status"] {
    const pm = cardDetails(outcome);
    pi.payment_method = pm.id;
    if (outcome === "succeeds") {
      succeed(pi);
    } else if (outcome === "declined") {
      fail(pi, { type: "card_error", code: "card_declined", decline_code: "generic_decline", message: "Your card was declined.", payment_method: pm });
    } else {
      pi.status = "requires_action";
      pi.last_payment_error = null;
      pi._returnUrl = returnUrl;
      pi.next_action = {
        type: "redirect_to_url",
        redirect_to_url: { url: `${publicUrl}/authenticate/${pi.id}`, return_url: returnUrl },
      };
      emit("payment_intent.requires_action", pi);
    }
    return pi.status;
  }

  function authenticate(pi: PaymentIntentRecord, ok: boolean) {
    if (ok) return succeed(pi);
    fail(pi, {
      type: "invalid_request_error",
      code: "payment_intent_authentication_failure",
      message:
        "The provided PaymentMethod has failed authentication. You can provide payment_method_data or a new PaymentMethod to attempt to fulfill this PaymentIntent again.",
      payment_method: null,
    });
  }

  function newPaymentIntent(fields: {
    amount: number;
    currency: string;
    description: string | null;
    metadata: Record<string, string>;
    receiptEmail: string | null;
    sessionId?: string;
  }): PaymentIntentRecord {
    const id = randomId("pi_");
    const pi: PaymentIntentRecord = {
      id,
      object: "payment_intent",
      amount: fields.amount,
      amount_capturable: 0,
      amount_received: 0,
      canceled_at: null,
      cancellation_reason: null,
      capture_method: "automatic",
      client_secret: `${id}_secret_${randomId("", 25)}`,
      confirmation_method: "automatic",
      created: nowSec(),
      currency: fields.currency,
      description: fields.description,
      last_payment_error: null,
      latest_charge: null,
      livemode: false,
      metadata: fields.metadata,
      next_action: null,
      payment_method: null,
      payment_method_types: ["card"],
      receipt_email: fields.receiptEmail,
      status: "requires_payment_method",
      _sessionId: fields.sessionId,
    };
    intents.set(id, pi);
    return pi;
  }

  function expireSession(session: SessionRecord) {
    session.status = "expired";
    session.url = null;
    const pi = intents.get(session.payment_intent);
    if (pi && pi.status !== "succeeded" && pi.status !== "canceled") {
      pi.status = "canceled";
      pi.canceled_at = nowSec();
      pi.cancellation_reason = "abandoned";
      pi.next_action = null;
      emit("payment_intent.canceled", pi);
    }
    emit("checkout.session.expired", session);
  }

  // --- the API --------------------------------------------------------------------------------------------

  const app = express();
  app.disable("x-powered-by");
  app.set("etag", false);

  const api = express.Router();

  api.use((req, res, next) => {
    res.setHeader("request-id", randomId("req_", 14));
    res.setHeader("cache-control", "no-cache, no-store");
    const header = req.get("authorization") ?? "";
    const match = /^Bearer\s+(\S+)$/i.exec(header);
    if (!match) {
      throw new ApiError(401, {
        type: "invalid_request_error",
        message:
          "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
      });
    }
    const key = match[1];
    const masked = key.length > 12 ? `${key.slice(0, 8)}${"*".repeat(Math.min(12, key.length - 12))}${key.slice(-4)}` : key;
    if (!key.startsWith("sk_test_") || (options.apiKey !== undefined && key !== options.apiKey)) {
      throw new ApiError(401, {
        type: "invalid_request_error",
        code: "api_key_invalid",
        message: key.startsWith("sk_live_")
          ? "This local test payment service accepts test keys only (sk_test_…); a live key was provided."
          : `Invalid API Key provided: ${masked}`,
      });
    }
    res.locals.apiKey = key;
    next();
  });

  api.use(express.urlencoded({ extended: true, limit: "256kb" }));

  // Idempotency: the same key with the same request replays the first response; different parameters → 400.
  api.use((req, res, next) => {
    const key = req.get("idempotency-key");
    if (req.method !== "POST" || !key) return next();
    const scope = `${res.locals.apiKey as string}\u0000${key}`;
    const fingerprint = `${req.method} ${req.path} ${canonical(req.body ?? {})}`;
    const stored = idempotency.get(scope);
    if (stored) {
      if (stored.fingerprint !== fingerprint) {
        throw new ApiError(400, {
          type: "idempotency_error",
          message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${key}' if you meant to execute a different request.`,
        });
      }
      res.setHeader("idempotent-replayed", "true");
      res.setHeader("idempotency-key", key);
      res.status(stored.status).json(stored.body);
      return;
    }
    res.setHeader("idempotency-key", key);
    const json = res.json.bind(res);
    res.json = (body: unknown) => {
      if (res.statusCode < 500) {
        idempotency.set(scope, { fingerprint, status: res.statusCode, body });
        if (idempotency.size > 10_000) idempotency.delete(idempotency.keys().next().value as string);
      }
      return json(body);
    };
    next();
  });

  api.post("/checkout/sessions", (req, res) => {
    const body = (req.body ?? {}) as Record<string, unknown>;
    const mode = optString(body, "mode");
    if (!mode) throw missing("mode");
    if (mode !== "payment") throw invalid(`This local test service supports only mode=payment (got '${mode}').`, "mode");
    const items = asList(body.line_items);
    if (!items || items.length === 0) throw missing("line_items");
    let currency: string | null = null;
    const lineItems: LineItemRecord[] = items.map((raw, i) => {
      const item = asObject(raw);
      const p = `line_items[${i}]`;
      if (!item) throw invalid("Invalid line item", p);
      if (item.price !== undefined) throw invalid("This local test service supports price_data only, not saved prices.", `${p}[price]`);
      const priceData = asObject(item.price_data);
      if (!priceData) throw missing(`${p}[price_data]`);
      const itemCurrency = parseCurrency(priceData.currency, `${p}[price_data][currency]`);
      if (currency && itemCurrency !== currency) throw invalid("All line items must use the same currency.", `${p}[price_data][currency]`);
      currency = itemCurrency;
      if (priceData.unit_amount === undefined) throw missing(`${p}[price_data][unit_amount]`);
      const unitAmount = parseInteger(priceData.unit_amount, `${p}[price_data][unit_amount]`);
      if (unitAmount < 0) throw invalid("unit_amount must be zero or more.", `${p}[price_data][unit_amount]`);
      const product = asObject(priceData.product_data);
      const name = product && typeof product.name === "string" ? product.name.trim() : "";
      if (!name) throw missing(`${p}[price_data][product_data][name]`);
      const description = product && typeof product.description === "string" && product.description ? product.description : null;
      const quantity = item.quantity === undefined ? 1 : parseInteger(item.quantity, `${p}[quantity]`);
      if (quantity < 1) throw invalid("quantity must be at least 1.", `${p}[quantity]`);
      return { name, description, unitAmount, quantity };
    });
    const total = lineItems.reduce((s, li) => s + li.unitAmount * li.quantity, 0);
    if (total < MIN_AMOUNT && !ZERO_DECIMAL.has(currency!)) {
      throw invalid(`The Checkout Session's total amount due must add up to at least ${formatMoney(MIN_AMOUNT, currency!)}.`, "line_items", "amount_too_small");
    }
    const successUrl = parseUrl(optString(body, "success_url"), "success_url");
    const cancelUrl = parseUrl(optString(body, "cancel_url"), "cancel_url");
    const customerEmail = optString(body, "customer_email");
    if (customerEmail !== null && !/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(customerEmail)) throw invalid("Invalid email address: " + customerEmail, "customer_email", "email_invalid");
    const clientReferenceId = optString(body, "client_reference_id");
    if (clientReferenceId && clientReferenceId.length > 200) throw invalid("client_reference_id can be at most 200 characters.", "client_reference_id");
    const metadata = parseMetadata(body.metadata, "metadata");
    const piData = asObject(body.payment_intent_data) ?? {};
    const piMetadata = parseMetadata(piData.metadata, "payment_intent_data[metadata]");
    const piDescription = optString(piData, "description", "payment_intent_data[description]");

    const id = randomId("cs_test_", 58);
    const created = nowSec();
    const pi = newPaymentIntent({
      amount: total,
      currency: currency!,
      description: piDescription ?? lineItems.map((li) => li.name).join(", "),
      metadata: piMetadata,
      receiptEmail: optString(piData, "receipt_email", "payment_intent_data[receipt_email]"),
      sessionId: id,
    });
    const session: SessionRecord = {
      id,
      object: "checkout.session",
      amount_subtotal: total,
      amount_total: total,
      cancel_url: cancelUrl,
      client_reference_id: clientReferenceId,
      created,
      currency: currency!,
      customer: null,
      customer_details: customerEmail ? { email: customerEmail, name: null } : null,
      customer_email: customerEmail,
      expires_at: created + 24 * 3600,
      livemode: false,
      metadata,
      mode: "payment",
      payment_intent: pi.id,
      payment_method_types: ["card"],
      payment_status: "unpaid",
      status: "open",
      success_url: successUrl,
      ui_mode: "hosted",
      url: `${publicUrl}/pay/${id}`,
      _lineItems: lineItems,
    };
    sessions.set(id, session);
    res.json(present(session));
  });

  const findSession = (id: string) => {
    const s = sessions.get(id);
    if (!s) throw noSuch("checkout.session", id, "session");
    return s;
  };
  const findIntent = (id: string) => {
    const pi = intents.get(id);
    if (!pi) throw noSuch("payment_intent", id, "intent");
    return pi;
  };

  api.get("/checkout/sessions/:id", (req, res) => {
    res.json(present(findSession(String(req.params.id))));
  });

  api.post("/checkout/sessions/:id/expire", (req, res) => {
    const session = findSession(String(req.params.id));
    if (session.status !== "open") {
      throw invalid(`Only Checkout Sessions with a status in ["open"] can be expired. This session has status '${session.status}'.`, undefined, "checkout_session_unexpected_state");
    }
    expireSession(session);
    res.json(present(session));
  });

  api.post("/payment_intents", (req, res) => {
    const body = (req.body ?? {}) as Record<string, unknown>;
    if (body.amount === undefined || body.amount === "") throw missing("amount");
    const amount = parseInteger(body.amount, "amount");
    const currency = parseCurrency(body.currency, "currency");
    if (amount < (ZERO_DECIMAL.has(currency) ? 1 : MIN_AMOUNT)) {
      throw invalid(`Amount must be at least ${formatMoney(MIN_AMOUNT, currency)}`, "amount", "amount_too_small");
    }
    const pi = newPaymentIntent({
      amount,
      currency,
      description: optString(body, "description"),
      metadata: parseMetadata(body.metadata, "metadata"),
      receiptEmail: optString(body, "receipt_email"),
    });
    const paymentMethod = optString(body, "payment_method");
    const returnUrl = parseUrl(optString(body, "return_url"), "return_url");
    if (paymentMethod) pi.status = "requires_confirmation";
    if (parseBool(body.confirm, "confirm")) confirmIntent(pi, paymentMethod, returnUrl);
    res.json(present(pi));
  });

  function confirmIntent(pi: PaymentIntentRecord, paymentMethod: string | null, returnUrl: string | null) {
    if (pi.status === "succeeded" || pi.status === "canceled" || pi.status === "requires_action") {
      throw new ApiError(400, {
        type: "invalid_request_error",
        code: "payment_intent_unexpected_state",
        message: `This PaymentIntent's status is ${pi.status}, so it cannot be confirmed.`,
      });
    }
    if (!paymentMethod) throw missing("payment_method");
    const outcome = TEST_PAYMENT_METHODS[paymentMethod];
    if (!outcome) {
      throw invalid(`No such PaymentMethod: '${paymentMethod}'. This local test service knows ${Object.keys(TEST_PAYMENT_METHODS).join(", ")}.`, "payment_method", "resource_missing");
    }
    attempt(pi, outcome, returnUrl);
    if (pi.status === "requires_payment_method" && pi.last_payment_error?.type === "card_error") {
      // As the provider does: a declined confirmation answers 402 with the PaymentIntent inside the error.
      throw new ApiError(402, {
        type: "card_error",
        code: pi.last_payment_error.code,
        decline_code: pi.last_payment_error.decline_code,
        message: pi.last_payment_error.message,
        payment_intent: present(pi),
      });
    }
  }

  api.get("/payment_intents/:id", (req, res) => {
    res.json(present(findIntent(String(req.params.id))));
  });

  api.post("/payment_intents/:id/confirm", (req, res) => {
    const pi = findIntent(String(req.params.id));
    const body = (req.body ?? {}) as Record<string, unknown>;
    confirmIntent(pi, optString(body, "payment_method") ?? pi.payment_method, parseUrl(optString(body, "return_url"), "return_url"));
    res.json(present(pi));
  });

  api.post("/payment_intents/:id/cancel", (req, res) => {
    const pi = findIntent(String(req.params.id));
    if (pi.status === "succeeded" || pi.status === "canceled") {
      throw new ApiError(400, {
        type: "invalid_request_error",
        code: "payment_intent_unexpected_state",
        message: `You cannot cancel this PaymentIntent because it has a status of ${pi.status}.`,
      });
    }
    if (pi._sessionId) throw invalid("This PaymentIntent belongs to a Checkout Session; expire the session instead.", undefined, "payment_intent_unexpected_state");
    pi.status = "canceled";
    pi.canceled_at = nowSec();
    pi.cancellation_reason = optString((req.body ?? {}) as Record<string, unknown>, "cancellation_reason") ?? "requested_by_customer";
    pi.next_action = null;
    emit("payment_intent.canceled", pi);
    res.json(present(pi));
  });

  api.get("/events/:id", (req, res) => {
    const entry = eventsById.get(String(req.params.id));
    if (!entry) throw noSuch("event", String(req.params.id), "id");
    res.json(entry.event);
  });

  api.use((req) => {
    throw new ApiError(404, {
      type: "invalid_request_error",
      message: `Unrecognized request URL (${req.method}: /v1${req.path}). This local test payment service implements only the few endpoints the app calls.`,
    });
  });

  app.use("/v1", api);

  // --- the hosted test payment page ----------------------------------------------------------------------

  const page = express.Router();
  page.use(express.urlencoded({ extended: false, limit: "16kb" }));
  page.use((_req, res, next) => {
    res.setHeader("cache-control", "no-store");
    res.setHeader("x-frame-options", "DENY");
    res.setHeader("content-security-policy", "default-src 'none'; style-src 'unsafe-inline'; form-action *; base-uri 'none'");
    next();
  });

  page.get("/pay/:sessionId", (req, res) => {
    const session = sessions.get(String(req.params.sessionId));
    if (!session) return void res.status(404).type("html").send(renderShell("Payment not found", `<p>This test payment link is not known to the local payment service.</p>`));
    res.type("html").send(renderPayPage(session));
  });

  page.post("/pay/:sessionId", (req, res) => {
    const session = sessions.get(String(req.params.sessionId));
    if (!session) return void res.status(404).type("html").send(renderShell("Payment not found", `<p>This test payment link is not known to the local payment service.</p>`));
    const self = `/pay/${encodeURIComponent(session.id)}`;
    if (session.status !== "open") return void res.redirect(303, self);
    const pi = intents.get(session.payment_intent)!;
    if (pi.status === "requires_action") return void res.redirect(303, `/authenticate/${encodeURIComponent(pi.id)}`);
    const card = typeof req.body?.card === "string" ? req.body.card : "";
    const outcome = cardOutcome(card);
    if (outcome === "incorrect") return void res.status(400).type("html").send(renderPayPage(session, { card, error: "Your card number is incorrect." }));
    if (outcome === "unknown") {
      return void res
        .status(400)
        .type("html")
        .send(renderPayPage(session, { card, error: "This local test page accepts only the test card numbers listed below." }));
    }
    const after = attempt(pi, outcome, null); // (re-read: the attempt changed pi.status)
    if (after === "succeeded") return void res.redirect(303, successRedirect(session));
    if (after === "requires_action") return void res.redirect(303, `/authenticate/${encodeURIComponent(pi.id)}`);
    res.redirect(303, self); // declined: the page shows the error from the PaymentIntent
  });

  page.get("/authenticate/:piId", (req, res) => {
    const pi = intents.get(String(req.params.piId));
    if (!pi) return void res.status(404).type("html").send(renderShell("Not found", `<p>This test authentication link is not known.</p>`));
    res.type("html").send(renderAuthPage(pi));
  });

  page.post("/authenticate/:piId", (req, res) => {
    const pi = intents.get(String(req.params.piId));
    if (!pi) return void res.status(404).type("html").send(renderShell("Not found", `<p>This test authentication link is not known.</p>`));
    const session = pi._sessionId ? sessions.get(pi._sessionId) : undefined;
    if (pi.status === "requires_action") {
      const outcome = req.body?.outcome;
      if (outcome !== "complete" && outcome !== "fail") return void res.status(400).type("html").send(renderAuthPage(pi, "Choose Complete or Fail."));
      authenticate(pi, outcome === "complete");
    }
    if (session) {
      if (session.status === "complete") return void res.redirect(303, successRedirect(session));
      return void res.redirect(303, `/pay/${encodeURIComponent(session.id)}`);
    }
    if (pi._returnUrl) {
      const u = new URL(pi._returnUrl);
      u.searchParams.set("payment_intent", pi.id);
      u.searchParams.set("payment_intent_client_secret", pi.client_secret);
      u.searchParams.set("redirect_status", pi.status === "succeeded" ? "succeeded" : "failed");
      return void res.redirect(303, u.toString());
    }
    res.redirect(303, `/authenticate/${encodeURIComponent(pi.id)}`);
  });

  function successRedirect(session: SessionRecord): string {
    if (!session.success_url) return `/pay/${encodeURIComponent(session.id)}`;
    return session.success_url.replace(/\{CHECKOUT_SESSION_ID\}/g, session.id);
  }

  app.use(page);

  app.use((req, res) => {
    res.status(404).json({
      error: { type: "invalid_request_error", message: `Unrecognized request URL (${req.method}: ${req.path}).` },
    });
  });

  app.use((err: unknown, _req: Request, res: Response, next: NextFunction) => {
    if (res.headersSent) return next(err);
    if (err instanceof ApiError) {
      const body: Record<string, unknown> = { ...err.body };
      for (const k of Object.keys(body)) if (body[k] === undefined) delete body[k];
      if (body.code && !body.doc_url) body.doc_url = `https://docs.stripe.com/error-codes/${String(body.code).replace(/_/g, "-")}`;
      return void res.status(err.status).json({ error: body });
    }
    const status = (err as { status?: number }).status;
    if (status && status >= 400 && status < 500) {
      return void res.status(status).json({ error: { type: "invalid_request_error", message: (err as Error).message } });
    }
    log(`payment fake: unexpected error: ${err instanceof Error ? err.stack : String(err)}`);
    res.status(500).json({ error: { type: "api_error", message: "The local payment service hit an unexpected error." } });
  });

  // --- HTML ----------------------------------------------------------------------------------------------

  function renderShell(title: string, inner: string): string {
    return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex"><title>${escapeHtml(title)} · Local test payment</title>
<style>
  :root { color-scheme: light; }
  body { margin: 0; font: 16px/1.5 system-ui, -apple-system, "Segoe UI", sans-serif; background: #eef1f4; color: #1c2430; }
  .banner { background: #7a3e00; color: #fff; padding: .6rem 1rem; text-align: center; font-weight: 600; letter-spacing: .02em; }
  main { max-width: 32rem; margin: 2rem auto; background: #fff; border: 1px solid #cfd6de; border-radius: 10px; padding: 1.5rem 1.75rem; }
  h1 { font-size: 1.25rem; margin: 0 0 1rem; }
  .amount { font-size: 2rem; font-weight: 700; margin: 0; }
  .muted { color: #5a6573; font-size: .9rem; }
  label { display: block; font-weight: 600; margin: 1.25rem 0 .35rem; }
  input[type=text] { width: 100%; box-sizing: border-box; font: inherit; font-family: ui-monospace, monospace; padding: .6rem .7rem; border: 1px solid #9aa6b2; border-radius: 6px; }
  button { font: inherit; font-weight: 600; border-radius: 6px; padding: .6rem 1rem; cursor: pointer; border: 1px solid #1d4f7a; background: #1d4f7a; color: #fff; }
  button.secondary { background: #fff; color: #1d4f7a; }
  button.danger { background: #fff; color: #9b1c1c; border-color: #9b1c1c; }
  .row { display: flex; gap: .75rem; flex-wrap: wrap; margin-top: 1rem; }
  .error { background: #fdecec; border: 1px solid #e3a3a3; color: #7d1212; padding: .6rem .8rem; border-radius: 6px; margin: 1rem 0 0; }
  .ok { background: #e9f6ec; border: 1px solid #9fd0aa; color: #17522a; padding: .6rem .8rem; border-radius: 6px; }
  ul.cards { padding-left: 1.1rem; margin: .5rem 0 0; }
  ul.cards li { margin: .35rem 0; }
  ul.cards form { display: inline; }
  code { font-family: ui-monospace, monospace; }
  hr { border: 0; border-top: 1px solid #dde3e9; margin: 1.5rem 0 1rem; }
</style></head>
<body><div class="banner" role="note">TEST MODE · Local test payment page · No real card is charged and no money moves</div>
<main>${inner}</main></body></html>`;
  }

  function renderPayPage(session: SessionRecord, opts: { card?: string; error?: string } = {}): string {
    const pi = intents.get(session.payment_intent)!;
    const amount = formatMoney(session.amount_total, session.currency);
    const items = (session._lineItems ?? []).map((li) => `${li.name}${li.quantity > 1 ? ` × ${li.quantity}` : ""}`).join(", ");
    const self = `/pay/${encodeURIComponent(session.id)}`;
    const header = `<h1>Pay a deposit (test)</h1>
<p class="amount" data-testid="amount">${escapeHtml(amount)}</p>
<p data-testid="description">${escapeHtml(items)}</p>
${session.customer_email ? `<p class="muted">Receipt to ${escapeHtml(session.customer_email)}</p>` : ""}`;
    if (session.status === "complete") {
      const next = session.success_url ? `<p><a href="${escapeHtml(successRedirect(session))}">Return to the site</a></p>` : "";
      return renderShell("Payment complete", `${header}<p class="ok" role="status">This test payment is complete.</p>${next}`);
    }
    if (session.status === "expired") {
      return renderShell("Payment link expired", `${header}<p class="error" role="alert">This test payment link has expired. Ask for a new link.</p>`);
    }
    const error = opts.error ?? (pi.last_payment_error ? pi.last_payment_error.message : null);
    const card = opts.card ?? TEST_CARDS.succeeds;
    const quick = (label: string, number: string, cls = "secondary") =>
      `<li><form method="post" action="${self}"><input type="hidden" name="card" value="${escapeHtml(number)}"><button type="submit" class="${cls}">${escapeHtml(label)}</button></form> <code>${escapeHtml(number)}</code></li>`;
    return renderShell(
      `Pay ${amount}`,
      `${header}
${error ? `<p class="error" role="alert" data-testid="error">${escapeHtml(error)} Try again with another test card.</p>` : ""}
<form method="post" action="${self}">
  <label for="card">Card number (test card)</label>
  <input id="card" name="card" type="text" inputmode="numeric" autocomplete="off" value="${escapeHtml(card)}">
  <p class="muted">Any expiry date in the future and any three-digit security code are assumed.</p>
  <div class="row"><button type="submit">Pay ${escapeHtml(amount)}</button>
  ${session.cancel_url ? `<a href="${escapeHtml(session.cancel_url)}">Cancel and go back</a>` : ""}</div>
</form>
<hr>
<p class="muted">Test outcomes:</p>
<ul class="cards">
${quick("Succeeds", TEST_CARDS.succeeds)}
${quick("Declined", TEST_CARDS.declined, "danger")}
${quick("Requires authentication", TEST_CARDS.authenticationRequired)}
</ul>`,
    );
  }

  function renderAuthPage(pi: PaymentIntentRecord, error?: string): string {
    const amount = formatMoney(pi.amount, pi.currency);
    const action = `/authenticate/${encodeURIComponent(pi.id)}`;
    if (pi.status !== "requires_action") {
      const msg = pi.status === "succeeded" ? "This test payment is complete." : "No authentication is pending for this test payment.";
      return renderShell("Authentication", `<h1>Authenticate this test payment</h1><p class="amount">${escapeHtml(amount)}</p><p>${msg}</p>`);
    }
    return renderShell(
      "Authenticate this test payment",
      `<h1>Authenticate this test payment</h1>
<p class="amount" data-testid="amount">${escapeHtml(amount)}</p>
<p>Your bank asks you to confirm this payment. On this local test page you choose the outcome.</p>
${error ? `<p class="error" role="alert">${escapeHtml(error)}</p>` : ""}
<form method="post" action="${action}" class="row">
  <button type="submit" name="outcome" value="complete">Complete authentication</button>
  <button type="submit" name="outcome" value="fail" class="danger">Fail authentication</button>
</form>`,
    );
  }

  // --- listen --------------------------------------------------------------------------------------------

  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(options.port ?? 0, host, () => resolve(s));
    s.once("error", reject);
  });
  const port = (server.address() as AddressInfo).port;
  const url = `http://${host}:${port}`;
  if (!publicUrl) publicUrl = url;
  log(`local test payment service on ${url}`);

  async function idle() {
    // New deliveries may be queued while we wait; loop until the queue stops changing.
    for (;;) {
      const current = queue;
      await current;
      if (current === queue) return;
    }
  }

  return {
    port,
    url,
    app,
    events: () => events.map((e) => JSON.parse(e.body) as FakeEvent),
    deliveries: () => attempts.map((a) => ({ ...a })),
    redeliver: (eventId) => {
      if (!eventsById.has(eventId)) return Promise.reject(new Error(`No such event: ${eventId}`));
      return enqueue(eventId);
    },
    deliver: async (eventIds) => {
      const out: DeliveryResult[] = [];
      for (const id of eventIds) {
        if (!eventsById.has(id)) throw new Error(`No such event: ${id}`);
        out.push(await enqueue(id));
      }
      return out;
    },
    setWebhookUrl: (u) => {
      webhookUrl = u;
    },
    idle,
    close: async () => {
      closed = true;
      for (const c of inFlight) c.abort(new Error("payment fake closing"));
      for (const wake of [...sleepers]) wake();
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      await queue;
    },
  };
}
