import "server-only";
/**
 * The photo worker's and the orphan sweep's writes (and the retry and dismissal of a failed
 * upload). Each update names the status it expects in its WHERE clause, so a replayed job, a
 * dismissal or a sweep running at the same time changes nothing it should not.
 */
import { and, eq, inArray, isNull, lt, sql } from "drizzle-orm";
import { db, type DbOrTx } from "@/db/client";
import { photos, type NewPhoto, type Photo } from "@/db/schema";

type PhotoKey = { workspaceId: string; photoId: string };

/** Takes a queued (or interrupted) photo for processing and counts the attempt; null when it is gone or settled. */
export async function claimPhotoForProcessing(photoId: string): Promise<Photo | null> {
  const [row] = await db()
    .update(photos)
    .set({ status: "processing", attempts: sql`${photos.attempts} + 1`, updatedAt: new Date() })
    .where(and(eq(photos.id, photoId), inArray(photos.status, ["queued", "processing"])))
    .returning();
  return row ?? null;
}

/** Stores the outcome of a processing attempt; false when the photo is no longer being processed (dismissed meanwhile). */
export async function updateProcessingPhoto(photoId: string, values: Partial<Omit<NewPhoto, "id" | "workspaceId">>, tx: DbOrTx = db()): Promise<boolean> {
  const rows = await tx
    .update(photos)
    .set({ ...values, updatedAt: new Date() })
    .where(and(eq(photos.id, photoId), eq(photos.status, "processing")))
    .returning({ id: photos.id });
  return rows.length > 0;
}

/** A failed photo goes back to the queue with its notice cleared; false when it is no longer failed. */
export async function requeueFailedPhoto(tx: DbOrTx, { workspaceId, photoId }: PhotoKey): Promise<boolean> {
  const rows = await tx
    .update(photos)
    .set({ status: "queued", failureCode: null, failureReason: null, lastError: null, updatedAt: new Date() })
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.id, photoId), eq(photos.status, "failed")))
    .returning({ id: photos.id });
  return rows.length > 0;
}

/** Deletes a failed upload's row; false when it is no longer failed. */
export async function deleteFailedPhoto(tx: DbOrTx, { workspaceId, photoId }: PhotoKey): Promise<boolean> {
  const rows = await tx
    .delete(photos)
    .where(and(eq(photos.workspaceId, workspaceId), eq(photos.id, photoId), eq(photos.status, "failed")))
    .returning({ id: photos.id });
  return rows.length > 0;
}

/** Deletes a refusal notice (failed, original already gone) of one photo, by id. */
export async function deleteRefusalNotice(photoId: string) {
  await db()
    .delete(photos)
    .where(and(eq(photos.id, photoId), eq(photos.status, "failed"), isNull(photos.originalKey)));
}

/** Refusal notices (failed, no original) last changed before `before`: deleted; returns how many. */
export async function deleteRefusalNoticesBefore(before: Date): Promise<number> {
  const removed = await db()
    .delete(photos)
    .where(and(eq(photos.status, "failed"), isNull(photos.originalKey), lt(photos.updatedAt, before)))
    .returning({ id: photos.id });
  return removed.length;
}

/** Photos queued or processing with no change since `before` are marked failed with `reason`; returns how many. */
export async function failStalledPhotos({ before, at, reason }: { before: Date; at: Date; reason: string }): Promise<number> {
  const stalled = await db()
    .update(photos)
    .set({ status: "failed", failureCode: "processing_failed", failureReason: reason, updatedAt: at })
    .where(and(inArray(photos.status, ["queued", "processing"]), lt(photos.updatedAt, before)))
    .returning({ id: photos.id });
  return stalled.length;
}

/** The object keys the rows of these photos name (any workspace: the sweep reads the whole store). */
export function listPhotoObjectKeys(photoIds: string[]) {
  return db()
    .select({ id: photos.id, workspaceId: photos.workspaceId, originalKey: photos.originalKey, previewKey: photos.previewKey, thumbnailKey: photos.thumbnailKey })
    .from(photos)
    .where(inArray(photos.id, photoIds));
}
