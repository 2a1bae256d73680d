import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { partTypes } from "@/db/schema";

export function listPartTypes({ workspaceId, active }: { workspaceId: string; active?: boolean }) {
  const where = [eq(partTypes.workspaceId, workspaceId)];
  if (active !== undefined) where.push(eq(partTypes.active, active));
  return db().select().from(partTypes).where(and(...where)).orderBy(asc(partTypes.name));
}

export async function getPartType({ workspaceId, partTypeId }: { workspaceId: string; partTypeId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(partTypes)
    .where(and(eq(partTypes.workspaceId, workspaceId), eq(partTypes.id, partTypeId)))
    .limit(1);
  return row;
}
