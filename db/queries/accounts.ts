import "server-only";
/**
 * One-time links and sign-up requests: only a token's SHA-256 is stored (lib/auth/tokens.ts makes
 * the token and its hash); a link is live while unused and unexpired, by the database's clock.
 */
import { and, eq, gt, isNotNull, isNull, lt, or, sql } from "drizzle-orm";
import { db, type DbOrTx, type Tx } from "@/db/client";
import { authTokens, signUpRequests, users } from "@/db/schema";

type TokenPurpose = "invite" | "reset";
type NewSignUpRequest = typeof signUpRequests.$inferInsert;

const liveToken = (tokenHash: string) => and(eq(authTokens.tokenHash, tokenHash), isNull(authTokens.usedAt), gt(authTokens.expiresAt, sql`now()`));

/**
 * Stores a new link for the user and voids the user's earlier unused links of the same purpose,
 * so only the newest works. The user's row is locked first, so two requests at once cannot both
 * leave a live link behind (auth_tokens_live_key holds the same rule). Inside `tx` when given (a
 * savepoint), else in its own transaction.
 */
export async function replaceAuthToken(
  { workspaceId, userId, purpose, tokenHash, expiresAt }: { workspaceId: string; userId: string; purpose: TokenPurpose; tokenHash: string; expiresAt: Date },
  tx: DbOrTx = db(),
): Promise<void> {
  await tx.transaction(async (inner) => {
    await inner.select({ id: users.id }).from(users).where(eq(users.id, userId)).for("update");
    await inner
      .update(authTokens)
      .set({ usedAt: new Date() })
      .where(and(eq(authTokens.userId, userId), eq(authTokens.purpose, purpose), isNull(authTokens.usedAt)));
    await inner.insert(authTokens).values({ workspaceId, userId, purpose, tokenHash, expiresAt });
  });
}

/** A live link's id and user (no lock; for checking a token before the slow password hash). */
export async function findLiveAuthToken({ tokenHash }: { tokenHash: string }) {
  const [row] = await db().select({ id: authTokens.id, userId: authTokens.userId }).from(authTokens).where(liveToken(tokenHash)).limit(1);
  return row ?? null;
}

/** A live link with its account, locked for the rest of the transaction, and marked used. Null when not live. */
export async function takeAuthToken(tx: Tx, { tokenHash }: { tokenHash: string }) {
  const [row] = await tx
    .select({ id: authTokens.id, userId: authTokens.userId, workspaceId: authTokens.workspaceId, purpose: authTokens.purpose, email: users.email, active: users.active })
    .from(authTokens)
    .innerJoin(users, eq(users.id, authTokens.userId))
    .where(liveToken(tokenHash))
    .for("update")
    .limit(1);
  if (!row) return null;
  await tx.update(authTokens).set({ usedAt: new Date() }).where(eq(authTokens.id, row.id));
  return row;
}

export async function insertSignUpRequest(values: NewSignUpRequest) {
  await db().insert(signUpRequests).values(values);
}

const liveSignUp = () => and(isNull(signUpRequests.usedAt), gt(signUpRequests.expiresAt, sql`now()`));

/** The live sign-up request of a token hash, if any (no lock; for checking a token before hashing). */
export async function findLiveSignUpRequest({ tokenHash }: { tokenHash: string }) {
  const [row] = await db()
    .select({ id: signUpRequests.id, email: signUpRequests.email })
    .from(signUpRequests)
    .where(and(eq(signUpRequests.tokenHash, tokenHash), liveSignUp()))
    .limit(1);
  return row ?? null;
}

/** The live request, locked and marked used; null when it was used or expired meanwhile. */
export async function takeSignUpRequest(tx: Tx, { requestId }: { requestId: string }) {
  const [request] = await tx
    .select()
    .from(signUpRequests)
    .where(and(eq(signUpRequests.id, requestId), liveSignUp()))
    .for("update");
  if (!request) return null;
  await tx.update(signUpRequests).set({ usedAt: new Date() }).where(eq(signUpRequests.id, request.id));
  return request;
}

/** Links expired before `before`, or used before it; returns how many went. */
export async function deleteAuthTokensSpentBefore(before: Date): Promise<number> {
  const rows = await db()
    .delete(authTokens)
    .where(or(lt(authTokens.expiresAt, before), and(isNotNull(authTokens.usedAt), lt(authTokens.usedAt, before))))
    .returning({ id: authTokens.id });
  return rows.length;
}

/** Sign-up requests expired before `before`; returns how many went. */
export async function deleteSignUpRequestsExpiredBefore(before: Date): Promise<number> {
  const rows = await db().delete(signUpRequests).where(lt(signUpRequests.expiresAt, before)).returning({ id: signUpRequests.id });
  return rows.length;
}
