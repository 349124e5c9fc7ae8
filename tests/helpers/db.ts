import type { Sequelize } from "sequelize";
import { loadConfig } from "../../server/config";
import { createSequelize } from "../../server/db/sequelize";
import { initModels } from "../../server/models/index";

let sequelize: Sequelize | null = null;

/** One Sequelize per test file (vitest isolates modules per file). */
export function testSequelize(): Sequelize {
  if (!sequelize) {
    sequelize = createSequelize(loadConfig().db);
    initModels(sequelize);
  }
  return sequelize;
}

export async function closeTestSequelize(): Promise<void> {
  await sequelize?.close();
  sequelize = null;
}

/** Empties every table but the migration record. */
export async function truncateAll(): Promise<void> {
  const db = testSequelize();
  const [rows] = await db.query(
    "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name <> 'schema_migrations'",
  );
  await db.transaction(async (transaction) => {
    await db.query("SET FOREIGN_KEY_CHECKS = 0", { transaction });
    for (const { name } of rows as Array<{ name: string }>) await db.query(`TRUNCATE TABLE \`${name}\``, { transaction });
    await db.query("SET FOREIGN_KEY_CHECKS = 1", { transaction });
  });
}

/** Row count of a table, for "changed nothing" checks. */
export async function countRows(table: string): Promise<number> {
  const [rows] = await testSequelize().query(`SELECT COUNT(*) AS n FROM \`${table}\``);
  return Number((rows as Array<{ n: number | bigint }>)[0].n);
}
