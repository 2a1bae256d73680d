import { describe, expect, it } from "vitest";
import { boundsArea, boundsContainPoint, boundsOfPoints, boundsOfShape } from "@/lib/geometry/bounds";
import { clampPoint, clampShapeToImage, clampTranslation, maxLineWidthFor, maxSpotRadiusFor } from "@/lib/geometry/clamp";
import { translateShape } from "@/lib/geometry/transform";

const image = { width: 100, height: 50 };

describe("bounding boxes", () => {
  it("covers each kind of shape", () => {
    expect(boundsOfShape({ kind: "rect", x: 5, y: 6, width: 10, height: 4 })).toEqual({ minX: 5, minY: 6, maxX: 15, maxY: 10 });
    expect(
      boundsOfShape({
        kind: "polygon",
        points: [
          [3, 9],
          [-1, 2],
          [7, 4],
        ],
      }),
    ).toEqual({ minX: -1, minY: 2, maxX: 7, maxY: 9 });
    expect(boundsOfShape({ kind: "spot", x: 10, y: 10, radius: 3 })).toEqual({ minX: 7, minY: 7, maxX: 13, maxY: 13 });
    const line = {
      kind: "line" as const,
      points: [
        [0, 0],
        [10, 0],
      ] as [number, number][],
      width: 4,
    };
    expect(boundsOfShape(line)).toEqual({ minX: 0, minY: 0, maxX: 10, maxY: 0 });
    expect(boundsOfShape(line, { includeStroke: true })).toEqual({ minX: -2, minY: -2, maxX: 12, maxY: 2 });
  });

  it("measures and contains", () => {
    const box = boundsOfPoints([
      [1, 1],
      [4, 3],
    ]);
    expect(boundsArea(box)).toBe(6);
    expect(boundsContainPoint(box, [4, 3])).toBe(true);
    expect(boundsContainPoint(box, [4.01, 3])).toBe(false);
    expect(() => boundsOfPoints([])).toThrow(RangeError);
  });
});

describe("clamping into the image", () => {
  it("clamps points to [0, width] × [0, height], edges included", () => {
    expect(clampPoint([-5, 60], image)).toEqual([0, 50]);
    expect(clampPoint([100, 0], image)).toEqual([100, 0]);
  });

  it("intersects a rect with the image", () => {
    expect(clampShapeToImage({ kind: "rect", x: -10, y: 40, width: 30, height: 30 }, image)).toEqual({ kind: "rect", x: 0, y: 40, width: 20, height: 10 });
    // Entirely outside: nothing left (degenerate; the caller refuses it).
    expect(clampShapeToImage({ kind: "rect", x: 200, y: 0, width: 5, height: 5 }, image)).toMatchObject({ width: 0 });
  });

  it("clamps vertices and spot centres and caps radius and width (at least 16 px on small photos)", () => {
    expect(
      clampShapeToImage(
        {
          kind: "polygon",
          points: [
            [-1, -1],
            [50, 80],
            [120, 10],
          ],
        },
        image,
      ),
    ).toEqual({
      kind: "polygon",
      points: [
        [0, 0],
        [50, 50],
        [100, 10],
      ],
    });
    // 100 × 50 px: 10 % and 5 % of the long edge are below the 16 px floor.
    expect(clampShapeToImage({ kind: "spot", x: 101, y: 25, radius: 500 }, image)).toEqual({ kind: "spot", x: 100, y: 25, radius: 16 });
    expect(
      clampShapeToImage(
        {
          kind: "line",
          points: [
            [0, 0],
            [10, 10],
          ],
          width: 1e6,
        },
        image,
      ),
    ).toMatchObject({ width: 16 });
  });

  it("caps a 4000 × 3000 photo's Line at 200 px and Spot radius at 400 px (5 % and 10 % of the long edge)", () => {
    const large = { width: 4000, height: 3000 };
    expect([maxLineWidthFor(large), maxSpotRadiusFor(large)]).toEqual([200, 400]);
    expect(maxLineWidthFor({ width: 3000, height: 4000 })).toBe(200);
  });

  it("cuts a move short at the image edge", () => {
    expect(clampTranslation({ minX: 10, minY: 10, maxX: 20, maxY: 20 }, 500, -500, image)).toEqual({ dx: 80, dy: -10 });
    expect(clampTranslation({ minX: 10, minY: 10, maxX: 20, maxY: 20 }, 3, 4, image)).toEqual({ dx: 3, dy: 4 });
  });

  it("translates every kind of shape", () => {
    expect(translateShape({ kind: "rect", x: 1, y: 2, width: 3, height: 4 }, 10, 20)).toEqual({ kind: "rect", x: 11, y: 22, width: 3, height: 4 });
    expect(
      translateShape(
        {
          kind: "line",
          points: [
            [0, 0],
            [1, 1],
          ],
          width: 2,
        },
        1,
        -1,
      ),
    ).toEqual({
      kind: "line",
      points: [
        [1, -1],
        [2, 0],
      ],
      width: 2,
    });
    expect(translateShape({ kind: "spot", x: 5, y: 5, radius: 1 }, -5, 0)).toEqual({ kind: "spot", x: 0, y: 5, radius: 1 });
    expect(
      translateShape(
        {
          kind: "polygon",
          points: [
            [0, 0],
            [2, 0],
            [0, 2],
          ],
        },
        1,
        1,
      ),
    ).toEqual({
      kind: "polygon",
      points: [
        [1, 1],
        [3, 1],
        [1, 3],
      ],
    });
  });
});
