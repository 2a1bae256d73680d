import "server-only";
/**
 * The worker's hourly clean-up of what the account protections leave behind: rate-limit counters
 * of windows long over (a day is far past the longest), revoked sessions whose
 * cookie has expired anyway, spent or expired one-time links, and unconfirmed sign-ups.
 */
import { deleteAuthTokensSpentBefore, deleteSignUpRequestsExpiredBefore } from "@/db/queries/accounts";
import { deleteCountsBefore } from "@/db/queries/rate-limits";
import { deleteRevokedSessionsExpiredBefore } from "@/db/queries/users";

const DAY_MS = 24 * 3_600_000;

export type PruneReport = { rateLimitCounters: number; revokedSessions: number; authTokens: number; signUpRequests: number };

export async function pruneAccountRecords({ now = new Date() }: { now?: Date } = {}): Promise<PruneReport> {
  const dayAgo = new Date(now.getTime() - DAY_MS);
  return {
    // Windows are at most an hour long: a counter whose window began a day ago counts nothing.
    rateLimitCounters: await deleteCountsBefore(dayAgo),
    revokedSessions: await deleteRevokedSessionsExpiredBefore(now),
    // Kept a day past use or expiry, so "this link was already used" stays answerable for a while.
    authTokens: await deleteAuthTokensSpentBefore(dayAgo),
    signUpRequests: await deleteSignUpRequestsExpiredBefore(dayAgo),
  };
}
