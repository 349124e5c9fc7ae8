import { beforeEach, describe, expect, it } from "vitest";
import { signedInAgent } from "../helpers/auth";
import { countRows, testSequelize, truncateAll } from "../helpers/db";
import { buildCatalogItem } from "../helpers/price-book-factories";
import { seedDemoPriceBook } from "../../server/db/seeders/demo-price-book";
import { parsePriceBookCsv, serializePriceBookCsv } from "../../server/services/price-book-csv";
import { presentCatalogItem } from "../../server/presenters/price-book.presenter";
import { AuditEvent, CatalogItem, CatalogItemPrice } from "../../server/models/index";
import { CSV_COLUMNS, PRICE_BOOK_CSV_MAX_BYTES } from "../../shared/schemas/price-book";

beforeEach(truncateAll);

const HEADER = "sku,category,name,purchase_unit,pack_coverage,coverage_unit,unit_cost,waste_pct,material_key,active,stock_length_ft,end_lap_in";
const csv = (...lines: string[]) => Buffer.from([HEADER, ...lines].join("\n") + "\n");

/** Items without ids, timestamps and versions, sorted by SKU: what a round trip must keep. */
async function itemsOf(companyId: number) {
  const rows = await CatalogItem.findAll({ where: { companyId }, order: [["sku", "ASC"]] });
  return rows.map((r) => {
    const { id: _id, createdAt: _c, updatedAt: _u, version: _v, ...rest } = presentCatalogItem(r);
    return rest;
  });
}

const importFile = (agent: Awaited<ReturnType<typeof signedInAgent>>["agent"], token: string, buf: Buffer, commit: boolean, name = "price-book.csv") =>
  agent.post(`/api/price-book/import${commit ? "?commit=1" : ""}`).set("X-CSRF-Token", token).attach("file", buf, { filename: name, contentType: "text/csv" });

describe("GET /api/price-book/export.csv", () => {
  it("sends text/csv with a header row and one row per item, archived ones marked", async () => {
    const { agent, user } = await signedInAgent({ role: "estimator" });
    await buildCatalogItem(user.companyId, { sku: "A-1", name: 'Ridge cap, 24 ga, 10 ft, "charcoal"', unitCostCents: 3805, materialKey: "ridge-cap" });
    await buildCatalogItem(user.companyId, { sku: "A-2", active: false, wastePct: 7.5 });
    const res = await agent.get("/api/price-book/export.csv").buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on("data", (c: Buffer) => chunks.push(c));
      r.on("end", () => cb(null, Buffer.concat(chunks).toString("utf8")));
    });
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toMatch(/^text\/csv/);
    expect(res.headers["content-disposition"]).toMatch(/attachment; filename="price-book-\d{4}-\d{2}-\d{2}\.csv"/);
    const text = res.body as string;
    expect(text.startsWith("\uFEFF")).toBe(true);
    const lines = text.slice(1).split("\r\n").filter(Boolean);
    expect(lines[0]).toBe(CSV_COLUMNS.join(","));
    expect(lines).toHaveLength(3);
    expect(lines[1]).toMatch(/^A-1,trim,"Ridge cap, 24 ga, 10 ft, ""charcoal""",pc,10,lf,38\.05,,ridge-cap,yes,/);
    expect(lines[2]).toMatch(/^A-2,trim,.*,18\.50,7\.5,,no,/);
  });
});

