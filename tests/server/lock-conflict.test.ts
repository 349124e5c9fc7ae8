import { describe, expect, it } from "vitest";
import { DatabaseError } from "sequelize";
import { isLockConflict, retryOnLockConflict } from "../../server/db/lock-conflict";

/** A driver error as Sequelize wraps it (the driver's own error is `parent` and `original`). */
function wrapped(errno: number): Error {
  const driver = Object.assign(new Error(`errno ${errno}`), { errno, sql: "UPDATE t SET x = 1" });
  return new DatabaseError(driver as never);
}

describe("lock conflicts (MariaDB ER_LOCK_DEADLOCK 1213, ER_LOCK_WAIT_TIMEOUT 1205)", () => {
  it("recognises a deadlock or a lock wait timeout, wrapped by Sequelize or straight from the driver", () => {
    expect(isLockConflict(wrapped(1213))).toBe(true);
    expect(isLockConflict(wrapped(1205))).toBe(true);
    expect(isLockConflict(Object.assign(new Error("raw"), { errno: 1213 }))).toBe(true);
    expect(isLockConflict(wrapped(1062))).toBe(false); // duplicate key: not a lock conflict
    expect(isLockConflict(new Error("other"))).toBe(false);
    expect(isLockConflict(undefined)).toBe(false);
  });

  it("runs the work again after a conflict and returns its result", async () => {
    let calls = 0;
    const result = await retryOnLockConflict(async () => {
      calls++;
      if (calls < 3) throw wrapped(1213);
      return "done";
    });
    expect(result).toBe("done");
    expect(calls).toBe(3);
  });

  it("gives up after the attempts allowed, and never retries another error", async () => {
    let calls = 0;
    await expect(
      retryOnLockConflict(async () => {
        calls++;
        throw wrapped(1205);
      }, 3),
    ).rejects.toThrow(/1205/);
    expect(calls).toBe(3);
    calls = 0;
    await expect(
      retryOnLockConflict(async () => {
        calls++;
        throw wrapped(1062);
      }),
    ).rejects.toThrow(/1062/);
    expect(calls).toBe(1);
  });
});
