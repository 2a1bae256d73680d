/**
 * Photo intake: checks an uploaded original and makes the two derivatives the app shows (a WebP
 * preview and a WebP thumbnail, both upright and stripped of metadata). Pure: bytes in, bytes and
 * numbers out; storage and database rows are the caller's job.
 *
 * Order matters for safety: size and magic bytes are checked before libvips sees the file, and
 * the pixel limit is enforced by libvips from the header, so a decompression bomb is refused
 * before any pixel is decoded.
 */
import { createHash } from "node:crypto";
import sharp, { type Metadata, type Sharp, type WebpOptions } from "sharp";
import { PhotoRejectedError, heicMessage, sniffPhotoFormat, type AcceptedPhotoFormat } from "./photo-errors";

export { PhotoRejectedError, type PhotoRejectionCode, type AcceptedPhotoFormat } from "./photo-errors";

export const MAX_PHOTO_BYTES = 40 * 1024 * 1024;
export const MAX_PHOTO_PIXELS = 50_000_000;
export const PREVIEW_LONG_EDGE = 2560;
export const THUMBNAIL_LONG_EDGE = 320;

// WebP effort 0 keeps a 12 MP photo's preview within the speed budget (effort 4 costs about 3×
// the encode time for ~20 % smaller files); the thumbnail is tiny, so it gets the default effort.
const PREVIEW_WEBP = { quality: 80, effort: 0 } as const;
const THUMBNAIL_WEBP = { quality: 80, effort: 4 } as const;

/**
 * libvips' strictest level: a truncated file fails with "truncated", but a JPEG with garbled
 * entropy data only raises a libjpeg *warning* and would otherwise decode to a smeared image.
 */
const DECODE_OPTIONS = { failOn: "warning", limitInputPixels: MAX_PHOTO_PIXELS } as const;

export type NormalizedPhoto = {
  format: AcceptedPhotoFormat;
  /** Upright size of the original, after its Exif orientation. */
  width: number;
  height: number;
  /** Length of the original in bytes, and SHA-256 (hex) of exactly those bytes. */
  bytes: number;
  sha256: string;
  /** Exif Orientation of the original (1–8), or null when it carries none. */
  orientation: number | null;
  /** Exif DateTimeOriginal; read as UTC wall-clock time when no OffsetTimeOriginal is present. */
  captureTime: Date | null;
  /** Exif OffsetTimeOriginal ("+02:00") when present; null means captureTime's zone is unknown. */
  captureTimeOffset: string | null;
  preview: Buffer;
  previewWidth: number;
  previewHeight: number;
  thumbnail: Buffer;
  thumbnailWidth: number;
  thumbnailHeight: number;
};

/**
 * Process-wide sharp settings for a worker that normalises one photo after another: no operation
 * cache (each photo is new, the cache only holds memory) and, if given, libvips threads per image.
 * Call once at worker start; importing this module changes nothing.
 *
 * On glibc, sharp defaults to 1 thread unless MALLOC_ARENA_MAX is set in the environment (it
 * must be set before the process starts); with MALLOC_ARENA_MAX=2 sharp uses every core and the
 * bench's peak RSS was lower too (bench/normalize.ts).
 */
export function configureSharpForWorker(options: { concurrency?: number } = {}): void {
  sharp.cache(false);
  if (options.concurrency !== undefined) sharp.concurrency(options.concurrency);
}

/** Whether the installed libvips/libheif decodes these (prebuilt sharp: AV1 yes, HEVC no). */
export const canDecodeAvif = () => sharp.format.heif.input.buffer && hasSuffix(".avif");
export const canDecodeHeic = () => sharp.format.heif.input.buffer && hasSuffix(".heic");
const hasSuffix = (suffix: string) => ((sharp.format.heif.input as { fileSuffix?: string[] }).fileSuffix ?? []).includes(suffix);

const megabytes = (bytes: number) => (bytes / (1024 * 1024)).toFixed(1);