describe("CSV round trip", () => {
  it("export → import into an empty price book gives the same items", async () => {
    const source = await signedInAgent({ role: "owner" });
    await seedDemoPriceBook(testSequelize(), source.user.companyId);
    await buildCatalogItem(source.user.companyId, { sku: "OLD-1", active: false, name: "=cmd|' /C calc'!A0" });
    const exported = await source.agent.get("/api/price-book/export.csv").buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on("data", (c: Buffer) => chunks.push(c));
      r.on("end", () => cb(null, Buffer.concat(chunks)));
    });
    const file = exported.body as Buffer;
    expect(file.toString("utf8")).toContain(",'=cmd|' /C calc'!A0,"); // a formula-looking name is defused in the file

    const target = await signedInAgent({ role: "owner" });
    const res = await importFile(target.agent, target.token, file, true);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ valid: true, committed: true, errors: [] });
    const before = await itemsOf(source.user.companyId);
    expect(before.length).toBeGreaterThan(40);
    expect(await itemsOf(target.user.companyId)).toEqual(before);
    // Every imported item starts its price history.
    expect(await CatalogItemPrice.count()).toBe(2 * before.length);
  });

  it("importing the export back changes nothing and adds no versions", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    await seedDemoPriceBook(testSequelize(), user.companyId);
    const items = (await CatalogItem.findAll({ where: { companyId: user.companyId } })).map(presentCatalogItem);
    const res = await importFile(agent, token, Buffer.from(serializePriceBookCsv(items)), true);
    expect(res.status).toBe(200);
    expect(res.body.data.summary).toEqual({ create: 0, update: 0, unchanged: items.length });
    expect(await CatalogItem.max("version", { where: { companyId: user.companyId } })).toBe(1);
  });
});

