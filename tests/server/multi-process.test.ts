/**
 * Two real server processes (A and B, each a full startServer: sessions, outbox worker, proposal
 * scheduler, payment webhooks, rate limiters) on the same test database, e-mail going to one SMTP catcher
 * run by this test. They must behave as one server: a session works on either, every e-mail is delivered
 * once, each expiry and reminder happens once, a webhook delivered to both is applied once, and the
 * sign-in limit counts failures on both together.
 *
 * The worlds (companies, quotes, proposals) are made in this process on the same database; the children
 * do everything the assertions are about.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { createMailCatcher, type CaughtMessage, type MailCatcher } from "../../server/mail/catcher";
import { enqueueEmail } from "../../server/services/outbox.service";
import { OutboxMessage } from "../../server/models/mail.models";
import { AuditEvent, Job, Payment, PaymentEvent, Proposal, Quote } from "../../server/models/index";
import { signWebhookPayload } from "../../server/fakes/payment-fake";
import { LOCAL_FAKE_WEBHOOK_SECRET } from "../../server/payments/config";
import { testStorage } from "../helpers/app";
import { testSequelize, truncateAll } from "../helpers/db";
import { buildUser, TEST_PASSWORD } from "../helpers/factories";
import { approvedQuoteWorld, sendQuote } from "../helpers/proposal-world";
import { startServerProcess, type ServerProcess } from "../helpers/server-process";

const LOGIN_LIMIT = 6;
let catcher: MailCatcher;
let A: ServerProcess;
let B: ServerProcess;

beforeAll(async () => {
  await truncateAll();
  catcher = createMailCatcher({ port: 0, maxMessages: 5_000 });
  await catcher.listen();
  const env = {
    NODE_ENV: "test",
    PORT: "0",
    HOST: "127.0.0.1",
    LOG_LEVEL: "warn",
    SMTP_URL: `smtp://127.0.0.1:${catcher.port}`,
    OUTBOX_POLL_MS: "100",
    PROPOSAL_SCHEDULER_MS: "1000",
    REMINDER_DAYS_BEFORE: "3",
    LOGIN_MAX_FAILURES: String(LOGIN_LIMIT),
    LOGIN_WINDOW_MINUTES: "15",
    STORAGE_DRIVER: "disk",
    STORAGE_DIR: testStorage().dir, // the proposals' PDFs made in this process are read by the children
    PAYMENTS_USE_FAKE: "true",
    PAYMENT_FAKE_PORT: "0",
  };
  [A, B] = await Promise.all([startServerProcess(env), startServerProcess(env)]);
}, 120_000);

afterAll(async () => {
  for (const [name, s] of [["A", A], ["B", B]] as const) if (s?.stderr().trim()) console.log(`--- server ${name} stderr ---\n${s.stderr()}`);
  await Promise.all([A?.stop(), B?.stop()]);
  await catcher?.close();
}, 30_000);

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function until<T>(what: string, probe: () => Promise<T | false | null | undefined>, timeoutMs = 20_000): Promise<T> {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const v = await probe();
    if (v) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}\n--- A stderr ---\n${A.stderr()}\n--- B stderr ---\n${B.stderr()}`);
    await sleep(100);
  }
}

/** A minimal browser: one cookie jar, any server. */
function browser() {
  const jar = new Map<string, string>();
  async function call(base: string, method: string, path: string, opts: { json?: unknown; csrf?: string } = {}) {
    const headers: Record<string, string> = {};
    if (jar.size) headers.cookie = [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
    if (opts.csrf) headers["x-csrf-token"] = opts.csrf;
    if (opts.json !== undefined) headers["content-type"] = "application/json";
    const res = await fetch(`${base}${path}`, { method, headers, body: opts.json === undefined ? undefined : JSON.stringify(opts.json) });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const i = pair.indexOf("=");
      jar.set(pair.slice(0, i).trim(), pair.slice(i + 1).trim());
    }
    const text = await res.text();
    let body: any = null; // eslint-disable-line @typescript-eslint/no-explicit-any
    try {
      body = text ? JSON.parse(text) : null;
    } catch {
      body = text;
    }
    return { status: res.status, body };
  }
  return {
    call,
    csrf: async (base: string) => (await call(base, "GET", "/api/auth/csrf")).body.token as string,
  };
}

