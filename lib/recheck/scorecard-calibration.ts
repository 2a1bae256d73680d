/**
 * Calibration results on the scorecards (screen, API and CSV): the attempts a person submitted in
 * the period, each with its set, local day, the share of items graded as the key and the verdict
 * with the checks that failed (lib/calibration/score-attempt.ts decides them). Nothing of the key
 * — items, key grades, regions, captions — is part of it (db/queries/calibration.ts reads only these
 * fields out of the stored score), so auditors and leads who have not taken a set learn nothing
 * of its key here.
 */
import { formatPercent } from "./scorecard-format";

export type CalibrationFailedCheck = { check: "grade_agreement" | "mean_iou"; defect?: string; value: number; threshold: number };
export type CalibrationResult = {
  attemptId: string;
  userId: string;
  setId: string;
  setName: string;
  /** Local day of submission (the workspace's time zone). */
  day: string;
  items: number;
  exactShare: number;
  passed: boolean;
  failedChecks: CalibrationFailedCheck[];
};

/** "grade agreement 40 % (needs 80 %)" or "mean IoU of scratch 0.31 (needs 0.50)". */
export function calibrationCheckText(check: CalibrationFailedCheck, classLabel: (defect: string) => string = (defect) => defect): string {
  if (check.check === "grade_agreement") return `grade agreement ${formatPercent(check.value)} (needs ${formatPercent(check.threshold)})`;
  return `mean IoU of ${classLabel(check.defect ?? "?")} ${check.value.toFixed(2)} (needs ${check.threshold.toFixed(2)})`;
}

/** "Passed" or "Failed: grade agreement 40 % (needs 80 %)". */
export function calibrationVerdictText(result: Pick<CalibrationResult, "passed" | "failedChecks">, classLabel?: (defect: string) => string): string {
  return result.passed ? "Passed" : `Failed: ${result.failedChecks.map((check) => calibrationCheckText(check, classLabel)).join("; ") || "below the set's thresholds"}`;
}

/** Per person, their attempts of the period in submission order. */
export function calibrationByPerson(results: readonly CalibrationResult[]): Map<string, CalibrationResult[]> {
  const byPerson = new Map<string, CalibrationResult[]>();
  for (const result of results) byPerson.set(result.userId, [...(byPerson.get(result.userId) ?? []), result]);
  return byPerson;
}

/** "1 of 2 passed", or "—" for nobody's attempt. */
export function calibrationCountText(results: readonly Pick<CalibrationResult, "passed">[]): string {
  if (results.length === 0) return "—";
  return `${results.filter((r) => r.passed).length} of ${results.length} passed`;
}
