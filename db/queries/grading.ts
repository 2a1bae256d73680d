import "server-only";
import { and, asc, desc, eq, inArray, isNull, max, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { checklistResults, grades, measurements, partTypes, photos, regions, regionSets, rubricVersions, units, users, type NewGradeRow } from "@/db/schema";
import type { StoredPhotoResult, StoredUnitResult } from "@/lib/grading/stored-measurement";

type UnitKey = { workspaceId: string; unitId: string };

/** The unit with what grading needs of its part type, scoped by workspace. */
export async function getUnitForGrading({ workspaceId, unitId }: UnitKey, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({
      id: units.id,
      serial: units.serial,
      sampleIndex: units.sampleIndex,
      status: units.status,
      lotId: units.lotId,
      partTypeId: units.partTypeId,
      partType: {
        id: partTypes.id,
        slug: partTypes.slug,
        name: partTypes.name,
        views: partTypes.views,
        defectClasses: partTypes.defectClasses,
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
export type GradingUnit = NonNullable<Awaited<ReturnType<typeof getUnitForGrading>>>;

/** The unit's photos with their current region set versions (0 for a photo never annotated). */
export function listUnitPhotoVersions({ workspaceId, unitId }: UnitKey, tx: DbOrTx = db()) {
  return (
    tx
      .select({
        photoId: photos.id,
        viewKey: photos.viewKey,
        status: photos.status,
        width: photos.width,
        height: photos.height,
        fileName: photos.fileName,
        createdAt: photos.createdAt,
        regionsVersion: regionSets.version,
      })
      .from(photos)
      .leftJoin(regionSets, and(eq(regionSets.photoId, photos.id), eq(regionSets.workspaceId, workspaceId)))
      // A photo taken out of the unit (lib/photos/removal.ts) is no longer measured.
      .where(and(eq(photos.workspaceId, workspaceId), eq(photos.unitId, unitId), isNull(photos.removedAt)))
      .orderBy(asc(photos.createdAt), asc(photos.id))
  );
}

export function listRegionsOfPhotos({ workspaceId, photoIds }: { workspaceId: string; photoIds: string[] }, tx: DbOrTx = db()) {
  if (photoIds.length === 0) return Promise.resolve([]);
  return tx
    .select({ photoId: regions.photoId, clientId: regions.clientId, role: regions.role, defectClass: regions.defectClass, shape: regions.shape, ruler: regions.ruler })
    .from(regions)
    .where(and(eq(regions.workspaceId, workspaceId), inArray(regions.photoId, photoIds)))
    .orderBy(asc(regions.photoId), asc(regions.position), asc(regions.createdAt), asc(regions.clientId));
}

/** Checklist results of the unit (pass/fail and severity) and the time of the latest one. */
export async function getChecklistState({ workspaceId, unitId }: UnitKey, tx: DbOrTx = db()) {
  const rows = await tx
    .select({ passed: checklistResults.passed, severityOnFail: checklistResults.severityOnFail })
    .from(checklistResults)
    .where(and(eq(checklistResults.workspaceId, workspaceId), eq(checklistResults.unitId, unitId)));
  const [latest] = await tx
    .select({ at: max(checklistResults.recordedAt) })
    .from(checklistResults)
    .where(and(eq(checklistResults.workspaceId, workspaceId), eq(checklistResults.unitId, unitId)));
  return { results: rows, latestAt: latest?.at ?? null };
}

/** Stores a unit-level measurement and its photo rows; returns their ids (unit first). */
export async function insertMeasurementSet(
  tx: DbOrTx,
  input: UnitKey & {
    rubricVersionId: string;
    regionsVersions: Record<string, number>;
    unit: StoredUnitResult;
    photos: StoredPhotoResult[];
    actorId: string | null;
  },
) {
  const [unitRow] = await tx
    .insert(measurements)
    .values({
      workspaceId: input.workspaceId,
      unitId: input.unitId,
      photoId: null,
      rubricVersionId: input.rubricVersionId,
      regionsVersions: input.regionsVersions,
      result: input.unit,
      createdBy: input.actorId,
    })
    .returning({ id: measurements.id, createdAt: measurements.createdAt });
  const photoRows = input.photos.length
    ? await tx
        .insert(measurements)
        .values(
          input.photos.map((photo) => ({
            workspaceId: input.workspaceId,
            unitId: input.unitId,
            photoId: photo.measurement.photoId,
            unitMeasurementId: unitRow.id,
            rubricVersionId: input.rubricVersionId,
            regionsVersions: { [photo.measurement.photoId]: input.regionsVersions[photo.measurement.photoId] },
            result: photo,
            createdBy: input.actorId,
          })),
        )
        .returning({ id: measurements.id })
    : [];
  return { unitMeasurementId: unitRow.id, createdAt: unitRow.createdAt, photoMeasurementIds: photoRows.map((row) => row.id) };
}

const unitMeasurementColumns = {
  id: measurements.id,
  unitId: measurements.unitId,
  rubricVersionId: measurements.rubricVersionId,
  rubricVersion: rubricVersions.version,
  regionsVersions: measurements.regionsVersions,
  result: measurements.result,
  createdAt: measurements.createdAt,
  createdByName: users.name,
};

function selectUnitMeasurements(tx: DbOrTx) {
  return tx.select(unitMeasurementColumns).from(measurements).innerJoin(rubricVersions, eq(rubricVersions.id, measurements.rubricVersionId)).leftJoin(users, eq(users.id, measurements.createdBy));
}

export async function getLatestUnitMeasurement({ workspaceId, unitId }: UnitKey, tx: DbOrTx = db()) {
  const [row] = await selectUnitMeasurements(tx)
    .where(and(eq(measurements.workspaceId, workspaceId), eq(measurements.unitId, unitId), isNull(measurements.photoId)))
    .orderBy(desc(measurements.createdAt), desc(measurements.id))
    .limit(1);
  return row;
}

export async function getUnitMeasurement({ workspaceId, unitId, measurementId }: UnitKey & { measurementId: string }, tx: DbOrTx = db()) {
  const [row] = await selectUnitMeasurements(tx)
    .where(and(eq(measurements.workspaceId, workspaceId), eq(measurements.unitId, unitId), eq(measurements.id, measurementId), isNull(measurements.photoId)))
    .limit(1);
  return row;
}
export type UnitMeasurementRow = NonNullable<Awaited<ReturnType<typeof getUnitMeasurement>>>;

/** The photo rows of a unit-level measurement. */
export function listPhotoMeasurements({ workspaceId, unitMeasurementId }: { workspaceId: string; unitMeasurementId: string }, tx: DbOrTx = db()) {
  return tx
    .select({ id: measurements.id, photoId: measurements.photoId, result: measurements.result })
    .from(measurements)
    .where(and(eq(measurements.workspaceId, workspaceId), eq(measurements.unitMeasurementId, unitMeasurementId)))
    .orderBy(asc(measurements.id));
}

/** The grade a submission with this idempotency key made on the unit, if any. */
export async function getGradeByIdempotencyKey({ workspaceId, unitId, key }: UnitKey & { key: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ id: grades.id, kind: grades.kind, proposedGrade: grades.proposedGrade, finalGrade: grades.finalGrade, overrideReason: grades.overrideReason })
    .from(grades)
    .where(and(eq(grades.workspaceId, workspaceId), eq(grades.unitId, unitId), eq(grades.idempotencyKey, key)))
    .limit(1);
  return row;
}

export async function insertGrade(tx: DbOrTx, row: NewGradeRow) {
  const [inserted] = await tx.insert(grades).values(row).returning({ id: grades.id, createdAt: grades.createdAt });
  return inserted;
}

/** The unit's grade history, oldest first (the last row is the current grade). */
export function listGrades({ workspaceId, unitId }: UnitKey, tx: DbOrTx = db()) {
  return tx
    .select({
      id: grades.id,
      kind: grades.kind,
      proposedGrade: grades.proposedGrade,
      finalGrade: grades.finalGrade,
      overrideReason: grades.overrideReason,
      rubricVersionId: grades.rubricVersionId,
      rubricVersion: rubricVersions.version,
      measurementIds: grades.measurementIds,
      explanation: grades.explanation,
      regionsVersions: grades.regionsVersions,
      gradedById: grades.gradedBy,
      gradedByName: users.name,
      createdAt: grades.createdAt,
    })
    .from(grades)
    .innerJoin(rubricVersions, eq(rubricVersions.id, grades.rubricVersionId))
    .innerJoin(users, eq(users.id, grades.gradedBy))
    .where(and(eq(grades.workspaceId, workspaceId), eq(grades.unitId, unitId)))
    .orderBy(asc(grades.createdAt), asc(grades.id));
}
export type GradeHistoryRow = Awaited<ReturnType<typeof listGrades>>[number];

/** Whether regions were saved on a photo and whether a measurement read it (the photo deletion gate's grading check). */
export async function getPhotoEvidenceUse(tx: DbOrTx, { workspaceId, photoId }: { workspaceId: string; photoId: string }) {
  const [row] = await tx
    .select({
      regions: sql<boolean>`EXISTS (SELECT 1 FROM ${regionSets} WHERE ${and(eq(regionSets.workspaceId, workspaceId), eq(regionSets.photoId, photoId))})`,
      measured: sql<boolean>`EXISTS (SELECT 1 FROM ${measurements} WHERE ${and(eq(measurements.workspaceId, workspaceId), eq(measurements.photoId, photoId))})`,
    })
    .from(sql`(SELECT 1) AS one`);
  return row;
}
