import "server-only";
/**
 * Counting limits in PostgreSQL, shared by every web instance (sign-in, the public account
 * endpoints, upload intents). An event is recorded *before* the work it pays for, in the same
 * transaction as the count that allowed it, under an advisory lock per (bucket, key): of many
 * parallel requests, exactly `max` get through in a window, however they interleave; the rest
 * are refused without being recorded, so hammering a refused limit does not extend it.
 *
 * Locks are taken in one global order (sorted keys), so requests that share some limits cannot
 * deadlock. Old events are deleted by the worker's pruning job (lib/rate-limit/prune.ts).
 */
import { and, eq, gte, inArray, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { rateLimitEvents } from "@/db/schema";
import { AppError } from "@/lib/errors";

export type Limit = {
  /** What is counted, e.g. "sign-in:account". */
  bucket: string;
  /** Whose, e.g. an e-mail address or a client address. */
  key: string;
  max: number;
  windowSeconds: number;
};

export type Allowance = { ok: true; eventIds: number[] } | { ok: false; limit: Limit; retryAfterSeconds: number };

// Bucket names never contain "|", so bucket and key cannot run into each other.
const lockKey = (l: Limit) => `${l.bucket}|${l.key}`;

/** Records one event for every limit, or none when any of them is used up. */
export async function takeAllowance(limits: readonly Limit[], { now = new Date() }: { now?: Date } = {}): Promise<Allowance> {
  const ordered = [...limits].sort((a, b) => (lockKey(a) < lockKey(b) ? -1 : lockKey(a) > lockKey(b) ? 1 : 0));
  return db().transaction(async (tx) => {
    for (const limit of ordered) await tx.execute(sql`SELECT pg_advisory_xact_lock(hashtextextended(${lockKey(limit)}, 0))`);
    for (const limit of ordered) {
      const since = new Date(now.getTime() - limit.windowSeconds * 1000);
      const [row] = await tx
        .select({ n: sql<number>`count(*)::int`, oldest: sql<string | null>`min(${rateLimitEvents.createdAt})::text` })
        .from(rateLimitEvents)
        .where(and(eq(rateLimitEvents.bucket, limit.bucket), eq(rateLimitEvents.key, limit.key), gte(rateLimitEvents.createdAt, since)));
      if ((row?.n ?? 0) >= limit.max) {
        const oldest = row?.oldest ? new Date(row.oldest).getTime() : now.getTime();
        return { ok: false as const, limit, retryAfterSeconds: Math.max(1, Math.ceil((oldest + limit.windowSeconds * 1000 - now.getTime()) / 1000)) };
      }
    }
    const inserted = await tx
      .insert(rateLimitEvents)
      .values(ordered.map((l) => ({ bucket: l.bucket, key: l.key, createdAt: now })))
      .returning({ id: rateLimitEvents.id });
    return { ok: true as const, eventIds: inserted.map((r) => r.id) };
  });
}

/** Takes back events (the attempt they paid for turned out not to count, e.g. a good password). */
export async function returnAllowance(eventIds: readonly number[]): Promise<void> {
  if (eventIds.length) await db().delete(rateLimitEvents).where(inArray(rateLimitEvents.id, [...eventIds]));
}

/** Forgets every event of a bucket and key, or of every key starting with keyPrefix. */
export async function clearLimit({ bucket, key, keyPrefix }: { bucket: string; key?: string; keyPrefix?: string }): Promise<void> {
  const match = key !== undefined ? eq(rateLimitEvents.key, key) : sql`starts_with(${rateLimitEvents.key}, ${keyPrefix ?? ""})`;
  await db().delete(rateLimitEvents).where(and(eq(rateLimitEvents.bucket, bucket), match));
}

/** "Wait 3 minutes" / "Wait 40 seconds", for the sentences of 429 answers. */
export function waitPhrase(seconds: number): string {
  if (seconds < 60) return `Wait ${seconds} second${seconds === 1 ? "" : "s"}`;
  const minutes = Math.ceil(seconds / 60);
  return `Wait ${minutes} minute${minutes === 1 ? "" : "s"}`;
}

/** Throws a 429 with the given sentence (and a Retry-After) unless every limit allows one more. */
export async function enforceLimits(limits: readonly Limit[], message: (retryAfterSeconds: number, limit: Limit) => string): Promise<number[]> {
  const allowance = await takeAllowance(limits);
  if (!allowance.ok) throw new AppError("too_many_requests", message(allowance.retryAfterSeconds, allowance.limit), { retryAfterSeconds: allowance.retryAfterSeconds });
  return allowance.eventIds;
}
