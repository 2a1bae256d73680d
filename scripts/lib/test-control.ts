/**
 * Services of the test run that the outage and fault tests may take down and bring back, the hard
 * way, through a small HTTP control server on loopback (TEST_CONTROL_URL):
 *   POST /s3/stop, /s3/start           the object store: stop drops every open connection and
 *                                      stops s3rver, as a crash or network cut would (s3rver's
 *                                      own close() lets busy keep-alive connections carry on);
 *                                      start brings it back on the same port and folder
 *   POST /mail/stop, /mail/start       the local SMTP inbox
 *   POST /postgres/stop, /postgres/start   PostgreSQL (pg_ctl -m fast: connections cut)
 *   POST /worker/kill, /worker/start   the background worker: kill is SIGKILL, nothing graceful
 * Each answers 204 once done.
 */
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import http from "node:http";
import path from "node:path";
import S3rver from "s3rver";
import { killTree, tsxArgs, waitForExit } from "./children";
import { startLocalMail, type LocalMailHandle } from "./local-mail";
import { corsXml } from "./local-s3";
import { isPortFree, portTakenMessage } from "./ports";
import type { PostgresHandle } from "./postgres";
import { projectRoot, type ServiceSettings } from "./settings";

type Toggle = { stop: () => Promise<void>; start: () => Promise<void> };

/** The test object store (owned here, not by startServices, so it can be cut off). */
async function testObjectStore(s: ServiceSettings): Promise<Toggle> {
  if (!(await isPortFree(s.s3.port))) throw new Error(portTakenMessage(s.s3.port, "the test S3 store", "TEST_S3_PORT"));
  const origins = [s.app.url, s.app.url.replace("127.0.0.1", "localhost")];
  fs.mkdirSync(s.s3.dir, { recursive: true });
  let server: S3rver | null = null;
  const start = async () => {
    if (server) return;
    const next = new S3rver({ address: "127.0.0.1", port: s.s3.port, directory: s.s3.dir, silent: true, configureBuckets: [{ name: s.s3.bucket, configs: [corsXml(origins)] }] });
    await next.run();
    server = next;
  };
  const stop = async () => {
    const running = server;
    server = null;
    if (!running) return;
    const closed = running.close();
    (running as unknown as { httpServer: http.Server }).httpServer.closeAllConnections();
    await closed;
  };
  await start();
  return { start, stop };
}

/** The worker, as `npm start` runs it, appending to <dataDir>/worker.log. */
function testWorker(env: Record<string, string>, dataDir: string): Toggle {
  let child: ChildProcess | null = null;
  const start = async () => {
    if (child && child.exitCode === null && child.signalCode === null) return;
    fs.mkdirSync(dataDir, { recursive: true });
    const log = fs.openSync(path.join(dataDir, "worker.log"), "a");
    const [node, args] = tsxArgs("lib/jobs/worker.ts");
    child = spawn(node, args, { cwd: projectRoot, env: { ...process.env, ...env, MALLOC_ARENA_MAX: "2" }, stdio: ["ignore", log, log], detached: true });
    fs.closeSync(log);
  };
  const stop = async () => {
    if (!child) return;
    killTree(child, "SIGKILL");
    await waitForExit(child, 10_000);
    child = null;
  };
  return { start, stop };
}

function testMail(s: ServiceSettings, first: LocalMailHandle | null): Toggle {
  let handle = first;
  return {
    stop: async () => {
      await handle?.close();
      handle = null;
    },
    start: async () => {
      handle ??= await startLocalMail({ port: s.smtp.port, inboxDir: s.smtp.inboxDir }, "TEST_SMTP_PORT");
    },
  };
}

export type TestControls = { url: string; startWorker: () => Promise<void>; close: () => Promise<void> };

export async function startTestControls({
  settings,
  env,
  postgres,
  mail,
}: {
  settings: ServiceSettings;
  env: Record<string, string>;
  postgres: PostgresHandle;
  mail: LocalMailHandle | null;
}): Promise<TestControls> {
  const s3 = await testObjectStore(settings);
  const worker = testWorker(env, settings.dataDir);
  const mailToggle = testMail(settings, mail);
  const pg: Toggle = { stop: async () => postgres.outage.stop(), start: async () => postgres.outage.start() };
  const routes: Record<string, () => Promise<void>> = {
    "/s3/stop": s3.stop,
    "/s3/start": s3.start,
    "/mail/stop": mailToggle.stop,
    "/mail/start": mailToggle.start,
    "/postgres/stop": pg.stop,
    "/postgres/start": pg.start,
    "/worker/kill": worker.stop,
    "/worker/start": worker.start,
  };
  const control = http.createServer((req, res) => {
    const action = req.method === "POST" ? routes[req.url ?? ""] : undefined;
    if (!action) return void res.writeHead(404).end();
    action().then(
      () => res.writeHead(204).end(),
      (err) => res.writeHead(500).end(String(err)),
    );
  });
  await new Promise<void>((resolve) => control.listen(0, "127.0.0.1", resolve));
  return {
    url: `http://127.0.0.1:${(control.address() as { port: number }).port}`,
    startWorker: worker.start,
    close: async () => {
      control.close();
      await worker.stop();
      await mailToggle.stop();
      await s3.stop();
    },
  };
}
