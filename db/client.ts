import "server-only";
import { createHash } from "node:crypto";
import type { SQL } from "drizzle-orm";
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import { PgDialect } from "drizzle-orm/pg-core";
import pg from "pg";
import * as schema from "./schema";

export type Database = NodePgDatabase<typeof schema>;
/** A transaction handle has the same query API as the database. */
export type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];
export type DbOrTx = Database | Tx;

type Cache = { pool?: pg.Pool; preparedPool?: pg.Pool; db?: Database };
// Cached on globalThis so dev reloads and route modules share one pool.
const cache = globalThis as unknown as { __partproofDb?: Cache };

const intFromEnv = (name: string, fallback: number) => {
  const raw = process.env[name];
  const value = raw === undefined || raw === "" ? fallback : Number(raw);
  if (!Number.isInteger(value) || value < 0) throw new Error(`${name} must be a whole number of milliseconds (got "${raw}").`);
  return value;
};

/**
 * Time limits of every app connection, so one stuck query or forgotten transaction cannot hold a
 * connection (and its locks) for good, and an unreachable server fails a request within seconds
 * (answered 503 by lib/http/route.ts) instead of hanging it. The session settings travel as
 * startup parameters, which a transaction-mode pooler may refuse: DATABASE_SESSION_SETTINGS=false
 * leaves them out, and they are then set on the database role instead (README, "Running at scale").
 */
export function connectionLimits(): pg.PoolConfig {
  const limits: pg.PoolConfig = { connectionTimeoutMillis: intFromEnv("DATABASE_CONNECT_TIMEOUT_MS", 5_000) };
  if (sessionSettingsAllowed()) {
    limits.statement_timeout = intFromEnv("DATABASE_STATEMENT_TIMEOUT_MS", 30_000);
    limits.idle_in_transaction_session_timeout = intFromEnv("DATABASE_IDLE_IN_TRANSACTION_TIMEOUT_MS", 60_000);
  }
  return limits;
}

const sessionSettingsAllowed = () => process.env.DATABASE_SESSION_SETTINGS !== "false";

function newPool(config: pg.PoolConfig): pg.Pool {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set; start the app with `npm start` or see .env.example.");
  const created = new pg.Pool({
    connectionString: url,
    ...connectionLimits(),
    // A new connection costs about 20 ms here (SCRAM sign-in, a fresh backend with cold caches).
    // With pg's default of closing idle connections after 10 s, every burst above the last
    // burst's size paid that again, which showed as 200-700 ms stalls in the queue benchmark;
    // five minutes keeps a busy app's connections warm. allowExitOnIdle lets scripts exit anyway.
    idleTimeoutMillis: 5 * 60_000,
    allowExitOnIdle: true,
    ...config,
  });
  created.on("error", (err) => console.error("PostgreSQL pool error", err));
  return created;
}

export function pool(): pg.Pool {
  const c = (cache.__partproofDb ??= {});
  c.pool ??= newPool({ max: Number(process.env.DATABASE_POOL_MAX ?? 20) });
  return c.pool;
}

/**
 * The connections executePrepared runs on, with plan_cache_mode = force_generic_plan: each
 * statement is planned once per connection. Left to itself PostgreSQL re-planned the queue's
 * statements on every call (pg_prepared_statements: 0 generic, 420 custom plans), because its
 * estimate for the generic plan came out higher, although both are the same index walk; a queue
 * page took 1.1-1.6 ms that way and 0.66 ms with the generic plan. The setting stays off the main
 * pool, where it would also plan every unnamed statement without its parameter values.
 */
function preparedPool(): pg.Pool {
  const c = (cache.__partproofDb ??= {});
  c.preparedPool ??= newPool({
    max: Number(process.env.DATABASE_PREPARED_POOL_MAX ?? 10),
    ...(sessionSettingsAllowed() && { options: "-c plan_cache_mode=force_generic_plan" }),
  });
  return c.preparedPool;
}

export function db(): Database {
  const c = (cache.__partproofDb ??= {});
  if (!c.db) c.db = drizzle(pool(), { schema, casing: "snake_case" });
  return c.db;
}

export async function closeDb() {
  const c = cache.__partproofDb;
  await Promise.all([c?.pool?.end(), c?.preparedPool?.end()]);
  cache.__partproofDb = undefined;
}

const dialect = new PgDialect({ casing: "snake_case" });

/**
 * Named prepared statements on the hot paths (DATABASE_PREPARED_STATEMENTS=false turns them
 * off, for a pooler that cannot keep them: PgBouncer before 1.21, or with max_prepared_statements = 0).
 */
export const preparedStatementsAllowed = () => process.env.DATABASE_PREPARED_STATEMENTS !== "false";

/**
 * Runs a raw SQL statement as a named prepared statement on its own pool (preparedPool): each
 * connection parses and plans it once, later runs only bind and execute. For the hot paths only,
 * and only for statements whose best plan does not depend on the parameter values (an index walk
 * in the index's order), since the plan is made without them. The name is a hash of the text, so
 * different texts never share a name. Not for use inside a transaction: it takes its own connection.
 * Unlike db().execute, timestamps come back as Date objects (pg's own parsing).
 */
export async function executePrepared<Row extends Record<string, unknown>>(query: SQL): Promise<{ rows: Row[] }> {
  const { sql: text, params } = dialect.sqlToQuery(query);
  if (!preparedStatementsAllowed()) return { rows: (await pool().query<Row>({ text, values: params })).rows };
  const name = `pp_${createHash("sha256").update(text).digest("base64url").slice(0, 22)}`;
  const { rows } = await preparedPool().query<Row>({ name, text, values: params });
  return { rows };
}

/**
 * Opens a transaction on the main pool. lib opens its transactions here, so the lock order and
 * the activity entry are decided where the change is decided; db/queries functions take the
 * `tx` it hands over and run the statements.
 */
export function transaction<T>(work: (tx: Tx) => Promise<T>, config?: Parameters<Database["transaction"]>[1]): Promise<T> {
  return db().transaction(work, config);
}
