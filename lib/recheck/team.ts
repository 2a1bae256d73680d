/**
 * The team's agreement beyond two raters: Krippendorff's alpha (ordinal metric, on the A < B < C <
 * Reject order) and Gwet's AC1 over the units of a period that more than one person graded —
 * first grade, recheck, adjudication, calibration keys and attempts alike. Both stay meaningful
 * when nearly every unit gets the same grade, where kappa collapses (docs/references.md,
 * "Agreement between graders").
 *
 * Input: per unit, the grades it was given, one per person (the caller keeps each person's last
 * grade of the unit). Units with fewer than `minGrades` grades (default 2) are left out of both
 * coefficients (alpha ignores single grades by construction; AC1 would count them in its chance
 * term, and leaving them out keeps the two figures over the same units). Pass `minGrades: 3` for
 * the figure over units graded by more than two people only. Raters need not be the same people
 * from unit to unit: alpha and AC1 only compare the grades within each unit.
 *
 * Caution for readers of the figure: an adjudication is made after seeing both earlier grades,
 * so it is not independent of them and raises agreement a little; the screen should say which
 * kinds of grade went in.
 */
import { gwetAc1Units, krippendorffAlpha } from "@/lib/agreement";
import { GRADES, type Grade } from "@/lib/grading/rubric-schema";

export type MultiRaterFigures = {
  /** Units with at least `minGrades` grades (the ones both coefficients are over). */
  units: number;
  /** Of those, units graded by more than two people. */
  unitsWithMoreThanTwo: number;
  grades: number;
  alphaOrdinal: number;
  ac1: number;
};

/**
 * `counts` (optional, one whole number per entry of `units`): entry i stands for counts[i] units
 * graded alike — the scorecards pass the period's grade sets counted in SQL, so the work does not
 * grow with the number of rechecks. The figures equal those of the units written out.
 */
export function multiRaterAgreement(units: readonly (readonly Grade[])[], options: { minGrades?: number; counts?: readonly number[] } = {}): MultiRaterFigures {
  const minGrades = options.minGrades ?? 2;
  if (!Number.isInteger(minGrades) || minGrades < 2) throw new RangeError(`Agreement needs units with at least two grades; minGrades was ${minGrades}.`);
  if (options.counts && options.counts.length !== units.length) throw new RangeError(`counts must have one entry per unit (${units.length}), got ${options.counts.length}.`);
  const kept = units.map((unit, index) => ({ unit, count: options.counts?.[index] ?? 1 })).filter(({ unit, count }) => unit.length >= minGrades && count > 0);
  const rated = kept.map(({ unit }) => unit);
  const weights = kept.map(({ count }) => count);
  const total = (of: (unit: readonly Grade[]) => number) => kept.reduce((sum, { unit, count }) => sum + count * of(unit), 0);
  const slots = rated.reduce((most, unit) => Math.max(most, unit.length), 0);
  // Krippendorff's data layout: one row per "rating slot", one entry per unit, null where a unit
  // has fewer grades; alpha depends only on the grades within each unit, not on who is in a row.
  const rows = Array.from({ length: slots }, (_, slot) => rated.map((unit) => unit[slot] ?? null));
  return {
    units: total(() => 1),
    unitsWithMoreThanTwo: total((unit) => (unit.length > 2 ? 1 : 0)),
    grades: total((unit) => unit.length),
    alphaOrdinal: rated.length === 0 ? Number.NaN : krippendorffAlpha(rows, { metric: "ordinal", categories: GRADES, weights }),
    ac1: gwetAc1Units(rated, { categories: GRADES, weights }),
  };
}

/** Rechecks counted alike (lib/recheck/scorecard.ts `RecheckCount`, read per grader and week). */
type CountedRecheck = { firstGrade: Grade; recheckGrade: Grade; adjudicatedGrade?: Grade | null; blind: boolean; count: number };

/**
 * The blind rechecks' grade sets (first grade, recheck grade, and the adjudicated grade where
 * there was one) with how many units share each, summed over graders and weeks: the `units` and
 * `counts` that `multiRaterAgreement` takes. Not-blind rechecks are left out, as in the scorecards.
 */
export function gradeSetsOf(rows: readonly CountedRecheck[]): { units: Grade[][]; counts: number[] } {
  const sets = new Map<string, { unit: Grade[]; count: number }>();
  for (const row of rows) {
    if (!row.blind) continue;
    const unit = [row.firstGrade, row.recheckGrade, ...(row.adjudicatedGrade ? [row.adjudicatedGrade] : [])];
    const key = unit.join("|");
    const set = sets.get(key);
    if (set) set.count += row.count;
    else sets.set(key, { unit, count: row.count });
  }
  const list = [...sets.values()];
  return { units: list.map((set) => set.unit), counts: list.map((set) => set.count) };
}

/** One calibration item's grades over a period: its key, and the grade each submitted attempt gave it. */
type CalibrationItemGrades = { keyGrade: Grade; given: readonly Grade[] };

/**
 * Calibration items as units for `multiRaterAgreement`: the key and each taker's grade are the
 * unit's grades, so an item taken by two people is a unit graded by three. Reported apart from the
 * rechecked units, not pooled with them: the items are chosen examples (often borderline) graded
 * by people being trained against a key set with hindsight, while a recheck is production work
 * graded blind by a peer; pooled, a set taken by many people would outweigh the period's rechecks.
 */
export function calibrationGradeSets(items: readonly CalibrationItemGrades[]): Grade[][] {
  return items.map((item) => [item.keyGrade, ...item.given]);
}
