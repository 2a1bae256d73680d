import "server-only";
/**
 * Adjudication: a lead, or an auditor who graded neither side, settles a recheck that disagrees
 * with its first grade: the first grade stands, the recheck's stands, or their own grade — always
 * with a reason. Either grader is refused (403 with the reason).
 *
 * Decisions:
 * - The outcome is a new grades row of kind "adjudication" (the history stays append-only) and so
 *   becomes the unit's current grade. It keeps the first grade's rubric version and measurement
 *   ids (the unit's measurement of record, which the lot's cosmetic findings read for the defect
 *   classes' severities) and takes the explanation lines of the side that stands (the first
 *   grade's for an own grade). The reason is stored as the row's override reason.
 * - The lot: while it is open its defectives and running verdict follow by themselves (they are
 *   computed from current grades). A decided lot is never rewritten: when the adjudicated grade
 *   differs from the grade the lot was decided on, the recheck is marked `decidedLotAffected` and
 *   the lot's activity log says so; the lot page shows it to the lead.
 */
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { insertGrade } from "@/db/queries/grading";
import { getGradeForAdjudication, getLotStatus, lockRecheck, settleRecheck } from "@/db/queries/rechecks";
import { lockUnit } from "@/db/queries/units";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import type { Grade } from "@/lib/grading/rubric-schema";
import type { AdjudicateInput } from "./schemas";

type Actor = Pick<SessionUser, "id" | "workspaceId">;

/** Refuses either grader; returns when `actor` may settle a recheck graded by `firstGraderId` and `auditorId`. */
export function assertNeitherGrader(actor: { id: string }, recheck: { firstGraderId: string; auditorId: string | null }) {
  if (actor.id === recheck.firstGraderId) throw new AppError("forbidden", "You gave the first grade of this unit, so someone else must settle the disagreement.");
  if (actor.id === recheck.auditorId) throw new AppError("forbidden", "You rechecked this unit, so someone else must settle the disagreement.");
}

export async function adjudicate(actor: Actor, recheckId: string, input: AdjudicateInput) {
  return transaction(async (tx) => {
    const peek = await lockRecheck(tx, { workspaceId: actor.workspaceId, recheckId });
    if (!peek) throw notFound("That recheck");
    // The unit first, then the recheck again (the order grade writes take), so a grade and a settlement never deadlock.
    const unit = await lockUnit(tx, { workspaceId: actor.workspaceId, unitId: peek.unitId });
    if (!unit) throw notFound("That recheck");
    const recheck = (await lockRecheck(tx, { workspaceId: actor.workspaceId, recheckId }))!;
    assertNeitherGrader(actor, recheck);
    if (recheck.status !== "adjudication") {
      throw new AppError("conflict", recheck.status === "settled" ? "This disagreement has been settled already." : "This recheck has nothing to settle.");
    }
    const first = await getGradeForAdjudication({ workspaceId: actor.workspaceId, gradeId: recheck.gradeId }, tx);
    if (!first || !recheck.recheckGrade || !recheck.proposedGrade || !recheck.measurement) throw notFound("That recheck");
    const chosen: { proposed: Grade; final: Grade; lines: typeof first.explanation.lines; notes: string[] } =
      input.choice === "first"
        ? { proposed: first.proposedGrade, final: first.finalGrade, lines: first.explanation.lines, notes: first.explanation.notes }
        : input.choice === "recheck"
          ? { proposed: recheck.proposedGrade, final: recheck.recheckGrade, lines: recheck.measurement.proposal.lines, notes: recheck.measurement.proposal.notes }
          : { proposed: first.proposedGrade, final: input.finalGrade, lines: first.explanation.lines, notes: first.explanation.notes };
    const row = await insertGrade(tx, {
      workspaceId: actor.workspaceId,
      unitId: recheck.unitId,
      kind: "adjudication",
      proposedGrade: chosen.proposed,
      finalGrade: chosen.final,
      overrideReason: input.reason,
      rubricVersionId: first.rubricVersionId,
      measurementIds: first.measurementIds,
      explanation: { lines: chosen.lines, notes: chosen.notes },
      regionsVersions: first.regionsVersions,
      gradedBy: actor.id,
    });
    const lot = await getLotStatus({ workspaceId: actor.workspaceId, lotId: unit.lotId }, tx);
    const decidedLotAffected = lot?.status === "decided" && chosen.final !== first.finalGrade;
    await settleRecheck(tx, {
      workspaceId: actor.workspaceId,
      recheckId,
      adjudicatedBy: actor.id,
      choice: input.choice,
      reason: input.reason,
      gradeId: row.id,
      grade: chosen.final,
      decidedLotAffected,
    });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "recheck.adjudicated",
      subjectType: "unit",
      subjectId: recheck.unitId,
      detail: { recheckId, gradeId: row.id, choice: input.choice, first: first.finalGrade, recheck: recheck.recheckGrade, final: chosen.final },
    });
    if (decidedLotAffected) {
      await logActivity(tx, {
        workspaceId: actor.workspaceId,
        actorId: actor.id,
        action: "lot.decided_lot_affected",
        subjectType: "lot",
        subjectId: unit.lotId,
        detail: { unitId: recheck.unitId, serial: unit.serial, recheckId, from: first.finalGrade, to: chosen.final },
      });
    }
    return { id: recheckId, gradeId: row.id, finalGrade: chosen.final, decidedLotAffected };
  });
}
