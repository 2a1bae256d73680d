import "server-only";
import { sql } from "drizzle-orm";
import { db } from "@/db/client";

/** Throws when the database does not answer (the health route's probe). */
export async function pingDatabase(): Promise<void> {
  await db().execute(sql`SELECT 1`);
}
