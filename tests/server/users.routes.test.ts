import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createTestApp } from "../helpers/app";
import { csrfFor, signedInAgent } from "../helpers/auth";
import { buildCompany, buildUser, TEST_PASSWORD } from "../helpers/factories";
import { countRows, truncateAll } from "../helpers/db";
import { AuditEvent, Session, User } from "../../server/models/index";

beforeEach(truncateAll);

const newUser = { email: "crewlead@example.com", name: "Ines Halvorsen", role: "crew", password: "long-enough-pass" };

describe("GET /api/users", () => {
  it("lists the owner's company only, without password hashes", async () => {
    const { agent, user } = await signedInAgent({ role: "owner" });
    await buildUser({ companyId: user.companyId, role: "crew", name: "Same Company" });
    await buildUser({ name: "Other Company" });
    const res = await agent.get("/api/users");
    expect(res.status).toBe(200);
    expect(res.body.data.map((u: { name: string }) => u.name).sort()).toEqual(["Same Company", user.name].sort());
    expect(JSON.stringify(res.body)).not.toMatch(/hash/i);
    expect(res.body.data[0]).toMatchObject({ active: true, companyId: user.companyId });
  });

  it.each(["estimator", "crew"] as const)("refuses a %s with 403", async (role) => {
    const { agent } = await signedInAgent({ role });
    const res = await agent.get("/api/users");
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("forbidden");
  });

  it("refuses anonymous with 401", async () => {
    expect((await request(createTestApp()).get("/api/users")).status).toBe(401);
  });
});

describe("POST /api/users", () => {
  it("creates a user in the owner's company, hashes the password and records it in the audit log", async () => {
    const { agent, token, user: owner, app } = await signedInAgent({ role: "owner" });
    const res = await agent.post("/api/users").set("X-CSRF-Token", token).send(newUser);
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ email: "crewlead@example.com", role: "crew", companyId: owner.companyId, active: true });
    const row = await User.findByPk(res.body.data.id);
    expect(row!.passwordHash).toMatch(/^\$2[aby]\$/);
    expect(row!.passwordHash).not.toContain(newUser.password);
    const audit = await AuditEvent.findAll({ where: { entityType: "user", entityId: String(row!.id) } });
    expect(audit.map((a) => a.action)).toEqual(["created"]);
    expect(audit[0].actorId).toBe(owner.id);
    // The new user can sign in.
    const fresh = request.agent(app);
    const csrf1 = await csrfFor(fresh);
    const login = await fresh
      .post("/api/auth/login")
      .set("X-CSRF-Token", csrf1)
      .send({ email: newUser.email, password: newUser.password });
    expect(login.status).toBe(200);
  });

  it("answers a bad body with 400, field messages, and no new row", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const before = await countRows("users");
    const res = await agent.post("/api/users").set("X-CSRF-Token", token).send({ email: "x", name: "", role: "boss", password: "short" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({
      email: "Enter a valid e-mail address",
      name: "Required",
      role: "Pick a role",
      password: "Use at least 10 characters",
    });
    expect(await countRows("users")).toBe(before);
  });

  it("answers a taken e-mail with 409", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    await buildUser({ email: newUser.email });
    const res = await agent.post("/api/users").set("X-CSRF-Token", token).send(newUser);
    expect(res.status).toBe(409);
  });

  it("refuses an estimator with 403 before looking at the body", async () => {
    const { agent, token } = await signedInAgent({ role: "estimator" });
    const res = await agent.post("/api/users").set("X-CSRF-Token", token).send({});
    expect(res.status).toBe(403);
  });

  it("refuses a request without the CSRF token", async () => {
    const { agent } = await signedInAgent({ role: "owner" });
    const res = await agent.post("/api/users").send(newUser);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("csrf");
    expect(await User.count({ where: { email: newUser.email } })).toBe(0);
  });
});

