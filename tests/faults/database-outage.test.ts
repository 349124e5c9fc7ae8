/**
 * Drill: MariaDB stopped and started again under a running server (a child process serving signed-in
 * requests). While the database is away every request answers 503 with the error body, quickly; once it
 * is back the same server process answers 200 again by itself; writes in flight at the stop (roof saves
 * with their audit rows, new quotes with their revision, options and lines) either landed whole or not at all.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { buildUser, TEST_PASSWORD } from "../helpers/factories";
import { buildJob, roofBody, saveRoofFor } from "../helpers/job-factories";
import { testSequelize } from "../helpers/db";
import { seedDemoPriceBook } from "../../server/db/seeders/demo-price-book";
import { Client, sleep, waitUntil, type Answer } from "./helpers/http-client";
import { startServerProcess, type ServerProcess } from "./helpers/server-process";
import { startDb, stopDb } from "./helpers/faults-db";
import { quoteProblems, roofProblems } from "./helpers/consistency";

const db = inject("faultsDb");
let server: ServerProcess;

beforeAll(async () => {
  server = await startServerProcess(db);
});

afterAll(async () => {
  await server?.kill("SIGTERM");
});

/** Every answer of the drill, to check that none was a 500 or a hang. */
interface Seen {
  what: string;
  status: number;
  ms: number;
  body: unknown;
}

const isErrorShape = (body: unknown) => {
  const e = (body as { error?: { code?: unknown; message?: unknown } })?.error;
  return typeof e?.code === "string" && typeof e?.message === "string";
};

async function world() {
  const owner = await buildUser({ role: "owner" });
  await seedDemoPriceBook(testSequelize(), owner.companyId);
  const jobs = [];
  for (let i = 0; i < 4; i++) {
    const job = await buildJob({ companyId: owner.companyId, status: "estimating" });
    await saveRoofFor(job, roofBody(0));
    jobs.push(job);
  }
  const client = await new Client(server.url).signIn(owner.email, TEST_PASSWORD);
  return { owner, jobs, client };
}

/**
 * Keeps saving one job's roof (alternating two shapes) until stopped. After an answer that leaves the outcome
 * unknown (503, a dropped connection) it re-reads the stored version, as the client does after a failed save.
 */
function roofWriter(client: Client, jobId: number, seen: Seen[], acked: number[], stop: () => boolean) {
  return (async () => {
    let version = 1;
    let n = 0;
    while (!stop()) {
      n += 1;
      const body = n % 2 ? roofBody(version, { planes: roofBody(0).planes.slice(0, 2) }) : roofBody(version);
      let r: Answer;
      try {
        r = await client.put(`/api/jobs/${jobId}/roof`, body);
      } catch (err) {
        seen.push({ what: "roof save", status: 0, ms: 0, body: String(err) });
        await sleep(200);
        continue;
      }
      seen.push({ what: "roof save", status: r.status, ms: r.ms, body: r.body });
      if (r.status === 200) {
        version = r.body.data.version;
        acked.push(version);
      } else if (r.status === 409 && typeof r.body.currentVersion === "number") {
        version = r.body.currentVersion;
      } else {
        await sleep(200);
        const cur = await client.get(`/api/jobs/${jobId}/roof`).catch(() => null);
        if (cur?.status === 200) version = cur.body.data.version;
      }
    }
  })();
}

function quoteWriter(client: Client, jobId: number, seen: Seen[], acked: number[], stop: () => boolean) {
  return (async () => {
    while (!stop()) {
      let r: Answer;
      try {
        r = await client.post(`/api/jobs/${jobId}/quotes`, {});
      } catch (err) {
        seen.push({ what: "quote create", status: 0, ms: 0, body: String(err) });
        await sleep(200);
        continue;
      }
      seen.push({ what: "quote create", status: r.status, ms: r.ms, body: r.body });
      if (r.status === 201) acked.push(r.body.data.id);
      else await sleep(200);
    }
  })();
}

/** How soon a request must be answered while the database is away: refused connections fail at once; a
 *  frozen server is only noticed by the connect and socket timeouts (server/db/sequelize.ts). */
const quickMs = { shutdown: 6_000, kill: 6_000, freeze: 15_000 };

