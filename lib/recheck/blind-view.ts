import "server-only";
/**
 * The auditor's own read path for a recheck: the unit's photos and its functional checklist
 * readings (instrument readings, not judgements), the part type's views, defect classes and
 * checklist (with its cautions), the rubric version the first grade used — and the auditor's own
 * regions. Nothing of the first grade: no regions, measurements, proposal, grade, override
 * reason, nor who graded or who recorded a reading. It reads only through the queries built for
 * it (db/queries/rechecks.ts `getBlindUnit`, `listBlindPhotos`, `listChecklistReadings`), never
 * through the Bench's, so a column added there cannot leak here.
 */
import { getBlindUnit, getRecheck, getRubricVersionNumber, listBlindPhotos, listChecklistReadings, listRecheckRegionSets } from "@/db/queries/rechecks";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";

type Actor = Pick<SessionUser, "id" | "workspaceId">;

/** The recheck as its holder may see it before submitting; 409 for anyone else, 404 when missing. */
export async function blindRecheckView(user: Actor, recheckId: string) {
  const key = { workspaceId: user.workspaceId };
  const recheck = await getRecheck({ ...key, recheckId });
  if (!recheck) throw notFound("That recheck");
  if (recheck.status !== "waiting") throw new AppError("conflict", "This recheck has been submitted; its outcome is on the Recheck screen.");
  if (recheck.leaseHolderId !== user.id) throw new AppError("conflict", "You do not hold this recheck. Take it from the recheck queue first.");
  const [unit, photos, readings, rubric, sets] = await Promise.all([
    getBlindUnit({ ...key, unitId: recheck.unitId }),
    listBlindPhotos({ ...key, unitId: recheck.unitId }),
    listChecklistReadings({ ...key, unitId: recheck.unitId }),
    getRubricVersionNumber({ ...key, rubricVersionId: recheck.rubricVersionId }),
    listRecheckRegionSets({ ...key, recheckId }),
  ]);
  if (!unit || !rubric) throw notFound("That recheck");
  const byItem = new Map(readings.map((r) => [r.itemId, r.value]));
  return {
    recheck: { id: recheck.id, leaseExpiresAt: recheck.leaseExpiresAt?.toISOString() ?? null, rubricVersion: rubric.version },
    unit: {
      serial: unit.serial,
      partType: {
        id: unit.partType.id,
        name: unit.partType.name,
        category: unit.partType.category,
        views: unit.partType.views,
        defectClasses: unit.partType.defectClasses,
        panelResolution: unit.partType.panelResolution,
      },
    },
    photos: photos.map((p) => ({
      id: p.id,
      viewKey: p.viewKey,
      width: p.width!,
      height: p.height!,
      preview: p.previewWidth && p.previewHeight ? { width: p.previewWidth, height: p.previewHeight } : null,
    })),
    checklist: unit.partType.checklist.map((item) => ({ item, value: byItem.get(item.id) ?? null })),
    regionSets: Object.fromEntries(sets.map((set) => [set.photoId, { version: set.version, regions: set.payload }])),
  };
}
/** JSON-ready (times as ISO text): the API answers it and the page hands it to the client as it is. */
export type BlindRecheckView = Awaited<ReturnType<typeof blindRecheckView>>;
