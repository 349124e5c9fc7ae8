/**
 * Drill: the payment provider's webhooks delivered twice at once and out of order, over real HTTP to a
 * listening server (server/index.ts startServer, with its local payment fake and mail catcher), after a
 * homeowner paid through the fake's test page. Whatever the order and however many copies, the deposit
 * is recorded once, ends paid, and the homeowner gets one receipt, counted at the mail catcher.
 * (tests/server/payments.test.ts covers a replay after processing and a completion before an older failure.)
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadConfig } from "../../server/config";
import { startServer, type RunningServer } from "../../server/index";
import { AuditEvent, Payment, PaymentEvent } from "../../server/models/index";
import { OutboxMessage } from "../../server/models/mail.models";
import { TEST_CARDS, signWebhookPayload, type FakeEvent } from "../../server/fakes/payment-fake";
import { createTestApp } from "../helpers/app";
import { approvedQuoteWorld, sendQuote } from "../helpers/proposal-world";
import { Client, sleep, waitUntil } from "./helpers/http-client";

let running: RunningServer;
let url: string;

beforeAll(async () => {
  running = await startServer(
    loadConfig({ ...process.env, PORT: "0", HOST: "127.0.0.1", MAIL_CATCHER_PORT: "0", MAIL_CATCHER_DIR: "", PAYMENT_FAKE_PORT: "0", OUTBOX_POLL_MS: "200", STORAGE_DIR: ".test-data/faults/storage" }),
  );
  url = running.url.replace("localhost", "127.0.0.1");
});

afterAll(async () => {
  await running?.close();
});

/** An accepted proposal with a deposit paid on the fake's test page, its webhooks held back. */
async function paidButNotNotified() {
  const w = await approvedQuoteWorld({ app: createTestApp() });
  const { token } = await sendQuote(w);
  const homeowner = new Client(url);
  const option = w.quote.revision.options[0];
  const accept = await homeowner.post(`/api/proposals/${token}/accept`, { optionId: option.id, signerName: "Ilse Marrick", consent: true });
  expect(accept.status).toBe(200);
  const fake = running.paymentFake!;
  const mark = fake.events().length;
  fake.setWebhookUrl(undefined); // the provider is slow to call back: events are recorded, not sent yet
  const deposit = await homeowner.post(`/api/proposals/${token}/deposit`, {});
  expect(deposit.status).toBe(200);
  const sessionId = String(deposit.body.url).split("/pay/")[1];
  const paid = await fetch(`${fake.url}/pay/${sessionId}`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ card: TEST_CARDS.succeeds }).toString(),
    redirect: "manual",
  });
  expect(paid.status).toBe(303);
  fake.setWebhookUrl(`${url}/api/payments/webhook`);
  const events = fake.events().slice(mark);
  const of = (type: string) => events.filter((e) => e.type === type);
  expect(of("checkout.session.completed")).toHaveLength(1);
  expect(of("payment_intent.succeeded")).toHaveLength(1);
  const payment = (await Payment.findOne({ where: { providerSessionId: sessionId } }))!;
  expect(payment.status).toBe("pending");
  return { w, token, sessionId, payment, homeowner, completed: of("checkout.session.completed")[0], succeeded: of("payment_intent.succeeded")[0] };
}

/** Posts an event to the server exactly as the provider would (signed raw body), and the answer. */
async function post(event: FakeEvent | Record<string, unknown>) {
  const body = JSON.stringify(event);
  const res = await fetch(`${url}/api/payments/webhook`, {
    method: "POST",
    headers: { "content-type": "application/json", "stripe-signature": signWebhookPayload(body, loadConfig().payments.webhookSecret) },
    body,
  });
  return { status: res.status, body: (await res.json()) as { received?: boolean; duplicate?: boolean; error?: unknown } };
}

/** Receipts that reached the server's mail catcher for this homeowner. */
const receiptsTo = (email: string) => running.mailCatcher!.messages().filter((m) => m.envelopeTo.includes(email) && m.subject.startsWith("Receipt: deposit"));

