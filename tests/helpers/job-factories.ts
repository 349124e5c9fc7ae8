import { randomUUID } from "node:crypto";
import { gableRoof, shedRoof } from "../../shared/engine/roof/generators";
import { jobSiteSchema, type JobStatus } from "../../shared/schemas/job";
import type { RoofSaveValues } from "../../shared/schemas/roof";
import { Customer, Job, JobCrew } from "../../server/models/index";
import { RoofsService } from "../../server/services/roofs.service";
import { testSequelize } from "./db";
import { buildCompany, buildUser } from "./factories";

export interface CustomerAttrs {
  companyId: number;
  name: string;
  email: string | null;
  addressLine1: string | null;
  city: string | null;
  postalCode: string | null;
  archivedAt: Date | null;
}

/** A customer (and a company when none is given), with an invented name and address. */
export async function buildCustomer(overrides: Partial<CustomerAttrs> = {}) {
  const id = randomUUID().slice(0, 8);
  return Customer.create({
    companyId: overrides.companyId ?? (await buildCompany()).id,
    name: overrides.name ?? `Homeowner ${id}`,
    email: overrides.email === undefined ? `home-${id}@example.com` : overrides.email,
    phone: "555-0100",
    addressLine1: overrides.addressLine1 === undefined ? "12 Larkspur Lane" : overrides.addressLine1,
    addressLine2: null,
    city: overrides.city === undefined ? "Fenwick Hollow" : overrides.city,
    region: "ST",
    postalCode: overrides.postalCode === undefined ? "00010" : overrides.postalCode,
    notes: null,
    archivedAt: overrides.archivedAt ?? null,
  });
}

export interface JobAttrs {
  companyId: number;
  customerId: number;
  status: JobStatus;
  estimatorId: number | null;
  siteAddressLine1: string | null;
  siteCity: string | null;
  squares: number | null;
  quoteTotalCents: number | null;
  archivedAt: Date | null;
  updatedAt: Date;
}

/** A job (and its customer and company when not given) written straight to the table. */
export async function buildJob(overrides: Partial<JobAttrs> = {}) {
  const companyId = overrides.companyId ?? (await buildCompany()).id;
  const customerId = overrides.customerId ?? (await buildCustomer({ companyId })).id;
  const job = await Job.create({
    companyId,
    customerId,
    siteAddressLine1: overrides.siteAddressLine1 === undefined ? "12 Larkspur Lane" : overrides.siteAddressLine1,
    siteAddressLine2: null,
    siteCity: overrides.siteCity === undefined ? "Fenwick Hollow" : overrides.siteCity,
    siteRegion: "ST",
    sitePostalCode: "00010",
    status: overrides.status ?? "lead",
    estimatorId: overrides.estimatorId ?? null,
    site: jobSiteSchema.parse({ climateZone: "5A", iceDamRisk: true }),
    notes: null,
    squares: overrides.squares ?? null,
    quoteTotalCents: overrides.quoteTotalCents ?? null,
    archivedAt: overrides.archivedAt ?? null,
  });
  if (overrides.updatedAt) {
    // Set the board's "last change" directly (Sequelize would stamp now).
    await testSequelize().query("UPDATE jobs SET updated_at = ? WHERE id = ?", { replacements: [overrides.updatedAt, job.id] });
    await job.reload();
  }
  return job;
}

export async function assignCrew(jobId: number, userIds: number[]) {
  await JobCrew.bulkCreate(userIds.map((userId) => ({ jobId, userId })));
}

/**
 * A small valid roof: a 40 × 30 ft gable at 6/12 and a 12 × 8 ft porch shed at 2/12, one synthetic
 * underlayment stack with battens, one mesh stack for the porch. Planes are the generators' output.
 */
export function roofBody(version: number, overrides: Partial<RoofSaveValues> = {}): RoofSaveValues {
  const main = gableRoof(40, 30, 6, { idPrefix: "house" });
  const porch = shedRoof(12, 8, 2, { idPrefix: "porch", origin: [60, 0], stackId: "porch" });
  return {
    planes: [...main, ...porch],
    stacks: [
      {
        id: "main",
        name: "Battens over synthetic",
        underlayment: { kind: "synthetic", highTemp: true },
        spacer: { kind: "battens", battens: { nominal: "1x4", spacingIn: 24, counterBattens: false } },
      },
      { id: "porch", name: "Mesh on the porch", spacer: { kind: "mesh", thicknessIn: 0.375 } },
    ],
    defaultStackId: "main",
    version,
    ...overrides,
  };
}

/** Saves a roof through the service (as a fresh estimator of the job's company); returns the saved version. */
export async function saveRoofFor(job: Job, body: RoofSaveValues = roofBody(0)) {
  const user = await buildUser({ companyId: job.companyId, role: "estimator" });
  const actor = { id: user.id, email: user.email, name: user.name, role: user.role, companyId: user.companyId };
  const { roofSaveSchema } = await import("../../shared/schemas/roof");
  return new RoofsService(testSequelize()).save(job.id, roofSaveSchema.parse(body), actor);
}
