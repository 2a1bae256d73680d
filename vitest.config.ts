import { defineConfig } from "vitest/config";
import { fileURLToPath } from "node:url";

const emptyModule = fileURLToPath(new URL("./tests/support/empty-module.ts", import.meta.url));

export default defineConfig({
  resolve: {
    tsconfigPaths: true,
    // "server-only" throws outside the react-server condition; tests run server code directly.
    alias: { "server-only": emptyModule },
  },
  test: {
    projects: [
      {
        extends: true,
        test: { name: "unit", environment: "node", include: ["tests/unit/**/*.test.ts"] },
      },
      {
        extends: true,
        test: {
          name: "integration",
          environment: "node",
          include: ["tests/integration/**/*.test.ts"],
          // One database for the whole run; files run one after another so fixtures never race.
          fileParallelism: false,
          testTimeout: 60_000,
          // The queue test runs 50 concurrent claimers against PostgreSQL.
          env: { DATABASE_POOL_MAX: "60" },
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
