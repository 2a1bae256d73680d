/**
 * Which calibration items most people get wrong (the rules are ours, c; counts by hand, HAND).
 */
import { describe, expect, it } from "vitest";
import { itemDifficulty } from "@/lib/calibration/item-difficulty";
import { scoreGrades, type CalibrationClassScore, type CalibrationItemScore } from "@/lib/calibration/score-item";
import type { Grade } from "@/lib/grading/rubric-schema";

function classScore(iou: number, missed: number, extra = 0): CalibrationClassScore {
  return { keyPx: 10, attemptPx: 10, sharedPx: 0, unionPx: 20, iou, dice: 0, keyDefects: 1, attemptDefects: 1, matched: 1 - missed, missed, extra };
}
function itemScore(itemId: string, key: Grade, given: Grade, classes: Record<string, CalibrationClassScore> = {}): CalibrationItemScore {
  const total = (field: "keyDefects" | "matched" | "missed" | "extra") => Object.values(classes).reduce((sum, c) => sum + c[field], 0);
  return { itemId, grade: scoreGrades(key, given), classes, keyDefects: total("keyDefects"), matched: total("matched"), missed: total("missed"), extra: total("extra") };
}

describe("itemDifficulty", () => {
  it("orders items by the share of attempts that missed a defect or misgraded, with per-class misses and mean IoU (HAND)", () => {
    const result = itemDifficulty([
      { attemptId: "p1", items: [itemScore("lens", "B", "B", { scratch: classScore(0.2, 1) }), itemScore("back", "A", "A"), itemScore("frame", "C", "B")] },
      { attemptId: "p2", items: [itemScore("lens", "B", "B", { scratch: classScore(0.6, 0) }), itemScore("back", "A", "A", { dent: classScore(0, 0, 1) }), itemScore("frame", "C", "C")] },
      { attemptId: "p3", items: [itemScore("lens", "B", "A", { scratch: classScore(0.1, 1) }), itemScore("back", "A", "A"), itemScore("frame", "C", "C")] },
    ]);
    // lens: p1 missed, p3 missed and misgraded → 2 of 3 wrong. frame: p1 misgraded → 1 of 3. back: extra only → 0.
    expect(result.map((item) => item.itemId)).toEqual(["lens", "frame", "back"]);
    expect(result[0]).toMatchObject({ attempts: 3, missedAttempts: 2, misgradedAttempts: 1, wrongAttempts: 2, extraAttempts: 0 });
    expect(result[0].wrongShare).toBeCloseTo(2 / 3, 15);
    expect(result[0].byClass.scratch.missedAttempts).toBe(2);
    expect(result[0].byClass.scratch.meanIou).toBeCloseTo(0.3, 15);
    expect(result[2]).toMatchObject({ wrongAttempts: 0, extraAttempts: 1, wrongShare: 0 });
  });

  it("breaks ties by the share that missed, then by item id", () => {
    const result = itemDifficulty([{ attemptId: "p1", items: [itemScore("z", "B", "C"), itemScore("y", "B", "B", { crack: classScore(0, 1) }), itemScore("x", "B", "C")] }]);
    // All three wrong once; y missed a defect, so it leads; x before z by id.
    expect(result.map((item) => item.itemId)).toEqual(["y", "x", "z"]);
  });

  it("refuses an attempt that scores an item twice; no attempts give no rows", () => {
    expect(() => itemDifficulty([{ attemptId: "p1", items: [itemScore("a", "A", "A"), itemScore("a", "A", "B")] }])).toThrow(/scores item a twice/);
    expect(itemDifficulty([])).toEqual([]);
  });
});
