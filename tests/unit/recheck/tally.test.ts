/**
 * The agreement tally behind the scorecards.
 * SAS   SAS PROC FREQ printout for [[0,4,1],[0,8,0],[0,1,5]]: simple κ 0.4842, ASE 0.1380, 95 %
 *       limits 0.2137–0.7547 (a, reproduced in statsmodels' test_inter_rater.py; docs/references.md).
 *       Put on A, B, C with Reject unused: an unused category has zero margins and changes neither
 *       plain nor weighted kappa at the same positions (HAND; tests/unit/agreement/kappa.test.ts).
 * SM    statsmodels 0.13.5 `cohens_kappa(…, wt="quadratic")` on that table: κ 0.4501607717
 *       (reference library, the figure tests/unit/agreement/kappa.test.ts pins).
 * SCIPY SciPy 1.17.1 `binomtest(13, 19).proportion_ci(method="wilson")`: 0.4601040768–0.8463562091
 *       (reference library, the machine's Python 3.11, run here).
 */
import { describe, expect, it } from "vitest";
import type { Grade } from "@/lib/grading/rubric-schema";
import { AgreementTally } from "@/lib/recheck/tally";

const SAS_TABLE = [
  [0, 4, 1],
  [0, 8, 0],
  [0, 1, 5],
];
const GRADES: Grade[] = ["A", "B", "C", "Reject"];

function tallyOf(table: number[][]): AgreementTally {
  const tally = new AgreementTally();
  table.forEach((row, i) =>
    row.forEach((count, j) => {
      for (let k = 0; k < count; k++) tally.add(GRADES[i], GRADES[j]);
    }),
  );
  return tally;
}

describe("AgreementTally", () => {
  it("reproduces SAS's simple kappa, ASE and limits, and statsmodels' quadratic kappa (SAS a, SM)", () => {
    const figures = tallyOf(SAS_TABLE).figures();
    expect(figures.n).toBe(19);
    const k = figures.kappa;
    expect([k.kappa, k.standardError, k.low, k.high].map((v) => Number(v.toFixed(4)))).toEqual([0.4842, 0.138, 0.2137, 0.7547]);
    expect(k.band).toBe("moderate");
    expect(figures.quadraticKappa.kappa).toBeCloseTo(0.4501607717, 9);
    expect(figures.quadraticKappa.n).toBe(19);
  });

  it("exact agreement with its Wilson interval, and within one step (SCIPY, HAND)", () => {
    const figures = tallyOf(SAS_TABLE).figures();
    // Diagonal 0 + 8 + 5 = 13; within one adds (A,B) 4 and (C,B) 1 → 18; (A,C) is two steps.
    expect(figures.exact.share).toBeCloseTo(13 / 19, 15);
    expect(figures.exact.low).toBeCloseTo(0.4601040768, 9);
    expect(figures.exact.high).toBeCloseTo(0.8463562091, 9);
    expect(figures.withinOne).toBeCloseTo(18 / 19, 15);
  });

  it("averages IoU per class over the rechecks where someone marked it (unionPx > 0), sorted by class", () => {
    const tally = new AgreementTally();
    tally.add("A", "A", { scratch: { iou: 0.5, unionPx: 100 }, dust: { iou: 1, unionPx: 0 } });
    tally.add("B", "B", { scratch: { iou: 0.3, unionPx: 40 }, dent: { iou: 0, unionPx: 12 } });
    tally.add("B", "B");
    expect(tally.figures().meanIou).toEqual({ dent: { mean: 0, n: 1 }, scratch: { mean: 0.4, n: 2 } });
    expect(Object.keys(tally.figures().meanIou)).toEqual(["dent", "scratch"]);
  });

  it("adds up: two tallies merged give the figures of all their rechecks", () => {
    const left = tallyOf([
      [3, 1, 0, 0],
      [0, 2, 1, 0],
      [0, 0, 0, 0],
      [0, 0, 0, 0],
    ]);
    left.add("A", "A", { dent: { iou: 0.2, unionPx: 5 } });
    const right = tallyOf([
      [0, 0, 0, 0],
      [1, 0, 0, 0],
      [0, 1, 4, 0],
      [0, 0, 1, 2],
    ]);
    right.add("C", "C", { dent: { iou: 0.8, unionPx: 5 } });
    const merged = new AgreementTally();
    merged.addTally(left);
    merged.addTally(right);
    const all = tallyOf([
      [3, 1, 0, 0],
      [1, 2, 1, 0],
      [0, 1, 4, 0],
      [0, 0, 1, 2],
    ]);
    all.add("A", "A", { dent: { iou: 0.2, unionPx: 5 } });
    all.add("C", "C", { dent: { iou: 0.8, unionPx: 5 } });
    expect(merged.figures()).toEqual(all.figures());
    expect(merged.figures().meanIou.dent.mean).toBeCloseTo(0.5, 15);
  });

  it("an empty tally has n = 0 and undefined (NaN) figures, not zeros", () => {
    const figures = new AgreementTally().figures();
    expect(figures.n).toBe(0);
    expect(figures.exact.share).toBeNaN();
    expect(figures.withinOne).toBeNaN();
    expect(figures.kappa.kappa).toBeNaN();
    expect(figures.kappa.band).toBeNull();
  });

  it("refuses an unknown grade and an IoU outside 0–1", () => {
    expect(() => new AgreementTally().add("A", "E" as Grade)).toThrow(/"E" is not a grade/);
    expect(() => new AgreementTally().add("A", "A", { dent: { iou: 1.2, unionPx: 3 } })).toThrow(/between 0 and 1/);
  });
});
