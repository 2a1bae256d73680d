/**
 * Extra web servers and workers for the multi-instance test, started exactly as `npm start`
 * starts them (scripts/serve.ts over the test build; lib/jobs/worker.ts), on the test run's
 * PostgreSQL and object store. Each logs to its own file in the test data folder.
 */
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import path from "node:path";

export type Instance = { name: string; url: string; log: string; stop: () => Promise<void> };

const dataDir = () => {
  const dir = process.env.TEST_DATA_DIR;
  if (!dir) throw new Error("TEST_DATA_DIR is not set; run the integration tests through `npm run test:integration`.");
  return dir;
};

/**
 * Every child started here, so a failed start (one of several in a Promise.all) or a test run
 * that ends early never leaves a server behind: stopAll() in afterAll, and a last SIGKILL to each
 * child's process group when the test process exits.
 */
const launched = new Set<ChildProcess>();
process.once("exit", () => {
  for (const child of launched) {
    try {
      process.kill(-child.pid!, "SIGKILL");
    } catch {
      /* gone */
    }
  }
});

export async function stopAll() {
  await Promise.all([...launched].map(stopChild));
}

function launch(name: string, args: string[], env: Record<string, string>): { child: ChildProcess; log: string } {
  const log = path.join(dataDir(), `${name}.log`);
  const fd = fs.openSync(log, "w");
  // The test runner's own NODE_ENV is "test"; the servers run as they do in production.
  const child = spawn(process.execPath, args, { cwd: process.cwd(), env: { ...process.env, NODE_ENV: "production", ...env }, stdio: ["ignore", fd, fd], detached: true });
  fs.closeSync(fd);
  launched.add(child);
  child.once("exit", () => launched.delete(child));
  return { child, log };
}

async function stopChild(child: ChildProcess) {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise<void>((resolve) => child.once("exit", () => resolve()));
  try {
    process.kill(-child.pid!, "SIGTERM");
  } catch {
    return;
  }
  const timer = setTimeout(() => {
    try {
      process.kill(-child.pid!, "SIGKILL");
    } catch {
      /* gone */
    }
  }, 10_000);
  await exited;
  clearTimeout(timer);
}

/** A web server on `port` serving the test build; resolves once /api/health answers. */
export async function startWebServer(name: string, port: number, env: Record<string, string> = {}): Promise<Instance> {
  const distDir = process.env.TEST_DIST_DIR;
  if (!distDir) throw new Error("TEST_DIST_DIR is not set; run the integration tests through `npm run test:integration`.");
  const url = `http://127.0.0.1:${port}`;
  // A server left over on the port would answer the health check in this one's place.
  if (
    await fetch(`${url}/api/health`).then(
      () => true,
      () => false,
    )
  )
    throw new Error(`Something already answers on ${url}; stop it before running this test.`);
  const { child, log } = launch(name, ["--import", "tsx", "scripts/serve.ts"], { PORT: String(port), HOST: "127.0.0.1", NEXT_DIST_DIR: distDir, APP_URL: url, NEXTAUTH_URL: url, ...env });
  const deadline = Date.now() + 120_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`${name} exited (${child.exitCode}): ${fs.readFileSync(log, "utf8").slice(-2000)}`);
    const ok = await fetch(`${url}/api/health`).then(
      (r) => r.ok,
      () => false,
    );
    if (ok) break;
    if (Date.now() > deadline) throw new Error(`${name} did not answer on ${url} within 120 s`);
    await new Promise((r) => setTimeout(r, 250));
  }
  return { name, url, log, stop: () => stopChild(child) };
}

/** A worker process; resolves once it reports ready. */
export async function startWorker(name: string, env: Record<string, string> = {}): Promise<Instance> {
  const { child, log } = launch(name, ["--conditions=react-server", "--import", "tsx", "lib/jobs/worker.ts"], { MALLOC_ARENA_MAX: "2", ...env });
  const deadline = Date.now() + 60_000;
  while (!fs.readFileSync(log, "utf8").includes("Worker ready")) {
    if (child.exitCode !== null) throw new Error(`${name} exited (${child.exitCode}): ${fs.readFileSync(log, "utf8").slice(-2000)}`);
    if (Date.now() > deadline) throw new Error(`${name} did not get ready within 60 s`);
    await new Promise((r) => setTimeout(r, 250));
  }
  return { name, url: "", log, stop: () => stopChild(child) };
}

export const logOf = (instance: Instance) => fs.readFileSync(instance.log, "utf8");
