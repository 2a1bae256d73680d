/**
 * Calibration scoring over the set: grade agreement, kappa, mean IoU per class, pass/fail.
 * Marks as in docs/references.md: (a) public source, (b) from memory, (c) our own rule.
 * GWET  Gwet (2014), Handbook of Inter-Rater Reliability, 4 × 4 two-rater table
 *       [[40,4,4,17],[6,25,2,13],[4,1,21,12],[15,5,9,45]] → Cohen's kappa 0.432 (a, docs/references.md).
 * SM    statsmodels 0.13.5 `cohens_kappa` on the same table, quadratic weights on the full scale:
 *       κ 0.3831859441, SE 0.0657946958, low 0.25423071 (reference library; the figures
 *       tests/unit/agreement/kappa.test.ts pins).
 * HAND  hand computation beside the check; the class rules are those of score-attempt.ts (c).
 */
import { describe, expect, it } from "vitest";
import { summariseAttempt } from "@/lib/calibration/score-attempt";
import { scoreCalibrationItem, scoreGrades, type CalibrationClassScore, type CalibrationItemScore } from "@/lib/calibration/score-item";
import { DEFAULT_CALIBRATION_THRESHOLDS, calibrationThresholdsSchema } from "@/lib/calibration/schemas";
import type { Grade } from "@/lib/grading/rubric-schema";

const GRADES: Grade[] = ["A", "B", "C", "Reject"];
const GWET_TABLE = [
  [40, 4, 4, 17],
  [6, 25, 2, 13],
  [4, 1, 21, 12],
  [15, 5, 9, 45],
];

/** A class score with only the fields the summary reads made meaningful. */
function classScore(keyPx: number, attemptPx: number, iou: number, counts: Partial<CalibrationClassScore> = {}): CalibrationClassScore {
  return {
    keyPx,
    attemptPx,
    sharedPx: 0,
    unionPx: keyPx + attemptPx,
    iou,
    dice: (2 * iou) / (1 + iou),
    keyDefects: keyPx > 0 ? 1 : 0,
    attemptDefects: attemptPx > 0 ? 1 : 0,
    matched: 0,
    missed: 0,
    extra: 0,
    ...counts,
  };
}

function itemScore(itemId: string, key: Grade, given: Grade, classes: Record<string, CalibrationClassScore> = {}): CalibrationItemScore {
  const total = (field: "keyDefects" | "matched" | "missed" | "extra") => Object.values(classes).reduce((sum, c) => sum + c[field], 0);
  return { itemId, grade: scoreGrades(key, given), classes, keyDefects: total("keyDefects"), matched: total("matched"), missed: total("missed"), extra: total("extra") };
}

