import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { randomBytes } from "node:crypto";
import { SMTPServer } from "smtp-server";
import { countRows, testSequelize, truncateAll } from "../helpers/db";
import { startTestMailCatcher, testConfig, testMailer, testOutboxWorker } from "../helpers/app";
import { buildCompany } from "../helpers/factories";
import { startMailCatcher, type MailCatcher } from "../../server/mail/catcher";
import { createSmtpMailer, type MailMessage, type Mailer } from "../../server/mail/mailer";
import { OutboxMessage } from "../../server/models/mail.models";
import {
  MAX_OUTBOX_ATTACHMENT_BYTES,
  OutboxWorker,
  enqueueEmail,
  outboxBackoffMs,
} from "../../server/services/outbox.service";

const cleanups: Array<() => Promise<void> | void> = [];

beforeEach(async () => {
  await truncateAll();
  await (await startTestMailCatcher()).clear();
});

afterEach(async () => {
  for (const c of cleanups.splice(0).reverse()) await c();
});

const message = (subject: string, extra: Partial<MailMessage> = {}): MailMessage => ({
  to: "homeowner@example.com",
  subject,
  text: `Text of ${subject}`,
  html: `<p>HTML of ${subject}</p>`,
  ...extra,
});

/** Enqueues and commits, as a service does with its own change. */
async function enqueue(msg: MailMessage, companyId: number | null = null, kind = "test") {
  return testSequelize().transaction((transaction) => enqueueEmail(msg, { transaction, companyId, kind }));
}

async function reload(id: number) {
  return (await OutboxMessage.findByPk(id))!;
}

/** A catcher of its own on a port it can be restarted on (the "SMTP server" that goes down). */
async function ownCatcher(port = 0): Promise<MailCatcher> {
  const c = await startMailCatcher({ port });
  cleanups.push(() => c.close());
  return c;
}

function smtpTo(port: number): Mailer {
  const m = createSmtpMailer({ host: "127.0.0.1", port }, { from: testConfig().mail.from });
  cleanups.push(() => m.close?.());
  return m;
}

describe("enqueueEmail", () => {
  it("writes nothing when the caller's transaction rolls back", async () => {
    await expect(
      testSequelize().transaction(async (transaction) => {
        await enqueueEmail(message("Rolled back"), { transaction, companyId: null, kind: "test" });
        throw new Error("the change failed");
      }),
    ).rejects.toThrow("the change failed");
    expect(await countRows("outbox_messages")).toBe(0);
  });

  it("commits a pending row with the message, its company and kind", async () => {
    const company = await buildCompany();
    const pdf = randomBytes(50_000);
    const row = await enqueue(
      message("Committed", {
        to: ["a@example.com", "b@example.com"],
        cc: "c@example.com",
        bcc: ["d@example.com"],
        attachments: [{ filename: "proposal.pdf", contentType: "application/pdf", content: pdf }],
      }),
      company.id,
      "proposal",
    );
    const stored = await reload(row.id);
    expect(stored).toMatchObject({
      companyId: company.id,
      kind: "proposal",
      status: "pending",
      attempts: 0,
      toAddresses: ["a@example.com", "b@example.com"],
      cc: ["c@example.com"],
      bcc: ["d@example.com"],
      subject: "Committed",
      sentAt: null,
      lastError: null,
    });
    expect(Buffer.from(stored.attachments![0].contentBase64, "base64").equals(pdf)).toBe(true);
    expect(stored.nextAttemptAt.getTime()).toBeLessThanOrEqual(Date.now());
  });

  it("refuses a message without recipients or with attachments over the limit", async () => {
    await expect(enqueue(message("Nobody", { to: [] }))).rejects.toThrow(/no recipient/);
    const big = Buffer.alloc(MAX_OUTBOX_ATTACHMENT_BYTES + 1);
    await expect(
      enqueue(message("Too big", { attachments: [{ filename: "x.bin", contentType: "application/octet-stream", content: big }] })),
    ).rejects.toThrow(/attachments total/);
    expect(await countRows("outbox_messages")).toBe(0);
  });
});

