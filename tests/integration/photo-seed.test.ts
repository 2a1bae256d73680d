/**
 * The demo photo seed, run against its own fixture lots: synthetic part photos go through the
 * same intent → PUT → finalise → processing pipeline as a browser upload.
 */
import { beforeAll, expect, it } from "vitest";
import { seedPhotos } from "@/db/seed/photos";
import { EXAMPLE_PART_TYPES } from "@/lib/grading/example-part-types";
import { createPhotoUnits, photoRowsFor, storedKeysFor } from "../support/photos";
import type { ViewDefinition } from "@/lib/part-types/schemas";

const displayViews: ViewDefinition[] = (EXAMPLE_PART_TYPES.display.views ?? []).map((key) => ({ key, label: key, required: true, zones: [] }));
let lots: { lotId: string; unitIds: string[] }[];

beforeAll(async () => {
  lots = [await createPhotoUnits({ slug: "vellmoor" }, { count: 2, views: displayViews, category: "display" }), await createPhotoUnits({ slug: "vellmoor" }, { count: 2, category: "camera" })];
});

it("photographs every view of two units per lot through the upload pipeline", { timeout: 120_000 }, async () => {
  const result = await seedPhotos({ lotIds: lots.map((l) => l.lotId) });
  // 5 display views × 2 units + 3 camera views × 2 units, plus one photo handed in for a second unit.
  expect(result).toMatchObject({ photos: 17, units: 4, reused: 1 });
  const rows = (await Promise.all(lots.flatMap((l) => l.unitIds).map(photoRowsFor))).flat();
  expect(rows).toHaveLength(17);
  // What was planted on each rendered photo (the recheck demo marks it): marks on the first unit of each lot only.
  expect(result.planted).toHaveLength(16);
  expect(result.planted.every((p) => rows.some((r) => r.id === p.photoId && r.unitId === p.unitId))).toBe(true);
  const firstUnits = new Set(lots.map((l) => l.unitIds[0]));
  expect(result.planted.filter((p) => p.regions.length > 0).every((p) => firstUnits.has(p.unitId))).toBe(true);
  expect(result.planted.filter((p) => firstUnits.has(p.unitId)).some((p) => p.regions.length > 0)).toBe(true);
  expect(rows.every((r) => r.status === "ready")).toBe(true);
  // Every demo photo is drawn upright at 1600 × 1200; those stored for Exif 6 and 8 are 1200 × 1600
  // rasters, which CIPA DC-008 turns back to 1600 × 1200 (90° clockwise / counter-clockwise). (a)
  expect(rows.every((r) => r.width === 1600 && r.height === 1200)).toBe(true);
  expect(new Set(rows.map((r) => r.orientation))).toEqual(new Set([1, 3, 6, 8]));
  expect(rows.filter((r) => r.possibleReuseOfPhotoId)).toHaveLength(1);
  expect(rows.every((r) => r.captureTime !== null && r.captureTimeOffset === "+01:00")).toBe(true);
  for (const unitId of lots.flatMap((l) => l.unitIds)) {
    const unitRows = rows.filter((r) => r.unitId === unitId);
    expect(await storedKeysFor(unitId)).toHaveLength(unitRows.length * 3);
  }
});
