import "server-only";
/**
 * Counting limits in PostgreSQL, shared by every web instance (sign-in, the public account
 * endpoints, upload intents). A request is counted *before* the work it pays for, by one atomic
 * statement per limit: an upsert of the (bucket, key, window) counter that only adds one while
 * the count is below the maximum. Of many parallel requests exactly `max` get through in a window,
 * however they interleave; the rest are refused without being counted, so hammering a refused
 * limit does not extend it. A row lock is held only for the length of one statement, so a burst
 * of requests never ties up the connection pool waiting for each other.
 *
 * A window starts with the first request it counts and lasts `windowSeconds`; the next request
 * after it starts a new one. So a burst never straddles two windows, and a refusal can say exactly
 * how long to wait. When a later limit refuses, the counts already taken for the same request are
 * given back.
 */
import { and, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { rateLimitCounters } from "@/db/schema";
import { AppError } from "@/lib/errors";

export type Limit = {
  /** What is counted, e.g. "sign-in:account". */
  bucket: string;
  /** Whose, e.g. an e-mail address or a client address. */
  key: string;
  max: number;
  windowSeconds: number;
};

/** A count taken for one limit, to give back if the request turns out not to count. */
export type Taken = { bucket: string; key: string; windowStart: Date };
export type Allowance = { ok: true; taken: Taken[] } | { ok: false; limit: Limit; retryAfterSeconds: number };

/**
 * Adds one to the limit's counter unless it is used up, in one statement (the row lock lasts as
 * long as the statement; under a burst every request holds a connection only that long). Answers
 * whether it was counted and when the counter's window started (for a refusal's "wait …"; null
 * when the refusing row is too new for this statement's snapshot).
 */
async function takeOne(limit: Limit, now: Date): Promise<{ taken: boolean; windowStart: Date | null }> {
  const windowOver = sql`rate_limit_counters.window_start <= ${new Date(now.getTime() - limit.windowSeconds * 1000)}`;
  const { rows } = await db().execute<{ window_start: string; taken: boolean }>(sql`
    WITH up AS (
      INSERT INTO rate_limit_counters (bucket, key, window_start, count) VALUES (${limit.bucket}, ${limit.key}, ${now}, 1)
      ON CONFLICT (bucket, key) DO UPDATE SET
        count = CASE WHEN ${windowOver} THEN 1 ELSE rate_limit_counters.count + 1 END,
        window_start = CASE WHEN ${windowOver} THEN excluded.window_start ELSE rate_limit_counters.window_start END
      WHERE ${windowOver} OR rate_limit_counters.count < ${limit.max}
      RETURNING window_start
    )
    SELECT window_start::text, true AS taken FROM up
    UNION ALL
    SELECT window_start::text, false FROM rate_limit_counters WHERE bucket = ${limit.bucket} AND key = ${limit.key} AND NOT EXISTS (SELECT 1 FROM up)`);
  const row = rows[0];
  return { taken: row?.taken === true, windowStart: row ? new Date(row.window_start) : null };
}

/** Counts the request against every limit, or against none when any of them is used up. */
export async function takeAllowance(limits: readonly Limit[], { now = new Date() }: { now?: Date } = {}): Promise<Allowance> {
  const taken: Taken[] = [];
  for (const limit of limits) {
    const one = await takeOne(limit, now);
    if (!one.taken) {
      await returnAllowance(taken);
      const end = one.windowStart ? one.windowStart.getTime() + limit.windowSeconds * 1000 : now.getTime() + limit.windowSeconds * 1000;
      return { ok: false, limit, retryAfterSeconds: Math.max(1, Math.ceil((end - now.getTime()) / 1000)) };
    }
    taken.push({ bucket: limit.bucket, key: limit.key, windowStart: one.windowStart! });
  }
  return { ok: true, taken };
}

/** Gives counts back (the attempt they paid for turned out not to count, e.g. a good password); a window started since keeps its count. */
export async function returnAllowance(taken: readonly Taken[]): Promise<void> {
  for (const t of taken) {
    await db()
      .update(rateLimitCounters)
      .set({ count: sql`greatest(${rateLimitCounters.count} - 1, 0)` })
      .where(and(eq(rateLimitCounters.bucket, t.bucket), eq(rateLimitCounters.key, t.key), eq(rateLimitCounters.windowStart, t.windowStart)));
  }
}

/** Forgets every count of a bucket and key, or of every key starting with keyPrefix. */
export async function clearLimit({ bucket, key, keyPrefix }: { bucket: string; key?: string; keyPrefix?: string }): Promise<void> {
  const match = key !== undefined ? eq(rateLimitCounters.key, key) : sql`starts_with(${rateLimitCounters.key}, ${keyPrefix ?? ""})`;
  await db().delete(rateLimitCounters).where(and(eq(rateLimitCounters.bucket, bucket), match));
}

/** "Wait 3 minutes" / "Wait 40 seconds", for the sentences of 429 answers. */
export function waitPhrase(seconds: number): string {
  if (seconds < 60) return `Wait ${seconds} second${seconds === 1 ? "" : "s"}`;
  const minutes = Math.ceil(seconds / 60);
  return `Wait ${minutes} minute${minutes === 1 ? "" : "s"}`;
}

/** Throws a 429 with the given sentence (and a Retry-After) unless every limit allows one more. */
export async function enforceLimits(limits: readonly Limit[], message: (retryAfterSeconds: number, limit: Limit) => string): Promise<Taken[]> {
  const allowance = await takeAllowance(limits);
  if (!allowance.ok) throw new AppError("too_many_requests", message(allowance.retryAfterSeconds, allowance.limit), { retryAfterSeconds: allowance.retryAfterSeconds });
  return allowance.taken;
}
