import "server-only";
/**
 * Handing a message to the mail server, now (lib/mail/send.ts) or from the worker's mail-send
 * queue, which retries a queued message with backoff until the server takes it or the retries
 * run out (then the Outbox shows it failed, with the server's last answer).
 */
import { eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { outgoingEmails } from "@/db/schema";
import { env } from "@/lib/env";
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

/** What a mail-send job carries: the row to update and the message itself (attachments as base64). */
export type MailDeliveryJob = {
  emailId: string;
  message: Omit<OutgoingMessage, "attachments" | "workspaceId"> & { attachments?: { filename: string; contentBase64: string; contentType?: string }[] };
};

export function mailDeliveryJob({ emailId, message }: { emailId: string; message: OutgoingMessage }): MailDeliveryJob {
  const { attachments, workspaceId: _workspaceId, ...rest } = message;
  return { emailId, message: { ...rest, attachments: attachments?.map((a) => ({ filename: a.filename, contentType: a.contentType, contentBase64: a.content.toString("base64") })) } };
}

/**
 * Worker side: one retry of a queued message. Throws while the server still refuses, so pg-boss
 * tries again later; on the last attempt the row is marked failed instead.
 */
export async function retryQueuedMail(job: MailDeliveryJob, { isLastAttempt }: { isLastAttempt: boolean }): Promise<"sent" | "already sent" | "failed"> {
  const [row] = await db().select({ status: outgoingEmails.status }).from(outgoingEmails).where(eq(outgoingEmails.id, job.emailId));
  if (!row || row.status === "sent") return "already sent";
  const attempt = await deliverNow({ ...job.message, attachments: job.message.attachments?.map((a) => ({ filename: a.filename, contentType: a.contentType, content: Buffer.from(a.contentBase64, "base64") })) });
  const status = attempt.ok ? "sent" : isLastAttempt ? "failed" : "queued";
  await db()
    .update(outgoingEmails)
    .set({ status, messageId: attempt.ok ? attempt.messageId : null, error: attempt.ok ? null : attempt.error, attempts: sql`${outgoingEmails.attempts} + 1`, updatedAt: new Date() })
    .where(eq(outgoingEmails.id, job.emailId));
  if (status === "queued") throw new Error(`mail server still refuses: ${attempt.ok ? "" : attempt.error}`);
  return status;
}
