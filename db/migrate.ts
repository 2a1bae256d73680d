/** Applies the committed drizzle-kit migrations in db/migrations. */
import path from "node:path";
import { drizzle } from "drizzle-orm/node-postgres";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";

export async function runMigrations(databaseUrl: string) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 1 });
  try {
    await migrate(drizzle(pool), { migrationsFolder: path.join(import.meta.dirname, "migrations") });
  } finally {
    await pool.end();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  // Migrations run as the tables' owner; the app's own role may not change the schema.
  const url = process.env.MIGRATION_DATABASE_URL || process.env.DATABASE_URL;
  if (!url) {
    console.error("MIGRATION_DATABASE_URL (or DATABASE_URL) is not set.");
    process.exit(1);
  }
  await runMigrations(url);
  console.log("Migrations applied.");
}
