import { beforeEach, describe, expect, it, vi } from "vitest";
import { existsSync, readdirSync } from "node:fs";
import path from "node:path";
import sharp from "sharp";
import { createTestApp, testStorage } from "../helpers/app";
import { signedInAgent } from "../helpers/auth";
import { countRows, truncateAll } from "../helpers/db";
import { buildUser } from "../helpers/factories";
import { assignCrew, buildJob } from "../helpers/job-factories";
import { Attachment, AuditEvent } from "../../server/models/index";

// No HEIC encoder is available offline (sharp's prebuilt libheif has no HEVC encoder), so the converter
// is mocked: a HEIC container header is enough for the content check, and the mock decides the outcome.
const heic = vi.hoisted(() => ({ convert: vi.fn() }));
vi.mock("heic-convert", () => ({ default: heic.convert }));

beforeEach(async () => {
  await truncateAll();
  heic.convert.mockReset();
});

const jpeg = (width = 640, height = 480) =>
  sharp({ create: { width, height, channels: 3, background: { r: 150, g: 90, b: 60 } } }).jpeg().toBuffer();
/** A photo of noise: a few tens of KB however it is compressed. */
const noisyJpeg = () =>
  sharp({ create: { width: 300, height: 300, channels: 3, background: "#808080", noise: { type: "gaussian", mean: 128, sigma: 40 } } })
    .jpeg()
    .toBuffer();
const png = (width = 40, height = 30) =>
  sharp({ create: { width, height, channels: 4, background: { r: 0, g: 120, b: 200, alpha: 1 } } }).png().toBuffer();
const PDF = Buffer.from("%PDF-1.4\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n");
/** The start of a HEIC file (ftyp box, brand heic): what file-type reads. */
function heicHeader(): Buffer {
  const b = Buffer.alloc(64);
  b.writeUInt32BE(24, 0);
  b.write("ftyp", 4);
  b.write("heic", 8);
  b.write("mif1", 16);
  b.write("heic", 20);
  return b;
}

