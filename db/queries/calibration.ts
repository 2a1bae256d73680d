import "server-only";
/**
 * Calibration sets, assignments and attempts: every read and write, scoped by workspace in the
 * WHERE clause. The rules (who may take what, when the key may be read, how an attempt is scored)
 * are lib/calibration's. Reads meant for a taker select no key column at all, so a key cannot
 * reach them by a mistake further up.
 */
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { calibrationAssignments, calibrationAttempts, calibrationSetItems, calibrationSets, galleryItems, partTypes, photos, users } from "@/db/schema";
import type { CalibrationAnswer, StoredAttemptScore } from "@/lib/calibration/types";
import type { Grade } from "@/lib/grading/rubric-schema";
import type { CalibrationFailedCheck, CalibrationResult } from "@/lib/recheck/scorecard-calibration";

type SetKey = { workspaceId: string; setId: string };

/** The gallery items a new set names, with their photos' sizes, locked against edits until the set is stored. */
export function lockItemsForSet(tx: DbOrTx, { workspaceId, itemIds }: { workspaceId: string; itemIds: readonly string[] }) {
  return tx
    .select({
      id: galleryItems.id,
      status: galleryItems.status,
      photoId: galleryItems.photoId,
      partTypeId: galleryItems.partTypeId,
      viewKey: galleryItems.viewKey,
      regions: galleryItems.regions,
      grade: galleryItems.grade,
      caption: galleryItems.caption,
    })
    .from(galleryItems)
    .where(and(eq(galleryItems.workspaceId, workspaceId), inArray(galleryItems.id, [...itemIds])))
    .for("share");
}

export async function insertSet(tx: DbOrTx, row: typeof calibrationSets.$inferInsert): Promise<string> {
  const [inserted] = await tx.insert(calibrationSets).values(row).returning({ id: calibrationSets.id });
  return inserted.id;
}

export async function insertSetItems(tx: DbOrTx, rows: (typeof calibrationSetItems.$inferInsert)[]) {
  await tx.insert(calibrationSetItems).values(rows);
}

const setColumns = {
  id: calibrationSets.id,
  name: calibrationSets.name,
  minGradeAgreement: calibrationSets.minGradeAgreement,
  minMeanIou: calibrationSets.minMeanIou,
  itemCount: calibrationSets.itemCount,
  createdAt: calibrationSets.createdAt,
};

/** Every set of the workspace, newest first, with how many people it is assigned to and how many submitted / passed. */
export function listSets({ workspaceId }: { workspaceId: string }) {
  return db()
    .select({
      ...setColumns,
      assigned: sql<number>`(SELECT count(*)::int FROM ${calibrationAssignments} a WHERE a.workspace_id = ${calibrationSets.workspaceId} AND a.set_id = ${calibrationSets.id})`,
      submitted: sql<number>`(SELECT count(*)::int FROM ${calibrationAttempts} t WHERE t.workspace_id = ${calibrationSets.workspaceId} AND t.set_id = ${calibrationSets.id} AND t.status = 'submitted')`,
      passed: sql<number>`(SELECT count(*)::int FROM ${calibrationAttempts} t WHERE t.workspace_id = ${calibrationSets.workspaceId} AND t.set_id = ${calibrationSets.id} AND t.passed)`,
    })
    .from(calibrationSets)
    .where(eq(calibrationSets.workspaceId, workspaceId))
    .orderBy(desc(calibrationSets.createdAt), desc(calibrationSets.id));
}

export async function getSet({ workspaceId, setId }: SetKey, tx: DbOrTx = db()) {
  const [row] = await tx
    .select(setColumns)
    .from(calibrationSets)
    .where(and(eq(calibrationSets.workspaceId, workspaceId), eq(calibrationSets.id, setId)))
    .limit(1);
  return row ?? null;
}

/** A set's items WITH the key, in order: for the trainer and for scoring a submitted attempt. */
export function listKeyedSetItems({ workspaceId, setId }: SetKey, tx: DbOrTx = db()) {
  return tx
    .select({
      position: calibrationSetItems.position,
      galleryItemId: calibrationSetItems.galleryItemId,
      photoId: calibrationSetItems.photoId,
      partTypeId: calibrationSetItems.partTypeId,
      partTypeName: partTypes.name,
      viewKey: calibrationSetItems.viewKey,
      keyRegions: calibrationSetItems.keyRegions,
      keyGrade: calibrationSetItems.keyGrade,
      keyCaption: calibrationSetItems.keyCaption,
      width: photos.width,
      height: photos.height,
    })
    .from(calibrationSetItems)
    .innerJoin(photos, and(eq(photos.workspaceId, calibrationSetItems.workspaceId), eq(photos.id, calibrationSetItems.photoId)))
    .innerJoin(partTypes, and(eq(partTypes.workspaceId, calibrationSetItems.workspaceId), eq(partTypes.id, calibrationSetItems.partTypeId)))
    .where(and(eq(calibrationSetItems.workspaceId, workspaceId), eq(calibrationSetItems.setId, setId)))
    .orderBy(asc(calibrationSetItems.position));
}

