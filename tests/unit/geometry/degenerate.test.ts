import { describe, expect, it } from "vitest";
import { areCollinear, describeOutsideImage, describeShapeProblem, isClosedLine, isSelfRetracingLine } from "@/lib/geometry/degenerate";
import { MAX_POINTS_PER_SHAPE } from "@/lib/geometry/limits";
import { dedupeConsecutive, distinctPointCount, distinctPointsUpTo, polylineLength } from "@/lib/geometry/points";
import type { Point } from "@/lib/geometry/shape";

describe("collinearity", () => {
  it("detects points on one line (zero cross product) and off it", () => {
    expect(
      areCollinear([
        [0, 0],
        [1, 1],
        [5, 5],
        [-3, -3],
      ]),
    ).toBe(true);
    expect(
      areCollinear([
        [0, 0],
        [1, 1],
        [5, 5.001],
      ]),
    ).toBe(false);
    expect(
      areCollinear([
        [2, 2],
        [2, 2],
        [2, 2],
      ]),
    ).toBe(true);
    // Rounding noise far below a pixel still counts as on the line.
    expect(
      areCollinear([
        [0, 0],
        [0.1 + 0.2, 0.3],
        [3000, 3000],
      ]),
    ).toBe(true);
  });
});

describe("point list helpers", () => {
  it("drops consecutive repeats and, for rings, a repeated start", () => {
    const pts: Point[] = [
      [0, 0],
      [0, 0],
      [1, 0],
      [1, 1],
      [0, 0],
    ];
    expect(dedupeConsecutive(pts)).toEqual([
      [0, 0],
      [1, 0],
      [1, 1],
      [0, 0],
    ]);
    expect(dedupeConsecutive(pts, true)).toEqual([
      [0, 0],
      [1, 0],
      [1, 1],
    ]);
    expect(distinctPointCount(pts)).toBe(3);
    expect(distinctPointsUpTo(pts, 2)).toBe(2);
    expect(distinctPointsUpTo(pts, 10)).toBe(3);
    expect(
      polylineLength([
        [0, 0],
        [3, 4],
        [3, 0],
      ]),
    ).toBe(9);
    expect(
      polylineLength(
        [
          [0, 0],
          [3, 4],
          [3, 0],
        ],
        true,
      ),
    ).toBe(12);
  });

  it("recognises lines that only retrace two points", () => {
    expect(
      isSelfRetracingLine([
        [0, 0],
        [5, 5],
        [0, 0],
      ]),
    ).toBe(true);
    expect(
      isSelfRetracingLine([
        [0, 0],
        [5, 5],
        [5, 5],
        [0, 0],
        [5, 5],
      ]),
    ).toBe(true);
    expect(
      isSelfRetracingLine([
        [0, 0],
        [5, 5],
      ]),
    ).toBe(false);
    expect(
      isSelfRetracingLine([
        [0, 0],
        [5, 5],
        [5, 0],
        [0, 0],
      ]),
    ).toBe(false); // a closed loop is a real scratch
    expect(
      isClosedLine([
        [0, 0],
        [5, 5],
        [5, 0],
        [0, 0],
      ]),
    ).toBe(true);
  });
});

