/**
 * Sample photos a lead draws a view's zones on (GET /api/part-types/:id/sample-photos?view=…), over
 * HTTP against the test server and its PostgreSQL: only processed photos with a preview, of that
 * view of that part type, none taken out of its unit; those with a Surface first and newest first
 * within each, each with its Surface outlines and never its defect regions. Bad input and other
 * roles or workspaces get a clear 4xx.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { photos } from "@/db/schema";
import { createPartType, createPhoto, createUnit, FIXTURE_SURFACE, saveRegions, scratchBox, workspaceIdOf } from "../support/grading";
import { api, signIn, type Session } from "../support/http";

type Sample = {
  id: string;
  unitLabel: string;
  width: number;
  height: number;
  preview: { width: number; height: number } | null;
  surfaces: { id: string; shape: unknown }[];
  urls: { preview: string };
};
type ErrorBody = { error: { code: string; message: string } };

let lead: Session;
let inspector: Session;
let owner: { workspaceId: string; userId: string };

beforeAll(async () => {
  [lead, inspector] = await Promise.all([signIn("lead@vellmoor.example"), signIn("inspector@vellmoor.example")]);
  owner = await workspaceIdOf("lead@vellmoor.example");
});

/** A ready photo with preview sizes, as the photo worker leaves it. */
async function readyPhoto(unitId: string, viewKey: string, createdAt: Date) {
  const photo = await createPhoto({ workspaceId: owner.workspaceId, unitId, uploadedBy: owner.userId, viewKey });
  await db().update(photos).set({ previewWidth: 150, previewHeight: 100, createdAt }).where(eq(photos.id, photo.id));
  return photo;
}

describe("sample photos for drawing zones", () => {
  it("lists the processed photos of the view, traced ones first, with their Surface; nothing of other views, part types or photos without a preview", async () => {
    const partType = await createPartType(owner.workspaceId);
    const unit = await createUnit({ workspaceId: owner.workspaceId, partTypeId: partType.id, createdBy: owner.userId });
    const older = await readyPhoto(unit.id, "lens", new Date("2026-11-01T08:00:00Z"));
    const newer = await readyPhoto(unit.id, "lens", new Date("2026-11-02T08:00:00Z"));
    await saveRegions({ workspaceId: owner.workspaceId, photoId: newer.id, authorId: owner.userId, regions: [FIXTURE_SURFACE, scratchBox(10, 10)] });
    const newest = await readyPhoto(unit.id, "lens", new Date("2026-11-02T12:00:00Z")); // no Surface traced
    await readyPhoto(unit.id, "back", new Date("2026-11-03T08:00:00Z")); // another view
    await createPhoto({ workspaceId: owner.workspaceId, unitId: unit.id, uploadedBy: owner.userId, viewKey: "lens", status: "processing" });
    await createPhoto({ workspaceId: owner.workspaceId, unitId: unit.id, uploadedBy: owner.userId, viewKey: "lens" }); // ready, but no preview sizes
    const removed = await readyPhoto(unit.id, "lens", new Date("2026-11-02T10:00:00Z"));
    await db().update(photos).set({ removedAt: new Date(), removedBy: owner.userId, removalReason: "A photo of another part" }).where(eq(photos.id, removed.id));
    const otherType = await createPartType(owner.workspaceId);
    const otherUnit = await createUnit({ workspaceId: owner.workspaceId, partTypeId: otherType.id, createdBy: owner.userId });
    await readyPhoto(otherUnit.id, "lens", new Date("2026-11-04T08:00:00Z"));

    const res = await api<{ photos: Sample[] }>(lead, "GET", `/api/part-types/${partType.id}/sample-photos?view=lens`);
    expect(res.status).toBe(200);
    // The traced photo first, then the others newest first.
    expect(res.body.photos.map((p) => p.id)).toEqual([newer.id, newest.id, older.id]);
    const [first, second] = res.body.photos;
    expect(first).toMatchObject({ width: 300, height: 200, preview: { width: 150, height: 100 }, urls: { preview: `/api/photos/${newer.id}/preview` } });
    expect(first.unitLabel).toContain(unit.serial!);
    expect(first.surfaces).toEqual([{ id: "surface-1", shape: FIXTURE_SURFACE.role === "surface" ? FIXTURE_SURFACE.shape : null }]);
    expect(second.surfaces).toEqual([]);

    const back = await api<{ photos: Sample[] }>(lead, "GET", `/api/part-types/${partType.id}/sample-photos?view=back`);
    expect(back.body.photos).toHaveLength(1);
    const none = await api<{ photos: Sample[] }>(lead, "GET", `/api/part-types/${partType.id}/sample-photos?view=side`);
    expect(none.status).toBe(200);
    expect(none.body.photos).toEqual([]);
  });

  it("a missing view is a 400 that says what to send; other roles get 403, other workspaces 404", async () => {
    const partType = await createPartType(owner.workspaceId);
    const missing = await api<ErrorBody>(lead, "GET", `/api/part-types/${partType.id}/sample-photos`);
    expect(missing.status).toBe(400);
    expect(missing.body.error.message).toMatch(/Name the view/);
    const blank = await api<ErrorBody>(lead, "GET", `/api/part-types/${partType.id}/sample-photos?view=%20`);
    expect(blank.status).toBe(400);
    expect((await api(inspector, "GET", `/api/part-types/${partType.id}/sample-photos?view=lens`)).status).toBe(403);
    const stranger = await signIn("lead@quillfen.example");
    expect((await api(stranger, "GET", `/api/part-types/${partType.id}/sample-photos?view=lens`)).status).toBe(404);
    expect((await api(lead, "GET", "/api/part-types/not-an-id/sample-photos?view=lens")).status).toBe(404);
  });
});
