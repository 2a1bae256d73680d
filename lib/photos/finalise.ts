import "server-only";
/**
 * Step 3 of an upload (after the browser's PUT): accept the bytes or refuse them, and never leave
 * a row without its object or an object without its row.
 *
 *  1. Check the ticket (signed by intents.ts) against the unit in the URL and the signed-in uploader.
 *  2. Size from HEAD (0 bytes / over 40 MB → refused), then a server-side copy from the staging
 *     key to the original's key, which no browser ever had a URL for — so an accepted original
 *     cannot be overwritten through the old PUT URL. The staging object is deleted.
 *  3. One streaming read of the original: SHA-256 and the first bytes (magic-byte sniff).
 *  4. Same bytes already on this unit → that photo (idempotent). On another unit → flagged.
 *  5. Row (queued) + pg-boss job + activity entry in one transaction.
 *  6. Wait (up to PHOTO_FINALISE_WAIT_MS) for the worker's verdict, so a file the decoder refuses
 *     (corrupt, truncated, too many pixels) is still answered with a 4xx and leaves nothing behind.
 *     A slower verdict answers 202; the photo's status then shows it.
 * Refusals throw PhotoRejectedError (mapped to 4xx by lib/photos/http.ts).
 */
import { transaction, type DbOrTx } from "@/db/client";
import { isUniqueViolation } from "@/db/errors";
import { logActivity } from "@/db/queries/activity";
import { deleteRefusalNotice } from "@/db/queries/photo-processing";
import type { NewPhoto } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/require-user";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import { MAX_PHOTO_BYTES, PhotoRejectedError, type PhotoRejectionCode } from "@/lib/imaging/normalize";
import { transactionWithJobs, type JobSender } from "@/lib/jobs/send";
import { copyObject, deleteObject, digestObject, headObject, objectStore, type ObjectStore } from "@/lib/storage/s3";
import { formatDate } from "@/lib/time/format";
import { photoSettings } from "./config";
import { assertOpenForUploads, loadUnit, viewOf } from "./intents";
import { originalKey, stagingKey, type PhotoKeyOwner } from "./object-keys";
import { checkStoredUpload, emptyFile, lengthMismatch, tooLarge } from "./precheck";
import { processPhoto } from "./process";
import { findReuseCandidate, findUnitPhotoBySha, getPhoto, getPhotoById, getPhotoWithContext, insertPhotoRow, type PhotoWithContext } from "@/db/queries/photos";
import type { FinaliseInput } from "./schemas";
import { verifyUploadTicket, type UploadTicket } from "./ticket";

export type FinaliseOutcome =
  /** A new photo: ready when the worker answered in time, otherwise queued/processing. */
  | { kind: "accepted"; photo: PhotoWithContext }
  /** This ticket was finalised before (a retried request): the same photo. */
  | { kind: "replayed"; photo: PhotoWithContext }
  /** The same bytes were already a photo of this unit: that photo; the new copy is discarded. */
  | { kind: "duplicate"; photo: PhotoWithContext };

export type FinaliseOptions = {
  store?: ObjectStore;
  /** "queue": the worker processes it (the app); "inline": processed before returning (the seed). */
  dispatch?: "queue" | "inline";
  waitMs?: number;
  now?: Date;
};

const BAD_TICKET = "This upload is not valid for this unit, or its link has expired. Upload the file again.";
const NOT_ARRIVED = "The file has not arrived in the photo store (the upload did not finish, or its link expired). Upload it again.";

function readTicket(actor: SessionUser, unitId: string, token: string, now: Date): UploadTicket {
  const check = verifyUploadTicket(token, { secret: env().NEXTAUTH_SECRET, now });
  // The ticket names who asked for it: a colleague who got hold of it cannot finalise it as theirs.
  if (!check.ok || check.ticket.workspaceId !== actor.workspaceId || check.ticket.unitId !== unitId || check.ticket.uploaderId !== actor.id) {
    throw new AppError("bad_request", BAD_TICKET, { fieldErrors: { ticket: BAD_TICKET } });
  }
  return check.ticket;
}

