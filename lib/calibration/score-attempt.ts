/**
 * Calibration scoring, the whole attempt: the item scores of one attempt (score-item.ts) summed up
 * and judged against the set's pass thresholds.
 *
 * Decisions:
 * - Grades over the set: exact agreement (share of items graded as the key), within one step,
 *   Cohen's kappa and quadratic-weighted kappa of [key, given] pairs with their 95 % intervals,
 *   always on the full A/B/C/Reject scale (lib/agreement.ts; NaN where undefined, e.g. every key
 *   and every answer "A": show "n/a").
 * - Mean IoU (and Dice) per class: the mean over the items where the key or the attempt has
 *   pixels of that class. An item where neither has any contributes nothing — not a 1 for
 *   agreeing that nothing is there (that would reward a set of clean items with a perfect score)
 *   and not a 0. An item where only the attempt has the class contributes IoU 0 (a false alarm),
 *   one where only the key has it contributes 0 too (a miss).
 * - Which classes decide pass/fail: the key classes — those the key has pixels of on at least one
 *   item of the set. A class only the grader used is listed (with its extra defects and its mean
 *   IoU of 0) but does not gate: the set has no example of it to be measured against. False
 *   alarms of a key class (marked on items whose key lacks it) do lower that class's mean. A set
 *   whose key marks nothing at all is judged on grades alone.
 * - Pass: exact grade agreement >= minGradeAgreement and every key class's mean IoU >=
 *   minMeanIou (compared with a 1e-9 tolerance, so 4 of 5 items passes an 80 % threshold however
 *   the share was rounded). Each check is returned with its value, so the screen can say which
 *   one failed.
 */
import { cohenKappaInterval, withBand, type KappaWithBand } from "@/lib/agreement";
import { GRADES } from "@/lib/grading/rubric-schema";
import type { CalibrationThresholds } from "./schemas";
import type { CalibrationItemScore } from "./score-item";

const TOLERANCE = 1e-9;

export type CalibrationClassSummary = {
  /** Items where the key or the attempt has this class (the items its means are taken over). */
  items: number;
  /** Items where the key has this class. */
  keyItems: number;
  meanIou: number;
  meanDice: number;
  keyDefects: number;
  matched: number;
  missed: number;
  extra: number;
  /** Whether this class decides pass/fail (a key class). */
  gates: boolean;
};

export type CalibrationCheck =
  { check: "grade_agreement"; value: number; threshold: number; passed: boolean } | { check: "mean_iou"; defect: string; value: number; threshold: number; passed: boolean };

export type CalibrationSummary = {
  items: number;
  grades: { exact: number; withinOne: number; exactShare: number; withinOneShare: number; kappa: KappaWithBand; quadraticKappa: KappaWithBand };
  classes: Record<string, CalibrationClassSummary>;
  checks: CalibrationCheck[];
  passed: boolean;
};

export function summariseAttempt(items: readonly CalibrationItemScore[], thresholds: CalibrationThresholds): CalibrationSummary {
  if (items.length === 0) throw new RangeError("An attempt has at least one item to score.");
  const ids = new Set(items.map((item) => item.itemId));
  if (ids.size !== items.length) throw new RangeError("Each item of the set is scored once per attempt.");

  const pairs = items.map((item) => [item.grade.key, item.grade.given] as const);
  const exact = items.filter((item) => item.grade.exact).length;
  const withinOne = items.filter((item) => item.grade.withinOne).length;
  const grades = {
    exact,
    withinOne,
    exactShare: exact / items.length,
    withinOneShare: withinOne / items.length,
    kappa: withBand(cohenKappaInterval(pairs, { categories: GRADES })),
    quadraticKappa: withBand(cohenKappaInterval(pairs, { weights: "quadratic", categories: GRADES })),
  };

  const totals = new Map<string, CalibrationClassSummary & { iouSum: number; diceSum: number }>();
  for (const item of items) {
    for (const [defect, score] of Object.entries(item.classes)) {
      const entry = totals.get(defect) ?? { items: 0, keyItems: 0, meanIou: 0, meanDice: 0, keyDefects: 0, matched: 0, missed: 0, extra: 0, gates: false, iouSum: 0, diceSum: 0 };
      entry.items++;
      if (score.keyPx > 0) entry.keyItems++;
      entry.iouSum += score.iou;
      entry.diceSum += score.dice;
      entry.keyDefects += score.keyDefects;
      entry.matched += score.matched;
      entry.missed += score.missed;
      entry.extra += score.extra;
      totals.set(defect, entry);
    }
  }
  const classEntries = [...totals].map(([defect, { iouSum, diceSum, ...entry }]): [string, CalibrationClassSummary] => [
    defect,
    { ...entry, meanIou: iouSum / entry.items, meanDice: diceSum / entry.items, gates: entry.keyItems > 0 },
  ]);

  const checks: CalibrationCheck[] = [
    { check: "grade_agreement", value: grades.exactShare, threshold: thresholds.minGradeAgreement, passed: grades.exactShare >= thresholds.minGradeAgreement - TOLERANCE },
    ...classEntries
      .filter(([, summary]) => summary.gates)
      .map(([defect, summary]): CalibrationCheck => ({
        check: "mean_iou",
        defect,
        value: summary.meanIou,
        threshold: thresholds.minMeanIou,
        passed: summary.meanIou >= thresholds.minMeanIou - TOLERANCE,
      })),
  ];
  return { items: items.length, grades, classes: Object.fromEntries(classEntries), checks, passed: checks.every((check) => check.passed) };
}
