import { describe, expect, it } from "vitest";
import { hashPassword, verifyPassword } from "../../server/auth/password";

describe("password hashing", () => {
  it("stores a salted bcrypt hash that verifies only the right password", async () => {
    const a = await hashPassword("correct-horse-battery", 4);
    const b = await hashPassword("correct-horse-battery", 4);
    expect(a).toMatch(/^\$2[aby]\$04\$/);
    expect(a).not.toBe(b); // a fresh salt each time
    expect(a).not.toContain("correct-horse-battery");
    expect(await verifyPassword("correct-horse-battery", a)).toBe(true);
    expect(await verifyPassword("correct-horse-batterY", a)).toBe(false);
  });
});
