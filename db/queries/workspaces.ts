import "server-only";
import { eq } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { workspaces } from "@/db/schema";

export async function getWorkspace({ workspaceId }: { workspaceId: string }, tx: DbOrTx = db()) {
  const [row] = await tx.select({ id: workspaces.id, name: workspaces.name, timeZone: workspaces.timeZone }).from(workspaces).where(eq(workspaces.id, workspaceId)).limit(1);
  return row;
}

export async function setWorkspaceTimeZone(tx: DbOrTx, { workspaceId, timeZone }: { workspaceId: string; timeZone: string }) {
  const [row] = await tx.update(workspaces).set({ timeZone }).where(eq(workspaces.id, workspaceId)).returning({ id: workspaces.id, name: workspaces.name, timeZone: workspaces.timeZone });
  return row;
}
