import type { TeamMemberDto, UserDto } from "@shared/schemas/auth";
import type { CustomerDto } from "@shared/schemas/customer";
import type { JobDto, JobListItem } from "@shared/schemas/job";
import { jobSiteSchema } from "@shared/schemas/job";

/** Made-up people and places for the client tests (demo e-mails at example.com). */
export const owner: UserDto = { id: 1, email: "owner@example.com", name: "Dana Example", role: "owner", companyId: 1 };
export const estimator: UserDto = { id: 2, email: "estimator@example.com", name: "Robin Sample", role: "estimator", companyId: 1 };
export const crew: UserDto = { id: 3, email: "crew@example.com", name: "Kit Sample", role: "crew", companyId: 1 };

export const member = (u: UserDto, extra: Partial<TeamMemberDto> = {}): TeamMemberDto => ({
  ...u,
  active: true,
  createdAt: "2026-01-02T10:00:00.000Z",
  lastLoginAt: null,
  ...extra,
});
export const team = [member(owner), member(estimator), member(crew)];

export function listItem(id: number, extra: Partial<JobListItem> = {}): JobListItem {
  return {
    id,
    status: "estimating",
    customerId: 100 + id,
    customer: { id: 100 + id, name: `Customer ${id}` },
    siteAddressLine1: `${id} Quarry Lane`,
    siteCity: "Millbrook",
    estimatorId: estimator.id,
    estimator: { id: estimator.id, name: estimator.name },
    squares: 20 + id / 10,
    quoteTotalCents: 1_845_000 + id,
    archivedAt: null,
    createdAt: "2026-11-01T10:00:00.000Z",
    updatedAt: "2026-11-20T10:00:00.000Z",
    ...extra,
  };
}

export function jobDetail(id: number, extra: Partial<JobDto> = {}): JobDto {
  return {
    id,
    status: "estimating",
    customerId: 100 + id,
    customer: { id: 100 + id, name: `Customer ${id}`, email: `customer${id}@example.com`, phone: "555-0100" },
    siteAddressLine1: `${id} Quarry Lane`,
    siteAddressLine2: null,
    siteCity: "Millbrook",
    siteRegion: "Eastshire",
    sitePostalCode: "00012",
    site: jobSiteSchema.parse({ climateZone: "5A" }),
    notes: null,
    estimatorId: estimator.id,
    estimator: { id: estimator.id, name: estimator.name },
    crew: [],
    squares: 24.6,
    quoteTotalCents: 1_845_000,
    archivedAt: null,
    createdAt: "2026-11-01T10:00:00.000Z",
    updatedAt: "2026-11-20T10:00:00.000Z",
    ...extra,
  };
}

export function customer(id: number, extra: Partial<CustomerDto> = {}): CustomerDto {
  return {
    id,
    name: `Customer ${id}`,
    email: `customer${id}@example.com`,
    phone: "555-0100",
    addressLine1: `${id} Quarry Lane`,
    addressLine2: null,
    city: "Millbrook",
    region: "Eastshire",
    postalCode: "00012",
    notes: null,
    archivedAt: null,
    createdAt: "2026-11-01T10:00:00.000Z",
    updatedAt: "2026-11-20T10:00:00.000Z",
    ...extra,
  };
}

export const page = <T>(data: T[], meta: Partial<{ page: number; pageSize: number; total: number }> = {}) => ({
  data,
  meta: { page: 1, pageSize: 25, total: data.length, ...meta },
});
