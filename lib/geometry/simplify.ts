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

/** Squared distance from p to segment ab, inlined without allocation (this loop is the hot path). */
function segmentDistanceSquared(p: Point, a: Point, b: Point): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const lengthSquared = dx * dx + dy * dy;
  let t = lengthSquared > 0 ? ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / lengthSquared : 0;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  const ex = p[0] - (a[0] + t * dx);
  const ey = p[1] - (a[1] + t * dy);
  return ex * ex + ey * ey;
}

export function simplifyPolyline(points: readonly Point[], tolerance: number): Point[] {
  if (points.length <= 2 || !(tolerance > 0)) return points.slice();
  const keep = new Uint8Array(points.length);
  keep[0] = 1;
  keep[points.length - 1] = 1;
  const stack: [number, number][] = [[0, points.length - 1]];
  while (stack.length > 0) {
    const [first, last] = stack.pop()!;
    let farIndex = -1;
    let farDistance = tolerance * tolerance;
    for (let i = first + 1; i < last; i++) {
      const d = segmentDistanceSquared(points[i], points[first], points[last]);
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
 * Simplify only as much as needed to fit `maxPoints`: double the tolerance from `startTolerance`
 * until the result fits, then bisect between the last two tolerances so as much detail as the
 * limit allows survives. Returns the input unchanged when it already fits.
 */
export function simplifyToLimit(points: readonly Point[], maxPoints: number, options: { closed: boolean; startTolerance?: number }): Point[] {
  if (points.length <= maxPoints) return points.slice();
  const simplify = options.closed ? simplifyRing : simplifyPolyline;
  let low = 0;
  let high = options.startTolerance ?? 0.25;
  let fitted = simplify(points, high);
  // 60 doublings take 0.25 px past any photo's size, so the loop always ends.
  for (let round = 0; fitted.length > maxPoints && round < 60; round++) {
    low = high;
    high *= 2;
    fitted = simplify(points, high);
  }
  for (let round = 0; round < 12; round++) {
    const middle = (low + high) / 2;
    const candidate = simplify(points, middle);
    if (candidate.length <= maxPoints) {
      high = middle;
      fitted = candidate;
    } else {
      low = middle;
    }
  }
  return fitted;
}
