import "server-only";
import { transaction } from "@/db/client";
import { isUniqueViolation } from "@/db/errors";
import { logActivity } from "@/db/queries/activity";
import { countActiveLeads, emailInWorkspace, getPerson, getUserByEmail, getUserInWorkspace, insertUser, lockUserInWorkspace, lockWorkspaceLeads, updateUserFields } from "@/db/queries/users";
import type { SessionUser } from "@/lib/auth/require-user";
import type { InviteInput, UpdatePersonInput } from "@/lib/auth/schemas";
import { INVITE_TTL_HOURS, issueAuthToken } from "@/lib/auth/tokens";
import { AppError, notFound } from "@/lib/errors";
import { sendMail } from "@/lib/mail/send";
import { invitationEmail, invitationToExistingAccountEmail } from "@/lib/mail/templates";
import { setPasswordLink } from "@/lib/accounts/links";

export const DUPLICATE_PERSON_MESSAGE = "Someone in your workspace already uses this e-mail address.";

export type InvitationDelivery = { emailSent: boolean; emailQueued: boolean };

const delivery = (status: "sent" | "queued" | "failed"): InvitationDelivery => ({ emailSent: status === "sent", emailQueued: status === "queued" });

async function sendInvitation(actor: SessionUser, user: { id: string; email: string }, token: string | null): Promise<InvitationDelivery> {
  const mail = token
    ? invitationEmail({ inviterName: actor.name, workspaceName: actor.workspaceName, link: setPasswordLink(token), expiresHours: INVITE_TTL_HOURS })
    : invitationToExistingAccountEmail({ inviterName: actor.name, workspaceName: actor.workspaceName });
  const sent = await sendMail({ workspaceId: actor.workspaceId, kind: "invitation", to: user.email, ...mail });
  return delivery(sent.status);
}

/**
 * Creates the account (without a password) and e-mails a one-time link to set one. The account
 * is committed before the e-mail goes out; if the mail server does not take it, it is queued and
 * retried (lib/mail/send.ts) and People shows it pending.
 *
 * The answer is the same whether or not the address has an account in another workspace, so a
 * lead cannot probe addresses: such an invitation is recorded like any other, but its e-mail
 * tells the address's owner that it cannot be accepted with that address, and no link is made
 * (users_email_key would refuse it anyway).
 */
export async function invitePerson(actor: SessionUser, input: InviteInput) {
  if (await emailInWorkspace({ workspaceId: actor.workspaceId, email: input.email })) {
    throw new AppError("conflict", DUPLICATE_PERSON_MESSAGE, { fieldErrors: { email: DUPLICATE_PERSON_MESSAGE } });
  }
  const takenElsewhere = Boolean((await getUserByEmail({ email: input.email }))?.passwordHash);
  let created: { id: string; email: string }, token: string | null;
  try {
    ({ created, token } = await transaction(async (tx) => {
      const row = await insertUser(tx, { workspaceId: actor.workspaceId, email: input.email, name: input.name, roles: input.roles, passwordHash: null });
      const t = takenElsewhere ? null : await issueAuthToken({ workspaceId: actor.workspaceId, userId: row.id, purpose: "invite", ttlMs: INVITE_TTL_HOURS * 3_600_000 }, tx);
      await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "user.invited", subjectType: "user", subjectId: row.id, detail: { email: input.email, roles: input.roles } });
      return { created: row, token: t };
    }));
  } catch (err) {
    if (isUniqueViolation(err, "users_workspace_email_key")) throw new AppError("conflict", DUPLICATE_PERSON_MESSAGE, { fieldErrors: { email: DUPLICATE_PERSON_MESSAGE } });
    throw err;
  }
  const sent = await sendInvitation(actor, created, token);
  return { person: (await getPerson({ workspaceId: actor.workspaceId, userId: created.id }))!, ...sent };
}

/** What the lead is told after inviting or re-sending. */
export function invitationMessage(person: { name: string; email: string }, sent: InvitationDelivery): string {
  if (sent.emailSent) return `Invitation sent to ${person.email}.`;
  if (sent.emailQueued)
    return `The mail server did not take the invitation to ${person.email} yet, so it is queued and goes out by itself once the server answers. People shows it as pending until then.`;
  return `${person.name} was added, but the invitation e-mail could not be sent. Use “Resend invitation” once mail works again.`;
}

export async function resendInvitation(actor: SessionUser, userId: string) {
  const user = await getUserInWorkspace({ workspaceId: actor.workspaceId, userId });
  if (!user) throw notFound("That person");
  if (user.passwordHash) throw new AppError("conflict", "This person has already set a password; they can use “Forgot password” instead.");
  if (!user.active) throw new AppError("conflict", "This account is deactivated; reactivate it before sending a new invitation.");
  const takenElsewhere = Boolean((await getUserByEmail({ email: user.email }))?.passwordHash);
  const token = takenElsewhere ? null : await issueAuthToken({ workspaceId: actor.workspaceId, userId, purpose: "invite", ttlMs: INVITE_TTL_HOURS * 3_600_000 });
  const sent = await sendInvitation(actor, user, token);
  return { ...sent, message: invitationMessage(user, sent) };
}

/**
 * Edits name, roles or the active flag. Deactivating bumps the token version so the person's
 * open sessions end on their next request. A workspace always keeps one active lead.
 */
export async function updatePerson(actor: SessionUser, userId: string, input: UpdatePersonInput) {
  await transaction(async (tx) => {
    const user = await lockUserInWorkspace(tx, { workspaceId: actor.workspaceId, userId });
    if (!user) throw notFound("That person");
    if (userId === actor.id && input.active === false) throw new AppError("conflict", "You cannot deactivate your own account.");
    const losesLead = user.roles.includes("lead") && ((input.roles && !input.roles.includes("lead")) || input.active === false);
    if (losesLead && user.active) {
      // Lock the workspace's lead rows so two leads demoting each other can't both succeed.
      await lockWorkspaceLeads(tx, { workspaceId: actor.workspaceId });
      if ((await countActiveLeads({ workspaceId: actor.workspaceId }, tx)) <= 1) {
        throw new AppError("conflict", "A workspace needs at least one active lead. Make someone else a lead first.");
      }
    }
    const deactivating = input.active === false && user.active;
    await updateUserFields(tx, {
      workspaceId: actor.workspaceId,
      userId,
      fields: {
        ...(input.name !== undefined && { name: input.name }),
        ...(input.roles !== undefined && { roles: input.roles }),
        ...(input.active !== undefined && { active: input.active }),
      },
      endSessions: deactivating,
    });
    await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "user.updated", subjectType: "user", subjectId: userId, detail: { ...input } });
  });
  return getPerson({ workspaceId: actor.workspaceId, userId });
}
