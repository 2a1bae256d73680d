/**
 * The cheap checks that come before the worker: the size the browser declares (so an obviously
 * refused file is never uploaded) and the size and first bytes of what actually arrived (so an
 * SVG, a PDF or a 0-byte file is refused by finalise at once). Everything that needs a decoder
 * (pixel limit, truncation, corruption) is normalizePhoto's job, in the worker. Pure.
 */
import { canDecodeAvif, canDecodeHeic, MAX_PHOTO_BYTES, PhotoRejectedError, type AcceptedPhotoFormat } from "@/lib/imaging/normalize";
import { heicMessage, sniffPhotoFormat } from "@/lib/imaging/photo-errors";

const megabytes = (bytes: number) => (bytes / (1024 * 1024)).toFixed(1);
const acceptedList = () => (canDecodeAvif() ? "JPEG, PNG, WebP or AVIF" : "JPEG, PNG or WebP");

export const emptyFile = () => new PhotoRejectedError("empty", "The file is empty (0 bytes); choose the photo again.");
export const tooLarge = (bytes: number) => new PhotoRejectedError("too_large", `This file is ${megabytes(bytes)} MB; a photo may be at most ${megabytes(MAX_PHOTO_BYTES)} MB.`);
/** What arrived is not the length the upload was announced (and signed) with. */
export const lengthMismatch = (arrived: number, declared: number) =>
  new PhotoRejectedError("corrupt", `The file that arrived has ${arrived} bytes, not the ${declared} announced for this upload; choose the photo again.`);

const NAMED_TYPES: Record<string, string> = {
  "image/svg+xml": "an SVG drawing",
  "image/gif": "a GIF image",
  "image/tiff": "a TIFF image",
  "image/bmp": "a BMP image",
  "application/pdf": "a PDF document",
};
const HEIF_TYPES = new Set(["image/heic", "image/heif", "image/heic-sequence", "image/heif-sequence"]);

/** What the browser declared: refused before any byte is uploaded. Null when it may go ahead. */
export function checkDeclaredUpload({ bytes, contentType }: { bytes: number; contentType: string }): PhotoRejectedError | null {
  if (bytes === 0) return emptyFile();
  if (bytes > MAX_PHOTO_BYTES) return tooLarge(bytes);
  const type = contentType.toLowerCase().split(";")[0].trim();
  // Browsers leave the type empty (or generic) for files they do not know; the bytes decide.
  if (type === "" || type === "application/octet-stream") return null;
  if (HEIF_TYPES.has(type)) return canDecodeHeic() ? null : new PhotoRejectedError("unsupported_format", heicMessage());
  if (NAMED_TYPES[type]) {
    return new PhotoRejectedError("unsupported_format", `This file is ${NAMED_TYPES[type]}, which is not accepted as a photo; upload it as ${acceptedList()}.`);
  }
  if (!type.startsWith("image/")) {
    return new PhotoRejectedError("unsupported_format", `This file is not an image (${type}); upload a photo as ${acceptedList()}.`);
  }
  return null;
}

const MIME: Record<AcceptedPhotoFormat, string> = { jpeg: "image/jpeg", png: "image/png", webp: "image/webp", avif: "image/avif", heic: "image/heic" };

export type StoredCheck = { ok: true; contentType: string } | { ok: false; rejection: PhotoRejectedError };

/** What arrived in the store: its real length and first bytes (magic-byte sniff). */
export function checkStoredUpload({ bytes, head }: { bytes: number; head: Buffer }): StoredCheck {
  if (bytes === 0) return { ok: false, rejection: emptyFile() };
  if (bytes > MAX_PHOTO_BYTES) return { ok: false, rejection: tooLarge(bytes) };
  const sniffed = sniffPhotoFormat(head);
  if (sniffed.kind === "refused") return { ok: false, rejection: new PhotoRejectedError("unsupported_format", sniffed.message) };
  if (sniffed.kind === "heic" && !canDecodeHeic()) return { ok: false, rejection: new PhotoRejectedError("unsupported_format", heicMessage()) };
  if (sniffed.kind === "accepted" && sniffed.format === "avif" && !canDecodeAvif()) {
    return { ok: false, rejection: new PhotoRejectedError("unsupported_format", "This server cannot read AVIF photos; convert it to JPEG and upload again.") };
  }
  // A generic HEIF container is settled by the decoder; its MIME type is provisional until then.
  const contentType = sniffed.kind === "accepted" ? MIME[sniffed.format] : sniffed.kind === "heic" ? MIME.heic : "image/heif";
  return { ok: true, contentType };
}

export const mimeForFormat = (format: string): string => MIME[format as AcceptedPhotoFormat] ?? "application/octet-stream";
