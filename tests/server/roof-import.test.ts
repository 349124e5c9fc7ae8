import { beforeEach, describe, expect, it } from "vitest";
import { signedInAgent } from "../helpers/auth";
import { truncateAll } from "../helpers/db";
import { assignCrew, buildJob, saveRoofFor } from "../helpers/job-factories";
import { Roof } from "../../server/models/index";
import { ROOF_CSV_COLUMNS } from "../../shared/roof-csv";

beforeEach(truncateAll);

const HEADER = ROOF_CSV_COLUMNS.join(",");
const GOOD = [
  HEADER,
  "Front,6/12,rectangle,0,0,40,15,,,,,",
  "Back,6,rectangle,0,30,40,15,,180,,,",
  'Porch,2,outline,,,,,,,"60 0; 72 0; 72 8; 60 8",0,',
].join("\n");

async function setup(role: "owner" | "estimator" = "estimator") {
  const s = await signedInAgent({ role });
  const job = await buildJob({ companyId: s.user.companyId });
  return { ...s, job };
}

describe("POST /api/jobs/:id/roof/import", () => {
  it("previews a good file without saving anything", async () => {
    const { agent, token, job } = await setup();
    const res = await agent.post(`/api/jobs/${job.id}/roof/import`).set("X-CSRF-Token", token).attach("file", Buffer.from(GOOD), "planes.csv");
    expect(res.status).toBe(200);
    expect(res.body.data.errors).toEqual([]);
    expect(res.body.data.committed).toBe(false);
    expect(res.body.data.rows).toEqual([2, 3, 4]);
    expect(res.body.data.planes.map((p: { name: string; pitch: number; outline: number[][] }) => [p.name, p.pitch, p.outline])).toEqual([
      ["Front", 6, [[0, 0], [40, 0], [40, 15], [0, 15]]],
      // rotated 180° about (0, 30): the eave runs along y = 30 from x = 0 to −40, the ridge at y = 15
      ["Back", 6, [[0, 30], [-40, 30], [-40, 15], [0, 15]]],
      ["Porch", 2, [[60, 0], [72, 0], [72, 8], [60, 8]]],
    ]);
    expect(await Roof.count()).toBe(0);
  });

  it("reports each row's problems by row and column", async () => {
    const { agent, token, job } = await setup();
    const text = [
      HEADER,
      "Good,6,rectangle,0,0,10,10,,,,,",
      "Bad pitch,steep,rectangle,0,0,10,10,,,,,",
      "Bad shape,6,dome,0,0,10,10,,,,,",
      "No width,6,rectangle,0,0,,10,,,,,",
      'Bad outline,6,outline,,,,,,,"0 0; 1",,',
      "Bad eave,6,triangle,0,0,10,10,,,,7,",
      "Bad stack,6,rectangle,0,0,10,10,,,,,porch",
    ].join("\n");
    const res = await agent.post(`/api/jobs/${job.id}/roof/import`).set("X-CSRF-Token", token).attach("file", Buffer.from(text), "planes.csv");
    expect(res.status).toBe(200);
    expect(res.body.data.planes).toHaveLength(1);
    expect(res.body.data.errors.map((e: { row: number; column: string }) => [e.row, e.column])).toEqual([
      [3, "pitch"],
      [4, "shape"],
      [5, "width"],
      [6, "outline"],
      [7, "eave_edge"],
      [8, "stack"],
    ]);
    // a job without a roof gets the default stack "main" on import: "porch" is unknown
    expect(res.body.data.errors[5].message).toBe('Unknown layer stack "porch" (this roof has "main")');
  });

  it("reads a file with a byte-order mark and Windows line ends", async () => {
    const { agent, token, job } = await setup();
    const text = "\uFEFF" + GOOD.replace(/\n/g, "\r\n") + "\r\n";
    const res = await agent.post(`/api/jobs/${job.id}/roof/import`).set("X-CSRF-Token", token).attach("file", Buffer.from(text, "utf8"), "planes.csv");
    expect(res.status).toBe(200);
    expect(res.body.data.errors).toEqual([]);
    expect(res.body.data.planes.map((p: { name: string }) => p.name)).toEqual(["Front", "Back", "Porch"]);
  });

  it("refuses a file that is not UTF-8 text", async () => {
    const { agent, token, job } = await setup();
    const res = await agent
      .post(`/api/jobs/${job.id}/roof/import`)
      .set("X-CSRF-Token", token)
      .attach("file", Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x00, 0xff, 0xfe]), "planes.csv");
    expect(res.status).toBe(200);
    expect(res.body.data.errors).toEqual([{ row: 1, column: "file", message: expect.stringMatching(/not a CSV text file/) }]);
  });

  it("commits: creates the roof with the default stack as version 1", async () => {
    const { agent, token, job } = await setup();
    const res = await agent
      .post(`/api/jobs/${job.id}/roof/import?commit=1`)
      .set("X-CSRF-Token", token)
      .field("version", "0")
      .attach("file", Buffer.from(GOOD), "planes.csv");
    expect(res.status).toBe(200);
    expect(res.body.data.committed).toBe(true);
    expect(res.body.data.roof).toMatchObject({ version: 1, defaultStackId: "main" });
    expect(res.body.data.roof.stacks.map((s: { id: string }) => s.id)).toEqual(["main"]);
    expect(res.body.data.roof.planes).toHaveLength(3);
    const roof = await agent.get(`/api/jobs/${job.id}/roof`).expect(200);
    expect(roof.body.data.version).toBe(1);
    expect(roof.body.data.planes.map((p: { id: string }) => p.id)).toEqual(["csv-1", "csv-2", "csv-3"]);
    const takeoff = await agent.get(`/api/jobs/${job.id}/takeoff`).expect(200);
    expect(takeoff.body.data).not.toBeNull();
  });

  it("commits: appends to an existing roof as a new version, keeping its planes and stacks", async () => {
    const { agent, token, job } = await setup();
    const saved = await saveRoofFor(job); // 3 planes, stacks main + porch, version 1
    const text = [HEADER, "Garage,4,rectangle,100,0,20,10,,,,,porch"].join("\n");
    const res = await agent
      .post(`/api/jobs/${job.id}/roof/import?commit=1`)
      .set("X-CSRF-Token", token)
      .field("version", String(saved.version))
      .attach("file", Buffer.from(text), "garage.csv");
    expect(res.status).toBe(200);
    expect(res.body.data.roof.version).toBe(saved.version + 1);
    const roof = (await agent.get(`/api/jobs/${job.id}/roof`).expect(200)).body.data;
    expect(roof.planes.map((p: { id: string }) => p.id)).toEqual([...saved.planes.map((p) => p.id), "csv-1"]);
    expect(roof.planes.at(-1)).toMatchObject({ name: "Garage", stackId: "porch", outline: [[100, 0], [120, 0], [120, 10], [100, 10]] });
    expect(roof.stacks.map((s: { id: string }) => s.id)).toEqual(["main", "porch"]);
  });

  it("commits nothing when any row is bad (400 with the row errors)", async () => {
    const { agent, token, job } = await setup();
    const saved = await saveRoofFor(job);
    const text = [HEADER, "Good,6,rectangle,0,0,10,10,,,,,", "Bad,99,rectangle,0,0,10,10,,,,,"].join("\n");
    const res = await agent
      .post(`/api/jobs/${job.id}/roof/import?commit=1`)
      .set("X-CSRF-Token", token)
      .field("version", String(saved.version))
      .attach("file", Buffer.from(text), "planes.csv");
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: "csv_invalid", message: "1 row has problems; nothing was saved" });
    expect(res.body.errors).toEqual([{ row: 3, column: "pitch", message: "Pitch must be at most 24" }]);
    expect((await Roof.findOne({ where: { jobId: job.id } }))!.version).toBe(saved.version);
  });

  it("answers 409 with the current version when the version is stale", async () => {
    const { agent, token, job } = await setup();
    const saved = await saveRoofFor(job);
    const res = await agent
      .post(`/api/jobs/${job.id}/roof/import?commit=1`)
      .set("X-CSRF-Token", token)
      .field("version", "0")
      .attach("file", Buffer.from(GOOD), "planes.csv");
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({ error: { code: "stale_version" }, currentVersion: saved.version });
    expect((await Roof.findOne({ where: { jobId: job.id } }))!.version).toBe(saved.version);
  });

  it("needs the version to commit (400)", async () => {
    const { agent, token, job } = await setup();
    const res = await agent.post(`/api/jobs/${job.id}/roof/import?commit=1`).set("X-CSRF-Token", token).attach("file", Buffer.from(GOOD), "planes.csv");
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["version"]);
  });

  it("answers 404 for another company's job and 403 to crew", async () => {
    const { agent, token, user } = await setup();
    const other = await buildJob();
    expect((await agent.post(`/api/jobs/${other.id}/roof/import`).set("X-CSRF-Token", token).attach("file", Buffer.from(GOOD), "a.csv")).status).toBe(404);
    const crew = await signedInAgent({ role: "crew", companyId: user.companyId });
    const job = await buildJob({ companyId: user.companyId });
    await assignCrew(job.id, [crew.user.id]);
    expect((await crew.agent.post(`/api/jobs/${job.id}/roof/import`).set("X-CSRF-Token", crew.token).attach("file", Buffer.from(GOOD), "a.csv")).status).toBe(403);
  });
});

