/**
 * The app connects as a role that owns nothing (migration 0019): it cannot switch off the
 * triggers that keep the evidence append-only, cannot alter tables or grants, and on the
 * append-only tables (activity_log, grades) may only add and read rows. Checked with the app's
 * own connection (DATABASE_URL, as the web server and the worker use it).
 */
import { sql } from "drizzle-orm";
import { expect, it } from "vitest";
import { db } from "@/db/client";

const attempt = (query: ReturnType<typeof sql>) =>
  db()
    .execute(query)
    .then(
      () => "allowed",
      (e: { cause?: { message?: string }; message?: string }) => e.cause?.message ?? e.message ?? String(e),
    );

it("is not the owner, and not a superuser", async () => {
  const { rows } = await db().execute<{ role: string; superuser: boolean; owner: string }>(
    sql`SELECT current_user AS role, (SELECT rolsuper FROM pg_roles WHERE rolname = current_user) AS superuser, (SELECT tableowner FROM pg_tables WHERE tablename = 'activity_log') AS owner`,
  );
  expect(rows[0].superuser).toBe(false);
  expect(rows[0].owner).not.toBe(rows[0].role);
});

it("cannot switch off the append-only triggers or change the tables", async () => {
  expect(await attempt(sql`ALTER TABLE activity_log DISABLE TRIGGER activity_log_append_only`)).toMatch(/must be owner/);
  expect(await attempt(sql`ALTER TABLE grades DISABLE TRIGGER ALL`)).toMatch(/must be owner/);
  expect(await attempt(sql`DROP TRIGGER grades_append_only ON grades`)).toMatch(/must be owner/);
  expect(await attempt(sql`ALTER TABLE users ADD COLUMN sneaky text`)).toMatch(/must be owner/);
  expect(await attempt(sql`ALTER TABLE activity_log OWNER TO CURRENT_USER`)).toMatch(/must be owner/);
});

it("may only add and read rows of the append-only tables", async () => {
  expect(await attempt(sql`SELECT count(*) FROM activity_log`)).toBe("allowed");
  expect(await attempt(sql`UPDATE activity_log SET action = 'tampered' WHERE false`)).toMatch(/permission denied for table activity_log/);
  expect(await attempt(sql`DELETE FROM activity_log WHERE false`)).toMatch(/permission denied for table activity_log/);
  expect(await attempt(sql`TRUNCATE activity_log`)).toMatch(/permission denied for table activity_log/);
  expect(await attempt(sql`UPDATE grades SET final_grade = 'A' WHERE false`)).toMatch(/permission denied for table grades/);
  expect(await attempt(sql`DELETE FROM grades WHERE false`)).toMatch(/permission denied for table grades/);
  // Ordinary tables stay writable (a supplier's notes, a person's name, …).
  expect(await attempt(sql`UPDATE suppliers SET notes = notes WHERE false`)).toBe("allowed");
});
