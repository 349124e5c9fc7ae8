import { beforeEach, describe, expect, it } from "vitest";
import { computeTakeoff } from "../../shared/engine/takeoff";
import { shedRoof } from "../../shared/engine/roof/generators";
import { applySpecToRoof, applySpecToStack } from "../../shared/schemas/quote";
import { stackSchema } from "../../shared/schemas/takeoff";
import { CatalogItem, Job, QuoteOption, Roof } from "../../server/models/index";
import { rulesForCompany } from "../../server/services/price-book-rules";
import { signedInAgent } from "../helpers/auth";
import { buildCompany } from "../helpers/factories";
import { truncateAll } from "../helpers/db";
import { buildJob, saveRoofFor } from "../helpers/job-factories";
import { buildCatalogItem, buildLaborRate, buildPricingSettings } from "../helpers/price-book-factories";
import { createQuote, patch, post, quoteWorld } from "../helpers/quote-factories";

beforeEach(truncateAll);

describe("pricing one small quote, checked by hand", () => {
  it("prices a 20 × 10 ft shed at 9/12 with two items, labour, tear-off, a manual line and a discount", async () => {
    const company = await buildCompany();
    // Markup 50 %, tax 5 % on the cost of materials, deposit 30 %, minimum margin 20 %.
    await buildPricingSettings(company.id, { pricingMode: "markup", markupPct: 50, minMarginPct: 20, taxRatePct: 5, taxBasis: "cost", depositPct: 30 });
    await buildCatalogItem(company.id, {
      sku: "P-SS-16",
      category: "panels",
      name: "Standing-seam panel, 16 in",
      purchaseUnit: "lf",
      packCoverage: 1,
      coverageUnit: "lf",
      unitCostCents: 450,
      materialKey: "panel-standing-seam",
      attributes: {},
    });
    await buildCatalogItem(company.id, { sku: "T-EAVE-10", name: "Eave trim, 10 ft", unitCostCents: 1850, materialKey: "trim-eave" });
    await buildLaborRate(company.id, { kind: "pitch_band", label: "7/12 to under 10/12", minPitch: 7, maxPitch: 10, centsPerUnit: 20000, unit: "square" });
    await buildLaborRate(company.id, { kind: "tear_off_per_layer", label: "Tear-off per layer", minPitch: null, maxPitch: null, centsPerUnit: 6000, unit: "square" });
    await buildLaborRate(company.id, { kind: "deck_sheet", label: "Deck sheet", minPitch: null, maxPitch: null, centsPerUnit: 2800, unit: "sheet" });
    const est = await signedInAgent({ role: "estimator", companyId: company.id });
    // The site has one existing layer to tear off (the job site's defaults: existingLayers 1, tearOff true).
    const job = await buildJob({ companyId: company.id, status: "estimating" });
    await saveRoofFor(job, {
      planes: shedRoof(20, 10, 9, { idPrefix: "shed" }),
      stacks: [{ id: "plain", name: "Panels on the deck", spacer: { kind: "none" } }],
      defaultStackId: "plain",
      version: 0,
    });
    const created = (await createQuote(est, job.id)).body.data;
    const res = await patch(est, `/api/quotes/${created.id}`, {
      version: 1,
      manualLines: [{ description: "Permit and disposal fee", quantity: 1, unitPriceCents: 15000, unitCostCents: 12000, taxable: false }],
      discount: { amountCents: 10000, reason: "Neighbour referral" },
    });
    expect(res.status).toBe(200);
    const opt = res.body.data.revision.options[0];

    // The engine's takeoff: 200 ft² plan × (15/12 for 9/12: √(9² + 12²) = 15) = 250 ft² = 2.5 squares;
    // 15 panels (20 ft ÷ 16 in) × 12.5 ft = 187.5 lf; 3 pieces of 10 ft eave trim.
    expect(opt.takeoffSummary.squares).toBe(2.5);
    const line = (key: string) => opt.lines.find((l: { key: string | null }) => l.key === key);
    // Panels: ceil(187.5 lf ÷ 1 lf per unit) = 188 lf × 450 ¢ = 84,600 ¢ cost; × 1.5 = 126,900 ¢ price.
    expect(line("panel-standing-seam")).toMatchObject({ quantity: 188, unitCostCents: 450, costCents: 84600, priceCents: 126900, taxable: true });
    // Eave trim: 3 pc × 1,850 ¢ = 5,550 ¢; × 1.5 = 8,325 ¢.
    expect(line("trim-eave")).toMatchObject({ quantity: 3, costCents: 5550, priceCents: 8325 });
    // Labour, 7/12 to under 10/12 band: 2.5 sq × 20,000 ¢ = 50,000 ¢; × 1.5 = 75,000 ¢.
    expect(line(opt.lines.find((l: { kind: string }) => l.kind === "labor").key)).toMatchObject({ quantity: 2.5, costCents: 50000, priceCents: 75000, taxable: false });
    // Tear-off: 2.5 sq × 6,000 ¢ × 1 layer = 15,000 ¢; × 1.5 = 22,500 ¢.
    expect(line("tearoff")).toMatchObject({ quantity: 2.5, costCents: 15000, priceCents: 22500 });
    // No deck sheets to replace (deck kept): no deck line.
    expect(line("deck")).toBeUndefined();
    // Manual line sold at its own price: cost 12,000 ¢, price 15,000 ¢, not taxable. Discount −10,000 ¢.
    expect(opt.lines.filter((l: { kind: string }) => l.kind === "manual")).toMatchObject([{ costCents: 12000, priceCents: 15000, taxable: false }]);
    expect(opt.lines.filter((l: { kind: string }) => l.kind === "discount")).toMatchObject([{ costCents: 0, priceCents: -10000 }]);
    // Unpriced materials are listed, not guessed.
    expect(opt.missingItems).toEqual(expect.arrayContaining(["underlayment-synthetic", "ice-barrier", "clip"]));

    // Cost  = 84,600 + 5,550 + 50,000 + 15,000 + 12,000              = 167,150 ¢
    // Price = 126,900 + 8,325 + 75,000 + 22,500 + 15,000 − 10,000     = 237,725 ¢
    // Tax   = 5 % × (84,600 + 5,550) taxable material cost = 4,507.5  → 4,508 ¢ (half a cent rounds up)
    // Total = 237,725 + 4,508                                         = 242,233 ¢
    // Margin = (237,725 − 167,150) ÷ 237,725 = 29.688 %  (above the 20 % minimum)
    // Deposit = 30 % × 242,233 = 72,669.9 ¢ → to the whole dollar     = 72,700 ¢
    expect(opt.totals).toEqual({ costCents: 167150, priceCents: 237725, taxCents: 4508, totalCents: 242233, marginPct: 29.688, depositCents: 72700 });
    expect(opt.belowMinMargin).toBe(false);
    expect(Number((await Job.findByPk(job.id))!.quoteTotalCents)).toBe(242233);
  });
});

