/**
 * Calibration scoring of one item on hand-computable rectangles (corners on pixel corners, so
 * every pixel count is the rectangle's area). Marks as in docs/references.md.
 * REF   docs/references.md, "Agreement between graders": squares [0,4]² and [2,6]² → intersection
 *       4, union 28, IoU 1/7, Dice 0.25 (a).
 * HAND  pixel counts and the matching rule of lib/imaging/compare-regions.ts worked out beside
 *       each check (the rule is our decision, c).
 */
import { describe, expect, it } from "vitest";
import type { Shape } from "@/lib/geometry/shape";
import { scoreCalibrationItem, scoreGrades, type CalibrationItemInput } from "@/lib/calibration/score-item";
import type { ComparedRegion } from "@/lib/imaging/compare-regions";

const rect = (x: number, y: number, width: number, height: number): Shape => ({ kind: "rect", x, y, width, height });
const region = (id: string, defect: string, shape: Shape): ComparedRegion => ({ id, defect, shape });

function item(key: ComparedRegion[], attempt: ComparedRegion[], extra: Partial<CalibrationItemInput> = {}): CalibrationItemInput {
  return { itemId: "item-1", width: 40, height: 40, key: { grade: "B", regions: key }, attempt: { grade: "B", regions: attempt }, ...extra };
}

