import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createTestApp } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { buildCompany, buildUser } from "../helpers/factories";
import { countRows, truncateAll } from "../helpers/db";
import { assignCrew, buildCustomer, buildJob, saveRoofFor } from "../helpers/job-factories";
import { AuditEvent, Customer, Job, JobCrew } from "../../server/models/index";

beforeEach(truncateAll);

const PRICE_KEY = /cost|price|margin|cents|total/i;

/** Every key anywhere in a JSON body. */
function allKeys(body: unknown): string[] {
  const keys: string[] = [];
  JSON.stringify(body, (k, v) => {
    if (k) keys.push(k);
    return v;
  });
  return keys;
}

describe("POST /api/jobs", () => {
  it("creates a lead for an existing customer, copies the customer's address to the site, and makes the estimator its estimator", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const customer = await buildCustomer({ companyId: user.companyId, addressLine1: "7 Wrenfield Court", city: "Marrow Bend" });
    const res = await agent
      .post("/api/jobs")
      .set("X-CSRF-Token", token)
      .send({ customerId: customer.id, site: { climateZone: "6a", wind: { meanRoofHeightFt: 18 } }, notes: "Back slope first" });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({
      id: expect.any(Number),
      status: "lead",
      customerId: customer.id,
      customer: { id: customer.id, name: customer.name },
      siteAddressLine1: "7 Wrenfield Court",
      siteCity: "Marrow Bend",
      estimatorId: user.id,
      estimator: { id: user.id, name: user.name },
      crew: [],
      squares: null,
      quoteTotalCents: null,
      notes: "Back slope first",
      archivedAt: null,
    });
    // The site is the engine's site object, defaults filled in.
    expect(res.body.data.site).toMatchObject({ atticType: "vented", climateZone: "6A", codeEdition: 2021, wind: { meanRoofHeightFt: 18, ratedAssemblyRequired: false } });
    const audit = await AuditEvent.findAll({ where: { entityType: "job", entityId: String(res.body.data.id) } });
    expect(audit.map((a) => [a.action, a.jobId, a.actorId])).toEqual([["created", res.body.data.id, user.id]]);
  });

  it("creates the customer inline with the job, in one transaction", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const res = await agent
      .post("/api/jobs")
      .set("X-CSRF-Token", token)
      .send({ customer: { name: "Orla Penhallow", email: "Orla@Example.com" }, siteAddressLine1: "3 Quarry Row", siteCity: "Fenwick Hollow" });
    expect(res.status).toBe(201);
    const customer = await Customer.findByPk(res.body.data.customerId);
    expect(customer).toMatchObject({ name: "Orla Penhallow", email: "orla@example.com", companyId: user.companyId });
    expect(res.body.data).toMatchObject({ siteAddressLine1: "3 Quarry Row", siteCity: "Fenwick Hollow", estimatorId: null });
  });

  it("answers a bad body with 400, field paths, and writes nothing", async () => {
    const { agent, token } = await signedInAgent({ role: "estimator" });
    const res = await agent
      .post("/api/jobs")
      .set("X-CSRF-Token", token)
      .send({ customer: { name: "", email: "not-an-address" }, site: { climateZone: "9Z", wind: { meanRoofHeightFt: -3 } } });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({
      "customer.name": "Required",
      "customer.email": "Enter a valid e-mail address",
      "site.climateZone": 'Use an IECC climate zone such as "3A"',
      "site.wind.meanRoofHeightFt": "Must be more than 0",
    });
    const none = await agent.post("/api/jobs").set("X-CSRF-Token", token).send({});
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toEqual({ customerId: "Pick a customer or add a new one" });
    expect(await countRows("jobs")).toBe(0);
    expect(await countRows("customers")).toBe(0);
  });

  it("refuses another company's customer or estimator with 400 on the field, and an archived customer", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const foreign = await buildCustomer();
    const res = await agent.post("/api/jobs").set("X-CSRF-Token", token).send({ customerId: foreign.id });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ customerId: "Unknown customer" });

    const own = await buildCustomer({ companyId: user.companyId });
    const otherEstimator = await buildUser({ role: "estimator" });
    const crew = await buildUser({ companyId: user.companyId, role: "crew" });
    for (const estimatorId of [otherEstimator.id, crew.id]) {
      const r = await agent.post("/api/jobs").set("X-CSRF-Token", token).send({ customerId: own.id, estimatorId });
      expect(r.status).toBe(400);
      expect(r.body.error.fields).toEqual({ estimatorId: "Pick an active estimator or owner of your company" });
    }
    const archived = await buildCustomer({ companyId: user.companyId, archivedAt: new Date() });
    const r2 = await agent.post("/api/jobs").set("X-CSRF-Token", token).send({ customerId: archived.id });
    expect(r2.status).toBe(400);
    expect(r2.body.error.fields.customerId).toMatch(/archived/);
    expect(await countRows("jobs")).toBe(0);
  });

  it("refuses crew with 403 before reading the body, anonymous with 401, and a missing CSRF token with 403", async () => {
    const { agent, token, user } = await signedInAgent({ role: "crew" });
    const customer = await buildCustomer({ companyId: user.companyId });
    const crew = await agent.post("/api/jobs").set("X-CSRF-Token", token).send({});
    expect(crew.status).toBe(403);
    expect(crew.body.error.code).toBe("forbidden");
    expect((await request(createTestApp()).post("/api/jobs").send({ customerId: customer.id })).status).toBe(401); // signed out, no token: sign in first
    const anon = request.agent(createTestApp());
    const csrf = (await anon.get("/api/auth/csrf")).body.token;
    expect((await anon.post("/api/jobs").set("X-CSRF-Token", csrf).send({ customerId: customer.id })).status).toBe(401);

    const { agent: est } = await signedInAgent({ role: "estimator", companyId: user.companyId });
    const noToken = await est.post("/api/jobs").send({ customerId: customer.id });
    expect(noToken.status).toBe(403);
    expect(noToken.body.error.code).toBe("csrf");
    expect(await countRows("jobs")).toBe(0);
  });
});

