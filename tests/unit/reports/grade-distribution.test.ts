/**
 * Grade distribution per part type and period; counts and shares by hand (HAND), weeks starting on
 * Monday (ISO 8601, a), the listing rules ours (c, lib/reports/grade-distribution.ts).
 */
import { describe, expect, it } from "vitest";
import { gradeDistribution } from "@/lib/reports/grade-distribution";

const ROWS = [
  { partTypeId: "cam", day: "2026-06-01", grade: "A" as const, count: 5 },
  { partTypeId: "cam", day: "2026-06-03", grade: "B" as const, count: 3 },
  { partTypeId: "cam", day: "2026-06-07", grade: "A" as const, count: 2 },
  { partTypeId: "bat", day: "2026-06-10", grade: "Reject" as const, count: 1 },
  { partTypeId: "cam", day: "2026-06-21", grade: "C" as const, count: 2 },
];

describe("gradeDistribution", () => {
  it("counts every grade per week, zeros and empty weeks included, with shares (HAND)", () => {
    const [cam, bat] = gradeDistribution(ROWS, "week");
    expect(cam.periods.map((p) => [p.period, p.total, p.counts])).toEqual([
      ["2026-06-01", 10, { A: 7, B: 3, C: 0, Reject: 0 }],
      ["2026-06-08", 0, { A: 0, B: 0, C: 0, Reject: 0 }],
      ["2026-06-15", 2, { A: 0, B: 0, C: 2, Reject: 0 }],
    ]);
    expect(cam.periods[0].shares).toEqual({ A: 0.7, B: 0.3, C: 0, Reject: 0 });
    expect(cam.periods[1].shares.A).toBeNaN();
    expect(cam.total).toMatchObject({ total: 12, counts: { A: 7, B: 3, C: 2, Reject: 0 } });
    expect(bat).toMatchObject({ partTypeId: "bat", periods: [{ period: "2026-06-08", total: 1 }] });
  });

  it("by month", () => {
    const [cam] = gradeDistribution(ROWS, "month");
    expect(cam.periods).toHaveLength(1);
    expect(cam.periods[0]).toMatchObject({ period: "2026-06-01", total: 12 });
    expect(Object.keys(cam.periods[0].counts)).toEqual(["A", "B", "C", "Reject"]);
  });

  it("refuses an unknown grade or a bad count", () => {
    expect(() => gradeDistribution([{ partTypeId: "cam", day: "2026-06-01", grade: "D" as never, count: 1 }], "week")).toThrow(/"D" is not a grade/);
    expect(() => gradeDistribution([{ partTypeId: "cam", day: "2026-06-01", grade: "A", count: -2 }], "week")).toThrow(/whole number >= 0/);
  });
});
