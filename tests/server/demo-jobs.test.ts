import { beforeEach, describe, expect, it } from "vitest";
import { computeTakeoff } from "../../shared/engine/takeoff";
import { JOB_STATUSES } from "../../shared/schemas/job";
import type { RoofDocument } from "../../shared/schemas/roof";
import { seedDemoJobs, type DemoUser } from "../../server/db/seeders/demo-jobs";
import { Customer, Job, JobCrew, Roof } from "../../server/models/index";
import { rulesForCompany } from "../../server/services/price-book-rules";
import { buildCompany, buildUser } from "../helpers/factories";
import { testSequelize, truncateAll } from "../helpers/db";

beforeEach(truncateAll);

async function demoCompany() {
  const company = await buildCompany("Demo Roofing");
  const users: DemoUser[] = [];
  for (const [role, email] of [["owner", "owner-demo@example.com"], ["estimator", "estimator-demo@example.com"], ["crew", "crew@example.com"]] as const) {
    const u = await buildUser({ companyId: company.id, role, email });
    users.push({ id: u.id, email: u.email, name: u.name, role });
  }
  return { company, users };
}

describe("seedDemoJobs", () => {
  it("seeds a dozen or more invented customers and jobs in every status, with roofs past lead, every spacer kind and partial crew assignment", async () => {
    const { company, users } = await demoCompany();
    expect(await seedDemoJobs(testSequelize(), company.id, users)).toBe(true);

    const customers = await Customer.findAll({ where: { companyId: company.id } });
    expect(customers.length).toBeGreaterThanOrEqual(12);
    expect(customers.every((c) => c.email!.endsWith("@example.com"))).toBe(true);

    const jobs = await Job.findAll({ where: { companyId: company.id } });
    expect(new Set(jobs.map((j) => j.status))).toEqual(new Set(JOB_STATUSES));
    // Each customer dates from their first job, not from the moment of seeding.
    for (const c of customers) {
      const theirs = jobs.filter((j) => j.customerId === c.id);
      if (!theirs.length) continue;
      expect(c.createdAt.getTime()).toBe(Math.min(...theirs.map((j) => j.createdAt.getTime())));
      expect(c.updatedAt.getTime()).toBeLessThan(Date.now() - 86_400_000);
    }

    const roofs = await Roof.findAll({ where: { companyId: company.id } });
    const roofByJob = new Map(roofs.map((r) => [r.jobId, r]));
    const spacerKinds = new Set<string>();
    const rules = await rulesForCompany(company.id);
    for (const job of jobs) {
      const roof = roofByJob.get(job.id);
      if (job.status === "lead") continue;
      expect(roof, `job ${job.id} (${job.status}) has a roof`).toBeDefined();
      const doc = roof!.document as RoofDocument;
      expect(doc.planes.length).toBeGreaterThanOrEqual(3);
      for (const s of doc.stacks) spacerKinds.add(s.spacer.kind === "battens" && s.spacer.battens.counterBattens ? "counter-battens" : s.spacer.kind);
      // The stored takeoff is the engine's result for the stored roof and site.
      const out = computeTakeoff({ site: job.site, planes: doc.planes, stacks: doc.stacks, defaultStackId: doc.defaultStackId, rules });
      expect(out.ok).toBe(true);
      if (out.ok) {
        expect(roof!.takeoff).toEqual(JSON.parse(JSON.stringify(out.result)));
        expect(Number(job.squares)).toBeCloseTo(out.result.totals.squares, 2);
        // The demo geometry is clean: no planes meeting at mismatched heights.
        expect(out.result.advisories.map((a: { code: string }) => a.code)).not.toContain("shared-edge-height-mismatch");
      }
    }
    expect(spacerKinds).toEqual(new Set(["none", "battens", "counter-battens", "mesh", "dimpled"]));
    expect(jobs.filter((j) => j.status !== "lead").every((j) => roofByJob.has(j.id))).toBe(true);

    const crew = users.find((u) => u.role === "crew")!;
    const assigned = await JobCrew.count({ where: { userId: crew.id } });
    expect(assigned).toBeGreaterThan(0);
    expect(assigned).toBeLessThan(jobs.length);
  });

  it("leaves a company that already has customers alone", async () => {
    const { company, users } = await demoCompany();
    await seedDemoJobs(testSequelize(), company.id, users);
    const before = await Job.count();
    expect(await seedDemoJobs(testSequelize(), company.id, users)).toBe(false);
    expect(await Job.count()).toBe(before);
  });
});