describe("PATCH /api/users/:id", () => {
  it("changes a role", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const member = await buildUser({ companyId: user.companyId, role: "crew" });
    const res = await agent.patch(`/api/users/${member.id}`).set("X-CSRF-Token", token).send({ role: "estimator" });
    expect(res.status).toBe(200);
    expect(res.body.data.role).toBe("estimator");
  });

  it("deactivating a user ends that user's live sessions at once", async () => {
    const app = createTestApp();
    const { agent: ownerAgent, token, user: owner } = await signedInAgent({ role: "owner" }, app);
    const member = await buildUser({ companyId: owner.companyId, role: "estimator" });
    const memberAgent = request.agent(app);
    const csrf2 = await csrfFor(memberAgent);
    await memberAgent
      .post("/api/auth/login")
      .set("X-CSRF-Token", csrf2)
      .send({ email: member.email, password: TEST_PASSWORD })
      .expect(200);
    expect((await memberAgent.get("/api/auth/me")).status).toBe(200);
    const res = await ownerAgent.patch(`/api/users/${member.id}`).set("X-CSRF-Token", token).send({ active: false });
    expect(res.status).toBe(200);
    expect(res.body.data.active).toBe(false);
    expect(await Session.count({ where: { userId: member.id } })).toBe(0);
    expect((await memberAgent.get("/api/auth/me")).status).toBe(401);
  });

  it("refuses to demote or deactivate the last active owner (409)", async () => {
    const { agent, token, user: owner } = await signedInAgent({ role: "owner" });
    const demote = await agent.patch(`/api/users/${owner.id}`).set("X-CSRF-Token", token).send({ role: "estimator" });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe("last_owner");
    const deactivate = await agent.patch(`/api/users/${owner.id}`).set("X-CSRF-Token", token).send({ active: false });
    expect(deactivate.status).toBe(409);
    expect((await User.findByPk(owner.id))!.role).toBe("owner");
    // With a second active owner the change is allowed.
    await buildUser({ companyId: owner.companyId, role: "owner" });
    const ok = await agent.patch(`/api/users/${owner.id}`).set("X-CSRF-Token", token).send({ role: "estimator" });
    expect(ok.status).toBe(200);
  });

  it("does not count an inactive owner as the other owner", async () => {
    const { agent, token, user: owner } = await signedInAgent({ role: "owner" });
    await buildUser({ companyId: owner.companyId, role: "owner", active: false });
    const res = await agent.patch(`/api/users/${owner.id}`).set("X-CSRF-Token", token).send({ active: false });
    expect(res.status).toBe(409);
  });

  it("answers another company's user with 404 and changes nothing", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const other = await buildUser({ companyId: (await buildCompany()).id, role: "estimator" });
    const res = await agent.patch(`/api/users/${other.id}`).set("X-CSRF-Token", token).send({ role: "crew" });
    expect(res.status).toBe(404);
    expect((await User.findByPk(other.id))!.role).toBe("estimator");
  });

  it("answers a non-numeric id with 404", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    expect((await agent.patch("/api/users/abc").set("X-CSRF-Token", token).send({ role: "crew" })).status).toBe(404);
  });

  it("answers an empty change with 400", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const res = await agent.patch(`/api/users/${user.id}`).set("X-CSRF-Token", token).send({});
    expect(res.status).toBe(400);
  });
});

describe("PUT /api/users/:id/password", () => {
  it("lets the owner set a new password for a team member and signs them out elsewhere", async () => {
    const app = createTestApp();
    const { agent, token, user: owner } = await signedInAgent({ role: "owner" }, app);
    const member = await buildUser({ companyId: owner.companyId });
    const res = await agent.put(`/api/users/${member.id}/password`).set("X-CSRF-Token", token).send({ password: "set-by-the-owner" });
    expect(res.status).toBe(204);
    const fresh = request.agent(app);
    const csrf3 = await csrfFor(fresh);
    const login = await fresh
      .post("/api/auth/login")
      .set("X-CSRF-Token", csrf3)
      .send({ email: member.email, password: "set-by-the-owner" });
    expect(login.status).toBe(200);
  });

  it("refuses a crew member with 403", async () => {
    const { agent, token, user } = await signedInAgent({ role: "crew" });
    const res = await agent.put(`/api/users/${user.id}/password`).set("X-CSRF-Token", token).send({ password: "whatever-long-one" });
    expect(res.status).toBe(403);
  });
});
