import { defineConfig, globalIgnores } from "eslint/config";
import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

/**
 * Where data access may live (DEVELOPERS.md, "Data access"): SQL — Drizzle builders, `sql`,
 * db().select/insert/update/delete/execute, raw pg queries — only under db/. Everything else
 * calls db/queries functions and opens transactions with db/client's `transaction()`; types may
 * be imported anywhere. db/ in turn uses lib/ only for types, so a query never makes a domain
 * decision. Tests, scripts and benchmarks may use the database directly (fixtures, harnesses);
 * the demo seed (db/seed) uses lib/ to build its scenario the way the app would.
 */
const DATA_ACCESS_ONLY_IN_DB = "SQL lives in db/ (db/queries/*): call a query function there, or open a transaction with `transaction` from @/db/client. Type-only imports are fine.";
const outsideDb = [
  "error",
  {
    paths: [
      { name: "drizzle-orm", allowTypeImports: true, message: DATA_ACCESS_ONLY_IN_DB },
      { name: "@/db/schema", allowTypeImports: true, message: DATA_ACCESS_ONLY_IN_DB },
      { name: "@/db/client", importNames: ["db", "pool", "executePrepared"], message: DATA_ACCESS_ONLY_IN_DB },
      { name: "pg", allowTypeImports: true, message: DATA_ACCESS_ONLY_IN_DB },
    ],
    patterns: [{ group: ["drizzle-orm/*", "@/db/schema/*"], allowTypeImports: true, message: DATA_ACCESS_ONLY_IN_DB }],
  },
];
const dbUsesLibTypesOnly = [
  "error",
  {
    patterns: [
      {
        group: ["@/lib/*", "@/lib/**"],
        allowTypeImports: true,
        message: "db/ imports lib/ only with `import type`: decisions (which status follows, who may) are made in lib/ and passed in as values.",
      },
    ],
  },
];

export default defineConfig([
  ...nextVitals,
  ...nextTs,
  globalIgnores([".next/**", ".next-test/**", ".data/**", "node_modules/**", "next-env.d.ts", "test-results/**", "playwright-report/**", "coverage/**"]),
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      // The React Compiler is not enabled, so this advisory about TanStack Table does not apply.
      "react-hooks/incompatible-library": "off",
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports" }],
    },
  },
  {
    files: ["app/**", "components/**", "lib/**", "proxy.ts", "instrumentation*.ts"],
    rules: { "@typescript-eslint/no-restricted-imports": outsideDb },
  },
  {
    // Benchmarks and the shared support/ folder (PRNG, synthetic photos, exact areas) never reach
    // into tests/: what both need lives in support/ (DEVELOPERS.md, "Tests").
    files: ["bench/**", "support/**"],
    rules: {
      "no-restricted-imports": ["error", { patterns: [{ regex: "^(@/|(\\.\\.?/)+)tests(/|$)", message: "bench/ and support/ do not import tests/: move what both need to support/." }] }],
    },
  },
  {
    files: ["db/**"],
    ignores: ["db/seed/**", "db/seed.ts"],
    rules: { "@typescript-eslint/no-restricted-imports": dbUsesLibTypesOnly },
  },
]);