describe("GET /api/jobs", () => {
  it("pages the company's live jobs, newest change first, with meta", async () => {
    const { agent, user } = await signedInAgent({ role: "owner" });
    const jobs = [];
    for (let i = 0; i < 5; i++) {
      jobs.push(await buildJob({ companyId: user.companyId, updatedAt: new Date(Date.UTC(2026, 0, 1 + i)) }));
    }
    await buildJob({ companyId: user.companyId, archivedAt: new Date() });
    await buildJob(); // another company
    const page1 = await agent.get("/api/jobs?pageSize=2");
    expect(page1.status).toBe(200);
    expect(page1.body.meta).toEqual({ page: 1, pageSize: 2, total: 5 });
    expect(page1.body.data.map((j: { id: number }) => j.id)).toEqual([jobs[4].id, jobs[3].id]);
    const page3 = await agent.get("/api/jobs?pageSize=2&page=3");
    expect(page3.body.data.map((j: { id: number }) => j.id)).toEqual([jobs[0].id]);
    expect(page3.body.data[0]).toMatchObject({ status: "lead", customer: { id: jobs[0].customerId }, quoteTotalCents: null });
    // The board's times are the job's own, to the millisecond text (the board formats them in SQL).
    expect(page3.body.data[0].updatedAt).toBe("2026-01-01T00:00:00.000Z");
    const detail = (await agent.get(`/api/jobs/${jobs[0].id}`)).body.data;
    for (const k of ["createdAt", "updatedAt", "archivedAt", "customerId", "estimatorId", "squares", "siteCity"]) {
      expect(page3.body.data[0][k], k).toEqual(detail[k]);
    }
    const past = await agent.get("/api/jobs?pageSize=2&page=9"); // past the end: no rows, the total still right
    expect(past.body).toEqual({ data: [], meta: { page: 9, pageSize: 2, total: 5 } });
    const archived = (await agent.get("/api/jobs?archived=1")).body.data[0];
    expect(archived.archivedAt).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.000Z$/);
  });

  it("defaults to 25 a page and refuses a page size outside 1–100 with 400", async () => {
    const { agent } = await signedInAgent({ role: "estimator" });
    expect((await agent.get("/api/jobs")).body.meta).toEqual({ page: 1, pageSize: 25, total: 0 });
    const big = await agent.get("/api/jobs?pageSize=101");
    expect(big.status).toBe(400);
    expect(big.body.error.fields).toEqual({ pageSize: "At most 100" });
    const zero = await agent.get("/api/jobs?pageSize=0&page=0&sort=price&status=done");
    expect(zero.status).toBe(400);
    expect(Object.keys(zero.body.error.fields).sort()).toEqual(["page", "pageSize", "sort", "status.0"]);
  });

  it("filters by status (one or several), estimator, archived and text", async () => {
    const { agent, user } = await signedInAgent({ role: "estimator" });
    const c = user.companyId;
    const other = await buildUser({ companyId: c, role: "estimator" });
    const ada = await buildCustomer({ companyId: c, name: "Ada Thistlewood", email: "ada@example.com" });
    const bo = await buildCustomer({ companyId: c, name: "Bo Marchetti", email: "bo.m@example.com" });
    const won = await buildJob({ companyId: c, customerId: ada.id, status: "won", estimatorId: user.id });
    const sched = await buildJob({ companyId: c, customerId: bo.id, status: "scheduled", estimatorId: other.id, siteAddressLine1: "88 Juniper Spur" });
    const lead = await buildJob({ companyId: c, customerId: bo.id, status: "lead", siteCity: "Okeby Flats" });
    const gone = await buildJob({ companyId: c, customerId: ada.id, status: "lost", archivedAt: new Date() });
    const ids = async (qs: string) => {
      const res = await agent.get(`/api/jobs?${qs}`);
      expect(res.status).toBe(200);
      return res.body.data.map((j: { id: number }) => j.id).sort();
    };
    expect(await ids("status=won")).toEqual([won.id]);
    expect(await ids("status=won,scheduled")).toEqual([won.id, sched.id].sort());
    expect(await ids(`estimatorId=${other.id}`)).toEqual([sched.id]);
    expect(await ids("estimatorId=none")).toEqual([lead.id]);
    expect(await ids("q=thistle")).toEqual([won.id]); // customer name
    expect(await ids("q=BO.M@")).toEqual([sched.id, lead.id].sort()); // customer e-mail
    expect(await ids("q=juniper")).toEqual([sched.id]); // site street
    expect(await ids("q=okeby")).toEqual([lead.id]); // site city
    expect(await ids("q=100%25")).toEqual([]); // a literal %, not a wildcard
    expect(await ids("archived=1")).toEqual([gone.id]);
  });

  it("sorts by customer, status, squares and quote total, both ways", async () => {
    const { agent, user } = await signedInAgent({ role: "owner" });
    const c = user.companyId;
    const a = await buildJob({ companyId: c, customerId: (await buildCustomer({ companyId: c, name: "Abbot" })).id, status: "won", squares: 30, quoteTotalCents: 500 });
    const b = await buildJob({ companyId: c, customerId: (await buildCustomer({ companyId: c, name: "Brisk" })).id, status: "lead", squares: 10, quoteTotalCents: 900 });
    const z = await buildJob({ companyId: c, customerId: (await buildCustomer({ companyId: c, name: "Zeller" })).id, status: "estimating", squares: 20, quoteTotalCents: 100 });
    const order = async (sort: string) => (await agent.get(`/api/jobs?sort=${sort}`)).body.data.map((j: { id: number }) => j.id);
    expect(await order("customer")).toEqual([a.id, b.id, z.id]);
    expect(await order("-customer")).toEqual([z.id, b.id, a.id]);
    expect(await order("status")).toEqual([b.id, z.id, a.id]); // lead, estimating, won: the ENUM's order
    expect(await order("squares")).toEqual([b.id, z.id, a.id]);
    expect(await order("-squares")).toEqual([a.id, z.id, b.id]);
    expect(await order("quoteTotal")).toEqual([z.id, a.id, b.id]);
    const list = (await agent.get("/api/jobs?sort=-quoteTotal")).body.data;
    expect(list.map((j: { quoteTotalCents: number }) => j.quoteTotalCents)).toEqual([900, 500, 100]);
    expect(list.map((j: { squares: number }) => j.squares)).toEqual([10, 30, 20]);
  });

  it("shows crew only the jobs assigned to them, and no price keys", async () => {
    const { agent, user } = await signedInAgent({ role: "crew" });
    const c = user.companyId;
    const mine = await buildJob({ companyId: c, status: "scheduled", quoteTotalCents: 1234500 });
    await buildJob({ companyId: c, status: "scheduled", quoteTotalCents: 99900 });
    await assignCrew(mine.id, [user.id]);
    const res = await agent.get("/api/jobs");
    expect(res.status).toBe(200);
    expect(res.body.meta.total).toBe(1);
    expect(res.body.data.map((j: { id: number }) => j.id)).toEqual([mine.id]);
    expect(res.body.data[0]).not.toHaveProperty("quoteTotalCents");
    expect(allKeys(res.body).filter((k) => PRICE_KEY.test(k) && k !== "total")).toEqual([]);
    // An archived job drops off the crew's list and detail, even when assigned.
    const archived = await buildJob({ companyId: c, archivedAt: new Date() });
    await assignCrew(archived.id, [user.id]);
    expect((await agent.get("/api/jobs?archived=1")).body.data.map((j: { id: number }) => j.id)).toEqual([mine.id]);
    expect((await agent.get(`/api/jobs/${archived.id}`)).status).toBe(404);
  });

  it("refuses anonymous with 401", async () => {
    expect((await request(createTestApp()).get("/api/jobs")).status).toBe(401);
  });
});

