/**
 * The drawn size of one region (lib/reports/region-size.ts), checked against plain geometry (a):
 * rectangle area = width × height; a disc's area = π r²; the shoelace formula for a polygon (a
 * 3-4-5 right triangle has area 6); a polyline's length is the sum of its segments (Pythagoras).
 */
import { describe, expect, it } from "vitest";
import { polylineLength, regionSize } from "@/lib/reports/region-size";

describe("regionSize", () => {
  it("rectangle: width × height, box as drawn, mm² by the square of px/mm", () => {
    expect(regionSize({ kind: "rect", x: 10, y: 20, width: 30, height: 10 }, 10)).toEqual({ x: 10, y: 20, width: 30, height: 10, areaPx: 300, lengthPx: null, areaMm2: 3, lengthMm: null });
  });

  it("spot: π r², its box the circle's", () => {
    const size = regionSize({ kind: "spot", x: 50, y: 50, radius: 4 }, null);
    expect(size.areaPx).toBeCloseTo(50.26548, 4);
    expect(size).toMatchObject({ x: 46, y: 46, width: 8, height: 8, areaMm2: null });
  });

  it("polygon: the shoelace area (3-4-5 triangle → 6)", () => {
    expect(
      regionSize(
        {
          kind: "polygon",
          points: [
            [0, 0],
            [4, 0],
            [0, 3],
          ],
        },
        2,
      ).areaPx,
    ).toBe(6);
    expect(
      regionSize(
        {
          kind: "polygon",
          points: [
            [0, 0],
            [4, 0],
            [0, 3],
          ],
        },
        2,
      ).areaMm2,
    ).toBe(1.5);
  });

  it("line: centre-line length, area = length × width, box widened by half the stroke", () => {
    const size = regionSize(
      {
        kind: "line",
        points: [
          [0, 0],
          [3, 4],
          [3, 10],
        ],
        width: 2,
      },
      5,
    );
    expect(size.lengthPx).toBe(11); // 5 (3-4-5) + 6
    expect(size.areaPx).toBe(22);
    expect(size.lengthMm).toBeCloseTo(2.2, 10);
    expect(size).toMatchObject({ x: -1, y: -1, width: 5, height: 12 });
  });

  it("no calibration or a zero scale gives no millimetres", () => {
    expect(regionSize({ kind: "rect", x: 0, y: 0, width: 1, height: 1 }, 0).areaMm2).toBeNull();
    expect(polylineLength([[0, 0]])).toBe(0);
  });
});
