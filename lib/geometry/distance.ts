/** Distances from a point to segments and polylines (used for hit-testing and vertex insertion). */
import type { Point } from "./shape";

export type ClosestPoint = { point: Point; distance: number };

/**
 * The point of segment ab nearest to p: the projection parameter t = ((p − a)·(b − a)) / |b − a|²
 * clamped to [0, 1]. A zero-length segment is its own nearest point.
 */
export function closestPointOnSegment(p: Point, a: Point, b: Point): ClosestPoint & { t: number } {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const lengthSquared = dx * dx + dy * dy;
  let t = 0;
  if (lengthSquared > 0) {
    t = ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / lengthSquared;
    t = Math.min(1, Math.max(0, t));
  }
  const point: Point = [a[0] + t * dx, a[1] + t * dy];
  return { point, t, distance: Math.hypot(p[0] - point[0], p[1] - point[1]) };
}

export function distanceToSegment(p: Point, a: Point, b: Point): number {
  return closestPointOnSegment(p, a, b).distance;
}

/**
 * Nearest point on a polyline (with `closed`, also on the segment from the last point back to
 * the first). `segmentIndex` i means the segment from points[i] to points[i + 1] (wrapping to 0
 * for the closing segment). A single point is a polyline of zero length.
 */
export function closestPointOnPolyline(p: Point, points: readonly Point[], closed = false): ClosestPoint & { segmentIndex: number } {
  if (points.length === 0) throw new RangeError("closestPointOnPolyline needs at least one point");
  if (points.length === 1) {
    return { point: points[0], distance: Math.hypot(p[0] - points[0][0], p[1] - points[0][1]), segmentIndex: 0 };
  }
  const segmentCount = closed ? points.length : points.length - 1;
  let best: ClosestPoint & { segmentIndex: number } = { point: points[0], distance: Infinity, segmentIndex: 0 };
  for (let i = 0; i < segmentCount; i++) {
    const hit = closestPointOnSegment(p, points[i], points[(i + 1) % points.length]);
    if (hit.distance < best.distance) best = { point: hit.point, distance: hit.distance, segmentIndex: i };
  }
  return best;
}

export function distanceToPolyline(p: Point, points: readonly Point[], closed = false): number {
  return closestPointOnPolyline(p, points, closed).distance;
}
