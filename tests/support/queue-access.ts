/** Fixture ids for the queue routes in the access matrix: one queued unit and an inspector. */
import { and, eq, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { users } from "@/db/schema";
import { api, type Session } from "./http";
import { createLotWithUnits, createPartTypeAndSupplier } from "./lot-fixtures";

export async function queueFixtureIds(lead: Session): Promise<Record<string, string>> {
  const me = await api<{ user: { id: string; workspaceId: string } }>(lead, "GET", "/api/me");
  const { id: leadId, workspaceId } = me.body.user;
  const { partType, supplier } = await createPartTypeAndSupplier(workspaceId);
  // Due far in the future so this unit never jumps ahead of real work in the demo workspace.
  const lot = await createLotWithUnits({ workspaceId, createdBy: leadId, count: 1, dueOn: "2099-12-31", partTypeId: partType.id, supplierId: supplier.id });
  const { rows } = await db().execute<{ id: string }>(sql`SELECT id FROM units WHERE lot_id = ${lot.id}`);
  const [inspector] = await db()
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.workspaceId, workspaceId), eq(users.active, true), sql`'inspector' = ANY(${users.roles})`))
    .limit(1);
  return { queuedUnitId: rows[0].id, inspectorId: inspector.id };
}
