import "server-only";
/**
 * Rechecks: the draw's inputs and records, the recheck queue (claims through the shared lease
 * statements of ./leases.ts), the auditor's separate region sets, and who opened a unit's
 * inspection data. Every query is scoped by workspace; the decisions are in lib/recheck.
 */
import { and, asc, desc, eq, gte, inArray, isNull, sql, type SQL } from "drizzle-orm";
import { db, executePrepared, type DbOrTx } from "@/db/client";
import { checklistResults, grades, lots, partTypes, photos, recheckDraws, recheckRegionSets, rechecks, rubricVersions, unitOpenings, units, users, workspaces, type NewRecheckRow } from "@/db/schema";
import type { RecheckDrawInputRecord, RecheckDrawOutcome } from "@/db/schema/recheck";
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { RecheckSettings } from "@/lib/recheck/settings";
import type { Grade } from "@/lib/grading/rubric-schema";
import { ASYNC_COMMIT, leaseColumns, leaseEnd, noLease } from "./leases";

type Scope = { workspaceId: string };

export async function getRecheckSettingsRow({ workspaceId }: Scope, tx: DbOrTx = db()) {
  const [row] = await tx.select({ settings: workspaces.recheckSettings, timeZone: workspaces.timeZone }).from(workspaces).where(eq(workspaces.id, workspaceId)).limit(1);
  return row;
}

export async function setRecheckSettings(tx: DbOrTx, { workspaceId, settings }: Scope & { settings: RecheckSettings }) {
  await tx.update(workspaces).set({ recheckSettings: settings }).where(eq(workspaces.id, workspaceId));
}

/** One grader's inspection grades since `since`, with the unit's part type (the draw's candidates). */
export function listGraderInspectionGrades({ workspaceId, graderId, since }: Scope & { graderId: string; since: Date }, tx: DbOrTx = db()) {
  return tx
    .select({ gradeId: grades.id, graderId: grades.gradedBy, partTypeId: units.partTypeId, createdAt: grades.createdAt })
    .from(grades)
    .innerJoin(units, eq(units.id, grades.unitId))
    .where(and(eq(grades.workspaceId, workspaceId), eq(grades.gradedBy, graderId), gte(grades.createdAt, since), eq(grades.kind, "inspection")));
}

/** Of these grades, the ones that already have a recheck (drawn or sent by hand). */
export async function listRecheckedGradeIds({ workspaceId, gradeIds }: Scope & { gradeIds: string[] }, tx: DbOrTx = db()) {
  if (gradeIds.length === 0) return [];
  const rows = await tx
    .select({ gradeId: rechecks.gradeId })
    .from(rechecks)
    .where(and(eq(rechecks.workspaceId, workspaceId), inArray(rechecks.gradeId, gradeIds)));
  return rows.map((row) => row.gradeId);
}

/** Of these units, the ones whose recheck still waits (not yet submitted): blind readers must not see their first grade. */
export async function listUnitsAwaitingRecheck({ workspaceId, unitIds }: Scope & { unitIds: string[] }, tx: DbOrTx = db()) {
  if (unitIds.length === 0) return new Set<string>();
  const rows = await tx
    .selectDistinct({ unitId: rechecks.unitId })
    .from(rechecks)
    .where(and(eq(rechecks.workspaceId, workspaceId), inArray(rechecks.unitId, unitIds), eq(rechecks.status, "waiting")));
  return new Set(rows.map((row) => row.unitId));
}

/** Active people holding any of `roles` (who could take a recheck). */
export async function listActiveUserIdsWithRoles({ workspaceId, roles }: Scope & { roles: string[] }, tx: DbOrTx = db()) {
  const rows = await tx
    .select({ id: users.id })
    .from(users)
    .where(
      and(
        eq(users.workspaceId, workspaceId),
        eq(users.active, true),
        sql`${users.roles} && ${sql`ARRAY[${sql.join(
          roles.map((r) => sql`${r}`),
          sql`, `,
        )}]::text[]`}`,
      ),
    )
    .orderBy(asc(users.id));
  return rows.map((row) => row.id);
}

