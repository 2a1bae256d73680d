import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { PgDialect } from "drizzle-orm/pg-core";
import Cursor from "pg-cursor";
import { pool } from "@/db/client";
import type { Shape } from "@/lib/geometry/shape";
import type { ExportKind, ReportFilter } from "@/lib/reports/filters";
import { gradedUnitFilterSql, lotFilterSql } from "./reports";

/**
 * The CSV exports' rows, read through a server-side cursor (pg-cursor) in batches, so an export of
 * any size holds one batch in memory. One statement per export: PostgreSQL reads it from one
 * snapshot, so the rows agree with each other even while people keep grading. Dates and days come
 * as text from the database (ISO 8601 with offset, and YYYY-MM-DD) and are written as they are, so
 * no time zone conversion happens in Node. Rows are in a stable order (by lot, then sample order).
 */

export type LotExportRow = {
  lot_id: string;
  purchase_ref: string;
  supplier: string;
  part_type: string;
  model_family: string;
  quantity: number;
  received_on: string;
  due_on: string;
  inspection_level: string;
  inspection_severity: string;
  sample_size: number;
  promised_grade: string;
  status: string;
  verdict: string | null;
  disposition: string | null;
  disposition_reason: string | null;
  decided_by: string | null;
  decided_at: string | null;
  units_sampled: number;
  units_graded: number;
};
export type UnitExportRow = {
  unit_id: string;
  lot_id: string;
  purchase_ref: string;
  supplier: string;
  part_type: string;
  sample_index: number;
  serial: string | null;
  status: string;
  grade: string | null;
  grade_kind: string | null;
  rubric_version: number | null;
  graded_by: string | null;
  graded_at: string | null;
  checklist_failed: number;
};
export type GradeExportRow = {
  grade_id: string;
  unit_id: string;
  serial: string | null;
  purchase_ref: string;
  part_type: string;
  kind: string;
  proposed_grade: string;
  final_grade: string;
  override_reason: string | null;
  rubric_version: number;
  graded_by: string;
  created_at: string;
};
export type DefectExportRow = {
  region_id: string;
  unit_id: string;
  serial: string | null;
  lot_id: string;
  purchase_ref: string;
  supplier: string;
  part_type: string;
  photo_id: string;
  view: string;
  defect_class: string;
  shape: Shape;
  px_per_mm: number | null;
  calibration: string | null;
  class_px: number | null;
  class_share: number | null;
  class_count: number | null;
  class_area_mm2: number | null;
  class_max_length_mm: number | null;
  measured_at: string | null;
};
export type ExportRow = { lots: LotExportRow; units: UnitExportRow; grades: GradeExportRow; defects: DefectExportRow };

const currentGrade = (unit: SQL) => sql`
  SELECT g.id, g.final_grade, g.kind, g.graded_by, g.created_at, g.measurement_ids, g.rubric_version_id FROM grades g
  WHERE g.workspace_id = ${unit}.workspace_id AND g.unit_id = ${unit}.id ORDER BY g.created_at DESC, g.id DESC LIMIT 1`;

/** For blind readers (lib/gallery/access.ts's rule, issue 19): no row of a unit whose recheck still waits. */
const notAwaitingRecheck = (hide: boolean) => (hide ? sql` AND NOT EXISTS (SELECT 1 FROM rechecks rc WHERE rc.workspace_id = u.workspace_id AND rc.unit_id = u.id AND rc.status = 'waiting')` : sql``);

