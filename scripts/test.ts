/**
 * `npm test`: lint and typecheck, then unit tests, then integration and browser tests against
 * real services — PostgreSQL (fresh database), s3rver and the mail inbox on their own test ports
 * and folders — and a production build served by `next start`. Exits non-zero on any failure.
 *   --only unit|integration|e2e   run one layer (integration/e2e still start the services)
 *   --coverage                    unit tests with coverage of lib/ and its thresholds (vitest.config.ts);
 *                                 `npm run check` is this whole run with --coverage, each step once
 */
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import http from "node:http";
import path from "node:path";
import { buildIfStale } from "./lib/build";
import { ensureChromium } from "./lib/debian";
import { killTree, run, start, tsxArgs, waitForExit } from "./lib/children";
import { isPortFree, portTakenMessage, waitFor } from "./lib/ports";
import S3rver from "s3rver";
import { corsXml } from "./lib/local-s3";
import { startServices, type Services } from "./lib/services";
import { appEnvironment, projectRoot, testDistDir, testSettings, type ServiceSettings } from "./lib/settings";

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
const timings: string[] = [];

async function step(name: string, fn: () => Promise<void>) {
  const t0 = Date.now();
  console.log(`\n━━ ${name} ━━`);
  try {
    await fn();
  } catch (err) {
    failures.push(name);
    console.error(`✗ ${name}: ${err instanceof Error ? err.message.split("\n")[0] : err}`);
  }
  timings.push(`${name}: ${((Date.now() - t0) / 1000).toFixed(1)} s`);
}

const bin = (name: string) => `node_modules/.bin/${name}`;

/** The photo worker, as `npm start` runs it, logging to <dataDir>/worker.log. */
function startWorker(env: Record<string, string>, dataDir: string): ChildProcess {
  fs.mkdirSync(dataDir, { recursive: true });
  const log = fs.openSync(path.join(dataDir, "worker.log"), "w");
  const [node, args] = tsxArgs("lib/jobs/worker.ts");
  const worker = spawn(node, args, { cwd: projectRoot, env: { ...process.env, ...env, MALLOC_ARENA_MAX: "2" }, stdio: ["ignore", log, log], detached: true });
  fs.closeSync(log);
  return worker;
}

/**
 * The test object store, owned here (not by startServices) so the store-outage integration test
 * can take it down the hard way: POST /s3/stop drops every open connection and stops s3rver —
 * as a crash or network cut would; s3rver's own close() lets busy keep-alive connections carry
 * on — and POST /s3/start starts it again on the same port and folder, its data kept.
 */
async function startTestS3(s: ServiceSettings) {
  if (!(await isPortFree(s.s3.port))) throw new Error(portTakenMessage(s.s3.port, "the test S3 store", "TEST_S3_PORT"));
  const origins = [s.app.url, s.app.url.replace("127.0.0.1", "localhost")];
  fs.mkdirSync(s.s3.dir, { recursive: true });
  let server: S3rver | null = null;
  const up = async () => {
    if (server) return;
    const next = new S3rver({ address: "127.0.0.1", port: s.s3.port, directory: s.s3.dir, silent: true, configureBuckets: [{ name: s.s3.bucket, configs: [corsXml(origins)] }] });
    await next.run();
    server = next;
  };
  const down = async () => {
    const running = server;
    server = null;
    if (!running) return;
    const closed = running.close();
    (running as unknown as { httpServer: http.Server }).httpServer.closeAllConnections();
    await closed;
  };
  await up();
  const control = http.createServer((req, res) => {
    const action = req.method === "POST" && req.url === "/s3/stop" ? down : req.method === "POST" && req.url === "/s3/start" ? up : null;
    if (!action) return void res.writeHead(404).end();
    action().then(
      () => res.writeHead(204).end(),
      (err) => res.writeHead(500).end(String(err)),
    );
  });
  await new Promise<void>((resolve) => control.listen(0, "127.0.0.1", resolve));
  return {
    controlUrl: `http://127.0.0.1:${(control.address() as { port: number }).port}`,
    close: async () => {
      control.close();
      await down();
    },
  };
}

async function main() {
  const t0 = Date.now();
  if (!only) {
    await step("lint", () => run(bin("eslint"), ["--max-warnings", "0", "."], { label: "lint" }));
    await step("typecheck", () => run("npm", ["run", "--silent", "typecheck"], { label: "typecheck" }));
  }
  if (wants("unit")) {
    const args = ["run", "--project", "unit", ...(coverage ? ["--coverage"] : [])];
    await step(coverage ? "unit tests with coverage" : "unit tests", () => run(bin("vitest"), args, { label: "unit" }));
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
    };
    let services: Services | null = null;
    let app: ReturnType<typeof start> | null = null;
    let worker: ChildProcess | null = null;
    let testS3: Awaited<ReturnType<typeof startTestS3>> | null = null;
    const stopAll = async () => {
      for (const child of [app, worker]) if (child) killTree(child);
      await Promise.all([app, worker].map((child) => child && waitForExit(child, 10_000)));
      await services?.stop();
      await testS3?.close();
    };
    process.on("SIGINT", () => void stopAll().then(() => process.exit(130)));
    try {
      console.log("\n━━ services ━━");
      services = await startServices(settings, { freshDatabase: true, localS3: false });
      testS3 = await startTestS3(settings);
      const [node, seedArgs] = tsxArgs("db/seed.ts");
      await run(node, seedArgs, { env, label: "seed" });
      worker = startWorker(env, settings.dataDir);
      await buildIfStale({ distDir: testDistDir(), env: { ...env, NODE_ENV: "production" } });
      app = start(process.execPath, ["node_modules/next/dist/bin/next", "start", "-H", "127.0.0.1", "-p", String(settings.app.port)], {
        env: { ...env, NEXT_DIST_DIR: testDistDir() },
        label: "next",
        quiet: true,
      });
      await waitFor(async () => (await fetch(`${settings.app.url}/api/health`)).ok, { timeoutMs: 60_000, what: "The test web server" });
      const testEnv = { ...env, NODE_ENV: "test", TEST_S3_CONTROL_URL: testS3.controlUrl };
      if (wants("integration")) await step("integration tests", () => run(bin("vitest"), ["run", "--project", "integration", ...passThrough], { env: testEnv, label: "integration" }));
      if (wants("e2e")) await step("browser tests", () => run(bin("playwright"), ["test", ...passThrough], { env: testEnv, label: "e2e" }));
    } catch (err) {
      failures.push("test services");
      console.error(err instanceof Error ? err.message : err);
    } finally {
      await stopAll();
    }
  }

  console.log(`\n━━ summary (${((Date.now() - t0) / 1000).toFixed(0)} s) ━━\n${timings.join("\n")}`);
  if (failures.length) {
    console.error(`\nFAILED: ${failures.join(", ")}`);
    process.exit(1);
  }
  console.log("\nAll checks passed.");
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
