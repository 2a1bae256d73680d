import { describe, expect, it } from "vitest";
import { closestPointOnPolyline, closestPointOnSegment, distanceToPolyline, distanceToSegment } from "@/lib/geometry/distance";
import type { Point } from "@/lib/geometry/shape";

describe("distance to a segment", () => {
  it("uses the perpendicular foot when it falls inside the segment", () => {
    // 3-4-5 right triangle: from (3, 4) to the x-axis segment the distance is 4, foot (3, 0).
    expect(closestPointOnSegment([3, 4], [0, 0], [10, 0])).toEqual({ point: [3, 0], t: 0.3, distance: 4 });
    // Point-to-line formula |ax + by + c| / √(a² + b²) for the line x + y − 10 = 0 through (10, 0)
    // and (0, 10): from the origin, 10 / √2.
    expect(distanceToSegment([0, 0], [10, 0], [0, 10])).toBeCloseTo(10 / Math.SQRT2, 12);
  });

  it("uses the nearer end point when the foot falls outside", () => {
    expect(distanceToSegment([13, 4], [0, 0], [10, 0])).toBe(5); // 3-4-5 from the end (10, 0)
    expect(closestPointOnSegment([-3, -4], [0, 0], [10, 0]).t).toBe(0);
  });

  it("handles a zero-length segment as a point", () => {
    expect(distanceToSegment([3, 4], [0, 0], [0, 0])).toBe(5);
  });
});

describe("distance to a polyline", () => {
  const path: Point[] = [
    [0, 0],
    [10, 0],
    [10, 10],
  ];

  it("finds the nearest segment and its index", () => {
    expect(closestPointOnPolyline([12, 6], path)).toEqual({ point: [10, 6], distance: 2, segmentIndex: 1 });
    expect(distanceToPolyline([5, -1], path)).toBe(1);
  });

  it("includes the closing segment only when closed", () => {
    // (2, 6) is √8 from the closing segment (10,10)→(0,0) but 6 from the open path.
    expect(distanceToPolyline([2, 6], path)).toBe(6);
    const closed = closestPointOnPolyline([2, 6], path, true);
    expect(closed.segmentIndex).toBe(2);
    expect(closed.distance).toBeCloseTo(Math.sqrt(8), 12);
  });

  it("accepts a single point and refuses none", () => {
    expect(distanceToPolyline([3, 4], [[0, 0]])).toBe(5);
    expect(() => distanceToPolyline([0, 0], [])).toThrow(RangeError);
  });
});
