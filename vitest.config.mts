import path from "node:path";
import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { alias: { "@": path.resolve(import.meta.dirname) } },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: "unit",
          include: ["tests/solver/**/*.test.ts", "tests/unit/**/*.test.ts"],
          environment: "node",
          // Some tests start the built command in a fresh process or run property checks; on a
          // loaded two-core machine they take several seconds. Speed goals live in `npm run bench`.
          testTimeout: 30000,
        },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          // Point lib/db at phasewright_test and migrate it (see tests/integration/setup.ts).
          setupFiles: ["tests/integration/env.ts"],
          globalSetup: ["tests/integration/global-setup.ts"],
          fileParallelism: false,
          testTimeout: 30000,
          hookTimeout: 60000,
        },
      },
      {
        extends: true,
        test: {
          name: "browser",
          include: ["tests/browser/**/*.test.ts"],
          environment: "node",
          fileParallelism: false,
          testTimeout: 90000,
          hookTimeout: 180000,
          // A page step (fetch + server refresh) can take seconds on a busy CI machine; the
          // default 1 s of expect.poll made the review walk flaky there.
          expect: { poll: { timeout: 15000, interval: 100 } },
        },
      },
    ],
  },
});
