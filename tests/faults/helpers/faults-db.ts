/**
 * The fault drills' MariaDB: where it lives, the environment that points a process at it, and stopping
 * and starting it from a drill (the drills' own instance; nothing else uses it).
 */
import { spawnSync } from "node:child_process";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { startLocalMariaDb } from "../../../scripts/lib/mariadb";

export interface FaultsDb {
  /** Absolute path of the instance's folder (my.cnf, data/, run/, log/). */
  base: string;
  host: string;
  port: number;
  database: string;
  user: string;
  password: string;
}

export const faultsDbOptions = () => ({
  base: process.env.FAULTS_DB_DIR ?? ".test-data/faults",
  port: Number(process.env.FAULTS_DB_PORT ?? 3344),
  database: "ridgewright_faults",
  user: "app_faults",
});


const ADMIN = ["/usr/bin/mariadb-admin", "/usr/local/bin/mariadb-admin"].find((p) => existsSync(p)) ?? "mariadb-admin";
const cnf = (db: FaultsDb) => path.join(db.base, "my.cnf");

export const dbRunning = (db: FaultsDb) =>
  spawnSync(ADMIN, [`--defaults-file=${cnf(db)}`, "-uroot", "status"], { stdio: "ignore" }).status === 0;

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * Stops mariadbd: "shutdown" is an orderly `mariadb-admin shutdown` (open connections are killed and
 * their transactions rolled back); "kill" is SIGKILL, a crash (InnoDB recovers on the next start).
 * Resolves once nothing answers on the folder any more.
 */
export async function stopDb(db: FaultsDb, how: "shutdown" | "kill" | "freeze" = "shutdown"): Promise<void> {
  if (how === "freeze") {
    // SIGSTOP: the process is there and its port accepts connections, but nothing answers (a hung host,
    // a storage stall, a network path that drops packets). startDb sends SIGCONT.
    const pid = mariadbdPid(db);
    process.kill(pid, "SIGSTOP");
    frozen.add(db.base);
    // kill() returns once the signal is sent, not once every thread has stopped: until then a query can still be
    // answered (a drill once got a 200 in 9 ms "during" the freeze). Wait until each thread's state is stopped.
    const deadline = Date.now() + 5_000;
    while (!allThreadsStopped(pid)) {
      if (Date.now() > deadline) throw new Error("mariadbd's threads did not all stop after SIGSTOP");
      await sleep(10);
    }
    return;
  }
  if (how === "kill") {
    const pid = mariadbdPid(db);
    process.kill(pid, "SIGKILL");
    const deadline = Date.now() + 15_000;
    while (processAlive(pid)) {
      if (Date.now() > deadline) throw new Error("mariadbd did not die after SIGKILL");
      await sleep(50);
    }
  } else {
    spawnSync(ADMIN, [`--defaults-file=${cnf(db)}`, "-uroot", "shutdown"], { stdio: "ignore" });
  }
  const deadline = Date.now() + 30_000;
  while (dbRunning(db)) {
    if (Date.now() > deadline) throw new Error("mariadbd still answers 30 s after the stop");
    await sleep(100);
  }
}

const frozen = new Set<string>();

function mariadbdPid(db: FaultsDb): number {
  const pidFile = path.join(db.base, "run", "mysqld.pid");
  const pid = Number(readFileSync(pidFile, "utf8").trim());
  if (!Number.isInteger(pid) || pid <= 0) throw new Error(`no mariadbd pid in ${pidFile}`);
  return pid;
}

/** Whether every thread of the process is stopped (state T in /proc/<pid>/task/<tid>/stat, proc(5)). */
function allThreadsStopped(pid: number): boolean {
  const tasks = readdirSync(`/proc/${pid}/task`);
  return tasks.length > 0 && tasks.every((tid) => {
    let stat: string;
    try {
      stat = readFileSync(`/proc/${pid}/task/${tid}/stat`, "utf8");
    } catch {
      return true; // the thread ended meanwhile
    }
    const state = stat[stat.lastIndexOf(")") + 2]; // after "pid (comm) ", whatever the thread's name holds
    return state === "T" || state === "t";
  });
}

function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    // A zombie (exited, not yet reaped by its parent) still "exists": look at its state.
    const stat = existsSync(`/proc/${pid}/stat`) ? readFileSync(`/proc/${pid}/stat`, "utf8") : "";
    return !/\) Z /.test(stat);
  } catch {
    return false;
  }
}

/** Starts mariadbd on the folder again (or wakes a frozen one) (same port, data and password) and waits until it answers. */
export async function startDb(db: FaultsDb): Promise<void> {
  if (frozen.delete(db.base)) {
    process.kill(mariadbdPid(db), "SIGCONT");
    return;
  }
  await startLocalMariaDb({ base: db.base, port: db.port, database: db.database, user: db.user, log: () => {} });
}
