/**
 * The fault drills' own MariaDB (.test-data/faults, port FAULTS_DB_PORT or 3344): the drills stop and
 * restart it, so nothing else may use it. The database is recreated and migrated on every run and the
 * demo data is seeded once (so the servers the drills start find it there and do not seed it themselves).
 * Its settings reach the test files through `inject("faultsDb")` (tests/faults/setup.ts puts them in
 * process.env of the test process only).
 */
import { spawnSync } from "node:child_process";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { startLocalMariaDb, type LocalDb } from "../../scripts/lib/mariadb";
import { createSequelize } from "../../server/db/sequelize";
import { createMigrator } from "../../server/db/migrator";
import { initModels } from "../../server/models/index";
import { seedDemo } from "../../server/db/seeders/demo";
import { loadConfig } from "../../server/config";
import { faultsDbOptions, type FaultsDb } from "./helpers/faults-db";

let db: LocalDb | null = null;

export async function setup(project: TestProject) {
  try {
    await start(project);
  } catch (err) {
    await teardown(); // vitest skips teardown when setup throws
    throw err;
  }
}

async function start(project: TestProject) {
  const opts = faultsDbOptions();
  db = await startLocalMariaDb({ ...opts, log: () => {} });
  const info: FaultsDb = {
    base: path.resolve(opts.base),
    host: db.host,
    port: db.port,
    database: db.database,
    user: db.user,
    password: db.password,
  };
  const env = {
    NODE_ENV: "test",
    DB_HOST: info.host,
    DB_PORT: String(info.port),
    DB_NAME: info.database,
    DB_USER: info.user,
    DB_PASSWORD: info.password,
    BCRYPT_ROUNDS: "4",
    LOG_LEVEL: "silent",
  };
  const config = loadConfig(env);
  const admin = createSequelize({ ...config.db, database: "" });
  await admin.query(`DROP DATABASE IF EXISTS \`${info.database}\``);
  await admin.query(`CREATE DATABASE \`${info.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  await admin.close();
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  await createMigrator(sequelize).up();
  await seedDemo(sequelize, { bcryptRounds: 4 });
  await sequelize.close();
  project.provide("faultsDb", info);
}

export async function teardown() {
  await db?.stop();
  db = null;
  // A drill may have restarted mariadbd from a test process: stop whatever runs on the folder.
  const cnf = path.resolve(faultsDbOptions().base, "my.cnf");
  const admin = ["/usr/bin/mariadb-admin", "/usr/local/bin/mariadb-admin"].find((p) => spawnSync("test", ["-x", p]).status === 0) ?? "mariadb-admin";
  if (spawnSync(admin, [`--defaults-file=${cnf}`, "-uroot", "status"], { stdio: "ignore" }).status === 0) {
    spawnSync(admin, [`--defaults-file=${cnf}`, "-uroot", "shutdown"], { stdio: "ignore" });
  }
}

declare module "vitest" {
  export interface ProvidedContext {
    faultsDb: FaultsDb;
  }
}
