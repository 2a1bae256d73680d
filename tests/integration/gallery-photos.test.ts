/**
 * Gallery items and the photo deletion gate: a photo an item shows keeps its original (any item
 * status), and the orphan sweep never deletes it — while a gallery upload that no item names is
 * removed after the grace period, row and objects. Calls the sweep directly against the test
 * bucket and database, as photo-sweep.test.ts does.
 */
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { beforeAll, expect, it } from "vitest";
import { db } from "@/db/client";
import { galleryItems, photos } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/require-user";
import { originalDeletionBlockers } from "@/lib/photos/deletion";
import { storeUpload } from "@/lib/photos/finalise";
import { stagingKey } from "@/lib/photos/object-keys";
import { sweepOrphans } from "@/lib/photos/sweep";
import { headObject, listObjects, putObject } from "@/lib/storage/s3";
import { createUser, uniqueEmail, workspaceBySlug } from "../support/db";
import { makePhotoLikeJpeg } from "@/support/fixtures/make-photos";
import { createPhotoUnits, testStore } from "../support/photos";

const HOUR = 3_600_000;
let trainer: SessionUser;
let partTypeId: string;

beforeAll(async () => {
  const vellmoor = await workspaceBySlug("vellmoor");
  const user = await createUser({ workspaceId: vellmoor.id, roles: ["trainer"], email: uniqueEmail("gallery-photos") });
  trainer = { id: user.id, workspaceId: vellmoor.id, workspaceName: vellmoor.name, timeZone: "UTC", email: user.email, name: user.name, roles: ["trainer"] };
  ({ partTypeId } = await createPhotoUnits({ id: vellmoor.id }));
});

/** A photo uploaded into the Gallery (no unit), through the same staging → original → worker steps. */
async function galleryUpload(seed: number) {
  const photoId = randomUUID();
  const bytes = await makePhotoLikeJpeg({ width: 320, height: 240, seed });
  await putObject(testStore(), stagingKey({ workspaceId: trainer.workspaceId, unitId: null, photoId }), bytes, { contentType: "image/jpeg" });
  const outcome = await storeUpload(trainer, { unitId: null, photoId, viewKey: "front", fileName: `gallery-${seed}.jpg` }, { store: testStore(), dispatch: "inline" });
  expect(outcome.photo.status).toBe("ready");
  expect(outcome.photo.originalKey).toBe(`photos/${trainer.workspaceId}/gallery/${photoId}/original`);
  return outcome.photo;
}

async function keysOf(photoId: string): Promise<string[]> {
  const keys: string[] = [];
  for await (const o of listObjects(testStore(), `photos/${trainer.workspaceId}/gallery/${photoId}/`)) keys.push(o.key);
  return keys.sort();
}

const age = (photoId: string) =>
  db()
    .update(photos)
    .set({ createdAt: new Date(Date.now() - 3 * HOUR) })
    .where(eq(photos.id, photoId));

it("keeps the original of a photo a gallery item shows, in every status, and names the reason", async () => {
  const photo = await galleryUpload(71);
  const ref = { workspaceId: trainer.workspaceId, photoId: photo.id };
  // A gallery upload has no regions or measurements: nothing but the item holds it.
  expect(await originalDeletionBlockers(db(), ref)).toEqual([]);
  const [item] = await db()
    .insert(galleryItems)
    .values({
      workspaceId: trainer.workspaceId,
      partTypeId,
      viewKey: "front",
      kind: "normal",
      photoId: photo.id,
      regions: { regions: [], surfaces: [], ruler: null },
      grade: "A",
      createdBy: trainer.id,
    })
    .returning({ id: galleryItems.id });
  expect(await originalDeletionBlockers(db(), ref)).toEqual(["A gallery item shows this photo; its original is kept for as long as an item uses it."]);
  await db().update(galleryItems).set({ status: "retired", retiredAt: new Date() }).where(eq(galleryItems.id, item.id));
  expect(await originalDeletionBlockers(db(), ref)).toHaveLength(1);
});

it("sweeps a gallery upload no item names after the grace period, and never one an item shows", async () => {
  const used = await galleryUpload(72);
  const unused = await galleryUpload(73);
  await db()
    .insert(galleryItems)
    .values({
      workspaceId: trainer.workspaceId,
      partTypeId,
      viewKey: "front",
      kind: "abnormal",
      photoId: used.id,
      regions: { regions: [], surfaces: [], ruler: null },
      grade: "B",
      createdBy: trainer.id,
    });
  const usedKeys = await keysOf(used.id);
  const unusedKeys = await keysOf(unused.id);
  expect(usedKeys).toHaveLength(3);
  expect(unusedKeys).toHaveLength(3);

  // Within the grace period nothing goes.
  await sweepOrphans({ graceMs: HOUR });
  expect(await keysOf(unused.id)).toEqual(unusedKeys);

  await Promise.all([age(used.id), age(unused.id)]);
  const report = await sweepOrphans({ now: new Date(Date.now() + 2 * HOUR), graceMs: HOUR });
  expect(report.galleryUploadsRemoved).toBeGreaterThanOrEqual(1);
  expect(report.deleted).toEqual(expect.arrayContaining(unusedKeys));
  expect(await db().select().from(photos).where(eq(photos.id, unused.id))).toEqual([]);
  expect(await keysOf(unused.id)).toEqual([]);

  expect(report.deleted.filter((k) => k.includes(used.id))).toEqual([]);
  expect(await keysOf(used.id)).toEqual(usedKeys);
  expect(await headObject(testStore(), used.originalKey!)).not.toBeNull();
  expect(await db().select({ id: photos.id }).from(photos).where(eq(photos.id, used.id))).toHaveLength(1);
});
