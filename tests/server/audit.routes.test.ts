import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createTestApp } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { buildUser } from "../helpers/factories";
import { truncateAll } from "../helpers/db";
import { assignCrew, buildCustomer, buildJob, roofBody } from "../helpers/job-factories";
import { recordAudit } from "../../server/services/audit.service";

beforeEach(truncateAll);

describe("GET /api/jobs/:id/audit", () => {
  it("lists the job's events newest first with the actor's name, and nothing from other jobs", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator", name: "Rowan Ashdown" });
    const customer = await buildCustomer({ companyId: user.companyId });
    const created = await agent.post("/api/jobs").set("X-CSRF-Token", token).send({ customerId: customer.id });
    const jobId = created.body.data.id;
    await agent.put(`/api/jobs/${jobId}/roof`).set("X-CSRF-Token", token).send(roofBody(0)).expect(200);
    await agent.patch(`/api/jobs/${jobId}`).set("X-CSRF-Token", token).send({ notes: "Gate code 4471" }).expect(200);
    const other = await agent.post("/api/jobs").set("X-CSRF-Token", token).send({ customerId: customer.id });
    expect(other.status).toBe(201);

    const res = await agent.get(`/api/jobs/${jobId}/audit`);
    expect(res.status).toBe(200);
    expect(res.body.meta).toEqual({ page: 1, pageSize: 25, total: 4 });
    expect(res.body.data.map((e: { entityType: string; action: string }) => `${e.entityType}:${e.action}`)).toEqual([
      "job:updated",
      "job:status_changed",
      "roof:created",
      "job:created",
    ]);
    expect(res.body.data[0]).toMatchObject({
      jobId,
      actor: { id: user.id, name: "Rowan Ashdown" },
      changes: { notes: { from: null, to: "Gate code 4471" } },
      createdAt: expect.any(String),
    });
    const page2 = await agent.get(`/api/jobs/${jobId}/audit?pageSize=3&page=2`);
    expect(page2.body.data.map((e: { action: string }) => e.action)).toEqual(["created"]);
  });

  it("refuses crew with 403 (even on an assigned job), another company's job with 404, anonymous with 401", async () => {
    const { agent, user } = await signedInAgent({ role: "crew" });
    const job = await buildJob({ companyId: user.companyId });
    await assignCrew(job.id, [user.id]);
    expect((await agent.get(`/api/jobs/${job.id}/audit`)).status).toBe(403);
    const { agent: owner } = await signedInAgent({ role: "owner" });
    expect((await owner.get(`/api/jobs/${job.id}/audit`)).status).toBe(404);
    expect((await request(createTestApp()).get(`/api/jobs/${job.id}/audit`)).status).toBe(401);
  });
});

describe("GET /api/audit", () => {
  it("lists the company's events for the owner, newest first, paged and filtered, never another company's", async () => {
    const { agent, user } = await signedInAgent({ role: "owner", name: "Mara Tolland" });
    const teammate = await buildUser({ companyId: user.companyId, role: "estimator", name: "Seb Oakes" });
    const stranger = await buildUser({ role: "owner" });
    await recordAudit({ companyId: user.companyId, actorId: user.id, entityType: "user", entityId: teammate.id, action: "created" });
    await recordAudit({ companyId: user.companyId, actorId: teammate.id, entityType: "customer", entityId: 5, action: "updated", changes: { phone: { from: null, to: "555-0110" } } });
    await recordAudit({ companyId: user.companyId, actorId: null, entityType: "job", entityId: 9, jobId: 9, action: "status_changed" });
    await recordAudit({ companyId: stranger.companyId, actorId: stranger.id, entityType: "user", entityId: 1, action: "created" });

    const res = await agent.get("/api/audit");
    expect(res.status).toBe(200);
    expect(res.body.meta).toEqual({ page: 1, pageSize: 25, total: 3 });
    expect(res.body.data.map((e: { action: string }) => e.action)).toEqual(["status_changed", "updated", "created"]);
    expect(res.body.data[0].actor).toBeNull();
    expect(res.body.data[1]).toMatchObject({ entityType: "customer", entityId: "5", actor: { id: teammate.id, name: "Seb Oakes" } });

    const paged = await agent.get("/api/audit?pageSize=1&page=2");
    expect(paged.body.data.map((e: { action: string }) => e.action)).toEqual(["updated"]);
    const byType = await agent.get("/api/audit?entityType=user");
    expect(byType.body.data.map((e: { entityId: string }) => e.entityId)).toEqual([String(teammate.id)]);
    const byActor = await agent.get(`/api/audit?actorId=${teammate.id}`);
    expect(byActor.body.data.map((e: { entityType: string }) => e.entityType)).toEqual(["customer"]);
    const bad = await agent.get("/api/audit?pageSize=0");
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ pageSize: "At least 1" });
  });

  it.each(["estimator", "crew"] as const)("refuses a %s with 403", async (role) => {
    const { agent } = await signedInAgent({ role });
    const res = await agent.get("/api/audit");
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("forbidden");
  });

  it("refuses anonymous with 401", async () => {
    expect((await request(createTestApp()).get("/api/audit")).status).toBe(401);
  });
});
