/**
 * `npm run bench:api`: API latency with 10,000 jobs, in a database of its own (`<DB_NAME>_bench`, never the
 * demo one), dropped and made new on each run.
 *
 * Seeds one invented company (bulk inserts): 2,000 customers, 10,000 jobs spread over every status, a
 * measured roof on 600 of them, the demo price book. Starts the app in this process on a free port, signs in
 * as the owner and, with autocannon at 20 connections for about 10 s each (after 3 s under the same load that are not counted), measures:
 *   - GET /api/health (the floor: no session, one `SELECT 1`)
 *   - GET /api/jobs?page=3&pageSize=50&status=estimating&sort=-updatedAt
 *   - GET /api/jobs?q=heron&pageSize=50
 *   - PUT /api/jobs/:id/roof, a 12-plane roof with its takeoff (each connection saves its own job and sends
 *     the version the last save returned, so no save is refused as stale)
 * and prints p50/p95/p99 latency, requests per second, errors and the ratio to health.
 * WORKERS=2 runs the app as two processes behind one port (node:cluster), one per core.
 * Targets: list p95 < 50 ms, roof save p95 < 100 ms.
 *
 * Database: like `npm start` (the local MariaDB in DB_DIR, default .data/mariadb on DB_PORT 3307; started
 * when it is not running, stopped again after) unless DATABASE_URL or DB_HOST names another server.
 */
import autocannon from "autocannon";
import { spawn } from "node:child_process";
import { loadDotEnv } from "./lib/env";
import { freshBenchDatabase } from "./lib/bench-db";
import { percentile, signInOverHttp } from "./lib/bench-http";
import { twelvePlaneRoof } from "./lib/bench-roofs";
import { commandCpuMs, treeCpuMs } from "./lib/proc-cpu";
import { Company, Customer, Job, Roof, User } from "../server/models/index";
import { hashPassword } from "../server/auth/password";
import { seedDemoPriceBook } from "../server/db/seeders/demo-price-book";
import { computeStoredTakeoff, takeoffSquares } from "../server/services/roof-takeoff";
import { jobSiteSchema, JOB_STATUSES, type JobStatus } from "../shared/schemas/job";
import { roofSaveSchema } from "../shared/schemas/roof";

loadDotEnv();
process.env.NODE_ENV ??= "development";

const JOBS = 10_000;
const CUSTOMERS = 2_000;
const ROOFED = 600;
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 20);
const DURATION_S = Number(process.env.BENCH_SECONDS ?? 10);
// Each endpoint first runs this long under the same load, not counted: the first seconds of a new process
// measure V8 compiling the hot code, the pool opening its connections and each connection preparing its
// statements, none of which a server that has been up for a while does. BENCH_WARMUP_SECONDS=0 counts them.
const WARMUP_S = Number(process.env.BENCH_WARMUP_SECONDS ?? 3);
const PASSWORD = "bench-only-password";

// ---- invented data ------------------------------------------------------------------------------------

const FIRST = ["Avel", "Brisa", "Corin", "Dagny", "Elsbeth", "Fenn", "Galen", "Hollis", "Ilse", "Jory", "Kestra", "Linnet", "Mabry", "Nell", "Orrin", "Pell", "Quilla", "Rook", "Sabine", "Tamsin"];
const LAST = ["Ashdown", "Bramwell", "Corrow", "Dunlevy", "Eskridge", "Fallow", "Greythorn", "Hatchell", "Ivers", "Jessop", "Kittering", "Lowde", "Marrick", "Nettleby", "Orme", "Pennock", "Quarles", "Ravensworth", "Sallow", "Thistlewood"];
const STREETS = ["Heron", "Larch", "Millpond", "Copse", "Wren", "Bramble", "Sedge", "Tinker", "Foxglove", "Marsh", "Quarry", "Willowby"];
const KINDS = ["Lane", "Road", "Close", "Way", "Street", "Row"];
const TOWNS = ["Brindlemere", "Harlow Bend", "Oxley Cross", "Fenwick Hollow"];
/** Rough share of each status on a busy contractor's board. */
const STATUS_WEIGHTS: Record<JobStatus, number> = { lead: 15, estimating: 25, proposed: 15, won: 10, scheduled: 8, installed: 20, lost: 7 };

