import { afterAll, describe, expect, it } from "vitest";
import { formatDate, formatMoney, type ProposalDocDto } from "@shared/schemas/proposal";
import { buildProposalDoc } from "@server/services/proposal-content";
import { renderProposalPdf } from "@server/pdf/proposal-pdf";
import { coverage, loadInterFonts } from "@server/pdf/fonts";
import { closePdfWorkers, renderProposalPdfInWorker } from "@server/pdf/pdf-worker";
import { LONG_COMPANY_NAME, manyPlaneRoof, proposalInput } from "../helpers/proposal-fixtures";
import { pdfItems, pdfPages, squash } from "../helpers/pdf-text";

afterAll(() => closePdfWorkers());

/** Every text item lies inside the page (nothing drawn past an edge or into the footer's margin area). */
async function expectInsidePages(pdf: Buffer) {
  const items = await pdfItems(pdf);
  expect(items.length).toBeGreaterThan(50);
  for (const it of items) {
    expect(it.x, `"${it.str}" starts left of the page`).toBeGreaterThanOrEqual(30);
    expect(it.x + it.width, `"${it.str}" runs past the right margin on page ${it.page}`).toBeLessThanOrEqual(it.pageWidth - 30);
    expect(it.y, `"${it.str}" sits below the footer on page ${it.page}`).toBeGreaterThanOrEqual(20);
    expect(it.y, `"${it.str}" is above the page`).toBeLessThanOrEqual(it.pageHeight - 20);
  }
}

/** The pages' text without running headers (pages 2+) and footers, so a paragraph split by a page break reads whole. */
const bodyText = (pages: string[]) =>
  pages
    .map((p, i) => p.split("\n").slice(i === 0 ? 0 : 1, -1).join("\n"))
    .join("\n");

function expectPageNumbers(pages: string[]) {
  pages.forEach((p, i) => expect(p).toContain(`Page ${i + 1} of ${pages.length}`));
}

