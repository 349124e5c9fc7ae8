import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createTestApp } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { buildCompany, buildUser } from "../helpers/factories";
import { countRows, truncateAll } from "../helpers/db";
import { buildCatalogItem, buildLaborRate, catalogItemInput } from "../helpers/price-book-factories";
import { AuditEvent, CatalogItem, CatalogItemPrice, CompanySettings, LaborRate } from "../../server/models/index";
import { MATERIAL_KEYS } from "../../shared/engine/materials";

beforeEach(truncateAll);

const owner = () => signedInAgent({ role: "owner" });

describe("role matrix on /api/price-book", () => {
  const reads = ["/api/price-book/items", "/api/price-book/labor", "/api/price-book/settings", "/api/price-book/mapping", "/api/price-book/rules", "/api/price-book/export.csv"];

  it.each(reads)("GET %s answers owners and estimators, 403 for crew, 401 signed out", async (path) => {
    const company = await buildCompany();
    for (const role of ["owner", "estimator"] as const) {
      const { agent } = await signedInAgent({ role, companyId: company.id });
      expect((await agent.get(path)).status).toBe(200);
    }
    const { agent: crew } = await signedInAgent({ role: "crew", companyId: company.id });
    const refused = await crew.get(path);
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe("forbidden");
    expect((await request(createTestApp()).get(path)).status).toBe(401);
  });

  it("refuses every write to an estimator and to crew with 403, before reading the body, and changes nothing", async () => {
    const company = await buildCompany();
    const item = await buildCatalogItem(company.id);
    for (const role of ["estimator", "crew"] as const) {
      const { agent, token } = await signedInAgent({ role, companyId: company.id });
      const writes = [
        agent.post("/api/price-book/items").set("X-CSRF-Token", token).send({}),
        agent.patch(`/api/price-book/items/${item.id}`).set("X-CSRF-Token", token).send({ unitCostCents: 1, version: 1 }),
        agent.post(`/api/price-book/items/${item.id}/archive`).set("X-CSRF-Token", token),
        agent.post(`/api/price-book/items/${item.id}/restore`).set("X-CSRF-Token", token),
        agent.put("/api/price-book/labor").set("X-CSRF-Token", token).send({ rates: [] }),
        agent.put("/api/price-book/settings").set("X-CSRF-Token", token).send({}),
        agent.post("/api/price-book/import").set("X-CSRF-Token", token).attach("file", Buffer.from("sku\n"), "a.csv"),
      ];
      for (const res of await Promise.all(writes)) expect(res.status).toBe(403);
    }
    const after = (await CatalogItem.findByPk(item.id))!;
    expect(after.unitCostCents).toBe(item.unitCostCents);
    expect(after.active).toBe(true);
    expect(await countRows("catalog_items")).toBe(1);
  });

  it("refuses anonymous writes with 401", async () => {
    const res = await request(createTestApp()).post("/api/price-book/items").send(catalogItemInput());
    expect(res.status).toBe(401);
  });
});

