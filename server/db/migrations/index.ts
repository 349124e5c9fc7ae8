import type { QueryInterface } from "sequelize";
import * as m1 from "./20261201000001-create-companies";
import * as m2 from "./20261201000002-create-users";
import * as m3 from "./20261201000003-create-sessions";
import * as m4 from "./20261201000004-create-audit-events";

interface Migration {
  name: string;
  up(qi: QueryInterface): Promise<void>;
  down(qi: QueryInterface): Promise<void>;
}

/** Every migration, in order. A new migration file is added here too (a test checks the folder). */
export const migrations: Migration[] = [
  { name: "20261201000001-create-companies", ...m1 },
  { name: "20261201000002-create-users", ...m2 },
  { name: "20261201000003-create-sessions", ...m3 },
  { name: "20261201000004-create-audit-events", ...m4 },
];