describe("GET /api/jobs/:id", () => {
  it("returns the job with customer, estimator, crew and site", async () => {
    const { agent, user } = await signedInAgent({ role: "estimator" });
    const crew = await buildUser({ companyId: user.companyId, role: "crew", name: "Kit Arrowsmith" });
    const job = await buildJob({ companyId: user.companyId, estimatorId: user.id, quoteTotalCents: 1850000 });
    await assignCrew(job.id, [crew.id]);
    const res = await agent.get(`/api/jobs/${job.id}`);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      id: job.id,
      estimator: { id: user.id, name: user.name },
      crew: [{ id: crew.id, name: "Kit Arrowsmith" }],
      quoteTotalCents: 1850000,
      site: { climateZone: "5A", iceDamRisk: true },
    });
  });

  it("answers another company's job, a non-numeric id, and an unassigned job for crew with 404", async () => {
    const { agent } = await signedInAgent({ role: "owner" });
    const foreign = await buildJob();
    expect((await agent.get(`/api/jobs/${foreign.id}`)).status).toBe(404);
    expect((await agent.get("/api/jobs/abc")).status).toBe(404);

    const { agent: crewAgent, user: crew } = await signedInAgent({ role: "crew" });
    const notMine = await buildJob({ companyId: crew.companyId });
    const mine = await buildJob({ companyId: crew.companyId, quoteTotalCents: 777 });
    await assignCrew(mine.id, [crew.id]);
    const refused = await crewAgent.get(`/api/jobs/${notMine.id}`);
    expect(refused.status).toBe(404);
    expect(refused.body.error.code).toBe("not_found");
    const ok = await crewAgent.get(`/api/jobs/${mine.id}`);
    expect(ok.status).toBe(200);
    expect(ok.body.data).not.toHaveProperty("quoteTotalCents");
    expect(allKeys(ok.body).filter((k) => PRICE_KEY.test(k))).toEqual([]);
  });
});

