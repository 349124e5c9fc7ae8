/**
 * The local test payment service, driven through the official SDK (as the app drives it) and through its
 * hosted page with plain HTTP form posts (as a browser does). Webhooks go to a tiny local receiver and are
 * checked with the SDK's own signature verification. No database is used.
 */
import { createServer, type IncomingHttpHeaders, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import Stripe from "stripe";
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { startPaymentFake, TEST_CARDS, type PaymentFake } from "@server/fakes/payment-fake";
import { createDepositCheckout, createPaymentClient, verifyWebhook, WebhookVerificationError } from "@server/payments/stripe-client";
import { loadPaymentConfig } from "@server/payments/config";

const WEBHOOK_SECRET = "whsec_test_drill_secret";
const API_KEY = "sk_test_local_fake";

interface Received {
  headers: IncomingHttpHeaders;
  raw: Buffer;
}

/** A webhook receiver that keeps the raw bytes; `failNext` answers 500 that many times first. */
function startReceiver() {
  const received: Received[] = [];
  const state = { failNext: 0, alwaysFail: false };
  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      received.push({ headers: req.headers, raw: Buffer.concat(chunks) });
      if (state.alwaysFail || state.failNext > 0) {
        state.failNext = Math.max(0, state.failNext - 1);
        res.writeHead(500).end("down for a drill");
        return;
      }
      res.writeHead(200, { "content-type": "application/json" }).end('{"received":true}');
    });
  });
  return new Promise<{ url: string; received: Received[]; state: typeof state; close: () => Promise<void> }>((resolve) => {
    server.listen(0, "127.0.0.1", () => {
      const { port } = server.address() as AddressInfo;
      resolve({
        url: `http://127.0.0.1:${port}/api/payments/webhook`,
        received,
        state,
        close: () => new Promise<void>((r) => server.close(() => r())),
      });
    });
  });
}

let fake: PaymentFake;
let receiver: Awaited<ReturnType<typeof startReceiver>>;
let stripe: Stripe;

beforeAll(async () => {
  receiver = await startReceiver();
  fake = await startPaymentFake({
    port: 0,
    host: "127.0.0.1",
    webhookUrl: receiver.url,
    webhookSecret: WEBHOOK_SECRET,
    webhookRetryDelaysMs: [20, 40],
  });
  stripe = createPaymentClient({ secretKey: API_KEY, fakeHost: { host: "127.0.0.1", port: fake.port, protocol: "http" } });
});

afterAll(async () => {
  await fake?.close();
  await receiver?.close();
});

beforeEach(() => {
  receiver.received.length = 0;
  receiver.state.failNext = 0;
  receiver.state.alwaysFail = false;
});

afterEach(async () => {
  await fake.idle();
});

let seq = 0;
async function newDeposit(overrides: Partial<Parameters<typeof createDepositCheckout>[1]> = {}) {
  seq += 1;
  return createDepositCheckout(stripe, {
    amountCents: 125_000,
    currency: "usd",
    description: "Deposit: standing-seam roof at 12 Example Lane",
    customerEmail: "homeowner@example.com",
    successUrl: "http://127.0.0.1:3999/p/tok123/paid?session_id={CHECKOUT_SESSION_ID}",
    cancelUrl: "http://127.0.0.1:3999/p/tok123",
    metadata: { quoteId: "42", proposalId: "7", paymentId: String(seq) },
    clientReferenceId: `payment-${seq}`,
    idempotencyKey: `deposit-${seq}-${Date.now()}`,
    ...overrides,
  });
}

/** Posts the hosted page's form like a browser would, without following the redirect. */
async function postForm(path: string, fields: Record<string, string>) {
  const res = await fetch(`${fake.url}${path}`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams(fields).toString(),
    redirect: "manual",
  });
  return { status: res.status, location: res.headers.get("location"), html: await res.text() };
}

const pay = (sessionId: string, card: string) => postForm(`/pay/${sessionId}`, { card });

/** Received webhooks, each verified with the SDK's own check. */
function verifiedEvents(): Stripe.Event[] {
  return receiver.received.map((r) => stripe.webhooks.constructEvent(r.raw, r.headers["stripe-signature"] as string, WEBHOOK_SECRET));
}

