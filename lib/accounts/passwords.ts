import "server-only";
import { and, eq, gt, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { getUserByEmail } from "@/db/queries/users";
import { authTokens, users } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { clearSignInFailures } from "@/lib/auth/rate-limit";
import { hashToken, issueAuthToken, RESET_TTL_MINUTES } from "@/lib/auth/tokens";
import { AppError } from "@/lib/errors";
import { sendMail } from "@/lib/mail/send";
import { passwordResetEmail } from "@/lib/mail/templates";
import { setPasswordLink } from "./links";

export const FORGOT_PASSWORD_REPLY = "If an active account uses that address, we have sent it a link to choose a new password. Check your inbox.";

/** Sends a reset link to an active account; answers the same either way so accounts can't be probed. */
export async function requestPasswordReset({ email }: { email: string }) {
  const user = await getUserByEmail({ email });
  if (!user || !user.active) return { message: FORGOT_PASSWORD_REPLY };
  const token = await issueAuthToken(db(), { workspaceId: user.workspaceId, userId: user.id, purpose: "reset", ttlMs: RESET_TTL_MINUTES * 60_000 });
  const mail = passwordResetEmail({ link: setPasswordLink(token), expiresMinutes: RESET_TTL_MINUTES });
  await sendMail({ workspaceId: user.workspaceId, kind: "password_reset", to: user.email, ...mail });
  return { message: FORGOT_PASSWORD_REPLY };
}

export const INVALID_LINK_MESSAGE = "This link is not valid any more: it was already used, replaced by a newer one, or has expired. Ask for a new one.";

/** Sets a password from an invitation or reset link; the link works once. Ends other sessions. */
export async function setPasswordWithToken({ token, password }: { token: string; password: string }) {
  const passwordHash = await hashPassword(password);
  return db().transaction(async (tx) => {
    const [row] = await tx
      .select({ id: authTokens.id, userId: authTokens.userId, workspaceId: authTokens.workspaceId, purpose: authTokens.purpose, email: users.email, active: users.active })
      .from(authTokens)
      .innerJoin(users, eq(users.id, authTokens.userId))
      .where(and(eq(authTokens.tokenHash, hashToken(token)), isNull(authTokens.usedAt), gt(authTokens.expiresAt, sql`now()`)))
      .for("update")
      .limit(1);
    if (!row) throw new AppError("bad_request", INVALID_LINK_MESSAGE, { fieldErrors: { token: INVALID_LINK_MESSAGE } });
    if (!row.active) throw new AppError("forbidden", "This account has been deactivated. Ask your QC lead to reactivate it.");
    await tx.update(authTokens).set({ usedAt: new Date() }).where(eq(authTokens.id, row.id));
    await tx
      .update(users)
      .set({ passwordHash, tokenVersion: sql`${users.tokenVersion} + 1`, updatedAt: new Date() })
      .where(eq(users.id, row.userId));
    await logActivity(tx, {
      workspaceId: row.workspaceId,
      actorId: row.userId,
      action: row.purpose === "invite" ? "user.invitation_accepted" : "user.password_reset",
      subjectType: "user",
      subjectId: row.userId,
    });
    await clearSignInFailures({ email: row.email });
    return { email: row.email };
  });
}
