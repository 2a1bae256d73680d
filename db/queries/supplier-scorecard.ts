import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { claims, lots, partTypes } from "@/db/schema";

/** The part types a supplier has delivered lots of (for its switching state per part type). */
export function listSupplierPartTypes({ workspaceId, supplierId }: { workspaceId: string; supplierId: string }, tx: DbOrTx = db()) {
  return tx
    .selectDistinct({ id: partTypes.id, name: partTypes.name })
    .from(lots)
    .innerJoin(partTypes, and(eq(partTypes.workspaceId, lots.workspaceId), eq(partTypes.id, lots.partTypeId)))
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.supplierId, supplierId)))
    .orderBy(asc(partTypes.name), asc(partTypes.id));
}

/** The supplier's claims still open, oldest first (the scorecard's follow-up list). */
export function listOpenClaims({ workspaceId, supplierId }: { workspaceId: string; supplierId: string }, tx: DbOrTx = db()) {
  return tx
    .select({ id: claims.id, reference: claims.reference, lotId: claims.lotId, purchaseRef: lots.purchaseRef, note: claims.note, createdAt: claims.createdAt })
    .from(claims)
    .innerJoin(lots, and(eq(lots.workspaceId, claims.workspaceId), eq(lots.id, claims.lotId)))
    .where(and(eq(claims.workspaceId, workspaceId), eq(claims.supplierId, supplierId), eq(claims.status, "open")))
    .orderBy(asc(claims.createdAt), desc(claims.id));
}

/** Open claims per supplier of the workspace (the Reports screen's scorecards). */
export async function countOpenClaimsBySupplier({ workspaceId }: { workspaceId: string }, tx: DbOrTx = db()): Promise<Map<string, number>> {
  const rows = await tx
    .select({ supplierId: claims.supplierId, n: sql<number>`count(*)::int` })
    .from(claims)
    .where(and(eq(claims.workspaceId, workspaceId), eq(claims.status, "open")))
    .groupBy(claims.supplierId);
  return new Map(rows.map((r) => [r.supplierId, r.n]));
}
