import { canSeePricing, type Role } from "../../shared/auth/roles";
import type { JobDto, JobListItem } from "../../shared/schemas/job";
import type { Job, User } from "../models/index";
import type { JobListRow } from "../services/jobs.service";

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);
const num = (v: string | number | bigint | null | undefined) => (v === null || v === undefined ? null : Number(v));
const person = (u: User | null | undefined) => (u ? { id: u.id, name: u.name } : null);
/** MariaDB hands JSON back parsed; older servers send text. */
const json = <T>(v: unknown): T => (typeof v === "string" ? (JSON.parse(v) as T) : (v as T));

/**
 * The price keys exist only for roles that see prices: for crew the key is left out, not nulled. Added to the
 * presenter's own new object (last, as a spread would put it) rather than copying it: a board page makes 50.
 */
function withPrices<T extends object>(dto: T, quoteTotalCents: number | null, role: Role): T & { quoteTotalCents?: number | null } {
  if (canSeePricing(role)) (dto as T & { quoteTotalCents?: number | null }).quoteTotalCents = quoteTotalCents;
  return dto;
}

/** A job with its customer, estimator and crew loaded (JobsService.getDetail). */
export function presentJob(job: Job, role: Role): JobDto {
  const c = job.customer;
  const dto = {
    id: job.id,
    status: job.status,
    customerId: job.customerId,
    customer: c
      ? { id: c.id, name: c.name, email: c.email, phone: c.phone }
      : { id: job.customerId, name: "", email: null, phone: null },
    siteAddressLine1: job.siteAddressLine1,
    siteAddressLine2: job.siteAddressLine2,
    siteCity: job.siteCity,
    siteRegion: job.siteRegion,
    sitePostalCode: job.sitePostalCode,
    site: json<JobDto["site"]>(job.site),
    notes: job.notes,
    estimatorId: job.estimatorId,
    estimator: person(job.estimator),
    crew: (job.crew ?? []).map((u) => ({ id: u.id, name: u.name })).sort((a, b) => a.name.localeCompare(b.name)),
    squares: num(job.squares),
    proposal: job.proposalProgress ?? null,
    archivedAt: iso(job.archivedAt),
    createdAt: job.createdAt.toISOString(),
    updatedAt: job.updatedAt.toISOString(),
  };
  return withPrices(dto, num(job.quoteTotalCents), role);
}

/** A row of the jobs board (JobsService.list; times already ISO text). */
export function presentJobListItem(job: JobListRow, role: Role): JobListItem {
  const dto = {
    id: job.id,
    status: job.status,
    customerId: job.customerId,
    customer: { id: job.customerId, name: job.customerName },
    siteAddressLine1: job.siteAddressLine1,
    siteCity: job.siteCity,
    estimatorId: job.estimatorId,
    estimator: job.estimatorId !== null && job.estimatorName !== null ? { id: job.estimatorId, name: job.estimatorName } : null,
    squares: job.squares,
    proposal: job.proposalProgress,
    archivedAt: job.archivedAt,
    createdAt: job.createdAt,
    updatedAt: job.updatedAt,
  };
  return withPrices(dto, job.quoteTotalCents, role);
}

export { json as parseJsonColumn };
