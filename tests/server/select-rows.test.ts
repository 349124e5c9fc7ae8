import { beforeEach, describe, expect, it } from "vitest";
import { DatabaseError } from "sequelize";
import { selectRows } from "../../server/db/sql";
import { testSequelize, truncateAll } from "../helpers/db";
import { buildCompany } from "../helpers/factories";
import { buildCustomer } from "../helpers/job-factories";

beforeEach(truncateAll);

describe("selectRows (reads through the MariaDB driver on Sequelize's pool)", () => {
  it("answers rows as objects, or as arrays in SELECT order, decoded by the driver", async () => {
    const db = testSequelize();
    const company = await buildCompany();
    const a = await buildCustomer({ companyId: company.id, name: "Aster Quill" });
    const b = await buildCustomer({ companyId: company.id, name: "Birch Quill" });
    const sql = "SELECT id, name, COUNT(*) OVER () AS n FROM customers WHERE company_id = ? ORDER BY name";
    expect([...(await selectRows(db, sql, [company.id]))]).toEqual([
      { id: a.id, name: "Aster Quill", n: 2 },
      { id: b.id, name: "Birch Quill", n: 2 },
    ]);
    const arrays = await selectRows<[number, string, number | bigint]>(db, sql, [company.id], { rowsAsArray: true });
    expect(arrays.map(([id, name, n]) => [id, name, Number(n)])).toEqual([
      [a.id, "Aster Quill", 2],
      [b.id, "Birch Quill", 2],
    ]);
  });

  it("sends each value as a value, never as SQL (quotes, backslashes and LIKE characters in text)", async () => {
    const db = testSequelize();
    const company = await buildCompany();
    const tricky = await buildCustomer({ companyId: company.id, name: "O'Hare \\ 100% _x" });
    await buildCustomer({ companyId: company.id, name: "Plain" });
    const rows = await selectRows<{ id: number }>(db, "SELECT id FROM customers WHERE company_id = ? AND name = ?", [company.id, "O'Hare \\ 100% _x"]);
    expect([...rows]).toEqual([{ id: tricky.id }]);
    const injected = await selectRows(db, "SELECT id FROM customers WHERE name = ?", ["x' OR '1'='1"]);
    expect(injected).toHaveLength(0);
  });

  it("turns a driver error into Sequelize's error, as sequelize.query does", async () => {
    const err = await selectRows(testSequelize(), "SELECT no_such_column FROM customers", []).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(DatabaseError);
    expect((err as DatabaseError).message).toMatch(/no_such_column/);
    expect((err as DatabaseError & { sql?: string }).sql).toBe("SELECT no_such_column FROM customers");
  });

  it("gives every connection back to the pool, after an answer and after an error", async () => {
    const db = testSequelize();
    const max = (db as unknown as { connectionManager: { pool: { maxSize: number } } }).connectionManager.pool.maxSize;
    // Twice the pool's size, one after another: a connection kept back would leave the last ones waiting for
    // the pool's acquire timeout instead of answering.
    for (let i = 0; i < max * 2; i++) {
      await selectRows(db, "SELECT ? AS i", [i]);
      await selectRows(db, "SELECT broken(", []).catch(() => undefined);
    }
    expect([...(await selectRows(db, "SELECT 1 AS one", []))]).toEqual([{ one: 1 }]);
  });
});