describe("describeShapeProblem", () => {
  it("accepts usable shapes", () => {
    expect(describeShapeProblem({ kind: "rect", x: 0, y: 0, width: 1, height: 1 })).toBeNull();
    expect(
      describeShapeProblem({
        kind: "polygon",
        points: [
          [0, 0],
          [4, 0],
          [0, 3],
        ],
      }),
    ).toBeNull();
    expect(
      describeShapeProblem({
        kind: "polygon",
        points: [
          [0, 0],
          [4, 0],
          [4, 0],
          [0, 3],
          [0, 0],
        ],
      }),
    ).toBeNull();
    expect(
      describeShapeProblem({
        kind: "line",
        points: [
          [0, 0],
          [4, 0],
        ],
        width: 1,
      }),
    ).toBeNull();
    expect(describeShapeProblem({ kind: "spot", x: 0, y: 0, radius: 0.5 })).toBeNull();
  });

  it("names what is wrong", () => {
    expect(describeShapeProblem({ kind: "rect", x: 0, y: 0, width: 0, height: 1 })).toBe("a box needs a width and a height above 0.");
    expect(describeShapeProblem({ kind: "rect", x: 0, y: 0, width: 2, height: -1 })).toMatch(/box/);
    expect(
      describeShapeProblem({
        kind: "polygon",
        points: [
          [0, 0],
          [1, 1],
        ],
      }),
    ).toBe("a polygon needs at least 3 points that are not on one line.");
    expect(
      describeShapeProblem({
        kind: "polygon",
        points: [
          [0, 0],
          [1, 1],
          [2, 2],
        ],
      }),
    ).toMatch(/not on one line/);
    expect(
      describeShapeProblem({
        kind: "polygon",
        points: [
          [0, 0],
          [1, 1],
          [1, 1],
          [0, 0],
        ],
      }),
    ).toMatch(/not on one line/);
    // Symmetric bow-tie: its two lobes have opposite orientation, so the shoelace sum is 0.
    expect(
      describeShapeProblem({
        kind: "polygon",
        points: [
          [0, 0],
          [2, 2],
          [2, 0],
          [0, 2],
        ],
      }),
    ).toMatch(/encloses no area/);
    expect(
      describeShapeProblem({
        kind: "line",
        points: [
          [0, 0],
          [0, 0],
        ],
        width: 2,
      }),
    ).toBe("a line needs at least 2 different points.");
    expect(
      describeShapeProblem({
        kind: "line",
        points: [
          [0, 0],
          [3, 0],
        ],
        width: 0,
      }),
    ).toBe("a line needs a width above 0.");
    expect(
      describeShapeProblem({
        kind: "line",
        points: [
          [0, 0],
          [3, 0],
          [0, 0],
        ],
        width: 1,
      }),
    ).toMatch(/back and forth/);
    expect(describeShapeProblem({ kind: "spot", x: 0, y: 0, radius: 0 })).toBe("a spot needs a radius above 0.");
    const many: Point[] = Array.from({ length: MAX_POINTS_PER_SHAPE + 1 }, (_, i) => [i % 100, Math.floor(i / 100)]);
    expect(describeShapeProblem({ kind: "polygon", points: many })).toBe(`a polygon may have at most ${MAX_POINTS_PER_SHAPE} points.`);
  });
});

describe("describeOutsideImage", () => {
  const image = { width: 100, height: 50 };
  it("accepts points on the far edges and rejects points past them", () => {
    expect(describeOutsideImage({ kind: "rect", x: 0, y: 0, width: 100, height: 50 }, image)).toBeNull();
    expect(describeOutsideImage({ kind: "rect", x: 0.5, y: 0, width: 100, height: 50 }, image)).toBe("the box reaches outside the 100 × 50 px photo.");
    expect(
      describeOutsideImage(
        {
          kind: "polygon",
          points: [
            [0, 0],
            [100, 0],
            [50, 50.5],
          ],
        },
        image,
      ),
    ).toBe("point 3 (50, 50.5) lies outside the 100 × 50 px photo.");
    expect(
      describeOutsideImage(
        {
          kind: "line",
          points: [
            [-0.1, 0],
            [1, 1],
          ],
          width: 1,
        },
        image,
      ),
    ).toMatch(/^point 1/);
  });

  it("lets a spot's radius and a line's width reach past the edge but not past their caps", () => {
    // 100 × 50 px: both caps are the 16 px floor (10 % and 5 % of 100 px are less).
    expect(describeOutsideImage({ kind: "spot", x: 0, y: 0, radius: 10 }, image)).toBeNull();
    expect(describeOutsideImage({ kind: "spot", x: 0, y: 0, radius: 16 }, image)).toBeNull();
    expect(describeOutsideImage({ kind: "spot", x: 0, y: 0, radius: 16.5 }, image)).toBe(
      "the spot's radius is 16.5 px; at most 16 px (10 % of the photo's long edge) is allowed — mark a larger defect with Outline.",
    );
    expect(describeOutsideImage({ kind: "spot", x: -1, y: 0, radius: 1 }, image)).toMatch(/centre/);
    expect(
      describeOutsideImage(
        {
          kind: "line",
          points: [
            [0, 0],
            [1, 1],
          ],
          width: 17,
        },
        image,
      ),
    ).toBe("the line is 17 px wide; at most 16 px (5 % of the photo's long edge) is allowed — mark a wider defect with Outline.");
    // The case: a 4 000 px wide line on a 4000 × 3000 photo (cap 200 px).
    expect(
      describeOutsideImage(
        {
          kind: "line",
          points: [
            [0, 1500],
            [4000, 1500],
          ],
          width: 4000,
        },
        { width: 4000, height: 3000 },
      ),
    ).toMatch(/at most 200 px/);
  });
});