describe("POST /api/price-book/items", () => {
  it("creates an item, its first price-history row and an audit entry", async () => {
    const { agent, token, user } = await owner();
    const body = catalogItemInput({ sku: "TR-EAVE-10", materialKey: "trim-eave", wastePct: 5 });
    const res = await agent.post("/api/price-book/items").set("X-CSRF-Token", token).send(body);
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({
      id: expect.any(Number),
      sku: "TR-EAVE-10",
      category: "trim",
      purchaseUnit: "pc",
      packCoverage: 10,
      coverageUnit: "lf",
      unitCostCents: 1850,
      wastePct: 5,
      materialKey: "trim-eave",
      attributes: { stockLengthFt: 10, endLapIn: 3 },
      active: true,
      version: 1,
    });
    const prices = await CatalogItemPrice.findAll({ where: { itemId: res.body.data.id } });
    expect(prices.map((p) => [p.version, p.unitCostCents, p.packCoverage, p.wastePct, p.changedBy])).toEqual([[1, 1850, 10, 5, user.id]]);
    const audit = await AuditEvent.findAll({ where: { entityType: "catalog_item", entityId: String(res.body.data.id) } });
    expect(audit.map((a) => a.action)).toEqual(["created"]);
  });

  it("answers a bad body with 400, field paths, and no new row", async () => {
    const { agent, token } = await owner();
    const res = await agent
      .post("/api/price-book/items")
      .set("X-CSRF-Token", token)
      .send({
        sku: "",
        category: "gutters",
        name: "Roll",
        purchaseUnit: "roll",
        packCoverage: -1,
        coverageUnit: "sqft",
        unitCostCents: 12.5,
        wastePct: 120,
        materialKey: "not-a-key",
        attributes: { rollWidthIn: "wide", rollLenghtFt: 65 },
      });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({
      sku: "Required",
      category: "Pick a category",
      packCoverage: "Must be more than 0",
      unitCostCents: "Use whole cents",
      wastePct: "At most 100",
      materialKey: "Unknown material key",
      "attributes.rollWidthIn": "Enter a number",
      attributes: "Unknown attribute",
    });
    expect(await countRows("catalog_items")).toBe(0);
  });

  it("refuses an item whose units cannot price its material key (400 on materialKey)", async () => {
    const { agent, token } = await owner();
    // Clips are counted each by the takeoff; an item bought by the roll and covering ft² cannot price them.
    const res = await agent
      .post("/api/price-book/items")
      .set("X-CSRF-Token", token)
      .send(catalogItemInput({ materialKey: "clip", purchaseUnit: "roll", coverageUnit: "sqft", packCoverage: 100 }));
    expect(res.status).toBe(400);
    expect(res.body.error.fields.materialKey).toMatch(/counts this material in "ea"/);
  });

  it("refuses a lap as wide as the roll", async () => {
    const { agent, token } = await owner();
    const res = await agent
      .post("/api/price-book/items")
      .set("X-CSRF-Token", token)
      .send(
        catalogItemInput({
          category: "underlayment",
          purchaseUnit: "roll",
          coverageUnit: "sqft",
          packCoverage: 900,
          materialKey: "underlayment-synthetic",
          attributes: { rollWidthIn: 48, rollLengthFt: 250, sideLapIn: 48 },
        }),
      );
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ "attributes.sideLapIn": "The side lap must be less than the roll width" });
  });

  it("answers a taken SKU (any letter case) with 409 on the sku field", async () => {
    const { agent, token, user } = await owner();
    await buildCatalogItem(user.companyId, { sku: "RW-100" });
    const res = await agent.post("/api/price-book/items").set("X-CSRF-Token", token).send(catalogItemInput({ sku: "rw-100" }));
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: "sku_taken", fields: { sku: "Another item already has this SKU" } });
  });

  it("allows the same SKU in another company", async () => {
    await buildCatalogItem((await buildCompany()).id, { sku: "RW-100" });
    const { agent, token } = await owner();
    const res = await agent.post("/api/price-book/items").set("X-CSRF-Token", token).send(catalogItemInput({ sku: "RW-100" }));
    expect(res.status).toBe(201);
  });

  it("answers a material key already priced by an active item with 409, but an archived holder does not block", async () => {
    const { agent, token, user } = await owner();
    const holder = await buildCatalogItem(user.companyId, { sku: "HOLD", materialKey: "trim-eave" });
    const res = await agent.post("/api/price-book/items").set("X-CSRF-Token", token).send(catalogItemInput({ materialKey: "trim-eave" }));
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("material_key_taken");
    expect(res.body.holderId).toBe(holder.id);
    await holder.update({ active: false });
    const ok = await agent.post("/api/price-book/items").set("X-CSRF-Token", token).send(catalogItemInput({ materialKey: "trim-eave" }));
    expect(ok.status).toBe(201);
  });

  it("the database itself refuses two active items on one key", async () => {
    const company = await buildCompany();
    await buildCatalogItem(company.id, { materialKey: "ridge-cap" });
    await expect(buildCatalogItem(company.id, { materialKey: "ridge-cap" })).rejects.toThrow();
    // Inactive duplicates are fine.
    await expect(buildCatalogItem(company.id, { materialKey: "ridge-cap", active: false })).resolves.toBeTruthy();
  });
});

