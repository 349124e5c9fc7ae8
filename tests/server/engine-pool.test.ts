import { afterEach, describe, expect, it } from "vitest";
import { EnginePool } from "../../server/services/engine-pool";
import { computeStoredTakeoffOfParsed, takeoffSquares } from "../../server/services/roof-takeoff";
import { HttpError } from "../../server/errors";
import { roofSaveSchema, type RoofDocument } from "../../shared/schemas/roof";
import { roofBody } from "../helpers/job-factories";

const site = { atticType: "vented", atticFloorAreaSqFt: 1200, climateZone: "5A", iceDamRisk: true };

/** A parsed roof document, as the roof save hands it over (no version, no underlay). */
function documentOf(body = roofBody(0)): RoofDocument {
  const { version: _version, underlay: _underlay, ...doc } = roofSaveSchema.parse(body);
  return doc;
}

const pools: EnginePool[] = [];
const pool = (size: number, url?: URL) => {
  const p = new EnginePool(size, url);
  pools.push(p);
  return p;
};
afterEach(async () => {
  await Promise.all(pools.splice(0).map((p) => p.close()));
});

describe("EnginePool (the takeoff of a roof save in worker threads)", () => {
  it("answers exactly what the engine gives on the event loop: the same JSON text and squares", async () => {
    const doc = documentOf();
    const inline = computeStoredTakeoffOfParsed(documentOf(), site, {});
    const fromWorker = await pool(1).storedTakeoff(doc, site, {});
    expect(fromWorker.json).toBe(JSON.stringify(inline));
    expect(fromWorker.squares).toBe(takeoffSquares(inline));
    // 40 × 30 gable at 6/12 and a 12 × 8 shed at 2/12: 1200 × √(6² + 12²)/12 + 96 × √(2² + 12²)/12 ft²
    // (rafter-table slope factors) = 14.39 squares
    expect(fromWorker.squares).toBeCloseTo(14.39, 2);
    // size 0: on the event loop, the same answer
    expect((await pool(0).storedTakeoff(documentOf(), site, {})).json).toBe(fromWorker.json);
  });

  it("several saves at once each get their own roof's takeoff back", async () => {
    const p = pool(2);
    const pitches = [2, 4, 6, 8, 10, 12];
    const bodies = pitches.map((pitch) => roofBody(0, { planes: roofBody(0).planes.map((pl) => ({ ...pl, pitch })) }));
    const results = await Promise.all(bodies.map((b) => p.storedTakeoff(documentOf(b), site, {})));
    results.forEach((r, i) => {
      expect(r.json).toBe(JSON.stringify(computeStoredTakeoffOfParsed(documentOf(bodies[i]), site, {})));
    });
    // steeper roofs, more squares: each answer went back to its own caller
    const squares = results.map((r) => r.squares!);
    expect([...squares].sort((a, b) => a - b)).toEqual(squares);
  });

  it("an engine refusal is the same 400, with the same field paths, as on the event loop", async () => {
    const badSite = { ...site, atticType: "basement" };
    let inline: unknown;
    try {
      computeStoredTakeoffOfParsed(documentOf(), badSite, {});
    } catch (err) {
      inline = err;
    }
    expect(inline).toBeInstanceOf(HttpError);
    const refused = await pool(1).storedTakeoff(documentOf(), badSite, {}).then(
      () => null,
      (err: unknown) => err,
    );
    expect(refused).toBeInstanceOf(HttpError);
    const [a, b] = [inline as HttpError, refused as HttpError];
    expect({ status: b.status, code: b.code, message: b.message, fields: b.fields }).toEqual({ status: a.status, code: a.code, message: a.message, fields: a.fields });
    expect(b.status).toBe(400);
    expect(Object.keys(b.fields ?? {})).toContain("site.atticType");
  });

  it("a worker that dies fails only the task it had, and the next task gets a new worker", async () => {
    const p = pool(1, new URL("../helpers/engine-worker-that-exits.ts", import.meta.url));
    const good = await p.storedTakeoff(documentOf(), site, {});
    await expect(p.storedTakeoff(documentOf(), "exit", {})).rejects.toThrow(/engine worker stopped \(exit code 3\)/);
    const again = await p.storedTakeoff(documentOf(), site, {});
    expect(again.json).toBe(good.json);
  });

  it("after close, takeoffs are computed on the event loop", async () => {
    const p = pool(1);
    const before = await p.storedTakeoff(documentOf(), site, {});
    await p.close();
    expect((await p.storedTakeoff(documentOf(), site, {})).json).toBe(before.json);
  });
});
