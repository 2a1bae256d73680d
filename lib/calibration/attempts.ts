import "server-only";
/**
 * Taking a calibration set (`calibration.take`): one's assignments, starting or resuming the
 * attempt, saving one item's answer at a time, submitting, and the result.
 *
 * Decisions:
 * - Blind until submitted: before `submitted_at` every answer to the taker is built from
 *   listBlindSetItems (no key column, no gallery item id, no photo id; the photo is streamed by
 *   position through the attempt's own image route). Only after submission does the result carry
 *   the key, the captions and the scores.
 * - Only the assigned person takes an attempt; for anyone else it answers 404, as a missing one.
 *   Trainers (`calibration.manage`) read submitted attempts through the set (lib/calibration/sets.ts).
 * - Pause and resume: each save stores that item's answer at once; opening the assignment again
 *   returns the same attempt with every answer so far. Nothing touches units, lots or the queue.
 * - Submitting needs a grade on every item (409 naming those without). Scoring runs in a compute
 *   thread; its result is stored in the same transaction that marks the attempt submitted, under
 *   the attempt's lock, so a double submit scores once and a failed scoring leaves it in progress.
 */
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import {
  getAssignment,
  getAttempt,
  getSet,
  getSetItemPhotoId,
  listBlindSetItems,
  listKeyedSetItems,
  listUserAssignments,
  lockAttempt,
  saveAnswer,
  startAttempt,
  storeSubmission,
} from "@/db/queries/calibration";
import { getGradingPartType } from "@/db/queries/rubrics";
import type { SessionUser } from "@/lib/auth/require-user";
import { COMPUTE_START_ALLOWANCE_MS, runInThread } from "@/lib/compute/pool";
import { AppError, notFound } from "@/lib/errors";
import { parseRegionSet } from "@/lib/geometry/validate";
import type { SaveAnswerInput } from "./schemas";
import { scoreCalibrationSet, type ScoreSetInput } from "./score-set";
import type { CalibrationAnswer, CalibrationAnswers } from "./types";

type Taker = Pick<SessionUser, "id" | "workspaceId">;

export const ATTEMPT_NOT_FOUND = "That calibration attempt";
const ASSIGNMENT_NOT_FOUND = "That calibration assignment";
const SCORING_TIMEOUT_MS = 60_000;

export async function listMyAssignments(taker: Taker) {
  const rows = await listUserAssignments({ workspaceId: taker.workspaceId, userId: taker.id });
  return rows.map((r) => ({
    id: r.id,
    setName: r.setName,
    itemCount: r.itemCount,
    dueOn: r.dueOn,
    attemptId: r.attemptId,
    status: r.attemptStatus ?? "not_started",
    submittedAt: r.submittedAt,
    passed: r.passed,
  }));
}

/** Starts the assignment's attempt or finds the one started; its id. */
export async function openAttempt(taker: Taker, assignmentId: string): Promise<{ attemptId: string }> {
  const assignment = await getAssignment({ workspaceId: taker.workspaceId, assignmentId });
  if (!assignment || assignment.userId !== taker.id) throw notFound(ASSIGNMENT_NOT_FOUND);
  const attemptId = await transaction((tx) => startAttempt(tx, { workspaceId: taker.workspaceId, assignmentId, setId: assignment.setId, userId: taker.id }));
  return { attemptId };
}

/** One's own attempt; anyone else's answers 404, as a missing one. */
export async function ownAttempt(taker: Taker, attemptId: string) {
  const attempt = await getAttempt({ workspaceId: taker.workspaceId, attemptId });
  if (!attempt || attempt.userId !== taker.id) throw notFound(ATTEMPT_NOT_FOUND);
  return attempt;
}

/** The attempt as its taker sees it: blind while in progress, with the key and the score once submitted. */
export async function readAttempt(taker: Taker, attemptId: string) {
  const attempt = await ownAttempt(taker, attemptId);
  const key = { workspaceId: taker.workspaceId, setId: attempt.setId };
  const set = await getSet(key);
  const base = {
    id: attempt.id,
    status: attempt.status,
    setName: set!.name,
    thresholds: { minGradeAgreement: set!.minGradeAgreement, minMeanIou: set!.minMeanIou },
    startedAt: attempt.startedAt,
    answers: attempt.answers,
  };
  if (attempt.status !== "submitted" || !attempt.score) {
    return { ...base, items: await listBlindSetItems(key), result: null };
  }
  const items = await listKeyedSetItems(key);
  return {
    ...base,
    submittedAt: attempt.submittedAt,
    items: items.map(({ galleryItemId: _g, photoId: _p, ...item }) => item),
    result: { passed: attempt.passed, summary: attempt.score.summary, items: attempt.score.items },
  };
}

