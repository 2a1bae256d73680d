import "server-only";
/**
 * The scheduled orphan sweep (pg-boss queue photo-sweep). Deletes, once older than the grace
 * period: staging objects (uploads never finalised, or finalised without their clean-up), and
 * photo objects that no row names (a finalise that failed after its copy, derivatives of a
 * dismissed photo, a refused original whose delete failed). Also drops the failure notices of
 * refused files after their retention, and marks photos whose job was lost (queued or processing
 * with no progress for PHOTO_STALLED_HOURS) as failed, so Retry is offered instead of a spinner
 * forever. Gallery uploads that no gallery item names (the browser left before the item was made)
 * are removed after the grace period too. Objects with keys this app never writes are left alone.
 * Every original goes through the deletion gate first (lib/photos/deletion.ts).
 */
import { transaction } from "@/db/client";
import { deleteUnusedGalleryPhoto, listUnusedGalleryPhotos } from "@/db/queries/gallery";
import { deleteRefusalNoticesBefore, failStalledPhotos, listPhotoObjectKeys } from "@/db/queries/photo-processing";
import { deleteObject, listObjects, objectStore, type ListedObject, type ObjectStore } from "@/lib/storage/s3";
import { photoSettings } from "./config";
import { ORIGINAL_DELETION_CHECKS, originalDeletionBlockers, type OriginalDeletionCheck } from "./deletion";
import { parsePhotoKey, PHOTOS_PREFIX, STAGING_PREFIX } from "./object-keys";

export type SweepReport = { scanned: number; deleted: string[]; kept: number; blocked: string[]; noticesRemoved: number; stalledMarked: number; galleryUploadsRemoved: number };

export type SweepOptions = {
  store?: ObjectStore;
  now?: Date;
  graceMs?: number;
  noticeRetentionMs?: number;
  stalledMs?: number;
  checks?: readonly OriginalDeletionCheck[];
};

const BATCH = 500;

export async function sweepOrphans(options: SweepOptions = {}): Promise<SweepReport> {
  const settings = photoSettings();
  const { store = objectStore(), now = new Date(), checks = ORIGINAL_DELETION_CHECKS } = options;
  const graceMs = options.graceMs ?? settings.PHOTO_ORPHAN_GRACE_HOURS * 3_600_000;
  const noticeRetentionMs = options.noticeRetentionMs ?? settings.PHOTO_FAILED_RETENTION_HOURS * 3_600_000;
  const stalledMs = options.stalledMs ?? settings.PHOTO_STALLED_HOURS * 3_600_000;
  const cutoff = now.getTime() - graceMs;
  const report: SweepReport = { scanned: 0, deleted: [], kept: 0, blocked: [], noticesRemoved: 0, stalledMarked: 0, galleryUploadsRemoved: 0 };
  await sweepUnusedGalleryUploads(store, new Date(cutoff), checks, report);

  for await (const object of listObjects(store, STAGING_PREFIX)) {
    report.scanned++;
    // A staging object is never named by a row; past the grace its ticket has long expired.
    if (parsePhotoKey(object.key)?.kind === "staging" && object.lastModified.getTime() < cutoff) {
      await deleteObject(store, object.key);
      report.deleted.push(object.key);
    } else report.kept++;
  }

  let batch: ListedObject[] = [];
  for await (const object of listObjects(store, PHOTOS_PREFIX)) {
    report.scanned++;
    if (parsePhotoKey(object.key) && object.lastModified.getTime() < cutoff) batch.push(object);
    else report.kept++;
    if (batch.length === BATCH) {
      await sweepPhotoObjects(store, batch, checks, report);
      batch = [];
    }
  }
  if (batch.length) await sweepPhotoObjects(store, batch, checks, report);

  report.noticesRemoved = await deleteRefusalNoticesBefore(new Date(now.getTime() - noticeRetentionMs));
  report.stalledMarked = await failStalledPhotos({
    before: new Date(now.getTime() - stalledMs),
    at: now,
    reason: "Processing this photo did not finish. Press Retry; the original is kept.",
  });
  return report;
}

async function sweepPhotoObjects(store: ObjectStore, objects: ListedObject[], checks: readonly OriginalDeletionCheck[], report: SweepReport) {
  const parsed = objects.map((o) => ({ object: o, key: parsePhotoKey(o.key)! }));
  const ids = [...new Set(parsed.map((p) => p.key.photoId))];
  const rows = await listPhotoObjectKeys(ids);
  const named = new Set(rows.flatMap((r) => [r.originalKey, r.previewKey, r.thumbnailKey]).filter((k): k is string => k !== null));
  for (const { object, key } of parsed) {
    if (named.has(object.key)) {
      report.kept++;
      continue;
    }
    if (key.kind === "original") {
      const reasons = await transaction((tx) => originalDeletionBlockers(tx, { workspaceId: key.workspaceId, photoId: key.photoId }, checks), { accessMode: "read only" });
      if (reasons.length) {
        report.blocked.push(object.key);
        continue;
      }
    }
    await deleteObject(store, object.key);
    report.deleted.push(object.key);
  }
}

/** Gallery uploads no item names, past the grace: row and objects go, each original through the gate. */
async function sweepUnusedGalleryUploads(store: ObjectStore, before: Date, checks: readonly OriginalDeletionCheck[], report: SweepReport) {
  for (const photo of await listUnusedGalleryPhotos({ before, limit: BATCH })) {
    const ref = { workspaceId: photo.workspaceId, photoId: photo.id };
    const keys = await transaction(async (tx) => {
      if ((await originalDeletionBlockers(tx, ref, checks)).length) return null;
      // Deletes only while no item names it: an item made meanwhile keeps the photo (and its key lock waits for this).
      return deleteUnusedGalleryPhoto(tx, ref);
    });
    if (!keys) continue;
    report.galleryUploadsRemoved++;
    for (const key of [keys.originalKey, keys.previewKey, keys.thumbnailKey]) {
      if (!key) continue;
      await deleteObject(store, key);
      report.deleted.push(key);
    }
  }
}