export async function insertRecheckDraw(
  tx: DbOrTx,
  row: { workspaceId: string; trigger: "grade_recorded" | "scheduled"; triggerGradeId: string | null; seed: string; algorithm: string; input: RecheckDrawInputRecord; outcome: RecheckDrawOutcome },
) {
  const [inserted] = await tx.insert(recheckDraws).values(row).returning({ id: recheckDraws.id });
  return inserted;
}

/** The rechecked grade's final grade and time, copied by the database itself (a timestamp through JavaScript would lose its microseconds). */
export const firstGradeFacts = (gradeId: string) => ({
  firstGrade: sql<Grade>`(SELECT g.final_grade FROM grades g WHERE g.id = ${gradeId})`,
  firstGradedAt: sql<Date>`(SELECT g.created_at FROM grades g WHERE g.id = ${gradeId})`,
});

/** Adds rechecks; a grade that already has one is skipped (rechecks_grade_key), never doubled. Returns the rows made. */
export function insertRechecks(tx: DbOrTx, rows: Omit<NewRecheckRow, "firstGrade" | "firstGradedAt">[]) {
  if (rows.length === 0) return Promise.resolve([]);
  return tx
    .insert(rechecks)
    .values(rows.map((row) => ({ ...row, ...firstGradeFacts(row.gradeId) })))
    .onConflictDoNothing({ target: rechecks.gradeId })
    .returning({ id: rechecks.id, gradeId: rechecks.gradeId, unitId: rechecks.unitId });
}

export function getRecheckDraw({ workspaceId, drawId }: Scope & { drawId: string }, tx: DbOrTx = db()) {
  return tx
    .select()
    .from(recheckDraws)
    .where(and(eq(recheckDraws.workspaceId, workspaceId), eq(recheckDraws.id, drawId)))
    .limit(1)
    .then((rows) => rows[0]);
}

/** The unit's current grade row (the last one) with its grader; undefined when ungraded. */
export async function getCurrentGrade({ workspaceId, unitId }: Scope & { unitId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ id: grades.id, kind: grades.kind, gradedBy: grades.gradedBy, rubricVersionId: grades.rubricVersionId, finalGrade: grades.finalGrade, partTypeId: units.partTypeId })
    .from(grades)
    .innerJoin(units, eq(units.id, grades.unitId))
    .where(and(eq(grades.workspaceId, workspaceId), eq(grades.unitId, unitId)))
    .orderBy(desc(grades.createdAt), desc(grades.id))
    .limit(1);
  return row;
}

/** What a recheck row copies from each grade. */
export function listGradeFacts({ workspaceId, gradeIds }: Scope & { gradeIds: string[] }, tx: DbOrTx = db()) {
  if (gradeIds.length === 0) return Promise.resolve([]);
  return tx
    .select({ gradeId: grades.id, unitId: grades.unitId, firstGraderId: grades.gradedBy, partTypeId: units.partTypeId, rubricVersionId: grades.rubricVersionId })
    .from(grades)
    .innerJoin(units, eq(units.id, grades.unitId))
    .where(and(eq(grades.workspaceId, workspaceId), inArray(grades.id, gradeIds)))
    .orderBy(asc(grades.id));
}

/** Records that `userId` opened the unit's inspection data (first time kept, last time moved on). */
export async function recordUnitOpening({ workspaceId, unitId, userId }: Scope & { unitId: string; userId: string }, tx: DbOrTx = db()) {
  await tx
    .insert(unitOpenings)
    .values({ workspaceId, unitId, userId })
    .onConflictDoUpdate({ target: [unitOpenings.unitId, unitOpenings.userId], set: { lastOpenedAt: sql`now()` } });
}

