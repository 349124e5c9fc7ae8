/**
 * The authorization matrix: every API route the app mounts (listed from the router itself by
 * listRoutes, so a new route cannot be forgotten) × anonymous, owner, estimator, crew assigned to the
 * job, crew not assigned, and the owner of another company, checked against the table below; then the
 * CSRF check for every state-changing session route.
 *
 * Refusals (README "API"): 401 signed out; 403 the role may not do this (or no CSRF token); 404 the record
 * is outside what the user may see (another company's id, a job not assigned to this crew member).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import sharp from "sharp";
import type { Express } from "express";
import { listRoutes } from "../../server/routes/route-list";
import { createTestApp, deliverOutbox, testMailCatcher, testPayments } from "../helpers/app";
import { csrfFor, signedInAgent } from "../helpers/auth";
import { countRows, testSequelize, truncateAll } from "../helpers/db";
import { buildCompany, buildUser, TEST_PASSWORD } from "../helpers/factories";
import { assignCrew, buildCustomer, buildJob, roofBody, saveRoofFor } from "../helpers/job-factories";
import { buildCatalogItem } from "../helpers/price-book-factories";
import { createQuote, post } from "../helpers/quote-factories";
import { latestToken } from "../helpers/proposal-world";
import { seedDemoPriceBook } from "../../server/db/seeders/demo-price-book";
import { DEFAULT_PRICING_SETTINGS } from "../../shared/schemas/price-book";
import { gableRoof } from "../../shared/engine/roof/generators";
import { CatalogItem } from "../../server/models/index";

// ---------------------------------------------------------------------------------------------------
// Actors and outcomes

const ACTORS = ["anon", "owner", "estimator", "crew", "crewUnassigned", "other"] as const;
type Actor = (typeof ACTORS)[number];
/** "ok": 2xx (or a code the row lists in `alsoOk`); a number: exactly that status. */
type Outcome = "ok" | 400 | 401 | 403 | 404;
type Who = Record<Actor, Outcome>;

const ok = "ok" as const;
/** Anyone, signed in or not. */
const anyone: Who = { anon: ok, owner: ok, estimator: ok, crew: ok, crewUnassigned: ok, other: ok };
/** Any signed-in user, no record of ours involved (another company's owner acts on their own company). */
const signedIn: Who = { anon: 401, owner: ok, estimator: ok, crew: ok, crewUnassigned: ok, other: ok };
/** Owners and estimators on a collection (another company's owner works on their own). */
const officeList: Who = { anon: 401, owner: ok, estimator: ok, crew: 403, crewUnassigned: 403, other: ok };
/** Owners and estimators on one of our records. */
const office: Who = { ...officeList, other: 404 };
/** Owners only, on a collection. */
const ownerList: Who = { anon: 401, owner: ok, estimator: 403, crew: 403, crewUnassigned: 403, other: ok };
/** Owners only, on one of our records. */
const ownerOnly: Who = { ...ownerList, other: 404 };
/** Everyone who may read the job: office, and crew assigned to it. */
const jobReaders: Who = { anon: 401, owner: ok, estimator: ok, crew: ok, crewUnassigned: 404, other: 404 };
/** Office only, and crew are told the record does not exist (the proposal routes: prices). */
const officeOr404: Who = { anon: 401, owner: ok, estimator: ok, crew: 404, crewUnassigned: 404, other: 404 };

// ---------------------------------------------------------------------------------------------------
// The world: company A with its people, records in every state; company B's owner.

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
interface Client {
  agent: ReturnType<typeof request.agent>;
  token: string;
  user?: Agent["user"];
}

interface World {
  app: Express;
  companyId: number;
  actors: Record<Actor, Client>;
  owner: Agent;
  estimator: Agent;
  crew: Agent;
  /** Job with a saved roof, estimator and the crew member assigned. */
  job: { id: number; customerId: number };
  /** Job whose roof the matrix saves (so the main job's roof stays as the quotes were priced). */
  roofJob: { id: number };
  teamMember: { id: number };
  itemId: number;
  draftQuoteId: number;
  sentQuoteId: number;
  publicToken: string;
  acceptedToken: string;
  photoId: number;
  mailId: string;
  png: Buffer;
}

const CSV_ROOF = "name,pitch,shape,width,depth\nGarage,4,rectangle,20,12\n";

const gableInput = () => ({
  site: { atticType: "vented", climateZone: "4A" },
  planes: gableRoof(40, 30, 6),
  stacks: [{ id: "s1", name: "Mesh", underlayment: { kind: "synthetic", highTemp: true }, spacer: { kind: "mesh" } }],
  defaultStackId: "s1",
});

