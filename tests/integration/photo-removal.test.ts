/**
 * Putting a wrong photo right (issue 15, item 7), over HTTP against the test server, its
 * PostgreSQL and object store (no mocks): a photo filed under the wrong view is reassigned, and
 * the measurement notices; a wrong photo is removed with a reason — deleted with its objects when
 * nothing referred to it, withdrawn and kept as a record when regions or a measurement did —
 * never silently; bad input and closed units change nothing.
 */
import { and, eq } from "drizzle-orm";
import sharp from "sharp";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { activityLog, photos, units } from "@/db/schema";
import { createMeasurableUnit, workspaceIdOf } from "../support/grading";
import { api, signIn, type Session } from "../support/http";
import { createPhotoUnits, photoRowsFor, storedKeysFor, uploadPhoto, type PhotoJson } from "../support/photos";

type ErrorBody = { error: { code: string; message: string; fieldErrors?: Record<string, string> } };
type ListBody = { photos: (PhotoJson & { removal: unknown })[]; removed: (PhotoJson & { removal: { reason: string; byName: string | null; at: string } | null })[] };
type MeasureBody = { measurement: { stale: boolean; reasons: string[] } | null };

let inspector: Session;
let inspector2: Session;

beforeAll(async () => {
  [inspector, inspector2] = await Promise.all([signIn("inspector@vellmoor.example"), signIn("inspector2@vellmoor.example")]);
});

const jpeg = (seed: number) =>
  sharp({ create: { width: 80, height: 60, channels: 3, background: { r: seed % 255, g: 120, b: 60 } } })
    .jpeg()
    .toBuffer();

/** A unit on the bench nobody holds, with one ready photo uploaded through the real pipeline as "front". */
async function unitWithPhoto() {
  const { unitIds } = await createPhotoUnits({ slug: "vellmoor" });
  const bytes = await jpeg(Math.floor(Math.random() * 255));
  const { finalise } = await uploadPhoto(inspector, unitIds[0], bytes, { viewKey: "front" });
  expect(finalise?.status).toBe(201);
  return { unitId: unitIds[0], photoId: finalise!.body.photo.id, bytes };
}

const logged = (photoId: string, action: string) =>
  db()
    .select()
    .from(activityLog)
    .where(and(eq(activityLog.subjectId, photoId), eq(activityLog.action, action)));

describe("reassigning a photo's view", () => {
  it("files the photo under another view of its part type and logs from → to", async () => {
    const { unitId, photoId } = await unitWithPhoto();
    const res = await api<{ photo: PhotoJson }>(inspector, "PATCH", `/api/photos/${photoId}`, { viewKey: "back" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.photo.viewKey).toBe("back");
    expect((await photoRowsFor(unitId))[0].viewKey).toBe("back");
    const [entry] = await logged(photoId, "photo.view_changed");
    expect(entry.detail).toMatchObject({ from: "front", to: "back" });
  });

  it("refuses a view the part type does not have, naming the ones it has, and changes nothing", async () => {
    const { unitId, photoId } = await unitWithPhoto();
    const res = await api<ErrorBody>(inspector, "PATCH", `/api/photos/${photoId}`, { viewKey: "side" });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/^“side” is not a view of .+; choose one of: Front, Back, Connector\.$/);
    expect(res.body.error.fieldErrors?.viewKey).toBeTruthy();
    const empty = await api<ErrorBody>(inspector, "PATCH", `/api/photos/${photoId}`, { viewKey: "" });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toMatch(/Choose the view/);
    expect((await photoRowsFor(unitId))[0].viewKey).toBe("front");
    expect(await logged(photoId, "photo.view_changed")).toHaveLength(0);
  });

  it("makes the unit's measurement out of date: the zones it used belong to the old view", async () => {
    const owner = await workspaceIdOf("lead@vellmoor.example");
    const { unit, photo } = await createMeasurableUnit(owner);
    const measured = await api<MeasureBody>(inspector, "POST", `/api/units/${unit.id}/measure`);
    expect(measured.status, JSON.stringify(measured.body)).toBe(200);
    expect((await api(inspector, "PATCH", `/api/photos/${photo.id}`, { viewKey: "back" })).status).toBe(200);
    const after = await api<MeasureBody>(inspector, "GET", `/api/units/${unit.id}/measure`);
    expect(after.body.measurement?.stale).toBe(true);
    expect(after.body.measurement?.reasons.join(" ")).toMatch(/filed under another view since measuring \(lens → back\)/);
  });

  it("is work on the unit: refused while someone else's lease runs and once the unit is graded", async () => {
    const { unitId, photoId } = await unitWithPhoto();
    const held = await api(inspector2, "PATCH", `/api/photos/${photoId}`, { viewKey: "back" }); // takes the waiting unit
    expect(held.status).toBe(200);
    const refused = await api<ErrorBody>(inspector, "PATCH", `/api/photos/${photoId}`, { viewKey: "connector" });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/has this unit on their bench/);
    await db().update(units).set({ status: "graded", leaseHolderId: null, leaseExpiresAt: null }).where(eq(units.id, unitId));
    const graded = await api<ErrorBody>(inspector2, "PATCH", `/api/photos/${photoId}`, { viewKey: "connector" });
    expect(graded.status).toBe(409);
    expect(graded.body.error.message).toMatch(/part of the record/);
    expect((await photoRowsFor(unitId))[0].viewKey).toBe("back");
  });
});

