/**
 * Bad input on every write route the app mounts (listed from the router itself, as the authorization matrix
 * does, so a new route cannot be left out): about 25 generated invalid bodies per JSON route get 400 with the
 * offending field paths and change nothing in the database (a CHECKSUM TABLE of every table before and after);
 * body-less routes ignore junk; oversized bodies get 413, other content types 415, broken JSON 400, strings over
 * a field's maximum 400 with that field. Hostile text (accents, CJK, emoji, RTL, combining marks, SQL, HTML) in
 * every free-text field is stored and returned exactly, and printed literally in the proposal PDF.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import sharp from "sharp";
import fc from "fast-check";
import type { Express } from "express";
import type { ZodType } from "zod";
import { listRoutes } from "../../server/routes/route-list";
import { createTestApp, stopTestStores, testPayments } from "../helpers/app";
import { csrfFor, signedInAgent } from "../helpers/auth";
import { testSequelize, truncateAll } from "../helpers/db";
import { buildCompany, buildUser, TEST_PASSWORD } from "../helpers/factories";
import { assignCrew, buildCustomer, buildJob, roofBody, saveRoofFor } from "../helpers/job-factories";
import { buildCatalogItem } from "../helpers/price-book-factories";
import { createQuote, post, quoteInReview } from "../helpers/quote-factories";
import { binary, latestToken, TWO_OPTIONS } from "../helpers/proposal-world";
import { pdfText, squash } from "../helpers/pdf-text";
import {
  changedTables,
  databaseChecksums,
  deepGarbage,
  findText,
  HOSTILE_TEXTS,
  invalidBodies,
  maxLengthAt,
  nodes,
  pathKey,
  relatedKey,
  setAt,
  unboundedNodes,
} from "../helpers/fuzz";
import { seedDemoPriceBook } from "../../server/db/seeders/demo-price-book";
import { coverage, loadInterFonts } from "../../server/pdf/fonts";
import { CatalogItem } from "../../server/models/index";
import { gableRoof } from "../../shared/engine/roof/generators";
import {
  changePasswordInputSchema,
  createUserInputSchema,
  forgotPasswordInputSchema,
  loginInputSchema,
  resetPasswordInputSchema,
  setPasswordInputSchema,
  updateUserInputSchema,
} from "../../shared/schemas/auth";
import { customerInputSchema, customerUpdateSchema } from "../../shared/schemas/customer";
import { jobAssignmentSchema, jobInputSchema, jobUpdateSchema } from "../../shared/schemas/job";
import { roofSaveSchema } from "../../shared/schemas/roof";
import { gapStudyInputSchema, takeoffInputSchema } from "../../shared/schemas/takeoff";
import {
  catalogItemInputSchema,
  catalogItemUpdateSchema,
  companyProfileSchema,
  DEFAULT_PRICING_SETTINGS,
  laborRatesInputSchema,
  pricingSettingsSchema,
} from "../../shared/schemas/price-book";
import {
  quoteApproveSchema,
  quoteCreateSchema,
  quotePatchSchema,
  quoteRecalculateSchema,
  quoteReturnSchema,
  quoteSubmitSchema,
} from "../../shared/schemas/quote";
import { attachmentUpdateSchema } from "../../shared/schemas/attachment";
import { proposalAcceptSchema, proposalDeclineSchema, proposalSendSchema } from "../../shared/schemas/proposal-api";

// ---------------------------------------------------------------------------------------------------
// The world

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
interface Client {
  agent: ReturnType<typeof request.agent>;
  token: string;
}

interface World {
  app: Express;
  companyId: number;
  owner: Agent;
  estimator: Agent;
  anon: Client;
  jobId: number;
  customerId: number;
  teamMemberId: number;
  crewId: number;
  itemId: number;
  draftQuoteId: number;
  reviewQuoteId: number;
  sentQuoteId: number;
  token: string;
  photoId: number;
}

let w: World;
let ipSeq = 0;
/** A new client address per request: the per-IP limits (sign-in, reset, public writes) stay out of the way. */
const nextIp = () => `10.${(ipSeq >> 16) & 255}.${(ipSeq >> 8) & 255}.${ipSeq++ & 255}`;

