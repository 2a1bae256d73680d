import "server-only";
/**
 * How grades come to be rechecked: the draw run when an inspection grade is recorded (in the
 * grade's own transaction, so a grade and its draw commit together), and units a lead or an
 * auditor sends by hand. Both go through the one unique key per grade (rechecks_grade_key), so
 * no grade is ever rechecked twice.
 *
 * Decisions:
 * - The draw runs over the grader's inspection grades of the grade's week (ISO week in the
 *   workspace's time zone, lib/time/periods.ts) as a running draw (`final: false`, draw.ts):
 *   each run tops the grader up to ⌈rate × grades so far⌉, so the share holds through the week.
 *   A consequence to know (c): with a 5 % rate the week's first grade meets a target of 1 and is
 *   always drawn; later draws are random among the week's grades so far.
 * - Only runs that drew something are recorded (seed, algorithm and the whole input), like the
 *   lot's sample draw: the record is enough to run drawRechecks again and get the same grades.
 * - The raised rate (draw.ts `recheckRateFor`) applies to a grader whose agreement drifts by the
 *   scorecards' rule over the weeks up to the grade, or whose last calibration attempt failed
 *   (raised-rate.ts); their rechecks are drawn with reason "raised_rate" and the record says why
 *   (`input.raisedFor`).
 * - By hand: the unit's current grade is sent (an override or an adjudication too); a grade that
 *   already has a recheck is refused with 409, never doubled.
 */
import crypto from "node:crypto";
import { transaction, type Tx } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import {
  getCurrentGrade,
  listGradeFacts,
  getRecheckSettingsRow,
  insertRecheckDraw,
  insertRechecks,
  listActiveUserIdsWithRoles,
  listGraderInspectionGrades,
  listRecheckedGradeIds,
  setRecheckSettings,
} from "@/db/queries/rechecks";
import { lockUnit } from "@/db/queries/units";
import { holders } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { periodOf } from "@/lib/time/periods";
import { drawRechecks, RECHECK_DRAW_ALGORITHM, recheckRateFor } from "./draw";
import { raisedRateReason } from "./raised-rate";
import { DEFAULT_RECHECK_SETTINGS, recheckSettingsSchema, type RecheckSettings } from "./settings";

const DAY_MS = 86_400_000;
const newSeed = () => String(crypto.randomBytes(4).readUInt32BE(0));

/** The workspace's settings: stored ones checked again (a bad stored value falls back to the defaults). */
export function settingsFrom(stored: unknown): RecheckSettings {
  const parsed = recheckSettingsSchema.safeParse(stored);
  return parsed.success ? parsed.data : DEFAULT_RECHECK_SETTINGS;
}

export async function recheckSettings(actor: Pick<SessionUser, "workspaceId">, tx?: Tx) {
  const row = await getRecheckSettingsRow({ workspaceId: actor.workspaceId }, tx);
  if (!row) throw notFound("That workspace");
  return { settings: settingsFrom(row.settings), timeZone: row.timeZone, isDefault: row.settings === null };
}

export async function updateRecheckSettings(actor: Pick<SessionUser, "id" | "workspaceId">, settings: RecheckSettings) {
  return transaction(async (tx) => {
    const before = await recheckSettings(actor, tx);
    await setRecheckSettings(tx, { workspaceId: actor.workspaceId, settings });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "recheck.settings_changed",
      subjectType: "workspace",
      subjectId: actor.workspaceId,
      detail: { from: before.settings, to: settings },
    });
    return settings;
  });
}

/**
 * Called by recordGrade inside its transaction, after an inspection grade row is inserted (the
 * unit is locked). Returns the rechecks it made (usually none).
 */
