import "server-only";
/**
 * The auditor measures and grades with their own regions, under the same rubric version as the
 * first grade; on submission the comparison with the first grade is computed and stored with the
 * recheck, and the recheck goes to adjudication or is agreed (lib/recheck/adjudication.ts).
 *
 * Decisions:
 * - Measuring reuses the Bench's pure measuring (lib/grading/grade-unit.ts in a compute thread):
 *   the auditor's regions in, the rubric version of the first grade, the unit's functional
 *   checklist failures (the readings are the unit's, not a judgement of the first grader).
 * - The comparison clips both sides to the first grader's Surface on each photo (what the graded
 *   measurement measured against); where the first grader drew none, to the auditor's, and where
 *   neither did, to the whole photo (compare-regions.ts). The first side is the photo's regions
 *   as they are now: a graded unit's regions no longer change (lib/regions/regions.ts).
 * - "Not blind": the auditor had opened the unit's inspection data (unit_openings) — the queue
 *   never offers such a unit, but a lead or a hand-sent unit can still end up there. Stored, and
 *   the scorecards leave it out.
 */
import { transaction, type Tx } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { getChecklistState, listRegionsOfPhotos } from "@/db/queries/grading";
import { getBlindUnit, getFirstGradeOfRecheck, getRubricVersionNumber, hasOpenedUnit, listBlindPhotos, listRecheckRegionSets, storeRecheckSubmission } from "@/db/queries/rechecks";
import type { LockedRecheck } from "@/db/queries/rechecks";
import type { SessionUser } from "@/lib/auth/require-user";
import { COMPUTE_START_ALLOWANCE_MS, runInThread } from "@/lib/compute/pool";
import { AppError, notFound } from "@/lib/errors";
import type { PolygonShape, Shape } from "@/lib/geometry/shape";
import { functionalFailureCounts, type UnitPhotoInput } from "@/lib/grading/grade-unit";
import type { Grade } from "@/lib/grading/rubric-schema";
import { MEASURE_INLINE_BUDGET_MS } from "@/lib/grading/schemas";
import { checklistStampOf } from "@/lib/grading/staleness";
import type { StoredUnitResult } from "@/lib/grading/stored-measurement";
import { adjudicationDecision } from "./adjudication";
import { compareRecheck, type RecheckPhotoInput } from "./compare";
import { requireHeldRecheck } from "./queue";
import { recheckSettings } from "./recording";
import type { SubmitRecheckInput } from "./schemas";

type Actor = Pick<SessionUser, "id" | "workspaceId">;

async function measureWithOwnRegions(tx: Tx, user: Actor, recheck: LockedRecheck) {
  const key = { workspaceId: user.workspaceId, unitId: recheck.unitId };
  // One after another: a transaction is one connection, and pg refuses overlapping queries on a client from pg@9 (a warning now).
  const unit = await getBlindUnit(key, tx);
  const photos = await listBlindPhotos(key, tx);
  const sets = await listRecheckRegionSets({ workspaceId: user.workspaceId, recheckId: recheck.id }, tx);
  const rubric = await getRubricVersionNumber({ workspaceId: user.workspaceId, rubricVersionId: recheck.rubricVersionId }, tx);
  const checklist = await getChecklistState(key, tx);
  if (!unit || !rubric) throw notFound("That recheck");
  const setOf = new Map(sets.map((set) => [set.photoId, set]));
  const inputs: UnitPhotoInput[] = photos.map((photo) => {
    const set = setOf.get(photo.id);
    return {
      photoId: photo.id,
      viewKey: photo.viewKey,
      width: photo.width!,
      height: photo.height!,
      regionsVersion: set?.version ?? 0,
      defects: set?.payload.regions.map((r) => ({ id: r.id, defect: r.defect, shape: r.shape })) ?? [],
      surfaces: set?.payload.surfaces.map((s) => s.shape as PolygonShape) ?? [],
      rulers: set?.payload.ruler ? [{ a: set.payload.ruler.a, b: set.payload.ruler.b, lengthMm: set.payload.ruler.lengthMm }] : [],
    };
  });
  const { nominalSizeMm, panelResolution, views, defectClasses } = unit.partType;
  const outcome = await runInThread(
    "measure-unit",
    {
      partType: { views, defectClasses, nominalSizeMm, panelResolution },
      rubric: rubric.rubric,
      photos: inputs,
      functionalFailures: functionalFailureCounts(checklist.results),
      budgetMs: MEASURE_INLINE_BUDGET_MS,
    },
    { timeoutMs: MEASURE_INLINE_BUDGET_MS + COMPUTE_START_ALLOWANCE_MS },
  );
  return { outcome, photos, sets: setOf, rubricVersion: rubric.version, checklistLatestAt: checklist.latestAt };
}