describe("GET /api/price-book/items", () => {
  it("lists the company's active items only; archived=1 the archived ones; filters by category and text", async () => {
    const { agent, user } = await signedInAgent({ role: "estimator" });
    await buildCatalogItem(user.companyId, { sku: "A-1", name: "Ridge cap, 24 ga" });
    await buildCatalogItem(user.companyId, { sku: "A-2", name: "Old trim", active: false });
    await buildCatalogItem(user.companyId, { sku: "P-1", category: "penetrations", name: "Pipe boot, 3 in", purchaseUnit: "ea", coverageUnit: "ea", packCoverage: 1, attributes: {} });
    await buildCatalogItem((await buildCompany()).id, { sku: "OTHER" });
    const live = await agent.get("/api/price-book/items");
    expect(live.status).toBe(200);
    expect(live.body.data.map((i: { sku: string }) => i.sku).sort()).toEqual(["A-1", "P-1"]);
    expect(live.body.meta.total).toBe(2);
    const archived = await agent.get("/api/price-book/items?archived=1");
    expect(archived.body.data.map((i: { sku: string }) => i.sku)).toEqual(["A-2"]);
    const all = await agent.get("/api/price-book/items?archived=all");
    expect(all.body.data).toHaveLength(3);
    const pens = await agent.get("/api/price-book/items?category=penetrations");
    expect(pens.body.data.map((i: { sku: string }) => i.sku)).toEqual(["P-1"]);
    const q = await agent.get("/api/price-book/items?q=ridge");
    expect(q.body.data.map((i: { sku: string }) => i.sku)).toEqual(["A-1"]);
    const bad = await agent.get("/api/price-book/items?category=gutters");
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ category: "Pick a category" });
  });

  it("answers another company's item id with 404", async () => {
    const other = await buildCatalogItem((await buildCompany()).id);
    const { agent } = await owner();
    expect((await agent.get(`/api/price-book/items/${other.id}`)).status).toBe(404);
    expect((await agent.get(`/api/price-book/items/${other.id}/prices`)).status).toBe(404);
    expect((await agent.get(`/api/price-book/items/abc`)).status).toBe(404);
  });
});

describe("PATCH /api/price-book/items/:id", () => {
  it("a price change adds 1 to the version, writes a history row and an audit entry", async () => {
    const { agent, token, user } = await owner();
    const item = await buildCatalogItem(user.companyId, { unitCostCents: 1850 });
    const res = await agent.patch(`/api/price-book/items/${item.id}`).set("X-CSRF-Token", token).send({ unitCostCents: 1995, version: 1 });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ unitCostCents: 1995, version: 2 });
    const history = await agent.get(`/api/price-book/items/${item.id}/prices`);
    expect(history.body.data.map((p: { version: number; unitCostCents: number }) => [p.version, p.unitCostCents])).toEqual([
      [2, 1995],
      [1, 1850],
    ]);
    expect(history.body.data[0].changedById).toBe(user.id);
    const audit = await AuditEvent.findOne({ where: { entityType: "catalog_item", entityId: String(item.id), action: "price_changed" } });
    expect(audit!.changes).toMatchObject({ unitCostCents: { from: 1850, to: 1995 }, version: { from: 1, to: 2 } });
  });

  it("a change that is not a price adds a version but no history row", async () => {
    const { agent, token, user } = await owner();
    const item = await buildCatalogItem(user.companyId);
    const res = await agent.patch(`/api/price-book/items/${item.id}`).set("X-CSRF-Token", token).send({ name: "Eave trim, renamed", version: 1 });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ name: "Eave trim, renamed", version: 2 });
    expect(await CatalogItemPrice.count({ where: { itemId: item.id } })).toBe(1);
  });

  it("a save that changes nothing keeps the version", async () => {
    const { agent, token, user } = await owner();
    const item = await buildCatalogItem(user.companyId);
    const res = await agent.patch(`/api/price-book/items/${item.id}`).set("X-CSRF-Token", token).send({ unitCostCents: item.unitCostCents, version: 1 });
    expect(res.status).toBe(200);
    expect(res.body.data.version).toBe(1);
    expect(await CatalogItemPrice.count({ where: { itemId: item.id } })).toBe(1);
  });

  it("answers a stale version with 409 and the current version, changing nothing", async () => {
    const { agent, token, user } = await owner();
    const item = await buildCatalogItem(user.companyId, { unitCostCents: 1000 });
    expect((await agent.patch(`/api/price-book/items/${item.id}`).set("X-CSRF-Token", token).send({ unitCostCents: 1100, version: 1 })).status).toBe(200);
    const stale = await agent.patch(`/api/price-book/items/${item.id}`).set("X-CSRF-Token", token).send({ unitCostCents: 900, version: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body).toMatchObject({ error: { code: "stale_version" }, currentVersion: 2 });
    const row = (await CatalogItem.findByPk(item.id))!;
    expect([row.unitCostCents, row.version]).toEqual([1100, 2]);
    expect(await CatalogItemPrice.count({ where: { itemId: item.id } })).toBe(2);
  });

  it("two concurrent saves with the same version: one wins, the other gets 409", async () => {
    const { agent, token, user } = await owner();
    const item = await buildCatalogItem(user.companyId, { unitCostCents: 1000 });
    const [a, b] = await Promise.all([
      agent.patch(`/api/price-book/items/${item.id}`).set("X-CSRF-Token", token).send({ unitCostCents: 1200, version: 1 }),
      agent.patch(`/api/price-book/items/${item.id}`).set("X-CSRF-Token", token).send({ unitCostCents: 1300, version: 1 }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const row = (await CatalogItem.findByPk(item.id))!;
    expect(row.version).toBe(2);
    expect(await CatalogItemPrice.count({ where: { itemId: item.id } })).toBe(2);
  });

  it("answers 400 with field paths (version required, bad values, units that no longer fit the key)", async () => {
    const { agent, token, user } = await owner();
    const item = await buildCatalogItem(user.companyId, { materialKey: "trim-eave" });
    const res = await agent.patch(`/api/price-book/items/${item.id}`).set("X-CSRF-Token", token).send({ unitCostCents: -5, purchaseUnit: "crate" });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ unitCostCents: "Must not be negative", purchaseUnit: "Pick a unit", version: "Required" });
    const units = await agent.patch(`/api/price-book/items/${item.id}`).set("X-CSRF-Token", token).send({ purchaseUnit: "box", coverageUnit: "ea", version: 1 });
    expect(units.status).toBe(400);
    expect(units.body.error.fields.materialKey).toMatch(/counts this material in "pc"/);
    expect((await CatalogItem.findByPk(item.id))!.version).toBe(1);
  });

  it("answers another company's item with 404 before looking at the body", async () => {
    const other = await buildCatalogItem((await buildCompany()).id, { unitCostCents: 700 });
    const { agent, token } = await owner();
    const res = await agent.patch(`/api/price-book/items/${other.id}`).set("X-CSRF-Token", token).send({});
    expect(res.status).toBe(404);
    const res2 = await agent.patch(`/api/price-book/items/${other.id}`).set("X-CSRF-Token", token).send({ unitCostCents: 1, version: 1 });
    expect(res2.status).toBe(404);
    expect((await CatalogItem.findByPk(other.id))!.unitCostCents).toBe(700);
  });
});