const pick = <T>(xs: readonly T[], i: number) => xs[i % xs.length];
const weighted = (i: number): JobStatus => {
  const total = Object.values(STATUS_WEIGHTS).reduce((a, b) => a + b, 0);
  let x = (i * 7919) % total;
  for (const s of JOB_STATUSES) {
    if (x < STATUS_WEIGHTS[s]) return s;
    x -= STATUS_WEIGHTS[s];
  }
  return "lead";
};


// ---- measuring ------------------------------------------------------------------------------------------

interface Measured {
  name: string;
  p50: number;
  p95: number;
  p99: number;
  rps: number;
  requests: number;
  errors: number;
  /** Error responses by status code. */
  byStatus: Record<number, number>;
  /** CPU ms per request of the app (all its processes), MariaDB and this load generator; null where unknown. */
  cpu: { app: number | null; db: number | null; load: number };
}

/** The app's process, once started: its CPU time is read around each measurement. */
let appPid: number | undefined;


/** `afterWarmup` runs between the warm-up and the measured run (the roof saves take stock of their versions). */
async function measure(name: string, opts: autocannon.Options, afterWarmup?: () => Promise<void>): Promise<Measured> {
  const times: number[] = [];
  let errors = 0;
  const byStatus: Record<number, number> = {};
  if (WARMUP_S > 0) {
    await new Promise<autocannon.Result>((resolve, reject) =>
      autocannon({ connections: CONNECTIONS, duration: WARMUP_S, ...opts }, (err, res) => (err ? reject(err) : resolve(res))),
    );
  }
  await afterWarmup?.();
  const cpuBefore = { app: treeCpuMs(appPid), db: commandCpuMs("mariadbd"), load: process.cpuUsage() };
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ connections: CONNECTIONS, duration: DURATION_S, ...opts }, (err, res) => (err ? reject(err) : resolve(res)));
    instance.on("response", (_client, status, _bytes, ms) => {
      times.push(ms);
      if (status >= 400) {
        errors += 1;
        byStatus[status] = (byStatus[status] ?? 0) + 1;
      }
    });
  });
  times.sort((a, b) => a - b);
  const perRequest = (before: number | null, after: number | null) =>
    before === null || after === null || times.length === 0 ? null : (after - before) / times.length;
  const load = process.cpuUsage(cpuBefore.load);
  const cpu = {
    app: perRequest(cpuBefore.app, treeCpuMs(appPid)),
    db: perRequest(cpuBefore.db, commandCpuMs("mariadbd")),
    load: (load.user + load.system) / 1000 / Math.max(1, times.length),
  };
  return {
    name,
    cpu,
    p50: percentile(times, 50),
    p95: percentile(times, 95),
    p99: percentile(times, 99),
    rps: result.requests.average,
    requests: times.length,
    errors: errors + result.errors + result.timeouts,
    byStatus,
  };
}

// ---- main -------------------------------------------------------------------------------------------------

