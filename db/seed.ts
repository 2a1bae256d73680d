/**
 * Seeds the invented demo scenario into an empty database (refuses to touch a database that
 * already has workspaces). Run with `npm run db:seed`; `npm start` runs it when the database is empty.
 */
import { sql } from "drizzle-orm";
import { closeDb, db } from "./client";
import { seedPeople } from "./seed/people";

export async function isDatabaseEmpty(): Promise<boolean> {
  const { rows } = await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM workspaces`);
  return rows[0]?.n === 0;
}

export async function seedDemo() {
  if (!(await isDatabaseEmpty())) return { seeded: false as const };
  const people = await seedPeople(db());
  return { seeded: true as const, people };
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const result = await seedDemo();
  console.log(result.seeded ? "Demo data seeded." : "The database already has data; seed skipped.");
  await closeDb();
}
