import "server-only";
/**
 * Signing a company up, in two steps so the answer never tells whether an address has an
 * account: the request only sends an e-mail (a confirmation link, or to an address that already
 * has an account a note saying so) and answers the same sentence either way; the workspace and
 * its lead are created when the link is used, with the password chosen there (passwords.ts).
 */
import crypto from "node:crypto";
import type { Tx } from "@/db/client";
import { isUniqueViolation } from "@/db/errors";
import { findLiveSignUpRequest, insertSignUpRequest, takeSignUpRequest } from "@/db/queries/accounts";
import { logActivity } from "@/db/queries/activity";
import { getUserByEmail, insertUser } from "@/db/queries/users";
import { insertWorkspace } from "@/db/queries/workspaces";
import type { SignUpInput } from "@/lib/auth/schemas";
import { hashToken } from "@/lib/auth/tokens";
import { AppError } from "@/lib/errors";
import { sendMail } from "@/lib/mail/send";
import { existingAccountEmail, signUpConfirmationEmail } from "@/lib/mail/templates";
import { addStarterPartTypes } from "@/lib/part-types/starters";
import { setPasswordLink, signInLink } from "./links";
import { slugify } from "./slugify";

export const SIGN_UP_TTL_HOURS = 24;

export const signUpReply = (email: string) =>
  `Check your inbox: we have sent a message to ${email}. Follow its link within ${SIGN_UP_TTL_HOURS} hours to confirm the address and choose your password.`;

export async function requestSignUp(input: SignUpInput): Promise<{ message: string }> {
  const existing = await getUserByEmail({ email: input.email });
  if (existing?.passwordHash) {
    await sendMail({ workspaceId: null, kind: "sign_up", to: input.email, ...existingAccountEmail({ signInLink: signInLink() }) });
    return { message: signUpReply(input.email) };
  }
  const token = crypto.randomBytes(32).toString("base64url");
  await insertSignUpRequest({
    email: input.email,
    companyName: input.companyName,
    name: input.name,
    starterPartTypes: input.starterPartTypes,
    tokenHash: hashToken(token),
    expiresAt: new Date(Date.now() + SIGN_UP_TTL_HOURS * 3_600_000),
  });
  await sendMail({
    workspaceId: null,
    kind: "sign_up",
    to: input.email,
    ...signUpConfirmationEmail({ companyName: input.companyName, link: setPasswordLink(token), expiresHours: SIGN_UP_TTL_HOURS }),
  });
  return { message: signUpReply(input.email) };
}

export const ACCOUNT_EXISTS_MESSAGE = "An account with this e-mail address already exists. Sign in, or reset your password.";

/** The live sign-up request of a token, if any (no lock; for checking a token before hashing). */
export function findSignUpRequest(token: string) {
  return findLiveSignUpRequest({ tokenHash: hashToken(token) });
}

/** Creates the workspace and its lead from a confirmed sign-up, inside the caller's transaction. */
export async function completeSignUp(tx: Tx, { requestId, passwordHash }: { requestId: string; passwordHash: string }): Promise<{ email: string } | null> {
  const request = await takeSignUpRequest(tx, { requestId });
  if (!request) return null;
  const slug = `${slugify(request.companyName)}-${crypto.randomBytes(3).toString("hex")}`;
  const workspace = await insertWorkspace(tx, { name: request.companyName, slug });
  let user: { id: string };
  try {
    user = await insertUser(tx, { workspaceId: workspace.id, email: request.email, name: request.name, passwordHash, roles: ["lead"] });
  } catch (err) {
    // The address got a password account since the request (another sign-up, an accepted
    // invitation); throwing rolls the whole confirmation back, the request stays unused.
    if (isUniqueViolation(err, "users_email_key")) throw new AppError("conflict", ACCOUNT_EXISTS_MESSAGE);
    throw err;
  }
  await logActivity(tx, { workspaceId: workspace.id, actorId: user.id, action: "workspace.created", subjectType: "workspace", subjectId: workspace.id, detail: { name: workspace.name } });
  await addStarterPartTypes(tx, { workspaceId: workspace.id, actorId: user.id, slugs: request.starterPartTypes });
  return { email: request.email };
}