describe("scoreCalibrationItem: regions", () => {
  it("squares [0,4]² (key) and [2,6]² (grader) → IoU 1/7, Dice 0.25; too little overlap to match (REF a, HAND)", async () => {
    const score = await scoreCalibrationItem(item([region("k", "dent", rect(0, 0, 4, 4))], [region("g", "dent", rect(2, 2, 4, 4))], { width: 10, height: 10 }));
    expect(score.classes.dent).toMatchObject({ keyPx: 16, attemptPx: 16, sharedPx: 4, unionPx: 28, keyDefects: 1, attemptDefects: 1 });
    expect(score.classes.dent.iou).toBeCloseTo(1 / 7, 15);
    expect(score.classes.dent.dice).toBeCloseTo(0.25, 15);
    // Overlap 4 px < ½ · min(16, 16) = 8: the key's dent is missed and the grader's is extra.
    expect(score.classes.dent).toMatchObject({ matched: 0, missed: 1, extra: 1 });
    expect(score).toMatchObject({ keyDefects: 1, matched: 0, missed: 1, extra: 1 });
  });

  it("a box drawn around a key scratch matches it; a key defect left unmarked is missed; a mark on a clean spot is extra (HAND)", async () => {
    const score = await scoreCalibrationItem(
      item(
        [region("k1", "scratch", rect(10, 10, 10, 2)), region("k2", "scratch", rect(30, 30, 4, 4)), region("k3", "chip", rect(0, 30, 5, 5))],
        [region("g1", "scratch", rect(8, 8, 14, 6)), region("g2", "stain", rect(0, 0, 3, 3))],
      ),
    );
    // Scratch: key 20 + 16 = 36 px; grader's box 84 px holds all 20 px of k1 (>= ½ · 20) → k1 matched, k2 missed.
    expect(score.classes.scratch).toMatchObject({ keyPx: 36, attemptPx: 84, sharedPx: 20, unionPx: 100, keyDefects: 2, attemptDefects: 1, matched: 1, missed: 1, extra: 0 });
    expect(score.classes.scratch.iou).toBeCloseTo(0.2, 15);
    // Chip only in the key: IoU 0, missed. Stain only in the attempt: IoU 0, extra.
    expect(score.classes.chip).toMatchObject({ keyPx: 25, attemptPx: 0, iou: 0, dice: 0, matched: 0, missed: 1, extra: 0 });
    expect(score.classes.stain).toMatchObject({ keyPx: 0, attemptPx: 9, iou: 0, matched: 0, missed: 0, extra: 1 });
    expect(score).toMatchObject({ keyDefects: 3, matched: 1, missed: 2, extra: 1 });
  });

  it("clips to the item's Surface and leaves out a class that lies wholly outside it on both sides (HAND)", async () => {
    const score = await scoreCalibrationItem(
      item([region("k1", "dent", rect(0, 0, 10, 10)), region("k2", "dust", rect(30, 30, 5, 5))], [region("g1", "dent", rect(5, 0, 10, 10)), region("g2", "dust", rect(32, 32, 5, 5))], {
        surface: [rect(0, 0, 20, 20)],
      }),
    );
    expect(Object.keys(score.classes)).toEqual(["dent"]);
    // Dent: both 100 px inside, overlap [5,10) × [0,10) = 50 → IoU 50/150, matched (50 >= 50).
    expect(score.classes.dent).toMatchObject({ keyPx: 100, attemptPx: 100, sharedPx: 50, unionPx: 150, matched: 1, missed: 0, extra: 0 });
    expect(score.areas).not.toHaveProperty("dust");
  });

  it("returns the missed and the extra areas as rectangles of the photo's pixels, per class (HAND)", async () => {
    const score = await scoreCalibrationItem(item([region("k", "dent", rect(0, 0, 4, 4))], [region("g", "dent", rect(2, 2, 4, 4))], { width: 10, height: 10 }));
    // Key minus grader: rows 0–1 cols 0–3, rows 2–3 cols 0–1. Grader minus key: rows 2–3 cols 4–5, rows 4–5 cols 2–5.
    expect(score.areas!.dent.missed).toEqual([
      { x: 0, y: 0, width: 4, height: 2 },
      { x: 0, y: 2, width: 2, height: 2 },
    ]);
    expect(score.areas!.dent.extra).toEqual([
      { x: 4, y: 2, width: 2, height: 2 },
      { x: 2, y: 4, width: 4, height: 2 },
    ]);
    const perfect = await scoreCalibrationItem(item([region("k", "dent", rect(1, 1, 3, 3))], [region("g", "dent", rect(1, 1, 3, 3))]));
    expect(perfect.areas!.dent).toEqual({ missed: [], extra: [] });
    expect(perfect.classes.dent.iou).toBe(1);
  });

  it("leaves the areas out with areas: false, and gives the same counts with either rasteriser on axis-aligned boxes", async () => {
    const input = item([region("k", "dent", rect(0, 0, 4, 4))], [region("g", "dent", rect(2, 2, 4, 4))], { width: 10, height: 10 });
    const bare = await scoreCalibrationItem(input, { areas: false });
    expect(bare.areas).toBeUndefined();
    const sharp = await scoreCalibrationItem(input, { areas: false, regionRaster: "sharp" });
    expect(sharp.classes).toEqual(bare.classes);
  });

  it("an item whose key and attempt are both clean has no classes and nothing missed (HAND)", async () => {
    const score = await scoreCalibrationItem(item([], []));
    expect(score).toMatchObject({ classes: {}, keyDefects: 0, matched: 0, missed: 0, extra: 0, areas: {} });
  });

  it("refuses regions of a bad shape with a clear error", async () => {
    await expect(scoreCalibrationItem(item([region("k", "dent", { kind: "rect", x: 0, y: 0, width: -3, height: 2 })], []))).rejects.toThrow();
  });
});

describe("scoreGrades (steps on A, B, C, Reject; c)", () => {
  it("exact, within one step, further", () => {
    expect(scoreGrades("B", "B")).toEqual({ key: "B", given: "B", steps: 0, exact: true, withinOne: true });
    expect(scoreGrades("B", "C")).toMatchObject({ steps: 1, exact: false, withinOne: true });
    expect(scoreGrades("C", "Reject")).toMatchObject({ steps: 1, exact: false, withinOne: true });
    expect(scoreGrades("A", "C")).toMatchObject({ steps: 2, exact: false, withinOne: false });
  });

  it("is carried into the item score", async () => {
    const score = await scoreCalibrationItem(item([], [], { key: { grade: "A", regions: [] }, attempt: { grade: "Reject", regions: [] } }));
    expect(score.grade).toMatchObject({ key: "A", given: "Reject", steps: 3, exact: false, withinOne: false });
  });
});
