import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import sharp from "sharp";
import { createTestApp } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { buildCompany } from "../helpers/factories";
import { testSequelize, truncateAll } from "../helpers/db";
import { AuditEvent, Company } from "../../server/models/index";
import { allocateProposalNumber } from "../../server/services/company.service";

beforeEach(truncateAll);

const profile = {
  name: "Harlow Bend Metal Roofs",
  legalName: "Harlow Bend Metal Roofs LLC",
  licenceNumber: "RC-0042-HB",
  addressLine1: "12 Fennick Lane",
  addressLine2: "",
  city: "Harlow Bend",
  region: "VT",
  postalCode: "05999",
  phone: "(802) 555-0101",
  email: "Office@Example.com",
  website: "https://harlowbend.example.com",
  proposalTerms: "Deposit on acceptance; balance on completion.",
  exclusions: "Gutters, framing repairs.",
  warranty: "Workmanship 10 years. Local codes and the panel maker's installation details govern.",
  proposalPrefix: "HB-",
  nextProposalNumber: 500,
};

describe("GET /api/company", () => {
  it("gives owners and estimators the profile, proposal texts and pricing settings", async () => {
    for (const role of ["owner", "estimator"] as const) {
      const { agent, user } = await signedInAgent({ role });
      const res = await agent.get("/api/company");
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ id: user.companyId, proposalPrefix: "", nextProposalNumber: 1, proposalTerms: null });
      expect(res.body.data.settings).toMatchObject({ pricingMode: "margin", priceBookVersion: 1 });
    }
  });

  it("gives crew the name and contact, without any pricing key", async () => {
    const company = await buildCompany("Crew Visible Roofing");
    await company.update({ phone: "(802) 555-0199", city: "Harlow Bend" });
    const { agent } = await signedInAgent({ role: "crew", companyId: company.id });
    const res = await agent.get("/api/company");
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ name: "Crew Visible Roofing", phone: "(802) 555-0199", city: "Harlow Bend" });
    for (const key of ["settings", "proposalTerms", "exclusions", "warranty", "nextProposalNumber", "proposalPrefix"]) {
      expect(res.body.data).not.toHaveProperty(key);
    }
    expect(JSON.stringify(res.body)).not.toMatch(/margin|markup|tax|cost|price/i);
  });

  it("refuses anonymous with 401", async () => {
    expect((await request(createTestApp()).get("/api/company")).status).toBe(401);
  });
});

describe("PUT /api/company", () => {
  it("saves the owner's profile (empty optional text becomes null, e-mail lower-cased) and audits it", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const res = await agent.put("/api/company").set("X-CSRF-Token", token).send(profile);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      ...profile,
      id: user.companyId,
      addressLine2: null,
      email: "office@example.com",
      logoUrl: null,
    });
    const row = (await Company.findByPk(user.companyId))!;
    expect([row.name, row.nextProposalNumber, row.proposalPrefix]).toEqual(["Harlow Bend Metal Roofs", 500, "HB-"]);
    const audit = await AuditEvent.findOne({ where: { entityType: "company", entityId: String(user.companyId) } });
    expect(audit!.action).toBe("profile_updated");
    expect(audit!.changes).toMatchObject({ city: { from: null, to: "Harlow Bend" } });
  });

  it("leaves the proposal numbering alone when nextProposalNumber is left out", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    await Company.update({ nextProposalNumber: 77 }, { where: { id: user.companyId } });
    const { nextProposalNumber: _n, ...rest } = profile;
    const res = await agent.put("/api/company").set("X-CSRF-Token", token).send(rest);
    expect(res.status).toBe(200);
    expect(res.body.data.nextProposalNumber).toBe(77);
  });

  it("answers a bad body with 400 and field paths, changing nothing", async () => {
    const { agent, token, user } = await signedInAgent({ role: "owner" });
    const res = await agent
      .put("/api/company")
      .set("X-CSRF-Token", token)
      .send({ ...profile, name: " ", email: "not-an-email", website: "ftp://files.example.com", proposalPrefix: "A B", nextProposalNumber: 0 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({
      name: "Required",
      email: "Enter a valid e-mail address",
      website: "Enter a web address starting with http:// or https://",
      proposalPrefix: "Use letters, digits and - _ / only",
      nextProposalNumber: "At least 1",
    });
    expect((await Company.findByPk(user.companyId))!.city).toBeNull();
  });

  it.each(["estimator", "crew"] as const)("refuses a %s with 403 before reading the body", async (role) => {
    const { agent, token, user } = await signedInAgent({ role });
    const res = await agent.put("/api/company").set("X-CSRF-Token", token).send({});
    expect(res.status).toBe(403);
    expect((await Company.findByPk(user.companyId))!.legalName).toBeNull();
  });

  it("changes only the owner's own company", async () => {
    const other = await buildCompany("Untouched Roofing");
    const { agent, token } = await signedInAgent({ role: "owner" });
    await agent.put("/api/company").set("X-CSRF-Token", token).send(profile).expect(200);
    expect((await Company.findByPk(other.id))!.name).toBe("Untouched Roofing");
  });

  it("refuses anonymous with 401", async () => {
    expect((await request(createTestApp()).put("/api/company").send(profile)).status).toBe(401);
  });
});

