import { startLocalMariaDb, type LocalDb } from "../../scripts/lib/mariadb";
import { resetTestDatabase } from "./test-db";

let db: LocalDb | null = null;

/**
 * `npm test` starts the test database and passes DB_* in the environment. When vitest is run on its
 * own, start the same test instance here so `npx vitest --project server` also works.
 */
export async function setup() {
  if (process.env.DB_PORT && process.env.NODE_ENV === "test") return;
  db = await startLocalMariaDb({
    base: process.env.TEST_DB_DIR ?? ".test-data/mariadb",
    port: Number(process.env.TEST_DB_PORT ?? 3317),
    database: "ridgewright_test",
    user: "app_test",
    log: () => {},
  });
  Object.assign(process.env, {
    NODE_ENV: "test",
    DB_HOST: db.host,
    DB_PORT: String(db.port),
    DB_NAME: db.database,
    DB_USER: db.user,
    DB_PASSWORD: db.password,
    BCRYPT_ROUNDS: "4",
    LOG_LEVEL: "silent",
  });
  await resetTestDatabase(process.env);
}

export async function teardown() {
  await db?.stop();
}
