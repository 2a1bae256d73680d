/**
 * How far apart two grades are on the cosmetic scale A, B, C, Reject (GRADES): the number of
 * steps between them. Calibration reads "exact" (0 steps) and "within one step" (<= 1) from it,
 * Recheck stores same / one step / further, and the adjudication trigger fires on any difference.
 * One step is the smallest disagreement the scale can express (A vs B, or C vs Reject alike):
 * the scale is ordinal, so steps count positions, not a distance in quality.
 */
import { GRADES, gradeRank, type Grade } from "./rubric-schema";

export type GradeAgreement = "same" | "one_step" | "further";

function rankOf(grade: Grade): number {
  const rank = gradeRank(grade);
  if (rank < 0) throw new RangeError(`${JSON.stringify(grade)} is not a grade (${GRADES.join(", ")}).`);
  return rank;
}

/** Steps between two grades: 0 when equal, 3 between A and Reject. */
export const gradeSteps = (a: Grade, b: Grade): number => Math.abs(rankOf(a) - rankOf(b));

export function gradeAgreement(a: Grade, b: Grade): GradeAgreement {
  const steps = gradeSteps(a, b);
  return steps === 0 ? "same" : steps === 1 ? "one_step" : "further";
}