describe("POST /v1/checkout/sessions through the SDK", () => {
  it("creates an open, unpaid session with the fake's own payment page and a PaymentIntent", async () => {
    const { id, url } = await newDeposit();
    expect(id).toMatch(/^cs_test_/);
    expect(url).toBe(`${fake.url}/pay/${id}`);

    const session = await stripe.checkout.sessions.retrieve(id);
    expect(session).toMatchObject({
      id,
      object: "checkout.session",
      mode: "payment",
      status: "open",
      payment_status: "unpaid",
      amount_total: 125_000,
      currency: "usd",
      customer_email: "homeowner@example.com",
      client_reference_id: `payment-${seq}`,
      metadata: { quoteId: "42", proposalId: "7", paymentId: String(seq) },
      success_url: "http://127.0.0.1:3999/p/tok123/paid?session_id={CHECKOUT_SESSION_ID}",
      livemode: false,
    });
    expect(session.payment_intent).toMatch(/^pi_/);

    const pi = await stripe.paymentIntents.retrieve(session.payment_intent as string);
    expect(pi).toMatchObject({
      status: "requires_payment_method",
      amount: 125_000,
      currency: "usd",
      metadata: { quoteId: "42", proposalId: "7" }, // from payment_intent_data[metadata]
      last_payment_error: null,
    });
  });

  it("returns the same session for the same Idempotency-Key and body, and a new one for a new key", async () => {
    const key = `deposit-idem-${Date.now()}`;
    const input = {
      amountCents: 50_000,
      currency: "usd",
      description: "Deposit",
      successUrl: "http://127.0.0.1:3999/ok",
      cancelUrl: "http://127.0.0.1:3999/cancel",
      metadata: { quoteId: "9" },
      idempotencyKey: key,
    };
    const first = await createDepositCheckout(stripe, input);
    const second = await createDepositCheckout(stripe, input);
    expect(second).toEqual(first);
    const third = await createDepositCheckout(stripe, { ...input, idempotencyKey: `${key}-b` });
    expect(third.id).not.toBe(first.id);

    // The same key with different parameters is refused, as the provider does.
    await expect(createDepositCheckout(stripe, { ...input, amountCents: 60_000 })).rejects.toMatchObject({
      type: "StripeIdempotencyError",
      statusCode: 400,
    });
  });

  it("parses nested form keys exactly as the SDK's wire format sends them", async () => {
    const body = [
      "mode=payment",
      "line_items[0][quantity]=2",
      "line_items[0][price_data][currency]=usd",
      "line_items[0][price_data][unit_amount]=30000",
      "line_items[0][price_data][product_data][name]=Deposit%20part%201",
      "line_items[1][price_data][currency]=usd",
      "line_items[1][price_data][unit_amount]=5000",
      "line_items[1][price_data][product_data][name]=Permit",
      "metadata[quoteId]=77",
      "payment_intent_data[metadata][quoteId]=77",
      "success_url=http%3A%2F%2F127.0.0.1%3A3999%2Fok",
    ].join("&");
    const res = await fetch(`${fake.url}/v1/checkout/sessions`, {
      method: "POST",
      headers: { authorization: `Bearer ${API_KEY}`, "content-type": "application/x-www-form-urlencoded" },
      body,
    });
    expect(res.status).toBe(200);
    const session = (await res.json()) as Record<string, unknown>;
    expect(session).toMatchObject({ amount_total: 65_000, currency: "usd", metadata: { quoteId: "77" }, status: "open" });
  });

  it("answers a missing parameter with 400 in the provider's error shape", async () => {
    const res = await fetch(`${fake.url}/v1/checkout/sessions`, {
      method: "POST",
      headers: { authorization: `Bearer ${API_KEY}`, "content-type": "application/x-www-form-urlencoded" },
      body: "mode=payment&success_url=http%3A%2F%2F127.0.0.1%2Fok",
    });
    expect(res.status).toBe(400);
    expect(await res.json()).toMatchObject({
      error: { type: "invalid_request_error", code: "parameter_missing", param: "line_items", message: expect.stringContaining("line_items") },
    });
  });

  it("answers an unknown session id with 404 resource_missing", async () => {
    await expect(stripe.checkout.sessions.retrieve("cs_test_nope")).rejects.toMatchObject({
      type: "StripeInvalidRequestError",
      statusCode: 404,
      code: "resource_missing",
    });
  });
});