export async function hasOpenedUnit({ workspaceId, unitId, userId }: Scope & { unitId: string; userId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ at: unitOpenings.firstOpenedAt })
    .from(unitOpenings)
    .where(and(eq(unitOpenings.workspaceId, workspaceId), eq(unitOpenings.unitId, unitId), eq(unitOpenings.userId, userId)))
    .limit(1);
  return row !== undefined;
}

/**
 * The waiting rechecks `auditorId` may take, oldest first: lease free or run out, never their own
 * grade, never a unit they opened. Walks rechecks_waiting_idx.
 */
const takeableByAuditor = (workspaceId: string, auditorId: string, extraCondition = sql``) => sql`
      SELECT r.id FROM rechecks r
      WHERE r.workspace_id = ${workspaceId} AND r.status = 'waiting'
        AND (r.lease_expires_at IS NULL OR r.lease_expires_at < now())
        AND r.first_grader_id <> ${auditorId}
        AND NOT EXISTS (SELECT 1 FROM unit_openings o WHERE o.unit_id = r.unit_id AND o.user_id = ${auditorId})
        ${extraCondition}
      ORDER BY r.created_at, r.id
      LIMIT 1`;

export type ClaimedRecheck = { id: string; unitId: string; leaseExpiresAt: Date };

/**
 * One claim attempt for the recheck queue, as Take next's claim for units (./unit-status.ts):
 * the oldest takeable recheck locked with SKIP LOCKED, given the lease and logged, in one
 * statement. Null when no free row was found.
 */
export async function claimNextRecheckRow({ workspaceId, auditorId, leaseSeconds }: Scope & { auditorId: string; leaseSeconds: number }): Promise<ClaimedRecheck | null> {
  const { rows } = await executePrepared<{ id: string; unit_id: string; lease_expires_at: Date }>(sql`
    WITH next AS (${takeableByAuditor(workspaceId, auditorId, sql`AND ${ASYNC_COMMIT}`)}
      FOR UPDATE OF r SKIP LOCKED
    ), claimed AS (
      UPDATE rechecks r SET ${leaseColumns({ holderId: auditorId, leaseSeconds })}
      FROM next WHERE r.id = next.id
      RETURNING r.id, r.unit_id, r.lease_expires_at
    ), cleared AS (
      -- A holder whose lease ran out leaves their marks behind: the next auditor starts blind.
      DELETE FROM recheck_region_sets s USING claimed WHERE s.recheck_id = claimed.id AND s.updated_by <> ${auditorId}
    ), claim_log AS (
      INSERT INTO activity_log (workspace_id, actor_id, action, subject_type, subject_id, detail)
      SELECT ${workspaceId}::uuid, ${auditorId}::uuid, 'recheck.claimed', 'recheck', claimed.id::text, '{}'::jsonb
      FROM claimed
    )
    SELECT * FROM claimed`);
  const row = rows[0];
  return row ? { id: row.id, unitId: row.unit_id, leaseExpiresAt: new Date(row.lease_expires_at) } : null;
}

/** Whether anything is takeable for `auditorId` (read without locks). */
export async function anyRecheckWaiting({ workspaceId, auditorId }: Scope & { auditorId: string }): Promise<boolean> {
  const { rows } = await executePrepared<{ waiting: boolean }>(sql`SELECT (${takeableByAuditor(workspaceId, auditorId)}) IS NOT NULL AS waiting`);
  return rows[0]?.waiting ?? false;
}

/** The recheck row locked for a change, with whether its lease runs by the database's clock. */
export async function lockRecheck(tx: DbOrTx, { workspaceId, recheckId }: Scope & { recheckId: string }) {
  const [row] = await tx
    .select({ recheck: rechecks, leaseRunning: sql<boolean>`coalesce(${rechecks.leaseExpiresAt} > now(), false)` })
    .from(rechecks)
    .where(and(eq(rechecks.workspaceId, workspaceId), eq(rechecks.id, recheckId)))
    .for("update");
  return row && { ...row.recheck, leaseRunning: row.leaseRunning };
}
export type LockedRecheck = NonNullable<Awaited<ReturnType<typeof lockRecheck>>>;

