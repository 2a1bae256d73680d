import "server-only";
/**
 * The worker's hourly clean-up of what the account protections leave behind: rate-limit events
 * older than any window that counts them (a day is far past the longest), revoked sessions whose
 * cookie has expired anyway, spent or expired one-time links, and unconfirmed sign-ups.
 */
import { and, isNotNull, lt, or } from "drizzle-orm";
import { db } from "@/db/client";
import { authTokens, rateLimitEvents, revokedSessions, signUpRequests } from "@/db/schema";

const DAY_MS = 24 * 3_600_000;

export type PruneReport = { rateLimitEvents: number; revokedSessions: number; authTokens: number; signUpRequests: number };

export async function pruneAccountRecords({ now = new Date() }: { now?: Date } = {}): Promise<PruneReport> {
  const dayAgo = new Date(now.getTime() - DAY_MS);
  const events = await db().delete(rateLimitEvents).where(lt(rateLimitEvents.createdAt, dayAgo)).returning({ id: rateLimitEvents.id });
  const sessions = await db().delete(revokedSessions).where(lt(revokedSessions.expiresAt, now)).returning({ id: revokedSessions.sessionId });
  // Kept a day past use or expiry, so "this link was already used" stays answerable for a while.
  const tokens = await db()
    .delete(authTokens)
    .where(or(lt(authTokens.expiresAt, dayAgo), and(isNotNull(authTokens.usedAt), lt(authTokens.usedAt, dayAgo))))
    .returning({ id: authTokens.id });
  const signUps = await db().delete(signUpRequests).where(lt(signUpRequests.expiresAt, dayAgo)).returning({ id: signUpRequests.id });
  return { rateLimitEvents: events.length, revokedSessions: sessions.length, authTokens: tokens.length, signUpRequests: signUps.length };
}
