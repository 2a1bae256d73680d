/**
 * Small point helpers shared by the geometry modules. Points are `[x, y]` tuples in upright
 * original pixel space (see shape.ts); nothing here knows about the screen.
 */
import type { Point } from "./shape";

export function pointsEqual(a: Point, b: Point): boolean {
  return a[0] === b[0] && a[1] === b[1];
}

export function distance(a: Point, b: Point): number {
  return Math.hypot(b[0] - a[0], b[1] - a[1]);
}

/** z of (a − o) × (b − o): > 0 when o→a→b turns clockwise on screen (y down), 0 when collinear. */
export function cross(o: Point, a: Point, b: Point): number {
  return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
}

/**
 * Drops a point equal to the one before it. With `closed`, also drops trailing points equal to
 * the first (a ring never needs to repeat its start).
 */
export function dedupeConsecutive(points: readonly Point[], closed = false): Point[] {
  const kept: Point[] = [];
  for (const point of points) {
    if (kept.length === 0 || !pointsEqual(kept[kept.length - 1], point)) kept.push(point);
  }
  if (closed) {
    while (kept.length > 1 && pointsEqual(kept[kept.length - 1], kept[0])) kept.pop();
  }
  return kept;
}

/**
 * How many different points the list holds (exact equality), counting no further than `limit`:
 * the checks only ask "at least 2?" or "at least 3?", and stopping early keeps a 5 000-point
 * outline cheap.
 */
export function distinctPointsUpTo(points: readonly Point[], limit: number): number {
  const found: Point[] = [];
  for (const p of points) {
    if (!found.some((q) => pointsEqual(p, q))) {
      found.push(p);
      if (found.length >= limit) break;
    }
  }
  return found.length;
}

/** How many different points the list holds (exact equality). */
export function distinctPointCount(points: readonly Point[]): number {
  const seen = new Set<string>();
  for (const [x, y] of points) seen.add(`${x},${y}`);
  return seen.size;
}

/** Sum of segment lengths; with `closed`, includes the segment back to the start. */
export function polylineLength(points: readonly Point[], closed = false): number {
  let total = 0;
  for (let i = 1; i < points.length; i++) total += distance(points[i - 1], points[i]);
  if (closed && points.length > 2) total += distance(points[points.length - 1], points[0]);
  return total;
}
