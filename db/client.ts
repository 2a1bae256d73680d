import "server-only";
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import pg from "pg";
import * as schema from "./schema";

export type Database = NodePgDatabase<typeof schema>;
/** A transaction handle has the same query API as the database. */
export type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];
export type DbOrTx = Database | Tx;

type Cache = { pool?: pg.Pool; db?: Database };
// Cached on globalThis so dev reloads and route modules share one pool.
const cache = globalThis as unknown as { __partproofDb?: Cache };

export function pool(): pg.Pool {
  const c = (cache.__partproofDb ??= {});
  if (!c.pool) {
    const url = process.env.DATABASE_URL;
    if (!url) throw new Error("DATABASE_URL is not set; start the app with `npm start` or see .env.example.");
    c.pool = new pg.Pool({ connectionString: url, max: Number(process.env.DATABASE_POOL_MAX ?? 20) });
    c.pool.on("error", (err) => console.error("PostgreSQL pool error", err));
  }
  return c.pool;
}

export function db(): Database {
  const c = (cache.__partproofDb ??= {});
  if (!c.db) c.db = drizzle(pool(), { schema, casing: "snake_case" });
  return c.db;
}

export async function closeDb() {
  const c = cache.__partproofDb;
  if (c?.pool) await c.pool.end();
  cache.__partproofDb = undefined;
}
