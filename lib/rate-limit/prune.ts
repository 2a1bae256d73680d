import "server-only";
/**
 * The worker's hourly clean-up of what the account protections leave behind: rate-limit counters
 * of windows long over (a day is far past the longest), revoked sessions whose
 * cookie has expired anyway, spent or expired one-time links, and unconfirmed sign-ups.
 */
import { and, isNotNull, lt, or } from "drizzle-orm";
import { db } from "@/db/client";
import { authTokens, rateLimitCounters, revokedSessions, signUpRequests } from "@/db/schema";

const DAY_MS = 24 * 3_600_000;

export type PruneReport = { rateLimitCounters: number; revokedSessions: number; authTokens: number; signUpRequests: number };

export async function pruneAccountRecords({ now = new Date() }: { now?: Date } = {}): Promise<PruneReport> {
  const dayAgo = new Date(now.getTime() - DAY_MS);
  // Windows are at most an hour long: a counter whose window began a day ago counts nothing.
  const counters = await db().delete(rateLimitCounters).where(lt(rateLimitCounters.windowStart, dayAgo)).returning({ key: rateLimitCounters.key });
  const sessions = await db().delete(revokedSessions).where(lt(revokedSessions.expiresAt, now)).returning({ id: revokedSessions.sessionId });
  // Kept a day past use or expiry, so "this link was already used" stays answerable for a while.
  const tokens = await db()
    .delete(authTokens)
    .where(or(lt(authTokens.expiresAt, dayAgo), and(isNotNull(authTokens.usedAt), lt(authTokens.usedAt, dayAgo))))
    .returning({ id: authTokens.id });
  const signUps = await db().delete(signUpRequests).where(lt(signUpRequests.expiresAt, dayAgo)).returning({ id: signUpRequests.id });
  return { rateLimitCounters: counters.length, revokedSessions: sessions.length, authTokens: tokens.length, signUpRequests: signUps.length };
}
