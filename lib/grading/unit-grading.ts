import "server-only";
import { transaction, type DbOrTx } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import {
  getChecklistState,
  getLatestUnitMeasurement,
  getUnitForGrading,
  getUnitMeasurement,
  insertMeasurementSet,
  listPhotoMeasurements,
  listRegionsOfPhotos,
  listUnitPhotoVersions,
  type GradingUnit,
  type UnitMeasurementRow,
} from "@/db/queries/grading";
import { getLatestPublished } from "@/db/queries/rubrics";
import type { PolygonShape, Shape } from "@/lib/geometry/shape";
import { AppError, notFound } from "@/lib/errors";
import type { PhotoMeasurement } from "@/lib/measure/types";
import { COMPUTE_START_ALLOWANCE_MS, runInThread } from "@/lib/compute/pool";
import { functionalFailureCounts, type UnitPhotoInput } from "./grade-unit";
import { MEASURE_JOB_BUDGET_MS } from "./schemas";
import { checklistStampOf, measurementStaleness, type MeasuredInputs, type Staleness } from "./staleness";
import type { StoredPhotoResult, StoredUnitResult } from "./stored-measurement";
import { gradingVersion } from "./versioning";

export type GradingActor = { id: string | null; workspaceId: string };

export async function requireUnit(actor: GradingActor, unitId: string, tx?: DbOrTx): Promise<GradingUnit> {
  const unit = await getUnitForGrading({ workspaceId: actor.workspaceId, unitId }, tx);
  if (!unit) throw notFound("That unit");
  return unit;
}

/** What the unit's measurement depends on right now: ready photos' region versions, checklist time. */
export async function currentInputs(actor: GradingActor, unitId: string, tx?: DbOrTx) {
  const photoRows = await listUnitPhotoVersions({ workspaceId: actor.workspaceId, unitId }, tx);
  const checklist = await getChecklistState({ workspaceId: actor.workspaceId, unitId }, tx);
  const ready = photoRows.filter((photo) => photo.status === "ready");
  const inputs: MeasuredInputs = {
    regionsVersions: Object.fromEntries(ready.map((photo) => [photo.photoId, photo.regionsVersion ?? 0])),
    checklistStamp: checklistStampOf(checklist.latestAt),
    views: Object.fromEntries(ready.map((photo) => [photo.photoId, photo.viewKey])),
  };
  return { inputs, photoRows, ready, checklist };
}

/** Photo names for sentences: "Photo 2 (back)". */
function photoNamer(photoRows: { photoId: string; viewKey: string }[]) {
  const index = new Map(photoRows.map((photo, i) => [photo.photoId, `Photo ${i + 1} (${photo.viewKey})`]));
  return (photoId: string) => index.get(photoId) ?? "A photo";
}

/** Reads everything a measurement needs in one snapshot, so the versions stored match the regions measured. */
async function loadMeasureInput(actor: GradingActor, unitId: string) {
  return transaction(
    async (tx) => {
      const unit = await requireUnit(actor, unitId, tx);
      const rubric = await getLatestPublished({ workspaceId: actor.workspaceId, partTypeId: unit.partTypeId }, tx);
      gradingVersion(rubric ? [rubric] : [], unit.partType.name);
      const { inputs, photoRows, ready, checklist } = await currentInputs(actor, unitId, tx);
      const pending = photoRows.filter((photo) => photo.status === "queued" || photo.status === "processing");
      if (pending.length > 0) {
        throw new AppError("conflict", `${pending.length} photo${pending.length === 1 ? " is" : "s are"} still being processed. Measure once every photo is ready.`);
      }
      const regionRows = await listRegionsOfPhotos({ workspaceId: actor.workspaceId, photoIds: ready.map((p) => p.photoId) }, tx);
      const photos: UnitPhotoInput[] = ready.map((photo) => {
        const own = regionRows.filter((region) => region.photoId === photo.photoId);
        return {
          photoId: photo.photoId,
          viewKey: photo.viewKey,
          width: photo.width!,
          height: photo.height!,
          regionsVersion: photo.regionsVersion ?? 0,
          defects: own.filter((r) => r.role === "defect").map((r) => ({ id: r.clientId, defect: r.defectClass!, shape: r.shape as Shape })),
          surfaces: own.filter((r) => r.role === "surface").map((r) => r.shape as PolygonShape),
          rulers: own.filter((r) => r.role === "ruler").map((r) => r.ruler!),
        };
      });
      return { unit, rubric: rubric!, photos, checklist, inputs, photoRows };
    },
    { isolationLevel: "repeatable read", accessMode: "read only" },
  );
}

