/**
 * The measuring work a shape costs, in shape rows (lib/imaging/raster/cost.ts). Expected counts
 * are hand counts under the rasterisers' row rule (a row j counts when its centre j + ½ lies in
 * the shape's vertical extent), checked against the rows the exact rasteriser actually writes.
 */
import { describe, expect, it } from "vitest";
import type { Shape } from "@/lib/geometry/shape";
import { rasterRows, shapeRasterRows } from "@/lib/imaging/raster/cost";
import { shapeSpans } from "@/lib/imaging/raster/exact-spans";

const photo = { width: 4000, height: 3000 };

describe("shape rows", () => {
  it("counts a box's and a disc's rows, clipped to the photo", () => {
    expect(shapeRasterRows({ kind: "rect", x: 10, y: 20, width: 30, height: 40 }, photo)).toBe(40);
    expect(shapeRasterRows({ kind: "rect", x: 10, y: 2990, width: 30, height: 40 }, photo)).toBe(10);
    expect(shapeRasterRows({ kind: "spot", x: 100, y: 100, radius: 12.5 }, photo)).toBe(25);
  });

  it("counts every edge's rows plus the polygon's own rows (its winding sweep)", () => {
    // A triangle 100 rows tall: edges of 100, 100 and 0 rows, plus 100 rows of sweep.
    expect(
      shapeRasterRows(
        {
          kind: "polygon",
          points: [
            [0, 0],
            [50, 100],
            [100, 0],
          ],
        },
        photo,
      ),
    ).toBe(300);
    // A zigzag of 40 edges each spanning the whole 3 000-row photo costs 40 × 3 000 + 3 000.
    const zigzag: [number, number][] = Array.from({ length: 40 }, (_, k) => [k * 10, k % 2 === 0 ? 0 : 3000]);
    expect(shapeRasterRows({ kind: "polygon", points: zigzag }, photo)).toBe(123_000);
  });

  it("counts a line per segment, grown by its width: the issue's 4 000 px line is only 3 000 rows here", () => {
    expect(
      shapeRasterRows(
        {
          kind: "line",
          points: [
            [0, 1500],
            [4000, 1500],
          ],
          width: 4000,
        },
        photo,
      ),
    ).toBe(3000);
    expect(
      shapeRasterRows(
        {
          kind: "line",
          points: [
            [10, 10],
            [10, 110],
            [60, 110],
          ],
          width: 4,
        },
        photo,
      ),
    ).toBe(104 + 4);
    expect(shapeRasterRows({ kind: "line", points: [[10, 10]], width: 6 }, photo)).toBe(6);
  });

  it("bounds the rows the exact rasteriser writes", () => {
    const shapes: Shape[] = [
      { kind: "rect", x: 3.5, y: 7.25, width: 30, height: 22.5 },
      { kind: "spot", x: 400, y: 300, radius: 37.3 },
      {
        kind: "polygon",
        points: [
          [100, 100],
          [180, 130],
          [150, 260],
          [90, 210],
        ],
      },
      {
        kind: "line",
        points: [
          [500, 500],
          [620, 540],
          [700, 420],
        ],
        width: 9,
      },
    ];
    for (const shape of shapes) {
      const spans = shapeSpans(shape, photo);
      expect(spans.rowCount, shape.kind).toBeLessThanOrEqual(shapeRasterRows(shape, photo));
    }
    expect(rasterRows(shapes, photo)).toBe(shapes.reduce((sum, s) => sum + shapeRasterRows(s, photo), 0));
  });
});
