import { describe, expect, it } from "vitest";
import { distanceToShape, hitsShape } from "@/lib/geometry/hit";

describe("distance to what a shape paints", () => {
  it("is 0 inside filled shapes and the gap outside", () => {
    const rect = { kind: "rect" as const, x: 10, y: 10, width: 20, height: 10 };
    expect(distanceToShape(rect, [15, 15])).toBe(0);
    expect(distanceToShape(rect, [33, 24])).toBe(5); // 3-4-5 from the corner (30, 20)
    expect(distanceToShape(rect, [20, 5])).toBe(5);
    const triangle = {
      kind: "polygon" as const,
      points: [
        [0, 0],
        [10, 0],
        [0, 10],
      ] as [number, number][],
    };
    expect(distanceToShape(triangle, [2, 2])).toBe(0);
    expect(distanceToShape(triangle, [10, 10])).toBeCloseTo(10 / Math.SQRT2 - 0, 9); // to the hypotenuse x + y = 10
    expect(distanceToShape({ kind: "spot", x: 0, y: 0, radius: 2 }, [3, 4])).toBe(3);
    expect(distanceToShape({ kind: "spot", x: 0, y: 0, radius: 2 }, [1, 1])).toBe(0);
  });

  it("counts half the stroke width for lines", () => {
    const line = {
      kind: "line" as const,
      points: [
        [0, 0],
        [10, 0],
      ] as [number, number][],
      width: 4,
    };
    expect(distanceToShape(line, [5, 1.5])).toBe(0);
    expect(distanceToShape(line, [5, 5])).toBe(3);
    expect(hitsShape(line, [5, 5], 3)).toBe(true);
    expect(hitsShape(line, [5, 5], 2.9)).toBe(false);
  });
});
