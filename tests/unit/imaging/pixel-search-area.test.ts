/**
 * The search area of pixel-fault candidates: inside every region, an edge band in from each
 * region's edge. Distances are hand computations on axis-aligned rectangles (a: point-to-segment
 * distance); the tile rule rests on the signed distance changing by at most the distance moved.
 */
import { describe, expect, it } from "vitest";
import type { Point } from "@/lib/geometry/shape";
import { compileSearchArea, searchableTiles } from "@/lib/imaging/pixel-search-area";

const rect = (x0: number, y0: number, x1: number, y1: number): Point[] => [
  [x0, y0],
  [x1, y0],
  [x1, y1],
  [x0, y1],
];
const image = { width: 1000, height: 800 };

describe("compileSearchArea", () => {
  const area = compileSearchArea({ regions: [{ polygons: [rect(100, 100, 900, 700)] }, { polygons: [rect(150, 50, 950, 650)] }], edgeBandPx: 20 }, image);

  it("boxes the intersection of the regions, inset by the band", () => {
    expect(area.box).toEqual({ x: 170, y: 120, width: 710, height: 510 });
  });

  it("classifies points: inside both, in the band of either, or outside one", () => {
    expect(area.classify(500, 400)).toBe("inside");
    expect(area.signedDistance(500, 400)).toBe(250); // 250 px from the second region's bottom edge (650)
    expect(area.classify(160, 400)).toBe("edge-band"); // 10 px inside the second region's left edge
    expect(area.classify(120, 400)).toBe("outside"); // inside the first region only
    expect(area.classify(20, 20)).toBe("outside");
  });

  it("an empty region list, or a region without a polygon, searches nothing", () => {
    expect(compileSearchArea({ regions: [], edgeBandPx: 0 }, image).box).toMatchObject({ width: 0 });
    expect(compileSearchArea({ regions: [{ polygons: [] }], edgeBandPx: 0 }, image).classify(10, 10)).toBe("outside");
  });
});

describe("searchableTiles", () => {
  it("keeps every tile that holds a searchable point and no tile that cannot", () => {
    const rounded: Point[] = Array.from({ length: 64 }, (_, k) => [500 + 300 * Math.cos((k * Math.PI) / 32), 400 + 300 * Math.sin((k * Math.PI) / 32)] as Point);
    const area = compileSearchArea({ regions: [{ polygons: [rounded] }], edgeBandPx: 24 }, image);
    const tile = 16;
    const { columns, rows, usable } = searchableTiles(area, area.box, tile, 24);
    for (let ty = 0; ty < rows; ty++) {
      for (let tx = 0; tx < columns; tx++) {
        // Any pixel centre of the tile that is searchable must be in a usable tile.
        let any = false;
        for (let y = 0; y < tile && !any; y += 3) for (let x = 0; x < tile && !any; x += 3) any = area.classify(area.box.x + tx * tile + x + 0.5, area.box.y + ty * tile + y + 0.5) === "inside";
        if (any) expect(usable[ty * columns + tx], `tile ${tx},${ty}`).toBe(1);
      }
    }
    const kept = usable.reduce((a, b) => a + b, 0);
    expect(kept).toBeLessThan(columns * rows); // the corners of the box around a disc are skipped
  });
});
