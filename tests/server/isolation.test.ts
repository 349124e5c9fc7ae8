import { beforeEach, describe, expect, it } from "vitest";
import { signedInAgent } from "../helpers/auth";
import { truncateAll, testSequelize } from "../helpers/db";
import { seedDemo, DEMO_USERS, SECOND_COMPANY_USERS } from "../../server/db/seeders/demo";
import { User } from "../../server/models/index";

beforeEach(truncateAll);

describe("company scoping with two seeded companies", () => {
  it("seeds the demo once, with three demo users and a second company", async () => {
    expect(await seedDemo(testSequelize(), { bcryptRounds: 4 })).toBe(true);
    expect(await seedDemo(testSequelize(), { bcryptRounds: 4 })).toBe(false);
    const demo = await User.findAll({ where: { email: DEMO_USERS.map((u) => u.email) } });
    expect(demo.map((u) => u.role).sort()).toEqual(["crew", "estimator", "owner"]);
    const other = await User.findOne({ where: { email: SECOND_COMPANY_USERS[0].email } });
    expect(other!.companyId).not.toBe(demo[0].companyId);
  });

  it("never shows or changes another company's users", async () => {
    await seedDemo(testSequelize(), { bcryptRounds: 4 });
    const demoOwner = (await User.findOne({ where: { email: DEMO_USERS[0].email } }))!;
    const otherOwner = (await User.findOne({ where: { email: SECOND_COMPANY_USERS[0].email } }))!;
    const { agent, token } = await signedInAgent({ role: "owner", companyId: otherOwner.companyId });
    const list = await agent.get("/api/users");
    expect(list.body.data.every((u: { companyId: number }) => u.companyId === otherOwner.companyId)).toBe(true);
    expect(list.body.data.some((u: { email: string }) => u.email === demoOwner.email)).toBe(false);
    for (const [method, path, body] of [
      ["patch", `/api/users/${demoOwner.id}`, { role: "crew" }],
      ["put", `/api/users/${demoOwner.id}/password`, { password: "taken-over-now" }],
    ] as const) {
      const res = await agent[method](path).set("X-CSRF-Token", token).send(body);
      expect(res.status).toBe(404);
    }
    const after = (await User.findByPk(demoOwner.id))!;
    expect(after.role).toBe("owner");
    expect(after.passwordHash).toBe(demoOwner.passwordHash);
  });
});
