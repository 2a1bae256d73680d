import "server-only";
/** What people do with a photo after upload: retry a failed processing, dismiss a failed upload. */
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { deleteFailedPhoto, requeueFailedPhoto } from "@/db/queries/photo-processing";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { transactionWithJobs } from "@/lib/jobs/send";
import { deleteObject, objectStore, type ObjectStore } from "@/lib/storage/s3";
import { assertOriginalDeletable } from "./deletion";
import { getPhoto, getPhotoWithContext } from "@/db/queries/photos";

const NOT_FOUND = "That photo";

/** Puts a photo whose processing failed (original kept) back in the queue. */
export async function retryPhotoProcessing(actor: SessionUser, photoId: string) {
  const photo = await getPhoto({ workspaceId: actor.workspaceId, photoId });
  if (!photo) throw notFound(NOT_FOUND);
  if (photo.status !== "failed" || photo.failureCode !== "processing_failed") {
    throw new AppError(
      "conflict",
      photo.status === "failed" ? "This file was refused, so there is nothing to retry; upload a good copy instead." : `This photo is ${photo.status}, so there is nothing to retry.`,
    );
  }
  await transactionWithJobs(async (tx, jobs) => {
    if (!(await requeueFailedPhoto(tx, { workspaceId: actor.workspaceId, photoId }))) throw new AppError("conflict", "This photo changed meanwhile; reload and try again.");
    await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "photo.retried", subjectType: "photo", subjectId: photoId, detail: { unitId: photo.unitId } });
    await jobs.sendPhotoProcessing(photoId);
  });
  return (await getPhotoWithContext({ workspaceId: actor.workspaceId, photoId }))!;
}

/**
 * Removes a failed upload (its notice, and its original when processing failed). Ready photos are
 * evidence and are never dismissed here.
 */
export async function dismissFailedPhoto(actor: SessionUser, photoId: string, { store = objectStore() }: { store?: ObjectStore } = {}) {
  const photo = await getPhoto({ workspaceId: actor.workspaceId, photoId });
  if (!photo) throw notFound(NOT_FOUND);
  if (photo.status !== "failed") throw new AppError("conflict", `This photo is ${photo.status}; only a failed upload can be dismissed. Ready photos stay as evidence.`);
  await transaction(async (tx) => {
    if (photo.originalKey) await assertOriginalDeletable(tx, { workspaceId: actor.workspaceId, photoId });
    if (!(await deleteFailedPhoto(tx, { workspaceId: actor.workspaceId, photoId }))) throw new AppError("conflict", "This photo changed meanwhile; reload and try again.");
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "photo.dismissed",
      subjectType: "photo",
      subjectId: photoId,
      detail: { unitId: photo.unitId, failureCode: photo.failureCode },
    });
  });
  // The row is gone first, so nothing points at a missing object; a failed delete is swept later.
  if (photo.originalKey) await deleteObject(store, photo.originalKey).catch((err) => console.error(`Could not delete the original of dismissed photo ${photoId}`, err));
}
