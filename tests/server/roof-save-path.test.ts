/**
 * The roof save's fast path: validation once (roofSaveSchema's cross-checks on its own parsed values), the
 * takeoff from the parsed document, the binary-protocol statements (server/db/sql.ts) and the answer put
 * together from the serialised parts. Each check compares with the straightforward way it replaced.
 */
import fc from "fast-check";
import { beforeEach, describe, expect, it } from "vitest";
import { DatabaseError, UniqueConstraintError } from "sequelize";
import { z } from "zod";
import { computeTakeoff } from "../../shared/engine/takeoff";
import { hipRoof } from "../../shared/engine/roof/generators";
import { jobSiteSchema } from "../../shared/schemas/job";
import { roofDocumentShape, roofSaveSchema, underlaySchema, type RoofSaveValues } from "../../shared/schemas/roof";
import { takeoffInputSchema } from "../../shared/schemas/takeoff";
import { executeBinary, sqlDateTime, type WriteResult } from "../../server/db/sql";
import { seedDemoPriceBook } from "../../server/db/seeders/demo-price-book";
import { HttpError } from "../../server/errors";
import { toHttpError, zodFields } from "../../server/middleware/error-handler";
import { AuditEvent, Job, Roof } from "../../server/models/index";
import { parseJsonColumn } from "../../server/presenters/job.presenter";
import { presentRoofDocument } from "../../server/presenters/roof.presenter";
import { rulesForCompany } from "../../server/services/price-book-rules";
import { computeStoredTakeoff, computeStoredTakeoffOfParsed } from "../../server/services/roof-takeoff";
import { signedInAgent } from "../helpers/auth";
import { countRows, testSequelize, truncateAll } from "../helpers/db";
import { buildJob, roofBody } from "../helpers/job-factories";
import type { RoofDocument } from "../../shared/schemas/roof";

beforeEach(truncateAll);

const underlay = { src: "/api/files/plan-3", originFt: [-4, -2] as [number, number], widthFt: 70, rotationDeg: 5, opacity: 0.5, visible: true };

/**
 * roofSaveSchema as it was defined before its cross-checks ran on its own parsed values: the refinement
 * parsed planes, stacks and default assembly again with the takeoff input schema and copied its issues.
 */
const reparsingRoofSaveSchema = z
  .object({
    ...roofDocumentShape,
    version: z.number({ error: "Required" }).int("Must be a whole number").min(0, "Must be 0 or more"),
    underlay: underlaySchema.nullable().optional(),
  })
  .superRefine((v, ctx) => {
    const checked = takeoffInputSchema.safeParse({ planes: v.planes, stacks: v.stacks, defaultStackId: v.defaultStackId });
    if (checked.success) return;
    for (const issue of checked.error.issues) {
      ctx.addIssue({ code: "custom", message: issue.message, path: issue.path as (string | number)[] });
    }
  });

/** Every distinct (path, message) of a failed parse, sorted. */
function issueSet(error: z.ZodError): string[] {
  return [...new Set(error.issues.map((i) => `${i.path.map(String).join(".")} :: ${i.message}`))].sort();
}

type Mutation = (b: Record<string, unknown> & { planes: Record<string, unknown>[]; stacks: Record<string, unknown>[] }) => void;

/** Plane or stack i of the body (a throwaway object when an earlier mutation removed it). */
const P = (b: Parameters<Mutation>[0], i: number) => b.planes[i] ?? {};
const S = (b: Parameters<Mutation>[0], i: number) => b.stacks[i] ?? {};