describe("PATCH /api/jobs/:id", () => {
  it("changes site data, notes and address, and records what changed", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const job = await buildJob({ companyId: user.companyId });
    const site = { atticType: "cathedral", climateZone: "4C", existingLayers: 2, wind: { ratedAssemblyRequired: true, basicWindSpeedMph: 130, exposure: "C", meanRoofHeightFt: 22, leastHorizontalDimensionFt: 30 } };
    const res = await agent.patch(`/api/jobs/${job.id}`).set("X-CSRF-Token", token).send({ site, notes: "Dog in yard", siteAddressLine2: "" });
    expect(res.status).toBe(200);
    expect(res.body.data.site).toMatchObject({ ...site, tearOff: true, codeEdition: 2021 });
    expect(res.body.data).toMatchObject({ notes: "Dog in yard", siteAddressLine2: null });
    const audit = await AuditEvent.findOne({ where: { entityType: "job", entityId: String(job.id), action: "updated" } });
    expect(Object.keys(audit!.changes!).sort()).toEqual(["notes", "site"]);
    expect(audit!.jobId).toBe(job.id);
  });

  it("recomputes the stored takeoff when the site changes", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const job = await buildJob({ companyId: user.companyId });
    await saveRoofFor(job);
    const before = (await agent.get(`/api/jobs/${job.id}/takeoff`)).body.data;
    const res = await agent
      .patch(`/api/jobs/${job.id}`)
      .set("X-CSRF-Token", token)
      .send({ site: { climateZone: "2A", iceDamRisk: false, atticType: "vented", atticFloorAreaSqFt: 1500 } });
    expect(res.status).toBe(200);
    const after = (await agent.get(`/api/jobs/${job.id}/takeoff`)).body.data;
    expect(after.ventilation).not.toEqual(before.ventilation);
    expect((await agent.get(`/api/jobs/${job.id}/roof`)).body.data.version).toBe(1); // the document did not change
  });

  it("moves the job to another customer of the company, and refuses another company's customer with 400", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const job = await buildJob({ companyId: user.companyId });
    const other = await buildCustomer({ companyId: user.companyId, name: "Greta Nightingale-Oslo" });
    const ok = await agent.patch(`/api/jobs/${job.id}`).set("X-CSRF-Token", token).send({ customerId: other.id });
    expect(ok.status).toBe(200);
    expect(ok.body.data.customer).toMatchObject({ id: other.id, name: "Greta Nightingale-Oslo" });
    const foreign = await buildCustomer();
    const refused = await agent.patch(`/api/jobs/${job.id}`).set("X-CSRF-Token", token).send({ customerId: foreign.id });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields).toEqual({ customerId: "Unknown customer" });
    expect((await Job.findByPk(job.id))!.customerId).toBe(other.id);
  });

  it("answers a bad body with 400 and field paths, and an empty one with 'Nothing to change'", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const job = await buildJob({ companyId: user.companyId });
    const res = await agent.patch(`/api/jobs/${job.id}`).set("X-CSRF-Token", token).send({ status: "paid", site: { existingLayers: -1 } });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(["site.existingLayers", "status"]);
    const empty = await agent.patch(`/api/jobs/${job.id}`).set("X-CSRF-Token", token).send({});
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields).toEqual({ body: "Nothing to change" });
  });

  it.each([
    ["won", "scheduled"],
    ["scheduled", "installed"],
    ["scheduled", "won"],
    ["installed", "scheduled"],
    ["lead", "lost"],
    ["proposed", "lost"],
    ["lost", "lead"],
  ] as const)("lets an estimator move %s → %s", async (from, to) => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const job = await buildJob({ companyId: user.companyId, status: from });
    const res = await agent.patch(`/api/jobs/${job.id}`).set("X-CSRF-Token", token).send({ status: to });
    expect(res.status).toBe(200);
    expect(res.body.data.status).toBe(to);
    const audit = await AuditEvent.findOne({ where: { entityId: String(job.id), action: "updated" } });
    expect(audit!.changes).toEqual({ status: { from, to } });
  });

  it.each([
    ["lead", "won"],
    ["lead", "scheduled"],
    ["estimating", "proposed"],
    ["proposed", "won"],
    ["won", "installed"],
    ["installed", "lost"],
    ["lost", "estimating"], // no roof yet: reopen as a lead
  ] as const)("refuses %s → %s with 409 and the current status", async (from, to) => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const job = await buildJob({ companyId: user.companyId, status: from });
    const res = await agent.patch(`/api/jobs/${job.id}`).set("X-CSRF-Token", token).send({ status: to, notes: "should not be saved" });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("invalid_transition");
    expect(res.body.currentStatus).toBe(from);
    const row = await Job.findByPk(job.id);
    expect(row!.status).toBe(from);
    expect(row!.notes).toBeNull();
  });

  it("reopens a lost job that has a roof as estimating, not as a lead", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const job = await buildJob({ companyId: user.companyId, status: "lost" });
    await saveRoofFor(job);
    const asLead = await agent.patch(`/api/jobs/${job.id}`).set("X-CSRF-Token", token).send({ status: "lead" });
    expect(asLead.status).toBe(409);
    expect(asLead.body.currentStatus).toBe("lost");
    const ok = await agent.patch(`/api/jobs/${job.id}`).set("X-CSRF-Token", token).send({ status: "estimating" });
    expect(ok.status).toBe(200);
    expect(ok.body.data.status).toBe("estimating");
  });

  it("answers another company's job with 404 before validating, crew with 403", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const foreign = await buildJob({ status: "won" });
    const res = await agent.patch(`/api/jobs/${foreign.id}`).set("X-CSRF-Token", token).send({ status: "nonsense" });
    expect(res.status).toBe(404);
    const { agent: crewAgent, token: crewToken, user: crew } = await signedInAgent({ role: "crew" });
    const mine = await buildJob({ companyId: crew.companyId, status: "won" });
    await assignCrew(mine.id, [crew.id]);
    const refused = await crewAgent.patch(`/api/jobs/${mine.id}`).set("X-CSRF-Token", crewToken).send({ status: "scheduled" });
    expect(refused.status).toBe(403);
    expect((await Job.findByPk(mine.id))!.status).toBe("won");
  });
});

