import { createHash } from "node:crypto";
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { MAX_PHOTO_BYTES, MAX_PHOTO_PIXELS, PhotoRejectedError, canDecodeAvif, canDecodeHeic, normalizePhoto, readExifCaptureTime, type PhotoRejectionCode } from "@/lib/imaging/normalize";
import {
  GRID_CELL,
  GRID_COLUMNS,
  GRID_PALETTE,
  GRID_ROWS,
  garbleMiddle,
  insertExifIntoJpeg,
  makeExifTiff,
  makeFtypFile,
  makeShortPng,
  makeOrientedGrid,
  makePhotoLikeJpeg,
  makePngBomb,
  seededRandom,
  type Rgb,
} from "@/support/fixtures/make-photos";

async function rejectionOf(input: Buffer): Promise<PhotoRejectedError> {
  const error = await normalizePhoto(input).then(
    () => null,
    (caught: unknown) => caught,
  );
  expect(error).toBeInstanceOf(PhotoRejectedError);
  return error as PhotoRejectedError;
}

async function expectRejected(input: Buffer, code: PhotoRejectionCode): Promise<string> {
  const error = await rejectionOf(input);
  expect(error.code).toBe(code);
  expect(error.message.length).toBeGreaterThan(20);
  return error.message;
}

const smallJpeg = () => makePhotoLikeJpeg({ width: 640, height: 480 });

// ---- Exif orientation -------------------------------------------------------------------------
// Source (a): libjpeg-turbo's jpegexiforient manual, which mirrors CIPA DC-008 (Exif), as copied
// into docs/references.md: stored (x, y) of a W × H raster → upright (x′, y′).
type Mapping = (x: number, y: number, w: number, h: number) => [number, number];
const UPRIGHT_POSITION: Record<number, Mapping> = {
  1: (x, y) => [x, y],
  2: (x, y, w) => [w - 1 - x, y],
  3: (x, y, w, h) => [w - 1 - x, h - 1 - y],
  4: (x, y, _w, h) => [x, h - 1 - y],
  5: (x, y) => [y, x],
  6: (x, y, _w, h) => [h - 1 - y, x],
  7: (x, y, w, h) => [h - 1 - y, w - 1 - x],
  8: (x, y, w) => [y, w - 1 - x],
};
// Same manual (a), its own table: where the stored 0th row and 0th column end up when upright.
const ZEROTH_ROW_AND_COLUMN: Record<number, [row: string, column: string]> = {
  1: ["top", "left"],
  2: ["top", "right"],
  3: ["bottom", "right"],
  4: ["bottom", "left"],
  5: ["left", "top"],
  6: ["right", "top"],
  7: ["right", "bottom"],
  8: ["left", "bottom"],
};

/** The edges of a uw × uh raster that every one of these points lies on. */
function edgesHolding(points: [number, number][], uw: number, uh: number): string[] {
  const edges: Record<string, (p: [number, number]) => boolean> = {
    top: ([, y]) => y === 0,
    bottom: ([, y]) => y === uh - 1,
    left: ([x]) => x === 0,
    right: ([x]) => x === uw - 1,
  };
  return Object.keys(edges).filter((edge) => points.every(edges[edge]));
}

