/**
 * `npm run db:restore <file.sql.gz> -- --yes`: replaces the app's database with a dump made by
 * `npm run db:backup`. Stop the app first. Without --yes it only says what it would do.
 */
import { spawn } from "node:child_process";
import { createReadStream, existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { createGunzip } from "node:zlib";
import { pipeline } from "node:stream/promises";
import { z } from "zod";
import { loadDotEnv } from "./lib/env";
import { loadConfig } from "../server/config";
import { createSequelize } from "../server/db/sequelize";

loadDotEnv();
const args = process.argv.slice(2);
const file = z.string().min(1, "Name the dump file to restore").parse(args.find((a) => !a.startsWith("--")));
if (!existsSync(file)) throw new Error(`No such file: ${file}`);
const config = loadConfig();
const dbDir = process.env.DB_DIR ?? ".data/mariadb";
const password =
  config.db.password || (existsSync(path.join(dbDir, "app-password")) ? readFileSync(path.join(dbDir, "app-password"), "utf8").trim() : "");
if (!args.includes("--yes")) {
  console.log(`Would replace every table of ${config.db.database} on ${config.db.host}:${config.db.port} with ${file}. Stop the app, then add --yes.`);
  process.exit(0);
}
// Start from an empty database so tables that are not in the dump do not linger.
const admin = createSequelize({ ...config.db, password, database: "" });
await admin.query(`DROP DATABASE IF EXISTS \`${config.db.database}\``);
await admin.query(`CREATE DATABASE \`${config.db.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
await admin.close();
const client = spawn(
  "mariadb",
  [`--host=${config.db.host}`, `--port=${config.db.port}`, `--user=${config.db.user}`, "--default-character-set=utf8mb4", config.db.database],
  { env: { ...process.env, MYSQL_PWD: password }, stdio: ["pipe", "inherit", "inherit"] },
);
const done = new Promise<number>((resolve) => client.on("exit", (code) => resolve(code ?? 1)));
const source = createReadStream(file);
await pipeline(file.endsWith(".gz") ? source.pipe(createGunzip()) : source, client.stdin);
const code = await done;
if (code !== 0) {
  console.error(`mariadb failed with exit code ${code}; the database may be partly restored — restore again`);
  process.exit(1);
}
console.log(`Restored ${config.db.database} from ${file}`);