export async function drawOnGradeRecorded(tx: Tx, grade: { workspaceId: string; gradeId: string; graderId: string; gradedAt: Date }) {
  const { workspaceId } = grade;
  const { settings, timeZone } = await recheckSettings({ workspaceId }, tx);
  const period = periodOf(grade.gradedAt, "week", timeZone);
  // A local week lies within 8 days of any of its instants; the period test keeps only this week's.
  const recent = await listGraderInspectionGrades({ workspaceId, graderId: grade.graderId, since: new Date(grade.gradedAt.getTime() - 8 * DAY_MS) }, tx);
  const week = recent.filter((row) => periodOf(row.createdAt, "week", timeZone) === period);
  const candidates = week.map(({ gradeId, graderId, partTypeId }) => ({ gradeId, graderId, partTypeId }));
  const alreadyDrawn = await listRecheckedGradeIds({ workspaceId, gradeIds: candidates.map((c) => c.gradeId) }, tx);
  const auditorIds = await listActiveUserIdsWithRoles({ workspaceId, roles: holders("recheck.perform") }, tx);
  const raised = await raisedRateReason(tx, { workspaceId, graderId: grade.graderId, at: grade.gradedAt, settings, timeZone });
  const graderRates = raised ? { [grade.graderId]: recheckRateFor(settings, { drifting: raised.drifting, lastCalibrationFailed: raised.reasons.includes("calibration_failed") }) } : {};
  const raisedFor = raised ? { [grade.graderId]: raised } : {};
  const seed = newSeed();
  const input = { period, candidates, alreadyDrawn, rate: settings.rate, graderRates, raisedFor, minimumPerGrader: settings.minimumPerGrader, final: false, auditorIds };
  const result = drawRechecks({ seed, ...input });
  if (result.drawn.length === 0) return [];
  const draw = await insertRecheckDraw(tx, {
    workspaceId,
    trigger: "grade_recorded",
    triggerGradeId: grade.gradeId,
    seed,
    algorithm: RECHECK_DRAW_ALGORITHM,
    input,
    outcome: { drawn: result.drawn.map((d) => d.gradeId), graders: result.graders, noOtherAuditor: result.noOtherAuditor },
  });
  const rows = await insertRecheckRowsForGrades(
    tx,
    workspaceId,
    result.drawn.map((d) => d.gradeId),
    { reason: raised ? "raised_rate" : "rate", drawId: draw.id },
  );
  for (const row of rows) {
    await logActivity(tx, {
      workspaceId,
      actorId: null,
      action: "recheck.drawn",
      subjectType: "unit",
      subjectId: row.unitId,
      detail: { recheckId: row.id, gradeId: row.gradeId, drawId: draw.id, reason: raised ? "raised_rate" : "rate" },
    });
  }
  return rows;
}

async function insertRecheckRowsForGrades(tx: Tx, workspaceId: string, gradeIds: string[], how: { reason: "rate" | "raised_rate"; drawId: string }) {
  const facts = await listGradeFacts({ workspaceId, gradeIds }, tx);
  return insertRechecks(
    tx,
    facts.map((grade) => ({ workspaceId, ...grade, reason: how.reason, drawId: how.drawId })),
  );
}

/** A lead or an auditor sends a unit's current grade to recheck by hand. */
export async function sendToRecheck(actor: Pick<SessionUser, "id" | "workspaceId">, input: { unitId: string; note?: string }) {
  return transaction(async (tx) => {
    const unit = await lockUnit(tx, { workspaceId: actor.workspaceId, unitId: input.unitId });
    if (!unit) throw notFound("That unit");
    const grade = await getCurrentGrade({ workspaceId: actor.workspaceId, unitId: input.unitId }, tx);
    if (!grade) throw new AppError("conflict", "This unit has no grade yet, so there is nothing to recheck. Send it once it is graded.");
    const [made] = await insertRechecks(tx, [
      {
        workspaceId: actor.workspaceId,
        unitId: input.unitId,
        gradeId: grade.id,
        firstGraderId: grade.gradedBy,
        partTypeId: grade.partTypeId,
        rubricVersionId: grade.rubricVersionId,
        reason: "by_hand",
        sentBy: actor.id,
        sentNote: input.note ?? null,
      },
    ]);
    if (!made) throw new AppError("conflict", "This unit's current grade is already in recheck (or was rechecked); a grade is rechecked once.");
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "recheck.sent",
      subjectType: "unit",
      subjectId: input.unitId,
      detail: { recheckId: made.id, gradeId: grade.id, note: input.note ?? null },
    });
    return { id: made.id, unitId: input.unitId };
  });
}