async function buildWorld(): Promise<World> {
  // trustProxy: the X-Forwarded-For address is the client's (nextIp); the sign-in limit is out of the way too.
  const pay = await testPayments();
  const app = createTestApp({ trustProxy: true, loginMaxFailures: 100_000 }, { payments: { stripe: pay.stripe, config: pay.config } });
  const company = await buildCompany();
  await seedDemoPriceBook(testSequelize(), company.id);
  const owner = await signedInAgent({ role: "owner", companyId: company.id }, app);
  const estimator = await signedInAgent({ role: "estimator", companyId: company.id }, app);
  const crew = await buildUser({ role: "crew", companyId: company.id });
  const teamMember = await buildUser({ role: "crew", companyId: company.id });
  const anonAgent = request.agent(app);
  const anon = { agent: anonAgent, token: await csrfFor(anonAgent) };
  const job = await buildJob({ companyId: company.id, status: "estimating", estimatorId: estimator.user.id });
  await saveRoofFor(job, roofBody(0));
  await assignCrew(job.id, [crew.id]);
  const item = await buildCatalogItem(company.id);
  const qw = { app, company, owner, estimator, crew: estimator, job };

  const draft = await createQuote(estimator, job.id, { options: TWO_OPTIONS });
  if (draft.status !== 201) throw new Error(`create quote: ${draft.status} ${JSON.stringify(draft.body)}`);
  const review = await quoteInReview(qw, { options: TWO_OPTIONS });
  const toSend = await quoteInReview(qw, { options: TWO_OPTIONS });
  const approved = await post(owner, `/api/quotes/${toSend.id}/approve`, {});
  if (approved.status !== 200) throw new Error(`approve: ${approved.status} ${JSON.stringify(approved.body)}`);
  const sent = await post(estimator, `/api/quotes/${toSend.id}/send`, {});
  if (sent.status !== 201) throw new Error(`send: ${sent.status} ${JSON.stringify(sent.body)}`);
  const token = await latestToken();

  const png = await sharp({ create: { width: 32, height: 24, channels: 3, background: { r: 120, g: 80, b: 40 } } }).png().toBuffer();
  const up = await owner.agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", owner.token).attach("file", png, "site.png");
  if (up.status !== 201) throw new Error(`upload: ${up.status} ${JSON.stringify(up.body)}`);

  return {
    app,
    companyId: company.id,
    owner,
    estimator,
    anon,
    jobId: job.id,
    customerId: job.customerId,
    teamMemberId: teamMember.id,
    crewId: crew.id,
    itemId: item.id,
    draftQuoteId: draft.body.data.id,
    reviewQuoteId: review.id,
    sentQuoteId: toSend.id,
    token,
    photoId: up.body.data[0].id,
  };
}

// ---------------------------------------------------------------------------------------------------
// What each write route takes

type As = "owner" | "anon" | "homeowner";
interface JsonSpec {
  kind: "json" | "optional";
  schema: ZodType;
  path: (w: World) => string;
  /** A body the schema accepts (never sent as it is: only its broken copies are). */
  sample: (w: World) => unknown | Promise<unknown>;
  as?: As;
}
interface OtherSpec {
  kind: "none" | "multipart" | "other";
  why: string;
}
type Spec = JsonSpec | OtherSpec;

const json = (schema: ZodType, path: JsonSpec["path"], sample: JsonSpec["sample"], as?: As): JsonSpec => ({ kind: "json", schema, path, sample, as });
const optional = (schema: ZodType, path: JsonSpec["path"], sample: JsonSpec["sample"], as?: As): JsonSpec => ({
  kind: "optional",
  schema,
  path,
  sample,
  as,
});
const none = (why = "takes no body: junk in it is ignored"): OtherSpec => ({ kind: "none", why });
const multipart = (why: string): OtherSpec => ({ kind: "multipart", why });

const gableInput = () => ({
  site: { atticType: "vented", climateZone: "4A", wind: { basicWindSpeedMph: 115, exposure: "B" } },
  planes: gableRoof(40, 30, 6),
  stacks: [{ id: "s1", name: "Mesh", underlayment: { kind: "synthetic", highTemp: true }, spacer: { kind: "mesh" } }],
  defaultStackId: "s1",
  rules: { waste: { underlaymentPct: 12 }, panels: { maxLengthFt: 40 } },
});

const customerSample = () => ({
  name: "Noor Quillfeather",
  email: "noor@example.com",
  phone: "555-0100",
  addressLine1: "12 Tanner Lane",
  addressLine2: "Unit 4",
  city: "Harlow Bend",
  region: "OR",
  postalCode: "97000",
  notes: "Dog in the yard",
});

const itemVersion = async (w: World) => (await CatalogItem.findByPk(w.itemId))!.version;
const quoteVersion = async (w: World, id: number) => (await w.owner.agent.get(`/api/quotes/${id}`)).body.data.revision.version as number;