/** A set's items for a taker: where each is and what to mark it with — no key column, no gallery id, no photo id. */
export function listBlindSetItems({ workspaceId, setId }: SetKey, tx: DbOrTx = db()) {
  return tx
    .select({
      position: calibrationSetItems.position,
      partTypeId: calibrationSetItems.partTypeId,
      partTypeName: partTypes.name,
      viewKey: calibrationSetItems.viewKey,
      width: photos.width,
      height: photos.height,
      previewWidth: photos.previewWidth,
      previewHeight: photos.previewHeight,
    })
    .from(calibrationSetItems)
    .innerJoin(photos, and(eq(photos.workspaceId, calibrationSetItems.workspaceId), eq(photos.id, calibrationSetItems.photoId)))
    .innerJoin(partTypes, and(eq(partTypes.workspaceId, calibrationSetItems.workspaceId), eq(partTypes.id, calibrationSetItems.partTypeId)))
    .where(and(eq(calibrationSetItems.workspaceId, workspaceId), eq(calibrationSetItems.setId, setId)))
    .orderBy(asc(calibrationSetItems.position));
}

/** The photo behind one position of a set (the image route streams it without telling the id). */
export async function getSetItemPhotoId({ workspaceId, setId, position }: SetKey & { position: number }) {
  const [row] = await db()
    .select({ photoId: calibrationSetItems.photoId })
    .from(calibrationSetItems)
    .where(and(eq(calibrationSetItems.workspaceId, workspaceId), eq(calibrationSetItems.setId, setId), eq(calibrationSetItems.position, position)))
    .limit(1);
  return row?.photoId ?? null;
}

/** Which of these ids are people of the workspace who can take a set (active, with the inspector role). */
export function listAssignableUsers(tx: DbOrTx, { workspaceId, userIds }: { workspaceId: string; userIds: readonly string[] }) {
  return tx
    .select({ id: users.id, name: users.name, roles: users.roles, active: users.active })
    .from(users)
    .where(and(eq(users.workspaceId, workspaceId), inArray(users.id, [...userIds])));
}

/** Assigns the set; someone it is already assigned to keeps their assignment and gets the new due date. */
export async function upsertAssignments(tx: DbOrTx, rows: (typeof calibrationAssignments.$inferInsert)[]) {
  await tx
    .insert(calibrationAssignments)
    .values(rows)
    .onConflictDoUpdate({ target: [calibrationAssignments.setId, calibrationAssignments.userId], set: { dueOn: sql`excluded.due_on` } });
}

const assignmentColumns = {
  id: calibrationAssignments.id,
  setId: calibrationAssignments.setId,
  userId: calibrationAssignments.userId,
  userName: users.name,
  dueOn: calibrationAssignments.dueOn,
  createdAt: calibrationAssignments.createdAt,
  attemptId: calibrationAttempts.id,
  attemptStatus: calibrationAttempts.status,
  startedAt: calibrationAttempts.startedAt,
  submittedAt: calibrationAttempts.submittedAt,
  passed: calibrationAttempts.passed,
};

function selectAssignments(tx: DbOrTx) {
  return tx
    .select({ ...assignmentColumns, setName: calibrationSets.name, itemCount: calibrationSets.itemCount })
    .from(calibrationAssignments)
    .innerJoin(users, eq(users.id, calibrationAssignments.userId))
    .innerJoin(calibrationSets, and(eq(calibrationSets.workspaceId, calibrationAssignments.workspaceId), eq(calibrationSets.id, calibrationAssignments.setId)))
    .leftJoin(calibrationAttempts, and(eq(calibrationAttempts.workspaceId, calibrationAssignments.workspaceId), eq(calibrationAttempts.assignmentId, calibrationAssignments.id)));
}

