import { afterAll, beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import sharp from "sharp";
import { formatInchesAsFeet } from "@shared/schemas/proposal";
import { installPacketDocSchema, type InstallPacketDocDto } from "@shared/schemas/install-packet";
import { closePdfWorkers } from "@server/pdf/pdf-worker";
import { packetFileName } from "@server/routes/install-packet.routes";
import { createTestApp } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { truncateAll } from "../helpers/db";
import { assignCrew, buildJob, saveRoofFor } from "../helpers/job-factories";
import { pdfPages, squash } from "../helpers/pdf-text";

beforeEach(async () => {
  await truncateAll();
});
afterAll(() => closePdfWorkers());

/** supertest's binary body as a Buffer. */
const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on("data", (c: Buffer) => chunks.push(c));
  res.on("end", () => cb(null, Buffer.concat(chunks)));
};

async function ownerWithRoof() {
  const s = await signedInAgent({ role: "owner" });
  const job = await buildJob({ companyId: s.user.companyId, siteAddressLine1: "12 Larkspur Lane" });
  await saveRoofFor(job);
  return { ...s, job };
}

describe("GET /api/jobs/:id/install-packet.pdf", () => {
  it("gives the owner a PDF with the job, every plane's cut list lengths, the layer notes and the cautions", async () => {
    const { agent, job } = await ownerWithRoof();
    const json = (await agent.get(`/api/jobs/${job.id}/install-packet`).expect(200)).body.data as InstallPacketDocDto;
    const res = await agent.get(`/api/jobs/${job.id}/install-packet.pdf`).buffer(true).parse(binary).expect(200);
    expect(res.headers["content-type"]).toBe("application/pdf");
    expect(res.headers["content-disposition"]).toBe(
      `inline; filename="install-packet-job-${job.id}-12-larkspur-lane.pdf"; filename*=UTF-8''install-packet-job-${job.id}-12-larkspur-lane.pdf`,
    );
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    const pages = await pdfPages(pdf);
    const text = pages.join("\n");
    const flat = squash(text);
    expect(text).toContain("Install packet");
    expect(text).toContain("12 Larkspur Lane");
    // 40 × 30 gable and 12 × 8 porch: five planes' worth of cut lists (2 gable planes + 1 shed, at least)
    expect(json.planes.length).toBeGreaterThanOrEqual(3);
    for (const p of json.planes) {
      expect(text).toContain(`${p.number}. ${p.name}`);
      expect(p.cutList.length).toBeGreaterThan(0);
      for (const c of p.cutList) expect(text).toContain(`${formatInchesAsFeet(c.lengthIn)} (${c.lengthIn} in)`);
    }
    expect(flat).toContain("BATTEN SPACING 24 IN ON CENTRE");
    expect(json.cautions.items.length).toBeGreaterThanOrEqual(4);
    for (const c of json.cautions.items) {
      expect(text).toContain(c.title);
      expect(flat).toContain(squash(c.text));
    }
    expect(flat).toContain(squash(json.cautions.governs));
    expect(flat).toMatch(/fall/i);
    expect(flat).toMatch(/power line/i);
    expect(text).not.toMatch(/\$\d/);
  });

  it("embeds the thumbnails of the photos flagged for the crew, with their captions", async () => {
    const s = await signedInAgent({ role: "crew" });
    const job = await buildJob({ companyId: s.user.companyId });
    await assignCrew(job.id, [s.user.id]);
    await saveRoofFor(job);
    const photo = await sharp({ create: { width: 400, height: 300, channels: 3, background: { r: 120, g: 80, b: 40 } } })
      .jpeg()
      .toBuffer();
    // Crew photos are shared with the crew from the start.
    await s.agent
      .post(`/api/jobs/${job.id}/attachments`)
      .set("X-CSRF-Token", s.token)
      .field("caption", "Service drop at the east gable: keep ladders clear")
      .attach("file", photo, { filename: "drop.jpg", contentType: "image/jpeg" })
      .expect(201);
    const json = (await s.agent.get(`/api/jobs/${job.id}/install-packet`).expect(200)).body.data as InstallPacketDocDto;
    expect(json.photoSlots).toEqual([{ caption: "Service drop at the east gable: keep ladders clear", attachmentId: expect.any(Number) }]);
    const res = await s.agent.get(`/api/jobs/${job.id}/install-packet.pdf`).buffer(true).parse(binary).expect(200);
    const pdf = res.body as Buffer;
    expect(squash(await pdfPages(pdf).then((p) => p.join("\n")))).toContain("Service drop at the east gable: keep ladders clear");
    expect(pdf.toString("latin1")).toMatch(/\/Subtype \/Image/);
  });

  it("lets the estimator and the assigned crew read it; an unassigned crew member and another company get 404", async () => {
    const app = createTestApp();
    const owner = await signedInAgent({ role: "owner" }, app);
    const job = await buildJob({ companyId: owner.user.companyId });
    await saveRoofFor(job);
    const estimator = await signedInAgent({ role: "estimator", companyId: owner.user.companyId }, app);
    const crew = await signedInAgent({ role: "crew", companyId: owner.user.companyId }, app);
    const otherCrew = await signedInAgent({ role: "crew", companyId: owner.user.companyId }, app);
    const stranger = await signedInAgent({ role: "owner" }, app);
    await assignCrew(job.id, [crew.user.id]);

    for (const who of [estimator, crew]) {
      const res = await who.agent.get(`/api/jobs/${job.id}/install-packet.pdf`).buffer(true).parse(binary).expect(200);
      expect(res.headers["content-type"]).toBe("application/pdf");
      expect((res.body as Buffer).length).toBeGreaterThan(1000);
    }
    for (const who of [otherCrew, stranger]) {
      for (const path of ["install-packet.pdf", "install-packet"]) {
        const res = await who.agent.get(`/api/jobs/${job.id}/${path}`).expect(404);
        expect(res.body.error.code).toBe("not_found");
      }
    }
    await request(app).get(`/api/jobs/${job.id}/install-packet.pdf`).expect(401);
    await owner.agent.get(`/api/jobs/not-a-job/install-packet.pdf`).expect(404);
  });

  it("answers 409 no_roof with a message for a job without a saved roof", async () => {
    const s = await signedInAgent({ role: "owner" });
    const job = await buildJob({ companyId: s.user.companyId });
    for (const path of ["install-packet.pdf", "install-packet"]) {
      const res = await s.agent.get(`/api/jobs/${job.id}/${path}`).expect(409);
      expect(res.body.error.code).toBe("no_roof");
      expect(res.body.error.message).toMatch(/saved roof/);
    }
  });
});