const SPECS: Record<string, Spec> = {
  "POST /api/payments/webhook": { kind: "other", why: "raw body verified by the payment service's signature (payments tests); junk is 400 below" },
  "POST /api/proposals/:token/accept": json(
    proposalAcceptSchema,
    (w) => `/api/proposals/${w.token}/accept`,
    () => ({ optionId: 1, signerName: "Ada Homeowner", consent: true }),
    "homeowner",
  ),
  "POST /api/proposals/:token/decline": optional(proposalDeclineSchema, (w) => `/api/proposals/${w.token}/decline`, () => ({ reason: "Going another way" }), "homeowner"),
  "POST /api/proposals/:token/deposit": none(),

  "POST /api/auth/login": json(loginInputSchema, () => "/api/auth/login", (w) => ({ email: w.owner.user.email, password: "not-the-password" }), "anon"),
  "POST /api/auth/logout": none(),
  "POST /api/auth/password": json(changePasswordInputSchema, () => "/api/auth/password", () => ({ currentPassword: TEST_PASSWORD, newPassword: "a-new-long-passphrase" })),
  "POST /api/auth/forgot": json(forgotPasswordInputSchema, () => "/api/auth/forgot", (w) => ({ email: w.owner.user.email }), "anon"),
  "POST /api/auth/reset": json(resetPasswordInputSchema, () => "/api/auth/reset", () => ({ token: "x".repeat(43), password: "a-new-long-passphrase" }), "anon"),

  "POST /api/users": json(createUserInputSchema, () => "/api/users", () => ({ email: "member@example.com", name: "New Member", role: "crew", password: "a-long-enough-pass" })),
  "PATCH /api/users/:id": json(updateUserInputSchema, (w) => `/api/users/${w.teamMemberId}`, () => ({ name: "Renamed Member", role: "estimator", active: true })),
  "PUT /api/users/:id/password": json(setPasswordInputSchema, (w) => `/api/users/${w.teamMemberId}/password`, () => ({ password: "set-by-the-owner" })),

  "POST /api/calc/takeoff": json(takeoffInputSchema, () => "/api/calc/takeoff", gableInput),
  "POST /api/calc/echo": { kind: "other", why: "benchmark route: returns any JSON body as received, stores nothing" },
  "POST /api/calc/gap-study": json(gapStudyInputSchema, () => "/api/calc/gap-study", () => ({ ...gableInput(), planeIds: [gableRoof(40, 30, 6)[0]!.id] })),

  "POST /api/customers": json(customerInputSchema, () => "/api/customers", customerSample),
  "PATCH /api/customers/:id": json(customerUpdateSchema, (w) => `/api/customers/${w.customerId}`, customerSample),
  "POST /api/customers/:id/archive": none(),
  "POST /api/customers/:id/restore": none(),

  "POST /api/jobs/:jobId/quotes": optional(quoteCreateSchema, (w) => `/api/jobs/${w.jobId}/quotes`, () => ({ options: TWO_OPTIONS, notes: "Two options" })),
  "POST /api/jobs/:jobId/attachments": multipart("multipart upload (attachments tests)"),
  "POST /api/jobs/:jobId/roof/import": multipart("multipart CSV upload (roof import tests)"),
  "POST /api/jobs": json(jobInputSchema, () => "/api/jobs", (w) => ({
    customer: customerSample(),
    siteAddressLine1: "3 Quarry Row",
    siteAddressLine2: "Rear",
    siteCity: "Harlow Bend",
    siteRegion: "OR",
    sitePostalCode: "97000",
    site: { atticType: "vented", climateZone: "5A", iceDamRisk: true, existingLayers: 1, wind: { exposure: "C" } },
    notes: "Ladder on the north side",
    estimatorId: w.estimator.user.id,
  })),
  "PATCH /api/jobs/:id": json(jobUpdateSchema, (w) => `/api/jobs/${w.jobId}`, (w) => ({
    customerId: w.customerId,
    siteAddressLine1: "3 Quarry Row",
    siteCity: "Harlow Bend",
    site: { atticType: "cathedral", codeEdition: 2021, tearOff: true },
    notes: "Ladder on the north side",
    status: "lost",
  })),
  "POST /api/jobs/:id/archive": none(),
  "POST /api/jobs/:id/restore": none(),
  "PUT /api/jobs/:id/assignment": json(jobAssignmentSchema, (w) => `/api/jobs/${w.jobId}/assignment`, (w) => ({ estimatorId: w.estimator.user.id, crewIds: [w.crewId] })),
  "PUT /api/jobs/:id/roof": json(roofSaveSchema, (w) => `/api/jobs/${w.jobId}/roof`, () => ({
    ...roofBody(1),
    underlay: { src: "/api/attachments/1/file", originFt: [0, 0], widthFt: 50, rotationDeg: 0, opacity: 0.5, visible: true, page: 1 },
  })),

  "POST /api/price-book/items": json(catalogItemInputSchema, () => "/api/price-book/items", () => ({
    sku: "T-NEW-1",
    category: "trim",
    name: "Rake trim",
    purchaseUnit: "pc",
    packCoverage: 10,
    coverageUnit: "lf",
    unitCostCents: 1900,
    wastePct: 5,
    materialKey: null,
    attributes: { stockLengthFt: 10, endLapIn: 3, colour: "Charcoal" },
  })),
  "PATCH /api/price-book/items/:id": json(catalogItemUpdateSchema, (w) => `/api/price-book/items/${w.itemId}`, async (w) => ({
    name: "Eave trim, renamed",
    unitCostCents: 2000,
    wastePct: 3,
    version: await itemVersion(w),
  })),
  "POST /api/price-book/items/:id/archive": none(),
  "POST /api/price-book/items/:id/restore": none(),
  "PUT /api/price-book/labor": json(laborRatesInputSchema, () => "/api/price-book/labor", () => ({
    rates: [
      { kind: "pitch_band", label: "Walkable", minPitch: 0, maxPitch: 8, centsPerUnit: 21000, unit: "square" },
      { kind: "tear_off_per_layer", label: "Tear-off", minPitch: null, maxPitch: null, centsPerUnit: 5000, unit: "square" },
    ],
  })),
  "PUT /api/price-book/settings": json(pricingSettingsSchema, () => "/api/price-book/settings", () => DEFAULT_PRICING_SETTINGS),
  "POST /api/price-book/import": multipart("multipart CSV upload (price-book CSV tests)"),

  "PUT /api/company": json(companyProfileSchema, () => "/api/company", () => ({
    name: "Harlow Bend Metal Roofs",
    legalName: "Harlow Bend Metal Roofs LLC",
    licenceNumber: "CCB 000000",
    addressLine1: "1 Mill Street",
    addressLine2: "Suite 2",
    city: "Harlow Bend",
    region: "OR",
    postalCode: "97000",
    phone: "555-0101",
    email: "office@example.com",
    website: "https://example.com",
    proposalTerms: "Balance due on completion.",
    exclusions: "Gutters.",
    warranty: "Ten years on workmanship.",
    proposalPrefix: "HB-",
    nextProposalNumber: 100,
  })),
  "PUT /api/company/logo": multipart("multipart image upload (company tests)"),
  "DELETE /api/company/logo": none(),

  "PATCH /api/quotes/:id": json(quotePatchSchema, (w) => `/api/quotes/${w.draftQuoteId}`, async (w) => ({
    version: await quoteVersion(w, w.draftQuoteId),
    notes: "Check the valley flashing",
    options: [{ label: "As designed", spec: { spacer: "battens", foil: true } }],
    manualLines: [{ optionId: null, description: "Skylight reflash", quantity: 2, unitPriceCents: 15000, unitCostCents: 9000, taxable: true }],
    overrides: [{ optionId: null, key: "tearoff", unitCostCents: 100, reason: "Supplier quote" }],
    discount: { amountCents: 5000, reason: "Neighbour referral" },
  })),
  "POST /api/quotes/:id/recalculate": json(quoteRecalculateSchema, (w) => `/api/quotes/${w.draftQuoteId}/recalculate`, async (w) => ({
    version: await quoteVersion(w, w.draftQuoteId),
  })),
  "POST /api/quotes/:id/submit": json(quoteSubmitSchema, (w) => `/api/quotes/${w.draftQuoteId}/submit`, async (w) => ({
    version: await quoteVersion(w, w.draftQuoteId),
    notes: "Ready",
  })),
  "POST /api/quotes/:id/approve": optional(quoteApproveSchema, (w) => `/api/quotes/${w.reviewQuoteId}/approve`, () => ({ reason: "Repeat customer" })),
  "POST /api/quotes/:id/return": json(quoteReturnSchema, (w) => `/api/quotes/${w.reviewQuoteId}/return`, () => ({ comment: "Add the snow guards" })),
  "POST /api/quotes/:id/revise": none(),
  "POST /api/quotes/:id/archive": none(),
  "POST /api/quotes/:id/restore": none(),
  "POST /api/quotes/:id/send": optional(proposalSendSchema, (w) => `/api/quotes/${w.sentQuoteId}/send`, () => ({
    to: "homeowner@example.com",
    copyToMe: true,
    message: "Here is the proposal",
  })),

  "PATCH /api/attachments/:id": json(attachmentUpdateSchema, (w) => `/api/attachments/${w.photoId}`, () => ({
    caption: "North slope",
    showInProposal: true,
    forCrew: false,
    kind: "photo",
  })),
  "DELETE /api/attachments/:id": none(),
};

