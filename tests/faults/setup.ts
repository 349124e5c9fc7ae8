/**
 * Runs in each drill's test process before the file: points process.env (of this process only) at the
 * drills' own database, so the shared test helpers (testSequelize, factories) use it.
 */
import { afterAll, inject } from "vitest";
import { closeTestSequelize, testSequelize } from "../helpers/db";
import { stopTestStores } from "../helpers/app";
import { testEnv } from "../helpers/test-db";

Object.assign(process.env, testEnv(inject("faultsDb")));
testSequelize(); // initialises the models on that database

afterAll(async () => {
  stopTestStores();
  await closeTestSequelize();
});
