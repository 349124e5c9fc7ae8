import { Umzug, SequelizeStorage } from "umzug";
import { QueryTypes, type QueryInterface, type Sequelize } from "sequelize";
import { migrations } from "./migrations/index";

export type MigrationContext = QueryInterface;

/**
 * Migrations are listed explicitly in migrations/index.ts (in file-name order), so the same list runs
 * under tsx, vitest and a bundled server without a TypeScript loader for umzug's glob.
 */
export function createMigrator(sequelize: Sequelize, log: boolean = false) {
  return new Umzug<MigrationContext>({
    migrations: migrations.map((m) => ({
      name: m.name,
      up: ({ context }) => m.up(context),
      down: ({ context }) => m.down(context),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: "schema_migrations" }),
    logger: log ? console : undefined,
  });
}

/** How long a starting server waits for another process's start-up work (migrations, demo seed). */
const STARTUP_LOCK_WAIT_S = 300;

/**
 * Runs `fn` under a named lock of the database server (GET_LOCK, one per database), so several processes
 * starting at once take turns: the first migrates (and seeds), the others then find nothing to do.
 * Without it two servers starting together on a new schema both run the same DDL and one of them fails.
 * GET_LOCK is per server node: on a Galera cluster point every server's start-up at the same node, or run
 * `npm run db:migrate` once before starting them.
 */
export async function withStartupLock<T>(sequelize: Sequelize, fn: () => Promise<T>): Promise<T> {
  // The transaction only pins one pooled connection: the lock belongs to it, while `fn` uses the others.
  // A pool of one connection (DB_POOL_MAX=1) has no other: then `fn` runs without the lock.
  if ((sequelize.config.pool?.max ?? 10) < 2) return fn();
  return sequelize.transaction(async (transaction) => {
    const [row] = await sequelize.query<{ got: number | null }>("SELECT GET_LOCK(CONCAT('ridgewright-startup:', DATABASE()), ?) AS got", {
      replacements: [STARTUP_LOCK_WAIT_S],
      type: QueryTypes.SELECT,
      transaction,
    });
    if (Number(row?.got) !== 1) throw new Error(`Another process has held the start-up lock for more than ${STARTUP_LOCK_WAIT_S} s`);
    try {
      return await fn();
    } finally {
      await sequelize.query("SELECT RELEASE_LOCK(CONCAT('ridgewright-startup:', DATABASE()))", { type: QueryTypes.SELECT, transaction });
    }
  });
}

/** Applies the pending migrations under the start-up lock. */
export const migrateWithLock = (sequelize: Sequelize, log: boolean = false) => withStartupLock(sequelize, () => createMigrator(sequelize, log).up());
