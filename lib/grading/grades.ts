import "server-only";
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { getGradeByIdempotencyKey, getLatestUnitMeasurement, getUnitMeasurement, insertGrade, listGrades, listPhotoMeasurements, type GradeHistoryRow } from "@/db/queries/grading";
import { getLatestPublished, getRubricVersion } from "@/db/queries/rubrics";
import { lockUnit } from "@/db/queries/units";
import type { SessionUser } from "@/lib/auth/require-user";
import { finishInspection } from "@/lib/queue/queue";
import { AppError, notFound } from "@/lib/errors";
import { drawOnGradeRecorded } from "@/lib/recheck/recording";
import { regradeStored } from "./grade-unit";
import { assertMayRecord, replayOf } from "./grade-rules";
import type { RecordGradeInput } from "./schemas";
import type { StoredUnitResult } from "./stored-measurement";
import { currentInputs, measurementStaleness, photoNamer, requireUnit, storedPhotos } from "./unit-grading";

type Actor = Pick<SessionUser, "id" | "workspaceId" | "roles"> & Partial<Pick<SessionUser, "timeZone">>;

/** The unit's grade history (oldest first) and its current grade (the last row). */
export async function gradeHistory(actor: Actor, unitId: string) {
  await requireUnit(actor, unitId);
  const history = await listGrades({ workspaceId: actor.workspaceId, unitId });
  return { grades: history, current: history.at(-1) ?? null };
}

/**
 * Records a grade: the measurement's proposal accepted, or overridden with a reason. Appends one
 * row; nothing earlier changes. Once the unit is graded, only a lead's override naming the
 * current grade may follow (grade-rules.ts); a repeat with the same idempotency key answers with
 * the row it made (`replayed`). The measurement must be current (its regions versions and
 * checklist time equal the unit's now), else 409: a stale proposal is never graded.
 */
export async function recordGrade(actor: Actor, unitId: string, input: RecordGradeInput): Promise<{ grade: GradeHistoryRow; replayed: boolean }> {
  const kind = input.kind ?? "inspection";
  const unit = await requireUnit(actor, unitId);
  const recorded = await transaction(async (tx) => {
    // The unit row lock serialises every grade write on the unit, so "current" stays current.
    const locked = await lockUnit(tx, { workspaceId: actor.workspaceId, unitId });
    if (!locked) throw notFound("That unit");
    const previous = await listGrades({ workspaceId: actor.workspaceId, unitId }, tx);
    const repeated = input.idempotencyKey ? await getGradeByIdempotencyKey({ workspaceId: actor.workspaceId, unitId, key: input.idempotencyKey }, tx) : undefined;
    if (repeated)
      return { id: replayOf(repeated, { kind, decision: input.decision, finalGrade: input.decision === "override" ? input.finalGrade : undefined, reason: input.reason }).id, replayed: true };
    assertMayRecord({ kind, reason: input.reason, expectedCurrentGradeId: input.expectedCurrentGradeId }, previous.at(-1) ?? null, actor.roles, actor.timeZone);
    // An inspection grade moves the unit on (on bench → graded) and ends its lease.
    if (kind === "inspection") await finishInspection(tx, actor, locked);
    const measurement = input.measurementId
      ? await getUnitMeasurement({ workspaceId: actor.workspaceId, unitId, measurementId: input.measurementId }, tx)
      : await getLatestUnitMeasurement({ workspaceId: actor.workspaceId, unitId }, tx);
    if (!measurement) {
      throw new AppError(
        input.measurementId ? "not_found" : "conflict",
        input.measurementId ? "That measurement of this unit was not found." : "This unit has not been measured yet. Measure it, then grade.",
      );
    }
    const stored = measurement.result as StoredUnitResult;
    const current = await currentInputs(actor, unitId, tx);
    const staleness = measurementStaleness({ regionsVersions: measurement.regionsVersions, checklistStamp: stored.checklistStamp, views: stored.views }, current.inputs, photoNamer(current.photoRows));
    if (staleness.stale) throw new AppError("conflict", `The measurement is out of date: ${staleness.reasons.join(" ")} Measure again before grading.`);

    const proposed = stored.proposal.grade;
    const finalGrade = input.decision === "accept" ? proposed : input.finalGrade;
    if (input.decision === "override" && finalGrade === proposed) {
      throw new AppError("bad_request", `The proposed grade is already ${proposed}; accept it instead of overriding.`, {
        fieldErrors: { finalGrade: `Choose a grade other than the proposed ${proposed}, or accept.` },
      });
    }
    const photoRows = await listPhotoMeasurements({ workspaceId: actor.workspaceId, unitMeasurementId: measurement.id }, tx);
    const row = await insertGrade(tx, {
      workspaceId: actor.workspaceId,
      unitId,
      kind,
      proposedGrade: proposed,
      finalGrade,
      overrideReason: input.reason ?? null,
      rubricVersionId: measurement.rubricVersionId,
      measurementIds: [measurement.id, ...photoRows.map((p) => p.id)],
      explanation: { lines: stored.proposal.lines, notes: stored.proposal.notes },
      regionsVersions: measurement.regionsVersions,
      gradedBy: actor.id,
      idempotencyKey: input.idempotencyKey ?? null,
    });
    // Drawn for recheck (or not) in the grade's own transaction: a grade and its draw commit together.
    if (kind === "inspection") await drawOnGradeRecorded(tx, { workspaceId: actor.workspaceId, gradeId: row.id, graderId: actor.id, gradedAt: row.createdAt });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: finalGrade === proposed ? "grade.accepted" : "grade.overridden",
      subjectType: "unit",
      subjectId: unitId,
      detail: { gradeId: row.id, kind, proposed, final: finalGrade, rubricVersion: measurement.rubricVersion, serial: unit.serial, replaces: previous.at(-1)?.id ?? null },
    });
    return { id: row.id, replayed: false };
  });
  const history = await listGrades({ workspaceId: actor.workspaceId, unitId });
  return { grade: history.find((g) => g.id === recorded.id)!, replayed: recorded.replayed };
}

