import path from "node:path";
import type { Config } from "../config";
import { createDiskStorage, type Storage } from "./storage";
import { createS3Storage } from "./s3-storage";

/**
 * The storage driver the configuration names: STORAGE_DRIVER=disk (STORAGE_DIR, relative to `baseDir`)
 * or s3 (S3_BUCKET on S3_ENDPOINT or the hosted service).
 */
export function createStorage(config: Pick<Config, "storage" | "uploads">, baseDir: string = process.cwd()): Storage {
  if (config.storage.driver === "s3") {
    if (!config.storage.s3) throw new Error("STORAGE_DRIVER=s3 needs the S3_* settings");
    return createS3Storage(config.storage.s3);
  }
  return createDiskStorage(path.resolve(baseDir, config.uploads.storageDir));
}
