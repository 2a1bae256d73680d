/**
 * Running counts of first grade against recheck, from which every agreement figure of the
 * scorecards is read: a 4 × 4 table on the full A/B/C/Reject scale, and per defect class the sum
 * of IoU over the rechecks where that class was in play. Tallies add up (grader-weeks → grader
 * period → team), so 5 000 rechecks are read once and every figure after that costs a 4 × 4 table.
 *
 * Figures:
 * - exact agreement with its Wilson 95 % interval (lib/agreement/proportion.ts), within one step;
 * - Cohen's kappa and quadratic-weighted kappa with n, the 95 % interval from the analytic
 *   standard error (Fleiss, Cohen & Everitt 1969; lib/agreement/kappa.ts says why not a
 *   bootstrap) and the Landis & Koch band; NaN where undefined (no rechecks, or one grade only);
 * - mean IoU per class over the rechecks where the first grader or the auditor marked the class
 *   (unit-level IoU from compare.ts; a unit where neither marked it says nothing about the class,
 *   as in calibration — lib/calibration/score-attempt.ts).
 */
import { kappaIntervalFromTable, wilsonInterval, withBand, type KappaWithBand, type ShareInterval } from "@/lib/agreement";
import { GRADES, gradeRank, type Grade } from "@/lib/grading/rubric-schema";

export type ClassIou = { iou: number; unionPx: number };
export type AgreementFigures = {
  n: number;
  exact: ShareInterval;
  withinOne: number;
  kappa: KappaWithBand;
  quadraticKappa: KappaWithBand;
  meanIou: Record<string, { mean: number; n: number }>;
};

function rankOf(grade: Grade): number {
  const rank = gradeRank(grade);
  if (rank < 0) throw new RangeError(`${JSON.stringify(grade)} is not a grade (${GRADES.join(", ")}).`);
  return rank;
}

export class AgreementTally {
  readonly table: number[][] = GRADES.map(() => GRADES.map(() => 0));
  n = 0;
  private readonly classes = new Map<string, { sum: number; n: number }>();

  add(first: Grade, recheck: Grade, classes: Readonly<Record<string, ClassIou>> = {}): void {
    this.table[rankOf(first)][rankOf(recheck)]++;
    this.n++;
    for (const [defect, { iou, unionPx }] of Object.entries(classes)) {
      if (!(unionPx > 0)) continue;
      if (!(iou >= 0 && iou <= 1)) throw new RangeError(`An IoU lies between 0 and 1; ${defect} has ${iou}.`);
      const entry = this.classes.get(defect) ?? { sum: 0, n: 0 };
      entry.sum += iou;
      entry.n++;
      this.classes.set(defect, entry);
    }
  }

  /** `count` rechecks graded `first` and then `recheck` (rows the database counted, lib/recheck/scorecard.ts). */
  addCount(first: Grade, recheck: Grade, count: number): void {
    if (!Number.isInteger(count) || count < 0) throw new RangeError(`A recheck count is a whole number >= 0; got ${count}.`);
    this.table[rankOf(first)][rankOf(recheck)] += count;
    this.n += count;
  }

  /** The IoU of `n` rechecks where the class was in play, summed (the database's sum of what `add` adds one by one). */
  addClassSum(defect: string, sum: number, n: number): void {
    if (!Number.isInteger(n) || n < 0) throw new RangeError(`A count of rechecks is a whole number >= 0; ${defect} has ${n}.`);
    if (!(sum >= 0 && sum <= n)) throw new RangeError(`${n} IoU values between 0 and 1 sum to between 0 and ${n}; ${defect} has ${sum}.`);
    if (n === 0) return;
    const entry = this.classes.get(defect) ?? { sum: 0, n: 0 };
    entry.sum += sum;
    entry.n += n;
    this.classes.set(defect, entry);
  }

  addTally(other: AgreementTally): void {
    other.table.forEach((row, i) => row.forEach((count, j) => (this.table[i][j] += count)));
    this.n += other.n;
    for (const [defect, entry] of other.classes) {
      const mine = this.classes.get(defect) ?? { sum: 0, n: 0 };
      this.classes.set(defect, { sum: mine.sum + entry.sum, n: mine.n + entry.n });
    }
  }

  /** Rechecks whose grades agree exactly (the diagonal) or are at most `steps` apart. */
  agreeing(steps = 0): number {
    let count = 0;
    this.table.forEach((row, i) => row.forEach((cell, j) => (count += Math.abs(i - j) <= steps ? cell : 0)));
    return count;
  }

  figures(): AgreementFigures {
    return {
      n: this.n,
      exact: wilsonInterval(this.agreeing(0), this.n),
      withinOne: this.n === 0 ? Number.NaN : this.agreeing(1) / this.n,
      kappa: withBand(kappaIntervalFromTable(this.table, "none")),
      quadraticKappa: withBand(kappaIntervalFromTable(this.table, "quadratic")),
      meanIou: Object.fromEntries([...this.classes].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)).map(([defect, { sum, n }]) => [defect, { mean: sum / n, n }])),
    };
  }
}