describe("Exif orientation (CIPA DC-008 via the jpegexiforient manual, (a))", () => {
  it("the coordinate mapping agrees with the manual's 0th-row / 0th-column table", () => {
    const w = 5;
    const h = 3;
    for (const orientation of [1, 2, 3, 4, 5, 6, 7, 8]) {
      const swaps = orientation >= 5;
      const [uw, uh] = swaps ? [h, w] : [w, h];
      const map = UPRIGHT_POSITION[orientation];
      const row0 = Array.from({ length: w }, (_, x) => map(x, 0, w, h));
      const column0 = Array.from({ length: h }, (_, y) => map(0, y, w, h));
      const [rowSide, columnSide] = ZEROTH_ROW_AND_COLUMN[orientation];
      expect(edgesHolding(row0, uw, uh)).toEqual([rowSide]);
      expect(edgesHolding(column0, uw, uh)).toEqual([columnSide]);
    }
  });

  function nearestPaletteIndex(pixel: Rgb): number {
    let best = -1;
    let bestDistance = Infinity;
    GRID_PALETTE.forEach((colour, i) => {
      const distance = colour.reduce((sum, c, k) => sum + (c - pixel[k]) ** 2, 0);
      if (distance < bestDistance) [best, bestDistance] = [i, distance];
    });
    return best;
  }

  for (const format of ["png", "jpeg"] as const) {
    for (const orientation of [1, 2, 3, 4, 5, 6, 7, 8]) {
      it(`${format} with orientation ${orientation}: upright size and pixel layout`, async () => {
        const input = await makeOrientedGrid(orientation, format);
        const storedW = GRID_COLUMNS * GRID_CELL;
        const storedH = GRID_ROWS * GRID_CELL;
        expect((await sharp(input).metadata()).orientation).toBe(orientation); // the fixture is tagged

        const photo = await normalizePhoto(input);
        const [uprightW, uprightH] = orientation >= 5 ? [storedH, storedW] : [storedW, storedH];
        expect(photo.orientation).toBe(orientation);
        expect([photo.width, photo.height]).toEqual([uprightW, uprightH]);
        expect([photo.previewWidth, photo.previewHeight]).toEqual([uprightW, uprightH]);

        const { data, info } = await sharp(photo.preview).removeAlpha().raw().toBuffer({ resolveWithObject: true });
        expect([info.width, info.height]).toEqual([uprightW, uprightH]);
        for (let row = 0; row < GRID_ROWS; row++) {
          for (let column = 0; column < GRID_COLUMNS; column++) {
            // The centre of each stored cell must land where the standard puts it, in its colour.
            const stored: [number, number] = [column * GRID_CELL + 8, row * GRID_CELL + 8];
            const [ux, uy] = UPRIGHT_POSITION[orientation](stored[0], stored[1], storedW, storedH);
            const at = (uy * info.width + ux) * 3;
            const seen: Rgb = [data[at], data[at + 1], data[at + 2]];
            expect({ cell: [column, row], colour: nearestPaletteIndex(seen) }).toEqual({
              cell: [column, row],
              colour: row * GRID_COLUMNS + column,
            });
          }
        }
      });
    }
  }
});