describe("allocateProposalNumber", () => {
  it("hands out the prefix and the next number, once each, also under concurrency", async () => {
    const company = await buildCompany();
    await company.update({ proposalPrefix: "QSS-", nextProposalNumber: 1001 });
    const db = testSequelize();
    const numbers = await Promise.all(Array.from({ length: 5 }, () => db.transaction((t) => allocateProposalNumber(company.id, t))));
    expect(numbers.sort()).toEqual(["QSS-1001", "QSS-1002", "QSS-1003", "QSS-1004", "QSS-1005"]);
    // A rolled-back transaction gives its number back.
    await expect(
      db.transaction(async (t) => {
        await allocateProposalNumber(company.id, t);
        throw new Error("send failed");
      }),
    ).rejects.toThrow("send failed");
    expect((await Company.findByPk(company.id))!.nextProposalNumber).toBe(1006);
  });
});

describe("/api/company/logo", () => {
  const png = () => sharp({ create: { width: 1200, height: 300, channels: 3, background: "#7a3b1f" } }).png().toBuffer();

  it("lets the owner upload a logo, resized to fit 600 × 200 and kept as PNG, readable by the team", async () => {
    const app = createTestApp();
    const { agent, token, user } = await signedInAgent({ role: "owner" }, app);
    const put = await agent.put("/api/company/logo").set("X-CSRF-Token", token).attach("file", await png(), { filename: "logo.png", contentType: "image/png" });
    expect(put.status).toBe(200);
    expect(put.body.data.logoUrl).toMatch(/^\/api\/company\/logo\?v=/);
    expect(JSON.stringify(put.body)).not.toMatch(/logoAttachmentKey/); // the storage key never leaves the server
    const crew = await signedInAgent({ role: "crew", companyId: user.companyId }, app);
    const got = await crew.agent.get("/api/company/logo");
    expect(got.status).toBe(200);
    expect(got.headers["content-type"]).toBe("image/png");
    const meta = await sharp(got.body as Buffer).metadata();
    expect([meta.format, meta.width, meta.height]).toEqual(["png", 600, 150]);
    const audit = await AuditEvent.findAll({ where: { entityType: "company", action: "logo_set" } });
    expect(audit).toHaveLength(1);
  });

  it("refuses a file that is not an image with 415 and keeps the old logo", async () => {
    const { agent, token } = await signedInAgent({ role: "owner" });
    await agent.put("/api/company/logo").set("X-CSRF-Token", token).attach("file", await png(), { filename: "logo.png", contentType: "image/png" }).expect(200);
    const bad = await agent
      .put("/api/company/logo")
      .set("X-CSRF-Token", token)
      .attach("file", Buffer.from("<html><script>alert(1)</script></html>"), { filename: "logo.png", contentType: "image/png" });
    expect(bad.status).toBe(415);
    expect((await agent.get("/api/company/logo")).status).toBe(200);
  });

  it("lets only the owner change it (estimator 403, signed out 401) and removes it with DELETE", async () => {
    const app = createTestApp();
    const owner = await signedInAgent({ role: "owner" }, app);
    const estimator = await signedInAgent({ role: "estimator", companyId: owner.user.companyId }, app);
    const refused = await estimator.agent.put("/api/company/logo").set("X-CSRF-Token", estimator.token).attach("file", await png(), "logo.png");
    expect(refused.status).toBe(403);
    expect((await request(app).get("/api/company/logo")).status).toBe(401);
    await owner.agent.put("/api/company/logo").set("X-CSRF-Token", owner.token).attach("file", await png(), "logo.png").expect(200);
    expect((await owner.agent.delete("/api/company/logo").set("X-CSRF-Token", owner.token)).status).toBe(204);
    expect((await owner.agent.get("/api/company/logo")).status).toBe(404);
    expect((await Company.findByPk(owner.user.companyId))!.logoAttachmentKey).toBeNull();
  });
});
