import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

const emptyModule = fileURLToPath(new URL("./tests/support/empty-module.ts", import.meta.url));

// Three layers, one command: unit (pure code), integration (route handlers and queries on a temp
// SQLite file), e2e (the built app in Debian's chromium). `npm test` runs all three.
export default defineConfig({
  resolve: {
    tsconfigPaths: true,
    // "server-only" throws outside the React server bundle; tests import server modules directly.
    alias: { "server-only": emptyModule },
  },
  test: {
    projects: [
      {
        extends: true,
        test: { name: "unit", include: ["tests/unit/**/*.test.ts"], environment: "node" },
      },
      {
        extends: true,
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/e2e/global-setup.ts"],
          testTimeout: 120_000,
          hookTimeout: 300_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
