import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createTestApp } from "../helpers/app";
import { countRows, testSequelize, truncateAll } from "../helpers/db";
import { buildJob } from "../helpers/job-factories";
import { signedInAgent } from "../helpers/auth";
import { createQuote, patch, post, quoteInReview, quoteWorld, type Agent } from "../helpers/quote-factories";
import { AuditEvent, Job, Quote, QuoteLine, QuoteRevision } from "../../server/models/index";
import type { QuoteStatus } from "../../shared/schemas/quote";

beforeEach(truncateAll);

type World = Awaited<ReturnType<typeof quoteWorld>>;

const THREE_OPTIONS = [
  { label: "Battens + foil", spec: { spacer: "battens", foil: true } },
  { label: "Mesh + foil", spec: { spacer: "mesh", foil: true } },
  { label: "No spacer", spec: { spacer: "none", foil: false } },
];

/** Sets a quote's current revision (and the quote) to a status the proposal flow would set. */
async function forceStatus(quoteId: number, status: QuoteStatus) {
  const q = (await Quote.findByPk(quoteId))!;
  await QuoteRevision.update({ status }, { where: { id: q.currentRevisionId! } });
  await q.update({ status });
}

async function approved(w: World, body: Record<string, unknown> = {}) {
  const q = await quoteInReview(w, body);
  const res = await post(w.owner, `/api/quotes/${q.id}/approve`, {});
  expect(res.status).toBe(200);
  return res.body.data;
}

