/**
 * `npm test`: starts a MariaDB of its own (.test-data/, port TEST_DB_PORT or 3317), recreates and
 * migrates the test database, runs the vitest projects, stops what it started, and ends with a plain
 * `N passed, N failed` line.
 *
 * Without arguments the suite runs in three phases, one after another, so the drills do not disturb each
 * other: (1) shared + client + server (server files one at a time), (2) the browser journeys, (3) the fault
 * drills alone (they stop databases and servers; they have a MariaDB of their own). A failed phase does not
 * stop the next; the totals add up every phase and the exit code is 1 when any phase failed.
 * With arguments, they go to one vitest run as they are (e.g. `npm test -- tests/shared`,
 * `npm test -- --project faults`).
 */
import { spawn } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, rmSync } from "node:fs";
import { resetTestDatabase, startTestMariaDb, testEnv } from "../tests/helpers/test-db";

interface Tally {
  passed: number;
  failed: number;
  skipped: number;
  ok: boolean;
}

const PHASES: Array<{ name: string; args: string[] }> = [
  { name: "shared, client and server", args: ["--project", "shared", "--project", "client", "--project", "server"] },
  { name: "browser journeys", args: ["--project", "browser"] },
  { name: "fault drills", args: ["--project", "faults"] },
];

/** One vitest run; its counts come from the JSON reporter's file. */
async function runVitest(args: string[], env: NodeJS.ProcessEnv, report: string): Promise<Tally> {
  rmSync(report, { force: true });
  const code = await new Promise<number>((resolve) => {
    const child = spawn(
      "node_modules/.bin/vitest",
      ["run", "--reporter=default", "--reporter=json", `--outputFile.json=${report}`, ...args],
      { stdio: "inherit", env },
    );
    child.on("exit", (c, signal) => resolve(c ?? (signal ? 1 : 0)));
  });
  const t: Tally = { passed: 0, failed: 0, skipped: 0, ok: false };
  if (existsSync(report)) {
    const r = JSON.parse(readFileSync(report, "utf8")) as {
      numPassedTests: number;
      numFailedTests: number;
      numPendingTests: number;
      numTodoTests: number;
      numFailedTestSuites: number;
    };
    t.passed = r.numPassedTests;
    t.failed = r.numFailedTests + (r.numFailedTests === 0 ? r.numFailedTestSuites : 0);
    t.skipped = r.numPendingTests + r.numTodoTests;
  } else if (code !== 0) {
    t.failed = 1;
  }
  t.ok = code === 0 && t.failed === 0;
  if (!t.ok && t.failed === 0) t.failed = 1; // vitest failed outside any test (a crashed file or setup)
  return t;
}

async function main(): Promise<number> {
  const db = await startTestMariaDb();
  const total: Tally = { passed: 0, failed: 0, skipped: 0, ok: true };
  try {
    const env = { ...process.env, ...testEnv(db) };
    await resetTestDatabase(env);
    mkdirSync(".test-data", { recursive: true });
    const report = `${process.env.TEST_DB_DIR ?? ".test-data/mariadb"}/vitest-report.json`;
    const extra = process.argv.slice(2);
    const runs = extra.length ? [{ name: "", args: extra }] : PHASES;
    for (const [i, phase] of runs.entries()) {
      if (phase.name) console.log(`\n── phase ${i + 1} of ${runs.length}: ${phase.name} ──\n`);
      const t = await runVitest(phase.args, env, report);
      if (phase.name) console.log(`\nphase ${i + 1} (${phase.name}): ${t.passed} passed, ${t.failed} failed${t.skipped ? `, ${t.skipped} skipped` : ""}`);
      total.passed += t.passed;
      total.failed += t.failed;
      total.skipped += t.skipped;
      total.ok &&= t.ok;
    }
  } finally {
    await db.stop();
  }
  console.log(`\n${total.passed} passed, ${total.failed} failed${total.skipped ? `, ${total.skipped} skipped` : ""}`);
  return total.ok ? 0 : 1;
}

main().then(
  (code) => process.exit(code),
  (err) => {
    console.error(err);
    console.log("\n0 passed, 1 failed");
    process.exit(1);
  },
);