describe("GET /api/jobs/:id/install-packet", () => {
  it("returns the packet document in the shared shape, without prices, and leaves the job's other routes alone", async () => {
    const { agent, job } = await ownerWithRoof();
    const res = await agent.get(`/api/jobs/${job.id}/install-packet`).expect(200);
    const parsed = installPacketDocSchema.safeParse(res.body.data);
    expect(parsed.success).toBe(true);
    const doc = parsed.data!;
    expect(doc.reference).toBe(`Job ${job.id}`);
    expect(doc.siteAddressLines[0]).toBe("12 Larkspur Lane");
    expect(doc.areas.map((a) => a.title).sort()).toEqual(["Battens over synthetic", "Mesh on the porch"]);
    const main = doc.areas.find((a) => a.title === "Battens over synthetic")!;
    expect(main.steps.map((s) => s.title)).toContain("Battens");
    expect(doc.planes.every((p) => p.zoneDiagram.roofEdges.length > 0)).toBe(true);
    // No price, cost or margin keys anywhere in the document, and no money amounts.
    const keys: string[] = [];
    const walk = (v: unknown) => {
      if (Array.isArray(v)) v.forEach(walk);
      else if (v && typeof v === "object") for (const [k, x] of Object.entries(v)) (keys.push(k), walk(x));
    };
    walk(res.body.data);
    expect(keys.length).toBeGreaterThan(50);
    expect(keys.filter((k) => /cents|price|cost|margin|total\b/i.test(k))).toEqual([]);
    expect(JSON.stringify(doc)).not.toMatch(/\$\s?\d/);
    // The mount at /jobs/:jobId lets the jobs router answer its own paths.
    const roof = await agent.get(`/api/jobs/${job.id}/roof`).expect(200);
    expect(roof.body.data.version).toBe(1);
    await agent.get(`/api/jobs/${job.id}`).expect(200);
  });
});

describe("packetFileName", () => {
  it("keeps only ASCII letters, digits and dashes", () => {
    expect(packetFileName(7, 'Ærø "Street" 5/../\\x')).toBe("install-packet-job-7-r-street-5-x.pdf");
    expect(packetFileName(7, undefined)).toBe("install-packet-job-7.pdf");
  });
});