describe("POST /api/price-book/items/:id/archive and /restore", () => {
  it("archives and restores an item, each adding a version", async () => {
    const { agent, token, user } = await owner();
    const item = await buildCatalogItem(user.companyId, { materialKey: "trim-rake" });
    const a = await agent.post(`/api/price-book/items/${item.id}/archive`).set("X-CSRF-Token", token);
    expect(a.status).toBe(200);
    expect(a.body.data).toMatchObject({ active: false, version: 2 });
    const mapping = await agent.get("/api/price-book/mapping");
    expect(mapping.body.data.find((m: { key: string }) => m.key === "trim-rake").item).toBeNull();
    const r = await agent.post(`/api/price-book/items/${item.id}/restore`).set("X-CSRF-Token", token);
    expect(r.status).toBe(200);
    expect(r.body.data).toMatchObject({ active: true, version: 3 });
    const actions = (await AuditEvent.findAll({ where: { entityType: "catalog_item", entityId: String(item.id) }, order: [["id", "ASC"]] })).map((e) => e.action);
    expect(actions).toEqual(["archived", "restored"]);
  });

  it("refuses to restore an item whose material key another active item took meanwhile (409)", async () => {
    const { agent, token, user } = await owner();
    const old = await buildCatalogItem(user.companyId, { materialKey: "trim-rake", active: false });
    await buildCatalogItem(user.companyId, { materialKey: "trim-rake" });
    const res = await agent.post(`/api/price-book/items/${old.id}/restore`).set("X-CSRF-Token", token);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe("material_key_taken");
    expect((await CatalogItem.findByPk(old.id))!.active).toBe(false);
  });

  it("answers another company's item with 404", async () => {
    const other = await buildCatalogItem((await buildCompany()).id);
    const { agent, token } = await owner();
    expect((await agent.post(`/api/price-book/items/${other.id}/archive`).set("X-CSRF-Token", token)).status).toBe(404);
    expect((await CatalogItem.findByPk(other.id))!.active).toBe(true);
  });
});

