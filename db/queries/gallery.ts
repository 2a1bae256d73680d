import "server-only";
/**
 * Gallery items: every read and write, scoped by workspace in the WHERE clause. The rules (what a
 * status allows, what publishing needs, who sees drafts) are lib/gallery's; these functions only
 * fetch and store.
 */
import { and, desc, eq, inArray, isNull, lt, or, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, type DbOrTx } from "@/db/client";
import { galleryItems, grades, lots, partTypes, photos, rubricVersions, units, users, type NewGalleryItemRow } from "@/db/schema";
import type { GalleryKind, GalleryStatus } from "@/lib/gallery/rules";
import type { Grade } from "@/lib/grading/rubric-schema";

type ItemKey = { workspaceId: string; itemId: string };

const creators = alias(users, "gallery_creators");

const cardColumns = {
  id: galleryItems.id,
  status: galleryItems.status,
  kind: galleryItems.kind,
  partTypeId: galleryItems.partTypeId,
  partTypeName: partTypes.name,
  viewKey: galleryItems.viewKey,
  grade: galleryItems.grade,
  defectClasses: galleryItems.defectClasses,
  caption: galleryItems.caption,
  regions: galleryItems.regions,
  revision: galleryItems.revision,
  createdAt: galleryItems.createdAt,
  updatedAt: galleryItems.updatedAt,
  photo: {
    id: photos.id,
    status: photos.status,
    width: photos.width,
    height: photos.height,
    previewWidth: photos.previewWidth,
    previewHeight: photos.previewHeight,
    thumbnailWidth: photos.thumbnailWidth,
    thumbnailHeight: photos.thumbnailHeight,
  },
};

function selectCards(tx: DbOrTx) {
  return tx
    .select(cardColumns)
    .from(galleryItems)
    .innerJoin(photos, and(eq(photos.workspaceId, galleryItems.workspaceId), eq(photos.id, galleryItems.photoId)))
    .innerJoin(partTypes, and(eq(partTypes.workspaceId, galleryItems.workspaceId), eq(partTypes.id, galleryItems.partTypeId)));
}

export type GalleryCardRow = Awaited<ReturnType<ReturnType<typeof selectCards>["where"]>>[number];

/** One item with what its page shows (photo size, part type, rubric version number, who made it). */
export async function getGalleryItem({ workspaceId, itemId }: ItemKey, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({
      ...cardColumns,
      rubricVersionId: galleryItems.rubricVersionId,
      rubricVersion: rubricVersions.version,
      sourceUnitId: galleryItems.sourceUnitId,
      createdByName: creators.name,
      publishedAt: galleryItems.publishedAt,
      retiredAt: galleryItems.retiredAt,
      partType: { views: partTypes.views, defectClasses: partTypes.defectClasses, nominalSizeMm: partTypes.nominalSizeMm, panelResolution: partTypes.panelResolution },
    })
    .from(galleryItems)
    .innerJoin(photos, and(eq(photos.workspaceId, galleryItems.workspaceId), eq(photos.id, galleryItems.photoId)))
    .innerJoin(partTypes, and(eq(partTypes.workspaceId, galleryItems.workspaceId), eq(partTypes.id, galleryItems.partTypeId)))
    .innerJoin(creators, eq(creators.id, galleryItems.createdBy))
    .leftJoin(rubricVersions, eq(rubricVersions.id, galleryItems.rubricVersionId))
    .where(and(eq(galleryItems.workspaceId, workspaceId), eq(galleryItems.id, itemId)))
    .limit(1);
  return row ?? null;
}
export type GalleryItemDetailRow = NonNullable<Awaited<ReturnType<typeof getGalleryItem>>>;

/** The item row, locked for the rest of the transaction (edits of one item queue here). */
export async function lockGalleryItem(tx: DbOrTx, { workspaceId, itemId }: ItemKey) {
  const [row] = await tx
    .select()
    .from(galleryItems)
    .where(and(eq(galleryItems.workspaceId, workspaceId), eq(galleryItems.id, itemId)))
    .for("update");
  return row ?? null;
}

export async function insertGalleryItem(tx: DbOrTx, row: NewGalleryItemRow): Promise<string> {
  const [inserted] = await tx.insert(galleryItems).values(row).returning({ id: galleryItems.id });
  return inserted.id;
}

export type GalleryItemPatch = Partial<Pick<NewGalleryItemRow, "caption" | "regions" | "defectClasses" | "grade" | "kind" | "rubricVersionId" | "status" | "publishedBy" | "publishedAt" | "retiredAt">>;

