import { randomUUID } from "node:crypto";
import type { Role } from "../../shared/auth/roles";
import { Company, User } from "../../server/models/index";
import { hashPassword } from "../../server/auth/password";

export const TEST_PASSWORD = "correct-horse-battery";

let hashCache: Promise<string> | null = null;
const testHash = () => (hashCache ??= hashPassword(TEST_PASSWORD, 4));

export async function buildCompany(name = `Test Roofing ${randomUUID().slice(0, 8)}`) {
  return Company.create({ name });
}

export interface UserAttrs {
  role: Role;
  companyId: number;
  email: string;
  name: string;
  active: boolean;
}

/** A user (and a company when none is given) with TEST_PASSWORD. */
export async function buildUser(overrides: Partial<UserAttrs> = {}) {
  const companyId = overrides.companyId ?? (await buildCompany()).id;
  const id = randomUUID().slice(0, 8);
  return User.create({
    companyId,
    email: overrides.email ?? `user-${id}@example.com`,
    name: overrides.name ?? `Test User ${id}`,
    role: overrides.role ?? "estimator",
    active: overrides.active ?? true,
    passwordHash: await testHash(),
  });
}
