/**
 * `npm test`: lint and typecheck, then unit tests, then integration and browser tests against
 * real services — PostgreSQL (fresh database), s3rver and the mail inbox on their own test ports
 * and folders — and a production build served by scripts/serve.ts. Exits non-zero on any failure.
 *   --only unit|integration|e2e   run one layer (integration/e2e still start the services)
 *   --coverage                    unit tests with coverage of lib/ and its thresholds (vitest.config.ts);
 *                                 `npm run check` is this whole run with --coverage, each step once
 */
import fs from "node:fs";
import { buildIfStale } from "./lib/build";
import { playwrightFailures, vitestFailures } from "./lib/failures";
import { ensureChromium } from "./lib/debian";
import { killTree, run, start, tsxArgs, waitForExit, webServerArgs } from "./lib/children";
import { isPortFree, portTakenMessage, waitFor } from "./lib/ports";
import { startServices, type Services } from "./lib/services";
import { startTestControls, type TestControls } from "./lib/test-control";
import { appEnvironment, testDistDir, testSettings } from "./lib/settings";

const onlyIndex = process.argv.indexOf("--only");
const only = onlyIndex > 0 ? process.argv[onlyIndex + 1] : undefined;
if (only && !["unit", "integration", "e2e"].includes(only)) {
  console.error(`Unknown layer "${only}"; use unit, integration or e2e.`);
  process.exit(2);
}
const wants = (layer: string) => !only || only === layer;
const coverage = process.argv.includes("--coverage");
// With --only, further arguments go to the runner: `npm run test:integration -- tests/integration/queue-api.test.ts`.
const passThrough = only ? process.argv.slice(onlyIndex + 2).filter((arg) => arg !== "--coverage") : [];
const failures: string[] = [];
const failedTests: string[] = [];
const timings: string[] = [];

async function step(name: string, fn: () => Promise<void>, failedTestsOf?: () => string[]) {
  const t0 = Date.now();
  console.log(`\n━━ ${name} ━━`);
  try {
    await fn();
  } catch (err) {
    failures.push(name);
    console.error(`✗ ${name}: ${err instanceof Error ? err.message.split("\n")[0] : err}`);
    if (failedTestsOf) failedTests.push(...failedTestsOf().map((line) => `${name}: ${line}`));
  }
  timings.push(`${name}: ${((Date.now() - t0) / 1000).toFixed(1)} s`);
}

const bin = (name: string) => `node_modules/.bin/${name}`;
/** The usual console output plus a JSON report the summary reads the failed tests from (an old one is removed first, so it is never read by mistake). */
function vitestReportArgs(reportFile: string) {
  fs.rmSync(reportFile, { force: true });
  return ["--reporter=default", "--reporter=json", `--outputFile.json=${reportFile}`];
}