describe("authentication and unknown routes", () => {
  it("refuses a request without a bearer key with 401 in the provider's error shape", async () => {
    const res = await fetch(`${fake.url}/v1/checkout/sessions/cs_test_x`);
    expect(res.status).toBe(401);
    const body = (await res.json()) as { error: { type: string; message: string } };
    expect(body.error.type).toBe("invalid_request_error");
    expect(body.error.message).toMatch(/did not provide an API key/);
  });

  it("refuses a live or non-test key through the SDK", async () => {
    const live = createPaymentClient({ secretKey: "sk_live_notreal", fakeHost: { host: "127.0.0.1", port: fake.port, protocol: "http" } });
    await expect(live.checkout.sessions.retrieve("cs_test_x")).rejects.toMatchObject({ type: "StripeAuthenticationError", statusCode: 401 });
  });

  it("answers an endpoint it does not implement with 404 in the provider's error shape", async () => {
    await expect(stripe.customers.create({ email: "a@example.com" })).rejects.toMatchObject({
      type: "StripeInvalidRequestError",
      statusCode: 404,
      message: expect.stringContaining("Unrecognized request URL (POST: /v1/customers)"),
    });
    const res = await fetch(`${fake.url}/nowhere`);
    expect(res.status).toBe(404);
    expect(await res.json()).toMatchObject({ error: { type: "invalid_request_error", message: expect.any(String) } });
  });
});