const WRITE = new Set(["POST", "PUT", "PATCH", "DELETE"]);
const jsonSpecs = () => Object.entries(SPECS).filter((e): e is [string, JsonSpec] => e[1].kind === "json" || e[1].kind === "optional");
const methodOf = (key: string) => key.split(" ")[0]!.toLowerCase() as "post" | "put" | "patch" | "delete";

/** A request as the spec's actor: the owner's session with its CSRF token, an anonymous session with its token, or the homeowner (no session). */
function open(spec: JsonSpec, method: "post" | "put" | "patch" | "delete", path: string) {
  const as = spec.as ?? "owner";
  const t =
    as === "homeowner"
      ? request(w.app)[method](path)
      : (as === "anon" ? w.anon.agent : w.owner.agent)[method](path).set("X-CSRF-Token", as === "anon" ? w.anon.token : w.owner.token);
  return t.set("X-Forwarded-For", nextIp());
}

const sendJson = (spec: JsonSpec, key: string, path: string, body: unknown) =>
  open(spec, methodOf(key), path).set("Content-Type", "application/json").send(JSON.stringify(body));

/** Runs `fn` and fails with the tables it changed. */
async function expectNoChange(what: string, fn: () => Promise<void>) {
  const before = await databaseChecksums();
  await fn();
  const after = await databaseChecksums();
  expect(changedTables(before, after), `${what}: tables changed`).toEqual([]);
}

/** The error shape: `{ error: { code, message, fields? } }` and nothing else at the top. */
function expectErrorShape(body: unknown, status: number, what: string) {
  const b = body as { error?: { code?: unknown; message?: unknown; fields?: unknown } };
  expect(typeof b?.error?.code, `${what} (${status}): ${JSON.stringify(body)}`).toBe("string");
  expect(typeof b?.error?.message, what).toBe("string");
  if (b.error!.fields !== undefined) expect(typeof b.error!.fields, what).toBe("object");
}

// ---------------------------------------------------------------------------------------------------

let routes: string[] = [];

beforeAll(async () => {
  await truncateAll();
  routes = listRoutes(createTestApp())
    .filter((r) => WRITE.has(r.method))
    .map((r) => `${r.method} ${r.path}`);
  w = await buildWorld();
}, 120_000);

