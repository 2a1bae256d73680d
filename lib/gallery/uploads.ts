import "server-only";
/**
 * Uploading a photo straight into the Gallery, through the same steps as a unit's photo
 * (lib/photos/intents.ts, finalise.ts): an intent answers a presigned PUT to a staging key and a
 * signed ticket; the browser PUTs; finalise moves the bytes to the original's key, checks them and
 * lets the worker make the derivatives. The photo has no unit (its keys say `gallery`).
 *
 * Decisions:
 * - The draft item is made once the photo is ready, never before: a refused file leaves nothing
 *   (no row, no object, no item). A photo still processing when finalise stops waiting answers
 *   202; the browser sends the same ticket again and gets the item once the photo is ready. A
 *   photo whose item never gets made is removed by the orphan sweep (lib/photos/sweep.ts).
 * - What the item starts as (kind and grade) travels in the ticket, so the second finalise needs
 *   nothing else. Its regions and caption start empty: the trainer marks and writes them on the
 *   item's page (a caption in the ticket could outgrow a signed token's size).
 */
import { randomUUID } from "node:crypto";
import { z } from "zod";
import { transaction } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { findActiveItemForPhoto, insertGalleryItem, lockPhotoForItems } from "@/db/queries/gallery";
import { getGradingPartType, getLatestPublished } from "@/db/queries/rubrics";
import type { SessionUser } from "@/lib/auth/require-user";
import { env } from "@/lib/env";
import { AppError, notFound } from "@/lib/errors";
import { GRADES } from "@/lib/grading/rubric-schema";
import { photoSettings } from "@/lib/photos/config";
import { storeUpload, type FinaliseOptions } from "@/lib/photos/finalise";
import { limitUploadIntents } from "@/lib/photos/intents";
import { stagingKey } from "@/lib/photos/object-keys";
import { checkDeclaredUpload } from "@/lib/photos/precheck";
import { getPhoto } from "@/db/queries/photos";
import type { FinaliseInput } from "@/lib/photos/schemas";
import { signToken, verifyToken } from "@/lib/signing/signed-token";
import { checkStore, objectStore, presignPut, type ObjectStore } from "@/lib/storage/s3";
import type { GalleryItemDto } from "./dto";
import { readGalleryItem } from "./items";
import { GALLERY_KINDS } from "./rules";
import type { GalleryUploadIntentInput } from "./schemas";

const PURPOSE = "gallery upload ticket";

const ticketSchema = z.strictObject({
  workspaceId: z.uuid(),
  partTypeId: z.uuid(),
  photoId: z.uuid(),
  viewKey: z.string().min(1).max(64),
  fileName: z.string().max(200),
  uploaderId: z.uuid(),
  kind: z.enum(GALLERY_KINDS),
  grade: z.enum(GRADES),
  /** The length the presigned PUT was signed for; finalise refuses anything else. */
  bytes: z.number().int().positive(),
});
type GalleryTicket = z.infer<typeof ticketSchema>;

const BAD_TICKET = "This upload is not valid for the gallery, or its link has expired. Upload the file again.";

/** The part type in the caller's workspace with `viewKey` among its views (404 / 400 otherwise). */
async function partTypeWithView(actor: SessionUser, partTypeId: string, viewKey: string) {
  const partType = await getGradingPartType({ workspaceId: actor.workspaceId, partTypeId });
  if (!partType) throw notFound("That part type");
  if (!partType.views.some((v) => v.key === viewKey)) {
    const message = `“${viewKey}” is not a view of ${partType.name}; choose one of: ${partType.views.map((v) => v.label).join(", ")}.`;
    throw new AppError("bad_request", message, { fieldErrors: { viewKey: message } });
  }
  return partType;
}

export type GalleryUploadIntent = { photoId: string; ticket: string; upload: { method: "PUT"; url: string; headers: Record<string, string>; expiresAt: string } };

