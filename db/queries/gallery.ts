import "server-only";
/**
 * Gallery items: every read and write, scoped by workspace in the WHERE clause. The rules (what a
 * status allows, what publishing needs, who sees drafts) are lib/gallery's; these functions only
 * fetch and store.
 */
import { and, desc, eq, inArray, isNull, lt, or, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { db, executePrepared, type DbOrTx } from "@/db/client";
import { galleryItems, grades, lots, partTypes, photos, rubricVersions, units, users, type NewGalleryItemRow } from "@/db/schema";
import type { GalleryKind, GalleryStatus } from "@/lib/gallery/rules";
import type { Grade } from "@/lib/grading/rubric-schema";

type ItemKey = { workspaceId: string; itemId: string };

/**
 * Not an item of a calibration set assigned to `readerId` that they have not submitted yet: a
 * set's key is its items' regions, grade and caption, so until the attempt is submitted the taker
 * meets those items nowhere in the Gallery (lib/calibration/attempts.ts, "blind").
 */
const notKeyFor = (readerId: string, workspaceId: SQL, itemId: SQL) => sql`NOT EXISTS (
  SELECT 1 FROM calibration_set_items si
  JOIN calibration_assignments a ON a.workspace_id = si.workspace_id AND a.set_id = si.set_id AND a.user_id = ${readerId}::uuid
  LEFT JOIN calibration_attempts t ON t.workspace_id = a.workspace_id AND t.assignment_id = a.id
  WHERE si.workspace_id = ${workspaceId} AND si.gallery_item_id = ${itemId} AND t.submitted_at IS NULL)`;

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
export async function getGalleryItem({ workspaceId, itemId, readerId }: ItemKey & { readerId?: string }, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({
      ...cardColumns,
      rubricVersionId: galleryItems.rubricVersionId,
      rubricVersion: rubricVersions.version,
      sourceUnitId: galleryItems.sourceUnitId,
      sourceUnitAwaitsRecheck: sql<boolean>`EXISTS (SELECT 1 FROM rechecks r WHERE r.workspace_id = ${galleryItems.workspaceId} AND r.unit_id = ${galleryItems.sourceUnitId} AND r.status = 'waiting')`,
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
    .where(and(eq(galleryItems.workspaceId, workspaceId), eq(galleryItems.id, itemId), readerId ? notKeyFor(readerId, sql`${galleryItems.workspaceId}`, sql`${galleryItems.id}`) : undefined))
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

export type GalleryItemPatch = Partial<
  Pick<NewGalleryItemRow, "caption" | "regions" | "defectClasses" | "grade" | "kind" | "rubricVersionId" | "status" | "publishedBy" | "publishedAt" | "retiredAt">
>;

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
  /** Leave out items promoted from a unit whose recheck is still waiting (blind readers, lib/gallery/access.ts). */
  hideUnitsAwaitingRecheck?: boolean;
};
export type GalleryListKey = { createdAt: string; id: string };

/** A status as a literal: a generic plan cannot read a parameter's value, and these are fixed words. */
const STATUS_LITERALS: Record<GalleryStatus, SQL> = { draft: sql.raw("'draft'"), published: sql.raw("'published'"), retired: sql.raw("'retired'") };

/** A listed item: its card as JSON text (the GalleryCardDto, see galleryCardJson) and its keyset. */
type ListRow = {
  id: string;
  /** created_at to the microsecond as ISO text: a JS Date keeps only milliseconds, and a cursor must not skip rows. */
  cursor_at: string;
  card: string;
};

/** A timestamp as JavaScript's toISOString writes it (UTC, milliseconds, "Z"). */
const isoMillis = (column: SQL) => sql`to_char(${column} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;
const sizeJson = (width: SQL, height: SQL) => sql`CASE WHEN ${width} IS NOT NULL AND ${height} IS NOT NULL THEN json_build_object('width', ${width}, 'height', ${height}) END`;

/**
 * The card of a listed item built by PostgreSQL, in exactly the shape toGalleryCardDto
 * (lib/gallery/dto.ts) makes of a row — tests/integration/gallery-browse.test.ts compares the two
 * for every listed item. The list is the Gallery's hot read: parsing 48 cards' region sets into
 * objects and writing them out again cost the app about half its CPU per page (bench/gallery-list.ts),
 * so the list's cards go from the database to the answer as text.
 */
const galleryCardJson = sql`json_build_object(
  'id', g.id, 'status', g.status, 'kind', g.kind,
  'partType', json_build_object('id', g.part_type_id, 'name', pt.name),
  'viewKey', g.view_key, 'grade', g.grade, 'defectClasses', g.defect_classes, 'caption', g.caption, 'regions', g.regions,
  'revision', g.revision, 'createdAt', ${isoMillis(sql`g.created_at`)}, 'updatedAt', ${isoMillis(sql`g.updated_at`)},
  'photo', json_build_object(
    'id', p.id, 'ready', p.status = 'ready',
    'original', ${sizeJson(sql`p.width`, sql`p.height`)},
    'preview', ${sizeJson(sql`p.preview_width`, sql`p.preview_height`)},
    'thumbnail', ${sizeJson(sql`p.thumbnail_width`, sql`p.thumbnail_height`)},
    'urls', CASE WHEN p.status = 'ready' THEN json_build_object('thumbnail', '/api/photos/' || p.id || '/thumbnail', 'preview', '/api/photos/' || p.id || '/preview') END))::text`;

/**
 * A page of items, newest first, as card JSON texts; `after` is the last row of the previous page
 * (keyset). One extra row tells whether more follow. The hot read of the Gallery, so a prepared
 * statement (planned once per connection, see executePrepared) of the queue list's shape: the page
 * is cut from gallery_items alone by walking gallery_items_list_idx in its order — the keyset a row
 * comparison, an index condition; the ORDER BY with the index's NULLS LAST, or PostgreSQL sorts
 * every item of the workspace for each page — and only those rows are joined.
 */
export async function listGalleryCards({
  workspaceId,
  readerId,
  filters,
  after,
  limit,
}: {
  workspaceId: string;
  readerId: string;
  filters: GalleryListFilters;
  after?: GalleryListKey;
  limit: number;
}): Promise<{ id: string; cursorAt: string; card: string }[]> {
  const statuses = sql.join(
    filters.statuses.map((s) => STATUS_LITERALS[s]),
    sql`, `,
  );
  const conditions = [
    filters.partTypeId ? sql`AND g.part_type_id = ${filters.partTypeId}::uuid` : sql``,
    filters.viewKey ? sql`AND g.view_key = ${filters.viewKey}` : sql``,
    filters.kind ? sql`AND g.kind = ${filters.kind}` : sql``,
    filters.grade ? sql`AND g.grade = ${filters.grade}` : sql``,
    filters.defectClass ? sql`AND g.defect_classes @> ARRAY[${filters.defectClass}]::text[]` : sql``,
    filters.hideUnitsAwaitingRecheck ? sql`AND NOT EXISTS (SELECT 1 FROM rechecks r WHERE r.workspace_id = g.workspace_id AND r.unit_id = g.source_unit_id AND r.status = 'waiting')` : sql``,
    after ? sql`AND (g.created_at, g.id) < (${after.createdAt}::timestamptz, ${after.id}::uuid)` : sql``,
  ];
  const { rows } = await executePrepared<ListRow>(sql`
    WITH page AS MATERIALIZED (
      SELECT g.* FROM gallery_items g
      WHERE g.workspace_id = ${workspaceId}::uuid AND g.status IN (${statuses}) ${sql.join(conditions, sql` `)}
        AND ${notKeyFor(readerId, sql`g.workspace_id`, sql`g.id`)}
      ORDER BY g.created_at DESC NULLS LAST, g.id DESC NULLS LAST
      LIMIT ${limit + 1}
    )
    SELECT g.id, to_char(g.created_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') AS cursor_at, ${galleryCardJson} AS card
    FROM page g
    JOIN photos p ON p.workspace_id = g.workspace_id AND p.id = g.photo_id
    JOIN part_types pt ON pt.workspace_id = g.workspace_id AND pt.id = g.part_type_id
    ORDER BY g.created_at DESC NULLS LAST, g.id DESC NULLS LAST`);
  return rows.map((r) => ({ id: r.id, cursorAt: r.cursor_at, card: r.card }));
}

/**
 * Published items of one part type and view for the Bench's reference panel, in the panel's
 * order (lib/gallery/rules.ts compareForReference): normal first, then A → Reject, then newest.
 */
export function listReferenceItems({
  workspaceId,
  readerId,
  partTypeId,
  viewKey,
  defectClass,
  limit,
  hideUnitsAwaitingRecheck,
}: {
  workspaceId: string;
  readerId: string;
  partTypeId: string;
  viewKey: string;
  defectClass?: string;
  limit: number;
  hideUnitsAwaitingRecheck?: boolean;
}) {
  const where: (SQL | undefined)[] = [
    eq(galleryItems.workspaceId, workspaceId),
    eq(galleryItems.status, "published"),
    eq(galleryItems.partTypeId, partTypeId),
    eq(galleryItems.viewKey, viewKey),
    notKeyFor(readerId, sql`${galleryItems.workspaceId}`, sql`${galleryItems.id}`),
  ];
  // A class narrows the abnormal items to those showing it; normal items stay as the comparison.
  if (defectClass) where.push(or(eq(galleryItems.kind, "normal"), sql`${galleryItems.defectClasses} @> ARRAY[${defectClass}]::text[]`));
  if (hideUnitsAwaitingRecheck)
    where.push(sql`NOT EXISTS (SELECT 1 FROM rechecks r WHERE r.workspace_id = ${galleryItems.workspaceId} AND r.unit_id = ${galleryItems.sourceUnitId} AND r.status = 'waiting')`);
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

/** Recently graded units (with their current grade), newest grade first: where trainers find photos to promote. */
export function listRecentlyGradedUnits({ workspaceId, limit }: { workspaceId: string; limit: number }) {
  const latest = db()
    .selectDistinctOn([grades.unitId], { unitId: grades.unitId, finalGrade: grades.finalGrade, gradedAt: grades.createdAt })
    .from(grades)
    .where(eq(grades.workspaceId, workspaceId))
    .orderBy(grades.unitId, desc(grades.createdAt), desc(grades.id))
    .as("latest_grade");
  return db()
    .select({ id: units.id, serial: units.serial, sampleIndex: units.sampleIndex, purchaseRef: lots.purchaseRef, partTypeName: partTypes.name, grade: latest.finalGrade, gradedAt: latest.gradedAt })
    .from(units)
    .innerJoin(latest, eq(latest.unitId, units.id))
    .innerJoin(lots, eq(lots.id, units.lotId))
    .innerJoin(partTypes, eq(partTypes.id, units.partTypeId))
    .where(and(eq(units.workspaceId, workspaceId), inArray(units.status, ["graded", "in_recheck", "final"])))
    .orderBy(desc(latest.gradedAt))
    .limit(limit);
}