export async function getRecheck({ workspaceId, recheckId }: Scope & { recheckId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ recheck: rechecks, leaseRunning: sql<boolean>`coalesce(${rechecks.leaseExpiresAt} > now(), false)` })
    .from(rechecks)
    .where(and(eq(rechecks.workspaceId, workspaceId), eq(rechecks.id, recheckId)))
    .limit(1);
  return row && { ...row.recheck, leaseRunning: row.leaseRunning };
}

export async function renewRecheckLease(tx: DbOrTx, { workspaceId, recheckId, leaseSeconds }: Scope & { recheckId: string; leaseSeconds: number }) {
  const { rows } = await tx.execute<{ lease_expires_at: string | Date }>(sql`
    UPDATE rechecks SET lease_expires_at = ${leaseEnd(leaseSeconds)}
    WHERE workspace_id = ${workspaceId} AND id = ${recheckId}
    RETURNING lease_expires_at`);
  return { leaseExpiresAt: new Date(rows[0].lease_expires_at) };
}

export async function endRecheckLease(tx: DbOrTx, { workspaceId, recheckId }: Scope & { recheckId: string }) {
  await tx.execute(sql`UPDATE rechecks SET ${noLease} WHERE workspace_id = ${workspaceId} AND id = ${recheckId}`);
}

/** Waiting rechecks held by `auditorId` with a running lease (the Recheck screen's "on your bench"). */
export function listHeldRechecks({ workspaceId, auditorId }: Scope & { auditorId: string }, tx: DbOrTx = db()) {
  return tx
    .select({ id: rechecks.id, unitId: rechecks.unitId, leaseExpiresAt: rechecks.leaseExpiresAt })
    .from(rechecks)
    .where(and(eq(rechecks.workspaceId, workspaceId), eq(rechecks.status, "waiting"), eq(rechecks.leaseHolderId, auditorId), sql`${rechecks.leaseExpiresAt} > now()`))
    .orderBy(asc(rechecks.createdAt));
}

export async function countWaitingRechecks({ workspaceId }: Scope, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(rechecks)
    .where(and(eq(rechecks.workspaceId, workspaceId), eq(rechecks.status, "waiting")));
  return row.n;
}

// The auditor's region sets.

export async function deleteRecheckRegionSets(tx: DbOrTx, { workspaceId, recheckId }: Scope & { recheckId: string }) {
  await tx.delete(recheckRegionSets).where(and(eq(recheckRegionSets.workspaceId, workspaceId), eq(recheckRegionSets.recheckId, recheckId)));
}

export function listRecheckRegionSets({ workspaceId, recheckId }: Scope & { recheckId: string }, tx: DbOrTx = db()) {
  return tx
    .select({ photoId: recheckRegionSets.photoId, payload: recheckRegionSets.payload, version: recheckRegionSets.version })
    .from(recheckRegionSets)
    .where(and(eq(recheckRegionSets.workspaceId, workspaceId), eq(recheckRegionSets.recheckId, recheckId)));
}

/**
 * Saves the auditor's set on one photo when it is still at `baseVersion` (0: none yet). Returns
 * the new version, or null when another save came first.
 */
export async function saveRecheckRegionSet(
  tx: DbOrTx,
  { workspaceId, recheckId, photoId, payload, baseVersion, userId }: Scope & { recheckId: string; photoId: string; payload: RegionSetPayload; baseVersion: number; userId: string },
) {
  if (baseVersion === 0) {
    const rows = await tx
      .insert(recheckRegionSets)
      .values({ workspaceId, recheckId, photoId, payload, version: 1, updatedBy: userId })
      .onConflictDoNothing()
      .returning({ version: recheckRegionSets.version });
    return rows[0]?.version ?? null;
  }
  const rows = await tx
    .update(recheckRegionSets)
    .set({ payload, version: sql`${recheckRegionSets.version} + 1`, updatedBy: userId, updatedAt: sql`now()` })
    .where(and(eq(recheckRegionSets.workspaceId, workspaceId), eq(recheckRegionSets.recheckId, recheckId), eq(recheckRegionSets.photoId, photoId), eq(recheckRegionSets.version, baseVersion)))
    .returning({ version: recheckRegionSets.version });
  return rows[0]?.version ?? null;
}