describe("GET/PUT /api/price-book/labor", () => {
  const rates = [
    { kind: "pitch_band", label: "Under 7/12", minPitch: 0, maxPitch: 7, centsPerUnit: 19500, unit: "square" },
    { kind: "pitch_band", label: "7/12 to under 10/12", minPitch: 7, maxPitch: 10, centsPerUnit: 23500, unit: "square" },
    { kind: "pitch_band", label: "10/12 and steeper", minPitch: 10, maxPitch: null, centsPerUnit: 28500, unit: "square" },
    { kind: "tear_off_per_layer", label: "Tear-off, per layer", centsPerUnit: 6500, unit: "square" },
    { kind: "deck_sheet", label: "Deck sheet replacement", centsPerUnit: 2800, unit: "sheet" },
  ];

  it("replaces the company's rates and lists them in order", async () => {
    const { agent, token, user } = await owner();
    await buildLaborRate(user.companyId, { label: "old" });
    const otherCompanyRate = await buildLaborRate((await buildCompany()).id, { label: "theirs" });
    const res = await agent.put("/api/price-book/labor").set("X-CSRF-Token", token).send({ rates });
    expect(res.status).toBe(200);
    expect(res.body.data.map((r: { label: string }) => r.label)).toEqual(rates.map((r) => r.label));
    expect(res.body.data[3]).toMatchObject({ kind: "tear_off_per_layer", minPitch: null, maxPitch: null, centsPerUnit: 6500 });
    expect(await LaborRate.count({ where: { companyId: user.companyId } })).toBe(5);
    expect(await LaborRate.findByPk(otherCompanyRate.id)).not.toBeNull();
    const { agent: est } = await signedInAgent({ role: "estimator", companyId: user.companyId });
    const list = await est.get("/api/price-book/labor");
    expect(list.body.data).toHaveLength(5);
  });

  it("answers overlapping bands, a missing minimum pitch and two tear-off rates with 400 and keeps the old rates", async () => {
    const { agent, token, user } = await owner();
    await buildLaborRate(user.companyId, { label: "kept" });
    const res = await agent
      .put("/api/price-book/labor")
      .set("X-CSRF-Token", token)
      .send({
        rates: [
          { kind: "pitch_band", label: "A", minPitch: 0, maxPitch: 8, centsPerUnit: 100, unit: "square" },
          { kind: "pitch_band", label: "B", minPitch: 7, maxPitch: 10, centsPerUnit: 100, unit: "square" },
          { kind: "pitch_band", label: "C", centsPerUnit: 100, unit: "square" },
          { kind: "tear_off_per_layer", label: "T1", centsPerUnit: 100, unit: "square" },
          { kind: "tear_off_per_layer", label: "T2", centsPerUnit: 100, unit: "square" },
          { kind: "pitch_band", label: "D", minPitch: 12, maxPitch: 11, centsPerUnit: 100, unit: "square" },
        ],
      });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({
      "rates.1.minPitch": "Overlaps the pitch band in row 1",
      "rates.2.minPitch": "Required for a pitch band",
      "rates.4.kind": "Only one rate of this kind",
      "rates.5.maxPitch": "Must be above the lowest pitch",
    });
    const res2 = await agent
      .put("/api/price-book/labor")
      .set("X-CSRF-Token", token)
      .send({
        rates: [
          { kind: "pitch_band", label: "A", minPitch: 0, maxPitch: 8, centsPerUnit: 100, unit: "square" },
          { kind: "pitch_band", label: "B", minPitch: 7, maxPitch: 10, centsPerUnit: 100, unit: "square" },
          { kind: "tear_off_per_layer", label: "T1", centsPerUnit: 100, unit: "square" },
          { kind: "tear_off_per_layer", label: "T2", centsPerUnit: 100, unit: "square" },
        ],
      });
    expect(res2.status).toBe(400);
    expect(res2.body.error.fields).toEqual({
      "rates.1.minPitch": "Overlaps the pitch band in row 1",
      "rates.3.kind": "Only one rate of this kind",
    });
    expect((await LaborRate.findAll({ where: { companyId: user.companyId } })).map((r) => r.label)).toEqual(["kept"]);
  });
});

