import { fileURLToPath } from "node:url";

import { defineConfig } from "vitest/config";

const root = fileURLToPath(new URL(".", import.meta.url));
const alias = { "@": root.replace(/\/$/, "") };
// Integration tests call a few server modules directly (the clock's sweep); "server-only" is
// Next's guard against client bundles and has nothing to guard in a test.
const serverAlias = { ...alias, "server-only": `${root}tests/helpers/server-only.ts` };

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        // PDF renders take a second or two here, several times that on a loaded machine.
        test: {
          name: "unit",
          include: ["tests/calc/**/*.test.ts", "tests/unit/**/*.test.ts"],
          testTimeout: 20000,
        },
      },
      {
        resolve: { alias: serverAlias },
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          fileParallelism: false,
          // The walks of the whole surface (matrix, hostile input) grow with every route.
          testTimeout: 90000,
          hookTimeout: 60000,
        },
      },
      {
        resolve: { alias },
        // App instances started and killed by the tests, the database stopped under them: run alone, after the rest.
        test: {
          name: "system",
          include: ["tests/system/**/*.test.ts"],
          fileParallelism: false,
          testTimeout: 120000,
          hookTimeout: 180000,
        },
      },
      {
        resolve: { alias },
        // Polls wait up to 10 s: a loaded CI machine answers slower than this one.
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          fileParallelism: false,
          testTimeout: 90000,
          hookTimeout: 120000,
          expect: { poll: { timeout: 10000, interval: 100 } },
        },
      },
    ],
  },
});
