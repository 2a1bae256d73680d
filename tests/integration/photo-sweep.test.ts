/**
 * The scheduled orphan sweep, called directly against the test bucket and database: objects no
 * row names are deleted once older than the grace period, nothing else is, and the deletion gate
 * can hold an original back.
 */
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { beforeAll, expect, it } from "vitest";
import { db } from "@/db/client";
import { photos } from "@/db/schema";
import { sweepOrphans } from "@/lib/photos/sweep";
import { headObject, putObject } from "@/lib/storage/s3";
import { api, signIn, type Session } from "../support/http";
import { createUser, TEST_PASSWORD, uniqueEmail, workspaceBySlug } from "../support/db";
import { makePhotoLikeJpeg } from "@/support/fixtures/make-photos";
import { createPhotoUnits, photoRowsFor, putToStore, requestUpload, storedKeysFor, testStore, uploadPhoto, waitForPhoto } from "../support/photos";

const HOUR = 3_600_000;
let inspector: Session;
let unit: string;
let workspaceId: string;

beforeAll(async () => {
  const vellmoor = await workspaceBySlug("vellmoor");
  workspaceId = vellmoor.id;
  inspector = await signIn((await createUser({ workspaceId, roles: ["inspector"], email: uniqueEmail("photo-sweep") })).email, TEST_PASSWORD);
  [unit] = (await createPhotoUnits({ id: workspaceId })).unitIds;
});

it("deletes unfinalised uploads and unnamed photo objects after the grace period, and nothing else", async () => {
  const store = testStore();
  const { finalise } = await uploadPhoto(inspector, unit, await makePhotoLikeJpeg({ width: 320, height: 240, seed: 61 }));
  const kept = finalise!.body.photo;
  const keptKeys = await storedKeysFor(unit);
  expect(keptKeys).toHaveLength(3);

  // An upload the browser never finalised, an object no row names, and one key the app never writes.
  const bytes = await makePhotoLikeJpeg({ width: 320, height: 240, seed: 62 });
  const intent = await requestUpload(inspector, unit, { bytes: bytes.length });
  await putToStore(intent.body, bytes);
  const staged = `uploads/${workspaceId}/${unit}/${intent.body.photoId}`;
  const strayOriginal = `photos/${workspaceId}/${unit}/${randomUUID()}/original`;
  const foreignKey = `photos/${workspaceId}/${unit}/${kept.id}/notes.txt`;
  await putObject(store, strayOriginal, bytes, { contentType: "image/jpeg" });
  await putObject(store, foreignKey, Buffer.from("not ours"), { contentType: "text/plain" });

  // A refused file's notice (finalise did not wait), two days old.
  const { intent: lateIntent, finalise: late } = await uploadPhoto(inspector, unit, bytes.subarray(0, 900), { wait: false });
  expect(late?.status, JSON.stringify(late?.body ?? lateIntent.body)).toBe(202);
  await waitForPhoto(inspector, late!.body.photo.id, (p) => p.status === "failed");
  await db()
    .update(photos)
    .set({ updatedAt: new Date(Date.now() - 48 * HOUR) })
    .where(eq(photos.id, late!.body.photo.id));

  const young = await sweepOrphans({ graceMs: HOUR, noticeRetentionMs: 72 * HOUR });
  expect(young.deleted.filter((k) => k.includes(unit))).toEqual([]);
  expect(young.noticesRemoved).toBe(0);

  const later = await sweepOrphans({ now: new Date(Date.now() + 2 * HOUR), graceMs: HOUR, noticeRetentionMs: 24 * HOUR });
  expect(later.deleted.filter((k) => k.includes(unit)).sort()).toEqual([strayOriginal, staged].sort());
  expect(later.noticesRemoved).toBeGreaterThanOrEqual(1);
  expect((await photoRowsFor(unit)).map((r) => r.id)).toEqual([kept.id]);
  expect(await storedKeysFor(unit)).toEqual([...keptKeys, foreignKey].sort());
});

it("keeps an unnamed original while a deletion check objects (as grades will)", async () => {
  const store = testStore();
  const orphan = `photos/${workspaceId}/${unit}/${randomUUID()}/original`;
  await putObject(store, orphan, Buffer.from([0xff, 0xd8, 0xff, 0xe0]), { contentType: "image/jpeg" });
  const gradeReferencesIt = async () => "A grade references this photo; it is evidence and cannot be deleted.";
  const blocked = await sweepOrphans({ now: new Date(Date.now() + 2 * HOUR), graceMs: HOUR, checks: [gradeReferencesIt] });
  expect(blocked.blocked).toContain(orphan);
  expect(await headObject(store, orphan)).not.toBeNull();
  const freed = await sweepOrphans({ now: new Date(Date.now() + 2 * HOUR), graceMs: HOUR });
  expect(freed.deleted).toContain(orphan);
  expect(await headObject(store, orphan)).toBeNull();
});

it("marks a photo whose job was lost (no progress for hours) as failed, so Retry brings it back", async () => {
  const { finalise } = await uploadPhoto(inspector, unit, await makePhotoLikeJpeg({ width: 320, height: 240, seed: 63 }));
  const id = finalise!.body.photo.id;
  // As a worker crash would leave it: processing, nothing happening since.
  await db()
    .update(photos)
    .set({ status: "processing", updatedAt: new Date(Date.now() - 4 * HOUR) })
    .where(eq(photos.id, id));
  const report = await sweepOrphans({ stalledMs: 3 * HOUR });
  expect(report.stalledMarked).toBeGreaterThanOrEqual(1);
  const stalled = await waitForPhoto(inspector, id, (p) => p.status === "failed");
  expect(stalled.failure?.code).toBe("processing_failed");
  expect((await api(inspector, "POST", `/api/photos/${id}/retry`)).status).toBe(202);
  expect((await waitForPhoto(inspector, id, (p) => p.status === "ready")).failure).toBeNull();
});
