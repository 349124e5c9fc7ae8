/**
 * The object-storage driver: each key is an object in one bucket of an S3-compatible service (the hosted
 * one, or a self-hosted one named by its endpoint). With it, every server process behind a load balancer
 * sees the same uploads, which the disk driver only does on a shared file system.
 */
import type { Readable } from "node:stream";
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  PutObjectCommand,
  S3Client,
  type S3ClientConfig,
} from "@aws-sdk/client-s3";
import { isStorageKey, type Storage } from "./storage";

export interface S3StorageOptions {
  bucket: string;
  /** The service's URL (e.g. http://127.0.0.1:9000 for a self-hosted one); unset = the hosted service. */
  endpoint?: string;
  region: string;
  /** Unset = the SDK's usual credential chain (environment, shared config, instance role). */
  credentials?: { accessKeyId: string; secretAccessKey: string };
  /** `endpoint/bucket/key` URLs instead of `bucket.endpoint/key` (most self-hosted services need it). */
  forcePathStyle?: boolean;
  /** Prepended to every key inside the bucket, e.g. "uploads/" (default none). */
  keyPrefix?: string;
}

const notFound = (key: string) =>
  Object.assign(new Error(`Stored file not found: ${key}`), { code: "ENOENT" as const });

const isMissing = (err: unknown): boolean => {
  const e = err as { name?: string; Code?: string; $metadata?: { httpStatusCode?: number } };
  return e?.name === "NoSuchKey" || e?.name === "NotFound" || e?.Code === "NoSuchKey" || e?.$metadata?.httpStatusCode === 404;
};

const checkKey = (key: string) => {
  if (!isStorageKey(key)) throw new Error(`Invalid storage key: ${JSON.stringify(key).slice(0, 80)}`);
};

/** S3-compatible driver with the same contract as the disk driver (generated keys only, ENOENT when missing). */
export function createS3Storage(options: S3StorageOptions): Storage & { client: S3Client; bucket: string } {
  const config: S3ClientConfig = {
    region: options.region,
    endpoint: options.endpoint,
    forcePathStyle: options.forcePathStyle ?? false,
    credentials: options.credentials,
    // Checksums only where the API requires them: several S3-compatible services reject the SDK's newer
    // default (CRC32 trailers on every upload). TLS and the service's own MD5/ETag checks still apply.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  };
  const client = new S3Client(config);
  const { bucket } = options;
  const prefix = options.keyPrefix ?? "";
  const objectKey = (key: string) => {
    checkKey(key);
    return prefix + key;
  };

  return {
    client,
    bucket,
    async put(key, buf, contentType) {
      // One PUT: the object appears whole or not at all, like the disk driver's rename.
      await client.send(
        new PutObjectCommand({ Bucket: bucket, Key: objectKey(key), Body: buf, ContentType: contentType, ContentLength: buf.length }),
      );
    },
    async get(key) {
      const k = objectKey(key);
      try {
        const out = await client.send(new GetObjectCommand({ Bucket: bucket, Key: k }));
        if (!out.Body) throw notFound(key);
        return out.Body as Readable; // in Node the body is a readable stream (http.IncomingMessage)
      } catch (err) {
        if (isMissing(err)) throw notFound(key);
        throw err;
      }
    },
    async delete(key) {
      // Deleting a missing object succeeds in S3, as a missing file is no error for the disk driver.
      await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: objectKey(key) }));
    },
    async exists(key) {
      if (!isStorageKey(key)) return false;
      try {
        await client.send(new HeadObjectCommand({ Bucket: bucket, Key: prefix + key }));
        return true;
      } catch (err) {
        if (isMissing(err)) return false;
        throw err; // an outage is not "no such file"
      }
    },
  };
}