describe("hosted test payment page", () => {
  it("shows a clearly labelled TEST page with amount, description, a prefilled test card and the outcomes", async () => {
    const { id } = await newDeposit({ description: "Deposit <b>& roof</b>" });
    const res = await fetch(`${fake.url}/pay/${id}`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/text\/html/);
    const html = await res.text();
    expect(html).toContain("TEST MODE");
    expect(html).toContain("Local test payment page");
    expect(html).toContain("No real card is charged");
    expect(html).toContain("$1,250.00");
    expect(html).toContain("Deposit &lt;b&gt;&amp; roof&lt;/b&gt;"); // escaped, never raw markup
    expect(html).not.toContain("<b>& roof</b>");
    expect(html).toMatch(/<input id="card" name="card"[^>]*value="4242 4242 4242 4242"/);
    for (const card of Object.values(TEST_CARDS)) expect(html).toContain(card);
    expect(html).toMatch(/Succeeds/);
    expect(html).toMatch(/Declined/);
    expect(html).toMatch(/Requires authentication/);
    expect(html).toContain('href="http://127.0.0.1:3999/p/tok123"'); // cancel link
  });

  it("succeeds with 4242: redirects to success_url, completes the session and sends signed webhooks", async () => {
    const { id } = await newDeposit();
    const res = await pay(id, TEST_CARDS.succeeds);
    expect(res.status).toBe(303);
    expect(res.location).toBe(`http://127.0.0.1:3999/p/tok123/paid?session_id=${id}`);

    const session = await stripe.checkout.sessions.retrieve(id);
    expect(session).toMatchObject({ status: "complete", payment_status: "paid", url: null });
    const pi = await stripe.paymentIntents.retrieve(session.payment_intent as string);
    expect(pi).toMatchObject({ status: "succeeded", amount_received: 125_000 });

    await fake.idle();
    const events = verifiedEvents(); // throws unless every signature checks out with the SDK
    expect(events.map((e) => e.type)).toEqual(["payment_intent.succeeded", "checkout.session.completed"]);
    for (const e of events) {
      expect(e).toMatchObject({ object: "event", livemode: false, api_version: Stripe.API_VERSION });
      expect(e.id).toMatch(/^evt_/);
      expect(e.created).toBeGreaterThan(1_700_000_000);
    }
    const completed = events[1].data.object as Stripe.Checkout.Session;
    expect(completed).toMatchObject({ id, payment_status: "paid", status: "complete", metadata: { quoteId: "42" } });
    const succeeded = events[0].data.object as Stripe.PaymentIntent;
    expect(succeeded).toMatchObject({ id: pi.id, status: "succeeded", metadata: { quoteId: "42" } });

    // The header has the provider's layout, and the app's helper accepts it too.
    const header = receiver.received[1].headers["stripe-signature"] as string;
    expect(header).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
    expect(verifyWebhook(stripe, receiver.received[1].raw, header, WEBHOOK_SECRET).id).toBe(events[1].id);

    // Paying again does nothing: the page only reports the finished payment.
    const again = await pay(id, TEST_CARDS.succeeds);
    expect(again.status).toBe(303);
    await fake.idle();
    expect(receiver.received).toHaveLength(2);
    const page = await (await fetch(`${fake.url}/pay/${id}`)).text();
    expect(page).toContain("This test payment is complete.");
  });

  it("declines 0002: payment_failed webhook, session stays unpaid, the page shows the error and a retry works", async () => {
    const { id } = await newDeposit();
    const res = await pay(id, TEST_CARDS.declined);
    expect(res.status).toBe(303);
    expect(res.location).toBe(`/pay/${id}`);

    const session = await stripe.checkout.sessions.retrieve(id);
    expect(session).toMatchObject({ status: "open", payment_status: "unpaid" });
    const pi = await stripe.paymentIntents.retrieve(session.payment_intent as string);
    expect(pi.status).toBe("requires_payment_method");
    expect(pi.last_payment_error).toMatchObject({ type: "card_error", code: "card_declined", decline_code: "generic_decline" });

    await fake.idle();
    const events = verifiedEvents();
    expect(events.map((e) => e.type)).toEqual(["payment_intent.payment_failed"]);
    expect((events[0].data.object as Stripe.PaymentIntent).last_payment_error?.code).toBe("card_declined");

    const page = await (await fetch(`${fake.url}/pay/${id}`)).text();
    expect(page).toContain("Your card was declined.");
    expect(page).toContain("Try again");

    const retry = await pay(id, TEST_CARDS.succeeds);
    expect(retry.location).toContain(`session_id=${id}`);
    expect((await stripe.checkout.sessions.retrieve(id)).payment_status).toBe("paid");
    await fake.idle();
    expect(verifiedEvents().map((e) => e.type)).toEqual([
      "payment_intent.payment_failed",
      "payment_intent.succeeded",
      "checkout.session.completed",
    ]);
  });

  it("3184 requires authentication: requires_action until the step is completed, then succeeded", async () => {
    const { id } = await newDeposit();
    const res = await pay(id, TEST_CARDS.authenticationRequired);
    const piId = (await stripe.checkout.sessions.retrieve(id)).payment_intent as string;
    expect(res.status).toBe(303);
    expect(res.location).toBe(`/authenticate/${piId}`);

    const pending = await stripe.paymentIntents.retrieve(piId);
    expect(pending.status).toBe("requires_action");
    expect(pending.next_action?.redirect_to_url?.url).toBe(`${fake.url}/authenticate/${piId}`);
    expect((await stripe.checkout.sessions.retrieve(id)).payment_status).toBe("unpaid");

    const step = await (await fetch(`${fake.url}/authenticate/${piId}`)).text();
    expect(step).toContain("Authenticate this test payment");
    expect(step).toContain('value="complete"');
    expect(step).toContain('value="fail"');
    expect(step).toContain("TEST MODE");

    const done = await postForm(`/authenticate/${piId}`, { outcome: "complete" });
    expect(done.status).toBe(303);
    expect(done.location).toBe(`http://127.0.0.1:3999/p/tok123/paid?session_id=${id}`);
    expect((await stripe.paymentIntents.retrieve(piId)).status).toBe("succeeded");
    expect(await stripe.checkout.sessions.retrieve(id)).toMatchObject({ status: "complete", payment_status: "paid" });

    await fake.idle();
    expect(verifiedEvents().map((e) => e.type)).toEqual([
      "payment_intent.requires_action",
      "payment_intent.succeeded",
      "checkout.session.completed",
    ]);
  });

  it("3184 with failed authentication: payment_failed, back to the page with the error, session unpaid", async () => {
    const { id } = await newDeposit();
    await pay(id, TEST_CARDS.authenticationRequired);
    const piId = (await stripe.checkout.sessions.retrieve(id)).payment_intent as string;

    const failed = await postForm(`/authenticate/${piId}`, { outcome: "fail" });
    expect(failed.status).toBe(303);
    expect(failed.location).toBe(`/pay/${id}`);

    const pi = await stripe.paymentIntents.retrieve(piId);
    expect(pi.status).toBe("requires_payment_method");
    expect(pi.last_payment_error?.code).toBe("payment_intent_authentication_failure");
    expect(await stripe.checkout.sessions.retrieve(id)).toMatchObject({ status: "open", payment_status: "unpaid" });

    await fake.idle();
    expect(verifiedEvents().map((e) => e.type)).toEqual(["payment_intent.requires_action", "payment_intent.payment_failed"]);
    const page = await (await fetch(`${fake.url}/pay/${id}`)).text();
    expect(page).toContain("failed authentication");
  });

  it("rejects a number that is not a listed test card without touching the payment", async () => {
    const { id } = await newDeposit();
    const wrong = await pay(id, "4242 4242 4242 4241");
    expect(wrong.status).toBe(400);
    expect(wrong.html).toContain("Your card number is incorrect.");
    const unlisted = await pay(id, "5555 5555 5555 4444");
    expect(unlisted.status).toBe(400);
    expect(unlisted.html).toContain("accepts only the test card numbers");
    await fake.idle();
    expect(receiver.received).toHaveLength(0);
    expect((await stripe.checkout.sessions.retrieve(id)).payment_status).toBe("unpaid");
  });

  it("expires an open session: the PaymentIntent is canceled and the page no longer takes payment", async () => {
    const { id } = await newDeposit();
    const expired = await stripe.checkout.sessions.expire(id);
    expect(expired).toMatchObject({ status: "expired", payment_status: "unpaid", url: null });
    expect((await stripe.paymentIntents.retrieve(expired.payment_intent as string)).status).toBe("canceled");

    const res = await pay(id, TEST_CARDS.succeeds);
    expect(res.location).toBe(`/pay/${id}`);
    expect(await (await fetch(`${fake.url}/pay/${id}`)).text()).toContain("expired");
    await expect(stripe.checkout.sessions.expire(id)).rejects.toMatchObject({ statusCode: 400 });
    await fake.idle();
    expect(verifiedEvents().map((e) => e.type)).toEqual(["payment_intent.canceled", "checkout.session.expired"]);
  });
});