export async function normalizePhoto(input: Buffer): Promise<NormalizedPhoto> {
  if (input.length === 0) {
    throw new PhotoRejectedError("empty", "The file is empty (0 bytes); choose the photo again.");
  }
  if (input.length > MAX_PHOTO_BYTES) {
    throw new PhotoRejectedError("too_large", `This file is ${megabytes(input.length)} MB; a photo may be at most ${megabytes(MAX_PHOTO_BYTES)} MB.`);
  }
  const sniffed = sniffPhotoFormat(input);
  if (sniffed.kind === "refused") throw new PhotoRejectedError("unsupported_format", sniffed.message);
  if (sniffed.kind === "heic" && !canDecodeHeic()) throw new PhotoRejectedError("unsupported_format", heicMessage());
  if (sniffed.kind === "accepted" && sniffed.format === "avif" && !canDecodeAvif()) {
    throw new PhotoRejectedError("unsupported_format", "This server cannot read AVIF photos; convert it to JPEG and upload again.");
  }

  const header = await readHeader(input);
  const format = settleFormat(sniffed.kind === "accepted" ? sniffed.format : null, header);
  if ((header.pages ?? 1) > 1 && format === "webp") {
    throw new PhotoRejectedError("unsupported_format", "This file is an animated WebP; upload a single still photo.");
  }

  let upright: UprightPixels;
  try {
    upright = await decodeUpright(input, header);
  } catch (error) {
    throw isPixelLimitError(error) ? await tooManyPixels(input, error) : corrupt(error);
  }
  // The intermediate is our own well-formed pixels: a failure from here on is a fault, not bad input.
  const [preview, thumbnail] = await Promise.all([encodeWebp(upright, null, PREVIEW_WEBP), encodeWebp(upright, THUMBNAIL_LONG_EDGE, THUMBNAIL_WEBP)]);

  const capture = readExifCaptureTime(header.exif);
  return {
    format,
    width: header.autoOrient.width,
    height: header.autoOrient.height,
    bytes: input.length,
    sha256: createHash("sha256").update(input).digest("hex"),
    orientation: header.orientation ?? null,
    captureTime: capture?.time ?? null,
    captureTimeOffset: capture?.offset ?? null,
    preview: preview.data,
    previewWidth: preview.info.width,
    previewHeight: preview.info.height,
    thumbnail: thumbnail.data,
    thumbnailWidth: thumbnail.info.width,
    thumbnailHeight: thumbnail.info.height,
  };
}

const corrupt = (cause: unknown) =>
  new PhotoRejectedError("corrupt", "This photo could not be read: the file is damaged or incomplete (perhaps the upload was cut off). Export or take it again.", { cause });

const isPixelLimitError = (error: unknown) => error instanceof Error && /exceeds pixel limit/i.test(error.message);

/** Header only (no pixels decoded); the pixel limit is applied here. */
async function readHeader(input: Buffer): Promise<Metadata> {
  let header: Metadata;
  try {
    header = await sharp(input, DECODE_OPTIONS).metadata();
  } catch (error) {
    if (isPixelLimitError(error)) throw await tooManyPixels(input, error);
    throw corrupt(error);
  }
  // Redundant with limitInputPixels, kept so the rule does not hinge on libvips' comparison.
  if (header.width * header.height > MAX_PHOTO_PIXELS) throw await tooManyPixels(input, null);
  return header;
}

async function tooManyPixels(input: Buffer, cause: unknown): Promise<PhotoRejectedError> {
  const limit = `the limit is ${MAX_PHOTO_PIXELS / 1_000_000} megapixels`;
  try {
    // Reading the header without the limit is safe: metadata() never decodes pixels.
    const { width, height } = await sharp(input, { limitInputPixels: false }).metadata();
    const megapixels = ((width * height) / 1_000_000).toFixed(1);
    return new PhotoRejectedError("too_many_pixels", `This photo is ${width} × ${height} pixels (${megapixels} megapixels); ${limit}. Reduce its size and upload again.`, { cause });
  } catch {
    return new PhotoRejectedError("too_many_pixels", `This photo has too many pixels; ${limit}.`, { cause });
  }
}

