/**
 * `npm run bench:load`: the built product under a realistic mix of office traffic, with autocannon at
 * CONNECTIONS concurrent connections (default 50) for DURATION seconds (default 60).
 *
 * - Builds the client (`vite build`; BENCH_SKIP_BUILD=1 skips it) and runs the server in a process of its own
 *   (scripts/lib/serve-app.ts with CLIENT_DIR=dist and NODE_ENV=production), so the load generator
 *   in this process does not share the server's event loop.
 * - A database of its own, `<DB_NAME>_load`, dropped and made new on every run (never the demo database): one
 *   invented company with the demo price book, 600 customers, 3,000 jobs over every status, a measured
 *   20-plane roof on 400 of them, a draft quote for the PDF, and one job per connection for roof saves.
 * - The mix, per connection, in a fixed cycle of 20 requests: jobs board list ×7, job detail ×5, roof save ×3
 *   (the connection's own job, sending the version its last save returned, re-reading it on a 409),
 *   POST /api/calc/takeoff ×4 (the same roof), and the draft proposal PDF ×1 (rendered on each request).
 * - First, in the same run, GET /api/health alone at the same concurrency: the floor the mix is compared to.
 * - Prints throughput, p50/p95/p99 (all requests and per kind), errors (non-2xx and socket errors; the
 *   target is zero) and the server's memory (RSS and V8 heap used) before, every 5 s during, and after
 *   (once as it is, once after a full GC).
 *
 * Database: like `npm start` (the local MariaDB in DB_DIR, default .data/mariadb on DB_PORT 3307; started when
 * it is not running, stopped again after) unless DATABASE_URL or DB_HOST names another server.
 */
import autocannon from "autocannon";
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { loadDotEnv } from "./lib/env";
import { freshBenchDatabase } from "./lib/bench-db";
import { percentile, signInOverHttp } from "./lib/bench-http";
import { twentyPlaneRoof } from "./lib/bench-roofs";
import { Company, Customer, Job, Roof, User } from "../server/models/index";
import { hashPassword } from "../server/auth/password";
import { seedDemoPriceBook } from "../server/db/seeders/demo-price-book";
import { computeStoredTakeoff, takeoffSquares } from "../server/services/roof-takeoff";
import { QuotesService } from "../server/services/quotes.service";
import { jobSiteSchema, JOB_STATUSES, type JobStatus } from "../shared/schemas/job";
import { roofSaveSchema } from "../shared/schemas/roof";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

// ---- invented data ------------------------------------------------------------------------------------

const JOBS = 3_000;
const CUSTOMERS = 600;
const ROOFED = 400;
const PASSWORD = "bench-load-only-password";
const FIRST = ["Avel", "Brisa", "Corin", "Dagny", "Elsbeth", "Fenn", "Galen", "Hollis", "Ilse", "Jory", "Kestra", "Linnet", "Mabry", "Nell", "Orrin"];
const LAST = ["Ashdown", "Bramwell", "Corrow", "Dunlevy", "Eskridge", "Fallow", "Greythorn", "Hatchell", "Ivers", "Jessop", "Kittering"];
const STREETS = ["Heron", "Larch", "Millpond", "Copse", "Wren", "Bramble", "Sedge", "Foxglove"];
const TOWNS = ["Brindlemere", "Harlow Bend", "Oxley Cross", "Fenwick Hollow"];
const pick = <T>(xs: readonly T[], i: number) => xs[i % xs.length];


// ---- measuring ----------------------------------------------------------------------------------------

interface Mem {
  rss: number;
  heapUsed: number;
  heapTotal: number;
  external: number;
}

class Kind {
  times: number[] = [];
  errors = 0;
  byStatus: Record<string, number> = {};
  constructor(readonly name: string) {}
  record(ms: number, status: number) {
    this.times.push(ms);
    if (status < 200 || status >= 300) {
      this.errors += 1;
      this.byStatus[status] = (this.byStatus[status] ?? 0) + 1;
    }
  }
}

const mb = (n: number) => `${(n / 1048576).toFixed(0)} MB`;