/** The photo of one item of one's attempt (preview or thumbnail), without telling its id. */
export async function attemptPhotoId(taker: Taker, attemptId: string, position: number): Promise<string> {
  const attempt = await ownAttempt(taker, attemptId);
  const photoId = await getSetItemPhotoId({ workspaceId: taker.workspaceId, setId: attempt.setId, position });
  if (!photoId) throw notFound("That item of the set");
  return photoId;
}

function notInProgress(): AppError {
  return new AppError("conflict", "This attempt has been submitted; its answers can no longer change.");
}

export async function saveItemAnswer(taker: Taker, attemptId: string, position: number, input: SaveAnswerInput): Promise<{ position: number; answer: CalibrationAnswer }> {
  const attempt = await ownAttempt(taker, attemptId);
  const item = (await listBlindSetItems({ workspaceId: taker.workspaceId, setId: attempt.setId })).find((i) => i.position === position);
  if (!item) throw notFound("That item of the set");
  if (!item.width || !item.height) throw new AppError("conflict", "This item's photo is not available; tell your trainer.");
  const partType = await getGradingPartType({ workspaceId: taker.workspaceId, partTypeId: item.partTypeId });
  const parsed = parseRegionSet(input.regions ?? { regions: [] }, { width: item.width, height: item.height, allowedDefects: partType!.defectClasses.map((d) => d.key) });
  if (!parsed.ok) {
    throw new AppError("bad_request", `The regions were not saved: ${parsed.messages.slice(0, 3).join(" ")} Nothing was stored.`, { fieldErrors: { regions: parsed.messages[0] ?? "are not valid" } });
  }
  const answer: CalibrationAnswer = { grade: input.grade, regions: parsed.value, savedAt: new Date().toISOString() };
  await transaction(async (tx) => {
    const locked = await lockAttempt(tx, { workspaceId: taker.workspaceId, attemptId });
    if (locked?.status !== "in_progress") throw notInProgress();
    await saveAnswer(tx, { workspaceId: taker.workspaceId, attemptId, position, answer });
  });
  return { position, answer };
}

/** `scoreInline`: score in this process instead of a compute thread (the seed, which runs no thread pool). */
export async function submitAttempt(taker: Taker, attemptId: string, { scoreInline = false }: { scoreInline?: boolean } = {}) {
  const attempt = await ownAttempt(taker, attemptId);
  if (attempt.status !== "in_progress") throw notInProgress();
  const key = { workspaceId: taker.workspaceId, setId: attempt.setId };
  const [set, items] = await Promise.all([getSet(key), listKeyedSetItems(key)]);
  await transaction(async (tx) => {
    const locked = await lockAttempt(tx, { workspaceId: taker.workspaceId, attemptId });
    if (locked?.status !== "in_progress") throw notInProgress();
    const answers: CalibrationAnswers = locked.answers;
    const ungraded = items.filter((i) => !answers[String(i.position)]?.grade).map((i) => i.position);
    if (ungraded.length) {
      throw new AppError("conflict", `Grade every item before submitting; still without a grade: ${ungraded.map((p) => `item ${p}`).join(", ")}. Your answers are kept.`, {
        fieldErrors: { items: ungraded.join(",") },
      });
    }
    const input: ScoreSetInput = {
      thresholds: { minGradeAgreement: set!.minGradeAgreement, minMeanIou: set!.minMeanIou },
      items: items.map((i) => {
        const answer = answers[String(i.position)]!;
        return { position: i.position, width: i.width!, height: i.height!, key: { grade: i.keyGrade, regions: i.keyRegions }, answer: { grade: answer.grade!, regions: answer.regions } };
      }),
    };
    const score = scoreInline ? await scoreCalibrationSet(input) : await runInThread("score-calibration", input, { timeoutMs: SCORING_TIMEOUT_MS + COMPUTE_START_ALLOWANCE_MS });
    await storeSubmission(tx, { workspaceId: taker.workspaceId, attemptId, score, passed: score.summary.passed });
    await logActivity(tx, {
      workspaceId: taker.workspaceId,
      actorId: taker.id,
      action: "calibration.submitted",
      subjectType: "calibration_attempt",
      subjectId: attemptId,
      detail: { setId: attempt.setId, passed: score.summary.passed },
    });
  });
  return readAttempt(taker, attemptId);
}