describe("PaymentIntents through the SDK", () => {
  it("creates, confirms with the test payment methods and reports each outcome", async () => {
    const created = await stripe.paymentIntents.create({ amount: 20_000, currency: "usd", metadata: { quoteId: "5" } });
    expect(created).toMatchObject({ status: "requires_payment_method", amount: 20_000, metadata: { quoteId: "5" } });
    expect(created.client_secret).toMatch(new RegExp(`^${created.id}_secret_`));

    const ok = await stripe.paymentIntents.confirm(created.id, { payment_method: "pm_card_visa" });
    expect(ok.status).toBe("succeeded");

    const declined = stripe.paymentIntents.create({ amount: 20_000, currency: "usd", payment_method: "pm_card_chargeDeclined", confirm: true });
    await expect(declined).rejects.toMatchObject({ type: "StripeCardError", statusCode: 402, code: "card_declined" });

    const auth = await stripe.paymentIntents.create({
      amount: 20_000,
      currency: "usd",
      payment_method: "pm_card_authenticationRequired",
      confirm: true,
      return_url: "http://127.0.0.1:3999/back",
    });
    expect(auth.status).toBe("requires_action");
    const done = await postForm(`/authenticate/${auth.id}`, { outcome: "complete" });
    expect(done.location).toContain("http://127.0.0.1:3999/back?payment_intent=" + auth.id);
    expect(done.location).toContain("redirect_status=succeeded");
    expect((await stripe.paymentIntents.retrieve(auth.id)).status).toBe("succeeded");

    const toCancel = await stripe.paymentIntents.create({ amount: 20_000, currency: "usd" });
    expect((await stripe.paymentIntents.cancel(toCancel.id)).status).toBe("canceled");

    await fake.idle();
    expect(verifiedEvents().map((e) => e.type)).toEqual([
      "payment_intent.succeeded",
      "payment_intent.payment_failed",
      "payment_intent.requires_action",
      "payment_intent.succeeded",
      "payment_intent.canceled",
    ]);
  });
});