describe("OutboxWorker", () => {
  it("delivers a new e-mail through the real SMTP catcher within a few seconds of the commit", async () => {
    const catcher = await startTestMailCatcher();
    const worker = testOutboxWorker({ pollMs: 1_500 });
    worker.start();
    cleanups.push(() => worker.stop());
    const company = await buildCompany();
    const pdf = Buffer.concat([Buffer.from("%PDF-1.7\n"), randomBytes(300_000)]);
    const started = Date.now();
    const row = await enqueue(
      message("Your proposal", { attachments: [{ filename: "proposal.pdf", contentType: "application/pdf", content: pdf }] }),
      company.id,
      "proposal",
    );
    const caught = await catcher.waitFor((m) => m.subject === "Your proposal", 5_000);
    expect(Date.now() - started).toBeLessThan(5_000);
    expect(caught).toMatchObject({
      to: ["homeowner@example.com"],
      from: "no-reply@example.com",
      text: "Text of Your proposal",
      companyId: company.id,
      kind: "proposal",
    });
    expect(caught.html).toContain("HTML of Your proposal");
    expect((await catcher.attachment(caught.id, 0))!.content.equals(pdf)).toBe(true);
    await expect.poll(async () => (await reload(row.id)).status, { timeout: 3_000 }).toBe("sent");
    const sent = await reload(row.id);
    expect(sent.attempts).toBe(1);
    expect(sent.sentAt).toBeInstanceOf(Date);
    expect(sent.messageId).toBe(caught.messageId);
    expect(sent.claimedBy).toBe(worker.id);
  });

  it("keeps no one-time link token in the row once the e-mail is delivered (the homeowner's copy has it)", async () => {
    const catcher = await startTestMailCatcher();
    const worker = testOutboxWorker({ pollMs: 200 });
    worker.start();
    cleanups.push(() => worker.stop());
    const proposal = randomBytes(32).toString("base64url");
    const reset = randomBytes(32).toString("base64url");
    const row = await enqueue(
      message("Links", {
        text: `Open https://roofs.example.com/p/${proposal} or https://roofs.example.com/reset-password?token=${reset}`,
        html: `<a href="https://roofs.example.com/p/${proposal}">open</a> <a href="/reset-password?token=${reset}">reset</a>`,
      }),
    );
    expect((await reload(row.id)).text).toContain(proposal); // kept until delivered: a retry needs it
    const caught = await catcher.waitFor((m) => m.subject === "Links", 5_000);
    expect(caught.text).toContain(`/p/${proposal}`);
    expect(caught.html).toContain(`token=${reset}`);
    await expect.poll(async () => (await reload(row.id)).status, { timeout: 3_000 }).toBe("sent");
    const sent = await reload(row.id);
    for (const body of [sent.text, sent.html]) {
      expect(body).not.toContain(proposal);
      expect(body).not.toContain(reset);
      expect(body).toContain("[removed after delivery]");
    }
    expect(sent.text).toContain("https://roofs.example.com/p/[removed after delivery]");
  });

  it("keeps the e-mail pending while SMTP is down, then delivers it exactly once when it is back", async () => {
    const first = await ownCatcher();
    const port = first.port;
    const worker = new OutboxWorker({ sequelize: testSequelize(), mailer: smtpTo(port), maxAttempts: 8 });
    await first.close(); // SMTP server down
    const row = await enqueue(message("Survives an outage"));

    const before = Date.now();
    expect(await worker.runOnce()).toMatchObject({ claimed: 1, sent: 0, retried: 1 });
    const waiting = await reload(row.id);
    expect(waiting.status).toBe("pending");
    expect(waiting.attempts).toBe(1);
    expect(waiting.lastError).toMatch(/ECONNREFUSED|ECONNECTION|connect/i);
    expect(waiting.claimedBy).toBeNull();
    // First backoff step: 10 s.
    expect(waiting.nextAttemptAt.getTime()).toBeGreaterThanOrEqual(before + outboxBackoffMs(1) - 50);
    expect(await worker.runOnce()).toMatchObject({ claimed: 0 }); // not due yet: no hammering

    const back = await ownCatcher(port); // the same server is back on the same port
    await OutboxMessage.update({ nextAttemptAt: new Date(Date.now() - 1_000) }, { where: { id: row.id } }); // 10 s pass
    expect(await worker.runOnce()).toMatchObject({ claimed: 1, sent: 1 });
    expect(await worker.runOnce()).toMatchObject({ claimed: 0, sent: 0 });
    await OutboxMessage.update({ nextAttemptAt: new Date(Date.now() - 60_000) }, { where: { id: row.id } });
    expect(await worker.runOnce()).toMatchObject({ claimed: 0, sent: 0 }); // sent rows are never due again

    expect(back.messages().filter((m) => m.subject === "Survives an outage")).toHaveLength(1);
    expect(await reload(row.id)).toMatchObject({ status: "sent", attempts: 2 });
    expect((await reload(row.id)).lastError).toMatch(/ECONNREFUSED|ECONNECTION|connect/i); // history kept
  });

  it("gives up after the configured number of attempts and marks the row failed", async () => {
    const down = await ownCatcher();
    const worker = new OutboxWorker({ sequelize: testSequelize(), mailer: smtpTo(down.port), maxAttempts: 3, backoffMs: () => 0 });
    await down.close();
    const row = await enqueue(message("Never arrives"));
    for (let i = 0; i < 3; i++) await worker.runOnce();
    expect(await reload(row.id)).toMatchObject({ status: "failed", attempts: 3 });
    expect(await worker.runOnce()).toMatchObject({ claimed: 0 });
  });

  it("marks a message failed at once when the server refuses every recipient with a 5xx", async () => {
    const refusing = new SMTPServer({
      authOptional: true,
      disabledCommands: ["STARTTLS"],
      logger: false,
      onRcptTo(_address, _session, callback) {
        callback(Object.assign(new Error("5.1.1 No such mailbox"), { responseCode: 550 }));
      },
    });
    await new Promise<void>((resolve) => refusing.listen(0, "127.0.0.1", () => resolve()));
    cleanups.push(() => new Promise<void>((resolve) => refusing.close(() => resolve())));
    const port = (refusing.server.address() as { port: number }).port;
    const worker = new OutboxWorker({ sequelize: testSequelize(), mailer: smtpTo(port), maxAttempts: 8 });
    const row = await enqueue(message("Bounced"));
    expect(await worker.runOnce()).toMatchObject({ failed: 1 });
    const failed = await reload(row.id);
    expect(failed).toMatchObject({ status: "failed", attempts: 1 });
    expect(failed.lastError).toMatch(/550/);
  });

  it("never lets two workers send the same row: 40 e-mails, two workers racing, each e-mail once", async () => {
    const catcher = await startTestMailCatcher();
    const sends = new Map<string, number>();
    // A slower mailer widens the window in which the two workers overlap.
    const counting: Mailer = {
      async send(msg) {
        sends.set(msg.subject, (sends.get(msg.subject) ?? 0) + 1);
        await new Promise((r) => setTimeout(r, 5));
        return testMailer.send(msg);
      },
    };
    const subjects = Array.from({ length: 40 }, (_, i) => `Race ${i}`);
    await testSequelize().transaction(async (transaction) => {
      for (const s of subjects) await enqueueEmail(message(s), { transaction, companyId: null, kind: "test" });
    });
    const a = new OutboxWorker({ sequelize: testSequelize(), mailer: counting, batchSize: 3, workerId: "worker-a" });
    const b = new OutboxWorker({ sequelize: testSequelize(), mailer: counting, batchSize: 3, workerId: "worker-b" });
    const drain = async (w: OutboxWorker) => {
      let total = 0;
      for (;;) {
        const r = await w.runOnce();
        total += r.sent;
        if (r.claimed === 0) return total;
      }
    };
    const [sentA, sentB] = await Promise.all([drain(a), drain(b)]);
    expect(sentA + sentB).toBe(40);
    expect(sentA).toBeGreaterThan(0);
    expect(sentB).toBeGreaterThan(0);
    expect([...sends.values()].every((n) => n === 1)).toBe(true);
    expect([...sends.keys()].sort()).toEqual([...subjects].sort());
    const caught = catcher.messages().map((m) => m.subject);
    expect(caught.sort()).toEqual([...subjects].sort());
    const rows = await OutboxMessage.findAll();
    expect(rows.every((r) => r.status === "sent" && r.attempts === 1)).toBe(true);
    expect(new Set(rows.map((r) => r.claimedBy))).toEqual(new Set(["worker-a", "worker-b"]));
  });

  it("skips rows another transaction has locked instead of waiting for them (SKIP LOCKED)", async () => {
    const catcher = await startTestMailCatcher();
    const locked = await enqueue(message("Locked elsewhere"));
    const free = await enqueue(message("Free"));
    const worker = testOutboxWorker();
    const t = await testSequelize().transaction();
    try {
      // Another worker mid-claim holds this row's lock.
      await testSequelize().query("SELECT id FROM outbox_messages WHERE id = ? FOR UPDATE", {
        replacements: [locked.id],
        transaction: t,
      });
      const started = Date.now();
      expect(await worker.runOnce()).toMatchObject({ claimed: 1, sent: 1 });
      expect(Date.now() - started).toBeLessThan(3_000); // no lock wait (innodb_lock_wait_timeout is 50 s)
    } finally {
      await t.rollback();
    }
    expect(catcher.messages().map((m) => m.subject)).toEqual(["Free"]);
    expect((await reload(free.id)).status).toBe("sent");
    expect((await reload(locked.id)).status).toBe("pending");
    expect(await worker.runOnce()).toMatchObject({ claimed: 1, sent: 1 }); // its turn once the lock is gone
  });

  it("puts a row left in sending by a crashed process back in line and sends it (once more)", async () => {
    const catcher = await startTestMailCatcher();
    const stuck = await enqueue(message("Crashed mid-send"));
    const recent = await enqueue(message("Being sent right now"));
    await OutboxMessage.update(
      { status: "sending", claimedBy: "dead-host:123:abc", claimedAt: new Date(Date.now() - 10 * 60_000) },
      { where: { id: stuck.id } },
    );
    await OutboxMessage.update(
      { status: "sending", claimedBy: "live-host:456:def", claimedAt: new Date(Date.now() - 30_000) },
      { where: { id: recent.id } },
    );
    const worker = testOutboxWorker({ stuckAfterMs: 5 * 60_000 });
    expect(await worker.runOnce()).toMatchObject({ recovered: 1, claimed: 1, sent: 1 });
    const done = await reload(stuck.id);
    expect(done).toMatchObject({ status: "sent", attempts: 2, claimedBy: worker.id });
    expect(done.lastError).toMatch(/dead-host:123:abc.*stopped mid-send/);
    expect(catcher.messages().map((m) => m.subject)).toEqual(["Crashed mid-send"]);
    // A send in progress elsewhere (30 s old) is left alone.
    expect(await reload(recent.id)).toMatchObject({ status: "sending", claimedBy: "live-host:456:def", attempts: 0 });
  });

  it("sends the same Message-ID on every try of a row", async () => {
    const seen: string[] = [];
    let fail = true;
    const flaky: Mailer = {
      async send(msg) {
        seen.push(msg.messageId!);
        if (fail) throw Object.assign(new Error("421 try later"), { code: "EMESSAGE", responseCode: 421 });
        return { messageId: msg.messageId! };
      },
    };
    const worker = new OutboxWorker({ sequelize: testSequelize(), mailer: flaky, backoffMs: () => 0 });
    const row = await enqueue(message("Same id"));
    await worker.runOnce();
    fail = false;
    await worker.runOnce();
    expect(seen).toHaveLength(2);
    expect(seen[0]).toBe(seen[1]);
    expect(seen[0]).toMatch(new RegExp(`^<outbox-${row.id}\\.\\d+@example\\.com>$`));
    expect(await reload(row.id)).toMatchObject({ status: "sent", attempts: 2, messageId: seen[0] });
  });

  it("backs off exponentially and caps the delay", () => {
    expect([1, 2, 3, 4, 5].map(outboxBackoffMs)).toEqual([10_000, 30_000, 120_000, 600_000, 3_600_000]);
    expect(outboxBackoffMs(20)).toBe(21_600_000);
  });

  it("stop() ends polling: nothing is sent after it", async () => {
    const catcher = await startTestMailCatcher();
    const worker = testOutboxWorker({ pollMs: 100 });
    worker.start();
    await worker.stop();
    await enqueue(message("After stop"));
    await new Promise((r) => setTimeout(r, 400));
    expect(catcher.messages()).toEqual([]);
    expect((await OutboxMessage.findOne())!.status).toBe("pending");
  });
});
