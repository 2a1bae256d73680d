/**
 * PostgreSQL from Debian's packages, in a project folder, on 127.0.0.1 and a non-default port.
 * PostgreSQL refuses to run as root; as root we run it as the unprivileged `postgres` user,
 * keeping CAP_DAC_READ_SEARCH so it can reach a data folder whose parents are private to root
 * (for example a fresh clone under a 0700 mktemp folder).
 */
import { execFileSync, spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import pg from "pg";
import { ensureDebianPackages, isRoot } from "./debian";
import { isPortFree, portTakenMessage } from "./ports";
import type { ServiceSettings } from "./settings";

const osUser = process.env.PG_OS_USER || "postgres";

function newestPostgresBin(): string | null {
  const base = "/usr/lib/postgresql";
  if (!fs.existsSync(base)) return null;
  const versions = fs
    .readdirSync(base)
    .filter((v) => fs.existsSync(path.join(base, v, "bin", "pg_ctl")))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], "bin") : null;
}

/** The newest installed server's bin folder, installing Debian's package when root. */
export function findPostgresBin(): string {
  ensureDebianPackages("The PostgreSQL server", ["postgresql"], () => newestPostgresBin() !== null);
  return newestPostgresBin()!;
}

/** Runs a PostgreSQL program as the right OS user. */
function runPg(bin: string, program: string, args: string[], opts: { allowFail?: boolean } = {}) {
  const full = path.join(bin, program);
  const [cmd, cmdArgs] = isRoot
    ? ["setpriv", [`--reuid=${osUser}`, `--regid=${osUser}`, "--init-groups", "--inh-caps=+dac_read_search", "--ambient-caps=+dac_read_search", "--", full, ...args]]
    : [full, args];
  const result = spawnSync(cmd, cmdArgs as string[], { encoding: "utf8" });
  if (result.status !== 0 && !opts.allowFail) {
    throw new Error(`${program} failed (exit ${result.status}):\n${result.stderr || result.stdout}`);
  }
  return result;
}

function prepareDir(dir: string) {
  fs.mkdirSync(dir, { recursive: true });
  if (isRoot) execFileSync("chown", ["-R", `${osUser}:${osUser}`, dir]);
}

function isRunning(bin: string, dataDir: string): boolean {
  if (!fs.existsSync(path.join(dataDir, "PG_VERSION"))) return false;
  return runPg(bin, "pg_ctl", ["-D", dataDir, "status"], { allowFail: true }).status === 0;
}

export type PostgresHandle = { stop: () => void; startedHere: boolean; outage: { stop: () => void; start: () => void } };

/**
 * Starts (or reuses) the cluster in settings.pg.dataDir and makes sure the role and database
 * exist. Returns a handle whose stop() only stops a server this call started.
 */
export async function ensurePostgres(s: ServiceSettings, opts: { freshDatabase?: boolean } = {}): Promise<PostgresHandle> {
  const bin = findPostgresBin();
  const dataDir = s.pg.dataDir;
  const clusterDir = path.dirname(dataDir);
  fs.mkdirSync(clusterDir, { recursive: true });

  if (!fs.existsSync(path.join(dataDir, "PG_VERSION"))) {
    prepareDir(dataDir);
    const pwFile = path.join(dataDir, "..", `.pw-${process.pid}`);
    fs.writeFileSync(pwFile, s.pg.password + "\n", { mode: 0o644 });
    try {
      runPg(bin, "initdb", ["-D", dataDir, "-U", s.pg.user, `--pwfile=${pwFile}`, "--auth-local=trust", "--auth-host=scram-sha-256", "-E", "UTF8", "--locale=C.UTF-8"]);
    } finally {
      fs.rmSync(pwFile, { force: true });
    }
  }

  let startedHere = false;
  if (!isRunning(bin, dataDir)) {
    if (!(await isPortFree(s.pg.port))) throw new Error(portTakenMessage(s.pg.port, "PostgreSQL", s.name === "test" ? "TEST_PG_PORT" : "PG_PORT"));
    startCluster(bin, s);
    startedHere = true;
  }

  await ensureDatabase(s, opts.freshDatabase ?? false);

  return {
    startedHere,
    stop: () => {
      if (startedHere) stopCluster(bin, dataDir);
    },
    // For outage tests: the server goes away (open connections cut) and comes back on the same data.
    outage: {
      stop: () => stopCluster(bin, dataDir),
      start: () => startCluster(bin, s),
    },
  };
}

function stopCluster(bin: string, dataDir: string) {
  runPg(bin, "pg_ctl", ["-D", dataDir, "-m", "fast", "-w", "stop"], { allowFail: true });
}

function startCluster(bin: string, s: ServiceSettings) {
  const clusterDir = path.dirname(s.pg.dataDir);
  const socketDir = path.join(clusterDir, "socket");
  prepareDir(socketDir);
  const logFile = path.join(clusterDir, "postgres.log");
  if (isRoot && !fs.existsSync(logFile)) {
    fs.writeFileSync(logFile, "");
    execFileSync("chown", [`${osUser}:${osUser}`, logFile]);
  }
  runPg(bin, "pg_ctl", [
    "-D",
    s.pg.dataDir,
    "-l",
    logFile,
    "-o",
    `-p ${s.pg.port} -k ${socketDir} -c listen_addresses=127.0.0.1 -c max_connections=200 -c fsync=${s.name === "test" ? "off" : "on"}`,
    "-w",
    "-t",
    "60",
    "start",
  ]);
}

async function ensureDatabase(s: ServiceSettings, fresh: boolean) {
  const admin = new pg.Client({
    host: "127.0.0.1",
    port: s.pg.port,
    user: s.pg.user,
    password: s.pg.password,
    database: "postgres",
  });
  await admin.connect();
  try {
    const quoted = `"${s.pg.database.replace(/"/g, '""')}"`;
    if (fresh) await admin.query(`DROP DATABASE IF EXISTS ${quoted} WITH (FORCE)`);
    const { rowCount } = await admin.query("SELECT 1 FROM pg_database WHERE datname = $1", [s.pg.database]);
    if (!rowCount) await admin.query(`CREATE DATABASE ${quoted}`);
  } finally {
    await admin.end();
  }
}

/**
 * The local app role may sign in with its local password (migration 0019 creates it without
 * one; a real deployment gives it, or a member role, a password of its own).
 */
export async function enableAppLogin(s: ServiceSettings) {
  const owner = new pg.Client({ host: "127.0.0.1", port: s.pg.port, user: s.pg.user, password: s.pg.password, database: s.pg.database });
  await owner.connect();
  try {
    const password = s.pg.appPassword.replace(/'/g, "''");
    await owner.query(`ALTER ROLE "${s.pg.appUser.replace(/"/g, '""')}" WITH LOGIN PASSWORD '${password}'`);
  } finally {
    await owner.end();
  }
}