// ---- Rejections -------------------------------------------------------------------------------
describe("rejections", () => {
  it("empty input → empty", async () => {
    await expectRejected(Buffer.alloc(0), "empty");
  });

  it("more than 40 MB → too_large; exactly 40 MB is judged on its content instead", async () => {
    const jpegStart = Buffer.from([0xff, 0xd8, 0xff, 0xe0]);
    const over = Buffer.alloc(MAX_PHOTO_BYTES + 1);
    jpegStart.copy(over);
    expect(MAX_PHOTO_BYTES).toBe(40 * 1024 * 1024);
    await expectRejected(over, "too_large");
    const exactly = over.subarray(0, MAX_PHOTO_BYTES);
    await expectRejected(exactly, "corrupt"); // JPEG magic followed by zeros: not too_large
  });

  it("a PNG bomb declaring 20000 × 20000 → too_many_pixels, refused from its header", async () => {
    const bomb = makePngBomb(20_000, 20_000);
    expect(bomb.length).toBeLessThan(200_000); // 400 megapixels in a small file
    const message = await expectRejected(bomb, "too_many_pixels");
    expect(message).toContain("20000 × 20000");
  });

  it("the pixel limit is 'more than 50 megapixels': 10000 × 5000 passes the check, 10000 × 5001 does not", async () => {
    expect(MAX_PHOTO_PIXELS).toBe(50_000_000);
    // PNGs with one row of data: the one at the limit gets past the pixel check, then fails to decode.
    await expectRejected(makeShortPng(10_000, 5_000), "corrupt");
    await expectRejected(makeShortPng(10_000, 5_001), "too_many_pixels");
  });

  it("SVG → unsupported_format, although libvips could render it", async () => {
    const svg = Buffer.from('<?xml version="1.0"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="40" height="40"><rect width="40" height="40" fill="red"/></svg>');
    expect((await sharp(svg).metadata()).format).toBe("svg"); // the sniffing is what stops it
    expect(await expectRejected(svg, "unsupported_format")).toContain("SVG");
    const bare = Buffer.from('  <svg xmlns="http://www.w3.org/2000/svg"></svg>');
    await expectRejected(bare, "unsupported_format");
  });

  it("GIF and TIFF (both readable by libvips) → unsupported_format, named in the message", async () => {
    const base = sharp({ create: { width: 20, height: 20, channels: 3, background: "#c33" } });
    const gif = await base.clone().gif().toBuffer();
    const tiff = await base.clone().tiff().toBuffer();
    expect(await expectRejected(gif, "unsupported_format")).toContain("GIF");
    expect(await expectRejected(tiff, "unsupported_format")).toContain("TIFF");
  });

  it("PDF, plain text and random bytes → unsupported_format", async () => {
    const pdf = Buffer.from("%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n");
    expect(await expectRejected(pdf, "unsupported_format")).toContain("PDF");
    expect(await expectRejected(Buffer.from("serial,grade\nKX2-0001,A\n"), "unsupported_format")).toContain("text");
    const random = seededRandom(11);
    const noise = Buffer.from(Array.from({ length: 4096 }, () => Math.floor(random() * 256)));
    await expectRejected(noise, "unsupported_format");
  });

  it("an animated WebP → unsupported_format (a photo is one still frame)", async () => {
    const frame = (colour: string) =>
      sharp({ create: { width: 32, height: 32, channels: 3, background: colour } })
        .png()
        .toBuffer();
    const animated = await sharp([await frame("#d22"), await frame("#2d2")], { join: { animated: true } })
      .webp()
      .toBuffer();
    expect((await sharp(animated).metadata()).pages).toBe(2);
    expect(await expectRejected(animated, "unsupported_format")).toContain("animated");
  });

  it.skipIf(canDecodeHeic())("HEIC → unsupported_format with 'convert it to JPEG'", async () => {
    for (const heic of [makeFtypFile("heic", ["mif1", "heic"]), makeFtypFile("mif1", ["mif1", "heix"])]) {
      const message = await expectRejected(heic, "unsupported_format");
      expect(message).toContain("HEIC");
      expect(message).toContain("convert it to JPEG");
    }
  });

  it("truncated JPEG, PNG and WebP → corrupt (not a grey half-image)", async () => {
    const jpeg = await smallJpeg();
    const png = await sharp(jpeg).png().toBuffer();
    const webp = await sharp(jpeg).webp().toBuffer();
    for (const whole of [jpeg, png, webp]) {
      await expect(normalizePhoto(whole)).resolves.toBeDefined(); // the intact file is fine
      await expectRejected(whole.subarray(0, Math.floor(whole.length * 0.6)), "corrupt");
    }
  });

  it("a JPEG with garbled data in the middle → corrupt", async () => {
    await expectRejected(garbleMiddle(await smallJpeg()), "corrupt");
  });

  it("JPEG or PNG magic followed by rubbish → corrupt", async () => {
    await expectRejected(Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.alloc(500, 7)]), "corrupt");
    await expectRejected(Buffer.concat([makeShortPng(1, 1).subarray(0, 8), Buffer.alloc(100, 9)]), "corrupt");
  });
});