async function main() {
  loadDotEnv();
  process.env.NODE_ENV ??= "development";
  const DURATION = Number(process.env.DURATION ?? 60);
  const CONNECTIONS = Number(process.env.CONNECTIONS ?? 50);
  const HEALTH_SECONDS = Math.max(5, Math.round(DURATION / 6));
  if (!(DURATION > 0 && CONNECTIONS > 0)) throw new Error("DURATION and CONNECTIONS must be positive numbers");

  if (process.env.BENCH_SKIP_BUILD !== "1") {
    console.log("Building the client (vite build)…");
    const r = spawnSync("node_modules/.bin/vite", ["build", "--logLevel", "error"], { stdio: "inherit", cwd: root });
    if (r.status !== 0) throw new Error("the client build failed");
  }

  const bench = await freshBenchDatabase("load", 20);
  const { sequelize } = bench;
  const dbConfig = bench.config.db;

  // ---- seed --------------------------------------------------------------------------------------------
  const t0 = Date.now();
  const company = await Company.create({ name: "Load Test Roofing (invented)" });
  const passwordHash = await hashPassword(PASSWORD, 4);
  const owner = await User.create({ companyId: company.id, email: "load-owner@example.com", name: "Load Owner", role: "owner", passwordHash });
  await seedDemoPriceBook(sequelize, company.id);
  const customerRows = Array.from({ length: CUSTOMERS }, (_, i) => ({
    companyId: company.id,
    name: `${pick(FIRST, i)} ${pick(LAST, Math.floor(i / FIRST.length) + i)}`,
    email: `load.customer.${i}@example.com`,
    phone: `555-01${String(i % 100).padStart(2, "0")}`,
    addressLine1: `${10 + (i % 890)} ${pick(STREETS, i * 5 + 1)} Lane`,
    addressLine2: null,
    city: pick(TOWNS, i),
    region: "Westmarch",
    postalCode: `BM-${200 + (i % 60)}`,
    notes: null,
  }));
  await Customer.bulkCreate(customerRows);
  const customers = await Customer.findAll({ where: { companyId: company.id }, attributes: ["id", "addressLine1", "city", "postalCode"], order: [["id", "ASC"]] });
  const site = jobSiteSchema.parse({ atticType: "vented", atticFloorAreaSqFt: 1600, climateZone: "5A", iceDamRisk: true });
  const now = Date.now();
  const jobRows = Array.from({ length: JOBS }, (_, i) => {
    const c = customers[i % customers.length];
    const status: JobStatus = i < ROOFED + CONNECTIONS + 1 ? "estimating" : pick(JOB_STATUSES, i);
    const updated = new Date(now - ((i * 104_729) % (300 * 86_400)) * 1000);
    return {
      companyId: company.id,
      customerId: c.id,
      siteAddressLine1: c.addressLine1,
      siteAddressLine2: null,
      siteCity: c.city,
      siteRegion: "Westmarch",
      sitePostalCode: c.postalCode,
      status,
      estimatorId: owner.id,
      site,
      notes: null,
      squares: null,
      quoteTotalCents: null,
      createdAt: new Date(updated.getTime() - 5 * 86_400_000),
      updatedAt: updated,
    };
  });
  for (let i = 0; i < jobRows.length; i += 1000) await Job.bulkCreate(jobRows.slice(i, i + 1000));
  const jobIds = (await Job.findAll({ where: { companyId: company.id }, attributes: ["id"], order: [["id", "ASC"]] })).map((j) => j.id);
  const doc = roofSaveSchema.parse(twentyPlaneRoof(0));
  const { version: _v, underlay: _u, ...document } = doc;
  const takeoff = await computeStoredTakeoff(document, site, company.id);
  const roofed = jobIds.slice(0, ROOFED);
  for (let i = 0; i < roofed.length; i += 10) {
    // a stored takeoff is ~75 KB: a few per statement stay far below max_allowed_packet
    await Roof.bulkCreate(roofed.slice(i, i + 10).map((jobId) => ({ jobId, companyId: company.id, version: 1, document, takeoff })));
  }
  await Job.update({ squares: takeoffSquares(takeoff) }, { where: { id: roofed }, silent: true });
  const saveJobs = jobIds.slice(ROOFED, ROOFED + CONNECTIONS); // one per connection, no roof yet (version 0)
  const actor = { id: owner.id, email: owner.email, name: owner.name, role: owner.role, companyId: company.id };
  const quoteId = await new QuotesService(sequelize).create(roofed[0], {}, actor);
  await sequelize.query("ANALYZE TABLE jobs, customers, roofs");
  console.log(`Seeded ${JOBS} jobs, ${CUSTOMERS} customers, ${ROOFED} roofs of ${doc.planes.length} planes, quote ${quoteId} in ${((Date.now() - t0) / 1000).toFixed(1)} s.`);

  // ---- the server, in a process of its own ---------------------------------------------------------------
  const child: ChildProcess = spawn(process.execPath, ["--expose-gc", "--import", "tsx", path.join(root, "scripts/lib/serve-app.ts")], {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: "production",
      SESSION_SECRET: "bench-load-only-session-secret-0123456789",
      DB_HOST: dbConfig.host,
      DB_PORT: String(dbConfig.port),
      DB_NAME: dbConfig.database,
      DB_USER: dbConfig.user,
      DB_PASSWORD: dbConfig.password,
      DB_POOL_MAX: String(dbConfig.poolMax),
      PORT: "0",
      LOG_LEVEL: "error",
      TRUST_PROXY: "1", // as behind a TLS-terminating proxy: the requests say X-Forwarded-Proto: https
      STORAGE_DIR: ".data/bench-load-storage",
      CLIENT_DIR: path.join(root, "dist"),
      SMTP_URL: "smtp://127.0.0.1:9", // never used (no outbox worker runs here); keeps the catcher off
    },
    stdio: ["ignore", "inherit", "inherit", "ipc"],
  });
  process.once("exit", () => child.kill("SIGTERM"));
  const port = await new Promise<number>((resolve, reject) => {
    child.on("message", (m: { listening?: number }) => m.listening && resolve(m.listening));
    child.once("exit", (code) => reject(new Error(`the server exited with code ${code} before listening`)));
  });
  const memory = (gc = false) =>
    new Promise<Mem>((resolve) => {
      const on = (m: { mem?: Mem }) => {
        if (!m.mem) return;
        child.off("message", on);
        resolve(m.mem);
      };
      child.on("message", on);
      child.send({ mem: true, gc });
    });
  const url = `http://127.0.0.1:${port}`;

  const headers = await signInOverHttp(url, owner.email, PASSWORD, { "x-forwarded-proto": "https" });

  // ---- the requests of the mix ------------------------------------------------------------------------------
  const boardPaths = ["/api/jobs?page=1&pageSize=25&sort=-updatedAt", "/api/jobs?page=2&pageSize=25&status=estimating&sort=-updatedAt", "/api/jobs?pageSize=25&q=heron"];
  const takeoffBody = JSON.stringify({ site, planes: document.planes, stacks: document.stacks, defaultStackId: document.defaultStackId });
  const roofJson = (v: number) => JSON.stringify(twentyPlaneRoof(v));
  const pdfPath = `/api/quotes/${quoteId}/pdf`;

  // Every request once before measuring: each must succeed.
  const checks: Array<[string, RequestInit]> = [
    [boardPaths[0], {}],
    [boardPaths[2], {}],
    [`/api/jobs/${roofed[1]}`, { headers }],
    ["/api/calc/takeoff", { method: "POST", headers, body: takeoffBody }],
    [pdfPath, { headers }],
    ["/", {}], // the built client's page
  ];
  for (const [p, init] of checks) {
    const r = await fetch(url + p, { ...init, headers }); // signed in, as every request of the mix
    const bytes = (await r.arrayBuffer()).byteLength;
    if (r.status !== 200) throw new Error(`GET/POST ${p} answered ${r.status}`);
    console.log(`${init.method ?? "GET"} ${p} → ${r.status}, ${(bytes / 1024).toFixed(1)} KB`);
  }

  const kinds = {
    board: new Kind("GET /api/jobs (board list)"),
    detail: new Kind("GET /api/jobs/:id (job detail)"),
    save: new Kind("PUT /api/jobs/:id/roof (20 planes)"),
    takeoff: new Kind("POST /api/calc/takeoff (20 planes)"),
    pdf: new Kind("GET /api/quotes/:id/pdf (draft, rendered)"),
  };
  type Ctx = { jobId?: number; started?: number; n?: number };
  const freeJobs = [...saveJobs];
  const versions = new Map(saveJobs.map((id) => [id, 0]));
  let saved = 0;
  let stale = 0;
  const timed =
    (build: (ctx: Ctx) => Partial<autocannon.Request>) =>
    (req: autocannon.Request, context: object) => {
      const ctx = context as Ctx;
      ctx.started = performance.now();
      return { ...req, ...build(ctx) } as autocannon.Request;
    };
  const done = (kind: Kind, after?: (status: number, body: string, ctx: Ctx) => void) => (status: number, body: string, context: object) => {
    const ctx = context as Ctx;
    kind.record(performance.now() - (ctx.started ?? performance.now()), status);
    after?.(status, body, ctx);
  };
  const board = (i: number): autocannon.Request => ({ method: "GET", setupRequest: timed(() => ({ path: boardPaths[i % boardPaths.length] })), onResponse: done(kinds.board) });
  const detail = (i: number): autocannon.Request => ({
    method: "GET",
    setupRequest: timed((ctx) => ({ path: `/api/jobs/${roofed[((ctx.n = (ctx.n ?? 0) + 1) * 37 + i) % roofed.length]}` })),
    onResponse: done(kinds.detail),
  });
  const save: autocannon.Request = {
    method: "PUT",
    // A save takes a job nobody is saving right now (one per connection, so one is always free) and sends
    // the version its last save returned; the job goes back with its new version when the answer comes.
    // (autocannon resets a connection's context after each cycle, so the versions live here.)
    setupRequest: timed((ctx) => {
      ctx.jobId = freeJobs.shift()!;
      return { path: `/api/jobs/${ctx.jobId}/roof`, body: roofJson(versions.get(ctx.jobId)!) };
    }),
    onResponse: done(kinds.save, (status, body, ctx) => {
      const jobId = ctx.jobId!;
      if (status === 200) {
        versions.set(jobId, (JSON.parse(body) as { data: { version: number } }).data.version);
        saved += 1;
      } else if (status === 409) {
        const current = (JSON.parse(body) as { currentVersion?: number }).currentVersion;
        if (typeof current === "number") versions.set(jobId, current); // re-read, as the client does, and go on
        stale += 1;
      }
      freeJobs.push(jobId);
    }),
  };
  const calc: autocannon.Request = { method: "POST", setupRequest: timed(() => ({ path: "/api/calc/takeoff", body: takeoffBody })), onResponse: done(kinds.takeoff) };
  const pdf: autocannon.Request = { method: "GET", setupRequest: timed(() => ({ path: pdfPath })), onResponse: done(kinds.pdf) };
  // 20 per cycle: board 7, detail 5, save 3, takeoff 4, pdf 1.
  const cycle = [board(0), detail(0), calc, board(1), save, detail(1), board(2), calc, detail(2), board(3), save, calc, board(4), detail(3), pdf, board(5), calc, save, detail(4), board(6)];

  // ---- health, alone, then the mix ------------------------------------------------------------------------
  const memBefore = await memory();
  console.log(`\nautocannon: GET /api/health, ${CONNECTIONS} connections, ${HEALTH_SECONDS} s…`);
  const healthTimes: number[] = [];
  const health = await new Promise<autocannon.Result>((resolve, reject) => {
    const inst = autocannon({ url: `${url}/api/health`, connections: CONNECTIONS, duration: HEALTH_SECONDS }, (err, res) => (err ? reject(err) : resolve(res)));
    inst.on("response", (_c, _s, _b, ms) => healthTimes.push(ms));
  });
  healthTimes.sort((a, b) => a - b);

  console.log(`autocannon: the mix, ${CONNECTIONS} connections, ${DURATION} s (memory sampled every 5 s)…`);
  const samples: Array<{ s: number; mem: Mem }> = [];
  const start = Date.now();
  const sampler = setInterval(() => void memory().then((mem) => samples.push({ s: Math.round((Date.now() - start) / 1000), mem })), 5_000);
  const mix = await new Promise<autocannon.Result>((resolve, reject) => {
    autocannon({ url, headers, connections: CONNECTIONS, duration: DURATION, requests: cycle, timeout: 30 }, (err, res) => (err ? reject(err) : resolve(res)));
  });
  clearInterval(sampler);
  await new Promise((r) => setTimeout(r, 5_000)); // settle: requests in flight end, timers run
  const memAfter = await memory();
  const memAfterGc = await memory(true);

  // ---- report ---------------------------------------------------------------------------------------------
  const all = Object.values(kinds).flatMap((k) => k.times).sort((a, b) => a - b);
  const errors = Object.values(kinds).reduce((n, k) => n + k.errors, 0) + mix.errors + mix.timeouts;
  const mixRps = all.length / DURATION;
  const healthRps = healthTimes.length / HEALTH_SECONDS;
  const hp = (p: number) => percentile(healthTimes, p);
  const pad = (s: string, n: number) => s.padEnd(n);
  const ms = (x: number) => `${x.toFixed(1)} ms`;
  console.log(`\n${pad("requests", 44)}${pad("count", 9)}${pad("p50", 11)}${pad("p95", 11)}${pad("p99", 11)}errors`);
  const row = (label: string, times: number[], errs: number) => {
    const s = [...times].sort((a, b) => a - b);
    console.log(`${pad(label, 44)}${pad(String(s.length), 9)}${pad(ms(percentile(s, 50)), 11)}${pad(ms(percentile(s, 95)), 11)}${pad(ms(percentile(s, 99)), 11)}${errs}`);
  };
  row("GET /api/health (alone, before the mix)", healthTimes, health.non2xx + health.errors + health.timeouts);
  for (const k of Object.values(kinds)) row(k.name, k.times, k.errors);
  row("the whole mix", all, errors);
  for (const k of Object.values(kinds)) if (k.errors) console.log(`${k.name}: non-2xx by status ${JSON.stringify(k.byStatus)}`);
  if (mix.errors || mix.timeouts) console.log(`socket errors ${mix.errors}, timeouts ${mix.timeouts}`);
  console.log(
    `\nThroughput: the mix ${mixRps.toFixed(0)} req/s, health alone ${healthRps.toFixed(0)} req/s (ratio ${(mixRps / healthRps).toFixed(2)}); ` +
      `p95 ${ms(percentile(all, 95))} vs health ${ms(hp(95))} (${(percentile(all, 95) / hp(95)).toFixed(1)}×).`,
  );
  console.log(`Roof saves accepted ${saved}, refused as stale ${stale}. Errors (non-2xx + socket errors + timeouts): ${errors} (target 0).`);
  console.log(`\nServer memory (RSS / V8 heap used):`);
  console.log(`  before            ${mb(memBefore.rss)} / ${mb(memBefore.heapUsed)}`);
  for (const s of samples) console.log(`  at ${String(s.s).padStart(3)} s          ${mb(s.mem.rss)} / ${mb(s.mem.heapUsed)}`);
  console.log(`  after (+5 s idle) ${mb(memAfter.rss)} / ${mb(memAfter.heapUsed)}`);
  console.log(`  after a full GC   ${mb(memAfterGc.rss)} / ${mb(memAfterGc.heapUsed)}`);
  console.log(`\nMachine: ${(await import("node:os")).cpus().length} cores, load average ${(await import("node:os")).loadavg().map((x) => x.toFixed(2)).join(" ")} at the end.`);

  await new Promise<void>((r) => {
    child.once("exit", () => r());
    child.kill("SIGTERM");
  });
  await bench.close();
}

main().catch((err) => {
  console.error(err instanceof Error ? (err.stack ?? err.message).slice(0, 4_000) : err);
  process.exit(1);
});
