/**
 * The active screen area a pixel-fault search uses: the Surface and the view's zones (0..1 of the
 * Surface box, docs/contracts.md), and the edge band (2 % of the shorter side, at least 16 px; our
 * choice, c). Expected boxes are hand computations on rectangles.
 */
import { describe, expect, it } from "vitest";
import type { PolygonShape } from "@/lib/geometry/shape";
import { screenSearchArea } from "@/lib/regions/screen-area";

const surface: PolygonShape = {
  kind: "polygon",
  points: [
    [500, 200],
    [3500, 200],
    [3500, 2800],
    [500, 2800],
  ],
};
const zone = {
  id: "screen-active",
  label: "Screen active",
  polygon: [
    [0.04, 0.03],
    [0.96, 0.03],
    [0.96, 0.97],
    [0.04, 0.97],
  ] as [number, number][],
};
const size = { width: 4000, height: 3000 };

describe("screenSearchArea", () => {
  it("asks for a Surface first", () => {
    expect(screenSearchArea({ surfaces: [], zones: [zone], size })).toEqual({ problem: expect.stringMatching(/no Surface yet/) });
  });

  it("searches inside the Surface and the zone, in photo pixels, 2 % of the shorter side in from their edges", () => {
    const result = screenSearchArea({ surfaces: [surface], zones: [zone], size });
    if ("problem" in result) throw new Error(result.problem);
    // The zone: x 500 + 0.04 × 3000 = 620 … 3380, y 200 + 0.03 × 2600 = 278 … 2722; shorter side 2444 → 49 px.
    expect(result.area.edgeBandPx).toBe(49);
    expect(result.area.regions[1].polygons[0][0][0]).toBeCloseTo(620, 6);
    expect(result.area.regions[1].polygons[0][0][1]).toBeCloseTo(278, 6);
    expect(result.description).toBe("inside the Surface and the zone Screen active, 49 px in from their edges");
  });

  it("without zones, the Surface alone; a small panel still gets 16 px", () => {
    const small: PolygonShape = {
      kind: "polygon",
      points: [
        [10, 10],
        [310, 10],
        [310, 210],
        [10, 210],
      ],
    };
    const result = screenSearchArea({ surfaces: [small], zones: [], size });
    if ("problem" in result) throw new Error(result.problem);
    expect(result.area.regions).toHaveLength(1);
    expect(result.area.edgeBandPx).toBe(16);
    expect(result.description).toBe("inside the Surface, 16 px in from its edge");
  });
});
