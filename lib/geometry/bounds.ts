/** Axis-aligned bounding boxes of points and shapes, in the same pixel space as the input. */
import type { Point, Shape } from "./shape";

export type Bounds = { minX: number; minY: number; maxX: number; maxY: number };

export function boundsOfPoints(points: readonly Point[]): Bounds {
  if (points.length === 0) throw new RangeError("boundsOfPoints needs at least one point");
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const [x, y] of points) {
    if (x < minX) minX = x;
    if (y < minY) minY = y;
    if (x > maxX) maxX = x;
    if (y > maxY) maxY = y;
  }
  return { minX, minY, maxX, maxY };
}

/**
 * Bounding box of a shape's geometry. A line's box covers its vertices only unless
 * `includeStroke` is set, which widens it by half the stroke width on every side (a safe,
 * slightly loose box for the painted stroke).
 */
export function boundsOfShape(shape: Shape, options: { includeStroke?: boolean } = {}): Bounds {
  switch (shape.kind) {
    case "rect":
      return { minX: shape.x, minY: shape.y, maxX: shape.x + shape.width, maxY: shape.y + shape.height };
    case "polygon":
      return boundsOfPoints(shape.points);
    case "line": {
      const box = boundsOfPoints(shape.points);
      return options.includeStroke ? expandBounds(box, shape.width / 2) : box;
    }
    case "spot":
      return { minX: shape.x - shape.radius, minY: shape.y - shape.radius, maxX: shape.x + shape.radius, maxY: shape.y + shape.radius };
  }
}

export function expandBounds(box: Bounds, margin: number): Bounds {
  return { minX: box.minX - margin, minY: box.minY - margin, maxX: box.maxX + margin, maxY: box.maxY + margin };
}

export function boundsArea(box: Bounds): number {
  return Math.max(0, box.maxX - box.minX) * Math.max(0, box.maxY - box.minY);
}

export function boundsContainPoint(box: Bounds, [x, y]: Point): boolean {
  return x >= box.minX && x <= box.maxX && y >= box.minY && y <= box.maxY;
}
