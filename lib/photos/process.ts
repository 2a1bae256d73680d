import "server-only";
/**
 * Processing one photo: the body of the worker's photo-process job (the seed calls it directly).
 * Reads the accepted original, lets normalizePhoto validate it and make the upright, metadata-free
 * derivatives, stores them, and records the numbers. A refused file is removed at once (its row
 * stays as a failure notice with the reason); any other failure is retried by pg-boss with
 * backoff, and only the last attempt marks the photo failed (its original kept, so Retry works).
 */
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { claimPhotoForProcessing, updateProcessingPhoto } from "@/db/queries/photo-processing";
import type { Photo } from "@/db/schema";
import { normalizePhoto, PhotoRejectedError, type NormalizedPhoto } from "@/lib/imaging/normalize";
import { deleteObject, getObjectBuffer, ObjectStoreUnavailableError, objectStore, putObject, type ObjectStore } from "@/lib/storage/s3";
import { assertOriginalDeletable } from "./deletion";
import { previewKey, thumbnailKey } from "./object-keys";
import { getPhotoById } from "@/db/queries/photos";

export type ProcessOutcome = "ready" | "rejected" | "gone" | "already_done";

export type ProcessOptions = { store?: ObjectStore; /** No retry follows this attempt (pg-boss's last, or a direct call). */ isLastAttempt?: boolean };

export async function processPhoto(photoId: string, { store = objectStore(), isLastAttempt = true }: ProcessOptions = {}): Promise<ProcessOutcome> {
  // Null when the photo is gone or already settled (a replayed job).
  const photo = await claimPhotoForProcessing(photoId);
  if (!photo) return (await getPhotoById(photoId)) ? "already_done" : "gone";
  try {
    const original = await getObjectBuffer(store, photo.originalKey!);
    if (!original) throw new Error(`the original ${photo.originalKey} is missing from the photo store`);
    let normalized: NormalizedPhoto;
    try {
      normalized = await normalizePhoto(original);
    } catch (err) {
      if (err instanceof PhotoRejectedError) return await reject(store, photo, err);
      throw err;
    }
    // The key is written once by finalise and never exposed, so this means damage in the store.
    if (normalized.sha256 !== photo.sha256) throw new Error(`the stored original of photo ${photo.id} no longer matches its SHA-256`);
    return await markReady(store, photo, normalized);
  } catch (err) {
    await markAttemptFailed(photo, err, isLastAttempt);
    throw err;
  }
}

async function reject(store: ObjectStore, photo: Photo, rejection: PhotoRejectedError): Promise<ProcessOutcome> {
  const ref = { workspaceId: photo.workspaceId, photoId: photo.id };
  await transaction(async (tx) => {
    await assertOriginalDeletable(tx, ref);
    await updateProcessingPhoto(photo.id, { status: "failed", failureCode: rejection.code, failureReason: rejection.message, originalKey: null, lastError: null, processedAt: new Date() }, tx);
    await logActivity(tx, {
      workspaceId: photo.workspaceId,
      actorId: null,
      action: "photo.rejected",
      subjectType: "photo",
      subjectId: photo.id,
      detail: { unitId: photo.unitId, code: rejection.code, uploadedBy: photo.uploadedBy },
    });
  });
  // The row no longer names the key; if this delete fails the orphan sweep removes the object.
  await deleteObject(store, photo.originalKey!).catch((err) => console.error(`Could not delete refused original of photo ${photo.id}`, err));
  return "rejected";
}

async function markReady(store: ObjectStore, photo: Photo, n: NormalizedPhoto): Promise<ProcessOutcome> {
  const owner = { workspaceId: photo.workspaceId, unitId: photo.unitId, photoId: photo.id };
  const keys = { preview: previewKey(owner), thumbnail: thumbnailKey(owner) };
  // Derivatives first: a row marked ready always has its objects. Same keys on a retry, so no duplicates.
  await putObject(store, keys.preview, n.preview, { contentType: "image/webp" });
  await putObject(store, keys.thumbnail, n.thumbnail, { contentType: "image/webp" });
  const updated = await transaction(async (tx) => {
    const marked = await updateProcessingPhoto(
      photo.id,
      {
        status: "ready",
        previewKey: keys.preview,
        thumbnailKey: keys.thumbnail,
        format: n.format,
        width: n.width,
        height: n.height,
        orientation: n.orientation,
        previewWidth: n.previewWidth,
        previewHeight: n.previewHeight,
        thumbnailWidth: n.thumbnailWidth,
        thumbnailHeight: n.thumbnailHeight,
        captureTime: n.captureTime,
        captureTimeOffset: n.captureTimeOffset,
        lastError: null,
        processedAt: new Date(),
      },
      tx,
    );
    if (marked) {
      await logActivity(tx, {
        workspaceId: photo.workspaceId,
        actorId: null,
        action: "photo.processed",
        subjectType: "photo",
        subjectId: photo.id,
        detail: { unitId: photo.unitId, format: n.format, width: n.width, height: n.height },
      });
    }
    return marked;
  });
  if (!updated) {
    // Dismissed while we worked: leave nothing behind.
    await Promise.allSettled([deleteObject(store, keys.preview), deleteObject(store, keys.thumbnail)]);
    return "gone";
  }
  return "ready";
}

function describe(err: unknown, isLastAttempt: boolean): { lastError: string; reason: string } {
  if (err instanceof ObjectStoreUnavailableError) {
    return {
      lastError: "The photo store is not reachable; processing will be retried.",
      reason: "The photo store was not reachable while this photo was being processed. Press Retry once it is back; the original is kept.",
    };
  }
  return {
    lastError: isLastAttempt ? "Processing failed." : "Processing failed; it will be retried.",
    reason: "Processing this photo failed. Press Retry; if it keeps failing, tell your QC lead.",
  };
}

async function markAttemptFailed(photo: Photo, err: unknown, isLastAttempt: boolean) {
  const { lastError, reason } = describe(err, isLastAttempt);
  await updateProcessingPhoto(photo.id, isLastAttempt ? { status: "failed", failureCode: "processing_failed", failureReason: reason, lastError } : { status: "queued", lastError }).catch((dbErr) =>
    console.error(`Could not record the failed attempt on photo ${photo.id}`, dbErr),
  );
}
