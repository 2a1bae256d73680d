import "server-only";
import { and, asc, eq, inArray, or, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { partTypes, type NewPartType } from "@/db/schema";

export function listPartTypes({ workspaceId, active }: { workspaceId: string; active?: boolean }) {
  const where = [eq(partTypes.workspaceId, workspaceId)];
  if (active !== undefined) where.push(eq(partTypes.active, active));
  return db()
    .select()
    .from(partTypes)
    .where(and(...where))
    .orderBy(asc(partTypes.name));
}

export async function getPartType({ workspaceId, partTypeId }: { workspaceId: string; partTypeId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(partTypes)
    .where(and(eq(partTypes.workspaceId, workspaceId), eq(partTypes.id, partTypeId)))
    .limit(1);
  return row;
}

export async function insertPartType(tx: DbOrTx, values: NewPartType) {
  const [row] = await tx.insert(partTypes).values(values).returning();
  return row;
}

/** Undefined when the part type is not in this workspace. */
export async function updatePartTypeFields(
  tx: DbOrTx,
  { workspaceId, partTypeId, fields }: { workspaceId: string; partTypeId: string; fields: Partial<Omit<NewPartType, "id" | "workspaceId" | "slug">> },
) {
  const [row] = await tx
    .update(partTypes)
    .set({ ...fields, updatedAt: new Date() })
    .where(and(eq(partTypes.workspaceId, workspaceId), eq(partTypes.id, partTypeId)))
    .returning();
  return row;
}

/** The workspace's part types that have one of these slugs, or one of these names in any case. */
export function listPartTypesNamed(tx: DbOrTx, { workspaceId, slugs, names }: { workspaceId: string; slugs: string[]; names: string[] }) {
  return tx
    .select({ slug: partTypes.slug, name: partTypes.name })
    .from(partTypes)
    .where(
      and(
        eq(partTypes.workspaceId, workspaceId),
        or(
          inArray(partTypes.slug, slugs),
          inArray(
            sql`lower(${partTypes.name})`,
            names.map((n) => n.toLowerCase()),
          ),
        ),
      ),
    );
}
