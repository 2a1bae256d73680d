import "server-only";
/**
 * The counters of lib/rate-limit/limits.ts (its file head says how a limit counts). One atomic
 * statement per count: the upsert adds one only while the window's count is below the maximum.
 */
import { and, eq, lt, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { rateLimitCounters } from "@/db/schema";

type Counter = { bucket: string; key: string };

/**
 * Adds one to the counter unless it is used up (`max` in the window that began at most
 * `windowSeconds` before `now`; an older window starts again at `now`), in one statement: the
 * row lock lasts as long as the statement. Answers whether it was counted and when the counter's
 * window started (null when the refusing row is too new for this statement's snapshot).
 */
export async function takeCount({ bucket, key, max, windowSeconds, now }: Counter & { max: number; windowSeconds: number; now: Date }): Promise<{ taken: boolean; windowStart: Date | null }> {
  const windowOver = sql`rate_limit_counters.window_start <= ${new Date(now.getTime() - windowSeconds * 1000)}`;
  const { rows } = await db().execute<{ window_start: string; taken: boolean }>(sql`
    WITH up AS (
      INSERT INTO rate_limit_counters (bucket, key, window_start, count) VALUES (${bucket}, ${key}, ${now}, 1)
      ON CONFLICT (bucket, key) DO UPDATE SET
        count = CASE WHEN ${windowOver} THEN 1 ELSE rate_limit_counters.count + 1 END,
        window_start = CASE WHEN ${windowOver} THEN excluded.window_start ELSE rate_limit_counters.window_start END
      WHERE ${windowOver} OR rate_limit_counters.count < ${max}
      RETURNING window_start
    )
    SELECT window_start::text, true AS taken FROM up
    UNION ALL
    SELECT window_start::text, false FROM rate_limit_counters WHERE bucket = ${bucket} AND key = ${key} AND NOT EXISTS (SELECT 1 FROM up)`);
  const row = rows[0];
  return { taken: row?.taken === true, windowStart: row ? new Date(row.window_start) : null };
}

/** Gives one count back to the window that took it; a window started since keeps its count. */
export async function giveCountBack({ bucket, key, windowStart }: Counter & { windowStart: Date }): Promise<void> {
  await db()
    .update(rateLimitCounters)
    .set({ count: sql`greatest(${rateLimitCounters.count} - 1, 0)` })
    .where(and(eq(rateLimitCounters.bucket, bucket), eq(rateLimitCounters.key, key), eq(rateLimitCounters.windowStart, windowStart)));
}

/** Forgets every count of a bucket and key, or of every key starting with keyPrefix. */
export async function deleteCounts({ bucket, key, keyPrefix }: { bucket: string; key?: string; keyPrefix?: string }): Promise<void> {
  const match = key !== undefined ? eq(rateLimitCounters.key, key) : sql`starts_with(${rateLimitCounters.key}, ${keyPrefix ?? ""})`;
  await db()
    .delete(rateLimitCounters)
    .where(and(eq(rateLimitCounters.bucket, bucket), match));
}

/** Counters whose window began before `before`; returns how many went. */
export async function deleteCountsBefore(before: Date): Promise<number> {
  const rows = await db().delete(rateLimitCounters).where(lt(rateLimitCounters.windowStart, before)).returning({ key: rateLimitCounters.key });
  return rows.length;
}
