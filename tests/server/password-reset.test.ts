import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createHash } from "node:crypto";
import type { Express } from "express";
import { createTestApp, deliverOutbox, startTestMailCatcher } from "../helpers/app";
import { csrfFor, signedInAgent } from "../helpers/auth";
import { buildUser, TEST_PASSWORD } from "../helpers/factories";
import { countRows, truncateAll } from "../helpers/db";
import { AuditEvent, Session } from "../../server/models/index";
import { OutboxMessage, PasswordResetToken } from "../../server/models/mail.models";
import { INVALID_RESET_TOKEN } from "../../server/services/password-reset.service";

const PUBLIC_URL = "https://roofs.example.com";
const NEW_PASSWORD = "a-brand-new-password";

beforeEach(async () => {
  await truncateAll();
  await (await startTestMailCatcher()).clear();
});

function anonymous(app: Express = createTestApp({ publicUrl: PUBLIC_URL })) {
  const agent = request.agent(app);
  return {
    agent,
    async post(path: string, body: unknown) {
      const token = await csrfFor(agent); // first: the agent attaches its cookies when a request is created
      return agent.post(path).set("X-CSRF-Token", token).send(body as object);
    },
  };
}

/** Asks for a reset, lets the outbox deliver it and reads the token from the caught e-mail's link. */
async function requestResetLink(email: string, client = anonymous()) {
  const res = await client.post("/api/auth/forgot", { email });
  expect(res.status).toBe(202);
  await deliverOutbox();
  const catcher = await startTestMailCatcher();
  const mail = await catcher.waitFor((m) => m.to.includes(email) && m.kind === "password_reset", 3_000);
  const link = /https:\/\/roofs\.example\.com\/reset-password\?token=([A-Za-z0-9_-]+)/.exec(mail.text);
  expect(link).not.toBeNull();
  return { mail, token: link![1], client };
}

async function signIn(app: Express, email: string, password: string) {
  const agent = request.agent(app);
  const token = await csrfFor(agent);
  return agent.post("/api/auth/login").set("X-CSRF-Token", token).send({ email, password });
}

describe("POST /api/auth/forgot", () => {
  it("answers 202 and e-mails a one-time link (HTML and text) through the outbox and the SMTP catcher", async () => {
    const user = await buildUser({ role: "estimator", name: "Zoë O'Brien <b>" });
    const { mail, token } = await requestResetLink(user.email);
    expect(mail.subject).toBe("Reset your Ridgewright password");
    expect(mail.to).toEqual([user.email]);
    expect(mail.companyId).toBe(user.companyId);
    expect(mail.text).toContain("60 minutes");
    expect(mail.html).toContain(`href="${PUBLIC_URL}/reset-password?token=${token}"`);
    expect(mail.html).toContain("Zoë O&#39;Brien &lt;b&gt;"); // the name is escaped in HTML
    expect(token.length).toBeGreaterThanOrEqual(22); // ≥ 128 bits of base64url (this one is 256)
    expect(Buffer.from(token, "base64url").length).toBeGreaterThanOrEqual(16);

    const [row] = await PasswordResetToken.findAll({ where: { userId: user.id } });
    expect(row.tokenHash).toBe(createHash("sha256").update(token).digest("hex"));
    expect(JSON.stringify(row.toJSON())).not.toContain(token); // only the hash is stored
    expect(row.usedAt).toBeNull();
    const ttl = row.expiresAt.getTime() - Date.now();
    expect(ttl).toBeGreaterThan(59 * 60_000);
    expect(ttl).toBeLessThanOrEqual(60 * 60_000);
    const outbox = await OutboxMessage.findAll();
    expect(outbox.map((o) => [o.kind, o.status])).toEqual([["password_reset", "sent"]]);
    const audit = await AuditEvent.findAll({ where: { entityType: "user", entityId: String(user.id) } });
    expect(audit.map((a) => a.action)).toEqual(["password_reset_requested"]);
  });

  it("answers an unknown e-mail exactly like a known one and sends nothing", async () => {
    const user = await buildUser();
    const known = await anonymous().post("/api/auth/forgot", { email: user.email });
    const unknown = await anonymous().post("/api/auth/forgot", { email: "nobody-here@example.com" });
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    await deliverOutbox();
    const catcher = await startTestMailCatcher();
    expect(catcher.messages().map((m) => m.to)).toEqual([[user.email]]);
    expect(await PasswordResetToken.count()).toBe(1);
  });

  it("sends nothing to a deactivated account (same 202)", async () => {
    const user = await buildUser({ active: false });
    const res = await anonymous().post("/api/auth/forgot", { email: user.email });
    expect(res.status).toBe(202);
    expect(await countRows("outbox_messages")).toBe(0);
  });

  it("matches the e-mail case-insensitively", async () => {
    const user = await buildUser();
    await anonymous().post("/api/auth/forgot", { email: `  ${user.email.toUpperCase()} ` });
    expect(await PasswordResetToken.count({ where: { userId: user.id } })).toBe(1);
  });

  it("sends at most 3 links per account and hour, still answering 202", async () => {
    const user = await buildUser();
    const client = anonymous();
    for (let i = 0; i < 4; i++) expect((await client.post("/api/auth/forgot", { email: user.email })).status).toBe(202);
    expect(await PasswordResetToken.count()).toBe(3);
    expect(await countRows("outbox_messages")).toBe(3);
  });

  it("rate-limits requests per IP with 429", async () => {
    const client = anonymous();
    for (let i = 0; i < 5; i++) {
      expect((await client.post("/api/auth/forgot", { email: `someone${i}@example.com` })).status).toBe(202);
    }
    const res = await client.post("/api/auth/forgot", { email: "someone9@example.com" });
    expect(res.status).toBe(429);
    expect(res.body.error.code).toBe("rate_limited");
  });

  it("answers a bad e-mail with 400 and a field message", async () => {
    const res = await anonymous().post("/api/auth/forgot", { email: "not-an-address" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ email: "Enter a valid e-mail address" });
  });

  it("needs the CSRF token like every POST", async () => {
    const user = await buildUser();
    const res = await request(createTestApp()).post("/api/auth/forgot").send({ email: user.email });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("csrf");
    expect(await countRows("password_reset_tokens")).toBe(0);
  });
});