describe("price versioning: a revision keeps the prices it was made with", () => {
  it("a catalog price change after approval leaves the approved revision as it was; revise picks up the new price", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    await post(w.estimator, `/api/quotes/${q.id}/submit`, { version: 1 }).expect(200);
    await post(w.owner, `/api/quotes/${q.id}/approve`, {}).expect(200);
    const before = (await w.owner.agent.get(`/api/quotes/${q.id}/revisions/1`)).body.data;
    const panelLine = before.options[0].lines.find((l: { key: string }) => l.key === "panel-standing-seam");

    const item = (await CatalogItem.findOne({ where: { companyId: w.company.id, materialKey: "panel-standing-seam" } }))!;
    const changed = await w.owner.agent
      .patch(`/api/price-book/items/${item.id}`)
      .set("X-CSRF-Token", w.owner.token)
      .send({ unitCostCents: item.unitCostCents + 100, version: item.version });
    expect(changed.status).toBe(200);

    const after = (await w.owner.agent.get(`/api/quotes/${q.id}/revisions/1`)).body.data;
    expect(after).toEqual(before);
    expect(after.options[0].totals.totalCents).toBe(before.options[0].totals.totalCents);

    const revised = (await post(w.estimator, `/api/quotes/${q.id}/revise`)).body.data.revision;
    const newPanel = revised.options[0].lines.find((l: { key: string }) => l.key === "panel-standing-seam");
    expect(newPanel.unitCostCents).toBe(panelLine.unitCostCents + 100);
    expect(newPanel.costCents).toBe(Math.round(newPanel.quantity * (panelLine.unitCostCents + 100)));
    expect(revised.priceBookVersion).toBeGreaterThan(before.priceBookVersion);
    expect(revised.options[0].totals.totalCents).toBeGreaterThan(before.options[0].totals.totalCents);
    // Revision 1 is still the approved one, unchanged.
    expect((await w.owner.agent.get(`/api/quotes/${q.id}/revisions/1`)).body.data).toEqual(before);
  });

  it("a draft keeps its prices through edits until it is recalculated", async () => {
    const w = await quoteWorld();
    const q = (await createQuote(w.estimator, w.job.id)).body.data;
    const total = q.revision.options[0].totals.totalCents;
    const item = (await CatalogItem.findOne({ where: { companyId: w.company.id, materialKey: "panel-standing-seam" } }))!;
    await w.owner.agent
      .patch(`/api/price-book/items/${item.id}`)
      .set("X-CSRF-Token", w.owner.token)
      .send({ unitCostCents: item.unitCostCents * 2, version: item.version })
      .expect(200);
    const edited = await patch(w.estimator, `/api/quotes/${q.id}`, { version: 1, notes: "Called the homeowner." });
    expect(edited.body.data.revision.options[0].totals.totalCents).toBe(total);
    const recalc = await post(w.estimator, `/api/quotes/${q.id}/recalculate`, { version: 2 });
    expect(recalc.status).toBe(200);
    expect(recalc.body.data.revision.options[0].totals.totalCents).toBeGreaterThan(total);
    expect(recalc.body.data.revision.options[0].lines.find((l: { key: string }) => l.key === "panel-standing-seam").unitCostCents).toBe(item.unitCostCents * 2);
  });
});

