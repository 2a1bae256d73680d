/**
 * Photo intake over HTTP against the test server, its worker, PostgreSQL and s3rver (no mocks):
 * upload intent → PUT to the presigned URL → finalise → background processing → serving.
 */
import { createHash } from "node:crypto";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { photos, units } from "@/db/schema";
import { api, signIn, type Session } from "../support/http";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { makePhotoLikeJpeg } from "@/support/fixtures/make-photos";
import { createPhotoUnits, fetchBytes, finalise, photoRowsFor, putToStore, requestUpload, storedKeysFor, uploadPhoto, waitForPhoto, type PhotoJson } from "../support/photos";

let inspector: Session;
let trainer: Session;
let auditor: Session;
let foreignLead: Session;
let unitA: string;
let unitB: string;
let unitC: string;

const sha256 = (bytes: Buffer) => createHash("sha256").update(bytes).digest("hex");

/** A 1200 × 900 photo-like JPEG stored as a phone held upright stores it (Exif 6), with GPS and a capture time. */
async function phonePhoto(seed: number) {
  const base = await makePhotoLikeJpeg({ width: 1200, height: 900, seed, orientation: 6 });
  return sharp(base)
    .withMetadata({ orientation: 6 })
    .withExifMerge({
      IFD2: { DateTimeOriginal: "2026:11:28 14:05:09", OffsetTimeOriginal: "+02:00" },
      // Invented coordinates: the original keeps them, the derivatives must not.
      IFD3: { GPSLatitudeRef: "N", GPSLatitude: "12/1 34/1 56/1", GPSLongitudeRef: "E", GPSLongitude: "65/1 43/1 21/1" },
    })
    .jpeg({ quality: 90 })
    .toBuffer();
}

beforeAll(async () => {
  const vellmoor = await workspaceBySlug("vellmoor");
  const make = async (roles: ("inspector" | "trainer" | "auditor")[]) => signIn((await createUser({ workspaceId: vellmoor.id, roles, email: uniqueEmail(`photos-${roles[0]}`) })).email, TEST_PASSWORD);
  [inspector, trainer, auditor] = await Promise.all([make(["inspector"]), make(["trainer"]), make(["auditor"])]);
  foreignLead = await signIn("lead@quillfen.example");
  const created = await createPhotoUnits({ slug: "vellmoor" }, { count: 3 });
  [unitA, unitB, unitC] = created.unitIds;
});

