import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import type { LotDecisionCounts } from "@/db/schema/lots";
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { Grade } from "@/lib/grading/rubric-schema";
import type { ReportFilter } from "@/lib/reports/filters";

/**
 * The Reports screen's reads. Lots are filtered by received day, grades by the local day the unit
 * was graded (lib/reports/filters.ts). A unit's *current* grade is the last row of its history
 * (ORDER BY created_at DESC, id DESC), as everywhere else.
 */

/** WHERE conditions on a lots alias `l` for the filter. */
export function lotFilterSql(workspaceId: string, filter: ReportFilter): SQL {
  const parts: SQL[] = [sql`l.workspace_id = ${workspaceId}`];
  if (filter.supplierId) parts.push(sql`l.supplier_id = ${filter.supplierId}`);
  if (filter.partTypeId) parts.push(sql`l.part_type_id = ${filter.partTypeId}`);
  if (filter.from) parts.push(sql`l.received_on >= ${filter.from}::date`);
  if (filter.to) parts.push(sql`l.received_on <= ${filter.to}::date`);
  return sql.join(parts, sql` AND `);
}

/** WHERE conditions on a units alias `u` graded (first inspection) within the filter's local days. */
export function gradedUnitFilterSql(workspaceId: string, filter: ReportFilter, timeZone: string): SQL {
  const parts: SQL[] = [sql`u.workspace_id = ${workspaceId}`, sql`u.graded_at IS NOT NULL`];
  if (filter.supplierId) parts.push(sql`u.supplier_id = ${filter.supplierId}`);
  if (filter.partTypeId) parts.push(sql`u.part_type_id = ${filter.partTypeId}`);
  if (filter.from) parts.push(sql`(u.graded_at AT TIME ZONE ${timeZone})::date >= ${filter.from}::date`);
  if (filter.to) parts.push(sql`(u.graded_at AT TIME ZONE ${timeZone})::date <= ${filter.to}::date`);
  return sql.join(parts, sql` AND `);
}

/** A PostgreSQL array literal of ids (sent as one parameter; ids come from our own rows, checked anyway). */
function uuidArray(ids: readonly string[]): string {
  for (const id of ids) if (!/^[0-9a-f-]{36}$/i.test(id)) throw new RangeError(`Not an id: ${id}`);
  return `{${ids.join(",")}}`;
}

export type ReportLotRow = {
  id: string;
  purchaseRef: string;
  supplierName: string;
  partTypeName: string;
  receivedOn: string;
  quantity: number;
  sampleSize: number;
  status: "open" | "decided";
  verdict: "accept" | "reject" | null;
  disposition: string | null;
  unitsGraded: number;
};

/** One page of the filtered lots, newest received first, and how many there are. */
export async function listReportLots({ workspaceId, filter, page, pageSize }: { workspaceId: string; filter: ReportFilter; page: number; pageSize: number }, tx: DbOrTx = db()) {
  const where = lotFilterSql(workspaceId, filter);
  const [{ rows }, { rows: counted }] = await Promise.all([
    tx.execute<{
      id: string;
      purchase_ref: string;
      supplier_name: string;
      part_type_name: string;
      received_on: string;
      quantity: number;
      sample_size: number;
      status: "open" | "decided";
      verdict: "accept" | "reject" | null;
      disposition: string | null;
      units_graded: number;
    }>(sql`
      SELECT l.id, l.purchase_ref, s.name AS supplier_name, pt.name AS part_type_name, l.received_on::text AS received_on, l.quantity,
        (l.plan->>'sampleSize')::int AS sample_size, l.status, l.verdict, l.disposition,
        (SELECT count(*)::int FROM units u WHERE u.workspace_id = l.workspace_id AND u.lot_id = l.id AND u.graded_at IS NOT NULL) AS units_graded
      FROM lots l JOIN suppliers s ON s.id = l.supplier_id JOIN part_types pt ON pt.id = l.part_type_id
      WHERE ${where}
      ORDER BY l.received_on DESC, l.created_at DESC, l.id
      LIMIT ${pageSize} OFFSET ${(page - 1) * pageSize}`),
    tx.execute<{ total: number }>(sql`SELECT count(*)::int AS total FROM lots l WHERE ${where}`),
  ]);
  const lots: ReportLotRow[] = rows.map((r) => ({
    id: r.id,
    purchaseRef: r.purchase_ref,
    supplierName: r.supplier_name,
    partTypeName: r.part_type_name,
    receivedOn: r.received_on,
    quantity: r.quantity,
    sampleSize: r.sample_size,
    status: r.status,
    verdict: r.verdict,
    disposition: r.disposition,
    unitsGraded: r.units_graded,
  }));
  return { lots, total: counted[0]?.total ?? 0 };
}