describe.each(["shutdown", "kill", "freeze"] as const)("MariaDB stopped (%s) and started again under a running server", (how) => {
  it("answers 503 quickly during the outage, recovers by itself, and leaves no half-written rows", async () => {
    const { owner, jobs, client } = await world();
    const before = await client.get("/api/jobs?pageSize=10");
    expect(before.status).toBe(200);
    const pid = server.pid;

    const seen: Seen[] = [];
    const ackedVersions = new Map<number, number[]>(jobs.map((j) => [j.id, []]));
    const ackedQuotes: number[] = [];
    let stopping = false;
    const writers = [
      ...jobs.slice(0, 3).map((j) => roofWriter(client, j.id, seen, ackedVersions.get(j.id)!, () => stopping)),
      quoteWriter(client, jobs[3].id, seen, ackedQuotes, () => stopping),
    ];
    await sleep(1_500); // writes are flowing
    const savesBefore = seen.filter((s) => s.status === 200 || s.status === 201).length;
    expect(savesBefore).toBeGreaterThan(0);

    await stopDb(db, how);
    const down = Date.now();
    try {
      // While it is away: the board, a roof save, a sign-in and the health check all answer 503 in the error shape.
      const during: Answer[] = [];
      for (let i = 0; i < (how === "freeze" ? 1 : 3); i++) {
        during.push(await client.get("/api/jobs?pageSize=10", 60_000));
        during.push(await client.get(`/api/jobs/${jobs[0].id}`, 60_000));
        during.push(await client.put(`/api/jobs/${jobs[0].id}/roof`, roofBody(1)));
        await sleep(500);
      }
      const anon = new Client(server.url);
      const csrf = await anon.get("/api/auth/csrf", 30_000);
      // The anonymous CSRF token needs no stored session: it answers, or says 503, never 500. A sign-in needs the database: 503.
      expect([200, 503]).toContain(csrf.status);
      if (csrf.status === 200) {
        anon.setToken(csrf.body.token);
        const login = await anon.post("/api/auth/login", { email: owner.email, password: TEST_PASSWORD });
        during.push(login);
      }
      const health = await client.get("/api/health", 30_000);
      expect(health.status).toBe(503);
      console.log(`[drill ${how}] during the outage: ${during.map((r) => `${r.status} in ${r.ms} ms`).join(", ")}; csrf ${csrf.status} in ${csrf.ms} ms`);
      for (const r of during) {
        expect(r.status, JSON.stringify(r.body)).toBe(503);
        expect(isErrorShape(r.body), JSON.stringify(r.body)).toBe(true);
        expect(r.body.error.code).toBe("unavailable");
        expect(r.ms).toBeLessThan(quickMs[how]);
      }
    } finally {
      await startDb(db); // never leave the drills' database stopped or frozen
    }
    const outageMs = Date.now() - down;
    const up = Date.now();
    // The same process answers again by itself: no restart, no new sign-in.
    await waitUntil(async () => ((await client.get("/api/jobs?pageSize=10", 10_000)).status === 200 ? true : undefined), 20_000, "the board to answer 200 again");
    const recoveredMs = Date.now() - up;
    expect(server.exited()).toBe(false);
    expect(server.pid).toBe(pid);
    expect((await client.get(`/api/jobs/${jobs[0].id}/roof`)).status).toBe(200);

    await sleep(1_500); // writes flow again
    stopping = true;
    await Promise.all(writers);

    // Nothing but success, a version conflict or 503 was ever answered, and nothing hung.
    const odd = seen.filter((s) => ![200, 201, 409, 503].includes(s.status));
    expect(odd, JSON.stringify(odd.slice(0, 3))).toEqual([]);
    for (const s of seen.filter((x) => x.status === 503)) expect(isErrorShape(s.body)).toBe(true);
    const slowest = Math.max(...seen.map((s) => s.ms));
    expect(slowest).toBeLessThan(15_000);
    const savesAfter = seen.filter((s) => (s.status === 200 || s.status === 201)).length;
    expect(savesAfter).toBeGreaterThan(savesBefore);

    // No half-written rows: each roof is one complete version, each acknowledged save is in its audit trail.
    for (const job of jobs.slice(0, 3)) {
      const { problems, state } = await roofProblems(job.id);
      expect(problems).toEqual([]);
      for (const v of ackedVersions.get(job.id)!) expect(state!.auditVersions).toContain(v);
    }
    const { problems, quotes } = await quoteProblems(owner.companyId);
    expect(problems).toEqual([]);
    expect(quotes).toBeGreaterThanOrEqual(ackedQuotes.length);
    console.log(
      `[drill ${how}] outage ${outageMs} ms, back to 200 ${recoveredMs} ms after MariaDB answered; ` +
        `${seen.length} writes (${seen.filter((s) => s.status === 503).length} × 503, slowest ${slowest} ms), ${quotes} quotes`,
    );
  });
});
