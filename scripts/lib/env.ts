import { existsSync } from "node:fs";

/** Loads `.env` when present (Node's own parser); variables already set win. */
export function loadDotEnv(file = ".env"): void {
  if (existsSync(file)) process.loadEnvFile(file);
}
