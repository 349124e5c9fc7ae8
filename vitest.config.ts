import { defineConfig } from "vitest/config";
import react from "@vitejs/plugin-react";
import { aliases } from "./vite.config.ts";

const resolve = { alias: Object.entries(aliases).map(([find, replacement]) => ({ find, replacement })) };

export default defineConfig({
  test: {
    projects: [
      {
        resolve,
        test: { name: "shared", environment: "node", include: ["tests/shared/**/*.test.ts"] },
      },
      {
        resolve,
        test: {
          name: "server",
          environment: "node",
          include: ["tests/server/**/*.test.ts"],
          fileParallelism: false,
          globalSetup: ["tests/helpers/server-global-setup.ts"],
          setupFiles: ["tests/helpers/server-setup.ts"],
          testTimeout: 20_000,
          hookTimeout: 30_000,
        },
      },
      {
        resolve,
        test: {
          name: "browser",
          environment: "node",
          include: ["tests/browser/**/*.test.ts"],
          fileParallelism: false,
          globalSetup: ["tests/browser/global-setup.ts"],
          testTimeout: 90_000,
          hookTimeout: 180_000,
        },
      },
      {
        resolve,
        test: {
          // Fault drills: they stop MariaDB, the mail catcher and servers, so they run alone (npm test runs
          // them last, by themselves) on a MariaDB of their own (tests/faults/global-setup.ts).
          name: "faults",
          environment: "node",
          include: ["tests/faults/**/*.test.ts"],
          fileParallelism: false,
          globalSetup: ["tests/faults/global-setup.ts"],
          setupFiles: ["tests/faults/setup.ts"],
          testTimeout: 240_000,
          hookTimeout: 120_000,
        },
      },
      {
        plugins: [react()],
        resolve,
        test: {
          name: "client",
          environment: "jsdom",
          include: ["tests/client/**/*.test.{ts,tsx}"],
          setupFiles: ["tests/helpers/client-setup.ts"],
        },
      },
    ],
  },
});