describe("POST /api/jobs/:id/archive and /restore", () => {
  it("archives (hidden from the board, read-only) and restores a job", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const job = await buildJob({ companyId: user.companyId });
    const archived = await agent.post(`/api/jobs/${job.id}/archive`).set("X-CSRF-Token", token);
    expect(archived.status).toBe(200);
    expect(archived.body.data.archivedAt).toEqual(expect.any(String));
    expect((await agent.get("/api/jobs")).body.meta.total).toBe(0);
    expect((await agent.get("/api/jobs?archived=1")).body.data.map((j: { id: number }) => j.id)).toEqual([job.id]);
    const edit = await agent.patch(`/api/jobs/${job.id}`).set("X-CSRF-Token", token).send({ notes: "x" });
    expect(edit.status).toBe(409);
    expect(edit.body.error.code).toBe("archived");
    const restored = await agent.post(`/api/jobs/${job.id}/restore`).set("X-CSRF-Token", token);
    expect(restored.status).toBe(200);
    expect(restored.body.data.archivedAt).toBeNull();
    expect((await agent.get("/api/jobs")).body.meta.total).toBe(1);
    const actions = (await AuditEvent.findAll({ where: { jobId: job.id }, order: [["id", "ASC"]] })).map((a) => a.action);
    expect(actions).toEqual(["archived", "restored"]);
  });

  it("answers another company's job with 404 and crew with 403", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const foreign = await buildJob();
    expect((await agent.post(`/api/jobs/${foreign.id}/archive`).set("X-CSRF-Token", token)).status).toBe(404);
    expect((await Job.findByPk(foreign.id))!.archivedAt).toBeNull();
    const { agent: crewAgent, token: crewToken, user: crew } = await signedInAgent({ role: "crew" });
    const mine = await buildJob({ companyId: crew.companyId });
    await assignCrew(mine.id, [crew.id]);
    expect((await crewAgent.post(`/api/jobs/${mine.id}/archive`).set("X-CSRF-Token", crewToken)).status).toBe(403);
  });
});

