import "server-only";
/**
 * Handing a message to the mail server, now (lib/mail/send.ts) or from the worker's mail-send
 * queue, which retries a queued message with backoff until the server takes it or the retries
 * run out (then the Outbox shows it failed, with the server's last answer).
 *
 * A queued message rests in pgboss.job for days and often holds a one-time link that sets a
 * password (auth_tokens keeps only its hash), so the job carries it sealed with a key derived
 * from NEXTAUTH_SECRET (lib/signing/sealed-box.ts): whoever can read the database cannot read it.
 */
import { getOutgoingEmailStatus, recordDeliveryAttempt } from "@/db/queries/emails";
import { env } from "@/lib/env";
import { open, seal } from "@/lib/signing/sealed-box";
import type { OutgoingMessage } from "./send";
import { mailTransport } from "./transport";

export type DeliveryAttempt = { ok: true; messageId: string | null } | { ok: false; error: string };

export async function deliverNow(message: Pick<OutgoingMessage, "to" | "subject" | "text" | "html" | "attachments" | "kind">): Promise<DeliveryAttempt> {
  try {
    const info = await mailTransport().sendMail({
      from: env().MAIL_FROM,
      to: message.to,
      subject: message.subject,
      text: message.text,
      html: message.html,
      attachments: message.attachments,
    });
    return { ok: true, messageId: info.messageId ?? null };
  } catch (err) {
    const error = err instanceof Error ? err.message : String(err);
    console.error(`E-mail (${message.kind}) to ${message.to} not delivered: ${error}`);
    return { ok: false, error };
  }
}

const SEAL_PURPOSE = "mail-job";

/** The message as sealed into a job (attachments as base64). */
type QueuedMessage = Omit<OutgoingMessage, "attachments" | "workspaceId"> & { attachments?: { filename: string; contentBase64: string; contentType?: string }[] };

/** What a mail-send job carries: the row to update and the sealed message. */
export type MailDeliveryJob = { emailId: string; sealed: string };

export function mailDeliveryJob({ emailId, message }: { emailId: string; message: OutgoingMessage }): MailDeliveryJob {
  const { attachments, workspaceId: _workspaceId, ...rest } = message;
  const queued: QueuedMessage = { ...rest, attachments: attachments?.map((a) => ({ filename: a.filename, contentType: a.contentType, contentBase64: a.content.toString("base64") })) };
  return { emailId, sealed: seal(SEAL_PURPOSE, queued, { secret: env().NEXTAUTH_SECRET }) };
}

/** Why a queued message can never go out (it is marked failed at once, not retried). */
const UNREADABLE = "The queued message could not be read back (NEXTAUTH_SECRET differs from the one it was queued with); send it again.";

/**
 * Worker side: one retry of a queued message. Throws while the server still refuses, so pg-boss
 * tries again later; on the last attempt the row is marked failed instead.
 */
export async function retryQueuedMail(job: MailDeliveryJob, { isLastAttempt }: { isLastAttempt: boolean }): Promise<"sent" | "already sent" | "failed"> {
  const current = await getOutgoingEmailStatus({ emailId: job.emailId });
  if (!current || current === "sent") return "already sent";
  const message = open<QueuedMessage>(SEAL_PURPOSE, job.sealed, { secret: env().NEXTAUTH_SECRET });
  const attempt: DeliveryAttempt = message
    ? await deliverNow({ ...message, attachments: message.attachments?.map((a) => ({ filename: a.filename, contentType: a.contentType, content: Buffer.from(a.contentBase64, "base64") })) })
    : { ok: false, error: UNREADABLE };
  const status = attempt.ok ? "sent" : isLastAttempt || !message ? "failed" : "queued";
  await recordDeliveryAttempt({ emailId: job.emailId, status, messageId: attempt.ok ? attempt.messageId : null, error: attempt.ok ? null : attempt.error });
  if (status === "queued") throw new Error(`mail server still refuses: ${attempt.ok ? "" : attempt.error}`);
  return status;
}
