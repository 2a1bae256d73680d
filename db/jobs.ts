import "server-only";
/**
 * The database side of the job queue (pg-boss runs its own SQL in the `pgboss` schema): the
 * connection a send-only pg-boss uses, the NOTIFY that wakes the worker at once, a transaction
 * whose jobs are sent through its own connection (so they commit or roll back with the rows they
 * are about), and the worker's LISTEN connection. lib/jobs decides what is sent when.
 */
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";
import { pool, type Database } from "./client";
import * as schema from "./schema";

/** What pg-boss takes as `db`: runs its statements on a connection of ours. */
export type JobDb = { executeSql: (text: string, values: unknown[]) => Promise<{ rows: unknown[] }> };

/** pg-boss's statements on the app's main pool (a sender in the web process). */
export function jobDbOnPool(): JobDb {
  return { executeSql: (text, values) => pool().query(text, values) };
}

/** Wakes the worker listening on `channel` for `queue` (polling is the fallback). */
export async function notifyJobs(channel: string, queue: string, on: JobDb = jobDbOnPool()): Promise<void> {
  await on.executeSql("SELECT pg_notify($1, $2)", [channel, queue]);
}

/**
 * Runs `work` in one transaction on one connection: `tx` for our queries, `jobs` for pg-boss's
 * sends and NOTIFYs on the same connection. Commits when `work` returns, rolls back when it throws.
 */
export async function transactionWithJobDb<T>(work: (tx: Database, jobs: JobDb) => Promise<T>): Promise<T> {
  const client = await pool().connect();
  try {
    await client.query("BEGIN");
    const tx = drizzle(client, { schema, casing: "snake_case" }) as unknown as Database;
    const result = await work(tx, { executeSql: (text, values) => client.query(text, values) });
    await client.query("COMMIT");
    return result;
  } catch (err) {
    await client.query("ROLLBACK").catch(() => {});
    throw err;
  } finally {
    client.release();
  }
}

/** LISTEN on its own connection; reconnects after a database restart. Returns a stop function. */
export function listenForJobs(connectionString: string, channel: string, onPayload: (payload: string) => void): () => Promise<void> {
  let client: pg.Client | null = null;
  let stopped = false;
  const connect = async () => {
    if (stopped) return;
    const next = new pg.Client({ connectionString, application_name: "partproof-worker-listen" });
    next.on("notification", (message) => {
      if (message.payload) onPayload(message.payload);
    });
    next.on("error", () => {
      next.end().catch(() => {});
      if (!stopped) setTimeout(() => void connect(), 5_000);
    });
    try {
      await next.connect();
      await next.query(`LISTEN ${channel}`);
      client = next;
    } catch {
      next.end().catch(() => {});
      if (!stopped) setTimeout(() => void connect(), 5_000);
    }
  };
  void connect();
  return async () => {
    stopped = true;
    await client?.end().catch(() => {});
  };
}
