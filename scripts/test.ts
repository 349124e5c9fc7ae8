/**
 * `npm test`: starts a MariaDB of its own (.test-data/, port TEST_DB_PORT or 3317), recreates and
 * migrates the test database, runs every vitest project, stops what it started, and ends with a
 * plain `N passed, N failed` line. Extra arguments go to vitest (e.g. `npm test -- tests/shared`).
 */
import { spawn } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, rmSync } from "node:fs";
import { resetTestDatabase, startTestMariaDb, testEnv } from "../tests/helpers/test-db";

async function main(): Promise<number> {
  const db = await startTestMariaDb();
  let passed = 0;
  let failed = 0;
  let skipped = 0;
  let exitCode = 1;
  try {
    const env = { ...process.env, ...testEnv(db) };
    await resetTestDatabase(env);
    mkdirSync(".test-data", { recursive: true });
    const report = `${process.env.TEST_DB_DIR ?? ".test-data/mariadb"}/vitest-report.json`;
    rmSync(report, { force: true });
    const code = await new Promise<number>((resolve) => {
      const child = spawn(
        "node_modules/.bin/vitest",
        ["run", "--reporter=default", "--reporter=json", `--outputFile.json=${report}`, ...process.argv.slice(2)],
        { stdio: "inherit", env },
      );
      child.on("exit", (c, signal) => resolve(c ?? (signal ? 1 : 0)));
    });
    if (existsSync(report)) {
      const r = JSON.parse(readFileSync(report, "utf8")) as {
        numPassedTests: number;
        numFailedTests: number;
        numPendingTests: number;
        numTodoTests: number;
        numFailedTestSuites: number;
      };
      passed = r.numPassedTests;
      failed = r.numFailedTests + (r.numFailedTests === 0 ? r.numFailedTestSuites : 0);
      skipped = r.numPendingTests + r.numTodoTests;
    } else if (code !== 0) {
      failed = 1;
    }
    exitCode = code !== 0 || failed > 0 ? 1 : 0;
    if (exitCode !== 0 && failed === 0) failed = 1; // vitest failed outside any test (a crashed file or setup)
  } finally {
    await db.stop();
  }
  console.log(`\n${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}`);
  return exitCode;
}

main().then(
  (code) => process.exit(code),
  (err) => {
    console.error(err);
    console.log("\n0 passed, 1 failed");
    process.exit(1);
  },
);