export type ScorecardLotRow = {
  lotId: string;
  supplierId: string;
  receivedOn: string;
  status: "open" | "decided";
  verdict: "accept" | "reject" | null;
  decisionCounts: LotDecisionCounts | null;
  /** Units of the lot with a current grade. */
  inspected: number;
  /** Per defect class: units whose current measurement has the class, and its separate defects. */
  classes: Record<string, { units: number; defects: number }>;
};

/**
 * Per filtered lot, what the supplier scorecard needs. Defects are counted from the photo rows of
 * the measurement each unit's current grade rests on (`byDefect[class].count`: separate regions
 * after merging overlaps, the measurement's own count), so a redrawn region never counts twice.
 */
export async function listScorecardLots({ workspaceId, filter }: { workspaceId: string; filter: ReportFilter }, tx: DbOrTx = db()): Promise<ScorecardLotRow[]> {
  const { rows } = await tx.execute<{
    id: string;
    supplier_id: string;
    received_on: string;
    status: "open" | "decided";
    verdict: "accept" | "reject" | null;
    decision_counts: LotDecisionCounts | null;
    inspected: number;
    classes: Record<string, { units: number; defects: number }> | null;
  }>(sql`
    -- A decided lot always has a verdict when the app decides it (lib/lots); rows written otherwise are left out.
    WITH filtered AS (SELECT l.* FROM lots l WHERE ${lotFilterSql(workspaceId, filter)} AND (l.status = 'open' OR l.verdict IS NOT NULL)),
    current_grades AS (
      SELECT DISTINCT ON (g.unit_id) g.unit_id, u.lot_id, g.measurement_ids
      FROM grades g JOIN units u ON u.id = g.unit_id AND u.workspace_id = g.workspace_id
      WHERE g.workspace_id = ${workspaceId} AND u.lot_id IN (SELECT id FROM filtered)
      ORDER BY g.unit_id, g.created_at DESC, g.id DESC
    ),
    unit_classes AS (
      SELECT c.lot_id, c.unit_id, d.key AS defect, sum((d.value->>'count')::int) AS defects
      FROM current_grades c
      JOIN measurements m ON m.workspace_id = ${workspaceId} AND m.id = ANY(c.measurement_ids) AND m.photo_id IS NOT NULL
      CROSS JOIN LATERAL jsonb_each(m.result->'measurement'->'byDefect') d
      WHERE (d.value->>'count')::int > 0
      GROUP BY c.lot_id, c.unit_id, d.key
    ),
    lot_classes AS (
      SELECT lot_id, jsonb_object_agg(defect, jsonb_build_object('units', units, 'defects', defects)) AS classes
      FROM (SELECT lot_id, defect, count(*)::int AS units, sum(defects)::int AS defects FROM unit_classes GROUP BY lot_id, defect) per_class
      GROUP BY lot_id
    )
    SELECT f.id, f.supplier_id, f.received_on::text AS received_on, f.status, f.verdict, f.decision_counts,
      (SELECT count(*)::int FROM current_grades c WHERE c.lot_id = f.id) AS inspected, lc.classes
    FROM filtered f LEFT JOIN lot_classes lc ON lc.lot_id = f.id
    ORDER BY f.received_on, f.created_at, f.id`);
  return rows.map((r) => ({
    lotId: r.id,
    supplierId: r.supplier_id,
    receivedOn: r.received_on,
    status: r.status,
    verdict: r.verdict,
    decisionCounts: r.decision_counts,
    inspected: r.inspected,
    classes: r.classes ?? {},
  }));
}

