/**
 * Fixtures for learned-suggestion training: a graded unit whose photos are synthetic part photos
 * with planted defects (db/seed/defect-photos.ts), their previews put in the test store and their
 * regions saved as an inspector's accepted regions. Photo ids are drawn until the wanted number
 * falls on each side of the training split, so a test knows which photos are held out.
 */
import crypto from "node:crypto";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import type { Shape } from "@/lib/geometry/shape";
import { photos, units } from "@/db/schema";
import { renderDefectPhoto } from "@/db/seed/defect-photos";
import { splitByPhoto } from "@/lib/imaging/learned-eval";
import { putObject } from "@/lib/storage/s3";
import { TEST_SHARE } from "@/lib/suggestions/training-set";
import { createPartType, createUnit, saveRegions, type FixtureRegion } from "./grading";
import { testStore } from "./photos";

export const isTestPhoto = (photoId: string) => splitByPhoto([photoId], (id) => id, { testShare: TEST_SHARE }).test.length === 1;

export type PlantedPhoto = { photoId: string; held: boolean; regions: { defect: string; shape: Shape }[] };

/**
 * A unit (graded unless `status` says otherwise) with `train` training-side and `held` held-out photos, rendered from `firstIndex`.
 * `rename` maps a planted class to the class name stored (another workspace's own names).
 */
export async function createPlantedPhotos(
  owner: { workspaceId: string; userId: string },
  {
    train,
    held,
    firstIndex = 0,
    width = 960,
    rename = (d: string) => d,
    status = "graded",
  }: { train: number; held: number; firstIndex?: number; width?: number; rename?: (defect: string) => string; status?: "graded" | "on_bench" },
) {
  const partType = await createPartType(owner.workspaceId);
  const unit = await createUnit({ workspaceId: owner.workspaceId, partTypeId: partType.id, createdBy: owner.userId });
  if (status !== "on_bench") await db().update(units).set({ status }).where(eq(units.id, unit.id));
  const store = testStore();
  const planted: PlantedPhoto[] = [];
  let wantTrain = train;
  let wantHeld = held;
  for (let index = firstIndex; wantTrain + wantHeld > 0; index++) {
    let id = crypto.randomUUID();
    while ((isTestPhoto(id) ? wantHeld : wantTrain) === 0) id = crypto.randomUUID();
    const isHeld = isTestPhoto(id);
    if (isHeld) wantHeld--;
    else wantTrain--;
    const art = await renderDefectPhoto(index, width);
    const previewKey = `fixtures/${id}/preview.jpg`;
    await putObject(store, previewKey, art.jpeg, { contentType: "image/jpeg" });
    await db()
      .insert(photos)
      .values({
        id,
        workspaceId: owner.workspaceId,
        unitId: unit.id,
        viewKey: "lens",
        status: "ready",
        originalKey: `fixtures/${id}/original.jpg`,
        previewKey,
        thumbnailKey: `fixtures/${id}/thumb.webp`,
        contentType: "image/jpeg",
        fileName: "planted.jpg",
        bytes: art.jpeg.length,
        sha256: crypto.randomBytes(32).toString("hex"),
        format: "jpeg",
        width: art.width,
        height: art.height,
        previewWidth: art.width,
        previewHeight: art.height,
        uploadedBy: owner.userId,
      });
    const regions = art.regions.map((r) => ({ defect: rename(r.defect), shape: r.shape }));
    await saveRegions({
      workspaceId: owner.workspaceId,
      photoId: id,
      authorId: owner.userId,
      regions: [{ clientId: "surface-1", role: "surface", shape: art.surface }, ...regions.map((r, k): FixtureRegion => ({ clientId: `d-${k}`, role: "defect", defect: r.defect, shape: r.shape }))],
    });
    planted.push({ photoId: id, held: isHeld, regions });
  }
  return { partType, unit, planted };
}