async function expectOneReceipt(paymentId: number, email: string) {
  // Wait for the outbox to deliver it, then a little longer for any second copy.
  await waitUntil(async () => (receiptsTo(email).length >= 1 ? true : undefined), 20_000, "the receipt at the catcher");
  await sleep(1_500);
  expect(receiptsTo(email)).toHaveLength(1);
  const rows = await OutboxMessage.findAll({ where: { kind: "deposit_receipt" } });
  expect(rows.filter((r) => r.toAddresses.includes(email))).toHaveLength(1);
  expect(await AuditEvent.count({ where: { entityType: "payment", entityId: String(paymentId), action: "paid" } })).toBe(1);
}

const homeownerEmail = async (paymentId: number) => {
  const p = await Payment.findByPk(paymentId);
  const { Job, Customer } = await import("../../server/models/index");
  const job = await Job.findByPk(p!.jobId);
  return (await Customer.findByPk(job!.customerId))!.email!;
};

describe("payment webhooks delivered twice and out of order", () => {
  it("the completion delivered five times at once: one payment, paid once, one receipt", async () => {
    const { payment, completed, succeeded, token, homeowner } = await paidButNotNotified();
    const answers = await Promise.all(Array.from({ length: 5 }, () => post(completed)));
    // Every copy is acknowledged (2xx), so the provider stops retrying; exactly one did the work.
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200, 200, 200]);
    expect(answers.filter((a) => a.body.duplicate === false)).toHaveLength(1);
    await post(succeeded);
    const after = (await Payment.findByPk(payment.id))!;
    expect(after.status).toBe("paid");
    expect(await Payment.count({ where: { proposalId: payment.proposalId } })).toBe(1);
    expect(await PaymentEvent.count({ where: { eventId: completed.id } })).toBe(1);
    await expectOneReceipt(payment.id, await homeownerEmail(payment.id));
    expect((await homeowner.get(`/api/proposals/${token}`)).body.data.deposit.status).toBe("paid");
  });

  it("completion first, then the older payment_intent.succeeded, then both again (in reverse), then a stale expiry: still paid once", async () => {
    const { payment, completed, succeeded, sessionId, token, homeowner } = await paidButNotNotified();
    const fake = running.paymentFake!;
    // The provider's own redelivery: newest first, then the whole lot again in the opposite order.
    const first = await fake.deliver([completed.id, succeeded.id]);
    expect(first.map((r) => r.lastStatus)).toEqual([200, 200]);
    const paid = (await Payment.findByPk(payment.id))!;
    expect(paid.status).toBe("paid");
    expect(paid.providerPaymentIntentId).toBe((succeeded.data.object as { id: string }).id);
    const again = await fake.deliver([succeeded.id, completed.id]);
    expect(again.map((r) => r.lastStatus)).toEqual([200, 200]);

    // An expiry written before the payment (older `created`) that arrives last must not undo it.
    const stale = {
      id: `evt_drill_expired_${payment.id}`,
      object: "event",
      api_version: completed.api_version,
      created: completed.created - 600,
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      type: "checkout.session.expired",
      data: { object: { ...(completed.data.object as Record<string, unknown>), id: sessionId, status: "expired", payment_status: "unpaid" } },
    };
    const expired = await post(stale);
    expect(expired.status).toBe(200);
    const after = (await Payment.findByPk(payment.id))!;
    expect(after.status).toBe("paid");
    expect(after.paidAt!.getTime()).toBe(paid.paidAt!.getTime());
    expect(await PaymentEvent.count({ where: { paymentId: payment.id } })).toBe(3); // completed, succeeded, the stale expiry: each once
    await expectOneReceipt(payment.id, await homeownerEmail(payment.id));
    expect((await homeowner.get(`/api/proposals/${token}`)).body.data.deposit.status).toBe("paid");
  });
});