describe("summariseAttempt: grades", () => {
  it("Gwet's 4 × 4 table as 223 items: κ 0.432 (GWET a), quadratic κ 0.3832 with its interval (SM)", () => {
    const items: CalibrationItemScore[] = [];
    GWET_TABLE.forEach((row, i) =>
      row.forEach((count, j) => {
        for (let k = 0; k < count; k++) items.push(itemScore(`i${items.length}`, GRADES[i], GRADES[j]));
      }),
    );
    const summary = summariseAttempt(items, DEFAULT_CALIBRATION_THRESHOLDS);
    expect(summary.items).toBe(223);
    expect(Number(summary.grades.kappa.kappa.toFixed(3))).toBe(0.432);
    expect(summary.grades.kappa.band).toBe("moderate");
    expect(summary.grades.quadraticKappa.kappa).toBeCloseTo(0.3831859441, 9);
    expect(summary.grades.quadraticKappa.standardError).toBeCloseTo(0.0657946958, 9);
    expect(summary.grades.quadraticKappa.low).toBeCloseTo(0.25423071, 8);
    // Exact: the diagonal 40 + 25 + 21 + 45 = 131 of 223. Within one step adds the first off-diagonals:
    // 4 + 2 + 12 + 6 + 1 + 9 = 34 → 165.
    expect(summary.grades).toMatchObject({ exact: 131, withinOne: 165 });
    expect(summary.grades.exactShare).toBeCloseTo(131 / 223, 15);
  });

  it("reads kappa on the full A/B/C/Reject scale: A→A, C→C, Reject→Reject, A→C, C→Reject gives quadratic 2/3, not 11/16 (HAND)", () => {
    const items = [itemScore("1", "A", "A"), itemScore("2", "C", "C"), itemScore("3", "Reject", "Reject"), itemScore("4", "A", "C"), itemScore("5", "C", "Reject")];
    const summary = summariseAttempt(items, DEFAULT_CALIBRATION_THRESHOLDS);
    expect(summary.grades.quadraticKappa.kappa).toBeCloseTo(2 / 3, 12);
    expect(summary.grades.kappa.kappa).toBeCloseTo(7 / 17, 12);
    expect(summary.grades).toMatchObject({ exact: 3, withinOne: 4, exactShare: 0.6, withinOneShare: 0.8 });
  });

  it("gives an undefined kappa (NaN, no band) when key and grader say A every time, and still passes on agreement", () => {
    const summary = summariseAttempt([itemScore("1", "A", "A"), itemScore("2", "A", "A")], DEFAULT_CALIBRATION_THRESHOLDS);
    expect(summary.grades.kappa).toMatchObject({ kappa: Number.NaN, band: null, n: 2 });
    expect(summary.checks).toEqual([{ check: "grade_agreement", value: 1, threshold: 0.8, passed: true }]);
    expect(summary.passed).toBe(true);
  });
});

describe("summariseAttempt: mean IoU per class and which classes decide (c)", () => {
  it("averages over the items where key or attempt has the class; a clean item adds nothing, a false alarm adds 0 (HAND)", () => {
    const items = [
      itemScore("1", "B", "B", { scratch: classScore(100, 90, 0.6, { matched: 1 }) }),
      itemScore("2", "B", "B", { scratch: classScore(50, 60, 0.4, { matched: 1 }) }),
      itemScore("3", "A", "A"),
      itemScore("4", "A", "A", { scratch: classScore(0, 30, 0, { extra: 1 }) }),
    ];
    const summary = summariseAttempt(items, { minGradeAgreement: 0.8, minMeanIou: 0.3 });
    // (0.6 + 0.4 + 0) / 3 items in play; item 3 (neither marked a scratch) is not counted.
    expect(summary.classes.scratch).toMatchObject({ items: 3, keyItems: 2, keyDefects: 2, matched: 2, missed: 0, extra: 1, gates: true });
    expect(summary.classes.scratch.meanIou).toBeCloseTo(1 / 3, 15);
    expect(summary.checks).toContainEqual({ check: "mean_iou", defect: "scratch", value: summary.classes.scratch.meanIou, threshold: 0.3, passed: true });
    expect(summary.passed).toBe(true);
  });

  it("a class only the grader used is listed with IoU 0 but does not decide pass/fail", () => {
    const items = [itemScore("1", "B", "B", { dent: classScore(80, 80, 0.9, { matched: 1 }), stain: classScore(0, 20, 0, { extra: 1 }) })];
    const summary = summariseAttempt(items, DEFAULT_CALIBRATION_THRESHOLDS);
    expect(summary.classes.stain).toMatchObject({ meanIou: 0, gates: false, extra: 1, keyItems: 0 });
    expect(summary.checks.map((check) => (check.check === "mean_iou" ? check.defect : check.check))).toEqual(["grade_agreement", "dent"]);
    expect(summary.passed).toBe(true);
  });

  it("fails on the one class under its threshold and says which", () => {
    const items = [itemScore("1", "B", "B", { dent: classScore(80, 80, 0.9), crack: classScore(40, 30, 0.45) }), itemScore("2", "C", "C", { crack: classScore(40, 30, 0.5) })];
    const summary = summariseAttempt(items, DEFAULT_CALIBRATION_THRESHOLDS);
    // Crack mean (0.45 + 0.5) / 2 = 0.475 < 0.5.
    expect(summary.checks.filter((check) => !check.passed)).toEqual([{ check: "mean_iou", defect: "crack", value: 0.475, threshold: 0.5, passed: false }]);
    expect(summary.passed).toBe(false);
  });

  it("4 of 5 grades exact passes an 80 % threshold; 3 of 5 does not (boundary, HAND)", () => {
    const grades = (wrong: number) => Array.from({ length: 5 }, (_, i) => itemScore(String(i), "B", i < wrong ? "C" : "B"));
    expect(summariseAttempt(grades(1), DEFAULT_CALIBRATION_THRESHOLDS).passed).toBe(true);
    expect(summariseAttempt(grades(2), DEFAULT_CALIBRATION_THRESHOLDS)).toMatchObject({ passed: false, checks: [{ check: "grade_agreement", value: 0.6, passed: false }] });
    // IoU exactly at the threshold passes.
    const atThreshold = [itemScore("1", "B", "B", { dent: classScore(10, 10, 0.5) })];
    expect(summariseAttempt(atThreshold, DEFAULT_CALIBRATION_THRESHOLDS).passed).toBe(true);
  });

  it("refuses an empty attempt and an item scored twice", () => {
    expect(() => summariseAttempt([], DEFAULT_CALIBRATION_THRESHOLDS)).toThrow(/at least one item/);
    expect(() => summariseAttempt([itemScore("1", "A", "A"), itemScore("1", "A", "B")], DEFAULT_CALIBRATION_THRESHOLDS)).toThrow(/scored once/);
  });
});

