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
        test: {
          name: "unit",
          environment: "node",
          include: ["tests/unit/**/*.test.ts"],
          // Several unit tests decode 12 MP photos or train a small model; on a busy 2-core machine
          // vitest's 5 s default turned them into timed tests. Speed targets live in bench/.
          testTimeout: 30_000,
        },
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
