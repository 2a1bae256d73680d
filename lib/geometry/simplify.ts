/**
 * Thinning long vertex lists (freehand strokes) with the Ramer–Douglas–Peucker algorithm
 * (Ramer 1972; Douglas & Peucker 1973): keep the end points, then recursively keep the point
 * farthest from the chord whenever it lies more than `tolerance` px away. Every dropped point is
 * therefore within `tolerance` of the simplified path. Iterative (explicit stack) so a
 * 100 000-point stroke cannot overflow the call stack.
 */
import { distanceToSegment } from "./distance";
import { distance } from "./points";
import type { Point } from "./shape";

export function simplifyPolyline(points: readonly Point[], tolerance: number): Point[] {
  if (points.length <= 2 || !(tolerance > 0)) return points.slice();
  const keep = new Uint8Array(points.length);
  keep[0] = 1;
  keep[points.length - 1] = 1;
  const stack: [number, number][] = [[0, points.length - 1]];
  while (stack.length > 0) {
    const [first, last] = stack.pop()!;
    let farIndex = -1;
    let farDistance = tolerance;
    for (let i = first + 1; i < last; i++) {
      const d = distanceToSegment(points[i], points[first], points[last]);
      if (d > farDistance) {
        farIndex = i;
        farDistance = d;
      }
    }
    if (farIndex >= 0) {
      keep[farIndex] = 1;
      stack.push([first, farIndex], [farIndex, last]);
    }
  }
  return points.filter((_, i) => keep[i] === 1);
}

/**
 * RDP for an implicitly closed ring: split at the first point and the point farthest from it,
 * simplify both halves as open paths and join them. Never returns fewer than 3 points for a ring
 * of 3 or more (a ring thinner than `tolerance` keeps its first, farthest and widest points).
 */
export function simplifyRing(points: readonly Point[], tolerance: number): Point[] {
  if (points.length <= 3 || !(tolerance > 0)) return points.slice();
  let farIndex = 1;
  for (let i = 1; i < points.length; i++) {
    if (distance(points[0], points[i]) > distance(points[0], points[farIndex])) farIndex = i;
  }
  const firstHalf = simplifyPolyline(points.slice(0, farIndex + 1), tolerance);
  const secondHalf = simplifyPolyline([...points.slice(farIndex), points[0]], tolerance);
  const ring = [...firstHalf, ...secondHalf.slice(1, -1)];
  if (ring.length >= 3) return ring;
  let widest = 1;
  let widestDistance = -1;
  for (let i = 1; i < points.length; i++) {
    const d = distanceToSegment(points[i], points[0], points[farIndex]);
    if (i !== farIndex && d > widestDistance) {
      widest = i;
      widestDistance = d;
    }
  }
  return [points[0], points[Math.min(widest, farIndex)], points[Math.max(widest, farIndex)]];
}

/**
 * Simplify only as much as needed to fit `maxPoints`: starting at `startTolerance` px, double the
 * tolerance until the result fits. Returns the input unchanged when it already fits.
 */
export function simplifyToLimit(
  points: readonly Point[],
  maxPoints: number,
  options: { closed: boolean; startTolerance?: number },
): Point[] {
  if (points.length <= maxPoints) return points.slice();
  const simplify = options.closed ? simplifyRing : simplifyPolyline;
  let tolerance = options.startTolerance ?? 0.25;
  let result = simplify(points, tolerance);
  // 60 doublings take 0.25 px past any photo's size, so the loop always ends.
  for (let round = 0; result.length > maxPoints && round < 60; round++) {
    tolerance *= 2;
    result = simplify(points, tolerance);
  }
  return result;
}