/**
 * "What would rubric version N say": the measurement behind the unit's current grade (or its
 * latest measurement when ungraded) graded again under version N (default: the latest
 * published). Stores nothing; the recorded grade stays as it is.
 */
export async function gradePreview(actor: Actor, unitId: string, version?: number) {
  const unit = await requireUnit(actor, unitId);
  const rubric =
    version === undefined
      ? await getLatestPublished({ workspaceId: actor.workspaceId, partTypeId: unit.partTypeId })
      : await getRubricVersion({ workspaceId: actor.workspaceId, partTypeId: unit.partTypeId, version });
  if (!rubric) {
    throw new AppError("not_found", version === undefined ? `${unit.partType.name} has no published rubric yet.` : `Rubric version ${version} of ${unit.partType.name} was not found.`);
  }
  const history = await listGrades({ workspaceId: actor.workspaceId, unitId });
  const grade = history.at(-1) ?? null;
  const measurement = grade
    ? await getUnitMeasurement({ workspaceId: actor.workspaceId, unitId, measurementId: grade.measurementIds[0] })
    : await getLatestUnitMeasurement({ workspaceId: actor.workspaceId, unitId });
  if (!measurement) throw new AppError("conflict", "This unit has not been measured yet, so there is nothing to grade again.");
  const stored = measurement.result as StoredUnitResult;
  const result = regradeStored({ rubric: rubric.rubric, photos: await storedPhotos(actor, measurement.id), unit: stored });
  const current = await currentInputs(actor, unitId);
  const staleness = measurementStaleness({ regionsVersions: measurement.regionsVersions, checklistStamp: stored.checklistStamp, views: stored.views }, current.inputs, photoNamer(current.photoRows));
  return {
    rubricVersion: { version: rubric.version, status: rubric.status, publishedAt: rubric.publishedAt },
    basis: {
      measurementId: measurement.id,
      measuredAt: measurement.createdAt,
      measuredUnderVersion: measurement.rubricVersion,
      grade: grade ? { id: grade.id, finalGrade: grade.finalGrade, proposedGrade: grade.proposedGrade, rubricVersion: grade.rubricVersion, createdAt: grade.createdAt } : null,
      ...staleness,
    },
    result,
  };
}