describe("PUT /api/jobs/:id/assignment", () => {
  it("sets the estimator and replaces the crew", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const c = user.companyId;
    const est = await buildUser({ companyId: c, role: "estimator" });
    const crewA = await buildUser({ companyId: c, role: "crew" });
    const crewB = await buildUser({ companyId: c, role: "crew" });
    const job = await buildJob({ companyId: c });
    await assignCrew(job.id, [crewA.id]);
    const res = await agent.put(`/api/jobs/${job.id}/assignment`).set("X-CSRF-Token", token).send({ estimatorId: est.id, crewIds: [crewB.id] });
    expect(res.status).toBe(200);
    expect(res.body.data.estimatorId).toBe(est.id);
    expect(res.body.data.crew.map((u: { id: number }) => u.id)).toEqual([crewB.id]);
    expect((await JobCrew.findAll({ where: { jobId: job.id } })).map((r) => r.userId)).toEqual([crewB.id]);
    const audit = await AuditEvent.findOne({ where: { jobId: job.id, action: "assigned" } });
    expect(audit!.changes).toEqual({ estimatorId: { from: null, to: est.id }, crewIds: { from: [crewA.id], to: [crewB.id] } });
    // The owner may be the estimator; an empty crew clears it.
    const self = await agent.put(`/api/jobs/${job.id}/assignment`).set("X-CSRF-Token", token).send({ estimatorId: user.id, crewIds: [] });
    expect(self.status).toBe(200);
    expect(self.body.data).toMatchObject({ estimatorId: user.id, crew: [] });
  });

  it("refuses users of another company, the wrong role or inactive with 400 on the field path, and changes nothing", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const c = user.companyId;
    const crewOk = await buildUser({ companyId: c, role: "crew" });
    const crewElsewhere = await buildUser({ role: "crew" });
    const crewInactive = await buildUser({ companyId: c, role: "crew", active: false });
    const notCrew = await buildUser({ companyId: c, role: "estimator" });
    const job = await buildJob({ companyId: c });
    const res = await agent
      .put(`/api/jobs/${job.id}/assignment`)
      .set("X-CSRF-Token", token)
      .send({ estimatorId: crewOk.id, crewIds: [crewOk.id, crewElsewhere.id, crewInactive.id, notCrew.id] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({
      estimatorId: "Pick an active estimator or owner of your company",
      "crewIds.1": "Pick an active crew member of your company",
      "crewIds.2": "Pick an active crew member of your company",
      "crewIds.3": "Pick an active crew member of your company",
    });
    const shape = await agent.put(`/api/jobs/${job.id}/assignment`).set("X-CSRF-Token", token).send({ crewIds: [crewOk.id, crewOk.id] });
    expect(shape.status).toBe(400);
    expect(Object.keys(shape.body.error.fields).sort()).toEqual(["crewIds", "estimatorId"]);
    expect(await countRows("job_crew")).toBe(0);
    expect((await Job.findByPk(job.id))!.estimatorId).toBeNull();
  });

  it("answers another company's job with 404 and crew with 403", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const foreign = await buildJob();
    expect((await agent.put(`/api/jobs/${foreign.id}/assignment`).set("X-CSRF-Token", token).send({ estimatorId: null, crewIds: [] })).status).toBe(404);
    const { agent: crewAgent, token: crewToken, user: crew } = await signedInAgent({ role: "crew" });
    const mine = await buildJob({ companyId: crew.companyId });
    await assignCrew(mine.id, [crew.id]);
    const res = await crewAgent.put(`/api/jobs/${mine.id}/assignment`).set("X-CSRF-Token", crewToken).send({ estimatorId: null, crewIds: [] });
    expect(res.status).toBe(403);
    expect(await countRows("job_crew")).toBe(1);
  });
});

describe("company isolation", () => {
  it("never lists another company's jobs, even with a matching search", async () => {
    const { agent, user } = await signedInAgent({ role: "owner" });
    const otherCompany = await buildCompany();
    await buildJob({ companyId: otherCompany.id, customerId: (await buildCustomer({ companyId: otherCompany.id, name: "Zanzibar Quince" })).id });
    await buildJob({ companyId: user.companyId });
    const res = await agent.get("/api/jobs?q=quince");
    expect(res.body.meta.total).toBe(0);
    expect((await agent.get("/api/jobs")).body.meta.total).toBe(1);
  });
});