describe("an accepted photo", () => {
  let photo: PhotoJson;
  let original: Buffer;

  beforeAll(async () => {
    original = await phonePhoto(21);
    const { intent, finalise: done } = await uploadPhoto(inspector, unitA, original, { fileName: "IMG_0001.jpg" });
    expect(intent.status).toBe(201);
    expect(done?.status, JSON.stringify(done?.body)).toBe(201);
    photo = done!.body.photo;
  });

  it("is ready with its upright size, format and the SHA-256 of exactly the uploaded bytes", () => {
    expect(photo.status).toBe("ready");
    // CIPA DC-008 (Exif 2.3), Orientation 6: the stored raster is turned 90° clockwise for
    // display, so a stored 1200 × 900 image stands upright as 900 × 1200. (a)
    expect([photo.width, photo.height]).toEqual([900, 1200]);
    expect(photo.orientation).toBe(6);
    expect(photo.format).toBe("jpeg");
    expect(photo.bytes).toBe(original.length);
    // Reference: SHA-256 of FIPS 180-4 as implemented by Node's crypto (OpenSSL). (a)
    expect(photo.sha256).toBe(sha256(original));
    // 14:05:09 at +02:00 is 12:05:09 UTC (Exif 2.31 OffsetTimeOriginal). (a)
    expect(photo.captureTime).toBe("2026-11-28T12:05:09.000Z");
  });

  it("serves an upright WebP thumbnail (long edge 320) and preview with no metadata, privately cached", async () => {
    const thumb = await fetchBytes(inspector, photo.urls!.thumbnail);
    expect(thumb.status).toBe(200);
    expect(thumb.headers.get("content-type")).toBe("image/webp");
    expect(thumb.headers.get("cache-control")).toMatch(/^private/);
    expect(thumb.headers.get("x-content-type-options")).toBe("nosniff");
    const thumbMeta = await sharp(thumb.bytes).metadata();
    expect([thumbMeta.format, thumbMeta.width, thumbMeta.height]).toEqual(["webp", 240, 320]);
    expect(thumbMeta.exif).toBeUndefined();
    const preview = await fetchBytes(inspector, photo.urls!.preview);
    const previewMeta = await sharp(preview.bytes).metadata();
    // 900 × 1200 fits inside 2560, so the preview keeps the full upright size.
    expect([previewMeta.format, previewMeta.width, previewMeta.height]).toEqual(["webp", 900, 1200]);
    expect(previewMeta.exif).toBeUndefined();
    const again = await fetchBytes(inspector, photo.urls!.thumbnail, { follow: false });
    const etag = again.headers.get("etag")!;
    const revalidated = await fetch(`${process.env.TEST_BASE_URL}${photo.urls!.thumbnail}`, { headers: { cookie: inspector.cookie, "if-none-match": etag } });
    expect(revalidated.status).toBe(304);
  });

  it("keeps the original untouched (same bytes, GPS still in it) behind a short-lived presigned GET", async () => {
    const redirect = await fetchBytes(inspector, photo.urls!.original, { follow: false });
    expect(redirect.status).toBe(302);
    expect(redirect.headers.get("location")).toMatch(/X-Amz-Expires=60\b/);
    const downloaded = await fetchBytes(inspector, photo.urls!.original);
    expect(sha256(downloaded.bytes)).toBe(sha256(original));
    // TIFF tag 0x8825 is the GPS IFD pointer (TIFF 6.0 / Exif 2.3); little-endian as libvips writes it.
    expect((await sharp(downloaded.bytes).metadata()).exif!.indexOf(Buffer.from([0x25, 0x88]))).toBeGreaterThan(0);
  });

  it("stores exactly three objects under server-built keys and one row", async () => {
    const rows = await photoRowsFor(unitA);
    expect(rows).toHaveLength(1);
    const prefix = `photos/${rows[0].workspaceId}/${unitA}/${photo.id}/`;
    expect(await storedKeysFor(unitA)).toEqual([`${prefix}original`, `${prefix}preview.webp`, `${prefix}thumbnail.webp`]);
    expect(rows[0].fileName).toBe("IMG_0001.jpg");
    expect(rows[0].originalKey).not.toContain("IMG_0001");
  });

  it("the same file again on the same unit is the same photo", async () => {
    const { finalise: again } = await uploadPhoto(inspector, unitA, original);
    expect(again?.status).toBe(200);
    expect(again?.body.outcome).toBe("duplicate");
    expect(again?.body.photo.id).toBe(photo.id);
    expect(await photoRowsFor(unitA)).toHaveLength(1);
    expect(await storedKeysFor(unitA)).toHaveLength(3);
  });

  it("repeating a finalise with the same ticket answers the same photo", async () => {
    const jpeg = await makePhotoLikeJpeg({ width: 320, height: 240, seed: 31 });
    const intent = await requestUpload(inspector, unitA, { bytes: jpeg.length, viewKey: "back" });
    expect(await putToStore(intent.body, jpeg)).toBe(200);
    const first = await finalise(inspector, unitA, intent.body.ticket);
    const second = await finalise(inspector, unitA, intent.body.ticket);
    expect(first.status).toBe(201);
    expect(second.status).toBe(200);
    expect(second.body.outcome).toBe("replayed");
    expect(second.body.photo.id).toBe(first.body.photo.id);
  });

  it("the same file on another unit is flagged as a possible reused photo", async () => {
    const { finalise: other } = await uploadPhoto(inspector, unitB, original);
    expect(other?.status).toBe(201);
    expect(other?.body.photo.id).not.toBe(photo.id);
    expect(other?.body.photo.possibleReuse).toMatchObject({ photoId: photo.id, unitId: unitA });
    const list = await api<{ photos: PhotoJson[] }>(inspector, "GET", `/api/units/${unitA}/photos`);
    expect(list.body.photos.find((p) => p.id === photo.id)?.possibleReuse).toBeNull();
  });

  it("the photo list and details (with the uploader) are inspection work, which trainers read and auditors do not; the images are for every role; only inspectors and leads upload", async () => {
    for (const viewer of [trainer, auditor]) {
      // Trainers read inspection work (view only) to promote graded photos into the Gallery; auditors stay blind.
      const expected = viewer === trainer ? 200 : 403;
      expect((await api(viewer, "GET", `/api/units/${unitA}/photos`)).status).toBe(expected);
      expect((await api(viewer, "GET", `/api/photos/${photo.id}`)).status).toBe(expected);
      expect((await fetchBytes(viewer, photo.urls!.thumbnail)).status).toBe(200);
      expect((await requestUpload(viewer, unitA, { bytes: 1000 })).status).toBe(403);
    }
  });

  it("another workspace gets 404, exactly as for a missing photo", async () => {
    const missing = "00000000-0000-4000-8000-000000000000";
    for (const path of [`/api/photos/${photo.id}`, `/api/photos/${photo.id}/thumbnail`, `/api/photos/${photo.id}/original`]) {
      const theirs = await api(foreignLead, "GET", path);
      const none = await api(foreignLead, "GET", path.replace(photo.id, missing));
      expect(theirs.status).toBe(404);
      expect(theirs.body).toEqual(none.body);
    }
    expect((await api(foreignLead, "GET", `/api/units/${unitA}/photos`)).status).toBe(404);
    expect((await requestUpload(foreignLead, unitA, { bytes: 1000 })).status).toBe(404);
  });
});