function exportQuery(kind: ExportKind, workspaceId: string, filter: ReportFilter, timeZone: string, hideUnitsAwaitingRecheck: boolean): SQL {
  const lotWhere = lotFilterSql(workspaceId, filter);
  const blind = notAwaitingRecheck(hideUnitsAwaitingRecheck);
  switch (kind) {
    case "lots":
      return sql`
        SELECT l.id AS lot_id, l.purchase_ref, s.name AS supplier, pt.name AS part_type, l.model_family, l.quantity, l.received_on::text, l.due_on::text,
          l.inspection_level, l.inspection_severity, (l.plan->>'sampleSize')::int AS sample_size, l.promised_grade, l.status, l.verdict, l.disposition,
          l.disposition_reason, d.name AS decided_by, to_char(l.decided_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') AS decided_at,
          (SELECT count(*)::int FROM units u WHERE u.workspace_id = l.workspace_id AND u.lot_id = l.id) AS units_sampled,
          (SELECT count(*)::int FROM units u WHERE u.workspace_id = l.workspace_id AND u.lot_id = l.id AND u.graded_at IS NOT NULL) AS units_graded
        FROM lots l JOIN suppliers s ON s.id = l.supplier_id JOIN part_types pt ON pt.id = l.part_type_id LEFT JOIN users d ON d.id = l.decided_by
        WHERE ${lotWhere}
        ORDER BY l.received_on, l.created_at, l.id`;
    case "units":
      return sql`
        SELECT u.id AS unit_id, l.id AS lot_id, l.purchase_ref, s.name AS supplier, pt.name AS part_type, u.sample_index, u.serial, u.status,
          cur.final_grade AS grade, cur.kind AS grade_kind, rv.version AS rubric_version, gb.name AS graded_by,
          to_char(cur.created_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') AS graded_at,
          (SELECT count(*)::int FROM checklist_results cr WHERE cr.workspace_id = u.workspace_id AND cr.unit_id = u.id AND NOT cr.passed) AS checklist_failed
        FROM lots l JOIN units u ON u.workspace_id = l.workspace_id AND u.lot_id = l.id
        JOIN suppliers s ON s.id = l.supplier_id JOIN part_types pt ON pt.id = l.part_type_id
        LEFT JOIN LATERAL (${currentGrade(sql`u`)}) cur ON true
        LEFT JOIN rubric_versions rv ON rv.id = cur.rubric_version_id LEFT JOIN users gb ON gb.id = cur.graded_by
        WHERE ${lotWhere}${blind}
        ORDER BY l.received_on, l.created_at, l.id, u.sample_index`;
    case "grades":
      return sql`
        SELECT g.id AS grade_id, u.id AS unit_id, u.serial, l.purchase_ref, pt.name AS part_type, g.kind, g.proposed_grade, g.final_grade, g.override_reason,
          rv.version AS rubric_version, gb.name AS graded_by, to_char(g.created_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') AS created_at
        FROM units u JOIN lots l ON l.id = u.lot_id JOIN part_types pt ON pt.id = u.part_type_id
        JOIN grades g ON g.workspace_id = u.workspace_id AND g.unit_id = u.id
        JOIN rubric_versions rv ON rv.id = g.rubric_version_id JOIN users gb ON gb.id = g.graded_by
        WHERE ${gradedUnitFilterSql(workspaceId, filter, timeZone)}${blind}
        ORDER BY u.graded_at, u.id, g.created_at, g.id`;
    case "defects":
      // The photo's figures of the class come from the measurement the unit's current grade rests on.
      return sql`
        SELECT r.id AS region_id, u.id AS unit_id, u.serial, l.id AS lot_id, l.purchase_ref, s.name AS supplier, pt.name AS part_type, p.id AS photo_id, p.view_key AS view,
          r.defect_class, r.shape, (m.result->'measurement'->'calibration'->>'pxPerMm')::float8 AS px_per_mm, m.result->'measurement'->'calibration'->>'method' AS calibration,
          (m.result->'measurement'->'byDefect'->r.defect_class->>'px')::float8 AS class_px, (m.result->'measurement'->'byDefect'->r.defect_class->>'share')::float8 AS class_share,
          (m.result->'measurement'->'byDefect'->r.defect_class->>'count')::int AS class_count, (m.result->'measurement'->'byDefect'->r.defect_class->>'areaMm2')::float8 AS class_area_mm2,
          (m.result->'measurement'->'byDefect'->r.defect_class->>'maxLengthMm')::float8 AS class_max_length_mm,
          to_char(m.created_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') AS measured_at
        FROM lots l JOIN units u ON u.workspace_id = l.workspace_id AND u.lot_id = l.id
        JOIN suppliers s ON s.id = l.supplier_id JOIN part_types pt ON pt.id = l.part_type_id
        JOIN photos p ON p.workspace_id = u.workspace_id AND p.unit_id = u.id AND p.removed_at IS NULL
        JOIN regions r ON r.workspace_id = p.workspace_id AND r.photo_id = p.id AND r.role = 'defect'
        LEFT JOIN LATERAL (${currentGrade(sql`u`)}) cur ON true
        LEFT JOIN measurements m ON m.workspace_id = u.workspace_id AND m.id = ANY(cur.measurement_ids) AND m.photo_id = p.id
        WHERE ${lotWhere}${blind}
        ORDER BY l.received_on, l.created_at, l.id, u.sample_index, p.created_at, p.id, r.position, r.id`;
  }
}

const dialect = new PgDialect({ casing: "snake_case" });

/**
 * The export's rows, `batchSize` at a time from a cursor on a connection of its own. Stopping the
 * iteration early (a download cancelled) closes the cursor and gives the connection back.
 */
export async function* exportRows<K extends ExportKind>(
  kind: K,
  scope: { workspaceId: string; filter: ReportFilter; timeZone: string; hideUnitsAwaitingRecheck?: boolean },
  batchSize = 500,
): AsyncGenerator<ExportRow[K]> {
  const { sql: text, params } = dialect.sqlToQuery(exportQuery(kind, scope.workspaceId, scope.filter, scope.timeZone, scope.hideUnitsAwaitingRecheck ?? false));
  const client = await pool().connect();
  const cursor = client.query(new Cursor<ExportRow[K]>(text, params as unknown[]));
  let failure: Error | undefined;
  try {
    for (;;) {
      const rows = await cursor.read(batchSize);
      if (rows.length === 0) break;
      yield* rows;
    }
  } catch (error) {
    failure = error as Error;
    throw error;
  } finally {
    await cursor.close().catch(() => {});
    // A connection that failed mid-read is dropped rather than handed to the next request.
    client.release(failure);
  }
}