async function main() {
  const t0 = Date.now();
  if (!only) {
    await step("lint", () => run(bin("eslint"), ["--max-warnings", "0", "."], { label: "lint" }));
    await step("typecheck", () => run("npm", ["run", "--silent", "typecheck"], { label: "typecheck" }));
  }
  if (wants("unit")) {
    const report = `${testSettings().dataDir}/unit-report.json`;
    const args = ["run", "--project", "unit", ...(coverage ? ["--coverage"] : []), ...vitestReportArgs(report)];
    await step(
      coverage ? "unit tests with coverage" : "unit tests",
      () => run(bin("vitest"), args, { label: "unit" }),
      () => vitestFailures(report),
    );
  }

  if (wants("integration") || wants("e2e")) {
    if (wants("e2e")) ensureChromium();
    const settings = testSettings();
    if (!(await isPortFree(settings.app.port))) throw new Error(portTakenMessage(settings.app.port, "the test web server", "TEST_APP_PORT"));
    // Every run starts from nothing: a fresh database, an empty object store and inbox.
    fs.rmSync(settings.s3.dir, { recursive: true, force: true });
    fs.rmSync(settings.smtp.inboxDir, { recursive: true, force: true });
    const env = {
      ...appEnvironment(settings, "test-secret-not-for-production-0123456789"),
      TEST_BASE_URL: settings.app.url,
      TEST_OUTPUT_DIR: `${settings.dataDir}/playwright`,
      NODE_ENV: "production",
      // Short backoff so the store-outage test's retries come within seconds (app and worker agree).
      PHOTO_JOB_RETRY_DELAY_SECONDS: "1",
      // The same for mail the inbox did not take while it was down (mail-outage test).
      MAIL_RETRY_DELAY_SECONDS: "1",
      // Evidence packs over 1 MB (not the 10 MB default) go behind an evidence link, so the
      // link test passes the limit with three photos; the other evidence tests stay well under it.
      EVIDENCE_ATTACHMENT_LIMIT_BYTES: "1000000",
      // A killed worker's jobs come back within seconds (worker-fault test), not minutes.
      PHOTO_JOB_EXPIRE_SECONDS: "30",
      MEASURE_JOB_EXPIRE_SECONDS: "30",
      JOB_MAINTENANCE_SECONDS: "2",
      // The tests play the reverse proxy: X-Forwarded-For names the client they act as, so
      // per-address limits in one test never spill into another (the default of 0 hops, the
      // socket's address, is tested with servers of its own in two-instances.test.ts).
      TRUSTED_PROXY_HOPS: "1",
    };
    let services: Services | null = null;
    let app: ReturnType<typeof start> | null = null;
    let controls: TestControls | null = null;
    const stopAll = async () => {
      if (app) killTree(app);
      if (app) await waitForExit(app, 10_000);
      await controls?.close();
      await services?.stop();
    };
    process.on("SIGINT", () => void stopAll().then(() => process.exit(130)));
    try {
      console.log("\n━━ services ━━");
      services = await startServices(settings, { freshDatabase: true, localS3: false });
      fs.mkdirSync(settings.dataDir, { recursive: true });
      fs.writeFileSync(`${settings.dataDir}/worker.log`, "");
      const [node, seedArgs] = tsxArgs("db/seed.ts");
      // The seed stores demo photos, so the object store must be up first (it starts with the controls).
      controls = await startTestControls({ settings, env, postgres: services.pg, mail: services.mail });
      await run(node, seedArgs, { env, label: "seed" });
      await controls.startWorker();
      await buildIfStale({ distDir: testDistDir(), env: { ...env, NODE_ENV: "production" } });
      const [webNode, webArgs] = webServerArgs({ port: settings.app.port });
      app = start(webNode, webArgs, {
        env: { ...env, NEXT_DIST_DIR: testDistDir(), PORT: String(settings.app.port), HOST: "127.0.0.1" },
        label: "next",
        logFile: `${settings.dataDir}/web.log`,
      });
      await waitFor(async () => (await fetch(`${settings.app.url}/api/health`)).ok, { timeoutMs: 60_000, what: "The test web server" });
      const testEnv = { ...env, NODE_ENV: "test", TEST_CONTROL_URL: controls.url, TEST_DATA_DIR: settings.dataDir, TEST_DIST_DIR: testDistDir() };
      const integrationReport = `${settings.dataDir}/integration-report.json`;
      const e2eReport = `${settings.dataDir}/e2e-report.json`;
      if (wants("integration")) {
        const args = ["run", "--project", "integration", ...vitestReportArgs(integrationReport), ...passThrough];
        await step(
          "integration tests",
          () => run(bin("vitest"), args, { env: testEnv, label: "integration" }),
          () => vitestFailures(integrationReport),
        );
      }
      if (wants("e2e")) {
        fs.rmSync(e2eReport, { force: true });
        const env = { ...testEnv, TEST_E2E_REPORT: e2eReport };
        await step(
          "browser tests",
          () => run(bin("playwright"), ["test", ...passThrough], { env, label: "e2e" }),
          () => playwrightFailures(e2eReport),
        );
      }
    } catch (err) {
      failures.push("test services");
      console.error(err instanceof Error ? err.message : err);
    } finally {
      await stopAll();
    }
  }

  console.log(`\n━━ summary (${((Date.now() - t0) / 1000).toFixed(0)} s) ━━\n${timings.join("\n")}`);
  if (failures.length) {
    if (failedTests.length) console.error(`\nFailed tests:\n${failedTests.map((line) => `  ${line}`).join("\n")}`);
    console.error(`\nFAILED: ${failures.join(", ")}`);
    process.exit(1);
  }
  console.log("\nAll checks passed.");
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
