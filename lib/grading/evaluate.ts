/**
 * Grades one unit with a rubric: every rule reads its metric (unit-metrics.ts), fired rules lower
 * the grade and the worst grade wins (A < B < C < Reject). Each fired rule writes one
 * explanation line; a rule that could not be read (no calibration, no photo of its view, …)
 * writes a "Could not evaluate" note instead of passing silently.
 *
 * Built-in rule: a defect class whose severity in the part type is "critical" present on any
 * photo (count > 0) → Reject. Major and minor severities do not grade by themselves.
 *
 * Lines are ordered worst grade first, then built-in lines (by defect key), then rubric order.
 * Comparisons treat values within 1e-9 (relative) of the threshold as equal to it, so a share
 * computed as 7/100 equals a 7 % threshold despite binary rounding.
 */
import { AppError } from "@/lib/errors";
import type { DefectSeverity } from "@/lib/part-types/severity";
import type { PixelFaultClass } from "@/lib/measure/types";
import { formatRubricIssues, gradeRank, pixelClassRank, rubricSchema, ruleZone, worseGrade, type Grade, type Rule, type Rubric } from "./rubric-schema";
import { describeRule, explainCriticalDefect, explainFiredRule, viewLabel, zoneLabel, type GradingLabels } from "./rule-text";
import { readMetric, totalDefectCount, type MetricReading, type UnitMetrics } from "./unit-metrics";

export type GradeLine = {
  /** The rubric rule's id, or "builtin:critical:<defect>" / "builtin:none". */
  ruleId: string;
  grade: Grade;
  text: string;
  /** In the rule's unit: percent for share, mm, mm², a count, or a pixel-fault class. */
  value: number | string | null;
  threshold: number | string | null;
};

export type GradeResult = {
  grade: Grade;
  lines: GradeLine[];
  notes: string[];
  /** Rules that could not be evaluated on some or all photos; each has a note. */
  unevaluatedRuleIds: string[];
};

export type EvaluateInput = {
  rubric: Rubric;
  metrics: UnitMetrics;
  defectSeverities: Record<string, DefectSeverity>;
  labels?: GradingLabels;
};

const TOLERANCE = 1e-9;

/** Whether a rule's comparison holds for a value (see the tolerance note above). */
export function ruleFires(rule: Rule, value: number | PixelFaultClass): boolean {
  if (rule.metric === "pixelFaultClass") {
    return typeof value === "string" && pixelClassRank(value) > pixelClassRank(rule.threshold);
  }
  if (typeof value !== "number") return false;
  const nearlyEqual = Math.abs(value - rule.threshold) <= TOLERANCE * Math.max(1, Math.abs(rule.threshold));
  if (nearlyEqual) return rule.comparison === ">=";
  return value > rule.threshold;
}

const notMeasuredText: Partial<Record<Rule["metric"], string>> = {
  maxLengthMm: "no length was measured (lengths come from Line regions)",
  totalLengthMm: "no length was measured (lengths come from Line regions)",
  maxDiameterMm: "no diameter was measured (diameters come from Spot regions)",
  areaMm2: "no area in mm² was measured",
};

function couldNotEvaluateNotes(rule: Rule, reading: MetricReading, labels: GradingLabels): string[] {
  const head = `Could not evaluate "${rule.id}" (${describeRule(rule, labels)})`;
  const ofView = rule.metric !== "functionalFailures" && rule.view !== undefined ? ` of the ${viewLabel(rule.view, labels)} view` : "";
  switch (reading.missing) {
    case "no-photos":
      return [`${head}: no photos were measured.`];
    case "no-photo-of-view":
      return [`${head}: no photo${ofView} was measured.`];
    case "zone-not-on-photos":
      return [`${head}: zone ${zoneLabel(ruleZone(rule) ?? "", labels)} is not on any measured photo${ofView}.`];
    case "no-pixel-fault-count":
      return [`${head}: no measured photo${ofView} has a pixel-fault count.`];
    default:
      break;
  }
  const notes: string[] = [];
  for (const reason of ["uncalibrated", "not-measured"] as const) {
    const photos = reading.unknown.filter((entry) => entry.reason === reason);
    if (photos.length === 0) continue;
    const list = photos.map((p) => `${p.photoId} (${viewLabel(p.viewKey, labels)})`).join(", ");
    const why = reason === "uncalibrated" ? "not calibrated, so millimetres are unknown" : (notMeasuredText[rule.metric] ?? "no value was measured");
    notes.push(`${head} on photo${photos.length === 1 ? "" : "s"} ${list}: ${why}.`);
  }
  return notes;
}

function assertValidRubric(rubric: Rubric): Rubric {
  const parsed = rubricSchema.safeParse(rubric);
  if (parsed.success) return parsed.data;
  const errors = formatRubricIssues(parsed.error.issues, rubric);
  throw new AppError("bad_request", `The rubric is not valid: ${errors.join("; ")}`);
}

export function evaluateRubric({ rubric, metrics, defectSeverities, labels = {} }: EvaluateInput): GradeResult {
  const { rules } = assertValidRubric(rubric);
  const ranked: { line: GradeLine; group: number; order: number }[] = [];
  const notes: string[] = [];
  const unevaluatedRuleIds: string[] = [];

  const criticalDefects = Object.keys(defectSeverities)
    .filter((defect) => defectSeverities[defect] === "critical")
    .sort();
  criticalDefects.forEach((defect, order) => {
    const count = totalDefectCount(metrics, defect);
    if (count > 0) {
      const text = explainCriticalDefect(defect, count, labels);
      ranked.push({ line: { ruleId: `builtin:critical:${defect}`, grade: "Reject", text, value: count, threshold: 0 }, group: 0, order });
    }
  });

  rules.forEach((rule, order) => {
    const reading = readMetric(metrics, rule);
    if (reading.value !== null && ruleFires(rule, reading.value)) {
      // A fired rule's outcome cannot change: unknown photos could only raise the same value.
      const text = explainFiredRule(rule, reading.value, labels);
      ranked.push({ line: { ruleId: rule.id, grade: rule.grade, text, value: reading.value, threshold: rule.threshold }, group: 1, order });
      return;
    }
    const ruleNotes = couldNotEvaluateNotes(rule, reading, labels);
    if (ruleNotes.length > 0) {
      notes.push(...ruleNotes);
      unevaluatedRuleIds.push(rule.id);
    }
  });

  ranked.sort((a, b) => gradeRank(b.line.grade) - gradeRank(a.line.grade) || a.group - b.group || a.order - b.order);
  const lines = ranked.map((entry) => entry.line);
  const grade = lines.reduce<Grade>((worst, line) => worseGrade(worst, line.grade), "A");
  if (lines.length === 0) {
    const skipped = unevaluatedRuleIds.length;
    const suffix = skipped === 0 ? "" : `; ${skipped} rule${skipped === 1 ? "" : "s"} could not be evaluated (see notes)`;
    lines.push({ ruleId: "builtin:none", grade: "A", text: `No rule fired: grade A${suffix}`, value: null, threshold: null });
  }
  return { grade, lines, notes, unevaluatedRuleIds };
}
