/**
 * The comparison stored with a recheck: the first grader's regions and grade against the
 * auditor's blind ones, per photo and defect class, pooled over the unit, and the two grades.
 * Pure apart from the rasteriser; plain data in, plain JSON out.
 *
 * Decisions:
 * - Per photo and class: compareRegionSets (lib/imaging/compare-regions.ts), side A the first
 *   grade's regions, side B the recheck's, both clipped to that photo's Surface. Matched counts
 *   the first grader's defects the recheck also marked (its matching rule); onlyFirst and
 *   onlyRecheck the defects the other side has nothing for.
 * - A class is listed on a photo when either side has pixels of it inside the Surface (regions
 *   wholly outside on both sides compare nothing; see lib/calibration/score-item.ts).
 * - Unit level (`classes`): pixel counts and defect counts summed over the photos, IoU and Dice
 *   of the sums — the pooled overlap, so a large defect weighs more than a speck, as it does in
 *   the measurement. The scorecards' mean IoU per class reads these unit figures.
 * - Grades: steps apart on A, B, C, Reject and same / one step / further (grade-steps.ts).
 * - `keepAreas` also returns, per photo and class, the areas only one side marked and the shared
 *   one as rectangles (for the adjudication overlay); it is not part of what the scorecards read.
 */
import type { Shape } from "@/lib/geometry/shape";
import { gradeAgreement, gradeSteps, type GradeAgreement } from "@/lib/grading/grade-steps";
import type { Grade } from "@/lib/grading/rubric-schema";
import { compareRegionSets, type ClassComparison, type ComparedRegion } from "@/lib/imaging/compare-regions";
import { spanRects, type PixelRect } from "@/lib/imaging/raster/span-areas";
import type { RegionRaster } from "@/lib/imaging/raster/region-masks";

export type RecheckPhotoInput = { photoId: string; width: number; height: number; surface?: Shape[]; first: ComparedRegion[]; recheck: ComparedRegion[] };
export type RecheckClassComparison = {
  firstPx: number;
  recheckPx: number;
  sharedPx: number;
  unionPx: number;
  iou: number;
  dice: number;
  firstDefects: number;
  recheckDefects: number;
  matched: number;
  onlyFirst: number;
  onlyRecheck: number;
};
export type RecheckAreas = { onlyFirst: PixelRect[]; onlyRecheck: PixelRect[]; shared: PixelRect[] };
export type RecheckPhotoComparison = {
  photoId: string;
  surfacePx: number;
  classes: Record<string, RecheckClassComparison>;
  areas?: Record<string, RecheckAreas>;
};
export type RecheckComparison = {
  photos: RecheckPhotoComparison[];
  classes: Record<string, RecheckClassComparison>;
  grade: { first: Grade; recheck: Grade; steps: number; agreement: GradeAgreement };
};

function fromComparison(compared: ClassComparison): RecheckClassComparison {
  return {
    firstPx: compared.aPx,
    recheckPx: compared.bPx,
    sharedPx: compared.intersectionPx,
    unionPx: compared.unionPx,
    iou: compared.iou,
    dice: compared.dice,
    firstDefects: compared.aDefects.length,
    recheckDefects: compared.bDefects.length,
    matched: compared.matchedA,
    onlyFirst: compared.onlyA,
    onlyRecheck: compared.onlyB,
  };
}

/** Sums of pixel and defect counts over photos; IoU and Dice of the sums (1 when both are empty). */
export function poolClassComparisons(list: readonly RecheckClassComparison[]): RecheckClassComparison {
  const sum = (field: keyof RecheckClassComparison) => list.reduce((total, entry) => total + entry[field], 0);
  const firstPx = sum("firstPx");
  const recheckPx = sum("recheckPx");
  const sharedPx = sum("sharedPx");
  const unionPx = sum("unionPx");
  return {
    firstPx,
    recheckPx,
    sharedPx,
    unionPx,
    iou: unionPx === 0 ? 1 : sharedPx / unionPx,
    dice: firstPx + recheckPx === 0 ? 1 : (2 * sharedPx) / (firstPx + recheckPx),
    firstDefects: sum("firstDefects"),
    recheckDefects: sum("recheckDefects"),
    matched: sum("matched"),
    onlyFirst: sum("onlyFirst"),
    onlyRecheck: sum("onlyRecheck"),
  };
}

export async function compareRecheck(
  input: { photos: readonly RecheckPhotoInput[]; firstGrade: Grade; recheckGrade: Grade },
  options: { keepAreas?: boolean; regionRaster?: RegionRaster } = {},
): Promise<RecheckComparison> {
  const ids = new Set(input.photos.map((photo) => photo.photoId));
  if (ids.size !== input.photos.length) throw new RangeError("Each photo of the unit is compared once.");
  const grade = { first: input.firstGrade, recheck: input.recheckGrade, steps: gradeSteps(input.firstGrade, input.recheckGrade), agreement: gradeAgreement(input.firstGrade, input.recheckGrade) };

  const photos: RecheckPhotoComparison[] = [];
  const perClass = new Map<string, RecheckClassComparison[]>();
  for (const photo of input.photos) {
    const compared = await compareRegionSets(
      { width: photo.width, height: photo.height, surface: photo.surface, a: photo.first, b: photo.recheck },
      { regionRaster: options.regionRaster, keepAreas: options.keepAreas },
    );
    const entries = Object.entries(compared.byDefect).filter(([, entry]) => entry.unionPx > 0);
    for (const [defect, entry] of entries) perClass.set(defect, [...(perClass.get(defect) ?? []), fromComparison(entry)]);
    photos.push({
      photoId: photo.photoId,
      surfacePx: compared.surfacePx,
      classes: Object.fromEntries(entries.map(([defect, entry]) => [defect, fromComparison(entry)])),
      ...(options.keepAreas
        ? {
            areas: Object.fromEntries(
              entries.map(([defect, entry]) => [defect, { onlyFirst: spanRects(entry.areas!.onlyA), onlyRecheck: spanRects(entry.areas!.onlyB), shared: spanRects(entry.areas!.both) }]),
            ),
          }
        : {}),
    });
  }
  return { photos, classes: Object.fromEntries([...perClass].map(([defect, list]) => [defect, poolClassComparisons(list)])), grade };
}
