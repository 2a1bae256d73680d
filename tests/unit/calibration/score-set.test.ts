/**
 * Scoring a whole submitted attempt (lib/calibration/score-set.ts) on hand-computable rectangles:
 * the key's Surface clips both sides, the taker's own Surface outlines are not scored, and the
 * summary is judged against the set's thresholds.
 * REF   docs/references.md, "Agreement between graders": squares [0,4]² and [2,6]² → IoU 1/7 (a).
 * HAND  pixel counts worked out beside each check.
 */
import { describe, expect, it } from "vitest";
import { scoreCalibrationSet } from "@/lib/calibration/score-set";
import type { RegionSetPayload } from "@/lib/geometry/validate";

const rect = (id: string, defect: string, x: number, y: number, width: number, height: number) => ({ id, defect, shape: { kind: "rect" as const, x, y, width, height } });
const payload = (regions: RegionSetPayload["regions"], surfaces: RegionSetPayload["surfaces"] = []): RegionSetPayload => ({ regions, surfaces, ruler: null });
/** The left half of a 20 × 10 photo. */
const LEFT_HALF = [
  {
    id: "s",
    shape: {
      kind: "polygon" as const,
      points: [
        [0, 0],
        [10, 0],
        [10, 10],
        [0, 10],
      ] as [number, number][],
    },
  },
];

describe("scoreCalibrationSet", () => {
  it("clips both sides to the key's Surface and ignores the taker's own Surface (HAND)", async () => {
    const score = await scoreCalibrationSet({
      thresholds: { minGradeAgreement: 1, minMeanIou: 0.5 },
      items: [
        {
          position: 1,
          width: 20,
          height: 10,
          // Key: a 4 × 4 dent at (0,0). Taker: the same dent plus a 4 × 4 "dent" at (14,0), outside the key's Surface,
          // and a Surface of their own over the whole photo, which must not bring that mark back in.
          key: { grade: "B", regions: payload([rect("k", "dent", 0, 0, 4, 4)], LEFT_HALF) },
          answer: {
            grade: "B",
            regions: payload(
              [rect("a", "dent", 0, 0, 4, 4), rect("b", "dent", 14, 0, 4, 4)],
              [
                {
                  id: "t",
                  shape: {
                    kind: "polygon",
                    points: [
                      [0, 0],
                      [20, 0],
                      [20, 10],
                      [0, 10],
                    ],
                  },
                },
              ],
            ),
          },
        },
      ],
    });
    // Inside the left half both sides hold the same 16 px: IoU 1; the mark at x 14–18 lies outside.
    expect(score.items[0].classes.dent).toMatchObject({ keyPx: 16, attemptPx: 16, iou: 1 });
    expect(score.items[0].position).toBe(1);
    expect(score.summary.passed).toBe(true);
  });

  it("judges the set: squares [0,4]² against [2,6]² give IoU 1/7 < 0.5, so it fails on that class (REF a)", async () => {
    const items = [1, 2, 3, 4, 5].map((position) => ({
      position,
      width: 10,
      height: 10,
      key: { grade: "A" as const, regions: payload(position === 1 ? [rect("k", "dent", 0, 0, 4, 4)] : []) },
      answer: { grade: "A" as const, regions: payload(position === 1 ? [rect("g", "dent", 2, 2, 4, 4)] : []) },
    }));
    const score = await scoreCalibrationSet({ thresholds: { minGradeAgreement: 0.8, minMeanIou: 0.5 }, items });
    expect(score.summary.grades.exactShare).toBe(1);
    expect(score.summary.classes.dent.meanIou).toBeCloseTo(1 / 7, 12);
    expect(score.summary.checks.find((c) => c.check === "mean_iou")).toMatchObject({ defect: "dent", passed: false });
    expect(score.summary.passed).toBe(false);
    expect(score.items.map((i) => i.position)).toEqual([1, 2, 3, 4, 5]);
  });
});
