import "server-only";
/**
 * Sending mail: one attempt at once, and when the mail server does not take the message, a
 * queued row plus a retry job in one transaction (lib/mail/deliver.ts runs it in the worker with
 * backoff). Every message is recorded for the workspace's Outbox: sent, queued (retrying) or
 * failed (retries used up). Delivery is at least once: a worker that dies after the server took
 * a message but before recording it sends that message again.
 */
import { insertOutgoingEmail } from "@/db/queries/emails";
import type { OutgoingEmail } from "@/db/schema";
import { transactionWithJobs } from "@/lib/jobs/send";
import { deliverNow } from "./deliver";

export type MailKind = OutgoingEmail["kind"];

export type OutgoingMessage = {
  /** Null for people who have no workspace yet (sign-up confirmations). */
  workspaceId: string | null;
  kind: MailKind;
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: Buffer; contentType?: string }[];
};

/** Sends one message or queues it for retry; never throws for a delivery failure (see status). */
export async function sendMail(message: OutgoingMessage): Promise<OutgoingEmail> {
  const attempt = await deliverNow(message);
  const values = {
    workspaceId: message.workspaceId,
    kind: message.kind,
    toAddress: message.to,
    subject: message.subject,
    messageId: attempt.ok ? attempt.messageId : null,
    status: attempt.ok ? ("sent" as const) : ("queued" as const),
    error: attempt.ok ? null : attempt.error,
  };
  if (attempt.ok) return insertOutgoingEmail(values);
  return transactionWithJobs(async (tx, jobs) => {
    const row = await insertOutgoingEmail(values, tx);
    await jobs.sendMailDelivery({ emailId: row.id, message });
    return row;
  });
}