/** The container decides between AVIF and HEIC when the brands did not; the magic must agree. */
function settleFormat(sniffed: AcceptedPhotoFormat | null, header: Metadata): AcceptedPhotoFormat {
  if (header.format === "heif") {
    if (header.compression === "av1" && (sniffed === null || sniffed === "avif")) return "avif";
    if (header.compression === "hevc" && sniffed !== "avif" && canDecodeHeic()) return "heic";
    throw new PhotoRejectedError("unsupported_format", heicMessage());
  }
  if (sniffed !== null && header.format === sniffed) return sniffed;
  throw corrupt(new Error(`magic bytes say ${sniffed ?? "HEIF"}, decoder says ${header.format}`));
}

/** The upright sRGB pixels at preview size that both derivatives are made from. */
type UprightPixels = { data: Buffer; raw: { width: number; height: number; channels: 1 | 2 | 3 | 4 } };

/**
 * The one full decode of the original (so damage anywhere fails): turned upright, fitted inside
 * the preview square without enlarging, and in sRGB.
 *
 * sharp converts through an embedded colour profile as it loads, before resizing; at 12 MP that
 * transform costs more than the decode itself (about 270 ms against 65 ms here). So a profiled
 * original is first resized with its profile kept, into an uncompressed TIFF that carries the
 * profile, and converted from that at preview size (about 40 ms). Converting once here, not in
 * each derivative's pipeline, also spares the thumbnail its own full-preview-size transform.
 * Without a profile there is nothing to convert, and the resized pixels are used as they are.
 */
async function decodeUpright(input: Buffer, header: Metadata): Promise<UprightPixels> {
  const pipeline = sharp(input, { ...DECODE_OPTIONS, autoOrient: true }).resize({
    width: PREVIEW_LONG_EDGE,
    height: PREVIEW_LONG_EDGE,
    fit: "inside",
    withoutEnlargement: true,
  });
  if (!header.icc) return rawPixels(pipeline);
  const profiled = await pipeline.keepIccProfile().tiff({ compression: "none" }).toBuffer();
  return rawPixels(sharp(profiled));
}

async function rawPixels(image: Sharp): Promise<UprightPixels> {
  const { data, info } = await image.raw().toBuffer({ resolveWithObject: true });
  return { data, raw: { width: info.width, height: info.height, channels: info.channels } };
}

/**
 * WebP from the upright pixels, optionally shrunk to fit `longEdge`. sharp writes no metadata
 * unless asked: no Exif, GPS, XMP or ICC.
 */
function encodeWebp(upright: UprightPixels, longEdge: number | null, webp: WebpOptions) {
  const image = sharp(upright.data, { raw: upright.raw });
  if (longEdge !== null) image.resize({ width: longEdge, height: longEdge, fit: "inside", withoutEnlargement: true });
  return image.webp(webp).toBuffer({ resolveWithObject: true });
}

// ---- Exif DateTimeOriginal ---------------------------------------------------------------------
// sharp hands over the raw Exif block (a TIFF structure, with the "Exif\0\0" prefix for JPEG and
// WebP, without it for PNG) and parses only Orientation, so the capture time is read here.

const TAG_EXIF_IFD_POINTER = 0x8769;
const TAG_DATE_TIME_ORIGINAL = 0x9003;
const TAG_OFFSET_TIME_ORIGINAL = 0x9011;
const TAG_SUBSEC_TIME_ORIGINAL = 0x9291;
const TYPE_ASCII = 2;
const TYPE_LONG = 4;

type IfdEntry = { type: number; count: number; valueAt: number };

