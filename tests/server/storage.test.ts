import { afterAll, describe, expect, it } from "vitest";
import { mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { createDiskStorage, isStorageKey, newStorageKey } from "../../server/storage/storage";

const dir = mkdtempSync(path.join(tmpdir(), "rw-storage-unit-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("disk storage", () => {
  const storage = createDiskStorage(path.join(dir, "files"));

  it("puts, reads, checks and deletes a file under a generated key", async () => {
    const key = newStorageKey(42);
    expect(key).toMatch(/^42\/[0-9a-f-]{36}$/);
    expect(await storage.exists(key)).toBe(false);
    await storage.put(key, Buffer.from("hello"), "text/plain");
    expect(await storage.exists(key)).toBe(true);
    const body = await storage.get(key);
    const chunks: Buffer[] = [];
    for await (const c of body as AsyncIterable<Buffer>) chunks.push(c);
    expect(Buffer.concat(chunks).toString()).toBe("hello");
    await storage.put(`${key}-thumb`, Buffer.from("t"), "image/jpeg");
    expect(readdirSync(path.join(dir, "files", "42")).sort()).toEqual([key.split("/")[1], `${key.split("/")[1]}-thumb`].sort());
    await storage.delete(key);
    expect(await storage.exists(key)).toBe(false);
    await expect(storage.delete(key)).resolves.toBeUndefined(); // deleting twice is fine
    await expect(storage.get(key)).rejects.toMatchObject({ code: "ENOENT" });
  });

  it.each([
    "../etc/passwd",
    "1/../../etc/passwd",
    "/etc/passwd",
    "1/roof.png",
    "1\\..\\x",
    "1/00000000-0000-0000-0000-000000000000/../x",
    "1/00000000-0000-0000-0000-000000000000-../x",
    "",
  ])("refuses a key that is not a generated one: %j", async (key) => {
    expect(isStorageKey(key)).toBe(false);
    await expect(storage.put(key, Buffer.from("x"), "text/plain")).rejects.toThrow(/Invalid storage key/);
    await expect(storage.get(key)).rejects.toThrow(/Invalid storage key/);
    await expect(storage.delete(key)).rejects.toThrow(/Invalid storage key/);
    expect(await storage.exists(key)).toBe(false);
  });
});