afterAll(() => stopTestStores());

describe("the write routes", () => {
  it("are listed from the router, and each one is described here (add a row for a new route)", () => {
    expect(routes.length).toBeGreaterThan(40);
    expect(routes.filter((k) => !(k in SPECS))).toEqual([]);
    expect(Object.keys(SPECS).filter((k) => !routes.includes(k))).toEqual([]);
  });

  it("bound every string, list and map in their body schemas (a field's own maximum, not only the body limit)", () => {
    const unbounded = jsonSpecs().flatMap(([key, spec]) => unboundedNodes(spec.schema).map((n) => `${key}: ${n}`));
    expect(unbounded).toEqual([]);
  });
});

describe("generated invalid bodies: 400 with the field paths, nothing changed", () => {
  it.each(jsonSpecs().map(([k]) => k))("%s", async (key) => {
    const spec = SPECS[key] as JsonSpec;
    const sample = await spec.sample(w);
    expect(spec.schema.safeParse(sample).success, `${key}: the sample itself must be valid`).toBe(true);
    const bodies = invalidBodies(key, spec.schema, sample);
    expect(bodies.length, `${key}: generated bodies`).toBeGreaterThanOrEqual(15);
    const path = spec.path(w);
    const wrong: string[] = [];
    await expectNoChange(key, async () => {
      for (const b of bodies) {
        const res = await sendJson(spec, key, path, b.body);
        const fields = (res.body?.error?.fields ?? {}) as Record<string, string>;
        const keys = Object.keys(fields);
        const named = keys.some((k) => k in b.expected || relatedKey(k, b.path));
        if (res.status !== 400 || res.body?.error?.code !== "bad_request" || keys.length === 0 || !named) {
          wrong.push(`${b.label}: ${res.status} ${JSON.stringify(res.body).slice(0, 300)} (expected fields ${JSON.stringify(Object.keys(b.expected))})`);
        }
      }
    });
    expect(wrong).toEqual([]);
  }, 30_000);
});

describe("strings over each field's maximum", () => {
  it("answer 400 naming that field, on every JSON route, and change nothing", async () => {
    const wrong: string[] = [];
    let sent = 0;
    await expectNoChange("long strings", async () => {
      for (const [key, spec] of jsonSpecs()) {
        const sample = await spec.sample(w);
        for (const n of nodes(sample)) {
          if (typeof n.value !== "string") continue;
          const max = maxLengthAt(spec.schema, n.path);
          if (max === undefined) continue;
          const body = setAt(sample, n.path, "ü".repeat(max + 1));
          const res = await sendJson(spec, key, spec.path(w), body);
          sent++;
          const fields = res.body?.error?.fields ?? {};
          if (res.status !== 400 || !(pathKey(n.path) in fields)) wrong.push(`${key} ${pathKey(n.path)} (max ${max}): ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`);
        }
      }
    });
    expect(wrong).toEqual([]);
    expect(sent).toBeGreaterThan(60);
  }, 30_000);
});

describe("bodies the JSON parser refuses", () => {
  it("broken JSON is 400 bad_json on every JSON route, and changes nothing", async () => {
    const wrong: string[] = [];
    await expectNoChange("broken JSON", async () => {
      for (const [key, spec] of jsonSpecs()) {
        for (const raw of ['{"name": ', "{'single': 'quotes'}", "[1, 2,]", "null", '"just a string"', "\u0000"]) {
          const res = await open(spec, methodOf(key), spec.path(w)).set("Content-Type", "application/json").send(raw);
          if (res.status !== 400 || res.body?.error?.code !== "bad_json") wrong.push(`${key} ${JSON.stringify(raw)}: ${res.status} ${JSON.stringify(res.body)}`);
        }
      }
    });
    expect(wrong).toEqual([]);
  });

  it("another content type (text, form, XML) is 415, multipart 400, with a message naming JSON, on every JSON route, and changes nothing", async () => {
    const wrong: string[] = [];
    await expectNoChange("content types", async () => {
      for (const [key, spec] of jsonSpecs()) {
        const sample = JSON.stringify(await spec.sample(w));
        const forms: Array<[string | null, string]> = [
          ["text/plain", sample],
          ["application/x-www-form-urlencoded", "name=x&version=1&consent=true"],
          ["application/xml", "<job><notes>x</notes></job>"],
          ["text/xml", "<?xml version=\"1.0\"?><a/>"],
          ["multipart/form-data; boundary=zz", "--zz\r\nContent-Disposition: form-data; name=\"notes\"\r\n\r\nx\r\n--zz--\r\n"],
        ];
        for (const [type, body] of forms) {
          const res = await open(spec, methodOf(key), spec.path(w)).set("Content-Type", type!).send(body);
          // Multipart is read on the upload routes only: on a JSON route it is a body no parser read (400).
          const okStatus = res.status === (type!.startsWith("multipart/") ? 400 : 415);
          if (!okStatus || !/application\/json/i.test(res.body?.error?.message ?? "")) wrong.push(`${key} ${type}: ${res.status} ${JSON.stringify(res.body)}`);
          else expectErrorShape(res.body, res.status, `${key} ${type}`);
        }
      }
    });
    expect(wrong).toEqual([]);
  });

  it("a body over the limit is 413 too_large with the error shape (session routes 1 MB, the homeowner's routes 100 kB, the webhook 1 MB)", async () => {
    const terms = "x".repeat(1_100_000);
    await expectNoChange("413", async () => {
      const big = await w.owner.agent.put("/api/company").set("X-CSRF-Token", w.owner.token).send({ name: "Big", proposalTerms: terms });
      expect(big.status).toBe(413);
      expect(big.body.error).toMatchObject({ code: "too_large", message: expect.any(String) });
      const pub = await request(w.app)
        .post(`/api/proposals/${w.token}/accept`)
        .set("X-Forwarded-For", nextIp())
        .send({ optionId: 1, signerName: "y".repeat(150_000), consent: true });
      expect(pub.status).toBe(413);
      expect(pub.body.error.code).toBe("too_large");
      const hook = await request(w.app).post("/api/payments/webhook").set("Content-Type", "application/json").send(JSON.stringify({ pad: terms }));
      expect(hook.status).toBe(413);
      expect(hook.body.error.code).toBe("too_large");
    });
  });

  it("the payment webhook refuses junk (no signature, garbage, other content types) with 400 and changes nothing", async () => {
    await expectNoChange("webhook junk", async () => {
      for (const [type, body] of [
        ["application/json", JSON.stringify(deepGarbage())],
        ["application/json", "{not json"],
        ["text/plain", "hello"],
      ] as const) {
        const res = await request(w.app).post("/api/payments/webhook").set("Content-Type", type).set("Stripe-Signature", "t=1,v1=00").send(body);
        expect([400, 415], `${type}: ${res.status} ${JSON.stringify(res.body)}`).toContain(res.status);
        expectErrorShape(res.body, res.status, `webhook ${type}`);
      }
    });
  });
});

