/**
 * Fixtures for learned-suggestion training: a graded unit whose photos are synthetic part photos
 * with planted defects (db/seed/defect-photos.ts), their previews put in the test store and their
 * regions saved as an inspector's accepted regions. Photo ids are drawn until the wanted number
 * falls on each side of the training split, so a test knows which photos are held out.
 *
 * The ids come from a generator seeded by `firstIndex`, not crypto.randomUUID: the split (which
 * photos are held out) and the order training reads the photos in (by id) both follow from the
 * ids, so random ids made every run a different scenario and the held-out figures the tests
 * assert on wandered from run to run (scratch recall 0.538 to 1 on the same code). Seeded, every
 * run trains and judges the same photos: three lone runs printed the same figures; a whole-suite
 * run printed the same recalls but lower precisions (scratch 0.542 instead of 0.929), a smaller
 * variation whose cause is not found yet. Callers in one database use different `firstIndex`
 * values, so their ids differ.
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
import { mulberry32 } from "@/support/prng";

/** A version-4-shaped UUID from a seeded generator (the same ids on every run). */
function seededUuid(random: () => number): string {
  const bytes = Array.from({ length: 16 }, () => Math.floor(random() * 256));
  bytes[6] = (bytes[6] & 0x0f) | 0x40;
  bytes[8] = (bytes[8] & 0x3f) | 0x80;
  const hex = bytes.map((b) => b.toString(16).padStart(2, "0")).join("");
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

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
  const random = mulberry32(firstIndex + 1);
  for (let index = firstIndex; wantTrain + wantHeld > 0; index++) {
    let id = seededUuid(random);
    while ((isTestPhoto(id) ? wantHeld : wantTrain) === 0) id = seededUuid(random);
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
