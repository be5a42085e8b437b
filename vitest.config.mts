import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

const root = fileURLToPath(new URL(".", import.meta.url));
const alias = { "@": root.replace(/\/$/, "") };

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      { resolve: { alias }, test: { name: "unit", include: ["tests/calc/**/*.test.ts", "tests/unit/**/*.test.ts"], benchmark: { include: ["tests/bench/**/*.bench.ts"] } } },
      {
        resolve: { alias },
        test: { name: "integration", include: ["tests/integration/**/*.test.ts"], fileParallelism: false, testTimeout: 30000, hookTimeout: 60000 },
      },
      { resolve: { alias }, test: { name: "e2e", include: ["tests/e2e/**/*.test.ts"], fileParallelism: false, testTimeout: 60000, hookTimeout: 120000 } },
    ],
  },
});
