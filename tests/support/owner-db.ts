/**
 * A connection as the tables' owner (MIGRATION_DATABASE_URL), for tests of what the database
 * itself refuses even to its owner (append-only and immutability triggers). Everything else runs
 * as the app role, like the app (DATABASE_URL).
 */
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";

let pool: pg.Pool | null = null;

export function ownerDb() {
  const url = process.env.MIGRATION_DATABASE_URL;
  if (!url) throw new Error("MIGRATION_DATABASE_URL is not set; run the integration tests through `npm run test:integration`.");
  pool ??= new pg.Pool({ connectionString: url, max: 2, allowExitOnIdle: true });
  return drizzle(pool, { casing: "snake_case" });
}