export type MeasurementView = Awaited<ReturnType<typeof describeMeasurement>>;

async function describeMeasurement(actor: GradingActor, row: UnitMeasurementRow, current: { inputs: MeasuredInputs; photoRows: { photoId: string; viewKey: string }[] }) {
  const photoRows = await listPhotoMeasurements({ workspaceId: actor.workspaceId, unitMeasurementId: row.id });
  const unit = row.result as StoredUnitResult;
  const staleness: Staleness = measurementStaleness({ regionsVersions: row.regionsVersions, checklistStamp: unit.checklistStamp, views: unit.views }, current.inputs, photoNamer(current.photoRows));
  return {
    id: row.id,
    createdAt: row.createdAt,
    createdByName: row.createdByName,
    rubricVersion: row.rubricVersion,
    regionsVersions: row.regionsVersions,
    functionalFailures: unit.functionalFailures,
    proposal: unit.proposal,
    photoMeasurementIds: photoRows.map((p) => p.id),
    photos: photoRows.map((p) => p.result as StoredPhotoResult),
    ...staleness,
  };
}

/**
 * Measures the unit now under the latest published rubric and stores the result. The measuring
 * runs in a compute thread (lib/compute/pool.ts), never on the request's thread: `budgetMs` is
 * its time once started (default: a background job's) — past it DeadlineExceeded, storing
 * nothing — and a thread that still runs a few seconds later is ended (ComputeTimeout).
 */
export async function measureAndStore(actor: GradingActor, unitId: string, options: { budgetMs?: number } = {}) {
  const loaded = await loadMeasureInput(actor, unitId);
  const checklistStamp = loaded.inputs.checklistStamp;
  const budgetMs = options.budgetMs ?? MEASURE_JOB_BUDGET_MS;
  const outcome = await runInThread(
    "measure-unit",
    {
      partType: loaded.unit.partType,
      rubric: loaded.rubric.rubric,
      photos: loaded.photos,
      functionalFailures: functionalFailureCounts(loaded.checklist.results),
      budgetMs,
    },
    { timeoutMs: budgetMs + COMPUTE_START_ALLOWANCE_MS },
  );
  const unitResult: StoredUnitResult = { ...outcome.unit, checklistStamp, views: loaded.inputs.views };
  const stored = await transaction(async (tx) => {
    const ids = await insertMeasurementSet(tx, {
      workspaceId: actor.workspaceId,
      unitId,
      rubricVersionId: loaded.rubric.id,
      regionsVersions: outcome.regionsVersions,
      unit: unitResult,
      photos: outcome.photos.map((p) => ({ kind: "photo", ...p })),
      actorId: actor.id,
    });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "unit.measured",
      subjectType: "unit",
      subjectId: unitId,
      detail: { measurementId: ids.unitMeasurementId, rubricVersion: loaded.rubric.version, proposed: outcome.unit.proposal.grade },
    });
    return ids;
  });
  const row = await getUnitMeasurement({ workspaceId: actor.workspaceId, unitId, measurementId: stored.unitMeasurementId });
  return describeMeasurement(actor, row!, await currentInputs(actor, unitId));
}

/** The unit's latest measurement with its staleness against the unit's inputs now (null if never measured). */
export async function latestMeasurement(actor: GradingActor, unitId: string): Promise<MeasurementView | null> {
  await requireUnit(actor, unitId);
  const row = await getLatestUnitMeasurement({ workspaceId: actor.workspaceId, unitId });
  return row ? describeMeasurement(actor, row, await currentInputs(actor, unitId)) : null;
}

/** Loads a unit measurement's photo rows as the PhotoMeasurements a re-evaluation reads. */
export async function storedPhotos(actor: GradingActor, unitMeasurementId: string, tx?: DbOrTx): Promise<PhotoMeasurement[]> {
  const rows = await listPhotoMeasurements({ workspaceId: actor.workspaceId, unitMeasurementId }, tx);
  return rows.map((row) => (row.result as StoredPhotoResult).measurement);
}

export { measurementStaleness, photoNamer };
