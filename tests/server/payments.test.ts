/**
 * Deposits through the local payment fake with the real SDK: the app listens on a port so the fake's
 * signed webhooks reach it, as they would in production.
 */
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import type { Express } from "express";
import { createTestApp, listenTestApp, startTestMailCatcher, testPayments, type TestPayments } from "../helpers/app";
import { countRows, truncateAll } from "../helpers/db";
import { approvedQuoteWorld, homeowner, sendQuote } from "../helpers/proposal-world";
import { AuditEvent, Payment, PaymentEvent } from "../../server/models/index";
import { OutboxMessage } from "../../server/models/mail.models";
import { TEST_CARDS, signWebhookPayload } from "../../server/fakes/payment-fake";

let pay: TestPayments;
let app: Express;
let webhookUrl: string;

beforeAll(async () => {
  pay = await testPayments();
  app = createTestApp({}, { payments: { stripe: pay.stripe, config: pay.config } });
  const { url } = await listenTestApp(app);
  webhookUrl = `${url}/api/payments/webhook`;
});

beforeEach(async () => {
  await pay.fake.idle();
  pay.fake.setWebhookUrl(webhookUrl);
  await truncateAll();
  await (await startTestMailCatcher()).clear();
  mark = pay.fake.events().length;
});

async function acceptedWorld() {
  const w = await approvedQuoteWorld({ app });
  const { token } = await sendQuote(w);
  const option = w.quote.revision.options[0];
  return { ...w, token, option };
}

async function accept(w: Awaited<ReturnType<typeof acceptedWorld>>) {
  await homeowner(app).post(`/api/proposals/${w.token}/accept`).send({ optionId: w.option.id, signerName: "Mara Quillfeather", consent: true }).expect(200);
}

async function startDeposit(token: string) {
  const res = await homeowner(app).post(`/api/proposals/${token}/deposit`).send({});
  expect(res.status).toBe(200);
  const url = res.body.url as string;
  expect(url.startsWith(`${pay.fake.url}/pay/cs_test_`)).toBe(true);
  return { url, sessionId: url.split("/pay/")[1] };
}

/** Posts the fake's hosted payment form like a browser, without following the redirect. */
async function postForm(path: string, fields: Record<string, string>) {
  const res = await fetch(`${pay.fake.url}${path}`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams(fields).toString(),
    redirect: "manual",
  });
  return { status: res.status, location: res.headers.get("location") };
}

const payment = async () => (await Payment.findOne({ order: [["id", "DESC"]] }))!;
let mark = 0;
/** This test's events of a type (the fake keeps every event of the file). */
const eventsOf = (type: string) => pay.fake.events().slice(mark).filter((e) => e.type === type);

describe("POST /api/proposals/:token/deposit", () => {
  it("is 409 before the proposal is accepted", async () => {
    const w = await acceptedWorld();
    const res = await homeowner(app).post(`/api/proposals/${w.token}/deposit`).send({});
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ error: { code: "not_accepted" }, currentStatus: "active" });
    expect(await countRows("payments")).toBe(0);
  });

  it("creates one pending payment for the chosen option's deposit and reuses it (same session) when asked again", async () => {
    const w = await acceptedWorld();
    await accept(w);
    const a = await startDeposit(w.token);
    const b = await startDeposit(w.token);
    expect(b.sessionId).toBe(a.sessionId);
    const rows = await Payment.findAll();
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ status: "pending", providerSessionId: a.sessionId, currency: "usd" });
    expect(Number(rows[0].amountCents)).toBe(w.option.totals.depositCents);
    const session = await pay.stripe.checkout.sessions.retrieve(a.sessionId);
    expect(session.amount_total).toBe(w.option.totals.depositCents);
    expect(session.metadata).toEqual({ proposalId: String(rows[0].proposalId), paymentId: String(rows[0].id) });
    expect(session.success_url).toBe(`http://localhost:3000/p/${w.token}?deposit=processing`.replace("http://localhost:3000", publicUrl()));
    expect(session.cancel_url).toContain(`/p/${w.token}?deposit=cancelled`);
  });
});

