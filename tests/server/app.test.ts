import { afterAll, beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createTestApp, testConfig, testMailer } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { truncateAll } from "../helpers/db";
import { createSequelize } from "../../server/db/sequelize";
import { createApp } from "../../server/app";
import { createLogger } from "../../server/logger";
import { createSessionStore } from "../../server/session-store";
import { sessionAttributes } from "../../server/models/session.model";

beforeEach(truncateAll);

describe("GET /api/health", () => {
  it("answers 200 with the database up", async () => {
    const res = await request(createTestApp()).get("/api/health");
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: "ok", db: "up" });
  });

  const down = createSequelize({ ...testConfig().db, port: 1 }); // nothing listens on port 1
  // The models are bound to the working database; give the unreachable one its own session model.
  down.define("Session", sessionAttributes, { tableName: "sessions", underscored: true });
  const store = createSessionStore(down, 60_000);
  afterAll(async () => {
    store.stopExpiringSessions();
    await down.close();
  });
  const downApp = createApp({ config: testConfig(), logger: createLogger("silent"), sequelize: down, sessionStore: store, mailer: testMailer });

  it("answers 503 with db down when the database is unreachable", async () => {
    const res = await request(downApp).get("/api/health");
    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ db: "down" });
  });

  it("answers session routes with a 503 JSON error, no stack trace, when the database is unreachable", async () => {
    // A real, correctly signed session cookie from the working app, replayed while the database is away.
    const cookie = (await request(createTestApp()).get("/api/auth/csrf")).headers["set-cookie"] ?? [];
    expect(cookie).toHaveLength(1);
    const res = await request(downApp).get("/api/auth/me").set("Cookie", ([] as string[]).concat(cookie).map((c) => c.split(";")[0]));
    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe("unavailable");
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts/);
  });
});

describe("API errors", () => {
  it("answers unknown /api routes with a 404 JSON error", async () => {
    const res = await request(createTestApp()).get("/api/nope");
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe("not_found");
  });

  it("answers broken JSON with 400", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const res = await agent.post("/api/users").set("X-CSRF-Token", token).set("Content-Type", "application/json").send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("bad_json");
  });

  it("answers a body over the limit with 413", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const res = await agent
      .post("/api/users")
      .set("X-CSRF-Token", token)
      .set("Content-Type", "application/json")
      .send(JSON.stringify({ name: "x".repeat(1_100_000) }));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe("too_large");
  });

  it("sets security headers and an httpOnly, SameSite=Lax session cookie", async () => {
    const res = await request(createTestApp()).get("/api/auth/csrf");
    expect(res.headers["content-security-policy"]).toContain("default-src 'self'");
    expect(res.headers["x-content-type-options"]).toBe("nosniff");
    const cookie = ([] as string[]).concat(res.headers["set-cookie"] ?? []).join(";");
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i); // development/test over plain http
  });

  it("keeps signed-in answers out of caches: Cache-Control no-store and no ETag", async () => {
    const { agent } = await signedInAgent({ role: "owner" });
    const res = await agent.get("/api/jobs");
    expect(res.status).toBe(200);
    expect(res.headers["cache-control"]).toBe("no-store"); // RFC 9111 5.2.2.5: never stored
    expect(res.headers.etag).toBeUndefined();
  });

  it("marks the cookie Secure in production", async () => {
    const app = createTestApp({ env: "production", trustProxy: true });
    const res = await request(app).get("/api/auth/csrf").set("X-Forwarded-Proto", "https");
    const cookie = ([] as string[]).concat(res.headers["set-cookie"] ?? []).join(";");
    expect(cookie).toMatch(/Secure/i);
  });
});
