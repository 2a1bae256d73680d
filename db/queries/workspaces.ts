import "server-only";
import { eq, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { workspaces, type NewWorkspace } from "@/db/schema";

export async function getWorkspace({ workspaceId }: { workspaceId: string }, tx: DbOrTx = db()) {
  const [row] = await tx.select({ id: workspaces.id, name: workspaces.name, timeZone: workspaces.timeZone }).from(workspaces).where(eq(workspaces.id, workspaceId)).limit(1);
  return row;
}

export async function setWorkspaceTimeZone(tx: DbOrTx, { workspaceId, timeZone }: { workspaceId: string; timeZone: string }) {
  const [row] = await tx.update(workspaces).set({ timeZone }).where(eq(workspaces.id, workspaceId)).returning({ id: workspaces.id, name: workspaces.name, timeZone: workspaces.timeZone });
  return row;
}

/** How far a workspace is set up: the counts the getting-started steps and empty states read. */
export async function getSetupCounts({ workspaceId }: { workspaceId: string }, tx: DbOrTx = db()) {
  const { rows } = await tx.execute<{ part_types: number; published_rubrics: number; draft_rubrics: number; suppliers: number; people: number; lots: number; units: number }>(sql`
    SELECT
      (SELECT count(*)::int FROM part_types WHERE workspace_id = ${workspaceId} AND active) AS part_types,
      (SELECT count(DISTINCT part_type_id)::int FROM rubric_versions WHERE workspace_id = ${workspaceId} AND status = 'published') AS published_rubrics,
      (SELECT count(*)::int FROM rubric_versions WHERE workspace_id = ${workspaceId} AND status = 'draft') AS draft_rubrics,
      (SELECT count(*)::int FROM suppliers WHERE workspace_id = ${workspaceId} AND active) AS suppliers,
      (SELECT count(*)::int FROM users WHERE workspace_id = ${workspaceId} AND active) AS people,
      (SELECT count(*)::int FROM lots WHERE workspace_id = ${workspaceId}) AS lots,
      (SELECT count(*)::int FROM units WHERE workspace_id = ${workspaceId}) AS units`);
  const r = rows[0];
  return { partTypes: r.part_types, publishedRubrics: r.published_rubrics, draftRubrics: r.draft_rubrics, suppliers: r.suppliers, people: r.people, lots: r.lots, units: r.units };
}
export type SetupCounts = Awaited<ReturnType<typeof getSetupCounts>>;

export async function insertWorkspace(tx: DbOrTx, values: NewWorkspace) {
  const [row] = await tx.insert(workspaces).values(values).returning();
  return row;
}