describe("an option's takeoff is the engine's result for the roof with the option applied", () => {
  it("stores, per option, exactly computeTakeoff of the stored roof with the spec applied, the site and the company's rules", async () => {
    const w = await quoteWorld();
    const specs = [{ spacer: "mesh", foil: true }, { spacer: "none", foil: false }, { stackId: "porch" }] as const;
    const q = (await createQuote(w.estimator, w.job.id, { options: specs.map((spec, i) => ({ label: `O${i}`, spec })) })).body.data;
    const roof = (await Roof.findOne({ where: { jobId: w.job.id } }))!;
    const job = (await Job.findByPk(w.job.id))!;
    const rules = await rulesForCompany(w.company.id);
    for (const [i, spec] of specs.entries()) {
      const applied = applySpecToRoof(roof.document, spec);
      if ("error" in applied) throw new Error(applied.error);
      const expected = computeTakeoff({ site: job.site, ...applied, rules });
      expect(expected.ok).toBe(true);
      const stored = (await QuoteOption.findByPk(q.revision.options[i].id))!;
      if (expected.ok) expect(stored.takeoff).toEqual(JSON.parse(JSON.stringify(expected.result)));
    }
    // "porch" puts every plane on the mesh assembly: the whole roof gets mesh.
    const porchKeys = q.revision.options[2].lines.map((l: { key: string }) => l.key);
    expect(porchKeys).toContain("spacer-mesh");
    expect(porchKeys).not.toContain("batten-1x4");
  });
});

describe("applySpecToStack / applySpecToRoof", () => {
  const battens = stackSchema.parse({ id: "b", spacer: { kind: "battens", battens: { nominal: "1x3", spacingIn: 16 } } });
  const mesh = stackSchema.parse({ id: "m", spacer: { kind: "mesh", thicknessIn: 0.375 }, radiantBarrier: { kind: "foil", position: "under-panels" } });

  it("swaps the spacer as the gap study does, keeping the batten settings and a mat's own thickness", () => {
    expect(applySpecToStack(battens, {}).spacer).toEqual(battens.spacer);
    expect(applySpecToStack(battens, { spacer: "counter-battens" }).spacer).toEqual({ kind: "battens", battens: { ...battens.spacer.battens, counterBattens: true } });
    expect(applySpecToStack(battens, { spacer: "none" }).spacer.kind).toBe("none");
    expect(applySpecToStack(mesh, { spacer: "mesh" }).spacer).toMatchObject({ kind: "mesh", thicknessIn: 0.375 });
    expect(applySpecToStack(battens, { spacer: "dimpled" }).spacer).toEqual({ kind: "dimpled", battens: battens.spacer.battens });
  });

  it("adds or removes the foil, keeping its position", () => {
    expect(applySpecToStack(battens, { foil: true }).radiantBarrier).toMatchObject({ kind: "foil", position: "on-deck" });
    expect(applySpecToStack(mesh, { foil: false }).radiantBarrier).toMatchObject({ kind: "none", position: "under-panels" });
    expect(applySpecToStack(mesh, {}).radiantBarrier.kind).toBe("foil");
  });

  it("puts every plane on the named assembly, or says the roof has no such assembly", () => {
    const roof = { planes: [{ id: "a", stackId: "b" }, { id: "c" }], stacks: [battens, mesh], defaultStackId: "b" };
    const out = applySpecToRoof(roof, { stackId: "m", spacer: "none" });
    if ("error" in out) throw new Error(out.error);
    expect(out.planes.map((p) => p.stackId)).toEqual(["m", "m"]);
    expect(out.defaultStackId).toBe("m");
    expect(out.stacks.map((s) => s.spacer.kind)).toEqual(["none", "none"]);
    expect(applySpecToRoof(roof, { stackId: "zz" })).toEqual({ error: 'The roof has no assembly "zz"' });
  });
});
