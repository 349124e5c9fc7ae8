/**
 * `npm run demo:reset`: puts the demo data back as new, also while the app is running, and signs everyone out.
 *
 * 1. Finds the demo companies by the demo users' e-mails (nothing else is touched).
 * 2. In one transaction, deletes every row of those companies: each table with a company_id column, and the
 *    tables that hang off them through foreign keys (quote lines under options under revisions, price history
 *    under items…), children before parents, found from the database's own foreign keys.
 * 3. Migrates (so new tables exist) and seeds the demo again (seedDemo, the same as the first `npm start`).
 * 4. Deletes every session row: everyone signed in is signed out.
 *
 * Safe to run twice. Connects like scripts/migrate.ts: .env, DB_* or DATABASE_URL, else the local server in
 * DB_DIR (default .data/mariadb) with its generated app password.
 */
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { QueryTypes, type Sequelize, type Transaction } from "sequelize";
import { loadDotEnv } from "./lib/env";
import { loadConfig } from "../server/config";
import { createSequelize } from "../server/db/sequelize";
import { createMigrator } from "../server/db/migrator";
import { initModels } from "../server/models/index";
import { DEMO_USERS, SECOND_COMPANY_USERS, seedDemo } from "../server/db/seeders/demo";

loadDotEnv();
const config = loadConfig();
if (!process.env.DB_PASSWORD && !process.env.DATABASE_URL) {
  const file = path.join(process.env.DB_DIR ?? ".data/mariadb", "app-password");
  if (existsSync(file)) config.db.password = readFileSync(file, "utf8").trim();
}

const q = (name: string) => `\`${name.replace(/`/g, "``")}\``;

interface Fk {
  table: string;
  column: string;
  refTable: string;
  refColumn: string;
}

/**
 * For each table holding rows of the given companies, the WHERE that picks them, in the order to delete
 * them (children first). Tables reach a company through a company_id column or through a foreign key to a
 * table that does.
 */
async function plan(sequelize: Sequelize, companyIds: number[], t: Transaction): Promise<Array<{ table: string; where: string }>> {
  const ids = companyIds.map(Number).join(",");
  const tables = (
    await sequelize.query<{ name: string }>(
      "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE'",
      { type: QueryTypes.SELECT, transaction: t },
    )
  ).map((r) => r.name);
  const withCompany = new Set(
    (
      await sequelize.query<{ name: string }>(
        "SELECT table_name AS name FROM information_schema.columns WHERE table_schema = DATABASE() AND column_name = 'company_id'",
        { type: QueryTypes.SELECT, transaction: t },
      )
    ).map((r) => r.name),
  );
  const fks = await sequelize.query<Fk>(
    `SELECT table_name AS \`table\`, column_name AS \`column\`, referenced_table_name AS refTable, referenced_column_name AS refColumn
       FROM information_schema.key_column_usage
      WHERE table_schema = DATABASE() AND referenced_table_name IS NOT NULL`,
    { type: QueryTypes.SELECT, transaction: t },
  );
  const where = new Map<string, string>();
  const order: string[] = [];
  where.set("companies", `id IN (${ids})`);
  order.push("companies");
  for (const name of tables) {
    if (name !== "companies" && withCompany.has(name)) {
      where.set(name, `company_id IN (${ids})`);
      order.push(name);
    }
  }
  // Tables without company_id, reached through a foreign key to a table already planned (repeat to a fixpoint).
  for (let changed = true; changed; ) {
    changed = false;
    for (const fk of fks) {
      if (where.has(fk.table) || !where.has(fk.refTable) || fk.table === "schema_migrations" || fk.table === "sessions") continue;
      where.set(fk.table, `${q(fk.column)} IN (SELECT ${q(fk.refColumn)} FROM ${q(fk.refTable)} WHERE ${where.get(fk.refTable)})`);
      order.push(fk.table);
      changed = true;
    }
  }
  // Delete in reverse order of discovery: a child's WHERE reads its parent's rows, so children go first;
  // foreign-key checks are off inside the transaction, so the order between sibling tables does not matter.
  return order.reverse().map((table) => ({ table, where: where.get(table)! }));
}

async function main() {
  const sequelize = createSequelize(config.db);
  initModels(sequelize);
  try {
    await sequelize.authenticate();
  } catch (err) {
    console.error(`Cannot reach the database (${config.db.host}:${config.db.port}/${config.db.database}): ${(err as Error).message}`);
    console.error("Start the app once with `npm start` (it starts the local MariaDB), or set DB_* / DATABASE_URL.");
    process.exit(1);
  }
  const migrated = await createMigrator(sequelize).up();
  if (migrated.length) console.log(`Applied ${migrated.length} migration(s).`);

  const emails = [...DEMO_USERS, ...SECOND_COMPANY_USERS].map((u) => u.email);
  const companies = (
    await sequelize.query<{ id: number }>("SELECT DISTINCT company_id AS id FROM users WHERE email IN (?)", {
      replacements: [emails],
      type: QueryTypes.SELECT,
    })
  ).map((r) => Number(r.id));

  if (companies.length) {
    const deleted = await sequelize.transaction(async (t) => {
      const steps = await plan(sequelize, companies, t);
      const counts: Array<[string, number]> = [];
      await sequelize.query("SET FOREIGN_KEY_CHECKS = 0", { transaction: t });
      try {
        for (const { table, where } of steps) {
          const [res] = (await sequelize.query(`DELETE FROM ${q(table)} WHERE ${where}`, { transaction: t })) as unknown as [{ affectedRows?: number }];
          counts.push([table, Number(res?.affectedRows ?? 0)]);
        }
      } finally {
        await sequelize.query("SET FOREIGN_KEY_CHECKS = 1", { transaction: t });
      }
      return counts;
    });
    console.log(`Removed the demo companies (ids ${companies.join(", ")}):`);
    for (const [table, n] of deleted) if (n > 0) console.log(`  ${table.padEnd(28)} ${n} row(s)`);
  } else {
    console.log("No demo companies found; seeding them new.");
  }

  const seeded = await seedDemo(sequelize, { bcryptRounds: config.bcryptRounds });
  console.log(seeded ? "Seeded the demo data again." : "The demo users already exist (another seed ran at the same time); left as they are.");
  const [sessions] = (await sequelize.query("DELETE FROM sessions")) as unknown as [{ affectedRows?: number }];
  console.log(`Signed everyone out (${Number(sessions?.affectedRows ?? 0)} session(s) removed).`);
  await sequelize.close();
}

await main();
