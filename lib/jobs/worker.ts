/**
 * The background worker process: `npm run worker`, or spawned by `npm start` and `npm test`
 * (scripts/start.ts, scripts/test.ts) with MALLOC_ARENA_MAX=2, which lets sharp use every core
 * and keeps the resident memory low (bench/normalize.ts).
 *
 * Server modules import "server-only", which loads only under the react-server condition; when
 * started without it (plain `tsx lib/jobs/worker.ts`), this entry restarts itself with it.
 */
import { spawn } from "node:child_process";

const hasReactServerCondition = [...process.execArgv, process.env.NODE_OPTIONS ?? ""].some((arg) => /(--conditions[= ]|-C ?)react-server/.test(arg));

if (hasReactServerCondition) {
  const { runWorker } = await import("./run-worker");
  await runWorker();
} else {
  const child = spawn(process.execPath, [...process.execArgv, "--conditions=react-server", ...process.argv.slice(1)], { stdio: "inherit" });
  for (const signal of ["SIGINT", "SIGTERM"] as const) process.on(signal, () => child.kill(signal));
  child.on("exit", (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
}