describe("paying through the fake", () => {
  it("4242 succeeds: paid only from the verified webhook (the browser's return alone changes nothing), the estimator is e-mailed, a second deposit is 409", async () => {
    const w = await acceptedWorld();
    await accept(w);
    const { sessionId } = await startDeposit(w.token);

    pay.fake.setWebhookUrl(undefined); // hold the webhooks back
    const res = await postForm(`/pay/${sessionId}`, { card: TEST_CARDS.succeeds });
    expect(res.status).toBe(303);
    expect(res.location).toContain(`/p/${w.token}?deposit=processing`);
    const page = await homeowner(app).get(`/api/proposals/${w.token}`); // what the return page polls
    expect(page.body.data.deposit).toEqual({ status: "pending", amountCents: w.option.totals.depositCents });
    expect((await payment()).status).toBe("pending");

    pay.fake.setWebhookUrl(webhookUrl);
    const completed = eventsOf("checkout.session.completed");
    expect(completed).toHaveLength(1);
    const [delivered] = await pay.fake.deliver(pay.fake.events().slice(mark).map((e) => e.id));
    expect(delivered.lastStatus).toBe(200);
    const p = await payment();
    expect(p.status).toBe("paid");
    expect(p.paidAt).not.toBeNull();
    expect(p.providerPaymentIntentId).toMatch(/^pi_/);
    const after = await homeowner(app).get(`/api/proposals/${w.token}`);
    expect(after.body.data.deposit).toEqual({ status: "paid", amountCents: w.option.totals.depositCents });
    const job = await w.estimator.agent.get(`/api/jobs/${w.job.id}`);
    expect(job.body.data.proposal.depositStatus).toBe("paid");
    // The board's row says the same as the job (the list reads it in its own query).
    const board = await w.estimator.agent.get(`/api/jobs`);
    expect(board.body.data.find((j: { id: number }) => j.id === w.job.id).proposal).toEqual(job.body.data.proposal);
    const mail = await OutboxMessage.findAll({ where: { kind: "deposit_paid" } });
    expect(mail).toHaveLength(1);
    expect(mail[0].toAddresses).toEqual([w.estimator.user.email]);
    // The homeowner gets a receipt, as the return page promises.
    const receipt = await OutboxMessage.findAll({ where: { kind: "deposit_receipt" } });
    expect(receipt).toHaveLength(1);
    expect(receipt[0].subject).toContain("Receipt: deposit of");
    expect(receipt[0].toAddresses).not.toContain(w.estimator.user.email);
    expect(await AuditEvent.count({ where: { entityType: "payment", action: "paid" } })).toBe(1);

    const again = await homeowner(app).post(`/api/proposals/${w.token}/deposit`).send({});
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe("already_paid");
  });

  it("0002 is declined: the payment is failed with the error, never paid", async () => {
    const w = await acceptedWorld();
    await accept(w);
    const { sessionId } = await startDeposit(w.token);
    const res = await postForm(`/pay/${sessionId}`, { card: TEST_CARDS.declined });
    expect(res.location).toBe(`/pay/${sessionId}`);
    await pay.fake.idle();
    const p = await payment();
    expect(p.status).toBe("failed");
    expect(p.lastError).toMatch(/declined/i);
    expect(p.paidAt).toBeNull();
    expect(await PaymentEvent.count({ where: { type: "payment_intent.payment_failed" } })).toBe(1);
    expect(await OutboxMessage.count({ where: { kind: "deposit_paid" } })).toBe(0);
  });

  it("3184 requires authentication: pending until the step is completed, then paid", async () => {
    const w = await acceptedWorld();
    await accept(w);
    const { sessionId } = await startDeposit(w.token);
    const res = await postForm(`/pay/${sessionId}`, { card: TEST_CARDS.authenticationRequired });
    expect(res.location).toMatch(/^\/authenticate\/pi_/);
    await pay.fake.idle();
    expect((await payment()).status).toBe("pending");
    const done = await postForm(res.location!, { outcome: "complete" });
    expect(done.location).toContain(`/p/${w.token}?deposit=processing`);
    await pay.fake.idle();
    expect((await payment()).status).toBe("paid");
  });
});

