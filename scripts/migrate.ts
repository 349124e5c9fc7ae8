/** `npm run db:migrate` / `npm run db:rollback` against the configured database. */
import { z } from "zod";
import { loadDotEnv } from "./lib/env";
import { loadConfig } from "../server/config";
import { createSequelize } from "../server/db/sequelize";
import { createMigrator } from "../server/db/migrator";

loadDotEnv();
const direction = z.enum(["up", "down", "status"]).parse(process.argv[2] ?? "up");
const config = loadConfig();
if (!process.env.DB_PASSWORD && !process.env.DATABASE_URL) {
  // The local server's generated password lives beside its data folder.
  const { readFileSync, existsSync } = await import("node:fs");
  if (existsSync(".data/mariadb/app-password")) config.db.password = readFileSync(".data/mariadb/app-password", "utf8").trim();
}
const sequelize = createSequelize(config.db);
const migrator = createMigrator(sequelize);
if (direction === "up") {
  const done = await migrator.up();
  console.log(done.length ? `Applied: ${done.map((m) => m.name).join(", ")}` : "Nothing to apply");
} else if (direction === "down") {
  const done = await migrator.down();
  console.log(done.length ? `Reverted: ${done.map((m) => m.name).join(", ")}` : "Nothing to revert");
} else {
  console.log("Applied:", (await migrator.executed()).map((m) => m.name));
  console.log("Pending:", (await migrator.pending()).map((m) => m.name));
}
await sequelize.close();
