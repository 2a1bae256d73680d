import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { outgoingEmails, type OutgoingEmail } from "@/db/schema";

export function listOutgoingEmails({ workspaceId, limit = 200 }: { workspaceId: string; limit?: number }) {
  return db().select().from(outgoingEmails).where(eq(outgoingEmails.workspaceId, workspaceId)).orderBy(desc(outgoingEmails.createdAt)).limit(limit);
}

export async function getOutgoingEmail({ workspaceId, emailId }: { workspaceId: string; emailId: string }) {
  const [row] = await db()
    .select()
    .from(outgoingEmails)
    .where(and(eq(outgoingEmails.workspaceId, workspaceId), eq(outgoingEmails.id, emailId)))
    .limit(1);
  return row;
}

/** Records a message for the Outbox (sent, or queued for a retry job sent in the same transaction). */
export async function insertOutgoingEmail(values: typeof outgoingEmails.$inferInsert, tx: DbOrTx = db()): Promise<OutgoingEmail> {
  const [row] = await tx.insert(outgoingEmails).values(values).returning();
  return row;
}

/** The delivery status of one message, by id (the mail worker acts for no workspace in particular). */
export async function getOutgoingEmailStatus({ emailId }: { emailId: string }) {
  const [row] = await db().select({ status: outgoingEmails.status }).from(outgoingEmails).where(eq(outgoingEmails.id, emailId));
  return row?.status ?? null;
}

/** Stores the outcome of one more delivery attempt. */
export async function recordDeliveryAttempt({ emailId, status, messageId, error }: { emailId: string } & Pick<OutgoingEmail, "status" | "messageId" | "error">) {
  await db()
    .update(outgoingEmails)
    .set({ status, messageId, error, attempts: sql`${outgoingEmails.attempts} + 1`, updatedAt: new Date() })
    .where(eq(outgoingEmails.id, emailId));
}