/** A multipart body written by hand, so the file name reaches the server exactly as given. */
function multipart(parts: Array<{ name: string; filename?: string; type?: string; data: Buffer | string }>) {
  const boundary = "----rwtest" + Math.random().toString(16).slice(2);
  const chunks: Buffer[] = [];
  for (const p of parts) {
    const disp = `form-data; name="${p.name}"${p.filename !== undefined ? `; filename="${p.filename}"` : ""}`;
    chunks.push(Buffer.from(`--${boundary}\r\nContent-Disposition: ${disp}\r\n${p.type ? `Content-Type: ${p.type}\r\n` : ""}\r\n`));
    chunks.push(Buffer.isBuffer(p.data) ? p.data : Buffer.from(p.data));
    chunks.push(Buffer.from("\r\n"));
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`));
  return { body: Buffer.concat(chunks), type: `multipart/form-data; boundary=${boundary}` };
}

const storedPath = (key: string) => path.join(testStorage().dir, ...key.split("/"));

async function office(role: "owner" | "estimator" = "estimator", app = createTestApp()) {
  const s = await signedInAgent({ role }, app);
  const job = await buildJob({ companyId: s.user.companyId });
  return { ...s, job };
}

async function crewOn(jobAssigned: boolean) {
  const s = await signedInAgent({ role: "crew" });
  const job = await buildJob({ companyId: s.user.companyId });
  if (jobAssigned) await assignCrew(job.id, [s.user.id]);
  return { ...s, job };
}

/** Polls the job's list until the attachment is no longer processing. */
async function settled(agent: Awaited<ReturnType<typeof office>>["agent"], jobId: number, id: number) {
  for (let i = 0; i < 100; i++) {
    const res = await agent.get(`/api/jobs/${jobId}/attachments`).expect(200);
    const a = res.body.data.find((x: { id: number }) => x.id === id);
    if (a.status !== "processing") return a;
    await new Promise((r) => setTimeout(r, 20));
  }
  throw new Error("still processing");
}

describe("POST /api/jobs/:id/attachments", () => {
  it("stores a real photo, records its size, makes a 320 px JPEG thumbnail and answers 201", async () => {
    const { agent, token, job, user } = await office();
    const img = await jpeg(1600, 1200);
    const res = await agent
      .post(`/api/jobs/${job.id}/attachments`)
      .set("X-CSRF-Token", token)
      .field("caption", "North slope before tear-off")
      .attach("file", img, { filename: "IMG_0001.jpg", contentType: "image/jpeg" });
    expect(res.status).toBe(201);
    expect(res.body.data).toHaveLength(1);
    const a = res.body.data[0];
    expect(a).toMatchObject({
      jobId: job.id,
      kind: "photo",
      originalName: "IMG_0001.jpg",
      mime: "image/jpeg",
      size: img.length,
      width: 1600,
      height: 1200,
      caption: "North slope before tear-off",
      showInProposal: false,
      forCrew: false,
      status: "ready",
      uploadedBy: { id: user.id, name: user.name },
    });
    expect(a.thumbUrl).toMatch(new RegExp(`^/api/attachments/${a.id}/thumb`));

    const thumb = await agent.get(a.thumbUrl).buffer(true).expect(200);
    expect(thumb.headers["content-type"]).toBe("image/jpeg");
    const meta = await sharp(thumb.body as Buffer).metadata();
    expect(meta.format).toBe("jpeg");
    expect(Math.max(meta.width!, meta.height!)).toBe(320);
    expect(meta.width! / meta.height!).toBeCloseTo(4 / 3, 1);

    const file = await agent.get(a.fileUrl).buffer(true).expect(200);
    expect(Buffer.compare(file.body as Buffer, img)).toBe(0);
    expect(file.headers["content-type"]).toBe("image/jpeg");
    expect(file.headers["x-content-type-options"]).toBe("nosniff");
    expect(file.headers["content-disposition"]).toBe(`inline; filename="IMG_0001.jpg"; filename*=UTF-8''IMG_0001.jpg`);
  });

  it("takes several files at once: photos, a PDF and a CSV, each typed from its content", async () => {
    const { agent, token, job } = await office("owner");
    const res = await agent
      .post(`/api/jobs/${job.id}/attachments`)
      .set("X-CSRF-Token", token)
      .attach("file", await png(), "ridge.png")
      .attach("file", PDF, "plans.pdf")
      .attach("file", Buffer.from("name,pitch,shape\nA,6,rectangle\n"), "planes.csv")
      .attach("file", Buffer.from("Gate code 4411. Dog in the yard."), "notes.txt");
    expect(res.status).toBe(201);
    expect(res.body.data.map((a: { kind: string; mime: string; thumbUrl: string | null }) => [a.kind, a.mime, a.thumbUrl !== null])).toEqual([
      ["photo", "image/png", true],
      ["document", "application/pdf", false],
      ["csv", "text/csv", false],
      ["document", "text/plain", false],
    ]);
    const list = await agent.get(`/api/jobs/${job.id}/attachments`).expect(200);
    expect(list.body.meta.total).toBe(4);
    const csv = res.body.data[2];
    const dl = await agent.get(csv.fileUrl).expect(200);
    expect(dl.headers["content-type"]).toBe("text/csv; charset=utf-8");
    expect(dl.headers["content-disposition"]).toMatch(/^attachment; /);
  });

  it("files a PDF as a plan when kind=plan", async () => {
    const { agent, token, job } = await office();
    const res = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).field("kind", "plan").attach("file", PDF, "A-101.pdf");
    expect(res.status).toBe(201);
    expect(res.body.data[0]).toMatchObject({ kind: "plan", mime: "application/pdf" });
  });

  it("refuses a file over the size limit with 413 and a message, storing nothing", async () => {
    const { agent, token, job } = await office("estimator", createTestApp({ uploads: { storageDir: testStorage().dir, maxBytes: 2_000 } }));
    const res = await agent
      .post(`/api/jobs/${job.id}/attachments`)
      .set("X-CSRF-Token", token)
      .attach("file", await noisyJpeg(), "big.jpg");
    expect(res.status).toBe(413);
    expect(res.body.error).toEqual({ code: "file_too_large", message: "Each file may be at most 2 KB; nothing was uploaded" });
    expect(await countRows("attachments")).toBe(0);
  });

  it("refuses 11 files in one request with 413", async () => {
    const { agent, token, job } = await office();
    const img = await png(8, 8);
    let req = agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token);
    for (let i = 0; i < 11; i++) req = req.attach("file", img, `p${i}.png`);
    const res = await req;
    expect(res.status).toBe(413);
    expect(res.body.error).toEqual({ code: "too_many_files", message: "At most 10 files per upload; nothing was uploaded" });
    expect(await countRows("attachments")).toBe(0);
  });

  it("refuses HTML named .png (and claimed as image/png) with 415", async () => {
    const { agent, token, job } = await office();
    const res = await agent
      .post(`/api/jobs/${job.id}/attachments`)
      .set("X-CSRF-Token", token)
      .attach("file", Buffer.from("<!doctype html><html><script>alert(document.cookie)</script></html>"), { filename: "roof.png", contentType: "image/png" });
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe("unsupported_type");
    expect(res.body.error.message).toMatch(/"roof\.png" contains HTML/);
    expect(await countRows("attachments")).toBe(0);
    expect(readdirSync(testStorage().dir, { recursive: true }).filter((f) => String(f).includes(".png"))).toEqual([]);
  });

  it("refuses content of a type that is not allowed (a GIF, a ZIP) and text named .pdf with 415", async () => {
    const { agent, token, job } = await office();
    const gif = await sharp({ create: { width: 4, height: 4, channels: 3, background: "red" } }).gif().toBuffer();
    const a = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", gif, "photo.jpg");
    expect(a.status).toBe(415);
    expect(a.body.error.message).toMatch(/GIF file \(image\/gif\)/);
    const zip = Buffer.from("504b0304140000000000", "hex");
    const b = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", Buffer.concat([zip, Buffer.alloc(40)]), "plans.zip");
    expect(b.status).toBe(415);
    const c = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", Buffer.from("just text"), "plans.pdf");
    expect(c.status).toBe(415);
    expect(c.body.error.message).toMatch(/named \.pdf but contains text/);
  });

  it("refuses the whole request when one of several files is refused", async () => {
    const { agent, token, job } = await office();
    const before = readdirSync(testStorage().dir, { recursive: true }).length;
    const res = await agent
      .post(`/api/jobs/${job.id}/attachments`)
      .set("X-CSRF-Token", token)
      .attach("file", await png(), "ok.png")
      .attach("file", Buffer.from("<svg onload=alert(1)>"), "evil.png");
    expect(res.status).toBe(415);
    expect(await countRows("attachments")).toBe(0);
    expect(readdirSync(testStorage().dir, { recursive: true })).toHaveLength(before);
  });

  it("stores a path-traversal file name under a generated key and keeps only a clean display name", async () => {
    const { agent, token, job, user } = await office();
    const img = await png();
    const { body, type } = multipart([{ name: "file", filename: "../../../etc/cron.d/x<evil>.png", type: "image/png", data: img }]);
    const res = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).set("Content-Type", type).send(body);
    expect(res.status).toBe(201);
    const a = res.body.data[0];
    expect(a.originalName).toBe("xevil.png");
    const row = await Attachment.findByPk(a.id);
    expect(row!.storageKey).toMatch(new RegExp(`^${user.companyId}/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$`));
    expect(existsSync(storedPath(row!.storageKey))).toBe(true);
    const everything = readdirSync(path.dirname(testStorage().dir), { recursive: true }).map(String);
    expect(everything.filter((f) => f.includes("evil") || f.endsWith("cron.d"))).toEqual([]);
    const file = await agent.get(a.fileUrl).expect(200);
    expect(file.headers["content-disposition"]).toBe(`inline; filename="xevil.png"; filename*=UTF-8''xevil.png`);
  });

  it("sends a non-ASCII name as RFC 5987 filename* with an ASCII fallback", async () => {
    const { agent, token, job } = await office();
    const { body, type } = multipart([{ name: "file", filename: "Façade «sud».png", type: "image/png", data: await png() }]);
    const res = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).set("Content-Type", type).send(body);
    expect(res.status).toBe(201);
    expect(res.body.data[0].originalName).toBe("Façade «sud».png");
    const file = await agent.get(res.body.data[0].fileUrl).expect(200);
    expect(file.headers["content-disposition"]).toBe(
      `inline; filename="Fa_ade _sud_.png"; filename*=UTF-8''Fa%C3%A7ade%20%C2%ABsud%C2%BB.png`,
    );
  });

  it("answers 404 for another company's job, storing nothing", async () => {
    const { agent, token } = await office();
    const other = await buildJob();
    const res = await agent.post(`/api/jobs/${other.id}/attachments`).set("X-CSRF-Token", token).attach("file", await png(), "a.png");
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe("not_found");
    expect(await countRows("attachments")).toBe(0);
  });

  it("answers 404 to crew on a job they are not assigned to", async () => {
    const { agent, token, job } = await crewOn(false);
    const res = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", await png(), "a.png");
    expect(res.status).toBe(404);
    expect((await agent.get(`/api/jobs/${job.id}/attachments`)).status).toBe(404);
  });

  it("lets crew upload a photo to their assigned job (shared with the crew)", async () => {
    const { agent, token, job } = await crewOn(true);
    const res = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", await jpeg(), "flashing.jpg");
    expect(res.status).toBe(201);
    expect(res.body.data[0]).toMatchObject({ kind: "photo", forCrew: true, status: "ready" });
  });

  it("refuses crew a PDF (403) and a plan (403)", async () => {
    const { agent, token, job } = await crewOn(true);
    const pdf = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", PDF, "plans.pdf");
    expect(pdf.status).toBe(403);
    expect(pdf.body.error.message).toMatch(/Crew can upload photos only/);
    const plan = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).field("kind", "plan").attach("file", await png(), "a.png");
    expect(plan.status).toBe(403);
    expect(await countRows("attachments")).toBe(0);
  });

  it("answers 401 signed out and 403 without the CSRF token", async () => {
    const { agent, job } = await office();
    expect((await agent.post(`/api/jobs/${job.id}/attachments`).attach("file", await png(), "a.png")).status).toBe(403);
    const anon = (await import("supertest")).default(createTestApp());
    const csrf = await anon.get("/api/auth/csrf");
    const res = await anon
      .post(`/api/jobs/${job.id}/attachments`)
      .set("Cookie", csrf.headers["set-cookie"] ?? [])
      .set("X-CSRF-Token", csrf.body.token)
      .attach("file", await png(), "a.png");
    expect(res.status).toBe(401);
  });

  it("answers 400 without a file", async () => {
    const { agent, token, job } = await office();
    const res = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).field("caption", "x");
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual({ file: "Choose at least one file" });
  });

  it("converts a HEIC photo to JPEG in the background: processing, then ready with a thumbnail", async () => {
    const out = await jpeg(400, 300);
    heic.convert.mockResolvedValue(out);
    const { agent, token, job } = await office();
    const res = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", heicHeader(), "IMG_2001.HEIC");
    expect(res.status).toBe(201);
    expect(res.body.data[0]).toMatchObject({ kind: "photo", status: "processing", mime: "image/heic", thumbUrl: null });
    const a = await settled(agent, job.id, res.body.data[0].id);
    expect(a).toMatchObject({ status: "ready", mime: "image/jpeg", originalName: "IMG_2001.jpg", width: 400, height: 300, size: out.length, error: null });
    expect(heic.convert).toHaveBeenCalledWith(expect.objectContaining({ format: "JPEG" }));
    const file = await agent.get(a.fileUrl).buffer(true).expect(200);
    expect(file.headers["content-type"]).toBe("image/jpeg");
    expect(Buffer.compare(file.body as Buffer, out)).toBe(0);
    expect((await agent.get(a.thumbUrl)).status).toBe(200);
  });

  it("marks a HEIC photo failed with a clear message when conversion fails", async () => {
    heic.convert.mockRejectedValue(new Error("unsupported codec"));
    const { agent, token, job } = await office();
    const res = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", heicHeader(), "IMG_2002.heic");
    expect(res.status).toBe(201);
    const a = await settled(agent, job.id, res.body.data[0].id);
    expect(a.status).toBe("failed");
    expect(a.error).toMatch(/could not be converted.*JPEG/);
    expect(a.thumbUrl).toBeNull();
  });
});

describe("GET /api/jobs/:id/attachments and the files", () => {
  it("crew see the files shared with the crew and their own photos, not the office's other files", async () => {
    const { agent: officeAgent, token, job, user } = await office();
    const up = await officeAgent
      .post(`/api/jobs/${job.id}/attachments`)
      .set("X-CSRF-Token", token)
      .attach("file", await png(), "shared.png")
      .attach("file", PDF, "private.pdf");
    const [shared, priv] = up.body.data;
    await officeAgent.patch(`/api/attachments/${shared.id}`).set("X-CSRF-Token", token).send({ forCrew: true }).expect(200);

    const crew = await signedInAgent({ role: "crew", companyId: user.companyId });
    await assignCrew(job.id, [crew.user.id]);
    const list = await crew.agent.get(`/api/jobs/${job.id}/attachments`).expect(200);
    expect(list.body.data.map((a: { id: number }) => a.id)).toEqual([shared.id]);
    expect((await crew.agent.get(`/api/attachments/${priv.id}/file`)).status).toBe(404);
    expect((await crew.agent.get(`/api/attachments/${shared.id}/file`)).status).toBe(200);
  });

  it("answers 404 for another company's file", async () => {
    const a = await office();
    const up = await a.agent.post(`/api/jobs/${a.job.id}/attachments`).set("X-CSRF-Token", a.token).attach("file", await png(), "a.png");
    const b = await office();
    expect((await b.agent.get(`/api/attachments/${up.body.data[0].id}/file`)).status).toBe(404);
    expect((await b.agent.get(`/api/jobs/${a.job.id}/attachments`)).status).toBe(404);
  });
});

describe("PATCH /api/attachments/:id", () => {
  it("changes the caption and flags, with an audit row", async () => {
    const { agent, token, job } = await office();
    const up = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", await png(), "a.png");
    const id = up.body.data[0].id;
    const res = await agent.patch(`/api/attachments/${id}`).set("X-CSRF-Token", token).send({ caption: " Valley at the chimney ", showInProposal: true, forCrew: true });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ caption: "Valley at the chimney", showInProposal: true, forCrew: true });
    const audit = await AuditEvent.findOne({ where: { entityType: "attachment", entityId: String(id), action: "updated" } });
    expect(audit?.jobId).toBe(job.id);
  });

  it("refuses showInProposal on a CSV (400) and unknown keys (400)", async () => {
    const { agent, token, job } = await office();
    const up = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", Buffer.from("a,b\n1,2\n"), "x.csv");
    const id = up.body.data[0].id;
    const a = await agent.patch(`/api/attachments/${id}`).set("X-CSRF-Token", token).send({ showInProposal: true });
    expect(a.status).toBe(400);
    expect(a.body.error.fields).toEqual({ showInProposal: "Only photos and plans can be shown in a proposal" });
    expect((await agent.patch(`/api/attachments/${id}`).set("X-CSRF-Token", token).send({ storageKey: "1/x" })).status).toBe(400);
  });

  it("lets crew caption their own photo but not flag it for the proposal", async () => {
    const { agent, token, job } = await crewOn(true);
    const up = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", await png(), "a.png");
    const id = up.body.data[0].id;
    expect((await agent.patch(`/api/attachments/${id}`).set("X-CSRF-Token", token).send({ caption: "Done" })).status).toBe(200);
    expect((await agent.patch(`/api/attachments/${id}`).set("X-CSRF-Token", token).send({ showInProposal: true })).status).toBe(403);
  });
});

describe("DELETE /api/attachments/:id", () => {
  it("deletes the row, the stored file and its thumbnail, and writes an audit row with the job", async () => {
    const { agent, token, job, user } = await office();
    const up = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", await jpeg(), "old.jpg");
    const id = up.body.data[0].id;
    const row = (await Attachment.findByPk(id))!;
    expect(existsSync(storedPath(row.storageKey))).toBe(true);
    expect(existsSync(storedPath(row.thumbKey!))).toBe(true);

    const res = await agent.delete(`/api/attachments/${id}`).set("X-CSRF-Token", token);
    expect(res.status).toBe(204);
    expect(await Attachment.findByPk(id)).toBeNull();
    expect(existsSync(storedPath(row.storageKey))).toBe(false);
    expect(existsSync(storedPath(row.thumbKey!))).toBe(false);
    const audit = await AuditEvent.findOne({ where: { entityType: "attachment", entityId: String(id), action: "deleted" } });
    expect(audit).toMatchObject({ jobId: job.id, actorId: user.id, companyId: user.companyId });
    expect((await agent.get(`/api/attachments/${id}/file`)).status).toBe(404);
  });

  it("lets crew delete their own photo but not a file the office shared with them", async () => {
    const { agent: officeAgent, token, job, user } = await office();
    const up = await officeAgent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", await png(), "plan.png");
    await officeAgent.patch(`/api/attachments/${up.body.data[0].id}`).set("X-CSRF-Token", token).send({ forCrew: true }).expect(200);
    const crewUser = await buildUser({ role: "crew", companyId: user.companyId });
    await assignCrew(job.id, [crewUser.id]);
    const crew = await signedInAgent({ role: "crew", companyId: user.companyId });
    await assignCrew(job.id, [crew.user.id]);
    const own = await crew.agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", crew.token).attach("file", await png(), "mine.png");
    expect((await crew.agent.delete(`/api/attachments/${up.body.data[0].id}`).set("X-CSRF-Token", crew.token)).status).toBe(403);
    expect((await crew.agent.delete(`/api/attachments/${own.body.data[0].id}`).set("X-CSRF-Token", crew.token)).status).toBe(204);
  });
});
