import "server-only";
import crypto from "node:crypto";
import { and, eq, isNull } from "drizzle-orm";
import type { DbOrTx } from "@/db/client";
import { authTokens } from "@/db/schema";

export const INVITE_TTL_HOURS = 72;
export const RESET_TTL_MINUTES = 60;

export function hashToken(token: string): string {
  return crypto.createHash("sha256").update(token).digest("hex");
}

/**
 * Issues a one-time token (256 random bits, base64url). Only its hash is stored; earlier unused
 * tokens of the same purpose for the user are voided so only the newest link works.
 */
export async function issueAuthToken(
  tx: DbOrTx,
  { workspaceId, userId, purpose, ttlMs }: { workspaceId: string; userId: string; purpose: "invite" | "reset"; ttlMs: number },
): Promise<string> {
  const token = crypto.randomBytes(32).toString("base64url");
  const now = new Date();
  await tx
    .update(authTokens)
    .set({ usedAt: now })
    .where(and(eq(authTokens.userId, userId), eq(authTokens.purpose, purpose), isNull(authTokens.usedAt)));
  await tx.insert(authTokens).values({ workspaceId, userId, purpose, tokenHash: hashToken(token), expiresAt: new Date(now.getTime() + ttlMs) });
  return token;
}