/** A set's assignments with each person's attempt, by name. */
export function listSetAssignments({ workspaceId, setId }: SetKey) {
  return selectAssignments(db())
    .where(and(eq(calibrationAssignments.workspaceId, workspaceId), eq(calibrationAssignments.setId, setId)))
    .orderBy(asc(users.name), asc(calibrationAssignments.id));
}

/** One person's assignments, soonest due first. */
export function listUserAssignments({ workspaceId, userId }: { workspaceId: string; userId: string }) {
  return selectAssignments(db())
    .where(and(eq(calibrationAssignments.workspaceId, workspaceId), eq(calibrationAssignments.userId, userId)))
    .orderBy(asc(calibrationAssignments.dueOn), asc(calibrationAssignments.id));
}

export async function getAssignment({ workspaceId, assignmentId }: { workspaceId: string; assignmentId: string }, tx: DbOrTx = db()) {
  const [row] = await selectAssignments(tx)
    .where(and(eq(calibrationAssignments.workspaceId, workspaceId), eq(calibrationAssignments.id, assignmentId)))
    .limit(1);
  return row ?? null;
}

/** Starts the assignment's attempt, or finds the one already started (one attempt per assignment). */
export async function startAttempt(tx: DbOrTx, row: { workspaceId: string; assignmentId: string; setId: string; userId: string }): Promise<string> {
  await tx.insert(calibrationAttempts).values(row).onConflictDoNothing({ target: calibrationAttempts.assignmentId });
  const [found] = await tx
    .select({ id: calibrationAttempts.id })
    .from(calibrationAttempts)
    .where(and(eq(calibrationAttempts.workspaceId, row.workspaceId), eq(calibrationAttempts.assignmentId, row.assignmentId)));
  return found.id;
}

type AttemptKey = { workspaceId: string; attemptId: string };

export async function getAttempt({ workspaceId, attemptId }: AttemptKey, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(calibrationAttempts)
    .where(and(eq(calibrationAttempts.workspaceId, workspaceId), eq(calibrationAttempts.id, attemptId)))
    .limit(1);
  return row ?? null;
}

/** The attempt row, locked for the rest of the transaction (saves and the submission queue here). */
export async function lockAttempt(tx: DbOrTx, { workspaceId, attemptId }: AttemptKey) {
  const [row] = await tx
    .select()
    .from(calibrationAttempts)
    .where(and(eq(calibrationAttempts.workspaceId, workspaceId), eq(calibrationAttempts.id, attemptId)))
    .for("update");
  return row ?? null;
}

export async function saveAnswer(tx: DbOrTx, { workspaceId, attemptId, position, answer }: AttemptKey & { position: number; answer: CalibrationAnswer }) {
  await tx
    .update(calibrationAttempts)
    .set({ answers: sql`${calibrationAttempts.answers} || jsonb_build_object(${String(position)}::text, ${JSON.stringify(answer)}::jsonb)`, updatedAt: sql`now()` })
    .where(and(eq(calibrationAttempts.workspaceId, workspaceId), eq(calibrationAttempts.id, attemptId)));
}

export async function storeSubmission(tx: DbOrTx, { workspaceId, attemptId, score, passed }: AttemptKey & { score: StoredAttemptScore; passed: boolean }) {
  await tx
    .update(calibrationAttempts)
    .set({ status: "submitted", submittedAt: sql`now()`, updatedAt: sql`now()`, score, passed })
    .where(and(eq(calibrationAttempts.workspaceId, workspaceId), eq(calibrationAttempts.id, attemptId)));
}

/** The submitted attempts of a set with their stored scores (the trainer's view). */
export function listSubmittedAttempts({ workspaceId, setId }: SetKey) {
  return db()
    .select({
      id: calibrationAttempts.id,
      userId: calibrationAttempts.userId,
      userName: users.name,
      submittedAt: calibrationAttempts.submittedAt,
      passed: calibrationAttempts.passed,
      score: calibrationAttempts.score,
    })
    .from(calibrationAttempts)
    .innerJoin(users, eq(users.id, calibrationAttempts.userId))
    .where(and(eq(calibrationAttempts.workspaceId, workspaceId), eq(calibrationAttempts.setId, setId), eq(calibrationAttempts.status, "submitted")))
    .orderBy(asc(users.name));
}

/**
 * A grader's last submitted calibration attempt up to `at` (the recheck draw raises the rate of
 * graders whose last attempt failed, lib/recheck/raised-rate.ts). A person has one attempt per
 * assignment, so this reads a handful of rows.
 */
