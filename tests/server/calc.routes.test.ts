import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createTestApp } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { truncateAll } from "../helpers/db";
import { gableRoof } from "../../shared/engine/roof/generators";
import { computeTakeoff, computeTakeoffQuantities } from "../../shared/engine/takeoff";
import { gapStudyQuantitiesSchema, gapStudyResultSchema, takeoffQuantitiesSchema, takeoffResultSchema } from "../../shared/schemas/takeoff-result";

beforeEach(truncateAll);

/** `engine;dur=1.234, json;dur=0.5` as { engine: 1.234, json: 0.5 }; throws on anything else. */
function serverTiming(header: string | undefined): Record<string, number> {
  const out: Record<string, number> = {};
  for (const part of (header ?? "").split(",")) {
    const m = /^\s*([a-z]+);dur=(\d+(?:\.\d+)?)\s*$/.exec(part);
    if (!m) throw new Error(`not a Server-Timing entry: "${part}"`);
    out[m[1]] = Number(m[2]);
  }
  return out;
}

const stack = {
  id: "s1",
  name: "Mesh and foil",
  underlayment: { kind: "synthetic", highTemp: true },
  spacer: { kind: "mesh" },
  radiantBarrier: { kind: "foil", position: "on-deck", reflectiveFace: "up" },
  panel: { system: "standing-seam", coverageWidthIn: 16, gauge: 24, solarReflectance: 0.3, thermalEmittance: 0.85 },
};

const gableInput = () => ({
  site: { atticType: "vented", climateZone: "4A" },
  planes: gableRoof(40, 30, 6),
  stacks: [stack],
  defaultStackId: "s1",
});

describe("POST /api/calc/takeoff", () => {
  it.each(["owner", "estimator", "crew"] as const)("returns the engine's result to a signed-in %s", async (role) => {
    const { agent, token } = await signedInAgent({ role });
    const res = await agent.post("/api/calc/takeoff").set("X-CSRF-Token", token).send(gableInput());
    expect(res.status).toBe(200);
    const expected = computeTakeoffQuantities(gableInput());
    expect(expected.ok).toBe(true);
    // The route is the engine: same input, same numbers (each plane's quantities unless detail=full).
    expect(res.body.data).toEqual(JSON.parse(JSON.stringify(expected.ok && expected.result)));
    expect(res.body.data.planes[0]).not.toHaveProperty("windZones");
    // The answer is what the output schema describes, key for key (strict objects).
    expect(takeoffQuantitiesSchema.safeParse(res.body.data).error).toBeUndefined();
    // 40 × 30 ft gable at 6/12: plan 1200 ft², slope factor √(144+36)/12 = 1.1180 (rafter tables), sloped 1341.6 ft².
    expect(res.body.data.totals.planAreaSqFt).toBeCloseTo(1200, 6);
    expect(res.body.data.totals.slopedAreaSqFt).toBeCloseTo(1200 * Math.sqrt(180) / 12, 6);
    // One ridge of 40 ft, counted once although two planes share it.
    expect(res.body.data.edgeTotals.ridgeLf).toBeCloseTo(40, 6);
  });

  it("names the engine's time and the serialisation's in a Server-Timing header (W3C Server Timing syntax)", async () => {
    const { agent, token } = await signedInAgent({ role: "estimator" });
    for (const path of ["/api/calc/takeoff", "/api/calc/takeoff?detail=full"]) {
      const res = await agent.post(path).set("X-CSRF-Token", token).send(gableInput());
      expect(res.status).toBe(200);
      expect(res.headers["content-type"]).toBe("application/json; charset=utf-8");
      const timing = serverTiming(res.headers["server-timing"]);
      expect(Object.keys(timing)).toEqual(["engine", "json"]);
      expect(timing.engine).toBeGreaterThan(0);
      expect(timing.json).toBeGreaterThan(0);
    }
    // A refused input has no timing: the error handler answers it.
    const input = gableInput();
    input.planes[0].pitch = 30;
    const bad = await agent.post("/api/calc/takeoff").set("X-CSRF-Token", token).send(input);
    expect(bad.status).toBe(400);
    expect(bad.headers["server-timing"]).toBeUndefined();
  });

  it("gives each plane's whole detail with detail=full, and 400 for another detail", async () => {
    const { agent, token } = await signedInAgent({ role: "estimator" });
    const res = await agent.post("/api/calc/takeoff?detail=full").set("X-CSRF-Token", token).send(gableInput());
    expect(res.status).toBe(200);
    const expected = computeTakeoff(gableInput());
    expect(res.body.data).toEqual(JSON.parse(JSON.stringify(expected.ok && expected.result)));
    expect(res.body.data.planes[0].windZones.widths.zone2PlanFt).toBeGreaterThan(0);
    expect(res.body.data.planes[0].vertices).toHaveLength(4);
    expect(takeoffResultSchema.safeParse(res.body.data).error).toBeUndefined();
    const lean = await agent.post("/api/calc/takeoff?detail=quantities").set("X-CSRF-Token", token).send(gableInput());
    expect(lean.status).toBe(200);
    // The roof-wide figures do not depend on the detail asked for.
    for (const key of ["edgeTotals", "totals", "materials", "fasteners", "ventilation", "thermal", "advisories"]) {
      expect(lean.body.data[key]).toEqual(res.body.data[key]);
    }
    const bad = await agent.post("/api/calc/takeoff?detail=everything").set("X-CSRF-Token", token).send(gableInput());
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty("detail");
  });

  it("answers bad input with 400 and the field path", async () => {
    const { agent, token } = await signedInAgent();
    const input = gableInput();
    input.planes[1].pitch = 25;
    const res = await agent.post("/api/calc/takeoff").set("X-CSRF-Token", token).send(input);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain("planes.1.pitch");
  });

  it("answers an unknown stack id with 400 at the plane's stackId", async () => {
    const { agent, token } = await signedInAgent();
    const input = gableInput();
    (input.planes[0] as { stackId?: string }).stackId = "nope";
    const res = await agent.post("/api/calc/takeoff").set("X-CSRF-Token", token).send(input);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain("planes.0.stackId");
  });

  it("needs a session (401) and the CSRF token (403)", async () => {
    expect((await request(createTestApp()).post("/api/calc/takeoff").send(gableInput())).status).toBe(401);
    const { agent } = await signedInAgent();
    expect((await agent.post("/api/calc/takeoff").send(gableInput())).status).toBe(403);
  });
});

