import "server-only";
import crypto from "node:crypto";
import { and, eq, isNull } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { authTokens, users } from "@/db/schema";

export const INVITE_TTL_HOURS = 72;
export const RESET_TTL_MINUTES = 60;

export function hashToken(token: string): string {
  return crypto.createHash("sha256").update(token).digest("hex");
}

/**
 * Issues a one-time token (256 random bits, base64url). Only its hash is stored; earlier unused
 * tokens of the same purpose for the user are voided so only the newest link works. The user's
 * row is locked first, so two requests at once cannot both leave a live token behind (the
 * partial unique index auth_tokens_live_key holds the same rule in the database).
 */
export async function issueAuthToken(
  tx: DbOrTx,
  { workspaceId, userId, purpose, ttlMs }: { workspaceId: string; userId: string; purpose: "invite" | "reset"; ttlMs: number },
): Promise<string> {
  return tx.transaction(async (inner) => {
    await inner.select({ id: users.id }).from(users).where(eq(users.id, userId)).for("update");
    const token = crypto.randomBytes(32).toString("base64url");
    const now = new Date();
    await inner
      .update(authTokens)
      .set({ usedAt: now })
      .where(and(eq(authTokens.userId, userId), eq(authTokens.purpose, purpose), isNull(authTokens.usedAt)));
    await inner.insert(authTokens).values({ workspaceId, userId, purpose, tokenHash: hashToken(token), expiresAt: new Date(now.getTime() + ttlMs) });
    return token;
  });
}
