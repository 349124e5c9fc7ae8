import type { Express } from "express";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { createDiskStorage, type Storage } from "../../server/storage/storage";
import { loadConfig, type Config } from "../../server/config";
import { createLogger } from "../../server/logger";
import { createApp } from "../../server/app";
import { createSessionStore } from "../../server/session-store";
import { testSequelize } from "./db";
import { createSmtpMailer, type Mailer } from "../../server/mail/mailer";
import { createMailCatcher, type MailCatcher } from "../../server/mail/catcher";
import { OutboxWorker, type OutboxRunResult, type OutboxWorkerOptions } from "../../server/services/outbox.service";
import { startPaymentFake, type PaymentFake } from "../../server/fakes/payment-fake";
import { createPaymentClient, type PaymentClient } from "../../server/payments/stripe-client";
import { LOCAL_FAKE_SECRET_KEY, LOCAL_FAKE_WEBHOOK_SECRET, type PaymentConfig } from "../../server/payments/config";
import type { Server } from "node:http";

const stores: Array<ReturnType<typeof createSessionStore>> = [];

let storage: (Storage & { dir: string }) | null = null;

/** This test file's upload storage: a fresh temp folder (vitest isolates modules per file). */
export function testStorage(): Storage & { dir: string } {
  return (storage ??= createDiskStorage(mkdtempSync(path.join(tmpdir(), "rw-storage-"))));
}

export function testConfig(overrides: Partial<Config> = {}): Config {
  return { ...loadConfig(), ...overrides };
}

let catcher: MailCatcher | null = null;
let smtp: { port: number; mailer: Mailer } | null = null;

/** This test file's local SMTP catcher (memory only, port 0); it listens from the first send on. */
export function testMailCatcher(): MailCatcher {
  return (catcher ??= createMailCatcher({ port: 0 }));
}

/** Starts this file's catcher if it is not listening yet. */
export async function startTestMailCatcher(): Promise<MailCatcher> {
  const c = testMailCatcher();
  await c.listen();
  return c;
}

/** Sends through real SMTP to this file's catcher (started on first use). */
export const testMailer: Mailer = {
  async send(msg) {
    const c = await startTestMailCatcher();
    if (!smtp || smtp.port !== c.port) {
      smtp = { port: c.port, mailer: createSmtpMailer({ host: "127.0.0.1", port: c.port }, { from: testConfig().mail.from }) };
    }
    return smtp.mailer.send(msg);
  },
};

/** An outbox worker on the test database that sends to this file's catcher (call runOnce() yourself). */
export function testOutboxWorker(options: Partial<OutboxWorkerOptions> = {}): OutboxWorker {
  const config = testConfig();
  return new OutboxWorker({
    sequelize: testSequelize(),
    mailer: testMailer,
    from: config.mail.from,
    maxAttempts: config.outbox.maxAttempts,
    tagForCatcher: true,
    ...options,
  });
}

/** Delivers every due outbox e-mail now, as the server's worker would within its poll interval. */
export async function deliverOutbox(): Promise<OutboxRunResult> {
  return testOutboxWorker().runOnce();
}

/**
 * The real app on the real test database, without listening. E-mail goes through real SMTP to this
 * file's catcher, which /api/dev/mail shows unless the config names an SMTP_URL.
 */
export function createTestApp(
  overrides: Partial<Config> = {},
  deps: { mailer?: Mailer; storage?: Storage; payments?: { stripe: PaymentClient; config: PaymentConfig } } = {},
): Express {
  const sequelize = testSequelize();
  const config = testConfig(overrides);
  const sessionStore = createSessionStore(sequelize, config.sessionMaxAgeMs);
  stores.push(sessionStore);
  return createApp({
    config,
    logger: createLogger("silent"),
    sequelize,
    sessionStore,
    mailer: deps.mailer ?? testMailer,
    mailCatcher: config.mail.useCatcher ? testMailCatcher() : undefined,
    storage: deps.storage ?? testStorage(),
    payments: deps.payments,
  });
}

export interface TestPayments {
  fake: PaymentFake;
  stripe: PaymentClient;
  config: PaymentConfig;
}

let payments: Promise<TestPayments> | null = null;

/**
 * This test file's local payment fake (port 0, short webhook retries) and an SDK client pointed at it.
 * Its webhooks go nowhere until `fake.setWebhookUrl(...)` names a listening app (see listenTestApp).
 */
export function testPayments(): Promise<TestPayments> {
  return (payments ??= (async () => {
    const fake = await startPaymentFake({
      port: 0,
      webhookSecret: LOCAL_FAKE_WEBHOOK_SECRET,
      apiKey: LOCAL_FAKE_SECRET_KEY,
      webhookRetryDelaysMs: [50, 200],
    });
    const stripe = createPaymentClient({ secretKey: LOCAL_FAKE_SECRET_KEY, fakeHost: { host: "127.0.0.1", port: fake.port, protocol: "http" } });
    const config: PaymentConfig = { useFake: true, secretKey: LOCAL_FAKE_SECRET_KEY, webhookSecret: LOCAL_FAKE_WEBHOOK_SECRET, fake: { host: "127.0.0.1", port: fake.port } };
    return { fake, stripe, config };
  })());
}

const listening: Server[] = [];

/** Listens on 127.0.0.1:0 (so the payment fake can POST webhooks to it); closed by stopTestStores. */
export async function listenTestApp(app: Express): Promise<{ url: string; server: Server }> {
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(0, "127.0.0.1", () => resolve(s));
    s.on("error", reject);
  });
  listening.push(server);
  const addr = server.address();
  const port = typeof addr === "object" && addr ? addr.port : 0;
  return { url: `http://127.0.0.1:${port}`, server };
}

export function stopTestStores(): void {
  for (const s of stores.splice(0)) s.stopExpiringSessions();
  for (const s of listening.splice(0)) {
    s.close();
    s.closeAllConnections();
  }
  if (payments) void payments.then((p) => p.fake.close()).catch(() => undefined);
  payments = null;
  smtp?.mailer.close?.();
  smtp = null;
  void catcher?.close();
  catcher = null;
  if (storage) rmSync(storage.dir, { recursive: true, force: true });
  storage = null;
}
