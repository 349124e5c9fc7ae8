import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { computeTakeoff } from "../../shared/engine/takeoff";
import { hipRoof } from "../../shared/engine/roof/generators";
import { createTestApp } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { countRows, truncateAll } from "../helpers/db";
import { assignCrew, buildJob, roofBody, saveRoofFor } from "../helpers/job-factories";
import { AuditEvent, Job, Roof } from "../../server/models/index";
import { rulesForCompany } from "../../server/services/price-book-rules";

beforeEach(truncateAll);

const underlay = { src: "/api/files/plan-17", originFt: [-5, -5] as [number, number], widthFt: 80, rotationDeg: 0, opacity: 0.4, visible: true };

describe("GET /api/jobs/:id/roof", () => {
  it("answers a job without a roof with version 0 and empty arrays", async () => {
    const { agent, user } = await signedInAgent({ role: "estimator" });
    const job = await buildJob({ companyId: user.companyId });
    const res = await agent.get(`/api/jobs/${job.id}/roof`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ data: { planes: [], stacks: [], defaultStackId: "", version: 0 } });
    expect((await agent.get(`/api/jobs/${job.id}/takeoff`)).body).toEqual({ data: null });
  });

  it("lets assigned crew read the roof and takeoff, answers 404 to other crew and other companies", async () => {
    const { agent, user } = await signedInAgent({ role: "crew" });
    const mine = await buildJob({ companyId: user.companyId });
    const notMine = await buildJob({ companyId: user.companyId });
    await assignCrew(mine.id, [user.id]);
    await saveRoofFor(mine);
    await saveRoofFor(notMine);
    const roof = await agent.get(`/api/jobs/${mine.id}/roof`);
    expect(roof.status).toBe(200);
    expect(roof.body.data.version).toBe(1);
    const takeoff = await agent.get(`/api/jobs/${mine.id}/takeoff`);
    expect(takeoff.status).toBe(200);
    expect(takeoff.body.data.totals.squares).toBeGreaterThan(0);
    // The takeoff has quantities, never prices.
    const keys: string[] = [];
    JSON.stringify(takeoff.body, (k, v) => (k && keys.push(k), v));
    expect(keys.filter((k) => /cost|price|margin|cents/i.test(k))).toEqual([]);
    expect((await agent.get(`/api/jobs/${notMine.id}/roof`)).status).toBe(404);
    expect((await agent.get(`/api/jobs/${notMine.id}/takeoff`)).status).toBe(404);

    const { agent: owner } = await signedInAgent({ role: "owner" });
    expect((await owner.get(`/api/jobs/${mine.id}/roof`)).status).toBe(404);
    expect((await owner.get(`/api/jobs/${mine.id}/takeoff`)).status).toBe(404);
    expect((await request(createTestApp()).get(`/api/jobs/${mine.id}/roof`)).status).toBe(401);
  });
});

