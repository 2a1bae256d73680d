/**
 * Grade distribution per part type and period (issue 17, Reports): how many units got A, B, C
 * and Reject, with shares, per week or month, plus the part type's total. Pure.
 *
 * What it expects: counts aggregated by the database, one row per part type, local day and grade
 * (`GROUP BY part_type_id, (graded_at AT TIME ZONE tz)::date, grade`), so the input stays small
 * however many units there are. Which grade is counted is the caller's choice and the screen's
 * label — the unit's current grade (after any override or adjudication) is what the desk sells.
 *
 * Decisions: every grade of the scale is listed, zeros included (A, B, C, Reject order); every
 * period from the first to the last with a unit, gaps included; shares are of the period's total
 * (NaN for an empty period: "n/a").
 */
import { GRADES, type Grade } from "@/lib/grading/rubric-schema";
import { periodOfDate, periodsBetween, type PeriodUnit } from "@/lib/time/periods";

export type GradeCountRow = { partTypeId: string; day: string; grade: Grade; count: number };
export type GradeCounts = { total: number; counts: Record<Grade, number>; shares: Record<Grade, number> };
export type GradeDistribution = { partTypeId: string; periods: ({ period: string } & GradeCounts)[]; total: GradeCounts };

function summarise(counts: Record<Grade, number>): GradeCounts {
  const total = GRADES.reduce((sum, grade) => sum + counts[grade], 0);
  const shares = Object.fromEntries(GRADES.map((grade) => [grade, total === 0 ? Number.NaN : counts[grade] / total])) as Record<Grade, number>;
  return { total, counts: { ...counts }, shares };
}

const zeroCounts = (): Record<Grade, number> => Object.fromEntries(GRADES.map((grade) => [grade, 0])) as Record<Grade, number>;

/** One distribution per part type, in order of first appearance. */
export function gradeDistribution(rows: readonly GradeCountRow[], unit: Exclude<PeriodUnit, "day">): GradeDistribution[] {
  const byPartType = new Map<string, Map<string, Record<Grade, number>>>();
  for (const row of rows) {
    if (!GRADES.includes(row.grade)) throw new RangeError(`${JSON.stringify(row.grade)} is not a grade (${GRADES.join(", ")}).`);
    if (!Number.isInteger(row.count) || row.count < 0) throw new RangeError(`A grade count is a whole number >= 0, got ${row.count}.`);
    let periods = byPartType.get(row.partTypeId);
    if (!periods) byPartType.set(row.partTypeId, (periods = new Map()));
    const period = periodOfDate(row.day, unit);
    let counts = periods.get(period);
    if (!counts) periods.set(period, (counts = zeroCounts()));
    counts[row.grade] += row.count;
  }
  return [...byPartType].map(([partTypeId, periods]) => {
    const keys = [...periods.keys()].sort();
    const total = zeroCounts();
    for (const counts of periods.values()) for (const grade of GRADES) total[grade] += counts[grade];
    return {
      partTypeId,
      periods: periodsBetween(keys[0], keys[keys.length - 1], unit).map((period) => ({ period, ...summarise(periods.get(period) ?? zeroCounts()) })),
      total: summarise(total),
    };
  });
}