const withContext = async (actor: SessionUser, photoId: string) => (await getPhotoWithContext({ workspaceId: actor.workspaceId, photoId }))!;

export async function finaliseUpload(actor: SessionUser, unitId: string, input: FinaliseInput, options: FinaliseOptions = {}): Promise<FinaliseOutcome> {
  const unit = await loadUnit(actor, unitId);
  const ticket = readTicket(actor, unitId, input.ticket, options.now ?? new Date());
  if (await getPhoto({ workspaceId: actor.workspaceId, photoId: ticket.photoId })) return { kind: "replayed", photo: await withContext(actor, ticket.photoId) };
  assertOpenForUploads(actor, unit);
  viewOf(unit, ticket.viewKey);
  return storeUpload(actor, { unitId, photoId: ticket.photoId, viewKey: ticket.viewKey, fileName: ticket.fileName, bytes: ticket.bytes }, options);
}

/**
 * What a checked ticket promised: where the staged bytes go (`unitId` null: a Gallery upload),
 * and the length the presigned PUT was signed for (finalise refuses any other).
 */
export type UploadTarget = { unitId: string | null; photoId: string; viewKey: string; fileName: string; bytes?: number };

/**
 * Steps 2–6 for a ticket the caller has checked (a unit's, or the Gallery's in lib/gallery/uploads.ts).
 * Gallery uploads skip the same-bytes and reuse checks: those compare evidence between units.
 */
export async function storeUpload(actor: SessionUser, target: UploadTarget, options: FinaliseOptions = {}): Promise<FinaliseOutcome> {
  const { store = objectStore(), dispatch = "queue" } = options;
  const waitMs = options.waitMs ?? photoSettings().PHOTO_FINALISE_WAIT_MS;
  const { unitId } = target;
  const owner: PhotoKeyOwner = { workspaceId: actor.workspaceId, unitId, photoId: target.photoId };
  const original = await moveToOriginal(store, owner, target.bytes);
  const digest = await digestObject(store, original);
  if (!digest) throw new AppError("conflict", NOT_ARRIVED);
  const stored = checkStoredUpload(digest);
  if (!stored.ok) {
    await deleteObject(store, original);
    throw stored.rejection;
  }

  const same = unitId ? await findUnitPhotoBySha({ workspaceId: actor.workspaceId, unitId, sha256: digest.sha256 }) : null;
  if (same) return answerSameBytes(actor, store, original, same.id);
  const reuse = unitId ? await findReuseCandidate({ workspaceId: actor.workspaceId, unitId, sha256: digest.sha256 }) : null;
  const row: NewPhoto = {
    id: target.photoId,
    workspaceId: actor.workspaceId,
    unitId,
    viewKey: target.viewKey,
    status: "queued",
    originalKey: original,
    contentType: stored.contentType,
    fileName: target.fileName,
    bytes: digest.bytes,
    sha256: digest.sha256,
    possibleReuseOfPhotoId: reuse?.id ?? null,
    uploadedBy: actor.id,
  };
  try {
    if (dispatch === "queue") await transactionWithJobs((tx, jobs) => insertPhoto(tx, actor, row, reuse?.unitId ?? null, jobs));
    else await transaction((tx) => insertPhoto(tx, actor, row, reuse?.unitId ?? null, null));
  } catch (err) {
    if (isUniqueViolation(err, "photos_pkey")) return { kind: "replayed", photo: await withContext(actor, row.id) };
    if (unitId && isUniqueViolation(err, "photos_unit_sha256_key")) {
      const winner = await findUnitPhotoBySha({ workspaceId: actor.workspaceId, unitId, sha256: digest.sha256 });
      if (winner) return answerSameBytes(actor, store, original, winner.id);
    }
    // No row was written: the copy must not outlive it (the sweep catches it if this fails too).
    await deleteObject(store, original).catch(() => {});
    throw err;
  }

  if (dispatch === "inline") await processPhoto(row.id, { store, isLastAttempt: true }).catch((err) => console.error(`Processing photo ${row.id} failed`, err));
  else await waitForVerdict(row.id, waitMs);
  await dropIfRefused(row.id);
  return { kind: "accepted", photo: await withContext(actor, row.id) };
}