/** Ways a body goes wrong, field by field and across fields (each applied to a fresh copy). */
const MUTATIONS: Mutation[] = [
  (b) => (P(b, 0).pitch = 30),
  (b) => (P(b, 0).pitch = -1),
  (b) => (P(b, 1).pitch = "6"),
  (b) => (P(b, 0).outline = [[0, 0], [1, 1]]),
  (b) => (P(b, 1).outline = [[0, 0], [10, 10], [10, 0], [0, 10]]),
  (b) => (P(b, 1).outline = [[0, 0], [5, 0], [10, 0]]),
  (b) => (P(b, 0).outline = [[0, 0], [2000, 0], [2000, 10]]),
  (b) => (P(b, 0).outline = "square"),
  (b) => (P(b, 0).eaveEdge = 9),
  (b) => (P(b, 1).eaveEdge = -1),
  (b) => (P(b, 1).eaveEdge = 1.5),
  (b) => (P(b, 0).stackId = "nope"),
  (b) => (P(b, 1).stackId = ""),
  (b) => (P(b, 1).id = P(b, 0).id),
  (b) => (P(b, 0).id = ""),
  (b) => (P(b, 0).edgeTypes = { "7": "ridge" }),
  (b) => (P(b, 0).edgeTypes = { x: "eave" }),
  (b) => (P(b, 1).edgeTypes = { "0": "bogus" }),
  (b) => (P(b, 0).penetrations = [{ kind: "pipe", count: 0 }]),
  (b) => (P(b, 0).name = "n".repeat(200)),
  (b) => b.planes.push({ ...P(b, 0), id: "extra", eaveEdge: 5 }),
  (b) => (S(b, 1).id = S(b, 0).id),
  (b) => (S(b, 0).panel = { coverageWidthIn: 2 }),
  (b) => (b.stacks = []),
  (b) => (b.planes = []),
  (b) => (b.defaultStackId = "zz"),
  (b) => (b.defaultStackId = ""),
  (b) => (b.version = -1),
  (b) => (b.version = 1.5),
  (b) => delete b.version,
  (b) => (b.underlay = { src: "https://elsewhere.example.com/x.png", widthFt: 0 }),
  (b) => (b.underlay = null),
  (b) => (b.underlay = underlay),
];

describe("roofSaveSchema runs the cross-checks on its own parsed values", () => {
  it("gives the same issues (paths and messages) and the same values as parsing the planes and stacks again", () => {
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 0, max: MUTATIONS.length - 1 }), { maxLength: 5 }), (picks) => {
        const body = structuredClone(roofBody(0, { underlay })) as unknown as Parameters<Mutation>[0];
        for (const i of picks) MUTATIONS[i](body);
        const now = roofSaveSchema.safeParse(body);
        const before = reparsingRoofSaveSchema.safeParse(body);
        expect(now.success).toBe(before.success);
        if (now.success && before.success) {
          expect(now.data).toEqual(before.data);
        } else if (!now.success && !before.success) {
          // What the API and the forms show (first message per path), and every distinct issue.
          expect(zodFields(now.error)).toEqual(zodFields(before.error));
          expect(issueSet(now.error)).toEqual(issueSet(before.error));
        }
      }),
      { numRuns: 400 },
    );
  });
});

describe("computeStoredTakeoffOfParsed", () => {
  const site = jobSiteSchema.parse({ atticType: "vented", atticFloorAreaSqFt: 1500, climateZone: "6A", iceDamRisk: true });

  it("gives the engine's takeoff for the raw input, with the company's price-book rules", async () => {
    const job = await buildJob();
    await seedDemoPriceBook(testSequelize(), job.companyId);
    const rules = await rulesForCompany(job.companyId);
    expect(Object.keys(rules).length).toBeGreaterThan(0);
    for (const body of [roofBody(0), roofBody(0, { planes: hipRoof(44, 30, 6, { idPrefix: "h" }), underlay })]) {
      const raw = JSON.parse(JSON.stringify(body)) as RoofSaveValues;
      const { version: _v, underlay: _u, ...doc } = roofSaveSchema.parse(raw);
      const expected = computeTakeoff({ site, planes: raw.planes, stacks: raw.stacks, defaultStackId: raw.defaultStackId, rules });
      expect(expected.ok).toBe(true);
      if (!expected.ok) return;
      expect(computeStoredTakeoffOfParsed(doc, site, rules)).toEqual(expected.result);
      expect(await computeStoredTakeoff(doc, site, job.companyId)).toEqual(expected.result);
    }
  });

  it("refuses a bad site or bad rules with the engine's message and fields, as parsing everything does", () => {
    const { version: _v, underlay: _u, ...doc } = roofSaveSchema.parse(roofBody(0));
    const cases: Array<{ site: unknown; rules: Record<string, unknown> }> = [
      { site: { ...site, climateZone: "9Z" }, rules: {} },
      { site: { ...site, codeEdition: 1999, existingLayers: 20 }, rules: {} },
      { site, rules: { waste: { trimPct: 300 } } },
      { site, rules: { trim: { stockLengthFt: 1, endLapIn: 24 } } },
      { site: { ...site, atticType: "attic" }, rules: { fasteners: { screwsPerBox: 0 }, deck: { sheetSqFt: -1 } } },
    ];
    for (const c of cases) {
      const expected = computeTakeoff({ site: c.site, planes: doc.planes, stacks: doc.stacks, defaultStackId: doc.defaultStackId, rules: c.rules });
      expect(expected.ok).toBe(false);
      if (expected.ok) return;
      let thrown: unknown;
      try {
        computeStoredTakeoffOfParsed(doc, c.site, c.rules);
      } catch (err) {
        thrown = err;
      }
      expect(thrown).toBeInstanceOf(HttpError);
      const e = thrown as HttpError;
      expect(e.status).toBe(400);
      expect(e.message).toBe(expected.reason);
      expect(e.fields).toEqual(expected.fields);
    }
  });
});