const caught = (match: (m: CaughtMessage) => boolean) => catcher.messages().filter(match);

describe("two server processes on one database", () => {
  it("both are up, each its own process", async () => {
    expect(A.pid).not.toBe(B.pid);
    expect(A.port).not.toBe(B.port);
    for (const s of [A, B]) expect((await fetch(`${s.url}/api/health`)).status).toBe(200);
  });

  it("a session made by signing in on A works on B, with its CSRF token; signing out on B ends it on A", async () => {
    const user = await buildUser({ role: "estimator" });
    const b = browser();
    const login = await b.call(A.url, "POST", "/api/auth/login", { csrf: await b.csrf(A.url), json: { email: user.email, password: TEST_PASSWORD } });
    expect(login.status).toBe(200);
    expect(login.body.user.email).toBe(user.email);
    const meB = await b.call(B.url, "GET", "/api/auth/me");
    expect(meB.status).toBe(200);
    expect(meB.body.user.id).toBe(user.id);
    // A state-changing request on B with the token A handed out (the token lives in the shared session).
    const token = await b.csrf(A.url);
    const created = await b.call(B.url, "POST", "/api/customers", { csrf: token, json: { name: "Two-Server Test Household", email: "household@example.com" } });
    expect(created.status).toBe(201);
    expect((await b.call(A.url, "GET", `/api/customers/${created.body.data.id}`)).status).toBe(200);

    expect((await b.call(B.url, "POST", "/api/auth/logout", { csrf: token })).status).toBe(204);
    const meA = await b.call(A.url, "GET", "/api/auth/me");
    expect(meA.status).toBe(401);
    expect((await b.call(B.url, "GET", "/api/auth/me")).status).toBe(401);
  });

  it("20 e-mails enqueued while both outbox workers run are each delivered exactly once", async () => {
    const run = randomUUID().slice(0, 8);
    const subject = (i: number) => `Two-server outbox ${run} #${i}`;
    await testSequelize().transaction(async (transaction) => {
      for (let i = 0; i < 20; i++) {
        await enqueueEmail(
          { to: `outbox-${i}@example.com`, subject: subject(i), text: `message ${i}`, html: `<p>message ${i}</p>` },
          { transaction, companyId: null, kind: "multi_process_test" },
        );
      }
    });
    const mine = (m: CaughtMessage) => m.subject.startsWith(`Two-server outbox ${run} #`);
    await until("20 e-mails at the catcher", async () => caught(mine).length >= 20);
    await sleep(1_500); // both workers poll every 100 ms: a second copy would have arrived by now
    const got = caught(mine);
    expect(got).toHaveLength(20);
    expect(new Set(got.map((m) => m.subject)).size).toBe(20);
    for (const m of got) expect(m.to).toEqual([`outbox-${m.subject.split("#")[1]}@example.com`]);
    const rows = await OutboxMessage.findAll({ where: { kind: "multi_process_test" } });
    expect(rows.map((r) => r.status)).toEqual(Array(20).fill("sent"));
    expect(rows.every((r) => r.attempts === 1)).toBe(true);
    // Which processes sent them (claimed_by is host:pid:random); logged, not asserted: one fast worker may take all.
    const byPid = new Map<string, number>();
    for (const r of rows) {
      const pid = String(r.claimedBy).split(":")[1];
      byPid.set(pid, (byPid.get(pid) ?? 0) + 1);
    }
    expect([...byPid.keys()].every((pid) => pid === String(A.pid) || pid === String(B.pid))).toBe(true);
    console.log(`outbox: e-mails sent per process ${JSON.stringify(Object.fromEntries(byPid))} (A=${A.pid}, B=${B.pid})`);
  }, 60_000);

  it("the scheduler in both processes expires each proposal once and sends each reminder once", async () => {
    type Sent = { w: Awaited<ReturnType<typeof approvedQuoteWorld>>; token: string; p: Proposal };
    const expiring: Sent[] = [];
    const reminding: Sent[] = [];
    for (let i = 0; i < 3; i++) {
      const w = await approvedQuoteWorld();
      const { token } = await sendQuote(w);
      expiring.push({ w, token, p: (await Proposal.findOne({ where: { quoteId: w.quoteId } }))! });
    }
    for (let i = 0; i < 3; i++) {
      const w = await approvedQuoteWorld();
      const { token } = await sendQuote(w);
      reminding.push({ w, token, p: (await Proposal.findOne({ where: { quoteId: w.quoteId } }))! });
    }
    // Make them due on the database's clock: both schedulers (1 s interval) find the same rows.
    await testSequelize().query("UPDATE proposals SET expires_at = NOW() - INTERVAL 1 MINUTE WHERE id IN (?)", {
      replacements: [expiring.map((e) => e.p.id)],
    });
    await testSequelize().query("UPDATE proposals SET expires_at = NOW() + INTERVAL 1 DAY WHERE id IN (?)", {
      replacements: [reminding.map((e) => e.p.id)],
    });
    const ids = [...expiring, ...reminding].map((e) => e.p.id);
    await until("expiries and reminders", async () => {
      const rows = await Proposal.findAll({ where: { id: ids } });
      return rows.every((p) => (expiring.some((e) => e.p.id === p.id) ? p.status === "expired" : p.reminderSentAt !== null));
    });
    await sleep(3_000); // several more passes of both schedulers: nothing may happen twice
    for (const { w, p, token } of expiring) {
      expect((await Proposal.findByPk(p.id))!.status).toBe("expired");
      expect((await Quote.findByPk(w.quoteId))!.status).toBe("expired");
      expect((await Job.findByPk(w.job.id))!.status).toBe("lost");
      expect(await AuditEvent.count({ where: { entityType: "quote", entityId: w.quoteId, action: "expired" } })).toBe(1);
      const jobChanges = await AuditEvent.findAll({ where: { entityType: "job", entityId: w.job.id, action: "status_changed" } });
      const statusTo = (c: unknown) => ((typeof c === "string" ? JSON.parse(c) : c) as { status?: { to?: string } } | null)?.status?.to;
      const toLost = jobChanges.filter((a) => statusTo(a.changes) === "lost");
      expect(toLost).toHaveLength(1);
      for (const s of [A, B]) expect((await fetch(`${s.url}/api/proposals/${token}`)).status).toBe(404);
    }
    const reminderRows = await OutboxMessage.findAll({ where: { kind: "proposal_reminder" } });
    expect(reminderRows).toHaveLength(3);
    // Quote numbers repeat across companies: each homeowner's address (unique per world) tells the mails apart.
    const reminderTo = (to: string) => (m: CaughtMessage) => m.subject.startsWith("Reminder:") && m.to.includes(to);
    for (const { w, p } of reminding) {
      expect(await AuditEvent.count({ where: { entityType: "quote", entityId: w.quoteId, action: "reminder_sent" } })).toBe(1);
      await until(`the reminder to ${p.sentTo}`, async () => caught(reminderTo(p.sentTo)).length > 0);
    }
    await sleep(500);
    for (const { w, p } of reminding) {
      const got = caught(reminderTo(p.sentTo));
      expect(got).toHaveLength(1);
      expect(got[0].subject).toContain(w.quote.number);
    }
    expect(caught((m) => m.subject.startsWith("Reminder:"))).toHaveLength(3);
    // The expired ones got no reminder.
    for (const { p } of expiring) expect(caught(reminderTo(p.sentTo))).toHaveLength(0);
  }, 120_000);

  it("the same payment webhook event delivered to A and B at the same moment is recorded once: one paid payment, one receipt", async () => {
    for (let round = 0; round < 3; round++) {
      const w = await approvedQuoteWorld();
      const { token } = await sendQuote(w);
      const option = w.quote.revision.options[0];
      const h = browser();
      const accepted = await h.call(B.url, "POST", `/api/proposals/${token}/accept`, { json: { optionId: option.id, signerName: "Mara Quillfeather", consent: true } });
      expect(accepted.status).toBe(200);
      const deposit = await h.call(A.url, "POST", `/api/proposals/${token}/deposit`, { json: {} });
      expect(deposit.status).toBe(200);
      const sessionId = String(deposit.body.url).split("/pay/")[1];
      const payment = (await Payment.findOne({ where: { proposalId: (await Proposal.findOne({ where: { quoteId: w.quoteId } }))!.id } }))!;
      expect(payment.status).toBe("pending");
      expect(payment.providerSessionId).toBe(sessionId);

      const eventId = `evt_multi_${randomUUID().replace(/-/g, "")}`;
      const body = JSON.stringify({
        id: eventId,
        object: "event",
        type: "checkout.session.completed",
        created: Math.floor(Date.now() / 1000),
        data: {
          object: {
            id: sessionId,
            object: "checkout.session",
            payment_status: "paid",
            payment_intent: `pi_multi_${round}`,
            metadata: { paymentId: String(payment.id), proposalId: String(payment.proposalId) },
          },
        },
      });
      const signature = signWebhookPayload(body, LOCAL_FAKE_WEBHOOK_SECRET);
      const post = (s: ServerProcess) =>
        fetch(`${s.url}/api/payments/webhook`, { method: "POST", headers: { "content-type": "application/json", "stripe-signature": signature }, body }).then(
          async (r) => ({ status: r.status, body: (await r.json()) as { received: boolean; duplicate: boolean } }),
        );
      // Twice to each, all four at once.
      const results = await Promise.all([post(A), post(B), post(A), post(B)]);
      expect(results.map((r) => r.status)).toEqual([200, 200, 200, 200]);
      expect(results.filter((r) => r.body.duplicate === false)).toHaveLength(1);
      expect(await PaymentEvent.count({ where: { eventId } })).toBe(1);
      const after = (await Payment.findByPk(payment.id))!;
      expect(after.status).toBe("paid");
      expect(await Payment.count({ where: { proposalId: payment.proposalId } })).toBe(1);
      expect(await AuditEvent.count({ where: { entityType: "payment", entityId: payment.id, action: "paid" } })).toBe(1);
      expect(await OutboxMessage.count({ where: { kind: "deposit_receipt", companyId: w.company.id } })).toBe(1);
      const homeownerEmail = (await Proposal.findByPk(payment.proposalId))!.sentTo;
      const receipt = (m: CaughtMessage) => m.subject.startsWith("Receipt: deposit") && m.to.includes(homeownerEmail);
      await until(`the receipt to ${homeownerEmail}`, async () => caught(receipt).length > 0);
      await sleep(500);
      expect(caught(receipt)).toHaveLength(1);
    }
  }, 120_000);

  it("the sign-in limit is shared: failures alternated between A and B hit 429 at the configured total", async () => {
    const user = await buildUser({ role: "owner" });
    const onA = browser();
    const onB = browser(); // separate sessions: the limit is per IP and e-mail, not per session
    const statuses: number[] = [];
    for (let i = 0; i < LOGIN_LIMIT + 2; i++) {
      const [c, s] = i % 2 === 0 ? [onA, A] : [onB, B];
      const res = await c.call(s.url, "POST", "/api/auth/login", { csrf: await c.csrf(s.url), json: { email: user.email, password: "not-the-password" } });
      statuses.push(res.status);
      if (res.status === 429) expect(res.body.error.code).toBe("rate_limited");
    }
    expect(statuses).toEqual([...Array(LOGIN_LIMIT).fill(401), 429, 429]);
    // Locked out on both, even with the right password (a success would reset the count).
    for (const [c, s] of [[onA, A], [onB, B]] as const) {
      const res = await c.call(s.url, "POST", "/api/auth/login", { csrf: await c.csrf(s.url), json: { email: user.email, password: TEST_PASSWORD } });
      expect(res.status).toBe(429);
    }
    // Another e-mail from the same IP still signs in (counted apart), on either server.
    const other = await buildUser({ role: "owner" });
    const res = await onB.call(B.url, "POST", "/api/auth/login", { csrf: await onB.csrf(B.url), json: { email: other.email, password: TEST_PASSWORD } });
    expect(res.status).toBe(200);
  }, 60_000);
});
