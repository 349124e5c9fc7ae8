import type { Sequelize } from "sequelize";
import { hasExternalDatabase, loadConfig, type Config } from "../../server/config";
import { createSequelize } from "../../server/db/sequelize";
import { createMigrator } from "../../server/db/migrator";
import { initModels } from "../../server/models/index";
import { startLocalMariaDb, type LocalDb } from "./mariadb";

export interface BenchDatabase {
  /** The app's configuration with `db` pointing at the new database. */
  config: Config;
  sequelize: Sequelize;
  /** Closes the connection, and stops the local MariaDB when this run started it. */
  close(): Promise<void>;
}

/**
 * A new, migrated database `<DB_NAME>_<suffix>` for a benchmark, made new on every run and never the demo
 * database: on the local MariaDB as `npm start` runs it (DB_DIR, DB_PORT; started when it is not running) unless
 * DATABASE_URL or DB_HOST names another server.
 */
export async function freshBenchDatabase(suffix: string, poolMax: number, log: (m: string) => void = console.log): Promise<BenchDatabase> {
  let localDb: LocalDb | null = null;
  if (!hasExternalDatabase()) {
    localDb = await startLocalMariaDb({
      base: process.env.DB_DIR ?? ".data/mariadb",
      port: Number(process.env.DB_PORT ?? 3307),
      database: process.env.DB_NAME ?? "ridgewright",
      user: process.env.DB_USER ?? "app",
      log,
    });
    Object.assign(process.env, { DB_HOST: localDb.host, DB_PORT: String(localDb.port), DB_NAME: localDb.database, DB_USER: localDb.user, DB_PASSWORD: localDb.password });
  }
  const base = loadConfig();
  const name = `${base.db.database}_${suffix}`;
  if (!/^[A-Za-z0-9_]+$/.test(name)) throw new Error(`Unusable database name ${name}`);
  const admin = createSequelize({ ...base.db });
  await admin.query(`DROP DATABASE IF EXISTS \`${name}\``);
  await admin.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.close();
  log(`Benchmark database ${name} created (the demo database ${base.db.database} is not touched).`);
  const config: Config = { ...base, db: { ...base.db, database: name, poolMax: Math.max(base.db.poolMax, poolMax) } };
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  await createMigrator(sequelize).up();
  return {
    config,
    sequelize,
    async close() {
      await sequelize.close();
      if (localDb?.started) await localDb.stop();
    },
  };
}
