import type { CustomerDto } from "../../shared/schemas/customer";
import type { Customer } from "../models/index";

const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);

export const presentCustomer = (c: Customer): CustomerDto => ({
  id: c.id,
  name: c.name,
  email: c.email,
  phone: c.phone,
  addressLine1: c.addressLine1,
  addressLine2: c.addressLine2,
  city: c.city,
  region: c.region,
  postalCode: c.postalCode,
  notes: c.notes,
  archivedAt: iso(c.archivedAt),
  createdAt: c.createdAt.toISOString(),
  updatedAt: c.updatedAt.toISOString(),
});
