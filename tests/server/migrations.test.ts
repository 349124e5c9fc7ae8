import { describe, expect, it } from "vitest";
import { readdirSync } from "node:fs";
import { testSequelize } from "../helpers/db";
import { createMigrator } from "../../server/db/migrator";
import { migrations } from "../../server/db/migrations/index";

describe("migrations", () => {
  it("lists every file in server/db/migrations, in order", () => {
    const files = readdirSync("server/db/migrations")
      .filter((f) => /^\d{14}-.+\.ts$/.test(f))
      .map((f) => f.replace(/\.ts$/, ""))
      .sort();
    expect(migrations.map((m) => m.name)).toEqual(files);
  });

  it("goes down all the way and up again", async () => {
    const migrator = createMigrator(testSequelize());
    await migrator.down({ to: 0 });
    const [tables] = await testSequelize().query(
      "SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name <> 'schema_migrations'",
    );
    expect(tables).toEqual([]);
    const applied = await migrator.up();
    expect(applied.map((m) => m.name)).toEqual(migrations.map((m) => m.name));
    expect(await migrator.pending()).toEqual([]);
  });
});