describe("webhook signatures, redelivery and retries", () => {
  async function oneDelivered() {
    const { id } = await newDeposit();
    await pay(id, TEST_CARDS.succeeds);
    await fake.idle();
    return receiver.received[receiver.received.length - 1];
  }

  it("a tampered body, a wrong secret or a stale timestamp is refused", async () => {
    const { raw, headers } = await oneDelivered();
    const header = headers["stripe-signature"] as string;
    const tampered = Buffer.from(raw.toString("utf8").replace('"payment_status": "paid"', '"payment_status": "unpaid"'));
    expect(tampered.equals(raw)).toBe(false);

    expect(() => stripe.webhooks.constructEvent(tampered, header, WEBHOOK_SECRET)).toThrow(Stripe.errors.StripeSignatureVerificationError);
    expect(() => stripe.webhooks.constructEvent(raw, header, "whsec_someone_else")).toThrow(Stripe.errors.StripeSignatureVerificationError);

    expect(() => verifyWebhook(stripe, tampered, header, WEBHOOK_SECRET)).toThrow(WebhookVerificationError);
    const reason = (fn: () => unknown) => {
      try {
        fn();
      } catch (e) {
        return (e as WebhookVerificationError).reason;
      }
      return "accepted";
    };
    expect(reason(() => verifyWebhook(stripe, tampered, header, WEBHOOK_SECRET))).toBe("bad_signature");
    expect(reason(() => verifyWebhook(stripe, raw, header, "whsec_someone_else"))).toBe("bad_signature");
    expect(reason(() => verifyWebhook(stripe, raw, undefined, WEBHOOK_SECRET))).toBe("missing_signature");
    expect(reason(() => verifyWebhook(stripe, JSON.parse(raw.toString()) as unknown as Buffer, header, WEBHOOK_SECRET))).toBe("not_raw_body");
    // Ten minutes later the same, correctly signed delivery is too old (default tolerance 300 s).
    expect(reason(() => verifyWebhook(stripe, raw, header, WEBHOOK_SECRET, { now: Date.now() + 600_000 }))).toBe("too_old");
    expect(reason(() => verifyWebhook(stripe, raw, header, WEBHOOK_SECRET))).toBe("accepted");
  });

  it("redelivery sends the identical event (same id and body) with a valid signature", async () => {
    await oneDelivered();
    const sent = fake.events();
    const last = sent[sent.length - 1];
    expect(last.type).toBe("checkout.session.completed");
    const before = receiver.received.length;

    const result = await fake.redeliver(last.id);
    expect(result).toMatchObject({ eventId: last.id, delivered: true });
    expect(receiver.received).toHaveLength(before + 1);
    const first = receiver.received[before - 1];
    const again = receiver.received[before];
    expect(again.raw.equals(first.raw)).toBe(true);
    const event = stripe.webhooks.constructEvent(again.raw, again.headers["stripe-signature"] as string, WEBHOOK_SECRET);
    expect(event.id).toBe(last.id);
  });

  it("delivers stored events in any order for out-of-order drills", async () => {
    const { id } = await newDeposit();
    await pay(id, TEST_CARDS.succeeds);
    await fake.idle();
    const mine = fake.events().slice(-2);
    receiver.received.length = 0;
    await fake.deliver([mine[1].id, mine[0].id]);
    expect(verifiedEvents().map((e) => e.type)).toEqual(["checkout.session.completed", "payment_intent.succeeded"]);
  });

  it("retries a failed delivery a bounded number of times", async () => {
    receiver.state.failNext = 2;
    const { id } = await newDeposit();
    await pay(id, TEST_CARDS.declined);
    await fake.idle();
    const eventId = fake.events().at(-1)!.id;
    const tries = fake.deliveries().filter((d) => d.eventId === eventId);
    expect(tries.map((t) => [t.attempt, t.status, t.ok])).toEqual([
      [1, 500, false],
      [2, 500, false],
      [3, 200, true],
    ]);

    receiver.state.alwaysFail = true;
    const result = await fake.redeliver(eventId);
    expect(result).toEqual({ eventId, delivered: false, attempts: 3, lastStatus: 500 }); // 1 + two retries, then it stops
  });
});

describe("loadPaymentConfig", () => {
  it("uses the local fake with local test defaults when no keys are given", () => {
    expect(loadPaymentConfig({})).toEqual({
      useFake: true,
      secretKey: "sk_test_local_fake",
      webhookSecret: "whsec_local_fake",
      fake: { host: "127.0.0.1", port: 12111 },
    });
    expect(loadPaymentConfig({ PAYMENT_FAKE_PORT: "0" }).fake).toEqual({ host: "127.0.0.1", port: 0 });
  });

  it("switches to the hosted service with a real-looking key and requires its webhook secret", () => {
    const key = "sk_test_" + "a1B2c3D4".repeat(4);
    expect(() => loadPaymentConfig({ STRIPE_SECRET_KEY: key })).toThrow(/STRIPE_WEBHOOK_SECRET/);
    expect(loadPaymentConfig({ STRIPE_SECRET_KEY: key, STRIPE_WEBHOOK_SECRET: "whsec_abc123" })).toEqual({
      useFake: false,
      secretKey: key,
      webhookSecret: "whsec_abc123",
      fake: null,
    });
  });

  it("refuses contradictory settings", () => {
    expect(() => loadPaymentConfig({ PAYMENTS_USE_FAKE: "false" })).toThrow(/STRIPE_SECRET_KEY is required/);
    expect(() => loadPaymentConfig({ PAYMENTS_USE_FAKE: "true", STRIPE_SECRET_KEY: "sk_live_" + "x1".repeat(12) })).toThrow(/live key/);
    expect(() => loadPaymentConfig({ PAYMENT_FAKE_PORT: "70000" })).toThrow(/PAYMENT_FAKE_PORT/);
  });
});