// ---- Derivatives and identity -----------------------------------------------------------------
describe("derivatives", () => {
  it("sha256 and bytes describe the original bytes exactly (reference: node:crypto)", async () => {
    const input = await smallJpeg();
    const photo = await normalizePhoto(input);
    expect(photo.sha256).toBe(createHash("sha256").update(input).digest("hex"));
    expect(photo.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(photo.bytes).toBe(input.length);
    expect(photo.format).toBe("jpeg");
  });

  it("a 4000 × 3000 photo tagged 6: upright 3000 × 4000, preview long edge 2560, thumbnail 320, both WebP", async () => {
    const photo = await normalizePhoto(await makePhotoLikeJpeg({ width: 4000, height: 3000, orientation: 6 }));
    expect([photo.width, photo.height]).toEqual([3000, 4000]);
    expect([photo.previewWidth, photo.previewHeight]).toEqual([1920, 2560]);
    expect([photo.thumbnailWidth, photo.thumbnailHeight]).toEqual([240, 320]);
    for (const [output, size] of [
      [photo.preview, [1920, 2560]],
      [photo.thumbnail, [240, 320]],
    ] as const) {
      const meta = await sharp(output).metadata();
      expect(meta.format).toBe("webp");
      expect([meta.width, meta.height]).toEqual(size);
    }
  });

  it("a small image is not enlarged", async () => {
    const tiny = await normalizePhoto(await makePhotoLikeJpeg({ width: 200, height: 100 }));
    expect([tiny.previewWidth, tiny.previewHeight, tiny.thumbnailWidth, tiny.thumbnailHeight]).toEqual([200, 100, 200, 100]);
    const mid = await normalizePhoto(await makePhotoLikeJpeg({ width: 500, height: 300 }));
    expect([mid.previewWidth, mid.previewHeight]).toEqual([500, 300]);
    expect([mid.thumbnailWidth, mid.thumbnailHeight]).toEqual([320, 192]);
  });

  it("outputs carry no metadata: a GPS- and ICC-tagged input gives no Exif, ICC, XMP or orientation", async () => {
    const input = await sharp(await smallJpeg())
      .withIccProfile("p3")
      .withExif({
        IFD0: { Make: "Invented Optics" },
        IFD3: { GPSLatitudeRef: "N", GPSLatitude: "52/1 31/1 0/1", GPSLongitudeRef: "E", GPSLongitude: "13/1 24/1 0/1" },
      })
      .withMetadata({ orientation: 3 })
      .jpeg()
      .toBuffer();
    const inputMeta = await sharp(input).metadata();
    expect(inputMeta.exif?.toString("latin1")).toContain("Invented Optics"); // the fixture really is tagged
    expect(inputMeta.hasProfile).toBe(true);

    const photo = await normalizePhoto(input);
    for (const output of [photo.preview, photo.thumbnail]) {
      const meta = await sharp(output).metadata();
      expect(meta.exif).toBeUndefined();
      expect(meta.icc).toBeUndefined();
      expect(meta.xmp).toBeUndefined();
      expect(meta.orientation ?? 1).toBe(1);
      // Byte-level check of the WebP RIFF container: no EXIF, ICCP or XMP chunk.
      const text = output.toString("latin1");
      for (const chunk of ["EXIF", "ICCP", "XMP "]) expect(text.includes(chunk)).toBe(false);
    }
  });

  it("colours are converted to sRGB through the embedded profile (P3, CMYK), then the profile is dropped", async () => {
    const patch = () => sharp({ create: { width: 64, height: 64, channels: 3, background: { r: 220, g: 40, b: 30 } } });
    const p3 = await patch().withMetadata({ icc: "p3" }).png().toBuffer();
    const cmyk = await patch().toColourspace("cmyk").jpeg({ quality: 100 }).toBuffer();
    expect((await sharp(p3).metadata()).icc).toBeDefined();
    expect((await sharp(cmyk).metadata()).space).toBe("cmyk");
    for (const input of [p3, cmyk]) {
      // Reference: libvips/lcms's own colour-managed decode of the same file, straight to sRGB.
      const reference = await sharp(input).raw().toBuffer();
      const ignoringProfile = await sharp(input, { ignoreIcc: true }).removeAlpha().raw().toBuffer();
      const photo = await normalizePhoto(input);
      const centre = (32 * 64 + 32) * 3;
      if (input === p3) expect(Math.abs(ignoringProfile[centre] - reference[centre])).toBeGreaterThan(8); // the check can fail
      // Both derivatives: the patch is flat, so the thumbnail's centre is the same colour.
      for (const derivative of [photo.preview, photo.thumbnail]) {
        const { data: seen, info } = await sharp(derivative).removeAlpha().raw().toBuffer({ resolveWithObject: true });
        const at = (Math.floor(info.height / 2) * info.width + Math.floor(info.width / 2)) * 3;
        for (let k = 0; k < 3; k++) expect(Math.abs(seen[at + k] - reference[centre + k])).toBeLessThanOrEqual(4);
        expect((await sharp(derivative).metadata()).hasProfile).toBe(false);
      }
    }
  });

  it("profile-less inputs (grey JPEG, 16-bit PNG, PNG with alpha) keep their colours", async () => {
    const grey = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 90, g: 90, b: 90 } } })
      .greyscale()
      .jpeg({ quality: 100 })
      .toBuffer();
    const deep = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 200, g: 120, b: 40 } } })
      .png()
      .toColourspace("rgb16")
      .toBuffer();
    const alpha = await sharp({ create: { width: 64, height: 48, channels: 4, background: { r: 30, g: 160, b: 220, alpha: 1 } } })
      .png()
      .toBuffer();
    expect((await sharp(deep).metadata()).depth).toBe("ushort"); // the fixture really is 16-bit
    for (const input of [grey, deep, alpha]) {
      expect((await sharp(input).metadata()).hasProfile).toBe(false);
      // Reference: libvips' own decode of the same file to 8-bit sRGB.
      const reference = await sharp(input).removeAlpha().toColourspace("srgb").raw().toBuffer();
      const photo = await normalizePhoto(input);
      expect([photo.width, photo.height]).toEqual([64, 48]);
      for (const output of [photo.preview, photo.thumbnail]) {
        const seen = await sharp(output).removeAlpha().toColourspace("srgb").raw().toBuffer();
        const centre = (24 * 64 + 32) * 3;
        for (let k = 0; k < 3; k++) expect(Math.abs(seen[centre + k] - reference[centre + k]), `channel ${k}`).toBeLessThanOrEqual(4);
      }
    }
  });

  it.runIf(canDecodeAvif())("AVIF is accepted when the installed libheif decodes it", async () => {
    const avif = await sharp(await smallJpeg())
      .avif()
      .toBuffer();
    const photo = await normalizePhoto(avif);
    expect(photo.format).toBe("avif");
    expect([photo.width, photo.height]).toEqual([640, 480]);
  });
});

