import "server-only";
/**
 * What an adjudicator sees: both sides of a disagreement — the first grade and the recheck, each
 * with its grade, proposal, explanation lines, regions per photo and who gave it — and the
 * comparison with the areas only one side marked (for the overlay). Only for a lead or an auditor
 * who graded neither side (lib/recheck/adjudicate.ts `assertNeitherGrader`).
 */
import { listRegionsOfPhotos } from "@/db/queries/grading";
import { getGradeForAdjudication, getRecheck, listBlindPhotos, listRecheckRegionSets, listWaitingAdjudications, userNames } from "@/db/queries/rechecks";
import type { SessionUser } from "@/lib/auth/require-user";
import { notFound } from "@/lib/errors";
import type { Shape } from "@/lib/geometry/shape";
import type { Grade } from "@/lib/grading/rubric-schema";
import { assertNeitherGrader } from "./adjudicate";
import { compareRecheck } from "./compare";

type Actor = Pick<SessionUser, "id" | "workspaceId">;

/** Disagreements waiting for a decision that the caller may settle (not their own grades), oldest first. */
export async function adjudicationsFor(actor: Actor) {
  const rows = await listWaitingAdjudications({ workspaceId: actor.workspaceId });
  return rows.filter((row) => row.firstGraderId !== actor.id && row.auditorId !== actor.id);
}

export async function adjudicationView(actor: Actor, recheckId: string) {
  const key = { workspaceId: actor.workspaceId };
  const recheck = await getRecheck({ ...key, recheckId });
  if (!recheck || recheck.status === "waiting" || !recheck.comparison || !recheck.measurement) throw notFound("That recheck");
  assertNeitherGrader(actor, recheck);
  const first = await getGradeForAdjudication({ ...key, gradeId: recheck.gradeId });
  if (!first) throw notFound("That recheck");
  const photos = await listBlindPhotos({ ...key, unitId: recheck.unitId });
  const [firstRows, sets, names] = await Promise.all([
    listRegionsOfPhotos({ ...key, photoIds: photos.map((p) => p.id) }),
    listRecheckRegionSets({ ...key, recheckId }),
    userNames({ ...key, ids: [first.gradedBy, recheck.auditorId!, ...(recheck.adjudicatedBy ? [recheck.adjudicatedBy] : [])] }),
  ]);
  const setOf = new Map(sets.map((set) => [set.photoId, set.payload]));
  const sides = photos.map((photo) => {
    const own = firstRows.filter((r) => r.photoId === photo.id);
    const firstSurface = own.filter((r) => r.role === "surface").map((r) => r.shape as Shape);
    const recheckSurface = setOf.get(photo.id)?.surfaces.map((s) => s.shape as Shape) ?? [];
    return {
      photo: { id: photo.id, viewKey: photo.viewKey, width: photo.width!, height: photo.height! },
      surface: firstSurface.length > 0 ? firstSurface : recheckSurface,
      first: own.filter((r) => r.role === "defect").map((r) => ({ id: r.clientId, defect: r.defectClass!, shape: r.shape as Shape })),
      recheck: setOf.get(photo.id)?.regions.map((r) => ({ id: r.id, defect: r.defect, shape: r.shape })) ?? [],
    };
  });
  // The areas only one side marked, as rectangles for the overlay (compare.ts keepAreas); the stored comparison has no areas.
  const withAreas = await compareRecheck(
    {
      photos: sides.map((s) => ({ photoId: s.photo.id, width: s.photo.width, height: s.photo.height, surface: s.surface.length ? s.surface : undefined, first: s.first, recheck: s.recheck })),
      firstGrade: first.finalGrade as Grade,
      recheckGrade: recheck.recheckGrade!,
    },
    { keepAreas: true },
  );
  return {
    recheck: {
      id: recheck.id,
      status: recheck.status,
      reasons: recheck.adjudicationReasons ?? [],
      notBlind: recheck.notBlind,
      submittedAt: recheck.submittedAt?.toISOString() ?? null,
      decidedLotAffected: recheck.decidedLotAffected,
      adjudication: recheck.adjudicatedAt
        ? { choice: recheck.adjudicationChoice, reason: recheck.adjudicationReason, byName: names.get(recheck.adjudicatedBy!) ?? null, at: recheck.adjudicatedAt.toISOString() }
        : null,
    },
    unit: {
      id: recheck.unitId,
      serial: first.serial,
      lotId: first.lotId,
      purchaseRef: first.purchaseRef,
      partTypeId: first.partTypeId,
      partTypeName: first.partTypeName,
      rubricVersion: first.rubricVersion,
    },
    first: {
      grade: first.finalGrade,
      proposed: first.proposedGrade,
      overrideReason: first.overrideReason,
      lines: first.explanation.lines,
      notes: first.explanation.notes,
      byName: names.get(first.gradedBy) ?? null,
      at: first.createdAt.toISOString(),
    },
    second: {
      grade: recheck.recheckGrade!,
      proposed: recheck.proposedGrade!,
      overrideReason: recheck.overrideReason,
      lines: recheck.measurement.proposal.lines,
      notes: recheck.measurement.proposal.notes,
      byName: names.get(recheck.auditorId!) ?? null,
      at: recheck.submittedAt!.toISOString(),
    },
    photos: sides.map((side) => ({ ...side, comparison: withAreas.photos.find((p) => p.photoId === side.photo.id) ?? null })),
    classes: recheck.comparison.classes,
    grades: recheck.comparison.grade,
  };
}
/** JSON-ready (times as ISO text): the API answers it and the page hands it to the client as it is. */
export type AdjudicationView = Awaited<ReturnType<typeof adjudicationView>>;
