import { beforeEach, describe, expect, it } from "vitest";
import { signedInAgent } from "../helpers/auth";
import { truncateAll } from "../helpers/db";
import { buildJob } from "../helpers/job-factories";

beforeEach(truncateAll);

describe("POST /api/jobs/:id/attachments with the real HEIC converter", () => {
  // A HEIC container header with no image: what the content check accepts and heic-convert cannot decode.
  // (No HEIC encoder is available offline to make a real photo; the mocked success path is in attachments.routes.test.ts.)
  it("marks a HEIC file the converter can't decode as failed, with a clear message", async () => {
    const { agent, token, user } = await signedInAgent({ role: "estimator" });
    const job = await buildJob({ companyId: user.companyId });
    const heic = Buffer.alloc(64);
    heic.writeUInt32BE(24, 0);
    heic.write("ftyp", 4);
    heic.write("heic", 8);
    heic.write("mif1", 16);
    heic.write("heic", 20);
    const res = await agent.post(`/api/jobs/${job.id}/attachments`).set("X-CSRF-Token", token).attach("file", heic, "IMG_0009.HEIC");
    expect(res.status).toBe(201);
    expect(res.body.data[0]).toMatchObject({ status: "processing", mime: "image/heic" });
    let a = res.body.data[0];
    for (let i = 0; i < 200 && a.status === "processing"; i++) {
      await new Promise((r) => setTimeout(r, 25));
      a = (await agent.get(`/api/attachments/${a.id}`).expect(200)).body.data;
    }
    expect(a.status).toBe("failed");
    expect(a.error).toBe("This HEIC photo could not be converted. Set the camera to save JPEG (or share the photo as JPEG) and upload it again.");
  });
});