describe("POST /api/auth/reset", () => {
  it("sets the new password with the e-mailed token (204): the new one signs in, the old one no longer", async () => {
    const app = createTestApp({ publicUrl: PUBLIC_URL });
    const user = await buildUser({ role: "owner" });
    const { token, client } = await requestResetLink(user.email, anonymous(app));
    const res = await client.post("/api/auth/reset", { token, password: NEW_PASSWORD });
    expect(res.status).toBe(204);
    expect((await signIn(app, user.email, NEW_PASSWORD)).status).toBe(200);
    expect((await signIn(app, user.email, TEST_PASSWORD)).status).toBe(401);
    const row = await PasswordResetToken.findOne({ where: { userId: user.id } });
    expect(row!.usedAt).toBeInstanceOf(Date);
    const audit = await AuditEvent.findAll({ where: { entityType: "user", entityId: String(user.id) }, order: [["id", "ASC"]] });
    expect(audit.map((a) => a.action)).toEqual(["password_reset_requested", "password_reset"]);
    // The account holder is told that the password changed.
    await deliverOutbox();
    const catcher = await startTestMailCatcher();
    const notice = await catcher.waitFor((m) => m.kind === "password_changed", 3_000);
    expect(notice.to).toEqual([user.email]);
    expect(notice.text).not.toContain(token);
  });

  it("ends the user's other sessions", async () => {
    const app = createTestApp({ publicUrl: PUBLIC_URL });
    const { agent: elsewhere, user } = await signedInAgent({ role: "estimator" }, app);
    const other = await signedInAgent({ role: "estimator" }, app); // someone else stays signed in
    expect((await elsewhere.get("/api/auth/me")).status).toBe(200);
    const { token, client } = await requestResetLink(user.email, anonymous(app));
    expect((await client.post("/api/auth/reset", { token, password: NEW_PASSWORD })).status).toBe(204);
    expect((await elsewhere.get("/api/auth/me")).status).toBe(401);
    expect(await Session.count({ where: { userId: user.id } })).toBe(0);
    expect((await other.agent.get("/api/auth/me")).status).toBe(200);
  });

  it("refuses a used, an expired and an unknown token with the same 400", async () => {
    const app = createTestApp({ publicUrl: PUBLIC_URL });
    const user = await buildUser();
    const first = await requestResetLink(user.email, anonymous(app));
    expect((await first.client.post("/api/auth/reset", { token: first.token, password: NEW_PASSWORD })).status).toBe(204);
    const reused = await first.client.post("/api/auth/reset", { token: first.token, password: "yet-another-password" });

    await (await startTestMailCatcher()).clear();
    const second = await requestResetLink(user.email, anonymous(app));
    await PasswordResetToken.update(
      { expiresAt: new Date(Date.now() - 1_000) },
      { where: { tokenHash: createHash("sha256").update(second.token).digest("hex") } },
    );
    const expired = await second.client.post("/api/auth/reset", { token: second.token, password: "yet-another-password" });

    const unknown = await anonymous(app).post("/api/auth/reset", {
      token: "A".repeat(43),
      password: "yet-another-password",
    });

    for (const res of [reused, expired, unknown]) {
      expect(res.status).toBe(400);
      expect(res.body).toEqual({ error: { code: "invalid_reset_token", message: INVALID_RESET_TOKEN } });
    }
    // None of them changed the password.
    expect((await signIn(app, user.email, NEW_PASSWORD)).status).toBe(200);
  });

  it("uses up the user's other open links too", async () => {
    const app = createTestApp({ publicUrl: PUBLIC_URL });
    const user = await buildUser();
    const a = await requestResetLink(user.email, anonymous(app));
    await (await startTestMailCatcher()).clear();
    const b = await requestResetLink(user.email, anonymous(app));
    expect((await b.client.post("/api/auth/reset", { token: b.token, password: NEW_PASSWORD })).status).toBe(204);
    const old = await a.client.post("/api/auth/reset", { token: a.token, password: "yet-another-password" });
    expect(old.status).toBe(400);
  });

  it("refuses a token of an account deactivated since", async () => {
    const app = createTestApp({ publicUrl: PUBLIC_URL });
    const user = await buildUser();
    const { token, client } = await requestResetLink(user.email, anonymous(app));
    await user.update({ active: false });
    const res = await client.post("/api/auth/reset", { token, password: NEW_PASSWORD });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe(INVALID_RESET_TOKEN);
  });

  it("checks the new password's rules (400 with a field message) before using the token", async () => {
    const app = createTestApp({ publicUrl: PUBLIC_URL });
    const user = await buildUser();
    const { token, client } = await requestResetLink(user.email, anonymous(app));
    const res = await client.post("/api/auth/reset", { token, password: "short" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ password: "Use at least 10 characters" });
    expect((await client.post("/api/auth/reset", { token, password: NEW_PASSWORD })).status).toBe(204);
  });

  it("needs the CSRF token like every POST", async () => {
    const res = await request(createTestApp()).post("/api/auth/reset").send({ token: "A".repeat(43), password: NEW_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("csrf");
  });
});
