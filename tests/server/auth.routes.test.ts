import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createTestApp } from "../helpers/app";
import { csrfFor, signedInAgent } from "../helpers/auth";
import { buildUser, TEST_PASSWORD } from "../helpers/factories";
import { countRows, truncateAll } from "../helpers/db";
import { SESSION_COOKIE } from "../../server/app";

beforeEach(truncateAll);

const sidOf = (res: request.Response) =>
  ([] as string[])
    .concat(res.headers["set-cookie"] ?? [])
    .find((c) => c.startsWith(`${SESSION_COOKIE}=`))
    ?.split(";")[0];

describe("POST /api/auth/login", () => {
  it("signs in with the right password and returns the user without secrets", async () => {
    const user = await buildUser({ role: "owner", email: "marta@example.com" });
    const agent = request.agent(createTestApp());
    const csrf1 = await csrfFor(agent);
    const res = await agent
      .post("/api/auth/login")
      .set("X-CSRF-Token", csrf1)
      .send({ email: "Marta@Example.com ", password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      user: { id: user.id, email: "marta@example.com", name: user.name, role: "owner", companyId: user.companyId },
    });
    expect(JSON.stringify(res.body)).not.toMatch(/hash|password/i);
    const me = await agent.get("/api/auth/me");
    expect(me.status).toBe(200);
    expect(me.body.user.id).toBe(user.id);
  });

  it("answers a wrong password and an unknown e-mail with the same 401", async () => {
    const user = await buildUser();
    const agent = request.agent(createTestApp());
    const token = await csrfFor(agent);
    const wrong = await agent.post("/api/auth/login").set("X-CSRF-Token", token).send({ email: user.email, password: "nope-nope-nope" });
    const unknown = await agent
      .post("/api/auth/login")
      .set("X-CSRF-Token", token)
      .send({ email: "nobody@example.com", password: TEST_PASSWORD });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe("invalid_credentials");
    expect((await agent.get("/api/auth/me")).status).toBe(401);
  });

  it("refuses a deactivated user with the same 401", async () => {
    const user = await buildUser({ active: false });
    const agent = request.agent(createTestApp());
    const csrf2 = await csrfFor(agent);
    const res = await agent
      .post("/api/auth/login")
      .set("X-CSRF-Token", csrf2)
      .send({ email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(401);
  });

  it("answers a malformed body with 400 and field messages", async () => {
    const agent = request.agent(createTestApp());
    const csrf3 = await csrfFor(agent);
    const res = await agent.post("/api/auth/login").set("X-CSRF-Token", csrf3).send({ email: "not-an-email" });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("bad_request");
    expect(res.body.error.fields).toEqual({ email: "Enter a valid e-mail address", password: "Required" });
  });

  it("answers a missing body with 400 and a body that is not JSON with 415, each with a message", async () => {
    const agent = request.agent(createTestApp());
    const csrf4 = await csrfFor(agent);
    const none = await agent.post("/api/auth/login").set("X-CSRF-Token", csrf4);
    expect(none.status).toBe(400);
    expect(none.body.error.message).toMatch(/JSON body/);
    const text = await agent.post("/api/auth/login").set("X-CSRF-Token", csrf4).set("Content-Type", "text/plain").send("hello");
    expect(text.status).toBe(415); // RFC 9110 15.5.16: the content type is not one the route accepts
    expect(text.body.error.message).toMatch(/JSON/);
  });

  it("refuses a request without the CSRF token with 403", async () => {
    const user = await buildUser();
    const res = await request(createTestApp()).post("/api/auth/login").send({ email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("csrf");
  });

  it("refuses a CSRF token from another session", async () => {
    const user = await buildUser();
    const app = createTestApp();
    const other = request.agent(app);
    const foreignToken = await csrfFor(other);
    const agent = request.agent(app);
    await csrfFor(agent);
    const res = await agent.post("/api/auth/login").set("X-CSRF-Token", foreignToken).send({ email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
  });

  it("gives a new session id at sign-in (no session fixation)", async () => {
    const user = await buildUser();
    const agent = request.agent(createTestApp());
    const csrfRes = await agent.get("/api/auth/csrf");
    const before = sidOf(csrfRes);
    expect(before).toBeDefined();
    const login = await agent
      .post("/api/auth/login")
      .set("X-CSRF-Token", csrfRes.body.token)
      .send({ email: user.email, password: TEST_PASSWORD });
    const after = sidOf(login);
    expect(after).toBeDefined();
    expect(after).not.toBe(before);
  });

  it("stores the session in MariaDB with the user's id", async () => {
    const { user } = await signedInAgent();
    const { Session } = await import("../../server/models/index");
    const rows = await Session.findAll({ where: { userId: user.id } });
    expect(rows).toHaveLength(1);
  });

  it("rate-limits failed sign-ins per IP and e-mail (429 after 10 failures), and a success resets the count", async () => {
    const user = await buildUser();
    const agent = request.agent(createTestApp({ loginMaxFailures: 10 }));
    const token = await csrfFor(agent);
    const fail = () => agent.post("/api/auth/login").set("X-CSRF-Token", token).send({ email: user.email, password: "wrong-password" });
    for (let i = 0; i < 9; i++) expect((await fail()).status).toBe(401);
    // The ninth failure is followed by a success: the count starts again.
    const ok = await agent.post("/api/auth/login").set("X-CSRF-Token", token).send({ email: user.email, password: TEST_PASSWORD });
    expect(ok.status).toBe(200);
    const fresh = await csrfFor(agent);
    const failAgain = () =>
      agent.post("/api/auth/login").set("X-CSRF-Token", fresh).send({ email: user.email, password: "wrong-password" });
    for (let i = 0; i < 10; i++) expect((await failAgain()).status).toBe(401);
    const limited = await failAgain();
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe("rate_limited");
    // Even the right password is refused while limited.
    const blocked = await agent.post("/api/auth/login").set("X-CSRF-Token", fresh).send({ email: user.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    // Another e-mail from the same IP is counted separately.
    const other = await buildUser();
    const otherOk = await agent.post("/api/auth/login").set("X-CSRF-Token", fresh).send({ email: other.email, password: TEST_PASSWORD });
    expect(otherOk.status).toBe(200);
  });
});

describe("POST /api/auth/logout", () => {
  it("ends the session with 204", async () => {
    const { agent, token } = await signedInAgent();
    const res = await agent.post("/api/auth/logout").set("X-CSRF-Token", token);
    expect(res.status).toBe(204);
    expect((await agent.get("/api/auth/me")).status).toBe(401);
  });

  it("needs the CSRF token", async () => {
    const { agent } = await signedInAgent();
    expect((await agent.post("/api/auth/logout")).status).toBe(403);
    expect((await agent.get("/api/auth/me")).status).toBe(200);
  });
});

describe("GET /api/auth/me", () => {
  it("answers 401 with the error shape when signed out", async () => {
    const res = await request(createTestApp()).get("/api/auth/me");
    expect(res.status).toBe(401);
    expect(res.body).toEqual({ error: { code: "unauthorized", message: "Please sign in" } });
  });
});

describe("POST /api/auth/password", () => {
  it("changes the user's own password when the current one is given", async () => {
    const { agent, token, user, app } = await signedInAgent();
    const res = await agent
      .post("/api/auth/password")
      .set("X-CSRF-Token", token)
      .send({ currentPassword: TEST_PASSWORD, newPassword: "a-brand-new-passphrase" });
    expect(res.status).toBe(204);
    const fresh = request.agent(app);
    const csrf5 = await csrfFor(fresh);
    const login = await fresh
      .post("/api/auth/login")
      .set("X-CSRF-Token", csrf5)
      .send({ email: user.email, password: "a-brand-new-passphrase" });
    expect(login.status).toBe(200);
  });

  it("refuses a wrong current password with a field error and changes nothing", async () => {
    const { agent, token, user } = await signedInAgent();
    const before = (await (await import("../../server/models/index")).User.findByPk(user.id))!.passwordHash;
    const res = await agent
      .post("/api/auth/password")
      .set("X-CSRF-Token", token)
      .send({ currentPassword: "not-my-password", newPassword: "a-brand-new-passphrase" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ currentPassword: "That is not your current password" });
    const after = (await (await import("../../server/models/index")).User.findByPk(user.id))!.passwordHash;
    expect(after).toBe(before);
  });

  it("refuses a short new password", async () => {
    const { agent, token } = await signedInAgent();
    const res = await agent.post("/api/auth/password").set("X-CSRF-Token", token).send({ currentPassword: TEST_PASSWORD, newPassword: "short" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.newPassword).toMatch(/at least 10/);
  });

  it("needs a session", async () => {
    const agent = request.agent(createTestApp());
    const csrf6 = await csrfFor(agent);
    const res = await agent.post("/api/auth/password").set("X-CSRF-Token", csrf6).send({});
    expect(res.status).toBe(401);
    expect(await countRows("audit_events")).toBe(0);
  });
});
