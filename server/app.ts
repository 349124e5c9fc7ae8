import { configureEnginePool } from "./services/engine-pool";
import express, { type Express } from "express";
import session, { type Store } from "express-session";
import helmet from "helmet";
import { existsSync } from "node:fs";
import path from "node:path";
import type { Sequelize } from "sequelize";
import type { Config } from "./config";
import type { Logger } from "./logger";
import type { Mailer } from "./mail/mailer";
import type { MailCatcher } from "./mail/catcher";
import { createPassport, type UserPrefetch } from "./auth/passport";
import { csrfProtection } from "./middleware/csrf";
import { jsonBodyOnly } from "./middleware/json-body";
import { errorHandler } from "./middleware/error-handler";
import { notFoundHandler } from "./middleware/not-found";
import { apiRouter } from "./routes/index";
import { healthRouter } from "./routes/health.routes";
import { UsersService } from "./services/users.service";
import type { Storage } from "./storage/storage";
import { createStorage } from "./storage/create-storage";
import type { PaymentClient } from "./payments/stripe-client";
import type { PaymentConfig } from "./payments/config";
import { publicProposalsRouter } from "./routes/public-proposals.routes";
import { paymentsWebhookRouter } from "./routes/payments-webhook.routes";

export interface AppDeps {
  config: Config;
  logger: Logger;
  sequelize: Sequelize;
  sessionStore: Store;
  /** Sends e-mail now (the outbox worker uses it; request handlers enqueue instead). */
  mailer: Mailer;
  /** The local mail catcher, when it is in use (no SMTP_URL): read by /api/dev/mail. */
  mailCatcher?: MailCatcher;
  /** Built client to serve (dist/); omitted in API tests. */
  clientDir?: string;
  /** Uploaded files; defaults to the disk folder named by config.uploads.storageDir. */
  storage?: Storage;
  /** Deposits: the SDK client (pointed at the local fake or the hosted service) and its settings. */
  payments?: { stripe: PaymentClient; config: PaymentConfig };
}

export interface AppContext extends AppDeps {
  storage: Storage;
  passport: ReturnType<typeof createPassport>;
  services: { users: UsersService };
}

export const SESSION_COOKIE = "rw.sid";

/** Builds the Express app; never listens (server/index.ts does). */
export function createApp(deps: AppDeps): Express {
  const { config, logger } = deps;
  const store = deps.sessionStore as Partial<UserPrefetch>;
  const passport = createPassport(typeof store.takeUser === "function" ? (store as UserPrefetch) : undefined);
  const ctx: AppContext = {
    ...deps,
    storage: deps.storage ?? createStorage(config),
    passport,
    services: { users: new UsersService(deps.sequelize, config.bcryptRounds) },
  };

  configureEnginePool(config.engineWorkers);
  const app = express();
  app.disable("x-powered-by");
  // API answers are private and never reused (no-store below), so hashing every JSON body for an ETag is
  // work for nothing; static files keep their own ETags (express.static, sendFile).
  app.set("etag", false);
  if (config.trustProxy) app.set("trust proxy", 1);
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          "default-src": ["'self'"],
          "img-src": ["'self'", "data:", "blob:"],
          "style-src": ["'self'", "'unsafe-inline'"],
          "font-src": ["'self'", "data:"],
          "script-src": ["'self'"],
          "connect-src": ["'self'"],
          "frame-ancestors": ["'none'"],
          "form-action": ["'self'"],
          "upgrade-insecure-requests": config.env === "production" ? [] : null,
        },
      },
      // The policy's frame-ancestors 'none', for browsers that only read the older header.
      frameguard: { action: "deny" },
    }),
  );

  // Signed-in data (customers, prices) must not sit in browser or proxy caches; a route that serves a
  // cacheable file sets its own Cache-Control.
  app.use("/api", (_req, res, next) => {
    res.set("Cache-Control", "no-store");
    next();
  });

  // No session needed: health answers even when the session store cannot.
  app.use("/api/health", healthRouter(deps.sequelize));

  // No session either: the payment webhook (raw body, verified by signature) and the homeowner's token routes.
  app.use("/api/payments/webhook", paymentsWebhookRouter(ctx));
  app.use("/api", jsonBodyOnly); // 415 for a body that is neither JSON nor (on upload routes) multipart
  app.use("/api/proposals", express.json({ limit: "100kb" }), publicProposalsRouter(ctx));

  app.use("/api", express.json({ limit: "1mb" }));
  app.use(
    "/api",
    session({
      name: SESSION_COOKIE,
      secret: config.sessionSecret,
      store: deps.sessionStore,
      resave: false,
      saveUninitialized: false,
      cookie: {
        httpOnly: true,
        sameSite: "lax",
        secure: config.env === "production",
        maxAge: config.sessionMaxAgeMs,
      },
    }),
    passport.initialize(),
    passport.session(),
    csrfProtection,
  );
  app.use("/api", apiRouter(ctx), notFoundHandler);

  if (deps.clientDir && existsSync(path.join(deps.clientDir, "index.html"))) {
    const dir = deps.clientDir;
    app.use(express.static(dir, { index: false, maxAge: "1h" }));
    app.get("/{*splat}", (_req, res) => {
      res.set("Cache-Control", "no-cache").sendFile(path.join(dir, "index.html"));
    });
  }

  app.use(errorHandler(logger));
  return app;
}
