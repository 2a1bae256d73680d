import "server-only";
import { and, asc, eq, ilike, or, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { suppliers } from "@/db/schema";

export function listSuppliers({ workspaceId, search }: { workspaceId: string; search?: string }) {
  const where = [eq(suppliers.workspaceId, workspaceId)];
  if (search) {
    const pattern = `%${search.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;
    where.push(or(ilike(suppliers.name, pattern), ilike(suppliers.contactEmail, pattern))!);
  }
  return db().select().from(suppliers).where(and(...where)).orderBy(asc(sql`lower(${suppliers.name})`));
}

export async function getSupplier({ workspaceId, supplierId }: { workspaceId: string; supplierId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(suppliers)
    .where(and(eq(suppliers.workspaceId, workspaceId), eq(suppliers.id, supplierId)))
    .limit(1);
  return row;
}