describe("PUT /api/jobs/:id/roof", () => {
  it("first save (version 0) creates version 1, stores the engine's takeoff, sets squares and moves the lead to estimating", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const job = await buildJob({ companyId: user.companyId, status: "lead" });
    const res = await agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send(roofBody(0, { underlay }));
    expect(res.status).toBe(200);
    const data = res.body.data;
    expect(data.version).toBe(1);
    expect(data.planes.map((p: { id: string }) => p.id)).toEqual(["house-s", "house-n", "porch-1"]);
    expect(data.underlay).toEqual(underlay);
    expect(data.defaultStackId).toBe("main");

    // The stored takeoff is exactly the engine's result for the stored roof, the job's site and the company's rules.
    const stored = await Roof.findOne({ where: { jobId: job.id } });
    const row = await Job.findByPk(job.id);
    const doc = (await agent.get(`/api/jobs/${job.id}/roof`)).body.data;
    const expected = computeTakeoff({
      site: row!.site,
      planes: doc.planes,
      stacks: doc.stacks,
      defaultStackId: doc.defaultStackId,
      rules: await rulesForCompany(user.companyId),
    });
    expect(expected.ok).toBe(true);
    if (!expected.ok) return;
    expect(stored!.takeoff).toEqual(JSON.parse(JSON.stringify(expected.result)));
    expect(data.takeoff).toEqual(stored!.takeoff);
    expect((await agent.get(`/api/jobs/${job.id}/takeoff`)).body.data).toEqual(stored!.takeoff);

    // 40 × 30 ft gable at 6/12: 1200 ft² plan × √(6² + 12²)/12 = 1341.64 ft²; porch 12 × 8 at 2/12:
    // 96 × √(2² + 12²)/12 = 97.33 ft²; together 14.39 squares (rafter-table slope factors).
    expect(data.takeoff.totals.squares).toBeCloseTo((1200 * Math.hypot(6, 12) / 12 + 96 * Math.hypot(2, 12) / 12) / 100, 6);
    expect(row!.status).toBe("estimating");
    expect(Number(row!.squares)).toBeCloseTo(14.39, 2);

    const events = await AuditEvent.findAll({ where: { jobId: job.id }, order: [["id", "ASC"]] });
    expect(events.map((e) => [e.entityType, e.action])).toEqual([
      ["roof", "created"],
      ["job", "status_changed"],
    ]);
    expect(events[1].changes).toEqual({ status: { from: "lead", to: "estimating" }, reason: "first roof saved" });
  });

  it("does not move a job that is past lead", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const job = await buildJob({ companyId: user.companyId, status: "won" });
    expect((await agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send(roofBody(0))).status).toBe(200);
    expect((await Job.findByPk(job.id))!.status).toBe("won");
  });

  it("adds 1 per accepted save, keeps the underlay when a save leaves it out and removes it on null", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const job = await buildJob({ companyId: user.companyId });
    await agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send(roofBody(0, { underlay })).expect(200);
    // the job's last change is set back an hour, so the next save is seen to move it
    await Job.update({ updatedAt: new Date(Date.now() - 3_600_000) }, { where: { id: job.id }, silent: true });
    const hip = hipRoof(50, 30, 8, { idPrefix: "hip" });
    const second = await agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send(roofBody(1, { planes: hip }));
    expect(second.status).toBe(200);
    expect(second.body.data.version).toBe(2);
    expect(second.body.data.underlay).toEqual(underlay);
    expect(second.body.data.planes).toHaveLength(4);
    // 50 × 30 hip at 8/12: 1500 ft² × √(8² + 12²)/12 = 1802.78 ft² (rafter-table slope factor).
    expect(second.body.data.takeoff.totals.squares).toBeCloseTo((1500 * Math.hypot(8, 12)) / 12 / 100, 6);
    const afterSecond = (await Job.findByPk(job.id))!;
    expect(Number(afterSecond.squares)).toBeCloseTo(18.03, 2);
    expect(Date.now() - afterSecond.updatedAt.getTime()).toBeLessThan(60_000);
    const saved = await AuditEvent.findAll({ where: { jobId: job.id, entityType: "roof", action: "saved" } });
    expect(saved.map((e) => e.changes)).toEqual([
      { version: { from: 1, to: 2 }, planes: 4, stacks: 2, squares: 18.03 },
    ]);
    const third = await agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send(roofBody(2, { underlay: null }));
    expect(third.body.data.version).toBe(3);
    expect(third.body.data).not.toHaveProperty("underlay");
    expect((await agent.get(`/api/jobs/${job.id}/roof`)).body.data).not.toHaveProperty("underlay");
  });

  it("of two saves with the same version, one wins and the other gets 409 with the current version; nothing is overwritten", async () => {
    const app = createTestApp();
    const a = await signedInAgent({ role: "estimator" }, app);
    const b = await signedInAgent({ role: "owner", companyId: a.user.companyId }, app);
    const job = await buildJob({ companyId: a.user.companyId });
    await a.agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", a.token).send(roofBody(0)).expect(200);

    const fromA = roofBody(1, { planes: hipRoof(30, 30, 6, { idPrefix: "a" }) });
    const fromB = roofBody(1, { planes: hipRoof(44, 26, 10, { idPrefix: "b" }) });
    const [ra, rb] = await Promise.all([
      a.agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", a.token).send(fromA),
      b.agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", b.token).send(fromB),
    ]);
    expect([ra.status, rb.status].sort()).toEqual([200, 409]);
    const [winner, loser, winnerPrefix] = ra.status === 200 ? [ra, rb, "a-"] : [rb, ra, "b-"];
    expect(winner.body.data.version).toBe(2);
    expect(loser.body).toMatchObject({ error: { code: "stale_version" }, currentVersion: 2 });
    const stored = (await a.agent.get(`/api/jobs/${job.id}/roof`)).body.data;
    expect(stored.version).toBe(2);
    expect(stored.planes.every((p: { id: string }) => p.id.startsWith(winnerPrefix))).toBe(true);
    expect((await AuditEvent.count({ where: { jobId: job.id, entityType: "roof" } }))).toBe(2);

    // A save from the stale copy later is refused too, and a save at the current version goes through.
    const late = await a.agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", a.token).send(roofBody(1));
    expect(late.status).toBe(409);
    expect(late.body.currentVersion).toBe(2);
    const ahead = await a.agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", a.token).send(roofBody(7));
    expect(ahead.status).toBe(409);
    expect(ahead.body.currentVersion).toBe(2);
    const ok = await a.agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", a.token).send(roofBody(2));
    expect(ok.status).toBe(200);
    expect(ok.body.data.version).toBe(3);
  });

  it("refuses a second first save (version 0 once a roof exists) with 409", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const job = await buildJob({ companyId: user.companyId });
    const [r1, r2] = await Promise.all([
      agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send(roofBody(0)),
      agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send(roofBody(0, { planes: hipRoof(20, 20, 4) })),
    ]);
    expect([r1.status, r2.status].sort()).toEqual([200, 409]);
    expect((r1.status === 409 ? r1 : r2).body.currentVersion).toBe(1);
    expect(await countRows("roofs")).toBe(1);
  });

  it("answers bad input with 400 and field paths, and stores nothing", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const job = await buildJob({ companyId: user.companyId });
    const body = roofBody(0);
    const res = await agent
      .put(`/api/jobs/${job.id}/roof`)
      .set("X-CSRF-Token", token)
      .send({
        ...body,
        version: -1,
        planes: [
          { ...body.planes[0], pitch: 30 },
          { ...body.planes[1], outline: [[0, 0], [1, 1]] },
        ],
        underlay: { src: "https://elsewhere.example.com/x.png", widthFt: 0 },
      });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toMatchObject({
      version: "Must be 0 or more",
      "planes.0.pitch": "Pitch must be at most 24",
      "planes.1.outline": "A plane needs at least 3 corners",
      "underlay.src": "Use a path on this server, such as /api/files/123",
      "underlay.widthFt": "Must be more than 0",
    });
    // The takeoff input's cross-checks: an unknown stack, an eave edge out of range, a self-crossing outline.
    const cross = await agent
      .put(`/api/jobs/${job.id}/roof`)
      .set("X-CSRF-Token", token)
      .send({
        ...body,
        planes: [
          { ...body.planes[0], stackId: "nope" },
          { ...body.planes[1], eaveEdge: 9 },
          { id: "bow", name: "Bow tie", pitch: 4, eaveEdge: 0, outline: [[0, 0], [10, 10], [10, 0], [0, 10]] },
        ],
      });
    expect(cross.status).toBe(400);
    expect(cross.body.error.fields).toEqual({
      "planes.0.stackId": 'Unknown assembly "nope"',
      "planes.1.eaveEdge": "The eave edge must be an edge number from 0 to 3",
      "planes.2.outline": "The outline crosses itself (edges 0 and 2)",
    });
    const empty = await agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send({ version: 0 });
    expect(empty.status).toBe(400);
    expect(Object.keys(empty.body.error.fields).sort()).toEqual(["defaultStackId", "planes", "stacks"]);
    expect(await countRows("roofs")).toBe(0);
    expect((await Job.findByPk(job.id))!.status).toBe("lead");
  });

  it("refuses crew with 403, another company's job with 404 (before validating), anonymous with 401 and no CSRF token with 403", async () => {
    const { agent, token, user } = await signedInAgent({ role: "crew" });
    const job = await buildJob({ companyId: user.companyId });
    await assignCrew(job.id, [user.id]);
    expect((await agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send(roofBody(0))).status).toBe(403);

    const { agent: owner, token: ownerToken } = await signedInAgent({ role: "owner" });
    const foreign = await owner.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", ownerToken).send({ nonsense: true });
    expect(foreign.status).toBe(404);

    const anon = request.agent(createTestApp());
    const csrf = (await anon.get("/api/auth/csrf")).body.token;
    expect((await anon.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", csrf).send(roofBody(0))).status).toBe(401);

    const { agent: est } = await signedInAgent({ role: "estimator", companyId: user.companyId });
    const noToken = await est.put(`/api/jobs/${job.id}/roof`).send(roofBody(0));
    expect(noToken.status).toBe(403);
    expect(noToken.body.error.code).toBe("csrf");
    expect(await countRows("roofs")).toBe(0);
  });

  it("refuses a save on an archived job with 409", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const job = await buildJob({ companyId: user.companyId, archivedAt: new Date() });
    const res = await agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send(roofBody(0));
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("archived");
    expect(await countRows("roofs")).toBe(0);
  });
});
