import "server-only";
/**
 * Putting right a photo filed under the wrong view, or one that should not be there at all.
 *
 * - Reassigning a view changes which view (and so which zones) the photo stands for; the unit's
 *   measurement goes out of date through its view stamp (lib/grading/staleness.ts).
 * - Removing needs a reason and is never silent. A photo nothing refers to yet is deleted — its
 *   row and objects — and the activity log keeps what it was and why it went. A photo that regions
 *   or a measurement (and so possibly a grade) referred to is evidence: it is **withdrawn**
 *   instead — kept with its objects, who withdrew it, when and why — and the unit's photo lists
 *   and measurements leave it out. The photo deletion gate (deletion.ts) decides which.
 *
 * Both count as work on the unit: refused once it is graded or its lot decided, or while another
 * person's lease runs; a unit still waiting in the queue is taken onto the worker's bench.
 */
import { transaction, type Tx } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { lockUnit } from "@/db/queries/units";
import type { SessionUser } from "@/lib/auth/require-user";
import { AppError, notFound } from "@/lib/errors";
import { claimForWork } from "@/lib/queue/claim-for-work";
import { deleteObject, objectStore, type ObjectStore } from "@/lib/storage/s3";
import { assertUnitEditable } from "@/lib/units/editability";
import { originalDeletionBlockers } from "./deletion";
import { viewOf } from "./intents";
import { deleteCurrentPhoto, getPhoto, getUnitForPhotos, updatePhotoView, withdrawPhoto } from "@/db/queries/photos";

/** A unit's photo (gallery uploads have no unit: this is not their way out). */
type Photo = NonNullable<Awaited<ReturnType<typeof getPhoto>>> & { unitId: string };

const NOT_FOUND = "That photo";

/** Locks the photo's unit and checks that it may still change; claims a waiting unit. */
async function openForWork(tx: Tx, actor: SessionUser, photo: Photo) {
  const unit = await lockUnit(tx, { workspaceId: actor.workspaceId, unitId: photo.unitId });
  if (!unit) throw notFound(NOT_FOUND);
  const { claims } = assertUnitEditable({ work: "photos", actor, lotStatus: unit.lotStatus, unit, timeZone: actor.timeZone });
  if (claims) await claimForWork(tx, actor, unit, "photos");
}

async function loadCurrentPhoto(actor: SessionUser, photoId: string): Promise<Photo> {
  const photo = await getPhoto({ workspaceId: actor.workspaceId, photoId });
  if (!photo || photo.unitId === null) throw notFound(NOT_FOUND);
  if (photo.removedAt) throw new AppError("conflict", "This photo was already taken out of the unit; it is kept only as a record.");
  return { ...photo, unitId: photo.unitId };
}

export async function reassignPhotoView(actor: SessionUser, photoId: string, viewKey: string) {
  const photo = await loadCurrentPhoto(actor, photoId);
  await transaction(async (tx) => {
    await openForWork(tx, actor, photo);
    const unit = await getUnitForPhotos({ workspaceId: actor.workspaceId, unitId: photo.unitId }, tx);
    if (!unit) throw notFound(NOT_FOUND);
    viewOf(unit, viewKey);
    if (photo.viewKey === viewKey) return;
    if (!(await updatePhotoView(tx, { workspaceId: actor.workspaceId, photoId, viewKey }))) throw new AppError("conflict", "This photo changed meanwhile; reload and try again.");
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "photo.view_changed",
      subjectType: "photo",
      subjectId: photoId,
      detail: { unitId: photo.unitId, from: photo.viewKey, to: viewKey, fileName: photo.fileName },
    });
  });
}

export type RemovalOutcome = { outcome: "deleted" | "withdrawn"; message: string };

export async function removePhoto(actor: SessionUser, photoId: string, reason: string, { store = objectStore() }: { store?: ObjectStore } = {}): Promise<RemovalOutcome> {
  const photo = await loadCurrentPhoto(actor, photoId);
  if (photo.status !== "ready") {
    throw new AppError("conflict", photo.status === "failed" ? "This upload failed; dismiss it instead." : "This photo is still being processed; remove it once it is ready.");
  }
  const result = await transaction(async (tx) => {
    await openForWork(tx, actor, photo);
    const blockers = await originalDeletionBlockers(tx, { workspaceId: actor.workspaceId, photoId });
    const detail = { unitId: photo.unitId, viewKey: photo.viewKey, fileName: photo.fileName, sha256: photo.sha256, reason };
    if (blockers.length > 0) {
      if (!(await withdrawPhoto(tx, { workspaceId: actor.workspaceId, photoId, removedBy: actor.id, reason }))) throw new AppError("conflict", "This photo changed meanwhile; reload and try again.");
      await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "photo.withdrawn", subjectType: "photo", subjectId: photoId, detail: { ...detail, kept: blockers } });
      return { outcome: "withdrawn" as const, message: `The photo was taken out of this unit and kept as a record, because ${blockers.map(lowerFirst).join(" ")}` };
    }
    if (!(await deleteCurrentPhoto(tx, { workspaceId: actor.workspaceId, photoId }))) throw new AppError("conflict", "This photo changed meanwhile; reload and try again.");
    await logActivity(tx, { workspaceId: actor.workspaceId, actorId: actor.id, action: "photo.removed", subjectType: "photo", subjectId: photoId, detail });
    return { outcome: "deleted" as const, message: "The photo was removed; nothing referred to it yet. The activity log keeps what it was and why it went." };
  });
  if (result.outcome === "deleted") {
    // The row is gone first, so nothing points at a missing object; a failed delete is swept later.
    for (const key of [photo.originalKey, photo.previewKey, photo.thumbnailKey]) {
      if (key) await deleteObject(store, key).catch((err) => console.error(`Could not delete ${key} of removed photo ${photoId}`, err));
    }
  }
  return result;
}

const lowerFirst = (sentence: string) => sentence.charAt(0).toLowerCase() + sentence.slice(1);
