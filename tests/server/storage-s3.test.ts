/**
 * The S3-compatible storage driver against s3rver (a local S3 imitation, in this process, on a free port,
 * path-style URLs, signed requests), with the same behavioural checks as the disk driver, then an upload
 * and download through the attachments API with the S3 driver configured.
 */
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { randomBytes } from "node:crypto";
import S3rver from "s3rver";
import sharp from "sharp";
import { HeadObjectCommand, ListObjectsV2Command } from "@aws-sdk/client-s3";
import { createDiskStorage, newStorageKey, type Storage } from "../../server/storage/storage";
import { createS3Storage } from "../../server/storage/s3-storage";
import { createStorage } from "../../server/storage/create-storage";
import { loadConfig } from "../../server/config";
import { createTestApp } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { truncateAll } from "../helpers/db";
import { buildJob } from "../helpers/job-factories";
import { Attachment } from "../../server/models/index";

const BUCKET = "rw-uploads";
// s3rver checks request signatures against these fixed credentials.
const CREDENTIALS = { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" };
const dir = mkdtempSync(path.join(tmpdir(), "rw-s3-"));
let server: S3rver;
let endpoint: string;
let s3: ReturnType<typeof createS3Storage>;

beforeAll(async () => {
  server = new S3rver({ address: "127.0.0.1", port: 0, silent: true, directory: path.join(dir, "s3"), configureBuckets: [{ name: BUCKET }] });
  const { port } = await server.run();
  endpoint = `http://127.0.0.1:${port}`;
  s3 = createS3Storage({ bucket: BUCKET, endpoint, region: "us-east-1", credentials: CREDENTIALS, forcePathStyle: true });
});

afterAll(async () => {
  s3?.client.destroy();
  await server?.close();
  rmSync(dir, { recursive: true, force: true });
});

async function bytesOf(body: Buffer | NodeJS.ReadableStream): Promise<Buffer> {
  if (Buffer.isBuffer(body)) return body;
  const chunks: Buffer[] = [];
  for await (const c of body as AsyncIterable<Buffer | string>) chunks.push(Buffer.isBuffer(c) ? c : Buffer.from(c));
  return Buffer.concat(chunks);
}

const drivers: Array<[string, () => Storage]> = [
  ["disk", () => createDiskStorage(path.join(dir, "disk"))],
  ["s3", () => s3],
];

describe.each(drivers)("%s driver (shared behaviour)", (_name, make) => {
  it("puts, reads, checks and deletes a file under a generated key", async () => {
    const storage = make();
    const key = newStorageKey(42);
    expect(await storage.exists(key)).toBe(false);
    await storage.put(key, Buffer.from("hello"), "text/plain");
    expect(await storage.exists(key)).toBe(true);
    expect((await bytesOf(await storage.get(key))).toString()).toBe("hello");
    await storage.put(`${key}-thumb`, Buffer.from("t"), "image/jpeg");
    expect(await storage.exists(`${key}-thumb`)).toBe(true);
    await storage.delete(key);
    expect(await storage.exists(key)).toBe(false);
    expect(await storage.exists(`${key}-thumb`)).toBe(true); // only that key went
    await expect(storage.delete(key)).resolves.toBeUndefined(); // deleting twice is fine
    await storage.delete(`${key}-thumb`);
  });

  it("rejects get() of a key that is not stored with an ENOENT-coded error", async () => {
    const storage = make();
    await expect(storage.get(newStorageKey(7))).rejects.toMatchObject({ code: "ENOENT" });
  });

  it("round-trips binary bytes exactly (1 MiB of random data) and an empty file", async () => {
    const storage = make();
    const key = newStorageKey(3);
    const data = randomBytes(1024 * 1024);
    await storage.put(key, data, "application/octet-stream");
    expect(Buffer.compare(await bytesOf(await storage.get(key)), data)).toBe(0);
    const empty = newStorageKey(3);
    await storage.put(empty, Buffer.alloc(0), "text/plain");
    expect(await storage.exists(empty)).toBe(true);
    expect((await bytesOf(await storage.get(empty))).length).toBe(0);
  });

  it("a second put under the same key replaces the bytes", async () => {
    const storage = make();
    const key = newStorageKey(5);
    await storage.put(key, Buffer.from("first"), "text/plain");
    await storage.put(key, Buffer.from("second, longer"), "text/plain");
    expect((await bytesOf(await storage.get(key))).toString()).toBe("second, longer");
  });

  it.each(["../etc/passwd", "1/../../etc/passwd", "/etc/passwd", "1/roof.png", "1\\..\\x", "1/00000000-0000-0000-0000-000000000000/../x", ""])(
    "refuses a key that is not a generated one: %j",
    async (key) => {
      const storage = make();
      await expect(storage.put(key, Buffer.from("x"), "text/plain")).rejects.toThrow(/Invalid storage key/);
      await expect(storage.get(key)).rejects.toThrow(/Invalid storage key/);
      await expect(storage.delete(key)).rejects.toThrow(/Invalid storage key/);
      expect(await storage.exists(key)).toBe(false);
    },
  );
});

describe("s3 driver specifics", () => {
  it("stores the object under the key in the bucket with its content type (path-style requests)", async () => {
    const key = newStorageKey(9);
    await s3.put(key, Buffer.from("%PDF-1.4"), "application/pdf");
    const head = await s3.client.send(new HeadObjectCommand({ Bucket: BUCKET, Key: key }));
    expect(head.ContentType).toBe("application/pdf");
    expect(head.ContentLength).toBe(8);
  });

  it("puts keys under a prefix when one is configured, and nothing outside it", async () => {
    const prefixed = createS3Storage({ bucket: BUCKET, endpoint, region: "us-east-1", credentials: CREDENTIALS, forcePathStyle: true, keyPrefix: "tenant-a/" });
    const key = newStorageKey(11);
    await prefixed.put(key, Buffer.from("x"), "text/plain");
    const listed = await s3.client.send(new ListObjectsV2Command({ Bucket: BUCKET, Prefix: "tenant-a/" }));
    expect(listed.Contents?.map((o) => o.Key)).toEqual([`tenant-a/${key}`]);
    expect(await s3.exists(key)).toBe(false); // the unprefixed driver does not see it
    expect(await prefixed.exists(key)).toBe(true);
    prefixed.client.destroy();
  });

  it("reports an unreachable service as an error, not as a missing file", async () => {
    const down = createS3Storage({ bucket: BUCKET, endpoint: "http://127.0.0.1:9", region: "us-east-1", credentials: CREDENTIALS, forcePathStyle: true });
    const key = newStorageKey(1);
    await expect(down.exists(key)).rejects.toBeTruthy();
    const err = await down.get(key).catch((e: unknown) => e as { code?: string });
    expect(err).toBeTruthy();
    expect((err as { code?: string }).code).not.toBe("ENOENT");
    down.client.destroy();
  });

  it("a missing bucket is an error on put", async () => {
    const nowhere = createS3Storage({ bucket: "no-such-bucket", endpoint, region: "us-east-1", credentials: CREDENTIALS, forcePathStyle: true });
    await expect(nowhere.put(newStorageKey(1), Buffer.from("x"), "text/plain")).rejects.toMatchObject({ name: "NoSuchBucket" });
    nowhere.client.destroy();
  });
});

describe("configuration", () => {
  const base = { ...process.env, NODE_ENV: "test" };

  it("STORAGE_DRIVER=s3 with the S3_* settings picks the S3 driver; the default is the disk folder", () => {
    const config = loadConfig({
      ...base,
      STORAGE_DRIVER: "s3",
      S3_ENDPOINT: endpoint,
      S3_BUCKET: BUCKET,
      S3_REGION: "eu-west-2",
      S3_ACCESS_KEY_ID: "S3RVER",
      S3_SECRET_ACCESS_KEY: "S3RVER",
      S3_FORCE_PATH_STYLE: "1",
    });
    expect(config.storage).toEqual({
      driver: "s3",
      s3: { bucket: BUCKET, endpoint, region: "eu-west-2", forcePathStyle: true, credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" } },
    });
    const storage = createStorage(config) as ReturnType<typeof createS3Storage>;
    expect(storage.bucket).toBe(BUCKET);
    storage.client.destroy();
    const disk = loadConfig({ ...base, STORAGE_DRIVER: undefined, STORAGE_DIR: path.join(dir, "cfg") });
    expect(disk.storage).toEqual({ driver: "disk" });
    expect((createStorage(disk) as { dir?: string }).dir).toBe(path.join(dir, "cfg"));
  });

  it("refuses an S3 driver without a bucket, half a key pair, or a bad endpoint", () => {
    expect(() => loadConfig({ ...base, STORAGE_DRIVER: "s3" })).toThrow(/S3_BUCKET is required/);
    expect(() => loadConfig({ ...base, STORAGE_DRIVER: "s3", S3_BUCKET: "b", S3_ACCESS_KEY_ID: "x" })).toThrow(/both S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY/);
    expect(() => loadConfig({ ...base, STORAGE_DRIVER: "s3", S3_BUCKET: "b", S3_ENDPOINT: "not a url" })).toThrow(/S3_ENDPOINT/);
    expect(() => loadConfig({ ...base, STORAGE_DRIVER: "ftp" })).toThrow(/STORAGE_DRIVER/);
  });
});

describe("attachments API with the S3 driver", () => {
  beforeEach(truncateAll);

  it("uploads a photo into the bucket (file and thumbnail), serves both back, and deleting removes both objects", async () => {
    const app = createTestApp({}, { storage: s3 });
    const { agent, token, user } = await signedInAgent({ role: "estimator" }, app);
    const job = await buildJob({ companyId: user.companyId });
    const img = await sharp({ create: { width: 800, height: 600, channels: 3, background: { r: 150, g: 90, b: 60 } } }).jpeg().toBuffer();
    const res = await agent
      .post(`/api/jobs/${job.id}/attachments`)
      .set("X-CSRF-Token", token)
      .attach("file", img, { filename: "ridge.jpg", contentType: "image/jpeg" });
    expect(res.status).toBe(201);
    const a = res.body.data[0];
    expect(a).toMatchObject({ kind: "photo", mime: "image/jpeg", size: img.length, status: "ready" });

    const row = (await Attachment.findByPk(a.id))!;
    expect(row.storageKey.startsWith(`${user.companyId}/`)).toBe(true);
    const head = await s3.client.send(new HeadObjectCommand({ Bucket: BUCKET, Key: row.storageKey }));
    expect(head.ContentLength).toBe(img.length);
    expect(head.ContentType).toBe("image/jpeg");
    expect(await s3.exists(row.thumbKey!)).toBe(true);

    const file = await agent.get(a.fileUrl).buffer(true).expect(200);
    expect(Buffer.compare(file.body as Buffer, img)).toBe(0);
    expect(file.headers["content-type"]).toBe("image/jpeg");
    const thumb = await agent.get(a.thumbUrl).buffer(true).expect(200);
    const meta = await sharp(thumb.body as Buffer).metadata();
    expect([meta.format, Math.max(meta.width!, meta.height!)]).toEqual(["jpeg", 320]);

    await agent.delete(`/api/attachments/${a.id}`).set("X-CSRF-Token", token).expect(204);
    expect(await s3.exists(row.storageKey)).toBe(false);
    expect(await s3.exists(row.thumbKey!)).toBe(false);
  });

  it("a file missing from the bucket answers 404, like a missing file on disk", async () => {
    const app = createTestApp({}, { storage: s3 });
    const { agent, token, user } = await signedInAgent({ role: "owner" }, app);
    const job = await buildJob({ companyId: user.companyId });
    const res = await agent
      .post(`/api/jobs/${job.id}/attachments`)
      .set("X-CSRF-Token", token)
      .attach("file", Buffer.from("Gate code 4411."), "notes.txt")
      .expect(201);
    const a = res.body.data[0];
    const row = (await Attachment.findByPk(a.id))!;
    await s3.delete(row.storageKey);
    const gone = await agent.get(a.fileUrl);
    expect(gone.status).toBe(404);
    expect(gone.body.error.code).toBe("not_found");
  });
});
