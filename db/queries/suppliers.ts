import "server-only";
import { and, asc, eq, ilike, or, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { suppliers, type NewSupplier } from "@/db/schema";

export function listSuppliers({ workspaceId, search }: { workspaceId: string; search?: string }) {
  const where = [eq(suppliers.workspaceId, workspaceId)];
  if (search) {
    const pattern = `%${search.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    where.push(or(ilike(suppliers.name, pattern), ilike(suppliers.contactEmail, pattern))!);
  }
  return db()
    .select()
    .from(suppliers)
    .where(and(...where))
    .orderBy(asc(sql`lower(${suppliers.name})`));
}

export async function getSupplier({ workspaceId, supplierId }: { workspaceId: string; supplierId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(suppliers)
    .where(and(eq(suppliers.workspaceId, workspaceId), eq(suppliers.id, supplierId)))
    .limit(1);
  return row;
}

export async function insertSupplier(tx: DbOrTx, values: NewSupplier) {
  const [row] = await tx.insert(suppliers).values(values).returning();
  return row;
}

/** Undefined when the supplier is not in this workspace. */
export async function updateSupplierFields(tx: DbOrTx, { workspaceId, supplierId, fields }: { workspaceId: string; supplierId: string; fields: Partial<Omit<NewSupplier, "id" | "workspaceId">> }) {
  const [row] = await tx
    .update(suppliers)
    .set({ ...fields, updatedAt: new Date() })
    .where(and(eq(suppliers.workspaceId, workspaceId), eq(suppliers.id, supplierId)))
    .returning();
  return row;
}
