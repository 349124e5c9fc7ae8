import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createTestApp } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { countRows, truncateAll } from "../helpers/db";
import { buildCustomer } from "../helpers/job-factories";
import { AuditEvent, Customer } from "../../server/models/index";

beforeEach(truncateAll);

const newCustomer = {
  name: "Hester Calloway",
  email: "Hester.Calloway@Example.com",
  phone: "555-0142",
  addressLine1: "19 Saltmarsh Road",
  addressLine2: "",
  city: "Fenwick Hollow",
  region: "ST",
  postalCode: "00012",
  notes: "Prefers e-mail",
};

describe("POST /api/customers", () => {
  it("creates a customer in the user's company and records it", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const res = await agent.post("/api/customers").set("X-CSRF-Token", token).send(newCustomer);
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({
      id: expect.any(Number),
      name: "Hester Calloway",
      email: "hester.calloway@example.com",
      addressLine2: null,
      city: "Fenwick Hollow",
      archivedAt: null,
    });
    expect((await Customer.findByPk(res.body.data.id))!.companyId).toBe(user.companyId);
    const audit = await AuditEvent.findAll({ where: { entityType: "customer", entityId: String(res.body.data.id) } });
    expect(audit.map((a) => [a.action, a.actorId])).toEqual([["created", user.id]]);
  });

  it("answers a bad body with 400 and field messages, and writes nothing", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const res = await agent.post("/api/customers").set("X-CSRF-Token", token).send({ name: " ", email: "nope", postalCode: "x".repeat(21) });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({
      name: "Required",
      email: "Enter a valid e-mail address",
      postalCode: "Use at most 20 characters",
    });
    const noBody = await agent.post("/api/customers").set("X-CSRF-Token", token);
    expect(noBody.status).toBe(400);
    const textBody = await agent.post("/api/customers").set("X-CSRF-Token", token).set("Content-Type", "text/plain").send("hello");
    expect(textBody.status).toBe(415); // not JSON: refused before the route reads it
    expect(await countRows("customers")).toBe(0);
  });

  it("refuses crew with 403, anonymous with 401 and a request without the CSRF token with 403", async () => {
    const { agent, token } = await signedInAgent({ role: "crew" });
    expect((await agent.post("/api/customers").set("X-CSRF-Token", token).send(newCustomer)).status).toBe(403);
    expect((await agent.get("/api/customers")).status).toBe(403);
    const anon = request.agent(createTestApp());
    const csrf = (await anon.get("/api/auth/csrf")).body.token;
    expect((await anon.post("/api/customers").set("X-CSRF-Token", csrf).send(newCustomer)).status).toBe(401);
    expect((await anon.get("/api/customers")).status).toBe(401);
    const { agent: est } = await signedInAgent({ role: "estimator" });
    const noToken = await est.post("/api/customers").send(newCustomer);
    expect(noToken.status).toBe(403);
    expect(noToken.body.error.code).toBe("csrf");
    expect(await countRows("customers")).toBe(0);
  });
});

describe("GET /api/customers", () => {
  it("pages the company's live customers by name and searches name, e-mail and address", async () => {
    const { agent, user } = await signedInAgent({ role: "owner" });
    const c = user.companyId;
    const names = ["Ines Brackwater", "Arlo Fenn", "Cora Lindqvist", "Dario Pell"];
    for (const name of names) await buildCustomer({ companyId: c, name });
    await buildCustomer({ companyId: c, name: "Ezra Hollins", email: "ezra.h@example.com", addressLine1: "4 Tanager Way", city: "Okeby Flats" });
    await buildCustomer({ companyId: c, name: "Old Archived", archivedAt: new Date() });
    await buildCustomer({ name: "Arlo Elsewhere" });

    const page1 = await agent.get("/api/customers?pageSize=2");
    expect(page1.status).toBe(200);
    expect(page1.body.meta).toEqual({ page: 1, pageSize: 2, total: 5 });
    expect(page1.body.data.map((x: { name: string }) => x.name)).toEqual(["Arlo Fenn", "Cora Lindqvist"]);
    const page3 = await agent.get("/api/customers?pageSize=2&page=3");
    expect(page3.body.data.map((x: { name: string }) => x.name)).toEqual(["Ines Brackwater"]);

    const search = async (q: string) =>
      (await agent.get(`/api/customers?q=${encodeURIComponent(q)}`)).body.data.map((x: { name: string }) => x.name);
    expect(await search("arlo")).toEqual(["Arlo Fenn"]);
    expect(await search("EZRA.H@")).toEqual(["Ezra Hollins"]);
    expect(await search("tanager")).toEqual(["Ezra Hollins"]);
    expect(await search("okeby")).toEqual(["Ezra Hollins"]);
    expect(await search("_")).toEqual([]); // a literal underscore, not a wildcard
    const archived = await agent.get("/api/customers?archived=1");
    expect(archived.body.data.map((x: { name: string }) => x.name)).toEqual(["Old Archived"]);
  });

  it("refuses a page size over 100 with 400", async () => {
    const { agent } = await signedInAgent({ role: "estimator" });
    const res = await agent.get("/api/customers?pageSize=500&archived=maybe");
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ pageSize: "At most 100", archived: "Use 1 or 0" });
  });
});

