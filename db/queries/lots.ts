import "server-only";
import { and, asc, desc, eq, ilike, inArray, isNotNull, sql, type SQL } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { checklistResults, inspectionSchemes, lots, partTypes, suppliers, units, users } from "@/db/schema";
import type { LotListQuery } from "@/lib/lots/schemas";

const lotColumns = {
  lot: lots,
  supplierName: suppliers.name,
  partTypeName: partTypes.name,
  partTypeCategory: partTypes.category,
  checklistItemIds: sql<string[]>`(SELECT coalesce(jsonb_agg(item->>'id'), '[]'::jsonb) FROM jsonb_array_elements(${partTypes.checklist}) AS item)`,
};

export type LotRow = NonNullable<Awaited<ReturnType<typeof getLot>>>;

export async function getLot({ workspaceId, lotId }: { workspaceId: string; lotId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ ...lotColumns, createdByName: users.name })
    .from(lots)
    .innerJoin(suppliers, eq(suppliers.id, lots.supplierId))
    .innerJoin(partTypes, eq(partTypes.id, lots.partTypeId))
    .innerJoin(users, eq(users.id, lots.createdBy))
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.id, lotId)))
    .limit(1);
  return row;
}

/** The lot row alone, locked for the rest of the transaction (decisions and unit creation). */
export async function lockLot(tx: DbOrTx, { workspaceId, lotId }: { workspaceId: string; lotId: string }) {
  const [row] = await tx
    .select()
    .from(lots)
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.id, lotId)))
    .for("update");
  return row;
}

const sortColumns = {
  dueOn: lots.dueOn,
  receivedOn: lots.receivedOn,
  createdAt: lots.createdAt,
  purchaseRef: sql`lower(${lots.purchaseRef})`,
  supplier: sql`lower(${suppliers.name})`,
  partType: sql`lower(${partTypes.name})`,
  quantity: lots.quantity,
  status: lots.status,
} satisfies Record<LotListQuery["sort"], unknown>;

export async function listLots({ workspaceId, query }: { workspaceId: string; query: LotListQuery }) {
  const where: SQL[] = [eq(lots.workspaceId, workspaceId)];
  if (query.status !== "all") where.push(eq(lots.status, query.status));
  if (query.supplierId) where.push(eq(lots.supplierId, query.supplierId));
  if (query.partTypeId) where.push(eq(lots.partTypeId, query.partTypeId));
  if (query.search) where.push(ilike(lots.purchaseRef, `%${query.search.replace(/[%_\\]/g, (c) => `\\${c}`)}%`));
  const order = query.dir === "asc" ? asc : desc;
  const [rows, [{ total }]] = await Promise.all([
    db()
      .select(lotColumns)
      .from(lots)
      .innerJoin(suppliers, eq(suppliers.id, lots.supplierId))
      .innerJoin(partTypes, eq(partTypes.id, lots.partTypeId))
      .where(and(...where))
      // The id keeps the order stable between pages when the sort key ties.
      .orderBy(order(sortColumns[query.sort] as SQL), desc(lots.createdAt), asc(lots.id))
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize),
    db()
      .select({ total: sql<number>`count(*)::int` })
      .from(lots)
      .innerJoin(suppliers, eq(suppliers.id, lots.supplierId))
      .innerJoin(partTypes, eq(partTypes.id, lots.partTypeId))
      .where(and(...where)),
  ]);
  return { rows, total };
}

/** Units and checklist results of some lots, for their running verdicts. */
export async function loadLotEvidence({ workspaceId, lotIds }: { workspaceId: string; lotIds: string[] }, tx: DbOrTx = db()) {
  if (lotIds.length === 0) return { units: [], results: [] };
  const [unitRows, resultRows] = await Promise.all([
    tx
      .select({ id: units.id, lotId: units.lotId, sampleIndex: units.sampleIndex, status: units.status })
      .from(units)
      .where(and(eq(units.workspaceId, workspaceId), inArray(units.lotId, lotIds))),
    tx
      .select({ unitId: checklistResults.unitId, lotId: units.lotId, itemId: checklistResults.itemId, passed: checklistResults.passed, severityOnFail: checklistResults.severityOnFail })
      .from(checklistResults)
      .innerJoin(units, eq(units.id, checklistResults.unitId))
      .where(and(eq(checklistResults.workspaceId, workspaceId), inArray(units.lotId, lotIds))),
  ]);
  return { units: unitRows, results: resultRows };
}

/** A supplier + part type's decided lots in the order their verdicts were recorded. */
export function listDecidedLots({ workspaceId, supplierId, partTypeId }: { workspaceId: string; supplierId: string; partTypeId: string }, tx: DbOrTx = db()) {
  return tx
    .select({ id: lots.id, purchaseRef: lots.purchaseRef, inspectionSeverity: lots.inspectionSeverity, verdict: lots.verdict, plan: lots.plan, decisionCounts: lots.decisionCounts, decidedAt: lots.decidedAt })
    .from(lots)
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.supplierId, supplierId), eq(lots.partTypeId, partTypeId), eq(lots.status, "decided"), isNotNull(lots.verdict)))
    .orderBy(asc(lots.decidedAt), asc(lots.createdAt), asc(lots.id));
}

export async function getScheme({ workspaceId, supplierId, partTypeId }: { workspaceId: string; supplierId: string; partTypeId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(inspectionSchemes)
    .where(and(eq(inspectionSchemes.workspaceId, workspaceId), eq(inspectionSchemes.supplierId, supplierId), eq(inspectionSchemes.partTypeId, partTypeId)))
    .limit(1);
  return row;
}