describe("GET /api/jobs/:id/roof/export.csv", () => {
  it("exports the roof's planes as outlines that import back to the same planes", async () => {
    const { agent, token, job } = await setup();
    const saved = await saveRoofFor(job);
    const res = await agent.get(`/api/jobs/${job.id}/roof/export.csv`).buffer(true);
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toBe("text/csv; charset=utf-8");
    expect(res.headers["content-disposition"]).toBe(`attachment; filename="job-${job.id}-roof-planes.csv"`);
    const text = String(res.text ?? res.body);
    expect(text.startsWith("\uFEFF" + HEADER + "\r\n")).toBe(true);

    const job2 = await buildJob({ companyId: job.companyId });
    await saveRoofFor(job2, { ...(await import("../helpers/job-factories")).roofBody(0), planes: [saved.planes[0]!] });
    const preview = await agent
      .post(`/api/jobs/${job2.id}/roof/import`)
      .set("X-CSRF-Token", token)
      .attach("file", Buffer.from(text, "utf8"), "export.csv");
    expect(preview.body.data.errors).toEqual([]);
    expect(preview.body.data.planes.map((p: { name: string; pitch: number; outline: unknown; eaveEdge: number; stackId?: string }) => [p.name, p.pitch, p.outline, p.eaveEdge, p.stackId])).toEqual(
      saved.planes.map((p) => [p.name, p.pitch, p.outline, p.eaveEdge, p.stackId]),
    );
  });

  it("answers 404 to crew on a job they are not assigned to", async () => {
    const crew = await signedInAgent({ role: "crew" });
    const job = await buildJob({ companyId: crew.user.companyId });
    expect((await crew.agent.get(`/api/jobs/${job.id}/roof/export.csv`)).status).toBe(404);
  });
});