describe("POST /api/jobs/:jobId/quotes", () => {
  it("creates revision 1 as a draft with one option 'As designed' by default, numbered from the company's proposal sequence (the demo price book sets prefix QSS- from 1001)", async () => {
    const w = await quoteWorld();
    const res = await createQuote(w.estimator, w.job.id);
    expect(res.status).toBe(201);
    const q = res.body.data;
    expect(q).toMatchObject({ id: expect.any(Number), number: "QSS-1001", jobId: w.job.id, status: "draft", archived: false });
    expect(q.revision).toMatchObject({
      revisionNo: 1,
      status: "draft",
      version: 1,
      roofVersion: 1,
      createdBy: { id: w.estimator.user.id, name: w.estimator.user.name },
      minMarginPct: 25,
      needsApprovalReason: false,
      manualLines: [],
      overrides: [],
      discount: null,
    });
    expect(q.revision.options).toHaveLength(1);
    const opt = q.revision.options[0];
    expect(opt).toMatchObject({ label: "As designed", spec: {}, belowMinMargin: false, hasOverrides: false, missingItems: [] });
    // Totals add up from the lines (the tax is on the taxable lines, once per option).
    const lines = opt.lines as Array<{ costCents: number; priceCents: number }>;
    expect(opt.totals.costCents).toBe(lines.reduce((s, l) => s + l.costCents, 0));
    expect(opt.totals.priceCents).toBe(lines.reduce((s, l) => s + l.priceCents, 0));
    expect(opt.totals.totalCents).toBe(opt.totals.priceCents + opt.totals.taxCents);
    // 14.39 squares: the 40 × 30 ft gable at 6/12 and the 12 × 8 ft porch at 2/12 (rafter-table slope factors).
    expect(opt.takeoffSummary.squares).toBeCloseTo(14.39, 2);
    expect(q.revisions).toEqual([{ id: q.revision.id, revisionNo: 1, status: "draft", totalCents: opt.totals.totalCents, createdAt: expect.any(String) }]);

    // The board's quote total follows, and the audit log of the job has the creation.
    expect(Number((await Job.findByPk(w.job.id))!.quoteTotalCents)).toBe(opt.totals.totalCents);
    const events = await AuditEvent.findAll({ where: { jobId: w.job.id, entityType: "quote" } });
    expect(events.map((e) => e.action)).toEqual(["created"]);
    expect(events[0].actorId).toBe(w.estimator.user.id);

    const second = await createQuote(w.owner, w.job.id);
    expect(second.body.data.number).toBe("QSS-1002");
  });

  it("takes up to five options, each with its own takeoff and totals", async () => {
    const w = await quoteWorld();
    const res = await createQuote(w.estimator, w.job.id, { options: THREE_OPTIONS, notes: "Homeowner wants to compare spacers." });
    expect(res.status).toBe(201);
    const opts = res.body.data.revision.options;
    expect(opts.map((o: { label: string }) => o.label)).toEqual(["Battens + foil", "Mesh + foil", "No spacer"]);
    const keys = (i: number) => opts[i].lines.map((l: { key: string }) => l.key);
    expect(keys(0)).toEqual(expect.arrayContaining(["batten-1x4", "radiant-barrier-foil"]));
    expect(keys(1)).toEqual(expect.arrayContaining(["spacer-mesh", "radiant-barrier-foil"]));
    expect(keys(1)).not.toContain("batten-1x4");
    expect(keys(2)).not.toContain("batten-1x4");
    expect(keys(2)).not.toContain("spacer-mesh");
    expect(keys(2)).not.toContain("radiant-barrier-foil");
    expect(new Set(opts.map((o: { totals: { totalCents: number } }) => o.totals.totalCents)).size).toBe(3);
    expect(res.body.data.revision.notes).toBe("Homeowner wants to compare spacers.");
  });

  it.each([
    [{ options: [] }, "options", "Add at least one option"],
    [{ options: Array.from({ length: 6 }, (_, i) => ({ label: `O${i}`, spec: {} })) }, "options", "At most 5 options"],
    [{ options: [{ label: "  ", spec: {} }] }, "options.0.label", "Required"],
    [{ options: [{ label: "A", spec: { spacer: "straw" } }] }, "options.0.spec.spacer", undefined],
    [{ options: [{ label: "A", spec: { colour: "red" } }] }, "options.0.spec", undefined],
    [{ options: [{ label: "A", spec: { stackId: "nope" } }] }, "options.0.spec.stackId", 'The roof has no assembly "nope"'],
    [{ notes: 5 }, "notes", undefined],
  ])("answers 400 with the field path for %j", async (body, field, message) => {
    const w = await quoteWorld();
    const res = await createQuote(w.estimator, w.job.id, body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("bad_request");
    expect(Object.keys(res.body.error.fields)).toContain(field);
    if (message) expect(res.body.error.fields[field]).toBe(message);
    expect(await countRows("quotes")).toBe(0);
  });

  it("answers 409 no_roof for a job without a saved roof and 409 archived for an archived job, writing nothing", async () => {
    const w = await quoteWorld();
    const bare = await buildJob({ companyId: w.company.id });
    const res = await createQuote(w.estimator, bare.id);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("no_roof");
    await w.job.update({ archivedAt: new Date() });
    expect((await createQuote(w.estimator, w.job.id)).body.error.code).toBe("archived");
    expect(await countRows("quotes")).toBe(0);
    expect(await countRows("quote_revisions")).toBe(0);
  });
});

describe("role matrix and company scope on every quote route", () => {
  const routes = (jobId: number, quoteId: number): Array<[string, string, unknown?]> => [
    ["get", `/api/jobs/${jobId}/quotes`],
    ["post", `/api/jobs/${jobId}/quotes`, { options: "bad" }],
    ["get", `/api/quotes/${quoteId}`],
    ["get", `/api/quotes/${quoteId}/revisions/1`],
    ["patch", `/api/quotes/${quoteId}`, { version: "bad" }],
    ["post", `/api/quotes/${quoteId}/recalculate`, { version: "bad" }],
    ["post", `/api/quotes/${quoteId}/submit`, { version: "bad" }],
    ["post", `/api/quotes/${quoteId}/approve`, { reason: 5 }],
    ["post", `/api/quotes/${quoteId}/return`, { comment: 5 }],
    ["post", `/api/quotes/${quoteId}/revise`, {}],
    ["post", `/api/quotes/${quoteId}/archive`, {}],
    ["post", `/api/quotes/${quoteId}/restore`, {}],
    ["get", "/api/approvals"],
  ];
  const call = (a: Agent, method: string, path: string, body?: unknown) => {
    const r = (a.agent as unknown as Record<string, (p: string) => request.Test>)[method](path).set("X-CSRF-Token", a.token);
    return body === undefined ? r : r.send(body as object);
  };

  it("refuses crew with 403 everywhere, before reading the body, and never shows them quote data", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    for (const [method, path, body] of routes(w.job.id, q.id)) {
      const res = await call(w.crew, method, path, body);
      expect(res.status, `${method} ${path}`).toBe(403);
      expect(res.body.error.code).toBe("forbidden");
      expect(JSON.stringify(res.body)).not.toMatch(/Cents|margin/i);
    }
    expect((await Quote.findByPk(q.id))!.archivedAt).toBeNull();
  });

  it("answers 401 when signed out", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    const anon = request(createTestApp());
    for (const [method, path, body] of routes(w.job.id, q.id)) {
      const r = (anon as unknown as Record<string, (p: string) => request.Test>)[method](path);
      const res = await (body === undefined ? r : r.send(body as object));
      expect(res.status, `${method} ${path}`).toBe(401);
    }
  });

  it("answers 404 for another company's job or quote, before validating the body", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    for (const role of ["owner", "estimator"] as const) {
      const other = await signedInAgent({ role });
      for (const [method, path, body] of routes(w.job.id, q.id)) {
        if (path === "/api/approvals") continue;
        if (role === "estimator" && /approve|return/.test(path)) continue; // estimators are refused first (403)
        const res = await call(other, method, path, body);
        expect(res.status, `${role} ${method} ${path}`).toBe(404);
        expect(res.body.error.code).toBe("not_found");
      }
    }
    expect((await Quote.findByPk(q.id))!.status).toBe("draft");
  });

  it("answers 404 for ids that are not numbers and revision numbers that do not exist", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    expect((await w.estimator.agent.get("/api/quotes/abc")).status).toBe(404);
    expect((await w.estimator.agent.get(`/api/quotes/${q.id}/revisions/2`)).status).toBe(404);
    expect((await w.estimator.agent.get(`/api/quotes/${q.id}/revisions/x`)).status).toBe(404);
  });
});

