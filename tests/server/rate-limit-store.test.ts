/**
 * The MariaDB store behind every rate limiter: counts, windows, decrement/reset, key hashing and exact
 * counting under concurrency (the same key hit from many connections at once, as several server
 * processes would).
 */
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import express from "express";
import request from "supertest";
import { rateLimit } from "express-rate-limit";
import { Sequelize } from "sequelize";
import { SequelizeRateLimitStore, shutdownRateLimitStores } from "../../server/middleware/rate-limit-store";
import { RateLimitHit } from "../../server/models/rate-limit-hit.model";
import { createSequelize } from "../../server/db/sequelize";
import { loadConfig } from "../../server/config";
import { countRows, testSequelize, truncateAll } from "../helpers/db";

beforeEach(truncateAll);

const stores: SequelizeRateLimitStore[] = [];
afterEach(() => {
  for (const s of stores.splice(0)) s.shutdown();
});

function makeStore(prefix = "test", windowMs = 60_000, sequelize: Sequelize = testSequelize(), cleanupIntervalMs?: number) {
  const store = new SequelizeRateLimitStore({ sequelize, prefix, cleanupIntervalMs });
  store.init({ windowMs });
  stores.push(store);
  return store;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe("SequelizeRateLimitStore", () => {
  it("counts hits per key, with a reset time one window ahead, and get() reads without counting", async () => {
    const store = makeStore("test", 60_000);
    const before = Date.now();
    const first = await store.increment("1.2.3.4");
    expect(first.totalHits).toBe(1);
    // The window is measured on the database's clock; allow a little skew against this process's.
    expect(first.resetTime!.getTime()).toBeGreaterThan(before + 60_000 - 2_000);
    expect(first.resetTime!.getTime()).toBeLessThan(Date.now() + 60_000 + 2_000);
    expect((await store.increment("1.2.3.4")).totalHits).toBe(2);
    const third = await store.increment("1.2.3.4");
    expect(third.totalHits).toBe(3);
    expect(third.resetTime!.getTime()).toBe(first.resetTime!.getTime()); // the same window
    expect(await store.get("1.2.3.4")).toEqual({ totalHits: 3, resetTime: first.resetTime });
    expect(await store.get("1.2.3.4")).toMatchObject({ totalHits: 3 });
    expect((await store.increment("5.6.7.8")).totalHits).toBe(1); // another key counts apart
    expect(await store.get("9.9.9.9")).toBeUndefined();
    const row = await RateLimitHit.findByPk("test:1.2.3.4");
    expect(row?.hits).toBe(3);
  });

  it("starts a new window (count 1, new reset time) once the old one has ended, and get() ignores an ended one", async () => {
    const store = makeStore("short", 300);
    const a = await store.increment("k");
    await store.increment("k");
    expect((await store.get("k"))?.totalHits).toBe(2);
    await sleep(450);
    expect(await store.get("k")).toBeUndefined();
    const b = await store.increment("k");
    expect(b.totalHits).toBe(1);
    expect(b.resetTime!.getTime()).toBeGreaterThan(a.resetTime!.getTime());
    expect(await countRows("rate_limit_hits")).toBe(1); // the row was reused, not duplicated
  });

  it("decrement takes one hit back and never goes below zero", async () => {
    const store = makeStore();
    await store.increment("k");
    await store.increment("k");
    await store.decrement("k");
    expect((await store.get("k"))?.totalHits).toBe(1);
    await store.decrement("k");
    await store.decrement("k");
    expect((await store.get("k"))?.totalHits).toBe(0);
    await store.decrement("never-seen"); // no row: nothing to do, no error
    expect(await store.get("never-seen")).toBeUndefined();
    expect((await store.increment("k")).totalHits).toBe(1);
  });

  it("resetKey forgets one key; resetAll forgets this limiter's keys only", async () => {
    const login = makeStore("login");
    const forgot = makeStore("forgot");
    await login.increment("a");
    await login.increment("b");
    await forgot.increment("a");
    await login.resetKey("a");
    expect(await login.get("a")).toBeUndefined();
    expect((await login.get("b"))?.totalHits).toBe(1);
    expect((await forgot.get("a"))?.totalHits).toBe(1); // same client key, other limiter: untouched
    expect((await login.increment("a")).totalHits).toBe(1);
    await login.resetAll();
    expect(await login.get("a")).toBeUndefined();
    expect(await login.get("b")).toBeUndefined();
    expect((await forgot.get("a"))?.totalHits).toBe(1);
  });

  it("prefixes keep limiters apart; a prefix with LIKE wildcards does not reach other limiters", async () => {
    const under = makeStore("a_b");
    const other = makeStore("axb");
    await under.increment("k");
    await other.increment("k");
    expect((await under.increment("k")).totalHits).toBe(2);
    expect((await other.get("k"))?.totalHits).toBe(1);
    await under.resetAll();
    expect((await other.get("k"))?.totalHits).toBe(1);
    expect(() => new SequelizeRateLimitStore({ sequelize: testSequelize(), prefix: "bad prefix%" })).toThrow(/bad prefix/);
  });

  it("stores a long or non-ASCII key as its SHA-256 under the prefix, and still counts it exactly", async () => {
    const store = makeStore("login");
    const long = `203.0.113.9|${"x".repeat(300)}@example.com`;
    const unicode = "203.0.113.9|zoë@example.com";
    expect(store.rowKey("1.2.3.4|a@example.com")).toBe("login:1.2.3.4|a@example.com");
    expect(store.rowKey(long)).toMatch(/^login:sha256:[0-9a-f]{64}$/);
    expect(store.rowKey(unicode)).toMatch(/^login:sha256:[0-9a-f]{64}$/);
    expect(store.rowKey(long)).not.toBe(store.rowKey(`${long}y`));
    expect((await store.increment(long)).totalHits).toBe(1);
    expect((await store.increment(long)).totalHits).toBe(2);
    expect((await store.increment(unicode)).totalHits).toBe(1);
    expect(await countRows("rate_limit_hits")).toBe(2);
  });

  it("keys differing only in letter case are counted apart (binary key column)", async () => {
    const store = makeStore();
    await store.increment("AbC");
    expect((await store.increment("abc")).totalHits).toBe(1);
    expect((await store.get("AbC"))?.totalHits).toBe(1);
  });

  it("counts concurrent increments exactly: 60 at once from two connection pools, each sees a different count", async () => {
    // Two Sequelize instances = two servers' connection pools on the same database.
    const other = createSequelize(loadConfig().db);
    try {
      const a = makeStore("race", 60_000);
      const b = makeStore("race", 60_000, other);
      const results = await Promise.all(Array.from({ length: 60 }, (_, i) => (i % 2 ? a : b).increment("203.0.113.7")));
      const counts = results.map((r) => r.totalHits).sort((x, y) => x - y);
      expect(counts).toEqual(Array.from({ length: 60 }, (_, i) => i + 1));
      expect((await a.get("203.0.113.7"))?.totalHits).toBe(60);
      expect(new Set(results.map((r) => r.resetTime!.getTime())).size).toBe(1); // one window
      // Concurrent first hits on a key nobody has seen yet (the insert path) are exact too.
      const fresh = await Promise.all(Array.from({ length: 20 }, (_, i) => (i % 2 ? a : b).increment("fresh")));
      expect(fresh.map((r) => r.totalHits).sort((x, y) => x - y)).toEqual(Array.from({ length: 20 }, (_, i) => i + 1));
      // Decrements race the same way and all land.
      await Promise.all(Array.from({ length: 10 }, (_, i) => (i % 2 ? a : b).decrement("fresh")));
      expect((await b.get("fresh"))?.totalHits).toBe(10);
    } finally {
      shutdownRateLimitStores(other);
      await other.close();
    }
  });

  it("cleanup deletes this limiter's ended windows and keeps live ones and other limiters' rows", async () => {
    const short = makeStore("short", 200);
    const long = makeStore("long", 60_000);
    const otherShort = makeStore("other", 200);
    await short.increment("old");
    await otherShort.increment("old");
    await sleep(300);
    await short.increment("new");
    await long.increment("old");
    expect(await short.cleanup()).toBe(1);
    expect(await RateLimitHit.findByPk("short:old")).toBeNull();
    expect(await RateLimitHit.findByPk("short:new")).not.toBeNull();
    expect(await RateLimitHit.findByPk("long:old")).not.toBeNull();
    expect(await RateLimitHit.findByPk("other:old")).not.toBeNull(); // that limiter cleans its own
  });

  it("runs cleanup on its own timer until shutdown()", async () => {
    const store = makeStore("timed", 100, testSequelize(), 150);
    await store.increment("k");
    await sleep(500);
    expect(await countRows("rate_limit_hits")).toBe(0);
    store.shutdown();
    await store.increment("k");
    await sleep(400);
    expect(await countRows("rate_limit_hits")).toBe(1); // no timer any more
  });
});

describe("with express-rate-limit", () => {
  function limitedApp(store: SequelizeRateLimitStore, limit: number, extra: Partial<Parameters<typeof rateLimit>[0]> = {}) {
    const app = express();
    app.use(
      rateLimit({ windowMs: 60_000, limit, store, standardHeaders: "draft-8", legacyHeaders: false, ...extra }),
    );
    app.get("/", (_req, res) => res.send("ok"));
    app.get("/fail", (_req, res) => res.status(401).send("no"));
    return app;
  }

  it("two apps (two servers) with their own store instances share one limit", async () => {
    const a = limitedApp(new SequelizeRateLimitStore({ sequelize: testSequelize(), prefix: "shared" }), 4);
    const b = limitedApp(new SequelizeRateLimitStore({ sequelize: testSequelize(), prefix: "shared" }), 4);
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) statuses.push((await request(i % 2 ? b : a).get("/")).status);
    expect(statuses).toEqual([200, 200, 200, 200, 429, 429]);
    const res = await request(a).get("/");
    // draft-8 header from the store's count and reset time: 0 remaining, about a minute to go.
    const m = /^"4-in-1min"; r=(\d+); t=(\d+)$/.exec(String(res.headers.ratelimit));
    expect(m?.[1]).toBe("0");
    expect(Number(m?.[2])).toBeGreaterThanOrEqual(58);
    expect(Number(m?.[2])).toBeLessThanOrEqual(61);
    shutdownRateLimitStores(testSequelize());
  });

  it("skipSuccessfulRequests takes successes back through decrement", async () => {
    const store = new SequelizeRateLimitStore({ sequelize: testSequelize(), prefix: "skip" });
    const app = limitedApp(store, 2, { skipSuccessfulRequests: true });
    for (let i = 0; i < 5; i++) expect((await request(app).get("/")).status).toBe(200);
    // express-rate-limit decrements when the response has finished: give it a moment to land.
    await sleep(100);
    expect(await countRows("rate_limit_hits")).toBe(1);
    const row = await RateLimitHit.findOne();
    expect(row?.hits).toBe(0);
    expect((await request(app).get("/fail")).status).toBe(401);
    expect((await request(app).get("/fail")).status).toBe(401);
    expect((await request(app).get("/fail")).status).toBe(429);
    store.shutdown();
  });
});
