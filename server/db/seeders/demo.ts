import type { Sequelize } from "sequelize";
import { Company, User } from "../../models/index";
import { hashPassword } from "../../auth/password";
import { seedDemoPriceBook } from "./demo-price-book";
import { seedDemoJobs } from "./demo-jobs";
import { seedDemoQuotes } from "./demo-quotes";

/** Demo-only password for every demo account (shown in the README). Never used outside demo data. */
export const DEMO_PASSWORD = "ridgewright-demo";

/** An invented company in a fictional town, and a second one that proves company isolation. */
export const DEMO_COMPANY = "Quillmoor Standing Seam Co.";
export const SECOND_COMPANY = "Oxbend Roof Works";

export const DEMO_USERS = [
  { email: "owner@example.com", name: "Marta Quillmoor", role: "owner" as const },
  { email: "estimator@example.com", name: "Dev Anand-Pike", role: "estimator" as const },
  { email: "crew@example.com", name: "Tomas Ferreira-Lund", role: "crew" as const },
];

export const SECOND_COMPANY_USERS = [
  { email: "owner.oxbend@example.com", name: "Lise Oxbend", role: "owner" as const },
  { email: "estimator.oxbend@example.com", name: "Cal Brennick", role: "estimator" as const },
];

/** Seeds the demo companies and users once; returns false when they are already there. */
export async function seedDemo(sequelize: Sequelize, opts: { bcryptRounds: number }): Promise<boolean> {
  const existing = await User.findOne({ where: { email: DEMO_USERS[0].email } });
  if (existing) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD, opts.bcryptRounds);
  await sequelize.transaction(async (transaction) => {
    const demo = await Company.create({ name: DEMO_COMPANY }, { transaction });
    const second = await Company.create({ name: SECOND_COMPANY }, { transaction });
    const demoUsers = [];
    for (const u of DEMO_USERS) demoUsers.push(await User.create({ ...u, companyId: demo.id, passwordHash }, { transaction }));
    for (const u of SECOND_COMPANY_USERS) await User.create({ ...u, companyId: second.id, passwordHash }, { transaction });
    // The price book first: the demo roofs' takeoffs are computed with its rules.
    await seedDemoPriceBook(sequelize, demo.id, transaction);
    await seedDemoPriceBook(sequelize, second.id, transaction);
    await seedDemoJobs(
      sequelize,
      demo.id,
      demoUsers.map((u) => ({ id: u.id, email: u.email, name: u.name, role: u.role })),
      transaction,
    );
    await seedDemoQuotes(
      sequelize,
      demo.id,
      demoUsers.map((u) => ({ id: u.id, email: u.email, name: u.name, role: u.role })),
      transaction,
    );
  });
  return true;
}
