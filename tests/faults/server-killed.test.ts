/**
 * Drill: the server process killed with SIGKILL in the middle of roof saves. Large roofs (hundreds of
 * planes, a takeoff of about a megabyte) keep each save busy for a while; the process is killed while
 * saves are in flight, started again, and every stored roof must be one complete version: its planes, its
 * takeoff (the engine's result for exactly those planes), jobs.squares and its audit rows agree, never a
 * mix of two saves.
 */
import { afterAll, describe, expect, inject, it } from "vitest";
import { buildUser, TEST_PASSWORD } from "../helpers/factories";
import { buildJob, roofBody, saveRoofFor } from "../helpers/job-factories";
import { testSequelize } from "../helpers/db";
import { seedDemoPriceBook } from "../../server/db/seeders/demo-price-book";
import { gableRoof, hipRoof } from "../../shared/engine/roof/generators";
import type { RoofSaveValues } from "../../shared/schemas/roof";
import { Client, sleep } from "./helpers/http-client";
import { startServerProcess, type ServerProcess } from "./helpers/server-process";
import { roofProblems } from "./helpers/consistency";

const db = inject("faultsDb");
let server: ServerProcess | null = null;

afterAll(async () => {
  await server?.kill("SIGTERM");
});

const stack = { id: "main", name: "Synthetic on the deck", underlayment: { kind: "synthetic" as const, highTemp: true }, spacer: { kind: "none" as const } };

/** A subdivision of hip roofs: `count` houses on a grid (4 planes each). */
function hipStreet(count: number, version: number): RoofSaveValues {
  const planes = [];
  for (let i = 0; i < count; i++) {
    planes.push(...hipRoof(30 + (i % 7), 20 + (i % 5), 6, { idPrefix: `h${i}`, origin: [(i % 12) * 60, Math.floor(i / 12) * 50] }));
  }
  return { planes, stacks: [stack], defaultStackId: "main", version };
}

/** A row of gables (2 planes each) at another pitch: a different plane count and takeoff. */
function gableStreet(count: number, version: number): RoofSaveValues {
  const planes = [];
  for (let i = 0; i < count; i++) {
    planes.push(...gableRoof(36 + (i % 4), 24, 8, { idPrefix: `g${i}`, origin: [(i % 10) * 50, Math.floor(i / 10) * 40] }));
  }
  return { planes, stacks: [stack], defaultStackId: "main", version };
}

const SHAPES = [(v: number) => hipStreet(120, v), (v: number) => gableStreet(150, v)];
const PLANE_COUNTS = new Set([roofBody(0).planes.length, hipStreet(120, 0).planes.length, gableStreet(150, 0).planes.length]);

describe("the server killed (SIGKILL) during roof saves", () => {
  it("keeps every stored roof one complete version, through three kills and restarts", async () => {
    const owner = await buildUser({ role: "owner" });
    await seedDemoPriceBook(testSequelize(), owner.companyId);
    const jobs = [];
    for (let i = 0; i < 3; i++) {
      const job = await buildJob({ companyId: owner.companyId, status: "estimating" });
      await saveRoofFor(job, roofBody(0));
      jobs.push(job);
    }
    const acked = new Map<number, number[]>(jobs.map((j) => [j.id, [1]]));
    let cutOff = 0; // saves whose answer never came (the process died under them)

    for (let round = 0; round < 3; round++) {
      server = await startServerProcess(db);
      const client = await new Client(server.url).signIn(owner.email, TEST_PASSWORD);
      const versions = new Map<number, number>();
      for (const j of jobs) versions.set(j.id, (await client.get(`/api/jobs/${j.id}/roof`)).body.data.version);

      let inFlight = 0;
      let dead = false;
      const writers = jobs.map((job, w) =>
        (async () => {
          for (let n = 0; !dead; n++) {
            inFlight += 1;
            try {
              const r = await client.put(`/api/jobs/${job.id}/roof`, SHAPES[(n + w) % 2](versions.get(job.id)!));
              if (r.status === 200) {
                versions.set(job.id, r.body.data.version);
                acked.get(job.id)!.push(r.body.data.version);
              } else if (r.status === 409) versions.set(job.id, r.body.currentVersion);
              else throw new Error(`roof save answered ${r.status}: ${JSON.stringify(r.body)}`);
            } catch (err) {
              if (!dead) throw err;
              cutOff += 1; // the connection died with the process
            } finally {
              inFlight -= 1;
            }
          }
        })(),
      );
      // Let a few saves land, then kill at a moment when all three writers are waiting on a save.
      await sleep(800 + round * 400);
      while (inFlight < jobs.length) await sleep(5);
      await sleep(40 + round * 60); // somewhere inside the save: parsing, the engine, or the database write
      dead = true;
      await server.kill("SIGKILL");
      expect(server.child.signalCode).toBe("SIGKILL");
      await Promise.all(writers);

      // Straight from the database, before anything is started again: whole versions only.
      for (const job of jobs) {
        const { problems, state } = await roofProblems(job.id);
        expect(problems).toEqual([]);
        expect(PLANE_COUNTS.has(state!.planes)).toBe(true);
        for (const v of acked.get(job.id)!) expect(state!.auditVersions).toContain(v);
      }
    }
    expect(cutOff).toBeGreaterThanOrEqual(3); // saves really were in flight at the kills
    console.log(`[drill kill -9] ${[...acked.values()].reduce((n, a) => n + a.length - 1, 0)} saves acknowledged, ${cutOff} cut off by the kills`);

    // A fresh process serves the stored versions and accepts the next save on top of them.
    server = await startServerProcess(db);
    const client = await new Client(server.url).signIn(owner.email, TEST_PASSWORD);
    for (const job of jobs) {
      const { state } = await roofProblems(job.id);
      const got = await client.get(`/api/jobs/${job.id}/roof`);
      expect(got.body.data.version).toBe(state!.version);
      expect(got.body.data.planes).toHaveLength(state!.planes);
      const next = await client.put(`/api/jobs/${job.id}/roof`, roofBody(state!.version));
      expect(next.status).toBe(200);
      expect(next.body.data.version).toBe(state!.version + 1);
      expect((await roofProblems(job.id)).problems).toEqual([]);
    }
  });
});
