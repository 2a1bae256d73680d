import "server-only";
import { and, eq, gt, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { isUniqueViolation } from "@/db/errors";
import { logActivity } from "@/db/queries/activity";
import { getUserByEmail } from "@/db/queries/users";
import { authTokens, users } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { unlockAccount } from "@/lib/auth/rate-limit";
import { hashToken, issueAuthToken, RESET_TTL_MINUTES } from "@/lib/auth/tokens";
import { AppError } from "@/lib/errors";
import { sendMail } from "@/lib/mail/send";
import { passwordResetEmail } from "@/lib/mail/templates";
import { setPasswordLink } from "./links";
import { limitForgotPassword, limitSetPasswordByAccount, limitSetPasswordByAddress } from "./public-limits";
import { completeSignUp, findSignUpRequest } from "./sign-up";

export const FORGOT_PASSWORD_REPLY = "If an active account uses that address, we have sent it a link to choose a new password. Check your inbox.";

/**
 * Sends a reset link to an active account; answers the same either way so accounts can't be
 * probed (the limits count known and unknown addresses alike).
 */
export async function requestPasswordReset({ email, ip }: { email: string; ip: string }) {
  await limitForgotPassword({ ip, email });
  const user = await getUserByEmail({ email });
  if (!user || !user.active) return { message: FORGOT_PASSWORD_REPLY };
  const token = await issueAuthToken(db(), { workspaceId: user.workspaceId, userId: user.id, purpose: "reset", ttlMs: RESET_TTL_MINUTES * 60_000 });
  const mail = passwordResetEmail({ link: setPasswordLink(token), expiresMinutes: RESET_TTL_MINUTES });
  await sendMail({ workspaceId: user.workspaceId, kind: "password_reset", to: user.email, ...mail });
  return { message: FORGOT_PASSWORD_REPLY };
}

export const INVALID_LINK_MESSAGE = "This link is not valid any more: it was already used, replaced by a newer one, or has expired. Ask for a new one.";
export const ADDRESS_TAKEN_MESSAGE =
  "This e-mail address already has a Partproof account, so this invitation cannot be accepted with it. Sign in with that account, or ask whoever invited you to invite another address.";

const invalidLink = () => new AppError("bad_request", INVALID_LINK_MESSAGE, { fieldErrors: { token: INVALID_LINK_MESSAGE } });

async function findAuthToken(token: string) {
  const [row] = await db()
    .select({ id: authTokens.id, userId: authTokens.userId })
    .from(authTokens)
    .where(and(eq(authTokens.tokenHash, hashToken(token)), isNull(authTokens.usedAt), gt(authTokens.expiresAt, sql`now()`)))
    .limit(1);
  return row ?? null;
}

/**
 * Sets a password from an invitation, reset or sign-up link; the link works once. The token is
 * looked up before the (deliberately slow) password hash is computed, so unknown tokens cost
 * nothing, and attempts are limited per address and per account. Ends the account's other
 * sessions and lifts a sign-in lock-out (the e-mail proved the owner).
 */
export async function setPasswordWithToken({ token, password, ip }: { token: string; password: string; ip: string }) {
  await limitSetPasswordByAddress({ ip });
  const authToken = await findAuthToken(token);
  const signUp = authToken ? null : await findSignUpRequest(token);
  if (!authToken && !signUp) throw invalidLink();
  await limitSetPasswordByAccount({ key: authToken ? authToken.userId : signUp!.email });
  const passwordHash = await hashPassword(password);

  if (signUp) {
    const created = await db().transaction((tx) => completeSignUp(tx, { requestId: signUp.id, passwordHash }));
    if (!created) throw invalidLink();
    return { email: created.email, message: "Your workspace is ready and your password is set. Sign in with it now." };
  }
  const { email } = await setAccountPassword({ token, passwordHash });
  await unlockAccount({ email });
  return { email, message: "Your password is set. Sign in with it now." };
}

async function setAccountPassword({ token, passwordHash }: { token: string; passwordHash: string }) {
  try {
    return await db().transaction(async (tx) => {
      const [row] = await tx
        .select({ id: authTokens.id, userId: authTokens.userId, workspaceId: authTokens.workspaceId, purpose: authTokens.purpose, email: users.email, active: users.active })
        .from(authTokens)
        .innerJoin(users, eq(users.id, authTokens.userId))
        .where(and(eq(authTokens.tokenHash, hashToken(token)), isNull(authTokens.usedAt), gt(authTokens.expiresAt, sql`now()`)))
        .for("update")
        .limit(1);
      if (!row) throw invalidLink();
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
      return { email: row.email };
    });
  } catch (err) {
    // An invitation to an address that has a password account elsewhere (users_email_key).
    if (isUniqueViolation(err, "users_email_key")) throw new AppError("conflict", ADDRESS_TAKEN_MESSAGE);
    throw err;
  }
}
