import type { Express } from "express";
import { loadConfig, type Config } from "../../server/config";
import { createLogger } from "../../server/logger";
import { createApp } from "../../server/app";
import { createSessionStore } from "../../server/session-store";
import { testSequelize } from "./db";

const stores: Array<ReturnType<typeof createSessionStore>> = [];

export function testConfig(overrides: Partial<Config> = {}): Config {
  return { ...loadConfig(), ...overrides };
}

/** The real app on the real test database, without listening. */
export function createTestApp(overrides: Partial<Config> = {}): Express {
  const sequelize = testSequelize();
  const config = testConfig(overrides);
  const sessionStore = createSessionStore(sequelize, config.sessionMaxAgeMs);
  stores.push(sessionStore);
  return createApp({ config, logger: createLogger("silent"), sequelize, sessionStore });
}

export function stopTestStores(): void {
  for (const s of stores.splice(0)) s.stopExpiringSessions();
}
