/**
 * Hit-testing a shape: how far a point is from what the shape paints. Filled shapes (rect,
 * polygon, spot) are at distance 0 anywhere inside; a line paints a stroke of its width around
 * its path. Tolerances are in the same (image) pixels as the shape; the editor converts a
 * screen-pixel tolerance through the viewport before calling in.
 */
import { closestPointOnPolyline } from "./distance";
import { pointInPolygon } from "./polygon";
import type { Point, Shape } from "./shape";

export function distanceToShape(shape: Shape, p: Point): number {
  switch (shape.kind) {
    case "rect": {
      const dx = Math.max(shape.x - p[0], 0, p[0] - (shape.x + shape.width));
      const dy = Math.max(shape.y - p[1], 0, p[1] - (shape.y + shape.height));
      return Math.hypot(dx, dy);
    }
    case "polygon":
      return pointInPolygon(p, shape.points) ? 0 : closestPointOnPolyline(p, shape.points, true).distance;
    case "line":
      return Math.max(0, closestPointOnPolyline(p, shape.points).distance - shape.width / 2);
    case "spot":
      return Math.max(0, Math.hypot(p[0] - shape.x, p[1] - shape.y) - shape.radius);
  }
}

export function hitsShape(shape: Shape, p: Point, tolerance: number): boolean {
  return distanceToShape(shape, p) <= tolerance;
}