describe("numbers the schema lets through never crash the roof engine", () => {
  const takeoff = (body: unknown) =>
    w.owner.agent.post("/api/calc/takeoff").set("X-CSRF-Token", w.owner.token).set("Content-Type", "application/json").send(JSON.stringify(body));

  it("a plane, a panel or a batten spacing that would make millions of pieces is 400 at its field (it used to end the process)", async () => {
    const cases: Array<[string, (b: ReturnType<typeof gableInput>) => void]> = [
      ["planes.0.outline.1.0", (b) => (b.planes[0]!.outline[1]![0] = 4e8)],
      ["stacks.0.spacer.battens.spacingIn", (b) => Object.assign(b.stacks[0]!, { spacer: { kind: "battens", battens: { spacingIn: 1e-9 } } })],
      ["stacks.0.panel.coverageWidthIn", (b) => Object.assign(b.stacks[0]!, { panel: { coverageWidthIn: 1e-9 } })],
      ["rules.trim.endLapIn", (b) => Object.assign(b.rules, { trim: { stockLengthFt: 1, endLapIn: 24 } })],
      ["rules.battens.stockLengthFt", (b) => Object.assign(b.rules, { battens: { stockLengthFt: 1e-9 } })],
    ];
    for (const [field, change] of cases) {
      const body = gableInput();
      change(body);
      const res = await takeoff(body);
      expect(res.status, `${field}: ${JSON.stringify(res.body).slice(0, 300)}`).toBe(400);
      expect(Object.keys(res.body.error.fields)).toContain(field);
    }
    // At the bounds: a 2000 ft square plane with 6 in panels and battens is computed.
    const edge = gableInput();
    edge.planes = [{ ...edge.planes[0]!, outline: [[-1000, -1000], [1000, -1000], [1000, 1000], [-1000, 1000]], eaveEdge: 0 }];
    Object.assign(edge.stacks[0]!, { spacer: { kind: "battens", battens: { spacingIn: 6 } }, panel: { coverageWidthIn: 6 } });
    const ok = await takeoff(edge);
    expect(ok.status, JSON.stringify(ok.body).slice(0, 300)).toBe(200);
    expect(ok.body.data.totals.panelCount).toBe(4000);
  });

  it("property: any number at any numeric field answers 200 with finite totals or 400, never 500", async () => {
    const sample = gableInput();
    const numeric = nodes(sample).filter((n) => typeof n.value === "number");
    const extreme = fc.oneof(
      fc.constantFrom(0, -0, 1e-9, -1e-9, 1e9, -1e9, 1e300, -1e300, 5e-324, 0.5, 24, 25, 2 ** 53),
      fc.double({ min: -1e6, max: 1e6, noNaN: true }),
    );
    const runs = fc.sample(fc.tuple(fc.constantFrom(...numeric), extreme, fc.constantFrom(...numeric), extreme), { seed: 8, numRuns: 40 });
    const wrong: string[] = [];
    for (const [a, va, b, vb] of runs) {
      const body = setAt(setAt(sample, a.path, va), b.path, vb);
      const res = await takeoff(body);
      const finite = res.status !== 200 || Number.isFinite(res.body.data.totals.squares);
      if (![200, 400].includes(res.status) || !finite) wrong.push(`${pathKey(a.path)}=${va}, ${pathKey(b.path)}=${vb}: ${res.status} ${JSON.stringify(res.body).slice(0, 200)}`);
    }
    expect(wrong).toEqual([]);
  }, 30_000);
});