// The blind read path: only what the auditor may see (no regions, measurements, grades or names).

/** The unit and its part type as the auditor sees them (no status, no lease, nobody's name). */
export async function getBlindUnit({ workspaceId, unitId }: Scope & { unitId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({
      id: units.id,
      serial: units.serial,
      partType: {
        id: partTypes.id,
        name: partTypes.name,
        category: partTypes.category,
        views: partTypes.views,
        defectClasses: partTypes.defectClasses,
        checklist: partTypes.checklist,
        nominalSizeMm: partTypes.nominalSizeMm,
        panelResolution: partTypes.panelResolution,
      },
    })
    .from(units)
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .where(and(eq(units.workspaceId, workspaceId), eq(units.id, unitId)))
    .limit(1);
  return row;
}

/** The unit's ready photos (not withdrawn), in upload order: sizes and views only. */
export function listBlindPhotos({ workspaceId, unitId }: Scope & { unitId: string }, tx: DbOrTx = db()) {
  return tx
    .select({ id: photos.id, viewKey: photos.viewKey, width: photos.width, height: photos.height, previewWidth: photos.previewWidth, previewHeight: photos.previewHeight })
    .from(photos)
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.unitId, unitId), eq(photos.status, "ready"), isNull(photos.removedAt)))
    .orderBy(asc(photos.createdAt), asc(photos.id));
}

/** The checklist's readings (values only: no verdict, no note, no name). */
export function listChecklistReadings({ workspaceId, unitId }: Scope & { unitId: string }, tx: DbOrTx = db()) {
  return tx
    .select({ itemId: checklistResults.itemId, value: checklistResults.value })
    .from(checklistResults)
    .where(and(eq(checklistResults.workspaceId, workspaceId), eq(checklistResults.unitId, unitId)))
    .orderBy(asc(checklistResults.itemId));
}

export async function getRubricVersionNumber({ workspaceId, rubricVersionId }: Scope & { rubricVersionId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ version: rubricVersions.version, rubric: rubricVersions.rubric })
    .from(rubricVersions)
    .where(and(eq(rubricVersions.workspaceId, workspaceId), eq(rubricVersions.id, rubricVersionId)))
    .limit(1);
  return row;
}

/** The rechecked grade's final grade (read on submission, never shown before it). */
export async function getFirstGradeOfRecheck({ workspaceId, gradeId }: Scope & { gradeId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ id: grades.id, finalGrade: grades.finalGrade, gradedBy: grades.gradedBy })
    .from(grades)
    .where(and(eq(grades.workspaceId, workspaceId), eq(grades.id, gradeId)))
    .limit(1);
  return row;
}

/** Stores the auditor's submission and ends their lease, in one statement. */
export async function storeRecheckSubmission(
  tx: DbOrTx,
  input: Scope &
    Pick<NewRecheckRow, "auditorId" | "measurement" | "proposedGrade" | "recheckGrade" | "overrideReason" | "notBlind" | "comparison" | "adjudicationReasons"> & {
      recheckId: string;
      status: "adjudication" | "agreed";
    },
) {
  const { workspaceId, recheckId, ...fields } = input;
  await tx
    .update(rechecks)
    .set({ ...fields, submittedAt: sql`now()`, leaseHolderId: null, leaseExpiresAt: null })
    .where(and(eq(rechecks.workspaceId, workspaceId), eq(rechecks.id, recheckId)));
}

// Adjudication.

