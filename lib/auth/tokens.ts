import "server-only";
import crypto from "node:crypto";
import type { DbOrTx } from "@/db/client";
import { replaceAuthToken } from "@/db/queries/accounts";

export const INVITE_TTL_HOURS = 72;
export const RESET_TTL_MINUTES = 60;

export function hashToken(token: string): string {
  return crypto.createHash("sha256").update(token).digest("hex");
}

/**
 * Issues a one-time token (256 random bits, base64url). Only its hash is stored, and the user's
 * earlier unused links of the same purpose stop working (db/queries/accounts.ts replaceAuthToken):
 * only the newest link works. Inside `tx` when given.
 */
export async function issueAuthToken({ workspaceId, userId, purpose, ttlMs }: { workspaceId: string; userId: string; purpose: "invite" | "reset"; ttlMs: number }, tx?: DbOrTx): Promise<string> {
  const token = crypto.randomBytes(32).toString("base64url");
  await replaceAuthToken({ workspaceId, userId, purpose, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + ttlMs) }, tx);
  return token;
}
