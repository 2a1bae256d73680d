/**
 * The JSON kept in `measurements.result`. A photo row holds that photo's PhotoMeasurement and the
 * notes written while measuring it; the unit-level row holds everything else a re-evaluation
 * needs (failure counts, the defect severities and labels in force when measured) plus the grade
 * proposed under the rubric version of the row. Measurements never depend on the rubric, so the
 * same rows can be graded again under any other version ("what would version N say").
 */
import type { PhotoMeasurement } from "@/lib/measure/types";
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { GradeResult } from "./evaluate";
import type { GradingLabels } from "./rule-text";
import type { FunctionalFailureCounts } from "./unit-metrics";

export type StoredPhotoResult = { kind: "photo"; measurement: PhotoMeasurement; notes: string[] };

export type StoredUnitResult = {
  kind: "unit";
  functionalFailures: FunctionalFailureCounts;
  defectSeverities: Record<string, DefectSeverity>;
  labels: GradingLabels;
  /** Latest checklist result time when measured (ISO), part of the staleness check. */
  checklistStamp: string | null;
  /** Photo id → the view it was filed under when measured, part of the staleness check (absent on older measurements). */
  views?: Record<string, string>;
  proposal: GradeResult;
};

export type StoredMeasurementResult = StoredPhotoResult | StoredUnitResult;