describe("POST /api/calc/gap-study", () => {
  it("returns one entry per spacer option", async () => {
    const { agent, token } = await signedInAgent();
    const res = await agent
      .post("/api/calc/gap-study")
      .set("X-CSRF-Token", token)
      .send({ ...gableInput(), planeIds: ["p-s"] });
    expect(res.status).toBe(200);
    expect(res.body.data.options.map((o: { spacer: string }) => o.spacer)).toEqual([
      "none",
      "battens",
      "counter-battens",
      "mesh",
      "dimpled",
    ]);
    for (const o of res.body.data.options) expect(o.result.totals.planAreaSqFt).toBeGreaterThan(0);
    // Each plane's quantities by default, its whole detail with detail=full.
    expect(Object.keys(res.body.data.options[0].result.planes[0])).not.toContain("layers");
    expect(gapStudyQuantitiesSchema.safeParse(res.body.data).error).toBeUndefined();
    expect(Object.keys(serverTiming(res.headers["server-timing"]))).toEqual(["engine", "json"]);
    const full = await agent
      .post("/api/calc/gap-study?detail=full")
      .set("X-CSRF-Token", token)
      .send({ ...gableInput(), planeIds: ["p-s"] });
    expect(full.status).toBe(200);
    expect(full.body.data.options[3].result.planes[0].layers.meshSqFt).toBeGreaterThan(0);
    expect(gapStudyResultSchema.safeParse(full.body.data).error).toBeUndefined();
    expect(full.body.data.options.map((o: { summary: unknown }) => o.summary)).toEqual(res.body.data.options.map((o: { summary: unknown }) => o.summary));
  });

  it("answers a missing planeIds with 400", async () => {
    const { agent, token } = await signedInAgent();
    const res = await agent.post("/api/calc/gap-study").set("X-CSRF-Token", token).send(gableInput());
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain("planeIds");
  });
});

describe("POST /api/calc/echo", () => {
  it("returns the body as received to a signed-in user (the benchmark's baseline)", async () => {
    const { agent, token } = await signedInAgent({ role: "crew" });
    const res = await agent.post("/api/calc/echo").set("X-CSRF-Token", token).send(gableInput());
    expect(res.status).toBe(200);
    expect(res.body.data).toEqual(gableInput());
  });

  it("needs a session", async () => {
    expect((await request(createTestApp()).post("/api/calc/echo").send({ a: 1 })).status).toBe(401);
  });
});
