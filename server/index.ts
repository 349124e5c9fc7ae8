import type { Server } from "node:http";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { loadConfig, type Config } from "./config";
import { createLogger, type Logger } from "./logger";
import { createSequelize } from "./db/sequelize";
import { createMigrator, withStartupLock } from "./db/migrator";
import { initModels } from "./models/index";
import { createSessionStore } from "./session-store";
import { createApp } from "./app";
import { seedDemo } from "./db/seeders/demo";
import { createSmtpMailer } from "./mail/mailer";
import type { MailCatcher } from "./mail/catcher";
import { OutboxWorker } from "./services/outbox.service";
import { createStorage } from "./storage/create-storage";
import type { PaymentFake } from "./fakes/payment-fake";
import { createPaymentClient } from "./payments/stripe-client";
import { startProposalScheduler } from "./services/proposal-scheduler";
import { shutdownRateLimitStores } from "./middleware/rate-limit-store";

export interface RunningServer {
  server: Server;
  url: string;
  /** The local mail catcher when no SMTP_URL is set (its inbox is at /dev/mail). */
  mailCatcher?: MailCatcher;
  /** The local test payment service when PAYMENTS_USE_FAKE (the default without real keys). */
  paymentFake?: PaymentFake;
  close(): Promise<void>;
}

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

/** The only place that listens: config → db → migrations → (demo seed) → createApp().listen(). */
export async function startServer(config: Config = loadConfig(), logger: Logger = createLogger(config.logLevel)): Promise<RunningServer> {
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  await sequelize.authenticate();
  // Servers starting together take turns: one migrates (and seeds), the others find it done.
  const { migrated, seeded } = await withStartupLock(sequelize, async () => ({
    migrated: await createMigrator(sequelize).up(),
    seeded: config.seedDemo ? await seedDemo(sequelize, { bcryptRounds: config.bcryptRounds }) : false,
  }));
  if (migrated.length) logger.info(`applied ${migrated.length} migration(s)`);
  if (seeded) logger.info("demo data seeded");
  const sessionStore = createSessionStore(sequelize, config.sessionMaxAgeMs);
  // E-mail: a real SMTP server (SMTP_URL), else the local catcher in this process (kept in MAIL_CATCHER_DIR, .data/mail by default).
  let mailCatcher: MailCatcher | undefined;
  if (config.mail.useCatcher) {
    try {
      // Loaded only when used: with SMTP_URL set, smtp-server and mailparser are never needed.
      const { startMailCatcher } = await import("./mail/catcher");
      mailCatcher = await startMailCatcher({
        port: config.mail.catcherPort,
        host: "127.0.0.1",
        dir: config.mail.catcherDir ? path.resolve(root, config.mail.catcherDir) : undefined,
      });
    } catch (err) {
      sessionStore.stopExpiringSessions();
      await sequelize.close();
      const busy = (err as { code?: string }).code === "EADDRINUSE";
      throw busy
        ? new Error(`The mail catcher's port ${config.mail.catcherPort} is in use: set MAIL_CATCHER_PORT (0 = any free port) or SMTP_URL`)
        : err;
    }
    if (config.env === "production") logger.warn("no SMTP_URL: e-mail goes to the local mail catcher, not to anyone's inbox");
  }
  const mailer = mailCatcher
    ? createSmtpMailer({ host: "127.0.0.1", port: mailCatcher.port }, { from: config.mail.from })
    : createSmtpMailer(config.mail.smtpUrl!, { from: config.mail.from });
  const outbox = new OutboxWorker({
    sequelize,
    mailer,
    logger,
    from: config.mail.from,
    pollMs: config.outbox.pollMs,
    maxAttempts: config.outbox.maxAttempts,
    tagForCatcher: Boolean(mailCatcher),
  });
  // STORAGE_DRIVER: a folder outside dist/ (never served statically), or an S3-compatible bucket.
  const storage = createStorage(config, root);
  // Payments: the local test payment service in this process (its webhooks come back to this app), or the hosted one.
  let paymentFake: PaymentFake | undefined;
  if (config.payments.useFake && config.payments.fake) {
    try {
      const { startPaymentFake } = await import("./fakes/payment-fake");
      paymentFake = await startPaymentFake({
        port: config.payments.fake.port,
        host: config.payments.fake.host,
        webhookSecret: config.payments.webhookSecret,
        apiKey: config.payments.secretKey,
        log: (m) => logger.debug(m),
      });
    } catch (err) {
      await mailCatcher?.close();
      sessionStore.stopExpiringSessions();
      await sequelize.close();
      const busy = (err as { code?: string }).code === "EADDRINUSE";
      throw busy ? new Error(`The payment fake's port ${config.payments.fake.port} is in use: set PAYMENT_FAKE_PORT (0 = any free port)`) : err;
    }
  }
  const stripe = createPaymentClient({
    secretKey: config.payments.secretKey,
    fakeHost: paymentFake ? { host: "127.0.0.1", port: paymentFake.port, protocol: "http" } : undefined,
  });
  const app = createApp({
    config,
    logger,
    sequelize,
    sessionStore,
    mailer,
    mailCatcher,
    clientDir: path.join(root, "dist"),
    storage,
    payments: { stripe, config: config.payments },
  });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.port, config.host, () => resolve(s));
    s.on("error", reject);
  }).catch(async (err) => {
    await mailCatcher?.close();
    await paymentFake?.close();
    throw err;
  });
  const addr = server.address();
  const port = typeof addr === "object" && addr ? addr.port : config.port;
  paymentFake?.setWebhookUrl(`http://127.0.0.1:${port}/api/payments/webhook`);
  outbox.start();
  const scheduler = startProposalScheduler({ sequelize, storage, logger, reminderDaysBefore: config.proposals.reminderDaysBefore }, config.proposals.schedulerMs);
  return {
    server,
    url: `http://localhost:${port}`,
    mailCatcher,
    paymentFake,
    async close() {
      sessionStore.stopExpiringSessions();
      await scheduler.stop();
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      await outbox.stop(); // lets a delivery in progress finish and record its outcome
      mailer.close?.();
      await mailCatcher?.close();
      await paymentFake?.close();
      shutdownRateLimitStores(sequelize);
      await sequelize.close();
    },
  };
}

// `tsx server/index.ts` runs the server on its own (the database must be reachable).
if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  startServer()
    .then((s) => {
      console.log(`Ridgewright is listening on ${s.url}`);
      const stop = () => s.close().then(() => process.exit(0));
      process.once("SIGINT", stop);
      process.once("SIGTERM", stop);
    })
    .catch((err) => {
      console.error(err);
      process.exit(1);
    });
}