describe("removing a wrong photo", () => {
  it("needs a reason, and without one changes nothing", async () => {
    const { unitId, photoId } = await unitWithPhoto();
    const res = await api<ErrorBody>(inspector, "POST", `/api/photos/${photoId}/removal`, { reason: " " });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/Say why the photo is removed/);
    expect(await photoRowsFor(unitId)).toHaveLength(1);
    expect(await storedKeysFor(unitId)).toHaveLength(3);
  });

  it("deletes a photo nothing referred to, with its objects, and logs what it was and why", async () => {
    const { unitId, photoId } = await unitWithPhoto();
    expect(await storedKeysFor(unitId)).toHaveLength(3); // original, preview, thumbnail
    const res = await api<{ outcome: string; message: string }>(inspector, "POST", `/api/photos/${photoId}/removal`, { reason: "Another unit's back, photographed by mistake" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.outcome).toBe("deleted");
    expect(await photoRowsFor(unitId)).toHaveLength(0);
    expect(await storedKeysFor(unitId)).toEqual([]);
    const [entry] = await logged(photoId, "photo.removed");
    expect(entry.detail).toMatchObject({ unitId, viewKey: "front", reason: "Another unit's back, photographed by mistake" });
  });

  it("withdraws a photo that regions or a measurement referred to: kept with its objects, who, when and why, and out of the unit's lists and measurement", async () => {
    const owner = await workspaceIdOf("lead@vellmoor.example");
    const { unit, photo } = await createMeasurableUnit(owner);
    expect((await api(inspector, "POST", `/api/units/${unit.id}/measure`)).status).toBe(200);
    const res = await api<{ outcome: string; message: string }>(inspector, "POST", `/api/photos/${photo.id}/removal`, { reason: "Shows another unit's lens" });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.outcome).toBe("withdrawn");
    expect(res.body.message).toMatch(/kept as a record, because a measurement \(and possibly a grade\) was made from this photo/);

    const [row] = await db().select().from(photos).where(eq(photos.id, photo.id));
    const me = await workspaceIdOf("inspector@vellmoor.example");
    expect(row).toMatchObject({ removedBy: me.userId, removalReason: "Shows another unit's lens", originalKey: photo.originalKey });
    expect(row.removedAt).toBeInstanceOf(Date);
    const [entry] = await logged(photo.id, "photo.withdrawn");
    expect(entry.detail).toMatchObject({ reason: "Shows another unit's lens" });

    const list = await api<ListBody>(inspector, "GET", `/api/units/${unit.id}/photos`);
    expect(list.body.photos.map((p) => p.id)).not.toContain(photo.id);
    expect(list.body.removed.map((p) => [p.id, p.removal?.reason])).toEqual([[photo.id, "Shows another unit's lens"]]);
    const measurement = await api<MeasureBody>(inspector, "GET", `/api/units/${unit.id}/measure`);
    expect(measurement.body.measurement?.reasons.join(" ")).toMatch(/was measured but is no longer part of the unit/);

    // Its regions are a record now, and it cannot be removed twice.
    const save = await api<ErrorBody>(inspector, "PUT", `/api/photos/${photo.id}/regions`, { baseVersion: 1, regions: { regions: [], surfaces: [], ruler: null } });
    expect(save.status).toBe(409);
    expect(save.body.error.message).toMatch(/taken out of the unit/);
    const again = await api<ErrorBody>(inspector, "POST", `/api/photos/${photo.id}/removal`, { reason: "twice" });
    expect(again.status).toBe(409);
  });

  it("does not let the same file back in by uploading it again", async () => {
    const { unitId, photoId, bytes } = await unitWithPhoto();
    await api(inspector, "PUT", `/api/photos/${photoId}/regions`, {
      baseVersion: 0,
      regions: { regions: [{ id: "r-1", defect: "scratch", shape: { kind: "rect", x: 5, y: 5, width: 10, height: 10 } }], surfaces: [], ruler: null },
    });
    expect((await api<{ outcome: string }>(inspector, "POST", `/api/photos/${photoId}/removal`, { reason: "Wrong unit" })).body.outcome).toBe("withdrawn");
    const { finalise } = await uploadPhoto(inspector, unitId, bytes, { viewKey: "front" });
    expect(finalise?.status).toBe(409);
    expect((finalise?.body as unknown as ErrorBody).error.message).toMatch(/This exact file was taken out of this unit on \d{4}-\d{2}-\d{2} \(“Wrong unit”\)/);
    expect(await photoRowsFor(unitId)).toHaveLength(1);
  });
});
