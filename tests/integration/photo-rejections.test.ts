/**
 * Every kind of file photo intake refuses answers a clear 4xx and leaves nothing behind: no row
 * in photos and no object in the bucket (staging or accepted) for the unit. Fixtures are made at
 * test time (support/fixtures/make-photos.ts).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { canDecodeHeic } from "@/lib/imaging/normalize";
import { signIn, type Session } from "../support/http";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { garbleMiddle, makeFtypFile, makePhotoLikeJpeg, makePngBomb } from "@/support/fixtures/make-photos";
import { createPhotoUnits, photoRowsFor, storedKeysFor, uploadPhoto } from "../support/photos";

const MiB = 1024 * 1024;
let inspector: Session;
let unit: string;

beforeAll(async () => {
  const vellmoor = await workspaceBySlug("vellmoor");
  inspector = await signIn((await createUser({ workspaceId: vellmoor.id, roles: ["inspector"], email: uniqueEmail("photo-rejects") })).email, TEST_PASSWORD);
  [unit] = (await createPhotoUnits({ slug: "vellmoor" })).unitIds;
});

type Case = { name: string; bytes: () => Promise<Buffer> | Buffer; contentType?: string; declaredBytes?: number; status: number; code: string; message: RegExp; at: "intent" | "finalise" };

const svg = Buffer.from('<?xml version="1.0"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><rect width="10" height="10"/></svg>');

const CASES: Case[] = [
  { name: "a 0-byte file (declared)", bytes: () => Buffer.alloc(0), status: 400, code: "empty", message: /empty/, at: "intent" },
  { name: "a 0-byte file declared as 2 KB", bytes: () => Buffer.alloc(0), declaredBytes: 2048, status: 400, code: "empty", message: /empty/, at: "finalise" },
  { name: "a file over 40 MB (declared)", bytes: () => Buffer.alloc(16), declaredBytes: 40 * MiB + 1, status: 413, code: "too_large", message: /at most 40\.0 MB/, at: "intent" },
  {
    name: "a file over 40 MB declared as small",
    bytes: async () => Buffer.concat([await makePhotoLikeJpeg({ width: 64, height: 48 }), Buffer.alloc(40 * MiB)]),
    declaredBytes: 5000,
    status: 413,
    code: "too_large",
    message: /40\.0 MB/,
    at: "finalise",
  },
  { name: "an SVG (declared)", bytes: () => svg, contentType: "image/svg+xml", status: 415, code: "unsupported_format", message: /SVG drawing/, at: "intent" },
  { name: "an SVG sent as image/jpeg", bytes: () => svg, status: 415, code: "unsupported_format", message: /SVG drawing/, at: "finalise" },
  { name: "a text file sent as image/jpeg", bytes: () => Buffer.from("serial,grade\nA1,B\n"), status: 415, code: "unsupported_format", message: /text file/, at: "finalise" },
  { name: "a PDF (declared)", bytes: () => Buffer.from("%PDF-1.7\n"), contentType: "application/pdf", status: 415, code: "unsupported_format", message: /PDF/, at: "intent" },
  {
    name: "a PDF sent as image/png",
    bytes: () => Buffer.from("%PDF-1.7\n%\u00e2\u00e3\n1 0 obj\n"),
    contentType: "image/png",
    status: 415,
    code: "unsupported_format",
    message: /PDF/,
    at: "finalise",
  },
  {
    name: "a truncated JPEG",
    bytes: async () => {
      const j = await makePhotoLikeJpeg({ width: 800, height: 600, seed: 3 });
      return j.subarray(0, Math.floor(j.length * 0.6));
    },
    status: 422,
    code: "corrupt",
    message: /damaged or incomplete/,
    at: "finalise",
  },
  {
    name: "a JPEG with garbled data",
    bytes: async () => garbleMiddle(await makePhotoLikeJpeg({ width: 800, height: 600, seed: 4 }), 400),
    status: 422,
    code: "corrupt",
    message: /damaged or incomplete/,
    at: "finalise",
  },
  // 20000 × 20000 = 400 megapixels in a ~50 KB valid PNG: a decompression bomb.
  { name: "a decompression bomb (400 MP PNG)", bytes: () => makePngBomb(20000, 20000), contentType: "image/png", status: 422, code: "too_many_pixels", message: /megapixels/, at: "finalise" },
  // 7072 × 7072 = 50,013,184 pixels: just over the 50-megapixel limit.
  { name: "a photo just over 50 megapixels", bytes: () => makePngBomb(7072, 7072), contentType: "image/png", status: 422, code: "too_many_pixels", message: /50 megapixels/, at: "finalise" },
];
if (!canDecodeHeic()) {
  CASES.push(
    {
      name: "a HEIC photo (declared)",
      bytes: () => makeFtypFile("heic", ["mif1", "heic"]),
      contentType: "image/heic",
      status: 415,
      code: "unsupported_format",
      message: /convert it to JPEG/,
      at: "intent",
    },
    { name: "a HEIC photo sent as image/jpeg", bytes: () => makeFtypFile("heic", ["mif1", "heic"]), status: 415, code: "unsupported_format", message: /convert it to JPEG/, at: "finalise" },
  );
}

describe.each(CASES.map((c) => [c.name, c] as const))("refusing %s", (_name, c) => {
  it(`answers ${c.status} ${c.code} at ${c.at} and stores nothing`, async () => {
    const bytes = await c.bytes();
    const rowsBefore = await photoRowsFor(unit);
    const { intent, finalise } = await uploadPhoto(inspector, unit, bytes, { contentType: c.contentType ?? "image/jpeg", declaredBytes: c.declaredBytes });
    const answer = c.at === "intent" ? intent : finalise;
    if (c.at === "finalise") expect(intent.status).toBe(201);
    expect(answer?.status, JSON.stringify(answer?.body)).toBe(c.status);
    const error = (answer?.body as { error: { code: string; message: string } }).error;
    expect(error.code).toBe(c.code);
    expect(error.message).toMatch(c.message);
    expect(await photoRowsFor(unit)).toEqual(rowsBefore);
    expect(await storedKeysFor(unit)).toEqual([]);
  });
});
