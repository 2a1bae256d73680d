/**
 * The worker's hourly clean-up of account records (lib/rate-limit/prune.ts, scheduled in
 * lib/jobs/run-worker.ts): limit counters of windows long over, revoked sessions whose cookie has
 * expired anyway, spent or expired one-time links and unconfirmed sign-ups a day past expiry go;
 * everything still in use stays.
 */
import { eq, inArray, sql } from "drizzle-orm";
import { expect, it } from "vitest";
import { db } from "@/db/client";
import { authTokens, rateLimitCounters, revokedSessions, signUpRequests } from "@/db/schema";
import { pruneAccountRecords } from "@/lib/rate-limit/prune";
import { createUser, createWorkspace, uniqueEmail } from "../support/db";

const HOUR = 3_600_000;

it("removes what can no longer count and keeps what still can", async () => {
  const now = new Date();
  const ago = (ms: number) => new Date(now.getTime() - ms);
  const ws = await createWorkspace();
  const [old, recent] = await Promise.all([createUser({ workspaceId: ws.id, roles: ["inspector"] }), createUser({ workspaceId: ws.id, roles: ["inspector"] })]);
  const tag = uniqueEmail("prune");

  await db()
    .insert(rateLimitCounters)
    .values([
      { bucket: "prune-test", key: `${tag}|old`, windowStart: ago(25 * HOUR), count: 5 },
      { bucket: "prune-test", key: `${tag}|recent`, windowStart: ago(HOUR), count: 5 },
    ]);
  const [oldSession, liveSession] = [crypto.randomUUID(), crypto.randomUUID()];
  await db()
    .insert(revokedSessions)
    .values([
      { sessionId: oldSession, userId: old.id, expiresAt: ago(60_000) },
      { sessionId: liveSession, userId: old.id, expiresAt: new Date(now.getTime() + HOUR) },
    ]);
  const tokens = await db()
    .insert(authTokens)
    .values([
      { workspaceId: ws.id, userId: old.id, purpose: "reset", tokenHash: `${tag}-expired`, expiresAt: ago(25 * HOUR), usedAt: ago(25 * HOUR) },
      { workspaceId: ws.id, userId: old.id, purpose: "invite", tokenHash: `${tag}-spent`, expiresAt: new Date(now.getTime() + HOUR), usedAt: ago(25 * HOUR) },
      { workspaceId: ws.id, userId: recent.id, purpose: "reset", tokenHash: `${tag}-live`, expiresAt: new Date(now.getTime() + HOUR) },
      { workspaceId: ws.id, userId: recent.id, purpose: "invite", tokenHash: `${tag}-just-used`, expiresAt: new Date(now.getTime() + HOUR), usedAt: ago(HOUR) },
    ])
    .returning({ id: authTokens.id, tokenHash: authTokens.tokenHash });
  const signUps = await db()
    .insert(signUpRequests)
    .values([
      { email: `old-${tag}`, companyName: "Old Works", name: "O", tokenHash: `${tag}-signup-old`, expiresAt: ago(25 * HOUR) },
      { email: `new-${tag}`, companyName: "New Works", name: "N", tokenHash: `${tag}-signup-new`, expiresAt: new Date(now.getTime() + HOUR) },
    ])
    .returning({ id: signUpRequests.id, email: signUpRequests.email });

  const report = await pruneAccountRecords({ now });
  expect(report.rateLimitCounters).toBeGreaterThanOrEqual(1);
  expect(report.revokedSessions).toBeGreaterThanOrEqual(1);
  expect(report.authTokens).toBeGreaterThanOrEqual(2);
  expect(report.signUpRequests).toBeGreaterThanOrEqual(1);

  const counters = await db().select({ key: rateLimitCounters.key }).from(rateLimitCounters).where(eq(rateLimitCounters.bucket, "prune-test"));
  expect(counters.map((c) => c.key)).toEqual([`${tag}|recent`]);
  const sessions = await db()
    .select({ id: revokedSessions.sessionId })
    .from(revokedSessions)
    .where(inArray(revokedSessions.sessionId, [oldSession, liveSession]));
  expect(sessions.map((s) => s.id)).toEqual([liveSession]);
  const keptTokens = await db()
    .select({ tokenHash: authTokens.tokenHash })
    .from(authTokens)
    .where(
      inArray(
        authTokens.id,
        tokens.map((t) => t.id),
      ),
    );
  expect(keptTokens.map((t) => t.tokenHash).sort()).toEqual([`${tag}-just-used`, `${tag}-live`]);
  const keptSignUps = await db()
    .select({ email: signUpRequests.email })
    .from(signUpRequests)
    .where(
      inArray(
        signUpRequests.id,
        signUps.map((s) => s.id),
      ),
    );
  expect(keptSignUps.map((s) => s.email)).toEqual([`new-${tag}`]);
  // Nothing of a live account went with them.
  const [{ n }] = (await db().execute<{ n: number }>(sql`SELECT count(*)::int AS n FROM users WHERE id IN (${old.id}, ${recent.id})`)).rows;
  expect(n).toBe(2);
});
