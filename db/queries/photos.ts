import "server-only";
/**
 * Photo rows: the reads of intake and the Bench, and the writes people make (upload, view change,
 * withdrawal, removal). Always scoped by workspace in the WHERE clause, except the worker's
 * reads by id. The worker's and the sweep's writes are in ./photo-processing.ts.
 */
import { and, asc, desc, eq, inArray, isNotNull, isNull, ne, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, type DbOrTx } from "@/db/client";
import { lots, partTypes, photos, regions, units, users, type NewPhoto, type Photo } from "@/db/schema";
import type { ViewDefinition } from "@/lib/part-types/schemas";

export type UnitForPhotos = {
  id: string;
  workspaceId: string;
  status: (typeof units.$inferSelect)["status"];
  serial: string | null;
  sampleIndex: number;
  lotId: string;
  lotStatus: (typeof lots.$inferSelect)["status"];
  purchaseRef: string;
  partType: { id: string; name: string; slug: string; category: string; views: ViewDefinition[] };
};

export async function getUnitForPhotos({ workspaceId, unitId }: { workspaceId: string; unitId: string }, tx: DbOrTx = db()): Promise<UnitForPhotos | null> {
  const [row] = await tx
    .select({
      id: units.id,
      workspaceId: units.workspaceId,
      status: units.status,
      serial: units.serial,
      sampleIndex: units.sampleIndex,
      lotId: units.lotId,
      lotStatus: lots.status,
      purchaseRef: lots.purchaseRef,
      partType: { id: partTypes.id, name: partTypes.name, slug: partTypes.slug, category: partTypes.category, views: partTypes.views },
    })
    .from(units)
    .innerJoin(lots, and(eq(lots.id, units.lotId), eq(lots.workspaceId, units.workspaceId)))
    .innerJoin(partTypes, and(eq(partTypes.id, units.partTypeId), eq(partTypes.workspaceId, units.workspaceId)))
    .where(and(eq(units.workspaceId, workspaceId), eq(units.id, unitId)))
    .limit(1);
  return row ?? null;
}

const reusedPhoto = alias(photos, "reused_photo");
const reusedUnit = alias(units, "reused_unit");
const reusedLot = alias(lots, "reused_lot");
const remover = alias(users, "remover");

/** A photo with the names the API shows beside it (uploader, the unit a reused photo came from). */
export type PhotoWithContext = Photo & {
  uploaderName: string;
  /** Who took the photo out of the unit, when it was (removedAt). */
  removerName: string | null;
  reuse: { photoId: string; unitId: string; serial: string | null; sampleIndex: number; purchaseRef: string } | null;
};

function selectPhotos(tx: DbOrTx) {
  return tx
    .select({
      photo: photos,
      uploaderName: users.name,
      reusePhotoId: reusedPhoto.id,
      reuseUnitId: reusedUnit.id,
      reuseSerial: reusedUnit.serial,
      reuseSampleIndex: reusedUnit.sampleIndex,
      reusePurchaseRef: reusedLot.purchaseRef,
      removerName: remover.name,
    })
    .from(photos)
    .innerJoin(users, eq(users.id, photos.uploadedBy))
    .leftJoin(reusedPhoto, and(eq(reusedPhoto.id, photos.possibleReuseOfPhotoId), eq(reusedPhoto.workspaceId, photos.workspaceId)))
    .leftJoin(reusedUnit, eq(reusedUnit.id, reusedPhoto.unitId))
    .leftJoin(reusedLot, eq(reusedLot.id, reusedUnit.lotId))
    .leftJoin(remover, eq(remover.id, photos.removedBy));
}

type SelectedRow = Awaited<ReturnType<ReturnType<typeof selectPhotos>["where"]>>[number];

function withContext(row: SelectedRow): PhotoWithContext {
  const reuse =
    row.reusePhotoId && row.reuseUnitId
      ? { photoId: row.reusePhotoId, unitId: row.reuseUnitId, serial: row.reuseSerial, sampleIndex: row.reuseSampleIndex ?? 0, purchaseRef: row.reusePurchaseRef ?? "" }
      : null;
  return { ...row.photo, uploaderName: row.uploaderName, removerName: row.removerName, reuse };
}

/** The unit's photos; those taken out of it (removedAt) only with `removed: true`. */
export async function listUnitPhotos({ workspaceId, unitId, removed = false }: { workspaceId: string; unitId: string; removed?: boolean }, tx: DbOrTx = db()): Promise<PhotoWithContext[]> {
  const rows = await selectPhotos(tx)
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.unitId, unitId), removed ? isNotNull(photos.removedAt) : isNull(photos.removedAt)))
    .orderBy(asc(photos.createdAt), asc(photos.id));
  return rows.map(withContext);
}

export async function getPhotoWithContext({ workspaceId, photoId }: { workspaceId: string; photoId: string }, tx: DbOrTx = db()): Promise<PhotoWithContext | null> {
  const [row] = await selectPhotos(tx)
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.id, photoId)))
    .limit(1);
  return row ? withContext(row) : null;
}

