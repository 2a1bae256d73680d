import "server-only";
import { aliasedTable, and, asc, eq, inArray, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { checklistResults, grades, lots, partTypes, suppliers, units, users, type NewUnit } from "@/db/schema";
import type { DEFECT_SEVERITIES, DefectSeverity } from "@/lib/part-types/severity";

const holders = aliasedTable(users, "lease_holders");
/** db/ takes lib's values only as types: this copy must equal lib/part-types/severity.ts (order included) or it does not compile. */
const SEVERITIES_WORST_FIRST = ["critical", "major", "minor"] as const satisfies typeof DEFECT_SEVERITIES;
const severityRankSql = sql`ARRAY[${sql.join(
  SEVERITIES_WORST_FIRST.map((s) => sql`${s}`),
  sql`, `,
)}]::text[]`;

/** A lot's units in sample order, with how far each checklist got. */
export function listLotUnits({ workspaceId, lotId }: { workspaceId: string; lotId: string }) {
  return db()
    .select({
      id: units.id,
      sampleIndex: units.sampleIndex,
      serial: units.serial,
      placeholder: units.placeholder,
      status: units.status,
      leaseHolderName: holders.name,
      leaseExpiresAt: units.leaseExpiresAt,
      recorded: sql<number>`(SELECT count(*)::int FROM ${checklistResults} WHERE ${checklistResults.unitId} = ${units.id})`,
      failed: sql<number>`(SELECT count(*)::int FROM ${checklistResults} WHERE ${checklistResults.unitId} = ${units.id} AND NOT ${checklistResults.passed})`,
      worstFailure: sql<DefectSeverity | null>`(SELECT ${checklistResults.severityOnFail} FROM ${checklistResults} WHERE ${checklistResults.unitId} = ${units.id} AND NOT ${checklistResults.passed} ORDER BY array_position(${severityRankSql}, ${checklistResults.severityOnFail}) LIMIT 1)`,
      grade: sql<
        "A" | "B" | "C" | "Reject" | null
      >`(SELECT ${grades.finalGrade} FROM ${grades} WHERE ${grades.unitId} = ${units.id} AND ${grades.workspaceId} = ${units.workspaceId} ORDER BY ${grades.createdAt} DESC, ${grades.id} DESC LIMIT 1)`,
    })
    .from(units)
    .leftJoin(holders, eq(holders.id, units.leaseHolderId))
    .where(and(eq(units.workspaceId, workspaceId), eq(units.lotId, lotId)))
    .orderBy(asc(units.sampleIndex));
}

/** One row of a lot's unit list (the Lot screen's table reads this type). */
export type LotUnitRow = Awaited<ReturnType<typeof listLotUnits>>[number];

export async function countLotUnits({ workspaceId, lotId }: { workspaceId: string; lotId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(units)
    .where(and(eq(units.workspaceId, workspaceId), eq(units.lotId, lotId)));
  return row?.n ?? 0;
}

/** One unit with what the bench needs of its lot and part type. */
export async function getUnitDetail({ workspaceId, unitId }: { workspaceId: string; unitId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({
      unit: units,
      leaseHolderName: holders.name,
      lot: { id: lots.id, purchaseRef: lots.purchaseRef, status: lots.status, sampleSize: sql<number>`(${lots.plan}->>'sampleSize')::int`, quantity: lots.quantity },
      supplierName: suppliers.name,
      partType: { id: partTypes.id, name: partTypes.name, category: partTypes.category, checklist: partTypes.checklist },
    })
    .from(units)
    .innerJoin(lots, eq(lots.id, units.lotId))
    .innerJoin(suppliers, eq(suppliers.id, units.supplierId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .leftJoin(holders, eq(holders.id, units.leaseHolderId))
    .where(and(eq(units.workspaceId, workspaceId), eq(units.id, unitId)))
    .limit(1);
  return row;
}

/**
 * The unit row, locked for the rest of the transaction: the one lock every change of a unit takes
 * first (status, lease, checklist, regions, serial, grades), so they serialise and never
 * deadlock. With its lot's status, the lease holder's name, and whether the lease is still running by the
 * database's clock (what lib/units/editability.ts reads) (the clock every lease is granted by: ./unit-status.ts). Undefined when the
 * unit is not in this workspace.
 */
export async function lockUnit(tx: DbOrTx, { workspaceId, unitId }: { workspaceId: string; unitId: string }) {
  const [row] = await tx
    .select({ unit: units, lotStatus: lots.status, leaseHolderName: holders.name, leaseRunning: sql<boolean>`coalesce(${units.leaseExpiresAt} > now(), false)` })
    .from(units)
    .innerJoin(lots, and(eq(lots.workspaceId, units.workspaceId), eq(lots.id, units.lotId)))
    .leftJoin(holders, eq(holders.id, units.leaseHolderId))
    .where(and(eq(units.workspaceId, workspaceId), eq(units.id, unitId)))
    .for("update", { of: units });
  return row && { ...row.unit, lotStatus: row.lotStatus, leaseHolderName: row.leaseHolderName, leaseRunning: row.leaseRunning };
}
export type LockedUnit = NonNullable<Awaited<ReturnType<typeof lockUnit>>>;

export function listUnitResults({ workspaceId, unitIds }: { workspaceId: string; unitIds: string[] }, tx: DbOrTx = db()) {
  if (unitIds.length === 0) return Promise.resolve([]);
  return tx
    .select({
      id: checklistResults.id,
      unitId: checklistResults.unitId,
      itemId: checklistResults.itemId,
      value: checklistResults.value,
      passed: checklistResults.passed,
      failureReason: checklistResults.failureReason,
      severityOnFail: checklistResults.severityOnFail,
      note: checklistResults.note,
      recordedAt: checklistResults.recordedAt,
      recordedByName: users.name,
    })
    .from(checklistResults)
    .innerJoin(users, eq(users.id, checklistResults.recordedBy))
    .where(and(eq(checklistResults.workspaceId, workspaceId), inArray(checklistResults.unitId, unitIds)))
    .orderBy(asc(checklistResults.recordedAt));
}

/** Inserts a lot's sampled units (in chunks, within the caller's transaction). */
export async function insertUnits(tx: DbOrTx, rows: NewUnit[]) {
  const CHUNK = 1000;
  for (let start = 0; start < rows.length; start += CHUNK) await tx.insert(units).values(rows.slice(start, start + CHUNK));
}

/** Sets a unit's serial; a serial used by another unit of the lot fails on units_lot_serial_key. */
export async function updateUnitSerial(tx: DbOrTx, { workspaceId, unitId, serial }: { workspaceId: string; unitId: string; serial: string }) {
  const [row] = await tx
    .update(units)
    .set({ serial, updatedAt: new Date() })
    .where(and(eq(units.workspaceId, workspaceId), eq(units.id, unitId)))
    .returning();
  return row;
}
