/**
 * The comparison stored with a recheck, on hand-computable rectangles.
 * REF   docs/references.md, "Agreement between graders": squares [0,4]² and [2,6]² → IoU 1/7,
 *       Dice 0.25 (a).
 * HAND  pixel counts, pooled sums and steps worked out beside each check; the pooling and the
 *       matching rule are ours (c), stated in lib/recheck/compare.ts and compare-regions.ts.
 */
import { describe, expect, it } from "vitest";
import type { Shape } from "@/lib/geometry/shape";
import { compareRecheck, poolClassComparisons, type RecheckPhotoInput } from "@/lib/recheck/compare";

const rect = (x: number, y: number, width: number, height: number): Shape => ({ kind: "rect", x, y, width, height });
const photo = (photoId: string, first: [string, Shape][], recheck: [string, Shape][], surface?: Shape[]): RecheckPhotoInput => ({
  photoId,
  width: 20,
  height: 20,
  surface,
  first: first.map(([defect, shape], i) => ({ id: `f${i}`, defect, shape })),
  recheck: recheck.map(([defect, shape], i) => ({ id: `r${i}`, defect, shape })),
});

describe("compareRecheck", () => {
  it("per photo and class: the squares give IoU 1/7 and Dice 0.25, neither defect matched (REF a, HAND)", async () => {
    const result = await compareRecheck({ photos: [photo("front", [["dent", rect(0, 0, 4, 4)]], [["dent", rect(2, 2, 4, 4)]])], firstGrade: "B", recheckGrade: "B" });
    const dent = result.photos[0].classes.dent;
    expect(dent).toMatchObject({ firstPx: 16, recheckPx: 16, sharedPx: 4, unionPx: 28, firstDefects: 1, recheckDefects: 1, matched: 0, onlyFirst: 1, onlyRecheck: 1 });
    expect(dent.iou).toBeCloseTo(1 / 7, 15);
    expect(dent.dice).toBeCloseTo(0.25, 15);
    expect(result.photos[0].surfacePx).toBe(400);
    expect(result.grade).toEqual({ first: "B", recheck: "B", steps: 0, agreement: "same" });
  });

  it("pools a class over the unit's photos: IoU and Dice of the summed pixels (HAND)", async () => {
    const result = await compareRecheck({
      photos: [
        photo("front", [["dent", rect(0, 0, 4, 4)]], [["dent", rect(2, 2, 4, 4)]]),
        photo(
          "back",
          [
            ["dent", rect(5, 5, 5, 5)],
            ["scratch", rect(0, 0, 10, 1)],
          ],
          [["dent", rect(5, 5, 5, 5)]],
        ),
      ],
      firstGrade: "B",
      recheckGrade: "Reject",
    });
    // Dent: shared 4 + 25 = 29 of a union 28 + 25 = 53; Dice 2·29 / (16 + 25 + 16 + 25) = 58/82.
    expect(result.classes.dent).toMatchObject({ firstPx: 41, recheckPx: 41, sharedPx: 29, unionPx: 53, firstDefects: 2, matched: 1, onlyFirst: 1, onlyRecheck: 1 });
    expect(result.classes.dent.iou).toBeCloseTo(29 / 53, 15);
    expect(result.classes.dent.dice).toBeCloseTo(58 / 82, 15);
    // Scratch only the first grader marked: IoU 0, one defect only first.
    expect(result.classes.scratch).toMatchObject({ firstPx: 10, recheckPx: 0, iou: 0, dice: 0, onlyFirst: 1, onlyRecheck: 0 });
    expect(result.photos[0].classes).not.toHaveProperty("scratch");
    expect(result.grade).toEqual({ first: "B", recheck: "Reject", steps: 2, agreement: "further" });
  });

  it("leaves out a class wholly outside the Surface, and keeps the areas for the adjudication overlay when asked (HAND)", async () => {
    const result = await compareRecheck(
      {
        photos: [
          photo(
            "front",
            [
              ["dent", rect(0, 0, 4, 4)],
              ["dust", rect(15, 15, 3, 3)],
            ],
            [["dent", rect(2, 2, 4, 4)]],
            [rect(0, 0, 10, 10)],
          ),
        ],
        firstGrade: "C",
        recheckGrade: "B",
      },
      { keepAreas: true },
    );
    expect(Object.keys(result.photos[0].classes)).toEqual(["dent"]);
    expect(result.photos[0].areas!.dent).toEqual({
      onlyFirst: [
        { x: 0, y: 0, width: 4, height: 2 },
        { x: 0, y: 2, width: 2, height: 2 },
      ],
      onlyRecheck: [
        { x: 4, y: 2, width: 2, height: 2 },
        { x: 2, y: 4, width: 4, height: 2 },
      ],
      shared: [{ x: 2, y: 2, width: 2, height: 2 }],
    });
    expect(result.grade.agreement).toBe("one_step");
    const without = await compareRecheck({ photos: [photo("front", [["dent", rect(0, 0, 4, 4)]], [])], firstGrade: "C", recheckGrade: "C" });
    expect(without.photos[0].areas).toBeUndefined();
  });

  it("refuses a photo listed twice and a grade off the scale", async () => {
    await expect(compareRecheck({ photos: [photo("front", [], []), photo("front", [], [])], firstGrade: "A", recheckGrade: "A" })).rejects.toThrow(/compared once/);
    await expect(compareRecheck({ photos: [], firstGrade: "A", recheckGrade: "E" as never })).rejects.toThrow(/not a grade/);
  });
});

describe("poolClassComparisons", () => {
  it("is 1 for IoU and Dice when nothing was marked on any photo (both agree nothing is there, c)", () => {
    expect(poolClassComparisons([])).toMatchObject({ firstPx: 0, unionPx: 0, iou: 1, dice: 1 });
  });
});