describe("GET /api/jobs/:jobId/quotes and GET /api/quotes/:id", () => {
  it("lists the job's live quotes newest first as summaries; archived ones only on request", async () => {
    const w = await quoteWorld();
    const a = (await createQuote(w.estimator, w.job.id, { options: THREE_OPTIONS.slice(0, 2) })).body.data;
    const b = (await createQuote(w.estimator, w.job.id)).body.data;
    await testSequelize().query("UPDATE quotes SET created_at = created_at - INTERVAL 1 DAY WHERE id = ?", { replacements: [a.id] });
    const res = await w.estimator.agent.get(`/api/jobs/${w.job.id}/quotes`);
    expect(res.status).toBe(200);
    expect(res.body.data.map((s: { id: number }) => s.id)).toEqual([b.id, a.id]);
    expect(res.body.data[1]).toEqual({
      id: a.id,
      number: a.number,
      status: "draft",
      revisionNo: 1,
      options: a.revision.options.map((o: { id: number; label: string; totals: { totalCents: number } }) => ({ id: o.id, label: o.label, totalCents: o.totals.totalCents })),
      totalCents: a.revision.options[0].totals.totalCents,
      marginPct: a.revision.options[0].totals.marginPct,
      updatedAt: expect.any(String),
      archived: false,
    });
    await post(w.estimator, `/api/quotes/${b.id}/archive`).expect(200);
    expect((await w.estimator.agent.get(`/api/jobs/${w.job.id}/quotes`)).body.data.map((s: { id: number }) => s.id)).toEqual([a.id]);
    expect((await w.estimator.agent.get(`/api/jobs/${w.job.id}/quotes?archived=1`)).body.data.map((s: { id: number }) => s.id)).toEqual([b.id]);
    expect((await w.estimator.agent.get(`/api/jobs/${w.job.id}/quotes?archived=all`)).body.data).toHaveLength(2);
    expect((await w.estimator.agent.get(`/api/jobs/${w.job.id}/quotes?archived=maybe`)).status).toBe(400);
  });

  it("GET /api/quotes/:id and /revisions/1 return the same revision", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    const detail = await w.owner.agent.get(`/api/quotes/${q.id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.data).toEqual(q);
    const rev = await w.owner.agent.get(`/api/quotes/${q.id}/revisions/1`);
    expect(rev.body.data).toEqual(q.revision);
  });
});

describe("PATCH /api/quotes/:id", () => {
  it("edits notes, options, manual lines, overrides and discount of a draft, re-prices it and adds 1 to the version", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id, { options: THREE_OPTIONS.slice(0, 2) })).body.data;
    const [battens, mesh] = q.revision.options;
    const res = await patch(w.estimator, `/api/quotes/${q.id}`, {
      version: 1,
      notes: "Snow guards over the entry.",
      options: [
        { id: mesh.id, label: "Mesh + foil (preferred)", spec: mesh.spec },
        { label: "No spacer", spec: { spacer: "none", foil: false } },
      ],
      manualLines: [
        { optionId: null, description: "Snow guards, clamp-on", quantity: 12, unitPriceCents: 2500, unitCostCents: 1150, taxable: true },
        { optionId: mesh.id, description: "Extra mesh at the porch", quantity: 1, unitPriceCents: 9000 },
      ],
      overrides: [{ key: "panel-standing-seam", unitCostCents: 600, reason: "Supplier price for this colour" }],
      discount: { amountCents: 25000, reason: "Repeat customer" },
    });
    expect(res.status).toBe(200);
    const rev = res.body.data.revision;
    expect(rev.version).toBe(2);
    expect(rev.notes).toBe("Snow guards over the entry.");
    expect(rev.options.map((o: { id: number; label: string }) => [o.id, o.label])).toEqual([
      [mesh.id, "Mesh + foil (preferred)"],
      [expect.any(Number), "No spacer"],
    ]);
    expect(rev.options.some((o: { id: number }) => o.id === battens.id)).toBe(false);
    const [m, none] = rev.options;
    const manual = (o: { lines: Array<{ kind: string; description: string }> }) => o.lines.filter((l) => l.kind === "manual").map((l) => l.description);
    expect(manual(m)).toEqual(["Snow guards, clamp-on", "Extra mesh at the porch"]);
    expect(manual(none)).toEqual(["Snow guards, clamp-on"]);
    const panel = m.lines.find((l: { key: string }) => l.key === "panel-standing-seam");
    expect(panel).toMatchObject({ unitCostCents: 600, overrideReason: "Supplier price for this colour" });
    expect(panel.costCents).toBe(Math.round(panel.quantity * 600));
    const discount = m.lines.find((l: { kind: string }) => l.kind === "discount");
    expect(discount).toMatchObject({ priceCents: -25000, costCents: 0, description: "Discount: Repeat customer" });
    expect(m.hasOverrides).toBe(true);
    expect(rev.needsApprovalReason).toBe(true);
    expect(rev.manualLines[1]).toMatchObject({ optionId: mesh.id, taxable: false });
    expect(rev.discount).toEqual({ amountCents: 25000, reason: "Repeat customer" });
    // The board's total is the first option's.
    expect(Number((await Job.findByPk(w.job.id))!.quoteTotalCents)).toBe(m.totals.totalCents);
    // Lines of the removed option are gone.
    expect(await QuoteLine.count({ where: { optionId: battens.id } })).toBe(0);
    expect((await AuditEvent.findAll({ where: { jobId: w.job.id, entityType: "quote" } })).map((e) => e.action)).toEqual(["created", "updated"]);
  });

  it.each([
    [{}, "version"],
    [{ version: 1, overrides: [{ key: "panel-standing-seam", unitCostCents: 1, reason: "x" }] }, "overrides.0.reason"],
    [{ version: 1, overrides: [{ key: "panel-standing-seam", reason: "no change given" }] }, "overrides.0.unitCostCents"],
    [{ version: 1, manualLines: [{ description: "Permit", quantity: 1, unitPriceCents: 10.5 }] }, "manualLines.0.unitPriceCents"],
    [{ version: 1, manualLines: [{ description: "", quantity: 1, unitPriceCents: 100 }] }, "manualLines.0.description"],
    [{ version: 1, discount: { amountCents: 500, reason: "" } }, "discount.reason"],
    [{ version: 1, options: [{ id: 999999, label: "X", spec: {} }] }, "options.0.id"],
    [{ version: 1, manualLines: [{ optionId: 999999, description: "Permit", quantity: 1, unitPriceCents: 100 }] }, "manualLines.0.optionId"],
  ])("answers 400 with the field path for %j and changes nothing", async (body, field) => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    const res = await patch(w.estimator, `/api/quotes/${q.id}`, body);
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toContain(field);
    expect((await w.estimator.agent.get(`/api/quotes/${q.id}`)).body.data).toEqual(q);
  });

  it("answers 409 stale_version with the current version for an old version; of two edits of one version only one wins", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    const [a, b] = await Promise.all([
      patch(w.estimator, `/api/quotes/${q.id}`, { version: 1, notes: "from the estimator" }),
      patch(w.owner, `/api/quotes/${q.id}`, { version: 1, notes: "from the owner" }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const [win, lose] = a.status === 200 ? [a, b] : [b, a];
    expect(lose.body).toMatchObject({ error: { code: "stale_version" }, currentVersion: 2 });
    const now = (await w.estimator.agent.get(`/api/quotes/${q.id}`)).body.data.revision;
    expect(now.notes).toBe(win.body.data.revision.notes);
    expect(now.version).toBe(2);
    const again = await patch(w.estimator, `/api/quotes/${q.id}`, { version: 1, notes: "late" });
    expect(again.status).toBe(409);
    expect(again.body.currentVersion).toBe(2);
  });

  it("answers 409 not_draft with the current status once the revision left draft", async () => {
    const w = await quoteWorld();
    const q = await quoteInReview(w);
    const res = await patch(w.estimator, `/api/quotes/${q.id}`, { version: q.revision.version, notes: "x" });
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ error: { code: "not_draft" }, currentStatus: "in_review" });
    const recalc = await post(w.estimator, `/api/quotes/${q.id}/recalculate`, { version: q.revision.version });
    expect(recalc.body).toMatchObject({ error: { code: "not_draft" }, currentStatus: "in_review" });
  });
});

describe("state transitions", () => {
  it("submit: draft → in_review with notes; a second submit is 409 invalid_transition; a stale version is 409", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    expect((await post(w.estimator, `/api/quotes/${q.id}/submit`, {})).body.error.fields).toHaveProperty("version");
    const stale = await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: 7 });
    expect(stale.body).toMatchObject({ error: { code: "stale_version" }, currentVersion: 1 });
    const res = await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: 1, notes: "Margin is thin on the porch." });
    expect(res.status).toBe(200);
    expect(res.body.data.status).toBe("in_review");
    expect(res.body.data.revision).toMatchObject({
      status: "in_review",
      notes: "Margin is thin on the porch.",
      submittedBy: { id: w.estimator.user.id },
      submittedAt: expect.any(String),
    });
    const again = await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: res.body.data.revision.version });
    expect(again.status).toBe(409);
    expect(again.body).toMatchObject({ error: { code: "invalid_transition" }, currentStatus: "in_review" });
  });

  it.each<[QuoteStatus, string, Record<string, unknown>]>([
    ["draft", "approve", {}],
    ["draft", "return", { comment: "Please check" }],
    ["draft", "revise", {}],
    ["in_review", "revise", {}],
    ["approved", "approve", {}],
    ["approved", "return", { comment: "Please check" }],
    ["approved", "submit", { version: 3 }],
    ["sent", "submit", { version: 3 }],
    ["accepted", "revise", {}],
    ["declined", "approve", {}],
  ])("a %s quote cannot be %s-ed: 409 invalid_transition with the current status", async (status, action, body) => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    if (status !== "draft") {
      await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: 1 }).expect(200);
      if (status !== "in_review") await post(w.owner, `/api/quotes/${q.id}/approve`, {}).expect(200);
      if (!["in_review", "approved"].includes(status)) await forceStatus(q.id, status);
    }
    const res = await post(w.owner, `/api/quotes/${q.id}/${action}`, body);
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ error: { code: "invalid_transition" }, currentStatus: status });
    expect((await Quote.findByPk(q.id))!.status).toBe(status);
  });

  it.each<QuoteStatus>(["approved", "sent", "declined", "expired"])("revise from %s makes revision 2 a draft and leaves revision 1 as it was", async (status) => {
    const w = await quoteWorld();
    const q = await approved(w, { options: THREE_OPTIONS.slice(0, 2) });
    if (status !== "approved") await forceStatus(q.id, status);
    const before = (await w.owner.agent.get(`/api/quotes/${q.id}/revisions/1`)).body.data;
    const res = await post(w.estimator, `/api/quotes/${q.id}/revise`);
    expect(res.status).toBe(201);
    expect(res.body.data.status).toBe("draft");
    expect(res.body.data.revision).toMatchObject({ revisionNo: 2, status: "draft", version: 1, createdBy: { id: w.estimator.user.id } });
    expect(res.body.data.revision.options.map((o: { label: string }) => o.label)).toEqual(["Battens + foil", "Mesh + foil"]);
    expect(res.body.data.revisions.map((r: { revisionNo: number; status: string }) => [r.revisionNo, r.status])).toEqual([
      [1, status],
      [2, "draft"],
    ]);
    expect((await w.owner.agent.get(`/api/quotes/${q.id}/revisions/1`)).body.data).toEqual(before);
  });

  it("revise copies manual lines, overrides (mapped to the new options) and the discount", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id, { options: THREE_OPTIONS.slice(0, 2) })).body.data;
    const mesh = q.revision.options[1];
    await patch(w.estimator, `/api/quotes/${q.id}`, {
      version: 1,
      manualLines: [{ optionId: mesh.id, description: "Extra mesh", quantity: 1, unitPriceCents: 9000 }],
      overrides: [{ optionId: mesh.id, key: "spacer-mesh", quantity: 9, reason: "Porch needs more" }],
      discount: { amountCents: 5000, reason: "Referral" },
    }).expect(200);
    await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: 2 }).expect(200);
    await post(w.owner, `/api/quotes/${q.id}/approve`, { reason: "Porch quantity checked on site" }).expect(200);
    const r2 = (await post(w.estimator, `/api/quotes/${q.id}/revise`)).body.data.revision;
    const newMesh = r2.options[1];
    expect(newMesh.id).not.toBe(mesh.id);
    expect(r2.manualLines).toEqual([{ optionId: newMesh.id, description: "Extra mesh", quantity: 1, unitPriceCents: 9000, taxable: false }]);
    expect(r2.overrides).toEqual([{ optionId: newMesh.id, key: "spacer-mesh", quantity: 9, reason: "Porch needs more" }]);
    expect(r2.discount).toEqual({ amountCents: 5000, reason: "Referral" });
    expect(newMesh.lines.find((l: { key: string }) => l.key === "spacer-mesh")).toMatchObject({ quantity: 9, overrideReason: "Porch needs more" });
    expect(r2.options[0].lines.some((l: { kind: string }) => l.kind === "manual")).toBe(false);
  });

  it("archive hides the quote, refuses edits with 409 archived, takes it off the board total; restore brings it back", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    const arch = await post(w.estimator, `/api/quotes/${q.id}/archive`);
    expect(arch.status).toBe(200);
    expect(arch.body.data.archived).toBe(true);
    expect((await Job.findByPk(w.job.id))!.quoteTotalCents).toBeNull();
    expect((await patch(w.estimator, `/api/quotes/${q.id}`, { version: 1, notes: "x" })).body.error.code).toBe("archived");
    expect((await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: 1 })).body.error.code).toBe("archived");
    expect((await post(w.estimator, `/api/quotes/${q.id}/archive`)).status).toBe(200); // twice: no change
    const rest = await post(w.estimator, `/api/quotes/${q.id}/restore`);
    expect(rest.body.data.archived).toBe(false);
    expect(Number((await Job.findByPk(w.job.id))!.quoteTotalCents)).toBe(q.revision.options[0].totals.totalCents);
    expect((await AuditEvent.findAll({ where: { jobId: w.job.id, entityType: "quote" } })).map((e) => e.action)).toEqual(["created", "archived", "restored"]);
  });

  it("a revised declined quote puts a lost job back to estimating", async () => {
    const w = await quoteWorld();
    const q = await approved(w);
    await forceStatus(q.id, "declined");
    await w.job.update({ status: "lost" });
    await post(w.estimator, `/api/quotes/${q.id}/revise`).expect(201);
    expect((await Job.findByPk(w.job.id))!.status).toBe("estimating");
  });
});

describe("POST /api/quotes/:id/recalculate", () => {
  it("re-prices the draft from the job's current roof (and adds 1 to the version)", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    const { hipRoof } = await import("../../shared/engine/roof/generators");
    const { roofBody } = await import("../helpers/job-factories");
    await w.estimator.agent.put(`/api/jobs/${w.job.id}/roof`).set("X-CSRF-Token", w.estimator.token).send(roofBody(1, { planes: hipRoof(50, 30, 8, { idPrefix: "hip" }) })).expect(200);
    // Nothing moves until the estimator asks.
    expect((await w.estimator.agent.get(`/api/quotes/${q.id}`)).body.data.revision.roofVersion).toBe(1);
    expect((await post(w.estimator, `/api/quotes/${q.id}/recalculate`, {})).status).toBe(400);
    const res = await post(w.estimator, `/api/quotes/${q.id}/recalculate`, { version: 1 });
    expect(res.status).toBe(200);
    const rev = res.body.data.revision;
    expect(rev.version).toBe(2);
    expect(rev.roofVersion).toBe(2);
    // 50 × 30 ft hip at 8/12: 1500 ft² × √(8² + 12²)/12 = 1802.78 ft² (rafter-table slope factor).
    expect(rev.options[0].takeoffSummary.squares).toBeCloseTo(18.03, 2);
    expect(rev.options[0].totals.totalCents).not.toBe(q.revision.options[0].totals.totalCents);
    expect((await post(w.estimator, `/api/quotes/${q.id}/recalculate`, { version: 1 })).body).toMatchObject({ currentVersion: 2 });
  });
});
