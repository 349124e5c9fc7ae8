/**
 * The real server (startServer, as `npm start` runs it, demo seed included) in a child process of its own,
 * on the drills' database: the child is the server itself, so a signal sent to it reaches the server.
 */
import { startServerProcess as startChild, type ServerProcess } from "../../helpers/server-process";
import { type FaultsDb } from "./faults-db";
import { testEnv } from "../../helpers/test-db";

export type { ServerProcess };

export function startServerProcess(db: FaultsDb, env: Record<string, string> = {}): Promise<ServerProcess> {
  return startChild({
    ...testEnv(db),
    PORT: "0",
    HOST: "127.0.0.1",
    LOG_LEVEL: "warn",
    MAIL_CATCHER_PORT: "0",
    MAIL_CATCHER_DIR: "",
    PAYMENT_FAKE_PORT: "0",
    STORAGE_DIR: ".test-data/faults/storage",
    RW_SEED_DEMO: "1",
    ...env,
  });
}