describe("routes without a body", () => {
  const MARKER = "JUNK-7f3a9c";
  /** Junk a careless handler might copy into a record. */
  const junk = (otherCompanyId: number) => ({
    name: MARKER,
    notes: MARKER,
    caption: MARKER,
    reason: MARKER,
    status: "won",
    role: "owner",
    companyId: otherCompanyId,
    archivedAt: null,
    version: 999,
    nested: deepGarbage(10),
  });

  it("ignore junk in the body: the action happens as documented, no junk is stored", async () => {
    const other = await buildCompany();
    const body = junk(other.id);
    const o = w.owner;
    const send = (method: "post" | "delete", path: string, agent = o) =>
      agent.agent[method](path).set("X-CSRF-Token", agent.token).set("X-Forwarded-For", nextIp()).send(body);
    const results: Array<[string, number]> = [];
    const customer = await buildCustomer({ companyId: w.companyId });
    const job = await buildJob({ companyId: w.companyId });
    const item = await buildCatalogItem(w.companyId);
    const quote = (await createQuote(w.estimator, w.jobId, {})).body.data.id as number;
    for (const base of [`/api/customers/${customer.id}`, `/api/jobs/${job.id}`, `/api/price-book/items/${item.id}`, `/api/quotes/${quote}`]) {
      const a = await send("post", `${base}/archive`);
      results.push([`${base}/archive`, a.status]);
      const r = await send("post", `${base}/restore`);
      results.push([`${base}/restore`, r.status]);
    }
    const revise = await send("post", `/api/quotes/${quote}/revise`); // a draft cannot be revised: 409, not 400 or 500
    results.push(["revise a draft", revise.status]);
    const delLogo = await send("delete", "/api/company/logo");
    results.push(["DELETE logo", delLogo.status]);
    const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: { r: 1, g: 2, b: 3 } } }).png().toBuffer();
    const up = await o.agent.post(`/api/jobs/${w.jobId}/attachments`).set("X-CSRF-Token", o.token).attach("file", png, "x.png");
    const delPhoto = await send("delete", `/api/attachments/${up.body.data[0].id}`);
    results.push(["DELETE attachment", delPhoto.status]);
    const deposit = await request(w.app).post(`/api/proposals/${w.token}/deposit`).set("X-Forwarded-For", nextIp()).send(body);
    results.push(["deposit before acceptance", deposit.status]);
    const second = await signedInAgent({ role: "estimator", companyId: w.companyId }, w.app);
    const logout = await send("post", "/api/auth/logout", second);
    results.push(["logout", logout.status]);

    expect(results.filter(([, s]) => s >= 500 || s === 400)).toEqual([]);
    expect(results.filter(([k]) => /archive|restore|DELETE|logout/.test(k)).every(([, s]) => s >= 200 && s < 300)).toBe(true);
    expect(revise.status).toBe(409);
    expect(deposit.status).toBe(409); // not accepted yet
    expect(await findText(MARKER)).toEqual([]);
    expect((await request(w.app).get(`/api/customers/${customer.id}`).set("Cookie", [])).status).toBe(401);
    const c = await o.agent.get(`/api/customers/${customer.id}`);
    expect(c.body.data).toMatchObject({ id: customer.id, archivedAt: null, name: customer.name });
  }, 30_000);
});

// ---------------------------------------------------------------------------------------------------
// Hostile text: stored and returned exactly, printed literally

const TEXTS = Object.entries(HOSTILE_TEXTS);
/** The first text that fits within `max` (the field's limit), cycling from `i`. */
const textFor = (i: number, max: number) => {
  for (let k = 0; k < TEXTS.length; k++) {
    const [, t] = TEXTS[(i + k) % TEXTS.length]!;
    if (t.length <= max) return t;
  }
  return TEXTS[0]![1].slice(0, max);
};

