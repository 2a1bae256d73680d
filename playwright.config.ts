import { defineConfig, devices } from "@playwright/test";

// The test script (scripts/test.ts) starts the production build and the services and passes the
// URL; Playwright never downloads a browser — it drives Debian's Chromium.
const baseURL = process.env.TEST_BASE_URL ?? "http://127.0.0.1:3100";

export default defineConfig({
  testDir: "tests/e2e",
  testMatch: "**/*.spec.ts",
  fullyParallel: false,
  workers: process.env.CI ? 1 : 2,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  // scripts/test.ts also asks for a JSON report, to name the failed tests in its closing summary.
  reporter: process.env.TEST_E2E_REPORT ? [["list"], ["json", { outputFile: process.env.TEST_E2E_REPORT }]] : [["list"]],
  outputDir: process.env.TEST_OUTPUT_DIR ?? ".data/test/playwright",
  use: {
    baseURL,
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
    launchOptions: {
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    },
  },
  projects: [{ name: "chromium", use: { ...devices["Desktop Chrome"] } }],
});
