import type { LocalDb } from "../../scripts/lib/mariadb";
import { resetTestDatabase, startTestMariaDb, testEnv } from "./test-db";

let db: LocalDb | null = null;

/**
 * `npm test` starts the test database and passes DB_* in the environment. When vitest is run on its
 * own, start the same test instance here so `npx vitest --project server` also works.
 */
export async function setup() {
  if (process.env.DB_PORT && process.env.NODE_ENV === "test") return;
  db = await startTestMariaDb(() => {});
  Object.assign(process.env, testEnv(db));
  await resetTestDatabase(process.env);
}

export async function teardown() {
  await db?.stop();
}