/** Returns null for absent, blank ("    :  :     :  :  ") or impossible values, never throws. */
export function readExifCaptureTime(exif: Buffer | undefined): { time: Date; offset: string | null } | null {
  if (!exif) return null;
  const tiff = exif.toString("latin1", 0, 6) === "Exif\0\0" ? exif.subarray(6) : exif;
  try {
    if (readUint(tiff, 2, 2) !== 42) return null; // TIFF magic after the byte order mark
    const ifd0 = readIfd(tiff, readUint(tiff, 4, 4));
    const pointer = ifd0?.get(TAG_EXIF_IFD_POINTER);
    if (!pointer || pointer.type !== TYPE_LONG) return null;
    const exifIfd = readIfd(tiff, readUint(tiff, pointer.valueAt, 4));
    const dateText = readAscii(tiff, exifIfd.get(TAG_DATE_TIME_ORIGINAL));
    const offsetText = readAscii(tiff, exifIfd.get(TAG_OFFSET_TIME_ORIGINAL));
    const subSecText = readAscii(tiff, exifIfd.get(TAG_SUBSEC_TIME_ORIGINAL));
    return parseExifDateTime(dateText, offsetText, subSecText);
  } catch {
    return null; // A malformed Exif block is not a reason to refuse the photo.
  }
}

function littleEndian(tiff: Buffer): boolean {
  const order = tiff.toString("latin1", 0, 2);
  if (order === "II") return true;
  if (order === "MM") return false;
  throw new RangeError("not a TIFF byte order mark");
}

function readUint(tiff: Buffer, at: number, size: 2 | 4): number {
  const little = littleEndian(tiff);
  if (size === 2) return little ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at);
  return little ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at);
}

/** The entries of the IFD at `offset`, by tag. Reading past the end throws RangeError. */
function readIfd(tiff: Buffer, offset: number): Map<number, IfdEntry> {
  const entries = new Map<number, IfdEntry>();
  const count = readUint(tiff, offset, 2);
  for (let i = 0; i < count; i++) {
    const at = offset + 2 + i * 12;
    const type = readUint(tiff, at + 2, 2);
    const valueCount = readUint(tiff, at + 4, 4);
    // Values of up to 4 bytes sit in the entry itself, longer ones at the offset it holds.
    const inline = type === TYPE_ASCII ? valueCount <= 4 : true;
    entries.set(readUint(tiff, at, 2), { type, count: valueCount, valueAt: inline ? at + 8 : readUint(tiff, at + 8, 4) });
  }
  return entries;
}

function readAscii(tiff: Buffer, entry: IfdEntry | undefined): string | null {
  if (!entry || entry.type !== TYPE_ASCII) return null;
  if (entry.valueAt + entry.count > tiff.length) throw new RangeError("Exif string past the end");
  return tiff.toString("latin1", entry.valueAt, entry.valueAt + entry.count).replace(/\0.*$/s, "");
}

function parseExifDateTime(date: string | null, offset: string | null, subSec: string | null) {
  const parts = date?.trim().match(/^(\d{4}):(\d{2}):(\d{2}) (\d{2}):(\d{2}):(\d{2})$/);
  if (!parts) return null;
  const [year, month, day, hour, minute, second] = parts.slice(1).map(Number);
  const millis = subSec && /^\d+$/.test(subSec.trim()) ? Math.min(999, Math.round(Number(`0.${subSec.trim()}`) * 1000)) : 0;
  const wallClock = Date.UTC(year, month - 1, day, hour, minute, second, millis);
  const check = new Date(wallClock);
  // Date.UTC rolls 2024-02-30 over to March; such a value is not a real time.
  if (year < 1 || check.getUTCMonth() !== month - 1 || check.getUTCDate() !== day || hour > 23 || minute > 59 || second > 59) {
    return null;
  }
  const zone = offset?.trim().match(/^([+-])(\d{2}):(\d{2})$/);
  if (!zone) return { time: check, offset: null };
  const offsetMinutes = (zone[1] === "-" ? -1 : 1) * (Number(zone[2]) * 60 + Number(zone[3]));
  return { time: new Date(wallClock - offsetMinutes * 60_000), offset: zone[0] };
}