describe("tickets and unit state", () => {
  it("a ticket for one unit does not finalise on another", async () => {
    const jpeg = await makePhotoLikeJpeg({ width: 320, height: 240, seed: 41 });
    const intent = await requestUpload(inspector, unitC, { bytes: jpeg.length });
    await putToStore(intent.body, jpeg);
    const wrong = await finalise(inspector, unitB, intent.body.ticket);
    expect(wrong.status).toBe(400);
    expect(wrong.body.error?.message).toMatch(/not valid for this unit/);
    const tampered = await finalise(
      inspector,
      unitC,
      intent.body.ticket.replace(/.$/, (c) => (c === "A" ? "B" : "A")),
    );
    expect(tampered.status).toBe(400);
    expect((await finalise(inspector, unitC, intent.body.ticket)).status).toBe(201);
  });

  it("a ticket issued to one inspector does not finalise for another (the uploader is checked)", async () => {
    const jpeg = await makePhotoLikeJpeg({ width: 320, height: 240, seed: 43 });
    const intent = await requestUpload(inspector, unitC, { bytes: jpeg.length });
    await putToStore(intent.body, jpeg);
    const colleague = await signIn((await createUser({ workspaceId: (await workspaceBySlug("vellmoor")).id, roles: ["inspector"], email: uniqueEmail("photos-colleague") })).email, TEST_PASSWORD);
    const taken = await finalise(colleague, unitC, intent.body.ticket);
    expect(taken.status).toBe(400);
    expect(taken.body.error?.message).toMatch(/not valid for this unit/);
    expect(await photoRowsFor(unitC).then((rows) => rows.some((r) => r.id === intent.body.photoId))).toBe(false);
    expect((await finalise(inspector, unitC, intent.body.ticket)).status).toBe(201);
  });

  it("a graded unit takes no new photos (409) but its photos stay visible", async () => {
    const [graded] = (await createPhotoUnits({ slug: "vellmoor" })).unitIds;
    await db().update(units).set({ status: "graded" }).where(eq(units.id, graded));
    const res = await requestUpload(inspector, graded, { bytes: 1000 });
    expect(res.status).toBe(409);
    expect(res.body.error?.message).toMatch(/graded/);
    expect((await api(inspector, "GET", `/api/units/${graded}/photos`)).status).toBe(200);
  });

  it("a view the part type does not have is refused with the views it has", async () => {
    const res = await requestUpload(inspector, unitC, { bytes: 1000, viewKey: "underside" });
    expect(res.status).toBe(400);
    expect(res.body.error?.message).toMatch(/Front, Back, Connector/);
  });
});

describe("a photo whose processing failed", () => {
  it("is retried on request and becomes ready again from its kept original", async () => {
    const [unit] = (await createPhotoUnits({ slug: "vellmoor" })).unitIds;
    const { finalise: done } = await uploadPhoto(inspector, unit, await makePhotoLikeJpeg({ width: 640, height: 480, seed: 71 }));
    const id = done!.body.photo.id;
    // As the worker leaves it after its last attempt failed (e.g. a long store outage).
    await db()
      .update(photos)
      .set({ status: "failed", failureCode: "processing_failed", failureReason: "The photo store was not reachable while this photo was being processed." })
      .where(eq(photos.id, id));
    expect((await api(trainer, "POST", `/api/photos/${id}/retry`)).status).toBe(403);
    const retried = await api<{ photo: PhotoJson }>(inspector, "POST", `/api/photos/${id}/retry`);
    expect(retried.status).toBe(202);
    // Queued again (the worker, woken at once, may already have taken it).
    expect(["queued", "processing", "ready"]).toContain(retried.body.photo.status);
    expect(retried.body.photo.failure).toBeNull();
    const ready = await waitForPhoto(inspector, id, (p) => p.status === "ready");
    expect([ready.width, ready.height, ready.failure]).toEqual([640, 480, null]);
    expect(await storedKeysFor(unit)).toHaveLength(3);
    expect((await api(inspector, "POST", `/api/photos/${id}/retry`)).status).toBe(409);
  });
});

describe("a file the decoder refuses after finalise stopped waiting", () => {
  it("shows as failed with the reason, its bytes already gone, and can be dismissed", async () => {
    const [unit] = (await createPhotoUnits({ slug: "vellmoor" })).unitIds;
    const good = await makePhotoLikeJpeg({ width: 640, height: 480, seed: 51 });
    const truncated = good.subarray(0, Math.floor(good.length / 2));
    const { finalise: accepted } = await uploadPhoto(inspector, unit, truncated, { wait: false });
    expect(accepted?.status).toBe(202);
    const failed = await waitForPhoto(inspector, accepted!.body.photo.id, (p) => p.status === "failed");
    expect(failed.failure?.code).toBe("corrupt");
    expect(failed.failure?.reason).toMatch(/damaged or incomplete/);
    expect(await storedKeysFor(unit)).toEqual([]);
    const dismissed = await api(inspector, "DELETE", `/api/photos/${failed.id}`);
    expect(dismissed.status).toBe(200);
    expect(await photoRowsFor(unit)).toEqual([]);
  });
});