export async function getLastSubmittedAttempt({ workspaceId, userId, at }: { workspaceId: string; userId: string; at: Date }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ id: calibrationAttempts.id, setId: calibrationAttempts.setId, submittedAt: calibrationAttempts.submittedAt, passed: calibrationAttempts.passed })
    .from(calibrationAttempts)
    .where(
      and(
        eq(calibrationAttempts.workspaceId, workspaceId),
        eq(calibrationAttempts.userId, userId),
        eq(calibrationAttempts.status, "submitted"),
        sql`${calibrationAttempts.submittedAt} <= ${at.toISOString()}::timestamptz`,
      ),
    )
    .orderBy(desc(calibrationAttempts.submittedAt), desc(calibrationAttempts.id))
    .limit(1);
  return row;
}

/** Attempts submitted on a local day in [from, to] (the workspace's time zone): the scorecards' calibration reads. */
const submittedInPeriod = ({ workspaceId, from, to, timeZone }: PeriodKey) => sql`
  a.workspace_id = ${workspaceId} AND a.status = 'submitted'
  AND a.submitted_at >= ((${from}::date)::timestamp AT TIME ZONE ${timeZone}) AND a.submitted_at < ((${to}::date)::timestamp AT TIME ZONE ${timeZone}) + interval '1 day'`;
type PeriodKey = { workspaceId: string; from: string; to: string; timeZone: string };

/**
 * The submitted attempts of a period for the scorecards: who, which set, the local day, the share
 * of items graded as the key and the verdict with the checks that failed. Only these figures leave
 * the stored score — no item, key grade, region or caption — so a reader who has not taken the set
 * learns nothing of its key.
 */
export async function listAttemptResultsInPeriod(key: PeriodKey, tx: DbOrTx = db()): Promise<CalibrationResult[]> {
  const { rows } = await tx.execute<{
    attempt_id: string;
    user_id: string;
    set_id: string;
    set_name: string;
    day: string;
    items: number;
    exact_share: number;
    passed: boolean;
    failed_checks: CalibrationFailedCheck[];
  }>(sql`
    SELECT a.id AS attempt_id, a.user_id, a.set_id, s.name AS set_name, to_char(a.submitted_at AT TIME ZONE ${key.timeZone}, 'YYYY-MM-DD') AS day,
           jsonb_array_length(a.score->'items') AS items, (a.score->'summary'->'grades'->>'exactShare')::float8 AS exact_share, a.passed,
           coalesce((SELECT jsonb_agg(c - 'passed') FROM jsonb_array_elements(a.score->'summary'->'checks') c WHERE NOT (c->>'passed')::boolean), '[]'::jsonb) AS failed_checks
    FROM calibration_attempts a JOIN calibration_sets s ON s.workspace_id = a.workspace_id AND s.id = a.set_id
    WHERE ${submittedInPeriod(key)}
    ORDER BY a.submitted_at, a.id`);
  return rows.map((row) => ({
    attemptId: row.attempt_id,
    userId: row.user_id,
    setId: row.set_id,
    setName: row.set_name,
    day: row.day,
    items: row.items,
    exactShare: row.exact_share,
    passed: row.passed,
    failedChecks: row.failed_checks,
  }));
}

/**
 * Per gallery item taken in the period, its key grade and the grades the period's submitted
 * attempts gave it, whichever sets it was in (the same example in two sets is one unit; if its key
 * grade differed between the sets' copies, one unit per key). For the scorecards' alpha and AC1
 * over calibration items (lib/recheck/team.ts); key grades are only counted into those two
 * coefficients, never returned to a screen.
 */
export async function listCalibrationGradeSetsInPeriod(key: PeriodKey, tx: DbOrTx = db()) {
  const { rows } = await tx.execute<{ gallery_item_id: string; key_grade: Grade; given: Grade[] }>(sql`
    SELECT si.gallery_item_id, i->'grade'->>'key' AS key_grade, array_agg(i->'grade'->>'given' ORDER BY a.id) AS given
    FROM calibration_attempts a
    CROSS JOIN LATERAL jsonb_array_elements(a.score->'items') i
    JOIN calibration_set_items si ON si.workspace_id = a.workspace_id AND si.set_id = a.set_id AND si.position = (i->>'position')::int
    WHERE ${submittedInPeriod(key)}
    GROUP BY 1, 2`);
  return rows.map((row) => ({ galleryItemId: row.gallery_item_id, keyGrade: row.key_grade, given: row.given }));
}