describe("GET and PATCH /api/customers/:id", () => {
  it("reads and changes a customer, recording only what changed", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const customer = await buildCustomer({ companyId: user.companyId, name: "Pia Grell" });
    expect((await agent.get(`/api/customers/${customer.id}`)).body.data).toMatchObject({ id: customer.id, name: "Pia Grell" });
    const res = await agent.patch(`/api/customers/${customer.id}`).set("X-CSRF-Token", token).send({ phone: "555-0199", email: "", name: "Pia Grell" });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ phone: "555-0199", email: null, name: "Pia Grell", city: "Fenwick Hollow" });
    const audit = await AuditEvent.findOne({ where: { entityType: "customer", action: "updated" } });
    expect(Object.keys(audit!.changes!).sort()).toEqual(["email", "phone"]);
  });

  it("answers a bad body with 400 and an empty one with 'Nothing to change'", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const customer = await buildCustomer({ companyId: user.companyId });
    const bad = await agent.patch(`/api/customers/${customer.id}`).set("X-CSRF-Token", token).send({ name: "", email: "x@" });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ name: "Required", email: "Enter a valid e-mail address" });
    const empty = await agent.patch(`/api/customers/${customer.id}`).set("X-CSRF-Token", token).send({});
    expect(empty.body.error.fields).toEqual({ body: "Nothing to change" });
  });

  it("answers another company's customer with 404 (before validating) and changes nothing", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const foreign = await buildCustomer({ name: "Not Yours" });
    expect((await agent.get(`/api/customers/${foreign.id}`)).status).toBe(404);
    const res = await agent.patch(`/api/customers/${foreign.id}`).set("X-CSRF-Token", token).send({ name: "" });
    expect(res.status).toBe(404);
    expect((await agent.post(`/api/customers/${foreign.id}/archive`).set("X-CSRF-Token", token)).status).toBe(404);
    const row = await Customer.findByPk(foreign.id);
    expect(row).toMatchObject({ name: "Not Yours", archivedAt: null });
  });

  it("refuses crew with 403 on one customer", async () => {
    const { agent, token, user } = await signedInAgent({ role: "crew" });
    const customer = await buildCustomer({ companyId: user.companyId });
    expect((await agent.get(`/api/customers/${customer.id}`)).status).toBe(403);
    expect((await agent.patch(`/api/customers/${customer.id}`).set("X-CSRF-Token", token).send({ name: "X" })).status).toBe(403);
  });
});

describe("POST /api/customers/:id/archive and /restore", () => {
  it("archives and restores; an archived customer is read-only until restored", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const customer = await buildCustomer({ companyId: user.companyId });
    const archived = await agent.post(`/api/customers/${customer.id}/archive`).set("X-CSRF-Token", token);
    expect(archived.status).toBe(200);
    expect(archived.body.data.archivedAt).toEqual(expect.any(String));
    expect((await agent.get("/api/customers")).body.meta.total).toBe(0);
    const edit = await agent.patch(`/api/customers/${customer.id}`).set("X-CSRF-Token", token).send({ name: "Changed" });
    expect(edit.status).toBe(409);
    expect(edit.body.error.code).toBe("archived");
    // Archiving twice changes nothing more.
    expect((await agent.post(`/api/customers/${customer.id}/archive`).set("X-CSRF-Token", token)).status).toBe(200);
    const restored = await agent.post(`/api/customers/${customer.id}/restore`).set("X-CSRF-Token", token);
    expect(restored.status).toBe(200);
    expect(restored.body.data.archivedAt).toBeNull();
    expect((await agent.get("/api/customers")).body.meta.total).toBe(1);
    const actions = (await AuditEvent.findAll({ where: { entityType: "customer" }, order: [["id", "ASC"]] })).map((a) => a.action);
    expect(actions).toEqual(["archived", "restored"]);
  });

  it("refuses crew with 403", async () => {
    const { agent, token, user } = await signedInAgent({ role: "crew" });
    const customer = await buildCustomer({ companyId: user.companyId });
    expect((await agent.post(`/api/customers/${customer.id}/archive`).set("X-CSRF-Token", token)).status).toBe(403);
    expect((await Customer.findByPk(customer.id))!.archivedAt).toBeNull();
  });
});