describe("GET/PUT /api/price-book/settings", () => {
  const settings = {
    pricingMode: "margin",
    markupPct: 50,
    targetMarginPct: 35,
    minMarginPct: 25,
    taxRatePct: 7,
    taxBasis: "cost",
    depositPct: 30,
    proposalValidityDays: 30,
  };

  it("gives the defaults before anything is saved, then the saved settings with a new price-book version", async () => {
    const { agent, token, user } = await owner();
    const before = await agent.get("/api/price-book/settings");
    expect(before.status).toBe(200);
    expect(before.body.data).toMatchObject({ pricingMode: "margin", priceBookVersion: 1 });
    const res = await agent.put("/api/price-book/settings").set("X-CSRF-Token", token).send(settings);
    expect(res.status).toBe(200);
    expect(res.body.data).toEqual({ ...settings, priceBookVersion: 2 });
    const { agent: est } = await signedInAgent({ role: "estimator", companyId: user.companyId });
    expect((await est.get("/api/price-book/settings")).body.data).toEqual({ ...settings, priceBookVersion: 2 });
    const audit = await AuditEvent.findOne({ where: { entityType: "pricing_settings", companyId: user.companyId } });
    expect(audit!.changes).toMatchObject({ taxRatePct: { from: 0, to: 7 } });
  });

  it("answers out-of-range percentages with 400 and field paths", async () => {
    const { agent, token } = await owner();
    const res = await agent
      .put("/api/price-book/settings")
      .set("X-CSRF-Token", token)
      .send({ ...settings, targetMarginPct: 100, minMarginPct: -1, taxRatePct: 101, taxBasis: "sale", proposalValidityDays: 0 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({
      targetMarginPct: "Must be below 100",
      minMarginPct: "Must not be negative",
      taxRatePct: "At most 100",
      taxBasis: "Pick cost or price",
      proposalValidityDays: "At least 1 day",
    });
    expect(await countRows("company_settings")).toBe(0);
  });

  it("refuses a target margin under the minimum in margin mode", async () => {
    const { agent, token } = await owner();
    const res = await agent.put("/api/price-book/settings").set("X-CSRF-Token", token).send({ ...settings, targetMarginPct: 20 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ targetMarginPct: "Set the target at or above the minimum margin" });
  });

  it("keeps each company's settings apart", async () => {
    const { agent, token } = await owner();
    await agent.put("/api/price-book/settings").set("X-CSRF-Token", token).send(settings).expect(200);
    const { agent: other } = await owner();
    expect((await other.get("/api/price-book/settings")).body.data.taxRatePct).toBe(0);
  });

  it("every price-book write adds 1 to the price-book version", async () => {
    const { agent, token, user } = await owner();
    const created = await agent.post("/api/price-book/items").set("X-CSRF-Token", token).send(catalogItemInput()).expect(201);
    await agent.patch(`/api/price-book/items/${created.body.data.id}`).set("X-CSRF-Token", token).send({ unitCostCents: 1, version: 1 }).expect(200);
    await agent.put("/api/price-book/labor").set("X-CSRF-Token", token).send({ rates: [] }).expect(200);
    expect((await CompanySettings.findByPk(user.companyId))!.priceBookVersion).toBe(4);
  });
});

describe("GET /api/price-book/mapping", () => {
  it("lists every material key with its description and the active item pricing it, or null", async () => {
    const { agent, user } = await signedInAgent({ role: "estimator" });
    const item = await buildCatalogItem(user.companyId, { materialKey: "ridge-cap", name: "Ridge cap, 24 ga, 10 ft" });
    await buildCatalogItem((await buildCompany()).id, { materialKey: "trim-eave" });
    const res = await agent.get("/api/price-book/mapping");
    expect(res.status).toBe(200);
    expect(res.body.data.map((m: { key: string }) => m.key)).toEqual(Object.keys(MATERIAL_KEYS));
    const ridge = res.body.data.find((m: { key: string }) => m.key === "ridge-cap");
    expect(ridge).toEqual({
      key: "ridge-cap",
      category: "trim",
      unit: "pc",
      description: MATERIAL_KEYS["ridge-cap"].description,
      item: { id: item.id, sku: item.sku, name: "Ridge cap, 24 ga, 10 ft", purchaseUnit: "pc", unitCostCents: item.unitCostCents },
    });
    expect(res.body.data.find((m: { key: string }) => m.key === "trim-eave").item).toBeNull();
    expect(res.body.conflicts).toEqual([]);
  });

  it("reports items that feed one engine value with different numbers", async () => {
    const { agent, user } = await owner();
    await buildCatalogItem(user.companyId, { sku: "EAVE", materialKey: "trim-eave", packCoverage: 10, attributes: { stockLengthFt: 10 } });
    await buildCatalogItem(user.companyId, { sku: "RAKE", materialKey: "trim-rake", packCoverage: 12, attributes: { stockLengthFt: 12 } });
    const res = await agent.get("/api/price-book/mapping");
    expect(res.body.conflicts).toEqual([
      { field: "trim.stockLengthFt", used: { key: "trim-eave", sku: "EAVE", value: 10 }, ignored: [{ key: "trim-rake", sku: "RAKE", value: 12 }] },
    ]);
  });
});