export async function getPhoto({ workspaceId, photoId }: { workspaceId: string; photoId: string }, tx: DbOrTx = db()): Promise<Photo | null> {
  const [row] = await tx
    .select()
    .from(photos)
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.id, photoId)))
    .limit(1);
  return row ?? null;
}

/** For the worker, which acts for no workspace in particular: by id alone. */
export async function getPhotoById(photoId: string, tx: DbOrTx = db()): Promise<Photo | null> {
  const [row] = await tx.select().from(photos).where(eq(photos.id, photoId)).limit(1);
  return row ?? null;
}

export async function findUnitPhotoBySha({ workspaceId, unitId, sha256 }: { workspaceId: string; unitId: string; sha256: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(photos)
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.unitId, unitId), eq(photos.sha256, sha256)))
    .limit(1);
  return row ?? null;
}

/**
 * The earliest photo with the same bytes on another unit of the workspace, refused files aside:
 * the same picture standing as evidence for two units is worth a second look.
 */
export async function findReuseCandidate({ workspaceId, unitId, sha256 }: { workspaceId: string; unitId: string; sha256: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ id: photos.id, unitId: photos.unitId })
    .from(photos)
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.sha256, sha256), ne(photos.unitId, unitId), sql`${photos.originalKey} IS NOT NULL`))
    .orderBy(asc(photos.createdAt))
    .limit(1);
  return row ?? null;
}

export async function insertPhotoRow(tx: DbOrTx, row: NewPhoto) {
  await tx.insert(photos).values(row);
}

type PhotoKey = { workspaceId: string; photoId: string };
/** Only photos still in their unit change; the rest are records. */
const currentPhoto = ({ workspaceId, photoId }: PhotoKey) => and(eq(photos.workspaceId, workspaceId), eq(photos.id, photoId), isNull(photos.removedAt));

/** Files the photo under another view; false when it was taken out meanwhile. */
export async function updatePhotoView(tx: DbOrTx, { viewKey, ...key }: PhotoKey & { viewKey: string }): Promise<boolean> {
  const rows = await tx.update(photos).set({ viewKey, updatedAt: new Date() }).where(currentPhoto(key)).returning({ id: photos.id });
  return rows.length > 0;
}

/** Takes the photo out of its unit but keeps it (and its objects) as a record; false when already out. */
export async function withdrawPhoto(tx: DbOrTx, { removedBy, reason, ...key }: PhotoKey & { removedBy: string; reason: string }): Promise<boolean> {
  const rows = await tx.update(photos).set({ removedAt: new Date(), removedBy, removalReason: reason, updatedAt: new Date() }).where(currentPhoto(key)).returning({ id: photos.id });
  return rows.length > 0;
}

/** Deletes a photo still in its unit; false when it was taken out meanwhile. */
export async function deleteCurrentPhoto(tx: DbOrTx, key: PhotoKey): Promise<boolean> {
  const rows = await tx.delete(photos).where(currentPhoto(key)).returning({ id: photos.id });
  return rows.length > 0;
}

/**
 * The newest processed photos of one view of a part type (with a preview to draw on; none taken
 * out of its unit as a wrong photo), with their Surface outlines: samples a lead draws the view's
 * zones on. Those with a Surface come first (the stored zones show on them at once), newest first
 * within each. Scoped by workspace on every table.
 */
export async function listSamplePhotos({ workspaceId, partTypeId, viewKey, limit = 12 }: { workspaceId: string; partTypeId: string; viewKey: string; limit?: number }) {
  const rows = await db()
    .select({
      id: photos.id,
      width: photos.width,
      height: photos.height,
      previewWidth: photos.previewWidth,
      previewHeight: photos.previewHeight,
      createdAt: photos.createdAt,
      serial: units.serial,
      sampleIndex: units.sampleIndex,
      purchaseRef: lots.purchaseRef,
    })
    .from(photos)
    .innerJoin(units, and(eq(units.id, photos.unitId), eq(units.workspaceId, workspaceId)))
    .innerJoin(lots, and(eq(lots.id, units.lotId), eq(lots.workspaceId, workspaceId)))
    .where(
      and(
        eq(photos.workspaceId, workspaceId),
        eq(units.partTypeId, partTypeId),
        eq(photos.viewKey, viewKey),
        eq(photos.status, "ready"),
        isNotNull(photos.previewWidth),
        isNotNull(photos.previewHeight),
        isNull(photos.removedAt),
      ),
    )
    .orderBy(desc(photos.createdAt), desc(photos.id))
    .limit(limit);
  const surfaces = rows.length
    ? await db()
        .select({ photoId: regions.photoId, id: regions.clientId, shape: regions.shape })
        .from(regions)
        .where(
          and(
            eq(regions.workspaceId, workspaceId),
            inArray(
              regions.photoId,
              rows.map((r) => r.id),
            ),
            eq(regions.role, "surface"),
          ),
        )
    : [];
  const samples = rows.map((row) => ({ ...row, surfaces: surfaces.filter((s) => s.photoId === row.id).map((s) => ({ id: s.id, shape: s.shape })) }));
  // A stable sort: the newest-first order is kept within each group.
  return samples.sort((a, b) => Number(b.surfaces.length > 0) - Number(a.surfaces.length > 0));
}
