import { describe, expect, it } from "vitest";
import { zoneBox, zonesToImage } from "@/components/annotate/zones";
import { zonesToPixels } from "@/lib/grading/measure-photo";
import type { PolygonShape } from "@/lib/geometry/shape";

const image = { width: 4000, height: 3000 };
const square = (x0: number, y0: number, x1: number, y1: number): PolygonShape => ({
  kind: "polygon",
  points: [
    [x0, y0],
    [x1, y0],
    [x1, y1],
    [x0, y1],
  ],
});
const lensWindow = {
  id: "lens-window",
  label: "Lens window",
  polygon: [
    [0.5, 0],
    [1, 0],
    [1, 0.5],
    [0.5, 0.5],
  ] as [number, number][],
};

describe("zones are drawn over the Surface's bounding box", () => {
  it("maps 0..1 onto the box: x = minX + u·w, y = minY + v·h (worked by hand)", () => {
    const box = zoneBox([square(1000, 500, 3000, 2500)], image);
    expect(box).toEqual({ minX: 1000, minY: 500, maxX: 3000, maxY: 2500, source: "surface" });
    // u 0.5 → 1000 + 0.5·2000 = 2000; v 0.5 → 500 + 0.5·2000 = 1500.
    expect(zonesToImage([lensWindow], box)[0].points).toEqual([
      [2000, 500],
      [3000, 500],
      [3000, 1500],
      [2000, 1500],
    ]);
  });

  it("uses the box of all surfaces together", () => {
    const box = zoneBox(
      [
        square(100, 200, 300, 400),
        {
          kind: "polygon",
          points: [
            [1000, 50],
            [1200, 600],
            [900, 500],
          ],
        },
      ],
      image,
    );
    expect(box).toMatchObject({ minX: 100, minY: 50, maxX: 1200, maxY: 600, source: "surface" });
  });

  it("falls back to the whole photo without a usable Surface", () => {
    expect(zoneBox([], image)).toEqual({ minX: 0, minY: 0, maxX: 4000, maxY: 3000, source: "image" });
    // A surface with no width cannot carry zones.
    expect(
      zoneBox(
        [
          {
            kind: "polygon",
            points: [
              [10, 10],
              [10, 200],
              [10, 400],
            ],
          },
        ],
        image,
      ).source,
    ).toBe("image");
  });

  it("puts zones exactly where the grading step measures them (lib/grading/measure-photo.ts)", () => {
    const surfaces = [
      square(312.5, 140.25, 3687.75, 2861.5),
      {
        kind: "polygon" as const,
        points: [
          [3000, 100],
          [3900, 900],
          [3100, 950],
        ] as [number, number][],
      },
    ];
    const zones = [
      lensWindow,
      {
        id: "body",
        label: "Body",
        polygon: [
          [0, 0],
          [1, 0],
          [1, 1],
          [0, 1],
        ] as [number, number][],
      },
    ];
    const server = zonesToPixels(zones, surfaces, image);
    const canvas = zonesToImage(zones, zoneBox(surfaces, image));
    expect(canvas.map((z) => z.points)).toEqual(server.map((z) => z.shape.points));
    expect(zonesToImage(zones, zoneBox([], image)).map((z) => z.points)).toEqual(zonesToPixels(zones, [], image).map((z) => z.shape.points));
  });
});
