import { Umzug, SequelizeStorage } from "umzug";
import type { QueryInterface, Sequelize } from "sequelize";
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