describe("renderProposalPdf", () => {
  it("renders the demo proposal with totals, options, deposit, terms, cautions, link and page numbers", async () => {
    const doc = buildProposalDoc(proposalInput({ optionCount: 3 }));
    const pdf = await renderProposalPdf(doc);
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    const pages = await pdfPages(pdf);
    const text = pages.join("\n");
    const flat = squash(bodyText(pages));
    expectPageNumbers(pages);
    expect(text).toContain("Quarry Slope Steelworks");
    expect(text).toContain("Licence RC-204518");
    expect(text).toContain("Marisol Vantongeren");
    expect(text).toContain("42 Larkspur Bend");
    expect(text).toContain("QSS-1042");
    expect(text).toContain(formatDate(doc.validUntil));
    for (const o of doc.options) {
      expect(text).toContain(o.label);
      expect(text).toContain(formatMoney(o.totalCents));
      expect(text).toContain(formatMoney(o.priceCents));
      expect(text).toContain(formatMoney(o.taxCents));
      expect(text).toContain(formatMoney(o.depositCents));
      for (const d of o.differences) expect(flat).toContain(squash(d));
    }
    expect(text).toContain("$41,864.50");
    expect(text).toContain("Deposit (30%)");
    for (const area of doc.scope.areas) for (const l of area.layers) for (const s of l.sentences) expect(flat).toContain(squash(s));
    expect(flat).toContain("shiny side facing up, toward the air gap");
    for (const t of [...doc.paymentTerms, ...doc.exclusions, ...doc.warranty]) expect(flat).toContain(squash(t));
    for (const c of doc.cautions.items) {
      expect(text).toContain(c.title);
      expect(flat).toContain(squash(c.text));
    }
    expect(flat).toContain(squash(doc.cautions.governs));
    expect(text).toContain(doc.acceptUrl);
    expect(text).toContain("Roof plan");
    await expectInsidePages(pdf);
  });

  it("keeps a long company name and accented names whole", async () => {
    const name = "Zoë Łukasiewicz-Øvergaard";
    const doc = buildProposalDoc(proposalInput({ companyName: LONG_COMPANY_NAME, customerName: name }));
    const pdf = await renderProposalPdf(doc);
    const pages = await pdfPages(pdf);
    const text = pages.join("\n");
    expect(text).toContain(name);
    expect(squash(text)).toContain(LONG_COMPANY_NAME); // in the introduction, wrapped over lines
    expect(coverage(loadInterFonts(), name).missing).toEqual([]);
    expectPageNumbers(pages);
    await expectInsidePages(pdf);
  });

  it("draws a Cyrillic name with Inter's Cyrillic subset", async () => {
    const name = "Анна Ковальчук";
    expect(coverage(loadInterFonts(), name).missing).toEqual([]);
    const pdf = await renderProposalPdf(buildProposalDoc(proposalInput({ customerName: name })));
    const text = (await pdfPages(pdf)).join("\n");
    expect(text).toContain(name);
  });

  it("reports characters no Inter subset has, instead of pretending to draw them", () => {
    expect(coverage(loadInterFonts(), "山田 太郎").missing).toEqual(["山", "田", "太", "郎"]);
  });

  it("adds pages and cuts no text with 5 options and 40 planes", async () => {
    const input = proposalInput({ roof: manyPlaneRoof(40), optionCount: 5, companyName: LONG_COMPANY_NAME, customerName: "Zoë Łukasiewicz-Øvergaard" });
    const doc = buildProposalDoc(input);
    expect(doc.plan.planes).toHaveLength(40);
    const pdf = await renderProposalPdf(doc);
    const pages = await pdfPages(pdf);
    expect(pages.length).toBeGreaterThan(4);
    expectPageNumbers(pages);
    const text = pages.join("\n");
    const flat = squash(bodyText(pages));
    // Amounts stand on the first line of each table row; without them a wrapped option label reads whole.
    const withoutAmounts = squash(bodyText(pages).replace(/\$[\d,]+\.\d\d/g, " "));
    for (const o of doc.options) {
      expect(withoutAmounts).toContain(squash(o.label));
      expect(text).toContain(formatMoney(o.totalCents));
      expect(text).toContain(formatMoney(o.depositCents));
      for (const d of o.differences) expect(flat).toContain(squash(d));
    }
    for (const p of doc.scope.areas.flatMap((a) => a.planes)) expect(flat).toContain(`${p.number}. ${p.name} (`);
    expect(text).toContain(doc.acceptUrl);
    expect(flat).toContain(squash(doc.cautions.governs));
    await expectInsidePages(pdf);
  });

  it("shows the signer, time and chosen option once accepted", async () => {
    const doc = buildProposalDoc(
      proposalInput({ status: "accepted", acceptance: { signerName: "Анна Ковальчук", acceptedAt: "2026-03-09T18:22:00Z", optionId: "102" } }),
    );
    const text = (await pdfPages(await renderProposalPdf(doc))).join("\n");
    expect(text).toContain("Signed by: Анна Ковальчук");
    expect(text).toContain("Accepted: March 9, 2026, 18:22 UTC");
    expect(text).toContain("Option chosen: Mesh mat with foil");
    expect(text).toContain("Mesh mat with foil (chosen)");
  });

  it("marks a draft and draws the vector plan without a logo image", async () => {
    const doc: ProposalDocDto = buildProposalDoc(proposalInput({ status: "draft" }));
    const pdf = await renderProposalPdf(doc);
    const text = (await pdfPages(pdf)).join("\n");
    expect(text).toContain("Metal roof proposal (draft)");
    expect(text).toContain("8/12"); // plane pitch labels in the plan
    expect(text).toContain("Eave");
  });
});

describe("renderProposalPdfInWorker", () => {
  it("renders off the main thread (TypeScript worker under vitest) a PDF like the direct call's", async () => {
    const doc = buildProposalDoc(proposalInput({ optionCount: 3 }));
    const direct = await renderProposalPdf(doc);
    const [a, b] = await Promise.all([renderProposalPdfInWorker(doc), renderProposalPdfInWorker(doc)]);
    for (const w of [a, b]) {
      expect(w.subarray(0, 5).toString()).toBe("%PDF-");
      expect(Math.abs(w.length - direct.length) / direct.length).toBeLessThan(0.05);
    }
    expect(await pdfPages(a)).toEqual(await pdfPages(direct));
  }, 60_000);

  it("rejects with the worker's error for a broken document and keeps working", async () => {
    await expect(renderProposalPdfInWorker({} as ProposalDocDto)).rejects.toThrow(/PDF worker/);
    const ok = await renderProposalPdfInWorker(buildProposalDoc(proposalInput({ optionCount: 1 })));
    expect(ok.subarray(0, 5).toString()).toBe("%PDF-");
  }, 60_000);
});