describe("PUT /api/jobs/:id/roof answer and stored rows", () => {
  it("answers exactly the JSON of the presented stored roof and takeoff, and stores the parsed document", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    await seedDemoPriceBook(testSequelize(), user.companyId);
    const job = await buildJob({ companyId: user.companyId, status: "estimating" });
    const bodies = [
      roofBody(0, { underlay }), // first save: the row is created
      roofBody(1, { planes: hipRoof(50, 30, 8, { idPrefix: "hip" }) }), // keeps the stored underlay
      roofBody(2, { underlay: null }), // removes it
      roofBody(3, { underlay: { ...underlay, widthFt: 90 } }),
    ];
    for (const body of bodies) {
      const before = new Date(Date.now() - 1000);
      const res = await agent.put(`/api/jobs/${job.id}/roof`).set("X-CSRF-Token", token).send(body);
      expect(res.status).toBe(200);
      expect(res.headers["content-type"]).toBe("application/json; charset=utf-8");

      const stored = (await Roof.findOne({ where: { jobId: job.id } }))!;
      const doc = parseJsonColumn<RoofDocument>(stored.document);
      const takeoff = parseJsonColumn<Record<string, unknown>>(stored.takeoff);
      expect(res.text).toBe(JSON.stringify({ data: { ...presentRoofDocument(doc, stored.version), takeoff } }));
      expect(stored.version).toBe(body.version + 1);

      // The stored document is the parsed body, keys in the document's order, the underlay kept or replaced.
      const parsed = roofSaveSchema.parse(body);
      const keptUnderlay = body.underlay === undefined ? underlay : (body.underlay ?? undefined);
      expect(JSON.stringify(doc)).toBe(
        JSON.stringify({ planes: parsed.planes, stacks: parsed.stacks, defaultStackId: parsed.defaultStackId, ...(keptUnderlay ? { underlay: underlaySchema.parse(keptUnderlay) } : {}) }),
      );
      const row = (await Job.findByPk(job.id))!;
      expect(takeoff).toEqual(await computeStoredTakeoff(doc, parseJsonColumn(row.site), user.companyId));
      expect(Number(row.squares)).toBeCloseTo(Math.round((takeoff as { totals: { squares: number } }).totals.squares * 100) / 100, 2);
      expect(row.updatedAt.getTime()).toBeGreaterThanOrEqual(before.getTime());
      expect(stored.updatedAt.getTime()).toBeGreaterThanOrEqual(before.getTime());
    }
    const events = await AuditEvent.findAll({ where: { jobId: job.id }, order: [["id", "ASC"]] });
    expect(events.map((e) => e.action)).toEqual(["created", "saved", "saved", "saved"]);
    expect(events[3].changes).toMatchObject({ version: { from: 3, to: 4 }, stacks: 2, underlay: "set" });
    expect(events[3].actorId).toBe(user.id);
    expect(events[3].createdAt.getTime()).toBeGreaterThan(Date.now() - 60_000);
  });

  it("answers 404 for another company's job whatever the body, and writes nothing", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const foreign = await buildJob();
    for (const body of [roofBody(0), { version: "x" }]) {
      const res = await agent.put(`/api/jobs/${foreign.id}/roof`).set("X-CSRF-Token", token).send(body);
      expect(res.status).toBe(404);
    }
    expect(await countRows("roofs")).toBe(0);
    expect(await countRows("audit_events")).toBe(0);
  });
});

