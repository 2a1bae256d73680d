import "server-only";
import { db } from "@/db/client";
import { outgoingEmails, type OutgoingEmail } from "@/db/schema";
import { env } from "@/lib/env";
import { mailTransport } from "./transport";

export type MailKind = OutgoingEmail["kind"];

export type OutgoingMessage = {
  workspaceId: string;
  kind: MailKind;
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: Buffer; contentType?: string }[];
};

/**
 * Sends one message and records it (sent or failed) for the workspace's Outbox. Never throws for
 * a delivery failure: the caller decides what to tell the user from the returned status.
 */
export async function sendMail(message: OutgoingMessage): Promise<OutgoingEmail> {
  let messageId: string | null = null;
  let error: string | null = null;
  try {
    const info = await mailTransport().sendMail({
      from: env().MAIL_FROM,
      to: message.to,
      subject: message.subject,
      text: message.text,
      html: message.html,
      attachments: message.attachments,
    });
    messageId = info.messageId ?? null;
  } catch (err) {
    error = err instanceof Error ? err.message : String(err);
    console.error(`E-mail (${message.kind}) to ${message.to} failed`, err);
  }
  const [row] = await db()
    .insert(outgoingEmails)
    .values({
      workspaceId: message.workspaceId,
      kind: message.kind,
      toAddress: message.to,
      subject: message.subject,
      messageId,
      status: error ? "failed" : "sent",
      error,
    })
    .returning();
  return row;
}
