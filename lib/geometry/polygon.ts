/**
 * Polygon measures. A polygon is an implicitly closed ring of points (the last point joins the
 * first); it must not be assumed simple, so the winding rule is stated wherever it matters.
 */
import type { Point } from "./shape";

/**
 * Signed area by the shoelace (surveyor's) formula A = ½ Σ (x_i·y_{i+1} − x_{i+1}·y_i).
 * Coordinates are taken relative to the first vertex, which gives the same value with less
 * rounding on large images. With y pointing down, the sign is positive for vertices that run
 * clockwise on screen. A self-intersecting ring's lobes of opposite orientation cancel out.
 */
export function signedPolygonArea(points: readonly Point[]): number {
  const n = points.length;
  if (n < 3) return 0;
  const [x0, y0] = points[0];
  let twiceArea = 0;
  for (let i = 1; i < n - 1; i++) {
    const ax = points[i][0] - x0;
    const ay = points[i][1] - y0;
    const bx = points[i + 1][0] - x0;
    const by = points[i + 1][1] - y0;
    twiceArea += ax * by - bx * ay;
  }
  return twiceArea / 2;
}

/** Unsigned shoelace area (see signedPolygonArea). */
export function polygonArea(points: readonly Point[]): number {
  return Math.abs(signedPolygonArea(points));
}

/**
 * Winding number of the ring around `point` (Sunday's crossing-with-orientation method): the
 * number of times the ring goes round the point, 0 outside. Points exactly on an edge may count
 * either way; hit-testing adds a distance tolerance on top, so that does not matter there.
 */
export function windingNumber(point: Point, ring: readonly Point[]): number {
  const [px, py] = point;
  let winding = 0;
  const n = ring.length;
  for (let i = 0; i < n; i++) {
    const [ax, ay] = ring[i];
    const [bx, by] = ring[(i + 1) % n];
    const side = (bx - ax) * (py - ay) - (px - ax) * (by - ay);
    if (ay <= py) {
      if (by > py && side > 0) winding += 1;
    } else if (by <= py && side < 0) {
      winding -= 1;
    }
  }
  return winding;
}

export type FillRule = "nonzero" | "evenodd";

/**
 * Whether `point` is inside the ring. The default "nonzero" rule is SVG's default fill rule,
 * which is what an SVG-based rasteriser paints for a self-intersecting outline; for simple
 * polygons both rules agree.
 */
export function pointInPolygon(point: Point, ring: readonly Point[], rule: FillRule = "nonzero"): boolean {
  if (ring.length < 3) return false;
  const winding = windingNumber(point, ring);
  return rule === "nonzero" ? winding !== 0 : Math.abs(winding) % 2 === 1;
}
