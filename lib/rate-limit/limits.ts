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
import { deleteCounts, giveCountBack, takeCount } from "@/db/queries/rate-limits";
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

/** Counts the request against every limit, or against none when any of them is used up. */
export async function takeAllowance(limits: readonly Limit[], { now = new Date() }: { now?: Date } = {}): Promise<Allowance> {
  const taken: Taken[] = [];
  for (const limit of limits) {
    const one = await takeCount({ ...limit, now });
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
  for (const t of taken) await giveCountBack(t);
}

/** Forgets every count of a bucket and key, or of every key starting with keyPrefix. */
export async function clearLimit(which: { bucket: string; key?: string; keyPrefix?: string }): Promise<void> {
  await deleteCounts(which);
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
