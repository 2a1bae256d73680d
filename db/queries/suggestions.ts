import "server-only";
/**
 * Learned suggestions: the rows training reads (accepted regions of graded units and published
 * gallery items, dismissed ghosts), the stored models and the inspectors' decisions. Every query
 * names the workspace in its WHERE clause; what counts as accepted and when to train is decided
 * in lib/suggestions, which passes the statuses in.
 */
import { and, desc, eq, inArray, isNull, max, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { galleryItems, photos, regions, suggestionDecisions, suggestionModels, units, type UnitStatus } from "@/db/schema";
import type { Shape } from "@/lib/geometry/shape";
import type { RegionSetPayload } from "@/lib/geometry/validate";

export type TrainingPhotoRow = {
  photoId: string;
  previewKey: string;
  width: number;
  height: number;
  previewWidth: number;
  previewHeight: number;
};

const readyPhoto = (workspaceId: string) => and(eq(photos.workspaceId, workspaceId), eq(photos.status, "ready"), isNull(photos.removedAt), sql`${photos.previewKey} IS NOT NULL`);

const photoColumns = {
  photoId: photos.id,
  previewKey: sql<string>`${photos.previewKey}`,
  width: sql<number>`${photos.width}`,
  height: sql<number>`${photos.height}`,
  previewWidth: sql<number>`coalesce(${photos.previewWidth}, ${photos.width})`,
  previewHeight: sql<number>`coalesce(${photos.previewHeight}, ${photos.height})`,
};

/** Ready photos of the workspace's units in `statuses` that have at least one region (any role). */
export async function unitTrainingPhotos(workspaceId: string, statuses: readonly UnitStatus[], tx: DbOrTx = db()): Promise<TrainingPhotoRow[]> {
  return tx
    .select(photoColumns)
    .from(photos)
    .innerJoin(units, and(eq(units.workspaceId, photos.workspaceId), eq(units.id, photos.unitId)))
    .where(
      and(
        readyPhoto(workspaceId),
        inArray(units.status, [...statuses]),
        sql`EXISTS (SELECT 1 FROM ${regions} WHERE ${regions.workspaceId} = ${photos.workspaceId} AND ${regions.photoId} = ${photos.id})`,
      ),
    )
    .orderBy(photos.id);
}

/** Defect and Surface regions of these photos (of this workspace only). */
export async function regionsOfPhotos(workspaceId: string, photoIds: readonly string[], tx: DbOrTx = db()) {
  if (photoIds.length === 0) return [];
  return tx
    .select({ photoId: regions.photoId, role: regions.role, defectClass: regions.defectClass, shape: sql<Shape>`${regions.shape}` })
    .from(regions)
    .where(and(eq(regions.workspaceId, workspaceId), inArray(regions.photoId, [...photoIds]), inArray(regions.role, ["defect", "surface"])))
    .orderBy(regions.photoId, regions.position);
}

/** Published gallery items with a ready photo: their own copy of the regions. */
export async function galleryTrainingPhotos(workspaceId: string, tx: DbOrTx = db()): Promise<(TrainingPhotoRow & { regions: RegionSetPayload })[]> {
  return tx
    .select({ ...photoColumns, regions: galleryItems.regions })
    .from(galleryItems)
    .innerJoin(photos, and(eq(photos.workspaceId, galleryItems.workspaceId), eq(photos.id, galleryItems.photoId)))
    .where(and(eq(galleryItems.workspaceId, workspaceId), eq(galleryItems.status, "published"), readyPhoto(workspaceId)))
    .orderBy(galleryItems.createdAt, galleryItems.id);
}

/** Ready photos with dismissed ghosts, and the dismissed shapes. */
export async function dismissedGhosts(workspaceId: string, tx: DbOrTx = db()) {
  return tx
    .select({ ...photoColumns, shape: suggestionDecisions.shape })
    .from(suggestionDecisions)
    .innerJoin(photos, and(eq(photos.workspaceId, suggestionDecisions.workspaceId), eq(photos.id, suggestionDecisions.photoId)))
    .where(and(eq(suggestionDecisions.workspaceId, workspaceId), eq(suggestionDecisions.decision, "dismissed"), readyPhoto(workspaceId)))
    .orderBy(photos.id, suggestionDecisions.decidedAt);
}

/** Workspaces with accepted defect regions, how many, and how many the latest model was trained on. */
export async function acceptedRegionTotals(statuses: readonly UnitStatus[], tx: DbOrTx = db()): Promise<{ workspaceId: string; accepted: number; lastTrainedOn: number | null }[]> {
  const statusList = sql.join(
    statuses.map((s) => sql`${s}`),
    sql`, `,
  );
  const result = await tx.execute<{ workspace_id: string; accepted: string; last_trained_on: string | null }>(sql`
    WITH unit_regions AS (
      SELECT r.workspace_id, count(*) AS n
        FROM regions r
        JOIN photos p ON p.workspace_id = r.workspace_id AND p.id = r.photo_id
        JOIN units u ON u.workspace_id = p.workspace_id AND u.id = p.unit_id
       WHERE r.role = 'defect' AND p.status = 'ready' AND p.removed_at IS NULL AND u.status IN (${statusList})
       GROUP BY r.workspace_id
    ), gallery_regions AS (
      SELECT g.workspace_id, sum(jsonb_array_length(g.regions -> 'regions')) AS n
        FROM gallery_items g
       WHERE g.status = 'published'
       GROUP BY g.workspace_id
    ), totals AS (
      SELECT workspace_id, sum(n) AS accepted FROM (SELECT * FROM unit_regions UNION ALL SELECT * FROM gallery_regions) s GROUP BY workspace_id
    )
    SELECT t.workspace_id, t.accepted,
           (SELECT (m.sources ->> 'acceptedRegions') FROM suggestion_models m WHERE m.workspace_id = t.workspace_id ORDER BY m.version DESC LIMIT 1) AS last_trained_on
      FROM totals t`);
  return result.rows.map((r) => ({ workspaceId: r.workspace_id, accepted: Number(r.accepted), lastTrainedOn: r.last_trained_on === null ? null : Number(r.last_trained_on) }));
}

/** The model in use (with its JSON), or null. */
export async function modelInUse(workspaceId: string, tx: DbOrTx = db()) {
  const [row] = await tx
    .select()
    .from(suggestionModels)
    .where(and(eq(suggestionModels.workspaceId, workspaceId), eq(suggestionModels.inUse, true)));
  return row ?? null;
}

/** One model of the workspace (without its JSON), or null for another workspace's or a missing id. */
export async function modelOfWorkspace(workspaceId: string, modelId: string, tx: DbOrTx = db()) {
  const [row] = await tx
    .select({ id: suggestionModels.id, version: suggestionModels.version })
    .from(suggestionModels)
    .where(and(eq(suggestionModels.workspaceId, workspaceId), eq(suggestionModels.id, modelId)));
  return row ?? null;
}

export type NewModel = Omit<typeof suggestionModels.$inferInsert, "id" | "version" | "workspaceId" | "inUse" | "createdAt">;

/**
 * Stores a trained model as the workspace's next version; with `switchIn`, it becomes the one in
 * use (the previous one is switched out first: the partial unique index allows one).
 */
export async function insertModel(tx: DbOrTx, workspaceId: string, values: NewModel, switchIn: boolean) {
  const [{ latest }] = await tx
    .select({ latest: max(suggestionModels.version) })
    .from(suggestionModels)
    .where(eq(suggestionModels.workspaceId, workspaceId));
  if (switchIn)
    await tx
      .update(suggestionModels)
      .set({ inUse: false })
      .where(and(eq(suggestionModels.workspaceId, workspaceId), eq(suggestionModels.inUse, true)));
  const [row] = await tx
    .insert(suggestionModels)
    .values({ ...values, workspaceId, version: (latest ?? 0) + 1, inUse: switchIn })
    .returning({ id: suggestionModels.id, version: suggestionModels.version, inUse: suggestionModels.inUse });
  return row;
}

/** The workspace's models, newest first, without the model JSON. */
export async function listModels(workspaceId: string, limit = 50, tx: DbOrTx = db()) {
  return tx
    .select({
      id: suggestionModels.id,
      version: suggestionModels.version,
      inUse: suggestionModels.inUse,
      classCounts: suggestionModels.classCounts,
      sources: suggestionModels.sources,
      evaluation: suggestionModels.evaluation,
      suggestable: suggestionModels.suggestable,
      decision: suggestionModels.decision,
      trainingMs: suggestionModels.trainingMs,
      requestedBy: suggestionModels.requestedBy,
      createdAt: suggestionModels.createdAt,
    })
    .from(suggestionModels)
    .where(eq(suggestionModels.workspaceId, workspaceId))
    .orderBy(desc(suggestionModels.version))
    .limit(limit);
}

export type NewDecision = Omit<typeof suggestionDecisions.$inferInsert, "id" | "decidedAt">;

export async function insertDecisions(tx: DbOrTx, rows: NewDecision[]) {
  if (rows.length === 0) return [];
  return tx.insert(suggestionDecisions).values(rows).returning({ id: suggestionDecisions.id, decision: suggestionDecisions.decision, defectClass: suggestionDecisions.defectClass });
}

/** A photo's recorded decisions, oldest first. */
export async function decisionsForPhoto(workspaceId: string, photoId: string, tx: DbOrTx = db()) {
  return tx
    .select()
    .from(suggestionDecisions)
    .where(and(eq(suggestionDecisions.workspaceId, workspaceId), eq(suggestionDecisions.photoId, photoId)))
    .orderBy(suggestionDecisions.decidedAt, suggestionDecisions.id);
}