/**
 * HEAD, size limits (and the length the upload was signed for), server-side copy to the
 * original's key, staging deleted. Returns the key.
 */
async function moveToOriginal(store: ObjectStore, owner: PhotoKeyOwner, declaredBytes: number | undefined): Promise<string> {
  const staged = stagingKey(owner);
  const original = originalKey(owner);
  const head = await headObject(store, staged);
  if (!head) {
    // A finalise that failed after the copy (e.g. the store went away) is retried from here.
    if (await headObject(store, original)) return original;
    throw new AppError("conflict", NOT_ARRIVED);
  }
  const sizeRejection =
    head.bytes === 0
      ? emptyFile()
      : head.bytes > MAX_PHOTO_BYTES
        ? tooLarge(head.bytes)
        : declaredBytes !== undefined && head.bytes !== declaredBytes
          ? lengthMismatch(head.bytes, declaredBytes)
          : null;
  if (sizeRejection) {
    await deleteObject(store, staged);
    throw sizeRejection;
  }
  if (!(await copyObject(store, staged, original))) throw new AppError("conflict", NOT_ARRIVED);
  await deleteObject(store, staged);
  return original;
}

async function answerSameBytes(actor: SessionUser, store: ObjectStore, newOriginal: string, existingId: string): Promise<FinaliseOutcome> {
  await deleteObject(store, newOriginal);
  const existing = await withContext(actor, existingId);
  // The same file was refused before (its notice is still shown): refuse it again, for the same reason.
  if (existing.status === "failed" && existing.failureCode !== "processing_failed") {
    throw new PhotoRejectedError(existing.failureCode as PhotoRejectionCode, existing.failureReason ?? "This file was refused.");
  }
  // The same file was taken out of this unit before: it does not come back in by the side door.
  if (existing.removedAt) {
    throw new AppError(
      "conflict",
      `This exact file was taken out of this unit on ${formatDate(existing.removedAt, actor.timeZone)} (“${existing.removalReason ?? ""}”) and is kept only as a record. Upload a different photo.`,
    );
  }
  return { kind: "duplicate", photo: existing };
}

async function insertPhoto(tx: DbOrTx, actor: SessionUser, row: NewPhoto, reuseUnitId: string | null, jobs: JobSender | null) {
  await insertPhotoRow(tx, row);
  await logActivity(tx, {
    workspaceId: actor.workspaceId,
    actorId: actor.id,
    action: "photo.uploaded",
    subjectType: "photo",
    subjectId: row.id!,
    detail: { unitId: row.unitId, viewKey: row.viewKey, bytes: row.bytes, sha256: row.sha256, possibleReuseOfPhotoId: row.possibleReuseOfPhotoId, possibleReuseUnitId: reuseUnitId },
  });
  await jobs?.sendPhotoProcessing(row.id!);
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

async function waitForVerdict(photoId: string, waitMs: number) {
  const deadline = Date.now() + waitMs;
  while (Date.now() < deadline) {
    const row = await getPhotoById(photoId);
    if (!row || row.status === "ready" || row.status === "failed") return;
    await sleep(150);
  }
}

/** A file the decoder refused: its original is already gone; drop the notice too and answer 4xx. */
async function dropIfRefused(photoId: string) {
  const row = await getPhotoById(photoId);
  if (!row || row.status !== "failed" || row.failureCode === "processing_failed" || row.originalKey !== null) return;
  await deleteRefusalNotice(photoId);
  throw new PhotoRejectedError(row.failureCode as PhotoRejectionCode, row.failureReason ?? "This file was refused.");
}
