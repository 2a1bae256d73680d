import "server-only";
import { transaction } from "@/db/client";
import { isUniqueViolation } from "@/db/errors";
import { findLiveAuthToken, takeAuthToken } from "@/db/queries/accounts";
import { logActivity } from "@/db/queries/activity";
import { getUserByEmail, setUserPassword } from "@/db/queries/users";
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
  const token = await issueAuthToken({ workspaceId: user.workspaceId, userId: user.id, purpose: "reset", ttlMs: RESET_TTL_MINUTES * 60_000 });
  const mail = passwordResetEmail({ link: setPasswordLink(token), expiresMinutes: RESET_TTL_MINUTES });
  await sendMail({ workspaceId: user.workspaceId, kind: "password_reset", to: user.email, ...mail });
  return { message: FORGOT_PASSWORD_REPLY };
}

export const INVALID_LINK_MESSAGE = "This link is not valid any more: it was already used, replaced by a newer one, or has expired. Ask for a new one.";
export const ADDRESS_TAKEN_MESSAGE =
  "This e-mail address already has a Partproof account, so this invitation cannot be accepted with it. Sign in with that account, or ask whoever invited you to invite another address.";

const invalidLink = () => new AppError("bad_request", INVALID_LINK_MESSAGE, { fieldErrors: { token: INVALID_LINK_MESSAGE } });

/**
 * Sets a password from an invitation, reset or sign-up link; the link works once. The token is
 * looked up before the (deliberately slow) password hash is computed, so unknown tokens cost
 * nothing, and attempts are limited per address and per account. Ends the account's other
 * sessions and lifts a sign-in lock-out (the e-mail proved the owner).
 */
export async function setPasswordWithToken({ token, password, ip }: { token: string; password: string; ip: string }) {
  await limitSetPasswordByAddress({ ip });
  const authToken = await findLiveAuthToken({ tokenHash: hashToken(token) });
  const signUp = authToken ? null : await findSignUpRequest(token);
  if (!authToken && !signUp) throw invalidLink();
  await limitSetPasswordByAccount({ key: authToken ? authToken.userId : signUp!.email });
  const passwordHash = await hashPassword(password);

  if (signUp) {
    const created = await transaction((tx) => completeSignUp(tx, { requestId: signUp.id, passwordHash }));
    if (!created) throw invalidLink();
    return { email: created.email, message: "Your workspace is ready and your password is set. Sign in with it now." };
  }
  const { email } = await setAccountPassword({ token, passwordHash });
  await unlockAccount({ email });
  return { email, message: "Your password is set. Sign in with it now." };
}

async function setAccountPassword({ token, passwordHash }: { token: string; passwordHash: string }) {
  try {
    return await transaction(async (tx) => {
      const row = await takeAuthToken(tx, { tokenHash: hashToken(token) });
      if (!row) throw invalidLink();
      // Throwing rolls back the link's use too: a deactivated account's link stays as it was.
      if (!row.active) throw new AppError("forbidden", "This account has been deactivated. Ask your QC lead to reactivate it.");
      await setUserPassword(tx, { userId: row.userId, passwordHash });
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
