/**
 * Local MariaDB lifecycle for `npm start` and `npm test`: install Debian's packages when missing,
 * initialise a data folder inside the project, start mariadbd on 127.0.0.1 with its own socket,
 * create the database and the application user. No systemd is involved.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { randomBytes } from "node:crypto";
import path from "node:path";
import mariadb from "mariadb";

export interface LocalDbOptions {
  /** Folder that holds my.cnf, data/, run/ and log/ (git-ignored). */
  base: string;
  port: number;
  database: string;
  user: string;
  log?: (msg: string) => void;
}

export interface LocalDb {
  host: string;
  port: number;
  database: string;
  user: string;
  password: string;
  /** True when this call started mariadbd (false when one was already running on the folder). */
  started: boolean;
  stop(): Promise<void>;
}

const which = (cmd: string) => spawnSync("sh", ["-c", `command -v ${cmd}`], { encoding: "utf8" }).status === 0;

function findBinary(name: string): string | null {
  for (const dir of ["/usr/sbin", "/usr/bin", "/usr/local/sbin", "/usr/local/bin"]) {
    const p = path.join(dir, name);
    if (existsSync(p)) return p;
  }
  return which(name) ? name : null;
}

/** Installs the small MariaDB package set from Debian when mariadbd is missing. */
export function ensureMariaDbInstalled(log: (m: string) => void = console.log): void {
  if (findBinary("mariadbd") && findBinary("mariadb-install-db") && findBinary("mariadb-admin")) return;
  if (process.getuid?.() !== 0) {
    throw new Error(
      "MariaDB is not installed and this user is not root, so it cannot be installed automatically.\n" +
        "Install it with: sudo apt-get install -y --no-install-recommends mariadb-server-core mariadb-client-core mariadb-client\n" +
        "or point DATABASE_URL (or DB_HOST/DB_PORT/DB_USER/DB_PASSWORD/DB_NAME) at an existing MariaDB.",
    );
  }
  log("MariaDB not found: installing it from Debian's packages (apt-get, about a minute)…");
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  const run = (args: string[]) => {
    const r = spawnSync("apt-get", args, { stdio: ["ignore", "inherit", "inherit"], env });
    if (r.status !== 0) throw new Error(`apt-get ${args.join(" ")} failed with exit code ${r.status}`);
  };
  run(["update"]);
  run(["install", "-y", "--no-install-recommends", "mariadb-server-core", "mariadb-client-core", "mariadb-client"]);
}

function myCnf(base: string, port: number): string {
  return `[mariadbd]
user=root
datadir=${base}/data
socket=${base}/run/mysqld.sock
pid-file=${base}/run/mysqld.pid
log-error=${base}/log/error.log
port=${port}
bind-address=127.0.0.1
skip-name-resolve
innodb-buffer-pool-size=64M
innodb-log-file-size=16M
character-set-server=utf8mb4
collation-server=utf8mb4_unicode_ci
max-connections=300
[client]
socket=${base}/run/mysqld.sock
`;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

function adminStatus(cnf: string): boolean {
  const admin = findBinary("mariadb-admin") ?? "mariadb-admin";
  return spawnSync(admin, [`--defaults-file=${cnf}`, "-uroot", "status"], { stdio: "ignore" }).status === 0;
}

/** Starts (or reuses) a mariadbd on the folder and makes sure database and user exist. */
export async function startLocalMariaDb(opts: LocalDbOptions): Promise<LocalDb> {
  const log = opts.log ?? console.log;
  ensureMariaDbInstalled(log);
  const base = path.resolve(opts.base);
  for (const d of ["data", "run", "log"]) mkdirSync(path.join(base, d), { recursive: true });
  const cnf = path.join(base, "my.cnf");
  writeFileSync(cnf, myCnf(base, opts.port));

  let child: ChildProcess | null = null;
  let started = false;
  if (!adminStatus(cnf)) {
    if (!existsSync(path.join(base, "data", "mysql"))) {
      log(`Initialising a new MariaDB data folder in ${path.relative(process.cwd(), base) || base}…`);
      const installDb = findBinary("mariadb-install-db") ?? "mariadb-install-db";
      const r = spawnSync(
        installDb,
        [`--defaults-file=${cnf}`, "--auth-root-authentication-method=normal", "--skip-test-db"],
        { encoding: "utf8" },
      );
      if (r.status !== 0) throw new Error(`mariadb-install-db failed:\n${r.stdout}\n${r.stderr}`);
    }
    const mariadbd = findBinary("mariadbd") ?? "mariadbd";
    child = spawn(mariadbd, [`--defaults-file=${cnf}`], { stdio: "ignore", detached: false });
    child.on("error", (e) => log(`mariadbd failed to start: ${e.message}`));
    started = true;
    const deadline = Date.now() + 30_000;
    while (!adminStatus(cnf)) {
      if (child.exitCode !== null) {
        const errLog = path.join(base, "log", "error.log");
        const tail = existsSync(errLog) ? readFileSync(errLog, "utf8").split("\n").slice(-15).join("\n") : "";
        throw new Error(`mariadbd exited with code ${child.exitCode}. Last lines of its log:\n${tail}`);
      }
      if (Date.now() > deadline) throw new Error("mariadbd did not answer within 30 s");
      await sleep(100);
    }
  } else {
    log(`Reusing the MariaDB already running on ${base}.`);
  }

  const password = appPassword(base);
  const root = await mariadb.createConnection({ socketPath: path.join(base, "run", "mysqld.sock"), user: "root" });
  try {
    // install-db creates password-less root over TCP: keep root on the socket only.
    await root.query("DROP USER IF EXISTS 'root'@'127.0.0.1', 'root'@'::1'");
    await root.query(
      `CREATE DATABASE IF NOT EXISTS \`${opts.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
    );
    await root.query(`CREATE USER IF NOT EXISTS '${opts.user}'@'127.0.0.1' IDENTIFIED BY ?`, [password]);
    await root.query(`ALTER USER '${opts.user}'@'127.0.0.1' IDENTIFIED BY ?`, [password]);
    await root.query(`GRANT ALL PRIVILEGES ON \`${opts.database}\`.* TO '${opts.user}'@'127.0.0.1'`);
    // Benchmarks and tests may create sibling databases with the same prefix.
    await root.query(`GRANT ALL PRIVILEGES ON \`${opts.database}\\_%\`.* TO '${opts.user}'@'127.0.0.1'`);
    await root.query("FLUSH PRIVILEGES");
  } finally {
    await root.end();
  }

  return {
    host: "127.0.0.1",
    port: opts.port,
    database: opts.database,
    user: opts.user,
    password,
    started,
    async stop() {
      if (!started) return;
      const admin = findBinary("mariadb-admin") ?? "mariadb-admin";
      spawnSync(admin, [`--defaults-file=${cnf}`, "-uroot", "shutdown"], { stdio: "ignore" });
      if (child && child.exitCode === null) {
        await Promise.race([new Promise((r) => child!.once("exit", r)), sleep(10_000)]);
      }
    },
  };
}

/** The app user's password, generated once per data folder and kept beside it (git-ignored). */
function appPassword(base: string): string {
  const file = path.join(base, "app-password");
  if (existsSync(file)) return readFileSync(file, "utf8").trim();
  const pw = randomBytes(18).toString("base64url");
  writeFileSync(file, pw + "\n", { mode: 0o600 });
  return pw;
}