/** The proposal of the auditor's own measurement now (nothing stored). */
export async function measureRecheck(user: Actor, recheckId: string) {
  return transaction(async (tx) => {
    const recheck = await requireHeldRecheck(tx, user, recheckId);
    const { outcome, rubricVersion } = await measureWithOwnRegions(tx, user, recheck);
    return { rubricVersion, proposal: outcome.unit.proposal, functionalFailures: outcome.unit.functionalFailures };
  });
}

/** Measures again, records the auditor's grade, compares it with the first grade and stores all of it with the recheck. */
export async function submitRecheck(user: Actor, recheckId: string, input: SubmitRecheckInput) {
  const { settings } = await recheckSettings(user);
  return transaction(async (tx) => {
    const recheck = await requireHeldRecheck(tx, user, recheckId);
    const measured = await measureWithOwnRegions(tx, user, recheck);
    const proposed = measured.outcome.unit.proposal.grade as Grade;
    if (proposed !== input.proposedGrade) {
      throw new AppError("conflict", `Your measurement now proposes ${proposed}, not ${input.proposedGrade}: your regions changed since you measured. Measure again, then submit.`);
    }
    const recheckGrade: Grade = input.decision === "accept" ? proposed : input.finalGrade;
    if (input.decision === "override" && recheckGrade === proposed) {
      throw new AppError("bad_request", `The proposed grade is already ${proposed}; accept it instead of overriding.`, {
        fieldErrors: { finalGrade: `Choose a grade other than the proposed ${proposed}, or accept.` },
      });
    }
    const first = await getFirstGradeOfRecheck({ workspaceId: user.workspaceId, gradeId: recheck.gradeId }, tx);
    if (!first) throw notFound("That recheck");
    const firstRegions = await listRegionsOfPhotos({ workspaceId: user.workspaceId, photoIds: measured.photos.map((p) => p.id) }, tx);
    const photos: RecheckPhotoInput[] = measured.photos.map((photo) => {
      const own = firstRegions.filter((r) => r.photoId === photo.id);
      const set = measured.sets.get(photo.id);
      const firstSurface = own.filter((r) => r.role === "surface").map((r) => r.shape as Shape);
      const recheckSurface = set?.payload.surfaces.map((s) => s.shape as Shape) ?? [];
      const surface = firstSurface.length > 0 ? firstSurface : recheckSurface.length > 0 ? recheckSurface : undefined;
      return {
        photoId: photo.id,
        width: photo.width!,
        height: photo.height!,
        surface,
        first: own.filter((r) => r.role === "defect").map((r) => ({ id: r.clientId, defect: r.defectClass!, shape: r.shape as Shape })),
        recheck: set?.payload.regions.map((r) => ({ id: r.id, defect: r.defect, shape: r.shape })) ?? [],
      };
    });
    const comparison = await compareRecheck({ photos, firstGrade: first.finalGrade as Grade, recheckGrade });
    const decision = adjudicationDecision(comparison, settings);
    const notBlind = await hasOpenedUnit({ workspaceId: user.workspaceId, unitId: recheck.unitId, userId: user.id }, tx);
    const measurement: StoredUnitResult = {
      ...measured.outcome.unit,
      checklistStamp: checklistStampOf(measured.checklistLatestAt),
      views: Object.fromEntries(measured.photos.map((p) => [p.id, p.viewKey])),
    };
    const status = decision.required ? "adjudication" : "agreed";
    await storeRecheckSubmission(tx, {
      workspaceId: user.workspaceId,
      recheckId,
      auditorId: user.id,
      measurement,
      proposedGrade: proposed,
      recheckGrade,
      overrideReason: input.decision === "override" ? input.reason : null,
      notBlind,
      comparison,
      adjudicationReasons: decision.reasons,
      status,
    });
    await logActivity(tx, {
      workspaceId: user.workspaceId,
      actorId: user.id,
      action: "recheck.submitted",
      subjectType: "recheck",
      subjectId: recheckId,
      detail: { unitId: recheck.unitId, status, notBlind, steps: comparison.grade.steps },
    });
    return { id: recheckId, status, notBlind, recheckGrade, comparison, reasons: decision.reasons };
  });
}
