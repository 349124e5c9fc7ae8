import { afterAll } from "vitest";
import { closeTestSequelize, testSequelize } from "./db";
import { stopTestStores } from "./app";

testSequelize();

afterAll(async () => {
  stopTestStores();
  await closeTestSequelize();
});