/** Writes `patch`, bumps the revision and stamps who and when (the caller holds the lock). */
export async function updateGalleryItem(tx: DbOrTx, { workspaceId, itemId, actorId, patch }: ItemKey & { actorId: string; patch: GalleryItemPatch }) {
  const [row] = await tx
    .update(galleryItems)
    .set({ ...patch, revision: sql`${galleryItems.revision} + 1`, updatedBy: actorId, updatedAt: sql`now()` })
    .where(and(eq(galleryItems.workspaceId, workspaceId), eq(galleryItems.id, itemId)))
    .returning({ revision: galleryItems.revision });
  return row;
}

export type GalleryListFilters = {
  statuses: readonly GalleryStatus[];
  partTypeId?: string;
  viewKey?: string;
  defectClass?: string;
  kind?: GalleryKind;
  grade?: Grade;
};
export type GalleryListKey = { createdAt: string; id: string };

/** created_at to the microsecond as ISO text: a JS Date keeps only milliseconds, and a cursor must not skip rows. */
const createdAtText = sql<string>`to_char(${galleryItems.createdAt} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`;

/** A page of items, newest first; `after` is the last row of the previous page (keyset). One extra row tells whether more follow. */
export function listGalleryItems({ workspaceId, filters, after, limit }: { workspaceId: string; filters: GalleryListFilters; after?: GalleryListKey; limit: number }) {
  const where: (SQL | undefined)[] = [eq(galleryItems.workspaceId, workspaceId), inArray(galleryItems.status, [...filters.statuses])];
  if (filters.partTypeId) where.push(eq(galleryItems.partTypeId, filters.partTypeId));
  if (filters.viewKey) where.push(eq(galleryItems.viewKey, filters.viewKey));
  if (filters.kind) where.push(eq(galleryItems.kind, filters.kind));
  if (filters.grade) where.push(eq(galleryItems.grade, filters.grade));
  if (filters.defectClass) where.push(sql`${galleryItems.defectClasses} @> ARRAY[${filters.defectClass}]::text[]`);
  if (after) {
    const at = sql`${after.createdAt}::timestamptz`;
    where.push(or(sql`${galleryItems.createdAt} < ${at}`, and(sql`${galleryItems.createdAt} = ${at}`, lt(galleryItems.id, after.id))));
  }
  return db()
    .select({ ...cardColumns, cursorAt: createdAtText })
    .from(galleryItems)
    .innerJoin(photos, and(eq(photos.workspaceId, galleryItems.workspaceId), eq(photos.id, galleryItems.photoId)))
    .innerJoin(partTypes, and(eq(partTypes.workspaceId, galleryItems.workspaceId), eq(partTypes.id, galleryItems.partTypeId)))
    .where(and(...where))
    .orderBy(desc(galleryItems.createdAt), desc(galleryItems.id))
    .limit(limit + 1);
}

/**
 * Published items of one part type and view for the Bench's reference panel, in the panel's
 * order (lib/gallery/rules.ts compareForReference): normal first, then A → Reject, then newest.
 */
export function listReferenceItems({ workspaceId, partTypeId, viewKey, defectClass, limit }: { workspaceId: string; partTypeId: string; viewKey: string; defectClass?: string; limit: number }) {
  const where: (SQL | undefined)[] = [
    eq(galleryItems.workspaceId, workspaceId),
    eq(galleryItems.status, "published"),
    eq(galleryItems.partTypeId, partTypeId),
    eq(galleryItems.viewKey, viewKey),
  ];
  // A class narrows the abnormal items to those showing it; normal items stay as the comparison.
  if (defectClass) where.push(or(eq(galleryItems.kind, "normal"), sql`${galleryItems.defectClasses} @> ARRAY[${defectClass}]::text[]`));
  return selectCards(db())
    .where(and(...where))
    .orderBy(
      sql`CASE ${galleryItems.kind} WHEN 'normal' THEN 0 ELSE 1 END`,
      sql`array_position(ARRAY['A','B','C','Reject']::text[], ${galleryItems.grade})`,
      desc(galleryItems.createdAt),
      galleryItems.id,
    )
    .limit(limit);
}

/** Items (any status) that show this photo: the deletion gate keeps its original while there is one. */
export async function countItemsUsingPhoto(tx: DbOrTx, { workspaceId, photoId }: { workspaceId: string; photoId: string }): Promise<number> {
  const [row] = await tx
    .select({ n: sql<number>`count(*)::int` })
    .from(galleryItems)
    .where(and(eq(galleryItems.workspaceId, workspaceId), eq(galleryItems.photoId, photoId)));
  return row?.n ?? 0;
}

