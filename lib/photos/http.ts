import "server-only";
/** HTTP answers specific to photos: refusals with their own code, and images streamed from the store. */
import { PhotoRejectedError, type PhotoRejectionCode } from "@/lib/imaging/photo-errors";
import { notFound } from "@/lib/errors";
import { getObjectStream, objectStore, presignGet } from "@/lib/storage/s3";
import type { SessionUser } from "@/lib/auth/require-user";
import { mimeForFormat } from "./precheck";
import { getPhoto } from "@/db/queries/photos";

/** 415 for formats, 413 for size, 422 for files that cannot be decoded or are too big in pixels. */
export const REJECTION_STATUS: Record<PhotoRejectionCode, number> = { empty: 400, too_large: 413, unsupported_format: 415, too_many_pixels: 422, corrupt: 422 };

export function rejectionResponse(err: PhotoRejectedError): Response {
  return Response.json({ error: { code: err.code, message: err.message, fieldErrors: { file: err.message } } }, { status: REJECTION_STATUS[err.code] });
}

/** Wraps a handler body so a refused photo becomes its 4xx (everything else goes on to handler()). */
export async function answeringRejections(run: () => Promise<Response>): Promise<Response> {
  try {
    return await run();
  } catch (err) {
    if (err instanceof PhotoRejectedError) return rejectionResponse(err);
    throw err;
  }
}

const IMAGE_HEADERS = {
  // Same key, same bytes forever (a photo's objects are written once), so revalidation is cheap;
  // private: only this signed-in browser may keep it.
  "Cache-Control": "private, max-age=3600",
  "X-Content-Type-Options": "nosniff",
  "Content-Security-Policy": "default-src 'none'; sandbox",
  "Cross-Origin-Resource-Policy": "same-origin",
};

async function readyPhoto(user: SessionUser, photoId: string) {
  const photo = await getPhoto({ workspaceId: user.workspaceId, photoId });
  if (!photo || photo.status !== "ready") throw notFound("That photo");
  return photo;
}

/** Streams the preview or thumbnail (same origin, so canvases that draw it stay readable). */
export async function derivativeResponse(req: Request, user: SessionUser, photoId: string, variant: "preview" | "thumbnail", options: { etag?: string } = {}): Promise<Response> {
  const photo = await readyPhoto(user, photoId);
  const key = variant === "preview" ? photo.previewKey! : photo.thumbnailKey!;
  // A caller that must not tell the photo's id (a calibration item, taken blind) names its own tag.
  const etag = `"${options.etag ?? photo.id}-${variant}"`;
  if (req.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers: { ...IMAGE_HEADERS, ETag: etag } });
  const object = await getObjectStream(objectStore(), key);
  if (!object) throw notFound("That photo");
  const headers: Record<string, string> = { ...IMAGE_HEADERS, "Content-Type": "image/webp", ETag: etag, "Content-Disposition": "inline" };
  if (object.bytes !== null) headers["Content-Length"] = String(object.bytes);
  return new Response(object.body, { headers });
}

/** The untouched original: a redirect to a one-minute presigned GET, so 40 MB never pass through the app. */
export async function originalResponse(user: SessionUser, photoId: string): Promise<Response> {
  const photo = await readyPhoto(user, photoId);
  const extension = photo.format === "jpeg" ? "jpg" : (photo.format ?? "bin");
  const url = await presignGet(objectStore(), photo.originalKey!, {
    expiresInSeconds: 60,
    contentType: mimeForFormat(photo.format ?? ""),
    downloadName: `photo-${photo.id}.${extension}`,
  });
  return new Response(null, { status: 302, headers: { Location: url, "Cache-Control": "private, no-store", "Referrer-Policy": "no-referrer" } });
}
