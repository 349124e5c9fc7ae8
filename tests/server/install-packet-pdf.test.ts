import { afterAll, describe, expect, it } from "vitest";
import { formatInchesAsFeet } from "@shared/schemas/proposal";
import { installPacketDocSchema } from "@shared/schemas/install-packet";
import { buildInstallPacketDoc, type InstallPacketInput } from "@server/services/install-packet-content";
import { renderInstallPacketPdf } from "@server/pdf/install-packet-pdf";
import { closePdfWorkers, renderInstallPacketPdfInWorker } from "@server/pdf/pdf-worker";
import { demoRoof, manyPlaneRoof, takeoffFor, type FixtureRoof } from "../helpers/proposal-fixtures";
import { pdfItems, pdfPages, squash } from "../helpers/pdf-text";

afterAll(() => closePdfWorkers());

function packetInput(roof: FixtureRoof = demoRoof()): InstallPacketInput {
  return {
    company: { name: "Quarry Slope Steelworks", phone: "(555) 013-2288", licenceNumber: "RC-204518" },
    job: {
      id: 7,
      customerName: "Zoë Łukasiewicz-Øvergaard",
      customerPhone: "(555) 014-7730",
      siteAddressLine1: "42 Larkspur Bend",
      siteCity: "Harrow Falls",
      siteRegion: "OR",
      sitePostalCode: "97099",
      site: roof.site,
      crew: [{ name: "Dario Finch" }, { name: "Анна Ковальчук" }],
    },
    roof: { planes: roof.planes, stacks: roof.stacks, defaultStackId: roof.defaultStackId },
    takeoff: takeoffFor(roof),
    date: "2026-03-20",
    reference: "QSS-1042",
    optionLabel: "As designed: battens and foil",
    photos: [
      { caption: "Satellite dish on the north slope: take it down before tear-off", attachmentId: 12 },
      { caption: "Service drop at the east gable: keep ladders clear", attachmentId: 13 },
    ],
  };
}

const bodyText = (pages: string[]) => pages.map((p, i) => p.split("\n").slice(i === 0 ? 0 : 1, -1).join("\n")).join("\n");

describe("buildInstallPacketDoc", () => {
  const input = packetInput();
  const doc = buildInstallPacketDoc(input);
  const t = input.takeoff;

  it("fits the shared schema and carries no prices", () => {
    expect(installPacketDocSchema.safeParse(doc).success).toBe(true);
    expect(JSON.stringify(doc)).not.toMatch(/Cents|\$\d/);
  });

  it("copies each plane's cut list and fasteners by zone from the takeoff", () => {
    expect(doc.planes).toHaveLength(t.planes.length);
    for (const p of doc.planes) {
      const r = t.planes.find((x) => x.id === p.id)!;
      expect(p.cutList).toEqual(r.panels.cutList);
      expect(p.panelCount).toBe(r.panels.count);
      expect(p.fasteners.reduce((s, z) => s + z.clips, 0)).toBe(r.windZones.clips);
      expect(p.zoneDiagram.zone2PlanFt).toBeCloseTo(r.windZones.widths.zone2PlanFt, 9);
    }
    const totalClips = doc.fastenerTotals.reduce((s, z) => s + z.clips, 0);
    expect(totalClips).toBe(t.fasteners.clips);
  });

  it("lists the layer stack in install order with the notes that matter", () => {
    const main = doc.areas.find((a) => a.title === "Main roof")!;
    expect(main.steps.map((s) => s.title)).toEqual(["Deck", "Ice barrier at the eaves", "Underlayment", "Radiant barrier (foil)", "Counter-battens and battens", "Panels", "Trim and flashing"]);
    const notes = main.steps.flatMap((s) => s.notes).join(" ");
    expect(notes).toContain("FOIL FACE UP, toward the air gap");
    expect(notes).toContain("BATTEN SPACING 24 IN ON CENTRE");
    expect(notes).toContain("VENT OPENINGS");
    // IRC R905.1.2: the ice barrier reaches 24 in inside the exterior wall line.
    expect(notes).toContain("24 in inside the exterior wall line");
    expect(doc.trim.map((m) => m.description).join(" ")).toMatch(/Eave trim/);
    expect(doc.cautions.governs).toContain("panel maker's tested installation details");
  });
});

describe("renderInstallPacketPdf", () => {
  it("prints the job, cut lists, fasteners by zone, trim, photo captions, cautions and page numbers", async () => {
    const doc = buildInstallPacketDoc(packetInput());
    const pdf = await renderInstallPacketPdf(doc);
    const pages = await pdfPages(pdf);
    const text = pages.join("\n");
    const flat = squash(bodyText(pages));
    pages.forEach((p, i) => expect(p).toContain(`Page ${i + 1} of ${pages.length}`));
    expect(text).toContain("Install packet");
    expect(text).toContain("Zoë Łukasiewicz-Øvergaard");
    expect(text).toContain("Анна Ковальчук");
    expect(text).toContain("42 Larkspur Bend");
    for (const p of doc.planes) {
      expect(text).toContain(`${p.number}. ${p.name}`);
      for (const c of p.cutList) expect(text).toContain(`${formatInchesAsFeet(c.lengthIn)} (${c.lengthIn} in)`);
      for (const z of p.fasteners) expect(text).toContain(`Zone ${z.zone}`);
    }
    expect(flat).toContain("FOIL FACE UP, toward the air gap.");
    expect(flat).toContain("BATTEN SPACING 24 IN ON CENTRE");
    expect(flat).toContain("VENT OPENINGS");
    for (const c of doc.cautions.items) {
      expect(text).toContain(c.title);
      expect(flat).toContain(squash(c.text));
    }
    expect(flat).toContain(squash(doc.cautions.governs));
    for (const s of doc.photoSlots) expect(flat).toContain(squash(s.caption));
    // The item and "how counted" columns share lines, so only the start of each item is matched here;
    // the margin check below covers the rest.
    for (const m of doc.trim) expect(text).toContain(m.description.slice(0, 24));
    expect(doc.trim.length).toBeGreaterThan(2);
    const items = await pdfItems(pdf);
    for (const it of items) expect(it.x + it.width, `"${it.str}" past the right margin`).toBeLessThanOrEqual(it.pageWidth - 30);
  });

  it("adds pages for 40 planes and renders the same in a worker", async () => {
    const doc = buildInstallPacketDoc(packetInput(manyPlaneRoof(40)));
    const direct = await renderInstallPacketPdf(doc);
    const pages = await pdfPages(direct);
    expect(pages.length).toBeGreaterThan(10);
    for (const p of doc.planes) expect(pages.join("\n")).toContain(`${p.number}. ${p.name}`);
    const viaWorker = await renderInstallPacketPdfInWorker(doc);
    expect(Math.abs(viaWorker.length - direct.length) / direct.length).toBeLessThan(0.05);
  }, 60_000);
});
