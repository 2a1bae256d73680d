/**
 * Who may add a row to a unit's grade history, decided from the unit's current grade (the last
 * row). Pure, so the rule is tested on its own (tests/unit/grading/grade-rules.test.ts).
 *
 * - No grade yet: an inspection grade (an inspector's, or a lead's). An override has nothing to
 *   replace.
 * - Graded: only a QC lead's override, with a reason, naming the grade it replaces
 *   (`expectedCurrentGradeId`). Anything else is refused with 409, and so is an override that
 *   names a grade which is no longer current: nobody replaces a grade they have not seen.
 * - A repeated submission (same idempotency key) is answered with the row it made, never a second
 *   row; the same key with a different decision is refused (see `replayOf`).
 */
import { can, describeHolders } from "@/lib/auth/permissions";
import type { Role } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { DEFAULT_TIME_ZONE, formatDateTime } from "@/lib/time/format";

export type CurrentGrade = { id: string; finalGrade: string; gradedByName: string; createdAt: Date };
export type GradeSubmission = {
  kind: "inspection" | "override";
  reason?: string;
  expectedCurrentGradeId?: string | null;
};

const describe = (g: CurrentGrade, timeZone: string) => `${g.finalGrade}, recorded by ${g.gradedByName} on ${formatDateTime(g.createdAt, timeZone)}`;

/** Throws the AppError that refuses this submission, or returns when it may be recorded. */
export function assertMayRecord(submission: GradeSubmission, current: CurrentGrade | null, roles: readonly Role[], timeZone = DEFAULT_TIME_ZONE): void {
  const { kind, reason, expectedCurrentGradeId } = submission;
  if (kind === "override" && !can({ roles }, "grades.override")) {
    throw new AppError("forbidden", `Overriding a recorded grade needs the ${describeHolders("grades.override")} role, which your account does not have.`);
  }
  if (kind === "override" && !reason) {
    throw new AppError("bad_request", "An override of a recorded grade needs a reason.", { fieldErrors: { reason: "An override of a recorded grade needs a reason." } });
  }
  if (!current) {
    if (kind === "override") throw new AppError("conflict", "This unit has no recorded grade to override yet; record the inspection grade first.");
    if (expectedCurrentGradeId) throw new AppError("conflict", "The grade you were looking at is not this unit's grade. Reload the unit and try again.");
    return;
  }
  if (kind !== "override") {
    throw new AppError(
      "conflict",
      `This unit is already graded (${describe(current, timeZone)}). Only a QC lead can change a recorded grade, with an override that gives a reason and names the grade it replaces.`,
    );
  }
  if (!expectedCurrentGradeId) {
    const message = "An override must name the grade it replaces (expectedCurrentGradeId). Reload the unit to see its current grade.";
    throw new AppError("bad_request", message, { fieldErrors: { expectedCurrentGradeId: message } });
  }
  if (expectedCurrentGradeId !== current.id) {
    throw new AppError("conflict", `The unit's grade changed since you looked: it is now ${describe(current, timeZone)}. Review it, then override again if it is still wrong.`);
  }
}

export type RecordedGrade = { id: string; kind: string; proposedGrade: string; finalGrade: string; overrideReason: string | null };
export type Decision = { kind: string; decision: "accept" | "override"; finalGrade?: string; reason?: string | null };

/**
 * A submission repeated with its idempotency key: the row it made, when the repeat asks for the
 * same thing (kind, decision, final grade, reason); a 409 when the key was used for another grade.
 */
export function replayOf<R extends RecordedGrade>(previous: R, submission: Decision): R {
  const finalGrade = submission.decision === "accept" ? previous.proposedGrade : submission.finalGrade;
  const same = previous.kind === submission.kind && previous.finalGrade === finalGrade && (previous.overrideReason ?? null) === (submission.reason ?? null);
  if (!same) throw new AppError("conflict", "This submission's key was already used for a different grade. Reload the unit and submit again.");
  return previous;
}