describe("POST /api/price-book/import", () => {
  it("without commit gives a preview and saves nothing", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    await buildCatalogItem(user.companyId, { sku: "TR-1", unitCostCents: 1800 });
    const res = await importFile(agent, token, csv("TR-1,trim,Eave trim,pc,10,lf,19.25,,,yes,10,3", "TR-2,trim,Rake trim,pc,10,lf,24,,trim-rake,yes,10,3"), false);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      valid: true,
      committed: false,
      summary: { create: 1, update: 1, unchanged: 0 },
      rows: [
        { row: 2, sku: "TR-1", action: "update", changes: expect.arrayContaining(["unitCostCents", "name"]) },
        { row: 3, sku: "TR-2", action: "create", changes: [] },
      ],
    });
    expect(await countRows("catalog_items")).toBe(1);
    expect((await CatalogItem.findOne({ where: { sku: "TR-1" } }))!.unitCostCents).toBe(1800);
  });

  it("with commit=1 upserts by SKU: a price change bumps the version and writes history; an audit entry records the import", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const existing = await buildCatalogItem(user.companyId, { sku: "TR-1", unitCostCents: 1800, name: "Eave trim" });
    const res = await importFile(agent, token, csv("tr-1,trim,Eave trim,pc,10,lf,19.25,,,yes,10,3", "TR-2,trim,Rake trim,pc,10,lf,24,,trim-rake,yes,10,3"), true);
    expect(res.status).toBe(200);
    expect(res.body.data.committed).toBe(true);
    const updated = (await CatalogItem.findByPk(existing.id))!;
    expect([updated.sku, updated.unitCostCents, updated.version]).toEqual(["tr-1", 1925, 2]);
    const history = await CatalogItemPrice.findAll({ where: { itemId: existing.id }, order: [["version", "ASC"]] });
    expect(history.map((h) => [h.version, h.unitCostCents, h.changedBy])).toEqual([[1, 1800, null], [2, 1925, user.id]]);
    const created = (await CatalogItem.findOne({ where: { companyId: user.companyId, sku: "TR-2" } }))!;
    expect(created).toMatchObject({ unitCostCents: 2400, materialKey: "trim-rake", version: 1, attributes: { stockLengthFt: 10, endLapIn: 3 } });
    const audit = await AuditEvent.findOne({ where: { entityType: "price_book", action: "csv_imported" } });
    expect(audit!.changes).toMatchObject({ created: ["TR-2"], updated: [{ sku: "TR-1", fields: expect.arrayContaining(["sku", "unitCostCents"]) }] });
  });

  it("leaves attributes alone when the file has no column for them, and clears one whose cell is blank", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const existing = await buildCatalogItem(user.companyId, {
      sku: "UL-1",
      category: "underlayment",
      name: "Synthetic underlayment",
      purchaseUnit: "roll",
      packCoverage: 1000,
      coverageUnit: "sqft",
      unitCostCents: 9000,
      attributes: { rollWidthIn: 48, rollLengthFt: 250, sideLapIn: 4, endLapIn: 6 },
    });
    // A file with only the base columns and end_lap_in (blank): the roll sizes have no column and stay.
    const header = "sku,category,name,purchase_unit,pack_coverage,coverage_unit,unit_cost,waste_pct,material_key,active,end_lap_in";
    const file = Buffer.from(`${header}\nUL-1,underlayment,Synthetic underlayment,roll,1000,sqft,95.00,,,yes,\n`);
    const res = await importFile(agent, token, file, true);
    expect(res.status).toBe(200);
    const after = (await CatalogItem.findByPk(existing.id))!;
    expect(after.unitCostCents).toBe(9500);
    expect(after.attributes).toEqual({ rollWidthIn: 48, rollLengthFt: 250, sideLapIn: 4 });
  });

  it("reports every bad row by row number and column and saves nothing (bad number, unknown category, duplicate SKU)", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    await buildCatalogItem(user.companyId, { sku: "KEEP", unitCostCents: 500 });
    const file = csv(
      "NEW-1,gutters,Gutter,pc,10,lf,5.00,,,yes,,", // row 2: unknown category
      "NEW-2,trim,Rake trim,pc,ten,lf,5.00,,,yes,,", // row 3: bad number
      "KEEP,trim,Kept item,pc,10,lf,6.00,,,yes,,", // row 4: fine on its own
      "new-2,trim,Rake again,pc,10,lf,5.00,,,yes,,", // row 5: fine (row 3 never became a valid row)
      "NEW-3,trim,Hip cap,pc,10,lf,5.5.0,,,maybe,,", // row 6: bad money and bad yes/no
      "KEEP,trim,Duplicate,pc,10,lf,6.00,,,yes,,", // row 7: same SKU as row 4
    );
    const preview = await importFile(agent, token, file, false);
    expect(preview.status).toBe(200);
    expect(preview.body.data.valid).toBe(false);
    const expected = [
      { row: 2, column: "category", message: "Pick a category" },
      { row: 3, column: "pack_coverage", message: "Enter a number" },
      { row: 6, column: "unit_cost", message: "Enter an amount in dollars, e.g. 12.50" },
      { row: 6, column: "active", message: "Use yes or no" },
      { row: 7, column: "sku", message: "Same SKU as row 4" },
    ];
    expect(preview.body.data.errors).toEqual(expected);
    const commit = await importFile(agent, token, file, true);
    expect(commit.status).toBe(400);
    expect(commit.body.error).toMatchObject({ code: "csv_invalid", message: "4 rows have problems; nothing was saved" });
    expect(commit.body.errors).toEqual(expected);
    expect(await countRows("catalog_items")).toBe(1);
    expect((await CatalogItem.findOne({ where: { sku: "KEEP" } }))!.unitCostCents).toBe(500);
    expect(await AuditEvent.count({ where: { entityType: "price_book" } })).toBe(0);
  });

  it("reports a missing column on row 1", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const file = Buffer.from("sku,category,name,purchase_unit,pack_coverage\nA,trim,Eave,pc,10\n");
    const res = await importFile(agent, token, file, true);
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([{ row: 1, column: "unit_cost", message: "Missing column" }]);
  });

  it("reads a file with a byte-order mark, CRLF line ends, quoted cells and columns in another order", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const text =
      "\uFEFFName ,SKU,Category,Purchase Unit,Pack Coverage,Coverage unit,Unit Cost,Material Key,Waste %\r\n" +
      '"Eave trim, 24 ga, ""charcoal""",TR-9,Trim,PC,10,LF,"$1,234.50",trim-eave,\r\n' +
      "\r\n" +
      "Pipe boot 3 in,PB-3,penetrations,ea,1,,14,pipe-boot-3in,\r\n";
    const res = await importFile(agent, token, Buffer.from(text, "utf8"), true);
    expect(res.status).toBe(200);
    expect(res.body.data.warnings).toEqual(['Column "waste_%" is not a price-book column and was ignored']);
    const rows = await CatalogItem.findAll({ where: { companyId: user.companyId }, order: [["sku", "ASC"]] });
    expect(rows.map((r) => [r.sku, r.name, r.category, r.purchaseUnit, r.coverageUnit, r.unitCostCents, r.materialKey])).toEqual([
      ["PB-3", "Pipe boot 3 in", "penetrations", "ea", "ea", 1400, "pipe-boot-3in"],
      ["TR-9", 'Eave trim, 24 ga, "charcoal"', "trim", "pc", "lf", 123450, "trim-eave"],
    ]);
  });

  it("numbers rows as a spreadsheet does, counting blank rows", () => {
    const parsed = parsePriceBookCsv(Buffer.from(`${HEADER}\r\n\r\nA,trim,Eave,pc,10,lf,abc,,,,,\r\n`));
    expect(parsed.errors).toEqual([{ row: 3, column: "unit_cost", message: "Enter an amount in dollars, e.g. 12.50" }]);
  });

  it("refuses a material key the file gives to two active rows, or that an item outside the file holds", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    await buildCatalogItem(user.companyId, { sku: "HOLDER", materialKey: "ridge-cap" });
    const res = await importFile(
      agent,
      token,
      csv("R-1,trim,Ridge A,pc,10,lf,30,,ridge-cap,yes,,", "E-1,trim,Eave A,pc,10,lf,18,,trim-eave,yes,,", "E-2,trim,Eave B,pc,10,lf,18,,trim-eave,yes,,", "E-3,trim,Eave C,pc,10,lf,18,,trim-eave,no,,"),
      true,
    );
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([
      { row: 2, column: "material_key", message: "Already priced by item HOLDER, which the file does not change" },
      { row: 4, column: "material_key", message: "Already priced by row 3" },
    ]);
    expect(await countRows("catalog_items")).toBe(1);
  });

  it("moves a material key from one item to another within one file", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const a = await buildCatalogItem(user.companyId, { sku: "OLD-RIDGE", materialKey: "ridge-cap" });
    const res = await importFile(agent, token, csv("NEW-RIDGE,trim,New ridge,pc,10,lf,40,,ridge-cap,yes,,", "OLD-RIDGE,trim,Old ridge,pc,10,lf,30,,,yes,,"), true);
    expect(res.status).toBe(200);
    expect((await CatalogItem.findByPk(a.id))!.materialKey).toBeNull();
    expect((await CatalogItem.findOne({ where: { sku: "NEW-RIDGE" } }))!.materialKey).toBe("ridge-cap");
  });

  it("refuses units that cannot price the row's material key", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const res = await importFile(agent, token, csv("C-1,fasteners,Clips,roll,100,sqft,62,,clip,yes,,"), false);
    expect(res.body.data.errors).toEqual([{ row: 2, column: "material_key", message: expect.stringMatching(/counts this material in "ea"/) }]);
  });

  it("answers a request without a file, or with a file that is not CSV, with 400", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const none = await agent.post("/api/price-book/import").set("X-CSRF-Token", token).field("x", "1");
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toEqual({ file: "Choose a CSV file (.csv)" });
    const png = await agent
      .post("/api/price-book/import")
      .set("X-CSRF-Token", token)
      .attach("file", Buffer.from([0x89, 0x50, 0x4e, 0x47]), { filename: "logo.png", contentType: "image/png" });
    expect(png.status).toBe(400);
    expect(png.body.error.fields).toEqual({ file: "Choose a CSV file (.csv)" });
    const empty = await importFile(agent, token, Buffer.from(""), false);
    expect(empty.body.data.errors).toEqual([{ row: 1, column: "file", message: "The file is empty" }]);
  });

  it("answers a file over the size limit with 413", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    const big = Buffer.alloc(PRICE_BOOK_CSV_MAX_BYTES + 10, "a");
    const res = await importFile(agent, token, big, false);
    expect(res.status).toBe(413);
  });
});