describe("hostile text in every free-text field", () => {
  it.each(TEXTS)("%s: customers, jobs, quotes, the company profile and price-book names store and return it exactly", async (_name, text) => {
    const o = w.owner;
    const put = (m: "post" | "put" | "patch", path: string, body: unknown) => o.agent[m](path).set("X-CSRF-Token", o.token).send(body as object);
    const fit = (max: number) => (text.length <= max ? text : null);

    const cust = { name: text, phone: fit(40), addressLine1: text, addressLine2: text, city: fit(80), region: fit(80), postalCode: fit(20), notes: text };
    const c = await put("post", "/api/customers", cust);
    expect(c.status, JSON.stringify(c.body)).toBe(201);
    const cBack = (await o.agent.get(`/api/customers/${c.body.data.id}`)).body.data;
    for (const [k, v] of Object.entries(cust)) expect(cBack[k], `customer.${k}`).toBe(v);

    const jobBody = { customerId: c.body.data.id, siteAddressLine1: text, siteAddressLine2: text, siteCity: fit(80), siteRegion: fit(80), sitePostalCode: fit(20), notes: text };
    const j = await put("post", "/api/jobs", jobBody);
    expect(j.status, JSON.stringify(j.body)).toBe(201);
    const jBack = await o.agent.get(`/api/jobs/${j.body.data.id}`);
    expect(jBack.headers["content-type"]).toMatch(/^application\/json/);
    for (const [k, v] of Object.entries(jobBody)) expect(jBack.body.data[k], `job.${k}`).toBe(v);

    const label = fit(80) ?? "Option";
    const q = await createQuote(w.estimator, w.jobId, { options: [{ label, spec: {} }], notes: text });
    expect(q.status, JSON.stringify(q.body)).toBe(201);
    const qp = await put("patch", `/api/quotes/${q.body.data.id}`, {
      version: q.body.data.revision.version,
      manualLines: [{ description: text, quantity: 1, unitPriceCents: 1000 }],
      overrides: [{ key: "tearoff", quantity: 2, reason: text }],
      discount: { amountCents: 100, reason: text },
    });
    expect(qp.status, JSON.stringify(qp.body)).toBe(200);
    const rev = (await o.agent.get(`/api/quotes/${q.body.data.id}`)).body.data.revision;
    expect(rev.notes).toBe(text);
    expect(rev.options[0].label).toBe(label);
    expect(rev.manualLines[0].description).toBe(text);
    expect(rev.overrides[0].reason).toBe(text);
    expect(rev.discount.reason).toBe(text);
    expect(rev.options[0].lines.some((l: { description: string }) => l.description === text)).toBe(true);

    const prof = { name: text, legalName: text, addressLine1: text, city: fit(80), proposalTerms: text, exclusions: text, warranty: text };
    const p = await put("put", "/api/company", prof);
    expect(p.status, JSON.stringify(p.body)).toBe(200);
    const pBack = (await o.agent.get("/api/company")).body.data;
    for (const [k, v] of Object.entries(prof)) expect(pBack[k], `company.${k}`).toBe(v);

    const item = await put("post", "/api/price-book/items", { sku: `H-${_name}`, category: "trim", name: text, purchaseUnit: "pc", packCoverage: 10, coverageUnit: "lf", unitCostCents: 100, attributes: { colour: fit(60) ?? "x" } });
    expect(item.status, JSON.stringify(item.body)).toBe(201);
    const iBack = (await o.agent.get(`/api/price-book/items/${item.body.data.id}`)).body.data;
    expect(iBack.name).toBe(text);
    expect(iBack.attributes.colour).toBe(fit(60) ?? "x");
  });

  it("a value of exactly each field's maximum, in two-byte characters, is stored whole", async () => {
    const o = w.owner;
    const long = (max: number) => "é".repeat(max);
    const c = await o.agent.post("/api/customers").set("X-CSRF-Token", o.token).send({ name: long(120), addressLine1: long(160), city: long(80), postalCode: long(20), phone: long(40), notes: long(5000) });
    expect(c.status, JSON.stringify(c.body).slice(0, 300)).toBe(201);
    expect(c.body.data.notes).toBe(long(5000));
    const p = await o.agent.put("/api/company").set("X-CSRF-Token", o.token).send({ name: long(160), legalName: long(200), proposalTerms: "😀".repeat(10_000), exclusions: long(20_000), warranty: "屋".repeat(20_000) });
    expect(p.status, JSON.stringify(p.body).slice(0, 300)).toBe(200);
    const back = (await o.agent.get("/api/company")).body.data;
    expect(back.proposalTerms).toBe("😀".repeat(10_000));
    expect(back.warranty).toBe("屋".repeat(20_000));
    expect(back.legalName).toBe(long(200));
  });

  it("the proposal PDF prints the text literally where the font has the characters, and renders (no crash) where it has not", async () => {
    const o = w.owner;
    const fonts = loadInterFonts();
    for (const [i, [name, text]] of TEXTS.entries()) {
      const other = TEXTS[(i + 1) % TEXTS.length]![1];
      const p = await o.agent.put("/api/company").set("X-CSRF-Token", o.token).send({ name: textFor(i, 160), proposalTerms: text, exclusions: other, warranty: text });
      expect(p.status).toBe(200);
      const customer = await buildCustomer({ companyId: w.companyId, name: textFor(i, 120) });
      const job = await buildJob({ companyId: w.companyId, customerId: customer.id, status: "estimating", siteAddressLine1: textFor(i, 160) });
      await saveRoofFor(job, roofBody(0));
      const q = await createQuote(w.estimator, job.id, { options: [{ label: textFor(i, 80), spec: {} }] });
      expect(q.status, JSON.stringify(q.body)).toBe(201);
      const pdf = await o.agent.get(`/api/quotes/${q.body.data.id}/pdf`).buffer(true).parse(binary);
      expect(pdf.status, `${name}: PDF`).toBe(200);
      const bytes = pdf.body as Buffer;
      expect(bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-");
      const pageText = squash((await pdfText(bytes)).normalize("NFC"));
      if (coverage(fonts, text).missing.length === 0) {
        expect(pageText, `${name} in the terms`).toContain(squash(text.normalize("NFC")));
      }
      // The SQL and HTML texts are plain text in the PDF: never markup, never a dropped character.
      if (name === "html") expect(pageText).toContain("<script>alert(1)</script>");
    }
  }, 60_000);
});
