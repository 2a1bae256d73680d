import "server-only";
/**
 * The CSV exports of the Reports screen: which columns each kind has, read from a database cursor
 * (db/queries/report-exports.ts) into csv-stream.ts. Column names are snake_case, stable, and
 * documented here; instants are ISO 8601 in UTC, days YYYY-MM-DD (the database writes both).
 * Rounding (c): measured figures keep 4 decimals, enough for a share of 0.01 % and a tenth of a
 * pixel, without float noise such as 0.30000000000000004.
 */
import { exportRows, type DefectExportRow, type ExportRow, type GradeExportRow, type LotExportRow, type UnitExportRow } from "@/db/queries/report-exports";
import { csvStream, type CsvColumn } from "./csv-stream";
import type { ExportKind, ReportFilter } from "./filters";
import { regionSize } from "./region-size";

const round4 = (value: number | null) => (value === null || !Number.isFinite(value) ? null : Math.round(value * 1e4) / 1e4);

const LOT_COLUMNS: CsvColumn<LotExportRow>[] = [
  { header: "lot_id", value: (r) => r.lot_id },
  { header: "purchase_ref", value: (r) => r.purchase_ref },
  { header: "supplier", value: (r) => r.supplier },
  { header: "part_type", value: (r) => r.part_type },
  { header: "model_family", value: (r) => r.model_family },
  { header: "quantity", value: (r) => r.quantity },
  { header: "received_on", value: (r) => r.received_on },
  { header: "due_on", value: (r) => r.due_on },
  { header: "inspection_level", value: (r) => r.inspection_level },
  { header: "inspection_severity", value: (r) => r.inspection_severity },
  { header: "sample_size", value: (r) => r.sample_size },
  { header: "promised_grade", value: (r) => r.promised_grade },
  { header: "status", value: (r) => r.status },
  { header: "verdict", value: (r) => r.verdict },
  { header: "disposition", value: (r) => r.disposition },
  { header: "disposition_reason", value: (r) => r.disposition_reason },
  { header: "decided_by", value: (r) => r.decided_by },
  { header: "decided_at", value: (r) => r.decided_at },
  { header: "units_sampled", value: (r) => r.units_sampled },
  { header: "units_graded", value: (r) => r.units_graded },
];

const UNIT_COLUMNS: CsvColumn<UnitExportRow>[] = [
  { header: "unit_id", value: (r) => r.unit_id },
  { header: "lot_id", value: (r) => r.lot_id },
  { header: "purchase_ref", value: (r) => r.purchase_ref },
  { header: "supplier", value: (r) => r.supplier },
  { header: "part_type", value: (r) => r.part_type },
  { header: "sample_index", value: (r) => r.sample_index },
  { header: "serial", value: (r) => r.serial },
  { header: "status", value: (r) => r.status },
  { header: "grade", value: (r) => r.grade },
  { header: "grade_kind", value: (r) => r.grade_kind },
  { header: "rubric_version", value: (r) => r.rubric_version },
  { header: "graded_by", value: (r) => r.graded_by },
  { header: "graded_at", value: (r) => r.graded_at },
  { header: "checklist_failed", value: (r) => r.checklist_failed },
];

const GRADE_COLUMNS: CsvColumn<GradeExportRow>[] = [
  { header: "grade_id", value: (r) => r.grade_id },
  { header: "unit_id", value: (r) => r.unit_id },
  { header: "serial", value: (r) => r.serial },
  { header: "purchase_ref", value: (r) => r.purchase_ref },
  { header: "part_type", value: (r) => r.part_type },
  { header: "kind", value: (r) => r.kind },
  { header: "proposed_grade", value: (r) => r.proposed_grade },
  { header: "final_grade", value: (r) => r.final_grade },
  { header: "override_reason", value: (r) => r.override_reason },
  { header: "rubric_version", value: (r) => r.rubric_version },
  { header: "graded_by", value: (r) => r.graded_by },
  { header: "created_at", value: (r) => r.created_at },
];

type DefectRow = DefectExportRow & { size: ReturnType<typeof regionSize> };

const DEFECT_COLUMNS: CsvColumn<DefectRow>[] = [
  { header: "region_id", value: (r) => r.region_id },
  { header: "unit_id", value: (r) => r.unit_id },
  { header: "serial", value: (r) => r.serial },
  { header: "lot_id", value: (r) => r.lot_id },
  { header: "purchase_ref", value: (r) => r.purchase_ref },
  { header: "supplier", value: (r) => r.supplier },
  { header: "part_type", value: (r) => r.part_type },
  { header: "photo_id", value: (r) => r.photo_id },
  { header: "view", value: (r) => r.view },
  { header: "defect_class", value: (r) => r.defect_class },
  { header: "shape", value: (r) => r.shape.kind },
  { header: "x_px", value: (r) => round4(r.size.x) },
  { header: "y_px", value: (r) => round4(r.size.y) },
  { header: "width_px", value: (r) => round4(r.size.width) },
  { header: "height_px", value: (r) => round4(r.size.height) },
  { header: "region_area_px", value: (r) => round4(r.size.areaPx) },
  { header: "region_length_px", value: (r) => round4(r.size.lengthPx) },
  { header: "px_per_mm", value: (r) => round4(r.px_per_mm) },
  { header: "calibration", value: (r) => r.calibration },
  { header: "region_area_mm2", value: (r) => round4(r.size.areaMm2) },
  { header: "region_length_mm", value: (r) => round4(r.size.lengthMm) },
  { header: "class_px_on_photo", value: (r) => r.class_px },
  { header: "class_share_of_surface", value: (r) => round4(r.class_share) },
  { header: "class_count_on_photo", value: (r) => r.class_count },
  { header: "class_area_mm2_on_photo", value: (r) => round4(r.class_area_mm2) },
  { header: "class_max_length_mm_on_photo", value: (r) => round4(r.class_max_length_mm) },
  { header: "measured_at", value: (r) => r.measured_at },
];

async function* withSizes(rows: AsyncIterable<DefectExportRow>): AsyncGenerator<DefectRow> {
  for await (const row of rows) yield { ...row, size: regionSize(row.shape, row.px_per_mm) };
}

/** `hideUnitsAwaitingRecheck`: for readers without inspection.read, units whose blind recheck still waits are left out (issue 19). */
type Scope = { workspaceId: string; filter: ReportFilter; timeZone: string; hideUnitsAwaitingRecheck?: boolean };

/** The export as a stream of CSV bytes; nothing is read from the database until the stream is pulled. */
export function exportCsv(kind: ExportKind, scope: Scope): ReadableStream<Uint8Array> {
  switch (kind) {
    case "lots":
      return csvStream(LOT_COLUMNS, exportRows("lots", scope));
    case "units":
      return csvStream(UNIT_COLUMNS, exportRows("units", scope));
    case "grades":
      return csvStream(GRADE_COLUMNS, exportRows("grades", scope));
    case "defects":
      return csvStream(DEFECT_COLUMNS, withSizes(exportRows("defects", scope)));
  }
}

export const EXPORT_HEADERS: Record<ExportKind, string[]> = {
  lots: LOT_COLUMNS.map((c) => c.header),
  units: UNIT_COLUMNS.map((c) => c.header),
  grades: GRADE_COLUMNS.map((c) => c.header),
  defects: DEFECT_COLUMNS.map((c) => c.header),
};

/** "partproof-defects-2026-12-03.csv" */
export const exportFileName = (kind: ExportKind, today: string) => `partproof-${kind}-${today}.csv`;

export type { ExportRow };