describe("executeBinary (server/db/sql.ts)", () => {
  it("answers a write with its affected rows and a SELECT with its rows, JSON parsed", async () => {
    const sequelize = testSequelize();
    const job = await buildJob({ status: "estimating" });
    await sequelize.transaction(async (t) => {
      const written = await executeBinary(sequelize, t, "UPDATE jobs SET notes = ?, updated_at = ? WHERE id = ?", ["binary ✓ 'quoted' \\ text", sqlDateTime(new Date()), job.id]);
      expect(written.affectedRows).toBe(1);
      const none = await executeBinary<WriteResult>(sequelize, t, "UPDATE jobs SET notes = ? WHERE id = ?", ["x", job.id + 1000]);
      expect(none.affectedRows).toBe(0);
      const rows = await executeBinary<Array<{ notes: string; site: unknown }>>(sequelize, t, "SELECT notes, site FROM jobs WHERE id = ?", [job.id]);
      expect(rows[0].notes).toBe("binary ✓ 'quoted' \\ text");
      expect(parseJsonColumn(rows[0].site)).toEqual(parseJsonColumn((await Job.findByPk(job.id, { transaction: t }))!.site));
    });
    expect((await Job.findByPk(job.id))!.notes).toBe("binary ✓ 'quoted' \\ text");
  });

  it("raises the Sequelize errors sequelize.query raises, and refuses a finished transaction", async () => {
    const sequelize = testSequelize();
    const job = await buildJob();
    await Roof.create({ jobId: job.id, companyId: job.companyId, version: 1, document: { planes: [], stacks: [], defaultStackId: "" }, takeoff: null });
    const insert = "INSERT INTO roofs (job_id, company_id, version, document, takeoff, created_at, updated_at) VALUES (?, ?, 1, '{}', NULL, NOW(), NOW())";
    await expect(sequelize.transaction((t) => executeBinary(sequelize, t, insert, [job.id, job.companyId]))).rejects.toBeInstanceOf(UniqueConstraintError);
    await expect(sequelize.transaction((t) => executeBinary(sequelize, t, "SELECT no_such_column FROM jobs", []))).rejects.toBeInstanceOf(DatabaseError);
    const t = await sequelize.transaction();
    await t.commit();
    await expect(executeBinary(sequelize, t, "SELECT 1", [])).rejects.toThrow(/commit has been called on this transaction/);
  });

  it("a lock wait that gives up becomes the 409 write_conflict of the error handler, and the waiting transaction is rolled back", async () => {
    const sequelize = testSequelize();
    const job = await buildJob();
    const holder = await sequelize.transaction();
    try {
      await executeBinary(sequelize, holder, "SELECT id FROM jobs WHERE id = ? FOR UPDATE", [job.id]);
      let caught: unknown;
      try {
        await sequelize.transaction(async (t) => {
          await executeBinary(sequelize, t, "SET STATEMENT innodb_lock_wait_timeout = 1 FOR UPDATE jobs SET notes = 'waiting' WHERE id = ?", [job.id]);
        });
      } catch (err) {
        caught = err;
      }
      expect(caught).toBeInstanceOf(DatabaseError);
      const http = toHttpError(caught);
      expect([http.status, http.code]).toEqual([409, "write_conflict"]);
    } finally {
      await holder.rollback();
    }
    expect((await Job.findByPk(job.id))!.notes).toBeNull();
  });
});