/** A grade row with what the adjudication view shows beside it. */
export async function getGradeForAdjudication({ workspaceId, gradeId }: Scope & { gradeId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({
      id: grades.id,
      unitId: grades.unitId,
      proposedGrade: grades.proposedGrade,
      finalGrade: grades.finalGrade,
      overrideReason: grades.overrideReason,
      rubricVersionId: grades.rubricVersionId,
      rubricVersion: rubricVersions.version,
      measurementIds: grades.measurementIds,
      explanation: grades.explanation,
      regionsVersions: grades.regionsVersions,
      gradedBy: grades.gradedBy,
      createdAt: grades.createdAt,
      serial: units.serial,
      lotId: units.lotId,
      purchaseRef: lots.purchaseRef,
      partTypeId: units.partTypeId,
      partTypeName: partTypes.name,
    })
    .from(grades)
    .innerJoin(units, eq(units.id, grades.unitId))
    .innerJoin(lots, eq(lots.id, units.lotId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .innerJoin(rubricVersions, eq(rubricVersions.id, grades.rubricVersionId))
    .where(and(eq(grades.workspaceId, workspaceId), eq(grades.id, gradeId)))
    .limit(1);
  return row;
}

export async function userNames({ workspaceId, ids }: Scope & { ids: string[] }, tx: DbOrTx = db()) {
  if (ids.length === 0) return new Map<string, string>();
  const rows = await tx
    .select({ id: users.id, name: users.name })
    .from(users)
    .where(and(eq(users.workspaceId, workspaceId), inArray(users.id, ids)));
  return new Map(rows.map((row) => [row.id, row.name]));
}

export async function getLotStatus({ workspaceId, lotId }: Scope & { lotId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ status: lots.status })
    .from(lots)
    .where(and(eq(lots.workspaceId, workspaceId), eq(lots.id, lotId)))
    .limit(1);
  return row;
}

export async function settleRecheck(
  tx: DbOrTx,
  {
    workspaceId,
    recheckId,
    adjudicatedBy,
    choice,
    reason,
    gradeId,
    grade,
    decidedLotAffected,
  }: Scope & { recheckId: string; adjudicatedBy: string; choice: "first" | "recheck" | "own"; reason: string; gradeId: string; grade: Grade; decidedLotAffected: boolean },
) {
  await tx
    .update(rechecks)
    .set({
      status: "settled",
      adjudicatedBy,
      adjudicationChoice: choice,
      adjudicationReason: reason,
      adjudicationGradeId: gradeId,
      adjudicatedGrade: grade,
      adjudicatedAt: sql`now()`,
      decidedLotAffected,
    })
    .where(and(eq(rechecks.workspaceId, workspaceId), eq(rechecks.id, recheckId)));
}

/** Rechecks waiting for adjudication, oldest first, with the unit's serial and part type. */
export function listWaitingAdjudications({ workspaceId }: Scope, tx: DbOrTx = db()) {
  return tx
    .select({
      id: rechecks.id,
      unitId: rechecks.unitId,
      serial: units.serial,
      partTypeName: partTypes.name,
      firstGraderId: rechecks.firstGraderId,
      auditorId: rechecks.auditorId,
      submittedAt: rechecks.submittedAt,
      reasons: rechecks.adjudicationReasons,
    })
    .from(rechecks)
    .innerJoin(units, eq(units.id, rechecks.unitId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .where(and(eq(rechecks.workspaceId, workspaceId), eq(rechecks.status, "adjudication")))
    .orderBy(asc(rechecks.submittedAt), asc(rechecks.id))
    .limit(200);
}

/** Rechecks of a lot's units whose adjudicated grade differs from the one the decided lot rests on. */
export function listDecidedLotAffected({ workspaceId, lotId }: Scope & { lotId: string }, tx: DbOrTx = db()) {
  return tx
    .select({ recheckId: rechecks.id, unitId: rechecks.unitId, serial: units.serial, adjudicatedAt: rechecks.adjudicatedAt })
    .from(rechecks)
    .innerJoin(units, eq(units.id, rechecks.unitId))
    .where(and(eq(rechecks.workspaceId, workspaceId), eq(units.lotId, lotId), eq(rechecks.decidedLotAffected, true)))
    .orderBy(asc(rechecks.adjudicatedAt));
}

// Scorecards. The reads touch only rows made for them (migrations scorecard_reads, recheck_class_scores):
// the per-day counts, the recheck rows, which carry their grade's facts, and the comparisons' class
// figures as rows; none scans the period's grades or expands a stored comparison.

/** Local midnight of `date` in `timeZone`, as an SQL timestamptz. */
const localMidnight = (date: string, timeZone: string) => sql`((${date}::date)::timestamp AT TIME ZONE ${timeZone})`;

/**
 * Inspection grades per grader and local week in [from, to] (local dates, both included), summed
 * from grader_day_counts (kept by triggers in the workspace's current time zone, which is the one
 * the scorecards use). Each week is keyed by its first day inside the period (its Monday, or
 * `from` for a period starting mid-week), so the rows are day counts as lib/recheck/scorecard.ts
 * `GradedCount` takes them, one per grader and week instead of one per grader and day.
 */
export async function countGradesByGraderAndWeek({ workspaceId, from, to }: Scope & { from: string; to: string }, tx: DbOrTx = db()) {
  const { rows } = await tx.execute<{ grader_id: string; day: string; count: number }>(sql`
    SELECT g.grader_id, to_char(g.day, 'YYYY-MM-DD') AS day, g.count
    FROM (
      SELECT d.grader_id, greatest(d.day - (extract(isodow FROM d.day)::int - 1), ${from}::date) AS day, sum(d.graded)::int AS count
      FROM grader_day_counts d
      WHERE d.workspace_id = ${workspaceId} AND d.day >= ${from}::date AND d.day <= ${to}::date
      GROUP BY 1, 2
    ) g`);
  return rows.map((row) => ({ graderId: row.grader_id, day: row.day, count: row.count }));
}

/** Rows of the period: the rechecked grade was recorded on a local day in [from, to] (`alias`: rechecks or recheck_class_scores). */
const firstGradedInPeriod = (alias: SQL, workspaceId: string, from: string, to: string, timeZone: string) => sql`
    ${alias}.workspace_id = ${workspaceId}
    AND ${alias}.first_graded_at >= ${localMidnight(from, timeZone)} AND ${alias}.first_graded_at < ${localMidnight(to, timeZone)} + interval '1 day'`;
/**
 * The local week (its Monday, as lib/time/periods.ts counts weeks) of the rechecked grade, as a
 * local timestamp to group by; `weekKey` writes the grouped weeks as YYYY-MM-DD (formatting the
 * few hundred groups rather than every row).
 */
const localWeek = (alias: SQL, timeZone: string) => sql`date_trunc('week', ${alias}.first_graded_at AT TIME ZONE ${timeZone})`;
const weekKey = sql`to_char(g.week, 'YYYY-MM-DD')`;

/**
 * The period's submitted rechecks counted per grader, local week, first grade, recheck grade,
 * adjudicated grade and blind mark (lib/recheck/scorecard.ts `RecheckCount`): about a thousand
 * rows for 5 000 rechecks. The same rows, summed over graders and weeks, are the grade sets alpha
 * and AC1 are computed from (lib/recheck/team.ts `gradeSetsOf`), so the period's rechecks are
 * scanned once for both.
 */
export async function countRechecksByGraderAndWeek({ workspaceId, from, to, timeZone }: Scope & { from: string; to: string; timeZone: string }, tx: DbOrTx = db()) {
  const r = sql`r`;
  const { rows } = await tx.execute<{ grader_id: string; week: string; first_grade: Grade; recheck_grade: Grade; adjudicated_grade: Grade | null; not_blind: boolean; count: number }>(sql`
    SELECT g.grader_id, ${weekKey} AS week, g.first_grade, g.recheck_grade, g.adjudicated_grade, g.not_blind, g.count
    FROM (
      SELECT r.first_grader_id AS grader_id, ${localWeek(r, timeZone)} AS week, r.first_grade, r.recheck_grade, r.adjudicated_grade, r.not_blind, count(*)::int AS count
      FROM rechecks r
      WHERE ${firstGradedInPeriod(r, workspaceId, from, to, timeZone)} AND r.submitted_at IS NOT NULL
      GROUP BY 1, 2, 3, 4, 5, 6
    ) g`);
  return rows.map((row) => ({
    graderId: row.grader_id,
    week: row.week,
    firstGrade: row.first_grade,
    recheckGrade: row.recheck_grade,
    adjudicatedGrade: row.adjudicated_grade,
    blind: !row.not_blind,
    count: row.count,
  }));
}

/**
 * Per grader, local week and defect class, the class IoU of the period's blind rechecks where the
 * class was in play (union > 0 in the stored comparison), summed, and how many
 * (lib/recheck/scorecard.ts `ClassIouSum`). Read from recheck_class_scores (the comparisons'
 * classes as plain rows of submitted rechecks, migration recheck_class_scores), not by expanding
 * each stored comparison's JSON.
 */
export async function sumClassIouByGraderAndWeek({ workspaceId, from, to, timeZone }: Scope & { from: string; to: string; timeZone: string }, tx: DbOrTx = db()) {
  const s = sql`s`;
  const { rows } = await tx.execute<{ grader_id: string; week: string; defect: string; sum: number; n: number }>(sql`
    SELECT g.grader_id, ${weekKey} AS week, g.defect, g.sum, g.n
    FROM (
      SELECT s.first_grader_id AS grader_id, ${localWeek(s, timeZone)} AS week, s.defect, sum(s.iou) AS sum, count(*)::int AS n
      FROM recheck_class_scores s
      WHERE ${firstGradedInPeriod(s, workspaceId, from, to, timeZone)} AND NOT s.not_blind AND s.union_px > 0
      GROUP BY 1, 2, 3
    ) g`);
  return rows.map((row) => ({ graderId: row.grader_id, week: row.week, defect: row.defect, sum: Number(row.sum), n: row.n }));
}

/**
 * Blind submitted rechecks whose rechecked grade was recorded from local `fromDay` up to `until`:
 * counts per first grade and recheck grade, the grader's own apart from everyone else's (the
 * raised-rate check, lib/recheck/raised-rate.ts). At most 2 × 4 × 4 rows.
 */
export async function countDriftWindow({ workspaceId, graderId, fromDay, until, timeZone }: Scope & { graderId: string; fromDay: string; until: Date; timeZone: string }, tx: DbOrTx = db()) {
  const { rows } = await tx.execute<{ mine: boolean; first_grade: string; recheck_grade: string; count: number }>(sql`
    SELECT r.first_grader_id = ${graderId} AS mine, r.first_grade, r.recheck_grade, count(*)::int AS count
    FROM rechecks r
    WHERE r.workspace_id = ${workspaceId} AND r.submitted_at IS NOT NULL AND NOT r.not_blind
      AND r.first_graded_at >= ${localMidnight(fromDay, timeZone)} AND r.first_graded_at < ${until.toISOString()}::timestamptz
    GROUP BY 1, 2, 3`);
  return rows.map((row) => ({ mine: row.mine, firstGrade: row.first_grade, recheckGrade: row.recheck_grade, count: row.count }));
}

export async function listWorkspaceUserNames({ workspaceId }: Scope, tx: DbOrTx = db()) {
  const rows = await tx.select({ id: users.id, name: users.name }).from(users).where(eq(users.workspaceId, workspaceId));
  return new Map(rows.map((row) => [row.id, row.name]));
}