// ---- Capture time -----------------------------------------------------------------------------
// Exif DateTimeOriginal is "YYYY:MM:DD HH:MM:SS", blank when unknown; OffsetTimeOriginal is
// "±HH:MM"; with no offset the time is read as UTC — (a) Android ExifInterface reference pages
// (TAG_DATETIME_ORIGINAL, TAG_OFFSET_TIME, getDateTimeOriginal), which quote the Exif standard.
describe("capture time", () => {
  const withExif = async (ifd2: Record<string, string>) =>
    sharp(await smallJpeg())
      .withExif({ IFD2: ifd2 })
      .jpeg()
      .toBuffer();

  it("reads DateTimeOriginal and OffsetTimeOriginal written by libvips/libexif", async () => {
    const photo = await normalizePhoto(await withExif({ DateTimeOriginal: "2024:05:06 07:08:09", OffsetTimeOriginal: "+02:00" }));
    expect(photo.captureTime?.toISOString()).toBe("2024-05-06T05:08:09.000Z");
    expect(photo.captureTimeOffset).toBe("+02:00");
  });

  it("without an offset the wall-clock time is taken as UTC and the offset is null", async () => {
    const photo = await normalizePhoto(await withExif({ DateTimeOriginal: "2023:12:31 23:59:58" }));
    expect(photo.captureTime?.toISOString()).toBe("2023-12-31T23:59:58.000Z");
    expect(photo.captureTimeOffset).toBeNull();
  });

  it("no Exif, blank or impossible dates give null", async () => {
    expect((await normalizePhoto(await smallJpeg())).captureTime).toBeNull();
    expect((await normalizePhoto(await withExif({ DateTimeOriginal: "    :  :     :  :  " }))).captureTime).toBeNull();
    expect((await normalizePhoto(await withExif({ DateTimeOriginal: "2024:02:30 10:00:00" }))).captureTime).toBeNull();
    expect(readExifCaptureTime(Buffer.from("Exif\0\0garbage"))).toBeNull();
  });

  it("reads a big-endian (MM) Exif block built by hand, with sub-seconds and a negative offset", async () => {
    // Tags 0x9003 DateTimeOriginal, 0x9011 OffsetTimeOriginal, 0x9291 SubSecTimeOriginal (b).
    const tiff = makeExifTiff(
      [
        { tag: 0x9003, text: "2022:01:02 03:04:05" },
        { tag: 0x9011, text: "-05:30" },
        { tag: 0x9291, text: "25" },
      ],
      true,
    );
    const photo = await normalizePhoto(insertExifIntoJpeg(await smallJpeg(), tiff));
    expect(photo.captureTime?.toISOString()).toBe("2022-01-02T08:34:05.250Z");
    expect(photo.captureTimeOffset).toBe("-05:30");
  });
});
