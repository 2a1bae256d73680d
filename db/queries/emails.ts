import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { outgoingEmails } from "@/db/schema";

export function listOutgoingEmails({ workspaceId, limit = 200 }: { workspaceId: string; limit?: number }) {
  return db()
    .select()
    .from(outgoingEmails)
    .where(eq(outgoingEmails.workspaceId, workspaceId))
    .orderBy(desc(outgoingEmails.createdAt))
    .limit(limit);
}

export async function getOutgoingEmail({ workspaceId, emailId }: { workspaceId: string; emailId: string }) {
  const [row] = await db()
    .select()
    .from(outgoingEmails)
    .where(and(eq(outgoingEmails.workspaceId, workspaceId), eq(outgoingEmails.id, emailId)))
    .limit(1);
  return row;
}
