/**
 * Calibration scoring, one item: a grader's regions and grade for one gallery photo against the
 * item's key (the trainer's regions and grade). Pure apart from the rasteriser; the key and the
 * attempt come in as plain data, the score goes out as plain JSON to store with the attempt.
 *
 * Decisions:
 * - Regions are compared per defect class by compareRegionSets (lib/imaging/compare-regions.ts):
 *   both sides clipped to the item's Surface, IoU and Dice of the two unions, and its defect
 *   matching rule (a key defect is found when an attempt defect of the same class covers at least
 *   half of the smaller of the two). Side A is the key, side B the attempt, so: matched = key
 *   defects found, missed = key defects not found, extra = attempt defects that match no key
 *   defect.
 * - A class is listed when either side has pixels of it inside the Surface. A class whose regions
 *   all lie outside the Surface on both sides is left out: there is nothing to compare (the empty-
 *   versus-empty IoU of 1 would read as a perfect score for something nobody can see).
 * - Grades: exact when equal, within one step when at most one step apart on A, B, C, Reject
 *   (lib/grading/grade-steps.ts).
 * - Areas for the after-submit view (option `areas`, on by default): per class the key's pixels
 *   the grader missed and the grader's pixels outside the key, as rectangles in the photo's
 *   upright pixels (lib/imaging/raster/span-areas.ts) that the canvas or an SVG overlay draws with
 *   its own pattern and colour per kind.
 */
import type { Shape } from "@/lib/geometry/shape";
import { gradeSteps } from "@/lib/grading/grade-steps";
import type { Grade } from "@/lib/grading/rubric-schema";
import { compareRegionSets, type ComparedRegion } from "@/lib/imaging/compare-regions";
import { spanRects, type PixelRect } from "@/lib/imaging/raster/span-areas";
import type { RegionRaster } from "@/lib/imaging/raster/region-masks";

export type CalibrationItemInput = {
  itemId: string;
  width: number;
  height: number;
  /** The item's Surface; the whole photo when absent. */
  surface?: Shape[];
  key: { grade: Grade; regions: ComparedRegion[] };
  attempt: { grade: Grade; regions: ComparedRegion[] };
};

export type CalibrationClassScore = {
  keyPx: number;
  attemptPx: number;
  sharedPx: number;
  unionPx: number;
  iou: number;
  dice: number;
  keyDefects: number;
  attemptDefects: number;
  matched: number;
  missed: number;
  extra: number;
};

export type CalibrationGradeScore = { key: Grade; given: Grade; steps: number; exact: boolean; withinOne: boolean };

export type CalibrationItemScore = {
  itemId: string;
  grade: CalibrationGradeScore;
  classes: Record<string, CalibrationClassScore>;
  /** Totals over the classes. */
  keyDefects: number;
  matched: number;
  missed: number;
  extra: number;
  /** Per class, what to draw after submission (absent with `areas: false`). */
  areas?: Record<string, { missed: PixelRect[]; extra: PixelRect[] }>;
};

export function scoreGrades(key: Grade, given: Grade): CalibrationGradeScore {
  const steps = gradeSteps(key, given);
  return { key, given, steps, exact: steps === 0, withinOne: steps <= 1 };
}

export async function scoreCalibrationItem(input: CalibrationItemInput, options: { areas?: boolean; regionRaster?: RegionRaster } = {}): Promise<CalibrationItemScore> {
  const keepAreas = options.areas ?? true;
  const grade = scoreGrades(input.key.grade, input.attempt.grade);
  const comparison = await compareRegionSets(
    { width: input.width, height: input.height, surface: input.surface, a: input.key.regions, b: input.attempt.regions },
    { regionRaster: options.regionRaster, keepAreas },
  );
  const classEntries: [string, CalibrationClassScore][] = [];
  const areaEntries: [string, { missed: PixelRect[]; extra: PixelRect[] }][] = [];
  for (const [defect, compared] of Object.entries(comparison.byDefect)) {
    if (compared.unionPx === 0) continue;
    classEntries.push([
      defect,
      {
        keyPx: compared.aPx,
        attemptPx: compared.bPx,
        sharedPx: compared.intersectionPx,
        unionPx: compared.unionPx,
        iou: compared.iou,
        dice: compared.dice,
        keyDefects: compared.aDefects.length,
        attemptDefects: compared.bDefects.length,
        matched: compared.matchedA,
        missed: compared.onlyA,
        extra: compared.onlyB,
      },
    ]);
    if (compared.areas) areaEntries.push([defect, { missed: spanRects(compared.areas.onlyA), extra: spanRects(compared.areas.onlyB) }]);
  }
  // Object.fromEntries defines own keys, so a class named "__proto__" stays plain data.
  const classes = Object.fromEntries(classEntries);
  const total = (field: "keyDefects" | "matched" | "missed" | "extra") => Object.values(classes).reduce((sum, entry) => sum + entry[field], 0);
  return {
    itemId: input.itemId,
    grade,
    classes,
    keyDefects: total("keyDefects"),
    matched: total("matched"),
    missed: total("missed"),
    extra: total("extra"),
    ...(keepAreas ? { areas: Object.fromEntries(areaEntries) } : {}),
  };
}
