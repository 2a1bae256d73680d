/**
 * What a lot inspection report shows, as plain data the DB layer fills (no database access here).
 * Dates are Date objects for instants and "YYYY-MM-DD" strings for calendar days, as stored.
 */
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { Grade } from "@/lib/grading/rubric-schema";
import type { Disposition } from "@/lib/lots/schemas";
import type { ParetoInput } from "./pareto";

export type LotReportPlanRow = {
  aql: number | null;
  codeLetter: string;
  planLetter: string;
  sampleSize: number;
  accept: number;
  reject: number;
  /** Units of this class's sample inspected, and the defectives found among them (units, not defects). */
  inspected: number;
  found: number;
};

export type LotReportUnit = {
  sampleIndex: number;
  /** Null for a placeholder whose serial was never recorded. */
  serial: string | null;
  grade: Grade | null;
  /** Labels of the defect classes marked on the unit's photos, most severe first. */
  defectClasses: string[];
  /** Labels of failed checklist items, with the reading where there is one ("Battery voltage 2.9 V"). */
  functionalFailures: string[];
};

export type LotReportPhoto = {
  /** e.g. "Unit OV-24-0113 · Front". */
  caption: string;
  /** The annotated photo with its legend (renderAnnotatedPhoto). */
  jpeg: Buffer;
  width: number;
  height: number;
};

export type LotReportData = {
  workspaceName: string;
  generatedAt: Date;
  generatedBy: string;
  lot: {
    purchaseRef: string;
    supplierName: string;
    partTypeName: string;
    modelFamily: string;
    quantity: number;
    receivedOn: string;
    inspectionLevel: string;
    inspectionSeverity: "normal" | "tightened" | "reduced";
    hundredPercent: boolean;
    /** Units to inspect (the largest sample among the classes). */
    sampleSize: number;
    switchingReason?: string;
  };
  plan: Record<DefectSeverity, LotReportPlanRow>;
  /** Null while the lot is open: the report then shows the running verdict as provisional. */
  decision: {
    verdict: "accept" | "reject";
    disposition: Disposition | null;
    reason: string | null;
    decidedBy: string;
    decidedAt: Date;
  } | null;
  /** Provisional verdict of an open lot ("pending" until its samples are complete). */
  runningVerdict?: "accept" | "reject" | "pending";
  units: LotReportUnit[];
  /** Defects (separate regions after merging overlaps) per defect class over the sampled units. */
  defectCounts: ParetoInput[];
  photos: LotReportPhoto[];
};
