/**
 * What the API says about a photo. Object keys never leave the server: images are reached through
 * /api/photos/:id/{thumbnail,preview,original}, which check the session every time.
 */
import type { PhotoFailureCode, PhotoStatus } from "@/db/schema/photos";
import type { PhotoWithContext } from "@/db/queries/photos";

/** How a unit is named beside a photo: its serial, or its place in the lot's sample. */
export const unitLabel = (u: { serial: string | null; sampleIndex: number; purchaseRef: string }) => (u.serial ? `${u.serial} (${u.purchaseRef})` : `sample ${u.sampleIndex} of ${u.purchaseRef}`);

export type PhotoDto = {
  id: string;
  /** Null for a photo uploaded straight into the Gallery. */
  unitId: string | null;
  viewKey: string;
  status: PhotoStatus;
  failure: { code: PhotoFailureCode; reason: string } | null;
  /** While queued again after a transient error: what went wrong (a retry is pending). */
  retryNote: string | null;
  fileName: string;
  bytes: number;
  sha256: string;
  format: string | null;
  /** Upright size of the original. */
  width: number | null;
  height: number | null;
  orientation: number | null;
  preview: { width: number; height: number } | null;
  thumbnail: { width: number; height: number } | null;
  captureTime: string | null;
  captureTimeOffset: string | null;
  possibleReuse: { photoId: string; unitId: string; unitLabel: string } | null;
  uploadedBy: { id: string; name: string };
  createdAt: string;
  processedAt: string | null;
  urls: { thumbnail: string; preview: string; original: string } | null;
  /** Taken out of the unit but kept as a record (lib/photos/removal.ts); null while part of it. */
  removal: { at: string; byName: string | null; reason: string } | null;
};

const size = (width: number | null, height: number | null) => (width !== null && height !== null ? { width, height } : null);

export function toPhotoDto(p: PhotoWithContext): PhotoDto {
  const ready = p.status === "ready";
  return {
    id: p.id,
    unitId: p.unitId,
    viewKey: p.viewKey,
    status: p.status,
    failure: p.status === "failed" && p.failureCode ? { code: p.failureCode, reason: p.failureReason ?? "" } : null,
    retryNote: p.status !== "failed" && p.status !== "ready" ? p.lastError : null,
    fileName: p.fileName,
    bytes: p.bytes,
    sha256: p.sha256,
    format: p.format,
    width: p.width,
    height: p.height,
    orientation: p.orientation,
    preview: size(p.previewWidth, p.previewHeight),
    thumbnail: size(p.thumbnailWidth, p.thumbnailHeight),
    captureTime: p.captureTime?.toISOString() ?? null,
    captureTimeOffset: p.captureTimeOffset,
    possibleReuse: p.reuse
      ? {
          photoId: p.reuse.photoId,
          unitId: p.reuse.unitId,
          unitLabel: unitLabel(p.reuse),
        }
      : null,
    uploadedBy: { id: p.uploadedBy, name: p.uploaderName },
    createdAt: p.createdAt.toISOString(),
    processedAt: p.processedAt?.toISOString() ?? null,
    urls: ready ? { thumbnail: `/api/photos/${p.id}/thumbnail`, preview: `/api/photos/${p.id}/preview`, original: `/api/photos/${p.id}/original` } : null,
    removal: p.removedAt && p.removalReason ? { at: p.removedAt.toISOString(), byName: p.removerName, reason: p.removalReason } : null,
  };
}