/** Locks the photo row: items are made from one photo one at a time, so a photo never gets two active items. */
export async function lockPhotoForItems(tx: DbOrTx, { workspaceId, photoId }: { workspaceId: string; photoId: string }) {
  const [row] = await tx
    .select({ id: photos.id, status: photos.status })
    .from(photos)
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.id, photoId)))
    .for("update");
  return row ?? null;
}

/** A draft or published item that already shows this photo (promoting it twice makes no second item). */
export async function findActiveItemForPhoto({ workspaceId, photoId }: { workspaceId: string; photoId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ id: galleryItems.id, status: galleryItems.status })
    .from(galleryItems)
    .where(and(eq(galleryItems.workspaceId, workspaceId), eq(galleryItems.photoId, photoId), inArray(galleryItems.status, ["draft", "published"])))
    .limit(1);
  return row ?? null;
}

/** A unit's photo with what promoting it needs: its unit's state, part type and current (latest) grade. */
export async function getUnitPhotoForPromotion({ workspaceId, photoId }: { workspaceId: string; photoId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({
      photo: { id: photos.id, status: photos.status, viewKey: photos.viewKey, removedAt: photos.removedAt },
      unit: { id: units.id, status: units.status, serial: units.serial, sampleIndex: units.sampleIndex },
      purchaseRef: lots.purchaseRef,
      partType: { id: partTypes.id, name: partTypes.name, views: partTypes.views, defectClasses: partTypes.defectClasses },
    })
    .from(photos)
    .innerJoin(units, and(eq(units.workspaceId, photos.workspaceId), eq(units.id, photos.unitId)))
    .innerJoin(lots, eq(lots.id, units.lotId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.id, photoId)))
    .limit(1);
  if (!row) return null;
  const [grade] = await tx
    .select({ finalGrade: grades.finalGrade, rubricVersionId: grades.rubricVersionId })
    .from(grades)
    .where(and(eq(grades.workspaceId, workspaceId), eq(grades.unitId, row.unit.id)))
    .orderBy(desc(grades.createdAt), desc(grades.id))
    .limit(1);
  return { ...row, currentGrade: grade ?? null };
}

/** Units a gallery item was promoted from, with the label the item page shows. */
export async function getSourceUnitLabel({ workspaceId, unitId }: { workspaceId: string; unitId: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ id: units.id, serial: units.serial, sampleIndex: units.sampleIndex, purchaseRef: lots.purchaseRef })
    .from(units)
    .innerJoin(lots, eq(lots.id, units.lotId))
    .where(and(eq(units.workspaceId, workspaceId), eq(units.id, unitId)))
    .limit(1);
  return row ?? null;
}

/**
 * Gallery uploads (photos without a unit) that no item names, older than `before`: an upload
 * whose item was never made (the browser went away while the photo was processed, or processing
 * failed). The orphan sweep removes them.
 */
export function listUnusedGalleryPhotos({ before, limit }: { before: Date; limit: number }, tx: DbOrTx = db()) {
  return tx
    .select({ id: photos.id, workspaceId: photos.workspaceId })
    .from(photos)
    .where(
      and(
        isNull(photos.unitId),
        lt(photos.createdAt, before),
        sql`NOT EXISTS (SELECT 1 FROM ${galleryItems} WHERE ${galleryItems.workspaceId} = ${photos.workspaceId} AND ${galleryItems.photoId} = ${photos.id})`,
      ),
    )
    .limit(limit);
}

/** Deletes such a photo row if still no item names it; returns its object keys (null: kept). */
export async function deleteUnusedGalleryPhoto(tx: DbOrTx, { workspaceId, photoId }: { workspaceId: string; photoId: string }) {
  const [row] = await tx
    .delete(photos)
    .where(
      and(
        eq(photos.workspaceId, workspaceId),
        eq(photos.id, photoId),
        isNull(photos.unitId),
        sql`NOT EXISTS (SELECT 1 FROM ${galleryItems} WHERE ${galleryItems.workspaceId} = ${photos.workspaceId} AND ${galleryItems.photoId} = ${photos.id})`,
      ),
    )
    .returning({ originalKey: photos.originalKey, previewKey: photos.previewKey, thumbnailKey: photos.thumbnailKey });
  return row ?? null;
}
