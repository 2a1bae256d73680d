/**
 * Plain geometry of region shapes: bounds, the segments of a line, and polygon outlines (rings)
 * for exact-area cross-checks with a polygon library. Coordinates are image pixels (see
 * lib/geometry/shape.ts).
 */
import type { Point, Shape } from "@/lib/geometry/shape";

export type Bounds = { minX: number; minY: number; maxX: number; maxY: number };

/** The continuous bounding box of everything the shape covers (a line includes its width). */
export function shapeBounds(shape: Shape): Bounds {
  switch (shape.kind) {
    case "rect":
      return { minX: shape.x, minY: shape.y, maxX: shape.x + shape.width, maxY: shape.y + shape.height };
    case "spot":
      return { minX: shape.x - shape.radius, minY: shape.y - shape.radius, maxX: shape.x + shape.radius, maxY: shape.y + shape.radius };
    case "polygon":
      return pointBounds(shape.points, 0);
    case "line":
      return pointBounds(shape.points, shape.width / 2);
  }
}

function pointBounds(points: Point[], pad: number): Bounds {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const [x, y] of points) {
    minX = Math.min(minX, x);
    minY = Math.min(minY, y);
    maxX = Math.max(maxX, x);
    maxY = Math.max(maxY, y);
  }
  return { minX: minX - pad, minY: minY - pad, maxX: maxX + pad, maxY: maxY + pad };
}

/** A line's centre-line segments; a single point is one zero-length segment (a round dot). */
export function lineSegments(points: Point[]): [Point, Point][] {
  if (points.length === 1) return [[points[0], points[0]]];
  const segments: [Point, Point][] = [];
  for (let k = 1; k < points.length; k++) segments.push([points[k - 1], points[k]]);
  return segments;
}

/**
 * Splits long segments into pieces of at most `maxLength`. With round caps the union of the
 * pieces' capsules is exactly the capsule of the segment, so this only changes how a line is
 * tiled (small boxes instead of one large diagonal box).
 */
export function splitSegments(segments: [Point, Point][], maxLength: number): [Point, Point][] {
  const pieces: [Point, Point][] = [];
  for (const [a, b] of segments) {
    const count = Math.max(1, Math.ceil(Math.hypot(b[0] - a[0], b[1] - a[1]) / maxLength));
    for (let k = 0; k < count; k++) {
      const t0 = k / count;
      const t1 = (k + 1) / count;
      pieces.push([
        [a[0] + (b[0] - a[0]) * t0, a[1] + (b[1] - a[1]) * t0],
        [a[0] + (b[0] - a[0]) * t1, a[1] + (b[1] - a[1]) * t1],
      ]);
    }
  }
  return pieces;
}

/** A closed ring approximating a circle with `sides` vertices (counter-clockwise in y-down). */
export function circleRing(cx: number, cy: number, radius: number, sides: number): Point[] {
  return Array.from({ length: sides }, (_, k) => {
    const angle = (2 * Math.PI * k) / sides;
    return [cx + radius * Math.cos(angle), cy + radius * Math.sin(angle)] as Point;
  });
}

/** The convex outline of one round-capped segment (a "stadium"), `sides` vertices per full turn. */
export function capsuleRing(a: Point, b: Point, halfWidth: number, sides: number): Point[] {
  const length = Math.hypot(b[0] - a[0], b[1] - a[1]);
  if (length === 0) return circleRing(a[0], a[1], halfWidth, sides);
  const heading = Math.atan2(b[1] - a[1], b[0] - a[0]);
  const half = Math.ceil(sides / 2);
  const ring: Point[] = [];
  // Half circle around b from heading-90° to heading+90°, then around a from heading+90° to +270°.
  for (let k = 0; k <= half; k++) {
    const angle = heading - Math.PI / 2 + (Math.PI * k) / half;
    ring.push([b[0] + halfWidth * Math.cos(angle), b[1] + halfWidth * Math.sin(angle)]);
  }
  for (let k = 0; k <= half; k++) {
    const angle = heading + Math.PI / 2 + (Math.PI * k) / half;
    ring.push([a[0] + halfWidth * Math.cos(angle), a[1] + halfWidth * Math.sin(angle)]);
  }
  return ring;
}

/**
 * Polygon outlines whose union is the shape (a line gives one capsule per segment). Curves use
 * `sides` vertices per full circle, so areas come out slightly small: by a factor of
 * sin(2π/n)/(2π/n), about 1e-4 for n = 256.
 */
export function shapeRings(shape: Shape, sides = 256): Point[][] {
  switch (shape.kind) {
    case "rect": {
      const { x, y, width, height } = shape;
      return [
        [
          [x, y],
          [x + width, y],
          [x + width, y + height],
          [x, y + height],
        ],
      ];
    }
    case "polygon":
      return [shape.points];
    case "spot":
      return [circleRing(shape.x, shape.y, shape.radius, sides)];
    case "line":
      return lineSegments(shape.points).map(([a, b]) => capsuleRing(a, b, shape.width / 2, sides));
  }
}