const uniq = () => Math.random().toString(36).slice(2, 10);

async function expectStatus(res: request.Response, allowed: number[], what: string) {
  if (!allowed.includes(res.status)) throw new Error(`${what}: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

async function quoteVersion(w: World, id: number): Promise<number> {
  const res = await w.owner.agent.get(`/api/quotes/${id}`);
  return (await expectStatus(res, [200], `GET quote ${id}`)).data.revision.version as number;
}

/** A quote on the main job, moved to the state asked for through the API. */
async function quoteIn(w: World, state: "draft" | "in_review" | "approved" | "archived", jobId = w.job.id): Promise<number> {
  const created = await expectStatus(await createQuote(w.estimator, jobId, {}), [201], "create quote");
  const id = created.data.id as number;
  if (state === "archived") await expectStatus(await post(w.estimator, `/api/quotes/${id}/archive`), [200], "archive");
  if (state === "draft" || state === "archived") return id;
  await expectStatus(await post(w.estimator, `/api/quotes/${id}/submit`, { version: created.data.revision.version }), [200], "submit");
  if (state === "in_review") return id;
  await expectStatus(await post(w.owner, `/api/quotes/${id}/approve`, {}), [200], "approve");
  return id;
}

/** A proposal sent to the homeowner on a job of its own: its token and the first option's id. */
async function sentProposal(w: World): Promise<{ token: string; optionId: number; quoteId: number }> {
  const job = await buildJob({ companyId: w.companyId, status: "estimating", estimatorId: w.estimator.user.id });
  await saveRoofFor(job, roofBody(0));
  const quoteId = await quoteIn(w, "approved", job.id);
  await expectStatus(await post(w.estimator, `/api/quotes/${quoteId}/send`, {}), [201], "send");
  const token = await latestToken();
  const view = await expectStatus(await request(w.app).get(`/api/proposals/${token}`), [200], "view proposal");
  return { token, optionId: view.data.options[0].id as number, quoteId };
}

async function uploadPhoto(w: World, as: Client = w.actors.owner): Promise<number> {
  const res = await as.agent.post(`/api/jobs/${w.job.id}/attachments`).set("X-CSRF-Token", as.token).attach("file", w.png, "site.png");
  const body = await expectStatus(res, [201], "upload photo");
  const id = body.data[0].id as number;
  await expectStatus(await as.agent.patch(`/api/attachments/${id}`).set("X-CSRF-Token", as.token).send({ forCrew: true }), [200], "share photo");
  return id;
}

async function setLogo(client: Client, png: Buffer) {
  await expectStatus(await client.agent.put("/api/company/logo").set("X-CSRF-Token", client.token).attach("file", png, "logo.png"), [200], "set logo");
}

async function anonClient(app: Express): Promise<Client> {
  const agent = request.agent(app);
  return { agent, token: await csrfFor(agent) };
}

/** A second session of the same user (so signing in or out leaves the shared agents alone). */
async function cloneClient(app: Express, actor: Actor, w: World): Promise<Client> {
  const base = w.actors[actor];
  if (!base.user) return anonClient(app);
  const agent = request.agent(app);
  const csrf = await csrfFor(agent); // before the POST: the agent attaches its cookies when the request is made
  await agent.post("/api/auth/login").set("X-CSRF-Token", csrf).send({ email: base.user.email, password: TEST_PASSWORD }).expect(200);
  return { agent, token: await csrfFor(agent), user: base.user };
}

async function buildWorld(): Promise<World> {
  const app = createTestApp({}, { payments: await testPayments() });
  const company = await buildCompany();
  await seedDemoPriceBook(testSequelize(), company.id);
  const owner = await signedInAgent({ role: "owner", companyId: company.id }, app);
  const estimator = await signedInAgent({ role: "estimator", companyId: company.id }, app);
  const crew = await signedInAgent({ role: "crew", companyId: company.id }, app);
  const crewUnassigned = await signedInAgent({ role: "crew", companyId: company.id }, app);
  const other = await signedInAgent({ role: "owner" }, app);
  const anon = await anonClient(app);
  const job = await buildJob({ companyId: company.id, status: "estimating", estimatorId: estimator.user.id });
  await saveRoofFor(job, roofBody(0));
  await assignCrew(job.id, [crew.user.id]);
  const roofJob = await buildJob({ companyId: company.id, status: "estimating", estimatorId: estimator.user.id });
  await assignCrew(roofJob.id, [crew.user.id]);
  const teamMember = await buildUser({ companyId: company.id, role: "crew" });
  const item = await buildCatalogItem(company.id);
  const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 150, g: 90, b: 60 } } }).png().toBuffer();

  const w: World = {
    app,
    companyId: company.id,
    actors: { anon, owner, estimator, crew, crewUnassigned, other },
    owner,
    estimator,
    crew,
    job: { id: job.id, customerId: job.customerId },
    roofJob: { id: roofJob.id },
    teamMember: { id: teamMember.id },
    itemId: item.id,
    png,
    // filled in below, once the records exist
    draftQuoteId: 0,
    sentQuoteId: 0,
    publicToken: "",
    acceptedToken: "",
    photoId: 0,
    mailId: "",
  };

  w.draftQuoteId = await quoteIn(w, "draft");
  const sent = await sentProposal(w);
  w.sentQuoteId = sent.quoteId;
  w.publicToken = sent.token;
  const accepted = await sentProposal(w);
  await expectStatus(
    await request(app).post(`/api/proposals/${accepted.token}/accept`).send({ optionId: accepted.optionId, signerName: "Ada Homeowner", consent: true }),
    [200],
    "accept",
  );
  w.acceptedToken = accepted.token;
  w.photoId = await uploadPhoto(w);
  await setLogo(owner, png);
  await setLogo(other, png);

  // A caught e-mail of company A with an attachment (the proposal's PDF).
  await deliverOutbox();
  const mail = testMailCatcher().messages().find((m) => m.companyId === company.id && m.attachments.length > 0);
  if (!mail) throw new Error("no caught e-mail with an attachment for company A");
  w.mailId = mail.id;
  return w;
}

// ---------------------------------------------------------------------------------------------------
// The table: one row per `METHOD /path` the app mounts.

interface Req {
  path: string;
  body?: unknown;
  /** Multipart: files and text fields instead of a JSON body. */
  files?: Array<{ field: string; buf: Buffer; name: string }>;
  fields?: Record<string, string>;
}

interface Row {
  who: Who;
  /** Statuses accepted for an allowed actor besides 2xx, and why (state or body, never access). */
  alsoOk?: { codes: number[]; why: string };
  /** Builds the request; `fixture` holds what `setup` made (shared by refused actors; new per allowed actor when `fresh`). */
  req: (w: World, actor: Actor, fixture: Record<string, unknown>) => Req | Promise<Req>;
  setup?: (w: World, actor: Actor) => Promise<Record<string, unknown>>;
  fresh?: boolean;
  /**
   * How each actor's client is made: "shared" (the world's agents), "clone" (a new session of the same
   * user on a new app: sign-in/out and rate-limited routes), "newUser" (a new user of the same role and
   * company: the route ends the user's other sessions).
   */
  client?: "shared" | "clone" | "newUser";
  /** State-changing routes without a session: not under CSRF, with the reason. */
  csrfExempt?: string;
}

const r = (row: Row) => row;
const json = (path: string, body?: unknown): Req => ({ path, body });

const TABLE: Record<string, Row> = {
  // --- no session ---------------------------------------------------------------------------------
  "GET /api/health": r({ who: anyone, req: () => json("/api/health") }),
  "POST /api/payments/webhook": r({
    // The signature over the raw body is the only credential: unsigned is 400 for everyone, session or not.
    who: { anon: 400, owner: 400, estimator: 400, crew: 400, crewUnassigned: 400, other: 400 },
    req: () => json("/api/payments/webhook", { id: "evt_unsigned", type: "checkout.session.completed" }),
    csrfExempt: "no session: verified by the payment service's signature",
  }),
  "GET /api/proposals/:token": r({ who: anyone, req: (w) => json(`/api/proposals/${w.publicToken}`) }),
  "GET /api/proposals/:token/pdf": r({ who: anyone, req: (w) => json(`/api/proposals/${w.publicToken}/pdf`) }),
  "POST /api/proposals/:token/accept": r({
    who: anyone,
    fresh: true,
    setup: (w) => sentProposal(w),
    req: (_w, _a, f) => json(`/api/proposals/${f.token}/accept`, { optionId: f.optionId, signerName: "Ada Homeowner", consent: true }),
    csrfExempt: "no session: the token in the path is the credential",
  }),
  "POST /api/proposals/:token/decline": r({
    who: anyone,
    fresh: true,
    setup: (w) => sentProposal(w),
    req: (_w, _a, f) => json(`/api/proposals/${f.token}/decline`, { reason: "Going another way" }),
    csrfExempt: "no session: the token in the path is the credential",
  }),
  "POST /api/proposals/:token/deposit": r({
    who: anyone,
    req: (w) => json(`/api/proposals/${w.acceptedToken}/deposit`, {}),
    csrfExempt: "no session: the token in the path is the credential",
  }),

  // --- auth ---------------------------------------------------------------------------------------
  "GET /api/auth/csrf": r({ who: anyone, req: () => json("/api/auth/csrf") }),
  "POST /api/auth/login": r({
    who: anyone,
    client: "clone",
    req: (w, a) => json("/api/auth/login", { email: (w.actors[a].user ?? w.owner.user).email, password: TEST_PASSWORD }),
  }),
  "POST /api/auth/logout": r({ who: anyone, client: "clone", req: () => json("/api/auth/logout") }),
  "GET /api/auth/me": r({ who: signedIn, req: () => json("/api/auth/me") }),
  "POST /api/auth/password": r({
    who: signedIn,
    client: "newUser",
    req: () => json("/api/auth/password", { currentPassword: TEST_PASSWORD, newPassword: "a-new-long-passphrase" }),
  }),
  "POST /api/auth/forgot": r({ who: anyone, client: "clone", req: (w) => json("/api/auth/forgot", { email: w.owner.user.email }) }),
  "POST /api/auth/reset": r({
    who: anyone,
    alsoOk: { codes: [400], why: "an unknown reset token is 400 invalid_reset_token: the token is the credential, not the session" },
    req: () => json("/api/auth/reset", { token: "x".repeat(43), password: "a-new-long-passphrase" }),
  }),

  // --- users --------------------------------------------------------------------------------------
  "GET /api/users": r({ who: ownerList, req: () => json("/api/users") }),
  "POST /api/users": r({
    who: ownerList,
    req: () => json("/api/users", { email: `member-${uniq()}@example.com`, name: "New Member", role: "crew", password: "a-long-enough-pass" }),
  }),
  "PATCH /api/users/:id": r({ who: ownerOnly, req: (w) => json(`/api/users/${w.teamMember.id}`, { name: "Renamed Member" }) }),
  "PUT /api/users/:id/password": r({ who: ownerOnly, req: (w) => json(`/api/users/${w.teamMember.id}/password`, { password: "set-by-the-owner" }) }),

  // --- calc ---------------------------------------------------------------------------------------
  "POST /api/calc/takeoff": r({ who: signedIn, req: () => json("/api/calc/takeoff", gableInput()) }),
  "POST /api/calc/echo": r({ who: signedIn, req: () => json("/api/calc/echo", { a: 1 }) }),
  "POST /api/calc/gap-study": r({
    who: signedIn,
    req: () => json("/api/calc/gap-study", { ...gableInput(), planeIds: [gableRoof(40, 30, 6)[0]!.id] }),
  }),

  // --- customers ----------------------------------------------------------------------------------
  "GET /api/customers": r({ who: officeList, req: () => json("/api/customers") }),
  "POST /api/customers": r({ who: officeList, req: () => json("/api/customers", { name: "Noor Quillfeather" }) }),
  "GET /api/customers/:id": r({ who: office, req: (w) => json(`/api/customers/${w.job.customerId}`) }),
  "PATCH /api/customers/:id": r({ who: office, req: (w) => json(`/api/customers/${w.job.customerId}`, { phone: "555-0199" }) }),
  "POST /api/customers/:id/archive": r({
    who: office,
    fresh: true,
    setup: async (w) => ({ id: (await buildCustomer({ companyId: w.companyId })).id }),
    req: (_w, _a, f) => json(`/api/customers/${f.id}/archive`),
  }),
  "POST /api/customers/:id/restore": r({
    who: office,
    fresh: true,
    setup: async (w) => ({ id: (await buildCustomer({ companyId: w.companyId, archivedAt: new Date() })).id }),
    req: (_w, _a, f) => json(`/api/customers/${f.id}/restore`),
  }),

  // --- jobs and what hangs off them ---------------------------------------------------------------
  "GET /api/jobs/:jobId/quotes": r({ who: office, req: (w) => json(`/api/jobs/${w.job.id}/quotes`) }),
  "POST /api/jobs/:jobId/quotes": r({ who: office, req: (w) => json(`/api/jobs/${w.job.id}/quotes`, {}) }),
  "GET /api/jobs/:jobId/attachments": r({ who: jobReaders, req: (w) => json(`/api/jobs/${w.job.id}/attachments`) }),
  "POST /api/jobs/:jobId/attachments": r({
    // Crew upload photos on jobs assigned to them.
    who: { anon: 401, owner: ok, estimator: ok, crew: ok, crewUnassigned: 404, other: 404 },
    req: (w) => ({ path: `/api/jobs/${w.job.id}/attachments`, files: [{ field: "file", buf: w.png, name: "ridge.png" }] }),
  }),
  "POST /api/jobs/:jobId/roof/import": r({
    who: office,
    req: (w) => ({ path: `/api/jobs/${w.roofJob.id}/roof/import`, files: [{ field: "file", buf: Buffer.from(CSV_ROOF), name: "planes.csv" }] }),
  }),
  "GET /api/jobs/:jobId/roof/export.csv": r({ who: jobReaders, req: (w) => json(`/api/jobs/${w.job.id}/roof/export.csv`) }),
  "GET /api/jobs/:jobId/install-packet": r({ who: jobReaders, req: (w) => json(`/api/jobs/${w.job.id}/install-packet`) }),
  "GET /api/jobs/:jobId/install-packet.pdf": r({ who: jobReaders, req: (w) => json(`/api/jobs/${w.job.id}/install-packet.pdf`) }),
  "GET /api/jobs/:jobId/proposals": r({ who: officeOr404, req: (w) => json(`/api/jobs/${w.job.id}/proposals`) }),
  "GET /api/jobs": r({ who: signedIn, req: () => json("/api/jobs") }),
  "POST /api/jobs": r({ who: officeList, req: () => json("/api/jobs", { customer: { name: "Ines Marrowby" }, siteAddressLine1: "3 Quarry Row" }) }),
  "GET /api/jobs/:id": r({ who: jobReaders, req: (w) => json(`/api/jobs/${w.job.id}`) }),
  "PATCH /api/jobs/:id": r({ who: office, req: (w) => json(`/api/jobs/${w.job.id}`, { notes: "Ladder on the north side" }) }),
  "POST /api/jobs/:id/archive": r({
    who: office,
    fresh: true,
    setup: async (w) => ({ id: (await buildJob({ companyId: w.companyId })).id }),
    req: (_w, _a, f) => json(`/api/jobs/${f.id}/archive`),
  }),
  "POST /api/jobs/:id/restore": r({
    who: office,
    fresh: true,
    setup: async (w) => ({ id: (await buildJob({ companyId: w.companyId, archivedAt: new Date() })).id }),
    req: (_w, _a, f) => json(`/api/jobs/${f.id}/restore`),
  }),
  "PUT /api/jobs/:id/assignment": r({
    who: office,
    // The same assignment again: the crew member stays assigned for the rest of the matrix.
    req: (w) => json(`/api/jobs/${w.job.id}/assignment`, { estimatorId: w.estimator.user.id, crewIds: [w.crew.user.id] }),
  }),
  "GET /api/jobs/:id/roof": r({ who: jobReaders, req: (w) => json(`/api/jobs/${w.job.id}/roof`) }),
  "PUT /api/jobs/:id/roof": r({
    who: office,
    req: async (w) => {
      const current = await w.owner.agent.get(`/api/jobs/${w.roofJob.id}/roof`);
      return json(`/api/jobs/${w.roofJob.id}/roof`, roofBody(current.body.data.version as number));
    },
  }),
  "GET /api/jobs/:id/takeoff": r({ who: jobReaders, req: (w) => json(`/api/jobs/${w.job.id}/takeoff`) }),
  "GET /api/jobs/:id/audit": r({ who: office, req: (w) => json(`/api/jobs/${w.job.id}/audit`) }),
  "GET /api/audit": r({ who: ownerList, req: () => json("/api/audit") }),

  // --- price book ---------------------------------------------------------------------------------
  "GET /api/price-book/items": r({ who: officeList, req: () => json("/api/price-book/items") }),
  "POST /api/price-book/items": r({
    who: ownerList,
    req: () => json("/api/price-book/items", { sku: `T-${uniq()}`, category: "trim", name: "Rake trim", purchaseUnit: "pc", packCoverage: 10, coverageUnit: "lf", unitCostCents: 1900 }),
  }),
  "GET /api/price-book/items/:id": r({ who: office, req: (w) => json(`/api/price-book/items/${w.itemId}`) }),
  "GET /api/price-book/items/:id/prices": r({ who: office, req: (w) => json(`/api/price-book/items/${w.itemId}/prices`) }),
  "PATCH /api/price-book/items/:id": r({
    who: ownerOnly,
    req: async (w) => json(`/api/price-book/items/${w.itemId}`, { name: "Eave trim, renamed", version: (await CatalogItem.findByPk(w.itemId))!.version }),
  }),
  "POST /api/price-book/items/:id/archive": r({
    who: ownerOnly,
    fresh: true,
    setup: async (w) => ({ id: (await buildCatalogItem(w.companyId)).id }),
    req: (_w, _a, f) => json(`/api/price-book/items/${f.id}/archive`),
  }),
  "POST /api/price-book/items/:id/restore": r({
    who: ownerOnly,
    fresh: true,
    setup: async (w) => ({ id: (await buildCatalogItem(w.companyId, { active: false })).id }),
    req: (_w, _a, f) => json(`/api/price-book/items/${f.id}/restore`),
  }),
  "GET /api/price-book/labor": r({ who: officeList, req: () => json("/api/price-book/labor") }),
  "PUT /api/price-book/labor": r({
    who: ownerList,
    req: () => json("/api/price-book/labor", { rates: [{ kind: "pitch_band", label: "Any pitch", minPitch: 0, maxPitch: null, centsPerUnit: 21000, unit: "square" }] }),
  }),
  "GET /api/price-book/settings": r({ who: officeList, req: () => json("/api/price-book/settings") }),
  "PUT /api/price-book/settings": r({ who: ownerList, req: () => json("/api/price-book/settings", DEFAULT_PRICING_SETTINGS) }),
  "GET /api/price-book/mapping": r({ who: officeList, req: () => json("/api/price-book/mapping") }),
  "GET /api/price-book/rules": r({ who: officeList, req: () => json("/api/price-book/rules") }),
  "GET /api/price-book/export.csv": r({ who: officeList, req: () => json("/api/price-book/export.csv") }),
  "POST /api/price-book/import": r({
    who: ownerList,
    req: async (w) => {
      const csv = await w.owner.agent.get("/api/price-book/export.csv").buffer(true).parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => cb(null, Buffer.concat(chunks)));
      });
      return { path: "/api/price-book/import", files: [{ field: "file", buf: csv.body as Buffer, name: "price-book.csv" }] };
    },
  }),

  // --- company ------------------------------------------------------------------------------------
  "GET /api/company": r({ who: signedIn, req: () => json("/api/company") }),
  "PUT /api/company": r({ who: ownerList, req: () => json("/api/company", { name: "Harlow Bend Metal Roofs", email: "office@example.com" }) }),
  "GET /api/company/logo": r({ who: signedIn, req: () => json("/api/company/logo") }),
  "PUT /api/company/logo": r({ who: ownerList, req: (w) => ({ path: "/api/company/logo", files: [{ field: "file", buf: w.png, name: "logo.png" }] }) }),
  "DELETE /api/company/logo": r({
    who: ownerList,
    fresh: true,
    setup: async (w, a) => {
      if (a === "owner" || a === "other") await setLogo(w.actors[a], w.png);
      return {};
    },
    req: () => json("/api/company/logo"),
  }),

  // --- quotes -------------------------------------------------------------------------------------
  "GET /api/quotes/:id": r({ who: office, req: (w) => json(`/api/quotes/${w.draftQuoteId}`) }),
  "GET /api/quotes/:id/revisions/:revisionNo": r({ who: office, req: (w) => json(`/api/quotes/${w.draftQuoteId}/revisions/1`) }),
  "PATCH /api/quotes/:id": r({
    who: office,
    req: async (w) => json(`/api/quotes/${w.draftQuoteId}`, { version: await quoteVersion(w, w.draftQuoteId), notes: "Check the valley flashing" }),
  }),
  "POST /api/quotes/:id/recalculate": r({
    who: office,
    req: async (w) => json(`/api/quotes/${w.draftQuoteId}/recalculate`, { version: await quoteVersion(w, w.draftQuoteId) }),
  }),
  "POST /api/quotes/:id/submit": r({
    who: office,
    fresh: true,
    setup: async (w) => ({ id: await quoteIn(w, "draft") }),
    req: async (w, _a, f) => json(`/api/quotes/${f.id}/submit`, { version: await quoteVersion(w, f.id as number) }),
  }),
  "POST /api/quotes/:id/approve": r({
    who: ownerOnly,
    fresh: true,
    setup: async (w) => ({ id: await quoteIn(w, "in_review") }),
    req: (_w, _a, f) => json(`/api/quotes/${f.id}/approve`, {}),
  }),
  "POST /api/quotes/:id/return": r({
    who: ownerOnly,
    fresh: true,
    setup: async (w) => ({ id: await quoteIn(w, "in_review") }),
    req: (_w, _a, f) => json(`/api/quotes/${f.id}/return`, { comment: "Add the snow guards" }),
  }),
  "POST /api/quotes/:id/revise": r({
    who: office,
    fresh: true,
    setup: async (w) => ({ id: await quoteIn(w, "approved") }),
    req: (_w, _a, f) => json(`/api/quotes/${f.id}/revise`),
  }),
  "POST /api/quotes/:id/archive": r({
    who: office,
    fresh: true,
    setup: async (w) => ({ id: await quoteIn(w, "draft") }),
    req: (_w, _a, f) => json(`/api/quotes/${f.id}/archive`),
  }),
  "POST /api/quotes/:id/restore": r({
    who: office,
    fresh: true,
    setup: async (w) => ({ id: await quoteIn(w, "archived") }),
    req: (_w, _a, f) => json(`/api/quotes/${f.id}/restore`),
  }),
  "GET /api/quotes/:id/pdf": r({ who: officeOr404, req: (w) => json(`/api/quotes/${w.draftQuoteId}/pdf`) }),
  "POST /api/quotes/:id/send": r({
    // A sent quote may be sent again (a new link; the older one revoked).
    who: officeOr404,
    req: (w) => json(`/api/quotes/${w.sentQuoteId}/send`, {}),
  }),
  "GET /api/approvals": r({ who: ownerList, req: () => json("/api/approvals") }),

  // --- attachments (a photo the office uploaded and shared with the crew) --------------------------
  "GET /api/attachments/:id": r({ who: jobReaders, req: (w) => json(`/api/attachments/${w.photoId}`) }),
  "PATCH /api/attachments/:id": r({
    // Crew may only caption their own photos: an office photo shared with them is visible (403), not hidden.
    who: { anon: 401, owner: ok, estimator: ok, crew: 403, crewUnassigned: 404, other: 404 },
    req: (w) => json(`/api/attachments/${w.photoId}`, { caption: "North slope" }),
  }),
  "DELETE /api/attachments/:id": r({
    who: { anon: 401, owner: ok, estimator: ok, crew: 403, crewUnassigned: 404, other: 404 },
    fresh: true,
    setup: async (w) => ({ id: await uploadPhoto(w) }),
    req: (_w, _a, f) => json(`/api/attachments/${f.id}`),
  }),
  "GET /api/attachments/:id/file": r({ who: jobReaders, req: (w) => json(`/api/attachments/${w.photoId}/file`) }),
  "GET /api/attachments/:id/thumb": r({ who: jobReaders, req: (w) => json(`/api/attachments/${w.photoId}/thumb`) }),

  // --- the local mail catcher (a caught proposal e-mail of company A) ------------------------------
  "GET /api/dev/mail": r({ who: officeList, req: () => json("/api/dev/mail") }),
  "GET /api/dev/mail/:id": r({ who: office, req: (w) => json(`/api/dev/mail/${w.mailId}`) }),
  "GET /api/dev/mail/:id/attachments/:index": r({ who: office, req: (w) => json(`/api/dev/mail/${w.mailId}/attachments/0`) }),
};

// ---------------------------------------------------------------------------------------------------
// Sending

const keyOf = (method: string, path: string) => `${method} ${path}`;
const methodOf = (key: string) => key.split(" ")[0]!;
const WRITE = new Set(["POST", "PUT", "PATCH", "DELETE"]);

function send(client: Client, method: string, req: Req, csrf = true) {
  const m = method.toLowerCase() as "get" | "post" | "put" | "patch" | "delete";
  let t = client.agent[m](req.path);
  if (csrf && WRITE.has(method)) t = t.set("X-CSRF-Token", client.token);
  if (req.files) {
    for (const f of req.files) t = t.attach(f.field, f.buf, f.name);
    for (const [k, v] of Object.entries(req.fields ?? {})) t = t.field(k, v);
    return t;
  }
  return req.body === undefined ? t : t.send(req.body as object);
}

async function clientFor(w: World, row: Row, actor: Actor): Promise<Client> {
  const kind = row.client ?? "shared";
  if (kind === "shared") return w.actors[actor];
  if (kind === "clone") {
    // Rate-limit counts live in the database and are shared by every app (as by every server process):
    // a new app no longer starts from zero, so clear them; this matrix checks access, not limits.
    await testSequelize().query("DELETE FROM rate_limit_hits");
    return cloneClient(createTestApp({}, { payments: await testPayments() }), actor, w);
  }
  // newUser: same role and company as the actor (crew assignment does not matter on these routes)
  if (actor === "anon") return anonClient(w.app);
  const base = w.actors[actor].user!;
  const fresh = await signedInAgent({ role: base.role, companyId: base.companyId }, w.app);
  return { agent: fresh.agent, token: fresh.token, user: fresh.user };
}

const allowedOf = (row: Row) => ACTORS.filter((a) => row.who[a] === ok);
const refusedOf = (row: Row) => ACTORS.filter((a) => row.who[a] !== ok);

// ---------------------------------------------------------------------------------------------------

let w: World;
const listed = new Set<string>();
let checks = 0;

beforeAll(async () => {
  await truncateAll();
  for (const route of listRoutes(createTestApp())) listed.add(keyOf(route.method, route.path));
  w = await buildWorld();
}, 120_000);

afterAll(() => {
  // One line for the report: how many route × actor cells were sent.
  console.info(`authorization matrix: ${listed.size} routes, ${checks} route × actor checks`);
});

describe("the route list", () => {
  it("lists the app's routes from its router, with their params", () => {
    expect(listed.size).toBeGreaterThan(80);
    expect(listed).toContain("GET /api/jobs/:jobId/install-packet.pdf");
    expect(listed).toContain("POST /api/proposals/:token/accept");
    expect(listed).toContain("POST /api/payments/webhook");
    expect(listed).toContain("GET /api/dev/mail/:id/attachments/:index");
  });

  it("has a row in the table for every listed route (add one for a new route)", () => {
    expect([...listed].filter((k) => !(k in TABLE))).toEqual([]);
  });

  it("has no row for a route that no longer exists", () => {
    expect(Object.keys(TABLE).filter((k) => !listed.has(k))).toEqual([]);
  });
});

describe.each(Object.keys(TABLE))("%s", (key) => {
  const row = TABLE[key]!;
  const method = methodOf(key);

  const refused = refusedOf(row).map((a) => [a, row.who[a]] as const);
  const allowed = allowedOf(row);
  if (refused.length) it.each(refused)("%s → %s", async (actor, expected) => {
    const fixture = row.setup ? await row.setup(w, actor) : {};
    const client = await clientFor(w, row, actor);
    const res = await send(client, method, await row.req(w, actor, fixture), !row.csrfExempt);
    checks++;
    expect(res.status, `${key} as ${actor}: ${JSON.stringify(res.body)}`).toBe(expected);
  });

  if (allowed.length) it.each(allowed)("%s → allowed", async (actor) => {
    const fixture = row.setup ? await row.setup(w, actor) : {};
    const client = await clientFor(w, row, actor);
    // The exempt routes are sent as the homeowner's browser and the payment service send them: no CSRF token.
    const res = await send(client, method, await row.req(w, actor, fixture), !row.csrfExempt);
    checks++;
    const fine = (res.status >= 200 && res.status < 300) || (row.alsoOk?.codes.includes(res.status) ?? false);
    expect(fine, `${key} as ${actor}: ${res.status} ${JSON.stringify(res.body)}`).toBe(true);
  });
});

describe("CSRF on every state-changing session route", () => {
  const writes = () => Object.keys(TABLE).filter((k) => WRITE.has(methodOf(k)) && !TABLE[k]!.csrfExempt);

  it("names exactly the public token routes and the payment webhook as exempt", () => {
    const exempt = Object.keys(TABLE).filter((k) => TABLE[k]!.csrfExempt);
    expect(exempt.sort()).toEqual(
      [
        "POST /api/payments/webhook",
        "POST /api/proposals/:token/accept",
        "POST /api/proposals/:token/decline",
        "POST /api/proposals/:token/deposit",
      ].sort(),
    );
    expect(writes().length).toBeGreaterThan(40);
  });

  it("refuses a signed-in owner without the X-CSRF-Token header with 403 csrf, and changes nothing", async () => {
    // Every fixture first (a valid request in every respect but the token), then the counts.
    const prepared: Array<[string, Req]> = [];
    for (const key of writes()) {
      const row = TABLE[key]!;
      const fixture = row.setup ? await row.setup(w, "owner") : {};
      prepared.push([key, await row.req(w, "owner", fixture)]);
    }
    const [tables] = await testSequelize().query(
      "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() ORDER BY table_name",
    );
    const names = (tables as Array<{ name: string }>).map((t) => t.name);
    const counts = async () => Object.fromEntries(await Promise.all(names.map(async (n) => [n, await countRows(n)] as const)));
    const before = await counts();
    const refused: string[] = [];
    for (const [key, req] of prepared) {
      const res = await send(w.actors.owner, methodOf(key), req, false);
      checks++;
      if (res.status !== 403 || res.body?.error?.code !== "csrf") refused.push(`${key}: ${res.status} ${JSON.stringify(res.body)}`);
    }
    expect(refused).toEqual([]);
    expect(await counts()).toEqual(before);
    // The owner's session is untouched (logout and login were refused too).
    expect((await w.owner.agent.get("/api/auth/me")).status).toBe(200);
  });
});
