import { loadConfig } from "../../server/config";
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
