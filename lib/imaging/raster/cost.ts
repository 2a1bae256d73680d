/**
 * What rasterising costs, counted before any work is done, so a region set that would keep the
 * measuring CPU busy for minutes is refused with a sentence instead.
 *
 * The unit is the **shape row**: one pixel row of one polygon edge, of one line segment's capsule,
 * of a box or of a disc (clipped to the image), plus one row per row a polygon spans (its winding
 * sweep). The exact rasteriser (exact-spans.ts) writes at most one crossing or span per shape row,
 * and every later step of measureCoverage — union, clipping to the Surface, zones, counting
 * separate regions — sorts or walks those spans, so time and memory grow with this count
 * (n log n), not with the photo's pixel count or a shape's area. A 4 000 px wide Line across a
 * 3 000 px photo is 3 000 shape rows per segment however long it is.
 */
import type { Shape } from "@/lib/geometry/shape";

type Frame = { width: number; height: number };

/** Rows whose centre lies in [y0, y1), clipped to the image (the rasterisers' row rule). */
function rowsBetween(y0: number, y1: number, frame: Frame): number {
  return Math.max(0, Math.min(frame.height, Math.ceil(y1 - 0.5)) - Math.max(0, Math.ceil(y0 - 0.5)));
}

export function shapeRasterRows(shape: Shape, frame: Frame): number {
  switch (shape.kind) {
    case "rect":
      return rowsBetween(shape.y, shape.y + shape.height, frame);
    case "spot":
      return rowsBetween(shape.y - shape.radius, shape.y + shape.radius, frame);
    case "polygon": {
      let rows = 0;
      let minY = Infinity;
      let maxY = -Infinity;
      const n = shape.points.length;
      for (let k = 0; k < n; k++) {
        const y1 = shape.points[k][1];
        const y2 = shape.points[(k + 1) % n][1];
        rows += rowsBetween(Math.min(y1, y2), Math.max(y1, y2), frame);
        minY = Math.min(minY, y1);
        maxY = Math.max(maxY, y1);
      }
      return rows + rowsBetween(minY, maxY, frame);
    }
    case "line": {
      const half = shape.width / 2;
      const { points } = shape;
      if (points.length === 1) return rowsBetween(points[0][1] - half, points[0][1] + half, frame);
      let rows = 0;
      for (let k = 0; k + 1 < points.length; k++) {
        const y1 = points[k][1];
        const y2 = points[k + 1][1];
        rows += rowsBetween(Math.min(y1, y2) - half, Math.max(y1, y2) + half, frame);
      }
      return rows;
    }
  }
}

/** Shape rows of all shapes together. */
export function rasterRows(shapes: Iterable<Shape>, frame: Frame): number {
  let total = 0;
  for (const shape of shapes) total += shapeRasterRows(shape, frame);
  return total;
}