async function main() {
  const bench = await freshBenchDatabase("bench", 25);
  const { config, sequelize } = bench;

  // ---- seed -----------------------------------------------------------------------------------------------
  const t0 = Date.now();
  const company = await Company.create({ name: "Benchmark Roofing (invented)" });
  const passwordHash = await hashPassword(PASSWORD, 4);
  const owner = await User.create({ companyId: company.id, email: "bench-owner@example.com", name: "Bench Owner", role: "owner", passwordHash });
  const estimators = await User.bulkCreate(
    Array.from({ length: 4 }, (_, i) => ({ companyId: company.id, email: `bench-estimator-${i + 1}@example.com`, name: `${pick(FIRST, i + 3)} ${pick(LAST, i + 5)}`, role: "estimator" as const, passwordHash })),
  );
  await seedDemoPriceBook(sequelize, company.id);

  const customerRows = Array.from({ length: CUSTOMERS }, (_, i) => {
    const name = `${pick(FIRST, i)} ${pick(LAST, Math.floor(i / FIRST.length) + i)}`;
    return {
      companyId: company.id,
      name,
      email: `${name.toLowerCase().replace(/[^a-z]+/g, ".")}.${i}@example.com`,
      phone: `555-01${String(i % 100).padStart(2, "0")}`,
      addressLine1: `${10 + (i % 890)} ${pick(STREETS, i * 5 + 1)} ${pick(KINDS, i)}`,
      addressLine2: null,
      city: pick(TOWNS, i),
      region: "Westmarch",
      postalCode: `BM-${200 + (i % 60)}`,
      notes: null,
    };
  });
  for (let i = 0; i < customerRows.length; i += 1000) await Customer.bulkCreate(customerRows.slice(i, i + 1000));
  const customers = await Customer.findAll({ where: { companyId: company.id }, attributes: ["id", "addressLine1", "city", "postalCode"], order: [["id", "ASC"]] });

  const site = jobSiteSchema.parse({ atticType: "vented", atticFloorAreaSqFt: 1600, climateZone: "5A", iceDamRisk: true });
  const now = Date.now();
  const jobRows = Array.from({ length: JOBS }, (_, i) => {
    const c = customers[i % customers.length];
    const status = weighted(i);
    const updated = new Date(now - ((i * 104_729) % (400 * 86_400)) * 1000);
    return {
      companyId: company.id,
      customerId: c.id,
      siteAddressLine1: c.addressLine1,
      siteAddressLine2: null,
      siteCity: c.city,
      siteRegion: "Westmarch",
      sitePostalCode: c.postalCode,
      status,
      estimatorId: i % 9 === 0 ? null : estimators[i % estimators.length].id,
      site,
      notes: null,
      squares: status === "lead" ? null : 18 + (i % 37),
      quoteTotalCents: ["lead", "estimating"].includes(status) ? null : 1_800_000 + (i % 50) * 23_700,
      createdAt: new Date(updated.getTime() - 5 * 86_400_000),
      updatedAt: updated,
    };
  });
  for (let i = 0; i < jobRows.length; i += 1000) await Job.bulkCreate(jobRows.slice(i, i + 1000)); // keeps the given timestamps

  // A measured roof on some jobs past lead (one roof computed once, stored on each).
  const doc = roofSaveSchema.parse(twelvePlaneRoof(0));
  const { version: _v, underlay: _u, ...document } = doc;
  const takeoff = await computeStoredTakeoff(document, site, company.id);
  const pastLead = await Job.findAll({ where: { companyId: company.id }, attributes: ["id", "status"], order: [["id", "ASC"]] });
  const roofed = pastLead.filter((j) => j.status !== "lead").slice(0, ROOFED);
  for (let i = 0; i < roofed.length; i += 200) {
    await Roof.bulkCreate(roofed.slice(i, i + 200).map((j) => ({ jobId: j.id, companyId: company.id, version: 1, document, takeoff })));
  }
  await Job.update({ squares: takeoffSquares(takeoff) }, { where: { id: roofed.map((j) => j.id) }, silent: true });
  await sequelize.query("ANALYZE TABLE jobs, customers, roofs");
  const roofedIds = new Set(roofed.map((j) => j.id));
  const saveTargets = pastLead.filter((j) => j.status === "estimating" && !roofedIds.has(j.id)).slice(0, CONNECTIONS).map((j) => j.id);
  console.log(`Seeded ${JOBS} jobs, ${CUSTOMERS} customers, ${roofed.length} roofs in ${((Date.now() - t0) / 1000).toFixed(1)} s.`);

  // ---- the app, in a process of its own (the load generator stays in this one) ---------------------------------
  // BENCH_PROFILE=<dir>: the app writes a V8 CPU profile there when it stops (open it in Chrome's DevTools).
  const profile = process.env.BENCH_PROFILE ? ["--cpu-prof", `--cpu-prof-dir=${process.env.BENCH_PROFILE}`] : [];
  const child = spawn(process.execPath, [...profile, "--import", "tsx", "scripts/lib/serve-app.ts"], {
    env: {
      ...process.env,
      NODE_ENV: "production",
      SESSION_SECRET: "bench-only-session-secret-0123456789",
      DB_HOST: config.db.host,
      DB_PORT: String(config.db.port),
      DB_NAME: config.db.database,
      DB_USER: config.db.user,
      DB_PASSWORD: config.db.password,
      DB_POOL_MAX: String(config.db.poolMax),
      PORT: "0",
      LOG_LEVEL: "error",
      TRUST_PROXY: "1", // as behind a TLS-terminating proxy: the requests below say X-Forwarded-Proto: https
    },
    stdio: ["ignore", "pipe", "inherit"],
  });
  const port = await new Promise<number>((resolve, reject) => {
    let out = "";
    child.stdout!.on("data", (d: Buffer) => {
      out += d.toString();
      const m = /listening (\d+)/.exec(out);
      if (m) resolve(Number(m[1]));
    });
    child.once("exit", (code) => reject(new Error(`the app exited with code ${code} before listening`)));
  });
  const url = `http://127.0.0.1:${port}`;
  appPid = child.pid;
  process.once("exit", () => child.kill("SIGTERM")); // never leave the app running if this script fails

  const headers = await signInOverHttp(url, owner.email, PASSWORD, { "x-forwarded-proto": "https" });

  const listPath = "/api/jobs?page=3&pageSize=50&status=estimating&sort=-updatedAt";
  const searchPath = "/api/jobs?q=heron&pageSize=50";
  for (const p of [listPath, searchPath]) {
    const r = await fetch(url + p, { headers });
    const body = (await r.json()) as { data: unknown[]; meta: { total: number } };
    console.log(`GET ${p} → ${r.status}, ${body.data.length} rows of ${body.meta.total}`);
  }

  // ---- measure --------------------------------------------------------------------------------------------------
  const workers = Math.max(1, Math.trunc(Number(process.env.WORKERS ?? 1)) || 1);
  console.log(`\nautocannon: ${CONNECTIONS} connections, ${DURATION_S} s per endpoint after ${WARMUP_S} s of warm-up; the app in ${workers} process${workers > 1 ? "es (WORKERS)" : " (WORKERS=1)"}…`);
  // BENCH_ONLY=list,search,save,me: measure only those (health is always measured: the ratios need it).
  const only = new Set((process.env.BENCH_ONLY ?? "me,list,search,save").split(",").map((x) => x.trim()));
  const results: Measured[] = [];
  results.push(await measure("GET /api/health", { url: `${url}/api/health` }));
  if (only.has("me")) results.push(await measure("GET /api/auth/me (session + user: signed-in floor)", { url: `${url}/api/auth/me`, headers }));
  if (only.has("list")) results.push(await measure("GET jobs list (page 3, 50, estimating, -updatedAt)", { url: url + listPath, headers }));
  if (only.has("search")) results.push(await measure("GET jobs search (q=heron, 50)", { url: url + searchPath, headers }));

  let firstSaveError = "";
  const roofJson = (v: number) => JSON.stringify(twelvePlaneRoof(v));
  // Each save takes a job nobody is saving right now and sends the version its last save returned; the job
  // goes back to the pool with its new version when the answer comes (20 jobs for 20 connections).
  const versions = new Map(saveTargets.map((id) => [id, 0]));
  const free = [...saveTargets];
  if (only.has("save")) {
    results.push(
      await measure("PUT /api/jobs/:id/roof (12 planes + takeoff)", {
        url,
        headers,
        requests: [
          {
            method: "PUT",
            setupRequest: (req, ctx) => {
              const jobId = free.shift()!;
              (ctx as { jobId?: number }).jobId = jobId;
              return { ...req, path: `/api/jobs/${jobId}/roof`, body: roofJson(versions.get(jobId)!) };
            },
            onResponse: (status, body, ctx) => {
              const jobId = (ctx as { jobId: number }).jobId;
              // A 200 is the next version (the contract); checked in the text rather than parsing 56 KB of JSON
              // here, which would take the load generator's CPU from the two cores the app and MariaDB share.
              const next = versions.get(jobId)! + 1;
              if (status === 200 && body.includes(`"version":${next},`)) versions.set(jobId, next);
              else if (status === 200 && !firstSaveError) firstSaveError = `200 without "version":${next}: ${body.slice(0, 300)}`;
              else if (!firstSaveError) firstSaveError = `${status} ${body.slice(0, 300)}`;
              free.push(jobId);
            },
          },
        ],
      },
      // autocannon ends the warm-up without waiting for the answers still on their way, so their jobs never came
      // back to the pool: once those saves are done, each job's version is read from the database again.
      async () => {
        await new Promise((r) => setTimeout(r, 1500));
        const stored = await Roof.findAll({ where: { jobId: saveTargets }, attributes: ["jobId", "version"] });
        for (const r of stored) versions.set(r.jobId, r.version);
        free.splice(0, free.length, ...saveTargets);
      }),
    );
  }
  const saves = [...versions.values()].reduce((a, b) => a + b, 0);
  console.log(`Roof saves accepted, warm-up included: ${saves} (the jobs' versions add up to it).`);

  // ---- report ---------------------------------------------------------------------------------------------------
  for (const r of results) if (r.errors) console.log(`${r.name}: errors by status ${JSON.stringify(r.byStatus)}`);
  if (firstSaveError) console.log(`first refused roof save: ${firstSaveError}`);
  const health = results[0];
  const pad = (s: string, n: number) => s.padEnd(n);
  const ms = (x: number) => `${x.toFixed(1)} ms`;
  console.log(`\n${pad("endpoint", 52)}${pad("p50", 11)}${pad("p95", 11)}${pad("p99", 11)}${pad("req/s", 10)}${pad("errors", 8)}p95 ÷ health  req/s ÷ health`);
  for (const r of results) {
    console.log(
      `${pad(r.name, 52)}${pad(ms(r.p50), 11)}${pad(ms(r.p95), 11)}${pad(ms(r.p99), 11)}${pad(r.rps.toFixed(0), 10)}${pad(String(r.errors), 8)}` +
        `${pad((r.p95 / health.p95).toFixed(1) + "×", 14)}${(r.rps / health.rps).toFixed(2)}`,
    );
  }
  // Where the CPU went (Linux /proc, 10 ms ticks): on these 2 cores the app, MariaDB and the load generator
  // share the machine, so a request's CPU across all three bounds the requests per second.
  const cpuMs = (x: number | null) => (x === null ? "?" : x.toFixed(2));
  console.log(`\nCPU per request (ms): app / MariaDB / load generator`);
  for (const r of results) console.log(`${pad(r.name, 52)}${cpuMs(r.cpu.app)} / ${cpuMs(r.cpu.db)} / ${cpuMs(r.cpu.load)}`);
  const find = (prefix: string) => results.find((r) => r.name.startsWith(prefix));
  const [list, search, save] = [find("GET jobs list"), find("GET jobs search"), find("PUT")];
  const verdict = (ok: boolean) => (ok ? "met" : "NOT met");
  if (list) console.log(`\nTarget jobs list (page of 50, filtered and sorted) p95 < 50 ms: ${verdict(list.p95 < 50)} (${ms(list.p95)}).`);
  if (search) console.log(`Text search p95 (no target of its own): ${ms(search.p95)}.`);
  if (save) console.log(`Target roof save p95 < 100 ms: ${verdict(save.p95 < 100)} (${ms(save.p95)}).`);

  // Let requests still in flight finish, then stop the app.
  await new Promise((r) => setTimeout(r, 1500));
  await new Promise<void>((r) => {
    child.once("exit", () => r());
    child.kill("SIGTERM");
  });
  await bench.close();
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
