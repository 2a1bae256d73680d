/**
 * Why an uploaded photo is refused, and the magic-byte sniffing that decides what a file claims to
 * be before any decoder sees it. Sniffing first means an SVG, PDF or TIFF never reaches libvips
 * (which would happily read some of them) and the person gets a message naming what they sent.
 */

export type PhotoRejectionCode = "unsupported_format" | "too_large" | "too_many_pixels" | "corrupt" | "empty";

export class PhotoRejectedError extends Error {
  readonly code: PhotoRejectionCode;

  constructor(code: PhotoRejectionCode, message: string, options?: { cause?: unknown }) {
    super(message, { cause: options?.cause });
    this.name = "PhotoRejectedError";
    this.code = code;
  }
}

/**
 * Formats the normaliser decodes. AVIF and HEIC only where the installed libheif has the decoder
 * (the prebuilt sharp 0.35 has AV1 but no HEVC, so HEIC is refused there).
 */
export type AcceptedPhotoFormat = "jpeg" | "png" | "webp" | "avif" | "heic";

/**
 * What the first bytes say. `heif` is an ISO-BMFF image whose brands name no codec we can tell
 * apart (plain `mif1`); the decoder's metadata settles it. `heic` is HEVC-coded HEIF.
 */
export type SniffedFormat = { kind: "accepted"; format: AcceptedPhotoFormat } | { kind: "heif" } | { kind: "heic" } | { kind: "refused"; message: string };

const ACCEPTED_LIST = "JPEG, PNG, WebP or AVIF";

export const heicMessage = () => "This file is a HEIC photo, which this server cannot read; convert it to JPEG and upload again.";

const refusedNamed = (what: string): SniffedFormat => ({
  kind: "refused",
  message: `This file is ${what}, which is not accepted as a photo; upload it as ${ACCEPTED_LIST}.`,
});

const startsWith = (bytes: Buffer, signature: number[], at = 0) => bytes.length >= at + signature.length && signature.every((byte, i) => bytes[at + i] === byte);

const ascii = (bytes: Buffer, start: number, end: number) => bytes.toString("latin1", start, end);

// ISO-BMFF brands (ftyp major/compatible). AVIF: avif (still), avis (sequence). HEVC-coded HEIF:
// heic, heix, heim, heis, hevc, hevx, hevm, hevs (from memory, (b)).
const AVIF_BRANDS = new Set(["avif", "avis"]);
const HEIC_BRANDS = new Set(["heic", "heix", "heim", "heis", "hevc", "hevx", "hevm", "hevs"]);
const GENERIC_HEIF_BRANDS = new Set(["mif1", "msf1", "miaf"]);

function sniffIsoBmff(bytes: Buffer): SniffedFormat | null {
  if (bytes.length < 16 || ascii(bytes, 4, 8) !== "ftyp") return null;
  const boxSize = bytes.readUInt32BE(0);
  const end = Math.min(boxSize >= 16 ? boxSize : 16, bytes.length);
  // Major brand at 8, minor version at 12, compatible brands from 16 to the end of the box.
  const brands = [ascii(bytes, 8, 12)];
  for (let at = 16; at + 4 <= end; at += 4) brands.push(ascii(bytes, at, at + 4));
  if (brands.some((brand) => AVIF_BRANDS.has(brand))) return { kind: "accepted", format: "avif" };
  if (brands.some((brand) => HEIC_BRANDS.has(brand))) return { kind: "heic" };
  if (brands.some((brand) => GENERIC_HEIF_BRANDS.has(brand))) return { kind: "heif" };
  if (brands.some((brand) => ["qt  ", "isom", "mp41", "mp42", "M4V "].includes(brand))) {
    return refusedNamed("a video");
  }
  return null;
}

/** Text (SVG, HTML, CSV…) is recognised by its first non-blank characters being printable. */
function sniffText(bytes: Buffer): SniffedFormat | null {
  const head = bytes
    .subarray(0, 1024)
    .toString("utf8")
    .replace(/^\uFEFF/, "")
    .trimStart();
  if (head.length === 0) return null;
  // An SVG may open with an XML declaration, a doctype or comments before its <svg> element.
  if (head.startsWith("<") && /<svg[\s>]/i.test(head)) return refusedNamed("an SVG drawing");
  const sample = head.slice(0, 256);
  const printable = [...sample].filter((ch) => ch === "\n" || ch === "\r" || ch === "\t" || (ch >= " " && ch !== "\uFFFD"));
  if (printable.length === sample.length) return refusedNamed("a text file, not an image");
  return null;
}

/** Decides from the first bytes what a file is; only accepted formats go on to the decoder. */
export function sniffPhotoFormat(bytes: Buffer): SniffedFormat {
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return { kind: "accepted", format: "jpeg" };
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return { kind: "accepted", format: "png" };
  if (bytes.length >= 12 && ascii(bytes, 0, 4) === "RIFF" && ascii(bytes, 8, 12) === "WEBP") {
    return { kind: "accepted", format: "webp" };
  }
  const isoBmff = sniffIsoBmff(bytes);
  if (isoBmff) return isoBmff;
  if (ascii(bytes, 0, 6) === "GIF87a" || ascii(bytes, 0, 6) === "GIF89a") return refusedNamed("a GIF image");
  if (startsWith(bytes, [0x49, 0x49, 0x2a, 0x00]) || startsWith(bytes, [0x4d, 0x4d, 0x00, 0x2a])) {
    return refusedNamed("a TIFF image");
  }
  if (ascii(bytes, 0, 5) === "%PDF-") return refusedNamed("a PDF document");
  if (ascii(bytes, 0, 2) === "BM") return refusedNamed("a BMP image");
  if (ascii(bytes, 0, 4) === "8BPS") return refusedNamed("a Photoshop document");
  if (startsWith(bytes, [0xff, 0x0a]) || startsWith(bytes, [0, 0, 0, 0x0c, 0x4a, 0x58, 0x4c, 0x20])) {
    return refusedNamed("a JPEG XL image");
  }
  if (startsWith(bytes, [0, 0, 0, 0x0c, 0x6a, 0x50, 0x20, 0x20])) return refusedNamed("a JPEG 2000 image");
  if (startsWith(bytes, [0x50, 0x4b, 0x03, 0x04])) return refusedNamed("a ZIP archive");
  if (startsWith(bytes, [0x1f, 0x8b])) return refusedNamed("a compressed (gzip) file");
  const text = sniffText(bytes);
  if (text) return text;
  return {
    kind: "refused",
    message: `This file is not an image this server recognises; upload a photo as ${ACCEPTED_LIST}.`,
  };
}