describe("score-item → score-attempt on real masks", () => {
  it("scores a two-item attempt end to end (REF a: IoU 1/7 of the squares; HAND)", async () => {
    const rect = (x: number, y: number, width: number, height: number) => ({ kind: "rect" as const, x, y, width, height });
    const first = await scoreCalibrationItem({
      itemId: "a",
      width: 10,
      height: 10,
      key: { grade: "B", regions: [{ id: "k", defect: "dent", shape: rect(0, 0, 4, 4) }] },
      attempt: { grade: "B", regions: [{ id: "g", defect: "dent", shape: rect(2, 2, 4, 4) }] },
    });
    const second = await scoreCalibrationItem({
      itemId: "b",
      width: 10,
      height: 10,
      key: { grade: "C", regions: [{ id: "k", defect: "dent", shape: rect(5, 5, 5, 5) }] },
      attempt: { grade: "B", regions: [{ id: "g", defect: "dent", shape: rect(5, 5, 5, 5) }] },
    });
    const summary = summariseAttempt([first, second], DEFAULT_CALIBRATION_THRESHOLDS);
    // Mean dent IoU (1/7 + 1) / 2 = 4/7 >= 0.5; grades 1 of 2 exact < 80 %.
    expect(summary.classes.dent.meanIou).toBeCloseTo(4 / 7, 15);
    expect(summary.classes.dent).toMatchObject({ keyDefects: 2, matched: 1, missed: 1, extra: 1 });
    expect(summary.checks.map((check) => check.passed)).toEqual([false, true]);
    expect(summary.passed).toBe(false);
  });
});

describe("calibrationThresholdsSchema", () => {
  it("takes fractions from 0 to 1 and refuses the rest with a readable message", () => {
    expect(calibrationThresholdsSchema.parse({ minGradeAgreement: 0.8, minMeanIou: 0.5 })).toEqual(DEFAULT_CALIBRATION_THRESHOLDS);
    const tooHigh = calibrationThresholdsSchema.safeParse({ minGradeAgreement: 80, minMeanIou: 0.5 });
    expect(tooHigh.success).toBe(false);
    expect(tooHigh.error!.issues[0].message).toMatch(/at most 1 \(100 %\)/);
    expect(calibrationThresholdsSchema.safeParse({ minGradeAgreement: 0.8, minMeanIou: 0.5, extra: 1 }).success).toBe(false);
  });
});
