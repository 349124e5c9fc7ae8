import { loadConfig } from "../../server/config";
import { startLocalMariaDb, type LocalDb } from "../../scripts/lib/mariadb";
import { createSequelize } from "../../server/db/sequelize";
import { createMigrator } from "../../server/db/migrator";

/** Drops and recreates the test database, then applies every migration. */
export async function resetTestDatabase(env: NodeJS.ProcessEnv): Promise<void> {
  const config = loadConfig(env);
  const admin = createSequelize({ ...config.db, database: "" });
  await admin.query(`DROP DATABASE IF EXISTS \`${config.db.database}\``);
  await admin.query(`CREATE DATABASE \`${config.db.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.close();
  const sequelize = createSequelize(config.db);
  await createMigrator(sequelize).up();
  await sequelize.close();
}

/** The test MariaDB instance (its own folder and port, apart from the dev data). */
export const startTestMariaDb = (log?: (m: string) => void) =>
  startLocalMariaDb({
    base: process.env.TEST_DB_DIR ?? ".test-data/mariadb",
    port: Number(process.env.TEST_DB_PORT ?? 3317),
    database: "ridgewright_test",
    user: "app_test",
    log,
  });

/** The environment every test process gets: the test database and fast, quiet settings. */
export const testEnv = (db: Pick<LocalDb, "host" | "port" | "database" | "user" | "password">): Record<string, string> => ({
  NODE_ENV: "test",
  DB_HOST: db.host,
  DB_PORT: String(db.port),
  DB_NAME: db.database,
  DB_USER: db.user,
  DB_PASSWORD: db.password,
  BCRYPT_ROUNDS: "4",
  LOG_LEVEL: "silent",
});
