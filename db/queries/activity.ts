import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { activityLog } from "@/db/schema";

export type ActivityInput = {
  workspaceId: string;
  actorId: string | null;
  action: string;
  subjectType: string;
  subjectId?: string | null;
  detail?: Record<string, unknown>;
};

/** Appends one entry; pass the transaction so the entry lands only if the change does. */
export async function logActivity(tx: DbOrTx, entry: ActivityInput) {
  await tx.insert(activityLog).values({ ...entry, subjectId: entry.subjectId ?? null, detail: entry.detail ?? {} });
}

export function listActivity({ workspaceId, subjectType, subjectId, limit = 50 }: { workspaceId: string; subjectType?: string; subjectId?: string; limit?: number }) {
  const where = [eq(activityLog.workspaceId, workspaceId)];
  if (subjectType) where.push(eq(activityLog.subjectType, subjectType));
  if (subjectId) where.push(eq(activityLog.subjectId, subjectId));
  return db()
    .select()
    .from(activityLog)
    .where(and(...where))
    .orderBy(desc(activityLog.id))
    .limit(limit);
}