describe("POST /api/payments/webhook", () => {
  it("refuses a bad signature with 400 and changes nothing", async () => {
    const w = await acceptedWorld();
    await accept(w);
    const { sessionId } = await startDeposit(w.token);
    const p = await payment();
    const body = JSON.stringify({
      id: "evt_forged",
      object: "event",
      type: "checkout.session.completed",
      data: { object: { id: sessionId, object: "checkout.session", payment_status: "paid", metadata: { paymentId: String(p.id) } } },
    });
    const forged = await homeowner(app)
      .post("/api/payments/webhook")
      .set("Content-Type", "application/json")
      .set("Stripe-Signature", signWebhookPayload(body, "whsec_not_the_secret"))
      .send(body);
    expect(forged.status).toBe(400);
    expect(forged.body.error.code).toBe("bad_signature");
    const unsigned = await homeowner(app).post("/api/payments/webhook").set("Content-Type", "application/json").send(body);
    expect(unsigned.status).toBe(400);
    expect((await payment()).status).toBe("pending");
    expect(await countRows("payment_events")).toBe(0);

    // The same body with the right secret goes through: the check, not the body, refused it.
    const good = await homeowner(app)
      .post("/api/payments/webhook")
      .set("Content-Type", "application/json")
      .set("Stripe-Signature", signWebhookPayload(body, pay.config.webhookSecret))
      .send(body);
    expect(good.status).toBe(200);
    expect((await payment()).status).toBe("paid");
  });

  it("a replayed event changes nothing (one event row, one e-mail)", async () => {
    const w = await acceptedWorld();
    await accept(w);
    const { sessionId } = await startDeposit(w.token);
    await postForm(`/pay/${sessionId}`, { card: TEST_CARDS.succeeds });
    await pay.fake.idle();
    const p = await payment();
    expect(p.status).toBe("paid");
    const events = await countRows("payment_events");
    const completed = eventsOf("checkout.session.completed")[0];
    const again = await pay.fake.redeliver(completed.id);
    expect(again).toMatchObject({ delivered: true, lastStatus: 200 });
    expect(await countRows("payment_events")).toBe(events);
    expect(await OutboxMessage.count({ where: { kind: "deposit_paid" } })).toBe(1);
    const after = await payment();
    expect(after.paidAt!.getTime()).toBe(p.paidAt!.getTime());
    expect(after.updatedAt.getTime()).toBe(p.updatedAt.getTime());
  });

  it("out of order: the completion arriving before an older failure leaves the payment paid", async () => {
    const w = await acceptedWorld();
    await accept(w);
    const { sessionId } = await startDeposit(w.token);
    pay.fake.setWebhookUrl(undefined);
    await postForm(`/pay/${sessionId}`, { card: TEST_CARDS.declined });
    await postForm(`/pay/${sessionId}`, { card: TEST_CARDS.succeeds });
    pay.fake.setWebhookUrl(webhookUrl);
    const failed = eventsOf("payment_intent.payment_failed")[0];
    const completed = eventsOf("checkout.session.completed")[0];
    const results = await pay.fake.deliver([completed.id, failed.id]);
    expect(results.map((r) => r.lastStatus)).toEqual([200, 200]);
    const p = await payment();
    expect(p.status).toBe("paid");
    expect(p.lastError).toBeNull();
    expect(await PaymentEvent.count()).toBe(2); // both recorded
  });
});

function publicUrl() {
  return (process.env.PUBLIC_URL ?? `http://localhost:${process.env.PORT ?? 3000}`).replace(/\/+$/, "");
}