/** Current grades of units graded in the filter's days, counted per part type, local day and grade. */
export async function countGradesByDay({ workspaceId, filter, timeZone }: { workspaceId: string; filter: ReportFilter; timeZone: string }, tx: DbOrTx = db()) {
  const { rows } = await tx.execute<{ part_type_id: string; day: string; grade: Grade; count: number }>(sql`
    SELECT u.part_type_id, (u.graded_at AT TIME ZONE ${timeZone})::date::text AS day, cur.final_grade AS grade, count(*)::int AS count
    FROM units u
    CROSS JOIN LATERAL (SELECT g.final_grade FROM grades g WHERE g.workspace_id = u.workspace_id AND g.unit_id = u.id ORDER BY g.created_at DESC, g.id DESC LIMIT 1) cur
    WHERE ${gradedUnitFilterSql(workspaceId, filter, timeZone)}
    GROUP BY 1, 2, 3
    ORDER BY 1, 2, 3`);
  return rows.map((r) => ({ partTypeId: r.part_type_id, day: r.day, grade: r.grade, count: r.count }));
}

/** Inspection grades (the first grade of each unit) in the filter's days, with who graded. */
export async function listInspectionGrades({ workspaceId, filter, timeZone }: { workspaceId: string; filter: ReportFilter; timeZone: string }, tx: DbOrTx = db()) {
  const { rows } = await tx.execute<{ unit_id: string; part_type_id: string; graded_by: string; graded_at: string }>(sql`
    SELECT u.id AS unit_id, u.part_type_id, first.graded_by, first.created_at AS graded_at
    FROM units u
    CROSS JOIN LATERAL (SELECT g.graded_by, g.created_at FROM grades g WHERE g.workspace_id = u.workspace_id AND g.unit_id = u.id AND g.kind = 'inspection' ORDER BY g.created_at, g.id LIMIT 1) first
    WHERE ${gradedUnitFilterSql(workspaceId, filter, timeZone)}`);
  return rows.map((r) => ({ unitId: r.unit_id, partTypeId: r.part_type_id, gradedBy: r.graded_by, gradedAt: new Date(r.graded_at) }));
}

export type UnitClaimEvent = { unitId: string; action: string; actorId: string | null; detail: Record<string, unknown>; at: Date };

/** The claim history (activity log) of some units, oldest first. */
export async function listUnitClaimEvents({ workspaceId, unitIds }: { workspaceId: string; unitIds: string[] }, tx: DbOrTx = db()): Promise<UnitClaimEvent[]> {
  if (unitIds.length === 0) return [];
  const { rows } = await tx.execute<{ subject_id: string; action: string; actor_id: string | null; detail: Record<string, unknown>; created_at: string }>(sql`
    SELECT subject_id, action, actor_id, detail, created_at FROM activity_log
    WHERE workspace_id = ${workspaceId} AND subject_type = 'unit'
      AND action IN ('unit.claimed', 'unit.reassigned', 'unit.released', 'unit.lease_expired')
      AND subject_id = ANY(${uuidArray(unitIds)}::text[])
    ORDER BY created_at, id`);
  return rows.map((r) => ({ unitId: r.subject_id, action: r.action, actorId: r.actor_id, detail: r.detail, at: new Date(r.created_at) }));
}

/** Names of some users of the workspace, by id. */
export async function userNames({ workspaceId, userIds }: { workspaceId: string; userIds: string[] }, tx: DbOrTx = db()): Promise<Map<string, string>> {
  if (userIds.length === 0) return new Map();
  const { rows } = await tx.execute<{ id: string; name: string }>(sql`SELECT id, name FROM users WHERE workspace_id = ${workspaceId} AND id = ANY(${uuidArray(userIds)}::uuid[])`);
  return new Map(rows.map((r) => [r.id, r.name]));
}

export type { DefectSeverity };
