import "server-only";
/**
 * Step 1 of an upload: the browser says what it is about to send; the server checks what it can
 * without the bytes, picks the photo id and the staging key, and answers a short-lived presigned
 * PUT URL plus a signed ticket that finalise will ask for. Nothing is written anywhere yet.
 */
import { randomUUID } from "node:crypto";
import type { SessionUser } from "@/lib/auth/require-user";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { enforceLimits, waitPhrase } from "@/lib/rate-limit/limits";
import { assertUnitEditable } from "@/lib/units/editability";
import { checkStore, objectStore, presignPut, type ObjectStore } from "@/lib/storage/s3";
import { photoSettings } from "./config";
import { stagingKey } from "./object-keys";
import { checkDeclaredUpload } from "./precheck";
import { getUnitForPhotos, type UnitForPhotos } from "@/db/queries/photos";
import type { UploadIntentInput } from "./schemas";
import { signUploadTicket } from "./ticket";

/** The unit in the caller's workspace (404 for any other, exactly like a missing one). */
export async function loadUnit(actor: SessionUser, unitId: string): Promise<UnitForPhotos> {
  const unit = await getUnitForPhotos({ workspaceId: actor.workspaceId, unitId });
  if (!unit) throw notFound("That unit");
  return unit;
}

/**
 * Photos can be added while the unit waits or is on a bench of an open lot; after grading the
 * evidence is fixed (lib/units/editability.ts, "upload": an upload only adds, so no lease holds it).
 */
export function assertOpenForUploads(actor: SessionUser, unit: UnitForPhotos): void {
  const lease = { leaseHolderId: null, leaseHolderName: null, leaseExpiresAt: null, leaseRunning: false };
  assertUnitEditable({ work: "upload", actor, lotStatus: unit.lotStatus, unit: { status: unit.status, ...lease }, timeZone: actor.timeZone });
}

export function viewOf(unit: UnitForPhotos, viewKey: string) {
  const view = unit.partType.views.find((v) => v.key === viewKey);
  if (!view) {
    const known = unit.partType.views.map((v) => v.label).join(", ");
    const message = `“${viewKey}” is not a view of ${unit.partType.name}; choose one of: ${known}.`;
    throw new AppError("bad_request", message, { fieldErrors: { viewKey: message } });
  }
  return view;
}

export type UploadIntent = {
  photoId: string;
  ticket: string;
  upload: { method: "PUT"; url: string; headers: Record<string, string>; expiresAt: string };
};

/**
 * Upload intents per person and minute (PHOTO_UPLOAD_INTENTS_PER_MINUTE), a unit's and the
 * Gallery's together: each hands out a URL that may store up to 40 MB, so one account cannot line
 * up an unbounded amount of storage.
 */
export async function limitUploadIntents(actor: SessionUser) {
  await enforceLimits(
    [{ bucket: "upload-intent:user", key: actor.id, max: photoSettings().PHOTO_UPLOAD_INTENTS_PER_MINUTE, windowSeconds: 60 }],
    (s) => `You have started too many uploads in the last minute. ${waitPhrase(s)} and add the rest; the photos already uploading carry on.`,
  );
}

export async function createUploadIntent(
  actor: SessionUser,
  unitId: string,
  input: UploadIntentInput,
  { store = objectStore(), now = new Date() }: { store?: ObjectStore; now?: Date } = {},
): Promise<UploadIntent> {
  const unit = await loadUnit(actor, unitId);
  assertOpenForUploads(actor, unit);
  viewOf(unit, input.viewKey);
  const rejection = checkDeclaredUpload(input);
  if (rejection) throw rejection;
  // Presigning needs no network; asking the bucket first turns an outage into a clear 503 now
  // instead of a failed upload in the browser.
  await checkStore(store);

  const settings = photoSettings();
  const photoId = randomUUID();
  const contentType = input.contentType || "application/octet-stream";
  const urlSeconds = settings.PHOTO_UPLOAD_URL_MINUTES * 60;
  await limitUploadIntents(actor);
  const url = await presignPut(store, stagingKey({ workspaceId: actor.workspaceId, unitId: unit.id, photoId }), { contentType, contentLength: input.bytes, expiresInSeconds: urlSeconds });
  const ticket = signUploadTicket(
    { workspaceId: actor.workspaceId, unitId: unit.id, photoId, viewKey: input.viewKey, fileName: input.fileName, uploaderId: actor.id, bytes: input.bytes },
    { secret: env().NEXTAUTH_SECRET, expiresAt: new Date(now.getTime() + settings.PHOTO_TICKET_HOURS * 3_600_000) },
  );
  return {
    photoId,
    ticket,
    upload: { method: "PUT", url, headers: { "Content-Type": contentType }, expiresAt: new Date(now.getTime() + urlSeconds * 1000).toISOString() },
  };
}