export async function createGalleryUploadIntent(
  actor: SessionUser,
  input: GalleryUploadIntentInput,
  { store = objectStore(), now = new Date() }: { store?: ObjectStore; now?: Date } = {},
): Promise<GalleryUploadIntent> {
  await partTypeWithView(actor, input.partTypeId, input.viewKey);
  const rejection = checkDeclaredUpload(input);
  if (rejection) throw rejection;
  await checkStore(store);
  const settings = photoSettings();
  const photoId = randomUUID();
  const contentType = input.contentType || "application/octet-stream";
  const urlSeconds = settings.PHOTO_UPLOAD_URL_MINUTES * 60;
  await limitUploadIntents(actor);
  const url = await presignPut(store, stagingKey({ workspaceId: actor.workspaceId, unitId: null, photoId }), { contentType, contentLength: input.bytes, expiresInSeconds: urlSeconds });
  const claims: GalleryTicket = {
    workspaceId: actor.workspaceId,
    partTypeId: input.partTypeId,
    photoId,
    viewKey: input.viewKey,
    fileName: input.fileName,
    uploaderId: actor.id,
    kind: input.kind,
    grade: input.grade,
    bytes: input.bytes,
  };
  const ticket = signToken(PURPOSE, claims, { secret: env().NEXTAUTH_SECRET, expiresAt: new Date(now.getTime() + settings.PHOTO_TICKET_HOURS * 3_600_000) });
  return { photoId, ticket, upload: { method: "PUT", url, headers: { "Content-Type": contentType }, expiresAt: new Date(now.getTime() + urlSeconds * 1000).toISOString() } };
}

export type GalleryFinaliseOutcome = { kind: "item"; item: GalleryItemDto; created: boolean } | { kind: "processing"; photoId: string };

export async function finaliseGalleryUpload(actor: SessionUser, input: FinaliseInput, options: FinaliseOptions = {}): Promise<GalleryFinaliseOutcome> {
  const check = verifyToken(PURPOSE, input.ticket, ticketSchema, { secret: env().NEXTAUTH_SECRET, now: options.now ?? new Date() });
  if (!check.ok || check.claims.workspaceId !== actor.workspaceId || check.claims.uploaderId !== actor.id) {
    throw new AppError("bad_request", BAD_TICKET, { fieldErrors: { ticket: BAD_TICKET } });
  }
  const ticket = check.claims;
  await partTypeWithView(actor, ticket.partTypeId, ticket.viewKey);
  const key = { workspaceId: actor.workspaceId, photoId: ticket.photoId };
  if (!(await getPhoto(key))) {
    await storeUpload(actor, { unitId: null, photoId: ticket.photoId, viewKey: ticket.viewKey, fileName: ticket.fileName, bytes: ticket.bytes }, options);
  }
  const photo = await getPhoto(key);
  if (!photo || photo.unitId !== null) throw new AppError("bad_request", BAD_TICKET);
  if (photo.status === "failed") throw new AppError("conflict", photo.failureReason ?? "Processing this photo failed. Upload it again.");
  if (photo.status !== "ready") return { kind: "processing", photoId: photo.id };
  const made = await ensureItem(actor, ticket);
  return { kind: "item", item: await readGalleryItem(actor, made.id), created: made.created };
}

/** The draft for this upload, made once (a repeated finalise finds it). */
async function ensureItem(actor: SessionUser, ticket: GalleryTicket): Promise<{ id: string; created: boolean }> {
  const key = { workspaceId: actor.workspaceId, photoId: ticket.photoId };
  return transaction(async (tx) => {
    await lockPhotoForItems(tx, key);
    const existing = await findActiveItemForPhoto(key, tx);
    if (existing) return { id: existing.id, created: false };
    const rubric = await getLatestPublished({ workspaceId: actor.workspaceId, partTypeId: ticket.partTypeId }, tx);
    const id = await insertGalleryItem(tx, {
      workspaceId: actor.workspaceId,
      partTypeId: ticket.partTypeId,
      viewKey: ticket.viewKey,
      kind: ticket.kind,
      photoId: ticket.photoId,
      regions: { regions: [], surfaces: [], ruler: null },
      grade: ticket.grade,
      rubricVersionId: rubric?.id ?? null,
      createdBy: actor.id,
    });
    await logActivity(tx, {
      workspaceId: actor.workspaceId,
      actorId: actor.id,
      action: "gallery.uploaded",
      subjectType: "gallery_item",
      subjectId: id,
      detail: { photoId: ticket.photoId, viewKey: ticket.viewKey, grade: ticket.grade, kind: ticket.kind },
    });
    return { id, created: true };
  });
}
