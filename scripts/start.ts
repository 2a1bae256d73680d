/**
 * `npm start`: local services → migrations → demo seed when the database is empty → production
 * build when missing or stale → the web server (scripts/serve.ts) on 127.0.0.1. Ctrl-C stops everything it started.
 * `--dev` runs `next dev` instead of a production build.
 */
import fs from "node:fs";
import http from "node:http";
import { DEMO_PASSWORD, DEMO_WORKSPACES } from "../db/seed/demo-data";
import { buildIfStale } from "./lib/build";
import { killTree, run, start, tsxArgs, waitForExit, webServerArgs } from "./lib/children";
import { isPortFree, portTakenMessage, waitFor } from "./lib/ports";
import { productionStartProblems } from "../lib/production-check";
import { sessionSecret } from "./lib/secret";
import { startServices } from "./lib/services";
import { appEnvironment, demoSettings } from "./lib/settings";

const dev = process.argv.includes("--dev");

function healthOf(url: string): Promise<{ app?: string } | null> {
  return new Promise((resolve) => {
    const req = http.get(`${url}/api/health`, { timeout: 2000 }, (res) => {
      let body = "";
      res.on("data", (c) => (body += c));
      res.on("end", () => {
        try {
          resolve(JSON.parse(body));
        } catch {
          resolve(null);
        }
      });
    });
    req.on("error", () => resolve(null));
    req.on("timeout", () => {
      req.destroy();
      resolve(null);
    });
  });
}

function printWelcome(url: string) {
  const lines = [
    "",
    `Partproof is running at ${url}`,
    "",
    `Demo accounts (demo only; password for all: ${DEMO_PASSWORD})`,
    ...DEMO_WORKSPACES.flatMap((ws) => [`  ${ws.name}:`, ...ws.people.map((p) => `    ${p.email.padEnd(30)} ${p.roles.join(", ")}`)]),
    "",
    "Press Ctrl-C to stop.",
    "",
  ];
  console.log(lines.join("\n"));
}

/**
 * The photo worker (lib/jobs/worker.ts). MALLOC_ARENA_MAX=2 lets sharp use every core and keeps its
 * memory low (bench/normalize.ts). A crash restarts it (jobs in hand are retried by pg-boss);
 * five crashes within ten minutes stop Partproof with a clear message instead of looping.
 */
function startWorker(env: Record<string, string>, children: ReturnType<typeof start>[], isStopping: () => boolean, shutdown: (code: number) => Promise<void>) {
  const crashes: number[] = [];
  const launch = () => {
    const [node, args] = tsxArgs("lib/jobs/worker.ts");
    const worker = start(node, args, { env: { ...env, MALLOC_ARENA_MAX: "2" }, label: "worker" });
    children.push(worker);
    worker.on("exit", (code, signal) => {
      children.splice(children.indexOf(worker), 1);
      if (isStopping()) return;
      const now = Date.now();
      crashes.push(now);
      while (crashes.length && crashes[0] < now - 600_000) crashes.shift();
      if (crashes.length >= 5) {
        console.error(`The photo worker keeps stopping (last: ${signal ?? `exit ${code}`}); see its messages above.`);
        void shutdown(1);
        return;
      }
      console.error(`The photo worker stopped (${signal ?? `exit ${code}`}); restarting it.`);
      setTimeout(() => !isStopping() && launch(), 2_000);
    });
  };
  launch();
}

async function main() {
  // A developer's .env overrides the defaults (see .env.example).
  if (fs.existsSync(".env")) process.loadEnvFile(".env");
  const settings = demoSettings();
  if (!(await isPortFree(settings.app.port))) {
    const health = await healthOf(settings.app.url);
    if (health?.app === "partproof") {
      console.log(`Partproof is already running at ${settings.app.url}; nothing to do.`);
      return;
    }
    throw new Error(portTakenMessage(settings.app.port, "Partproof", "PORT"));
  }

  // A production start must bring its own secret; only the local demo gets a generated one.
  const problems = dev ? [] : productionStartProblems({ ...process.env, NODE_ENV: "production", APP_URL: process.env.APP_URL || settings.app.url });
  if (problems.length) throw new Error(`Partproof will not start:\n${problems.map((p) => `  - ${p}`).join("\n")}`);
  const secret = sessionSecret(settings.dataDir);
  const env = appEnvironment(settings, secret);
  console.log("Starting PostgreSQL, the local S3 store and the mail inbox …");
  const services = await startServices(settings, {
    // A real S3 or SMTP server configured in the environment replaces the local one.
    localS3: !process.env.S3_ENDPOINT,
    localMail: !process.env.SMTP_HOST,
  });
  if (process.env.SMTP_HOST) delete env.MAIL_INBOX_DIR;

  let stopping = false;
  const children: ReturnType<typeof start>[] = [];
  const shutdown = async (code: number) => {
    if (stopping) return;
    stopping = true;
    console.log("\nStopping Partproof …");
    for (const c of children) killTree(c);
    await Promise.all(children.map((c) => waitForExit(c, 10_000)));
    await services.stop();
    console.log("Stopped.");
    process.exit(code);
  };
  process.on("SIGINT", () => void shutdown(0));
  process.on("SIGTERM", () => void shutdown(0));

  try {
    const [node, seedArgs] = tsxArgs("db/seed.ts");
    await run(node, seedArgs, { env, label: "seed" });
    if (!dev) await buildIfStale({ distDir: ".next", env });
  } catch (err) {
    console.error(err instanceof Error ? err.message : err);
    await shutdown(1);
    return;
  }

  startWorker(env, children, () => stopping, shutdown);

  const [node, webArgs] = webServerArgs({ port: settings.app.port, dev });
  const app = start(node, webArgs, { env: { ...env, PORT: String(settings.app.port), HOST: "127.0.0.1" }, label: "next" });
  children.push(app);
  app.on("exit", (code) => {
    if (!stopping) {
      console.error(`The web server stopped unexpectedly (exit ${code}).`);
      void shutdown(1);
    }
  });
  await waitFor(async () => (await healthOf(settings.app.url))?.app === "partproof", { timeoutMs: 120_000, what: "The web server" });
  printWelcome(settings.app.url);
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
