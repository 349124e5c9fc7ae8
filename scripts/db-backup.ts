/**
 * `npm run db:backup [file]`: a consistent dump of the app's database with mariadb-dump
 * (--single-transaction: InnoDB tables are read at one point in time while the app keeps running),
 * gzip-compressed, to backups/<database>-<UTC time>.sql.gz by default. Uploaded files live in
 * STORAGE_DIR and are backed up separately (copy the folder). Safe to run twice: each run writes a new file.
 */
import { spawn } from "node:child_process";
import { createWriteStream, existsSync, mkdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { createGzip } from "node:zlib";
import { pipeline } from "node:stream/promises";
import { z } from "zod";
import { loadDotEnv } from "./lib/env";
import { loadConfig } from "../server/config";

loadDotEnv();
const config = loadConfig();
const dbDir = process.env.DB_DIR ?? ".data/mariadb";
const password =
  config.db.password || (existsSync(path.join(dbDir, "app-password")) ? readFileSync(path.join(dbDir, "app-password"), "utf8").trim() : "");
const stamp = new Date().toISOString().replace(/[:.]/g, "-");
const file = z
  .string()
  .min(1)
  .default(`backups/${config.db.database}-${stamp}.sql.gz`)
  .parse(process.argv[2]);
mkdirSync(path.dirname(file), { recursive: true });

const dump = spawn(
  "mariadb-dump",
  [
    `--host=${config.db.host}`,
    `--port=${config.db.port}`,
    `--user=${config.db.user}`,
    "--single-transaction",
    "--routines",
    "--triggers",
    "--default-character-set=utf8mb4",
    config.db.database,
  ],
  { env: { ...process.env, MYSQL_PWD: password }, stdio: ["ignore", "pipe", "inherit"] },
);
const done = new Promise<number>((resolve) => dump.on("exit", (code) => resolve(code ?? 1)));
await pipeline(dump.stdout, createGzip(), createWriteStream(file));
const code = await done;
if (code !== 0) {
  console.error(`mariadb-dump failed with exit code ${code}; ${file} is incomplete`);
  process.exit(1);
}
console.log(`Backed up ${config.db.database} to ${file}`);
