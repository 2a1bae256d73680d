import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import { projectRoot } from "./settings";

/** `logFile`: the child's output goes there (a long-running child whose stderr nobody reads would block on a full pipe). */
type Options = { env?: Record<string, string>; label: string; quiet?: boolean; logFile?: string };

function spawnWithOutput(cmd: string, args: string[], { env, label, quiet, logFile }: Options): ChildProcess {
  const fd = logFile ? fs.openSync(logFile, "w") : null;
  const child = spawn(cmd, args, {
    cwd: projectRoot,
    env: { ...process.env, ...env },
    stdio: fd !== null ? ["ignore", fd, fd] : quiet ? ["ignore", "ignore", "pipe"] : ["ignore", "inherit", "inherit"],
    // Own process group, so stopping it also stops what it started.
    detached: true,
  });
  if (fd !== null) fs.closeSync(fd);
  child.on("error", (err) => console.error(`[${label}] could not start: ${err.message}`));
  return child;
}

/** Runs a command to completion; rejects with its exit code. */
export function run(cmd: string, args: string[], options: Options): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawnWithOutput(cmd, args, options);
    let stderr = "";
    child.stderr?.on("data", (d) => (stderr += d));
    const stop = () => killTree(child);
    process.once("SIGINT", stop);
    child.on("exit", (code, signal) => {
      process.off("SIGINT", stop);
      if (code === 0) resolve();
      else reject(new Error(`${options.label} failed (${signal ?? `exit ${code}`})${stderr ? `:\n${stderr.slice(-4000)}` : ""}`));
    });
  });
}

/** Starts a long-running command; the caller stops it with killTree. */
export function start(cmd: string, args: string[], options: Options): ChildProcess {
  return spawnWithOutput(cmd, args, options);
}

export function killTree(child: ChildProcess, signal: NodeJS.Signals = "SIGTERM") {
  if (child.pid === undefined || child.exitCode !== null) return;
  try {
    process.kill(-child.pid, signal);
  } catch {
    /* already gone */
  }
}

export function waitForExit(child: ChildProcess, timeoutMs: number): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    const timer = setTimeout(() => {
      killTree(child, "SIGKILL");
      resolve();
    }, timeoutMs);
    child.once("exit", () => {
      clearTimeout(timer);
      resolve();
    });
  });
}

/** `tsx` with the react-server condition, so server-only modules load outside Next. */
export function tsxArgs(script: string, extra: string[] = []): [string, string[]] {
  return [process.execPath, ["--conditions=react-server", "--import", "tsx", script, ...extra]];
}

/**
 * The production web server (scripts/serve.ts: Next.js behind a server that sets the client
 * address), or `next dev` for --dev. Plain `tsx`, without the react-server condition, which
 * Next.js sets up for its own server code.
 */
export function webServerArgs({ port, dev = false }: { port: number; dev?: boolean }): [string, string[]] {
  if (dev) return [process.execPath, ["node_modules/next/dist/bin/next", "dev", "-H", "127.0.0.1", "-p", String(port)]];
  return [process.execPath, ["--import", "tsx", "scripts/serve.ts"]];
}
