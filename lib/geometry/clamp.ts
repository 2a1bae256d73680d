/**
 * Keeping geometry inside the photo. Stored shapes live in [0, width] × [0, height] of the upright
 * original (pixel edges, so `width` itself is a valid x). Spot radii and line widths may reach
 * past the edge: the measurement clips them, and refusing a dust spot on the border would be
 * worse than painting a few pixels outside.
 */
import type { Bounds } from "./bounds";
import { MAX_LINE_WIDTH_SHARE, MAX_SPOT_RADIUS_SHARE, MIN_SIZE_CAP_PX } from "./limits";
import type { Point, Shape } from "./shape";

export type ImageSize = { width: number; height: number };

export function clamp(value: number, min: number, max: number): number {
  return Math.min(max, Math.max(min, value));
}

export function clampPoint([x, y]: Point, size: ImageSize): Point {
  return [clamp(x, 0, size.width), clamp(y, 0, size.height)];
}

/** Widest Line allowed on this photo (limits.ts says why). */
export function maxLineWidthFor(size: ImageSize): number {
  return Math.max(MIN_SIZE_CAP_PX, Math.floor(MAX_LINE_WIDTH_SHARE * Math.max(size.width, size.height)));
}

/** Largest Spot radius allowed on this photo (limits.ts says why). */
export function maxSpotRadiusFor(size: ImageSize): number {
  return Math.max(MIN_SIZE_CAP_PX, Math.floor(MAX_SPOT_RADIUS_SHARE * Math.max(size.width, size.height)));
}

/**
 * The shape with every defining point moved into the image: a rect is intersected with the image
 * (its width or height may become 0 when it lay outside; check with describeShapeProblem),
 * vertices and spot centres are clamped, and radius and width are capped (maxSpotRadiusFor, maxLineWidthFor).
 */
export function clampShapeToImage(shape: Shape, size: ImageSize): Shape {
  switch (shape.kind) {
    case "rect": {
      const minX = clamp(shape.x, 0, size.width);
      const minY = clamp(shape.y, 0, size.height);
      const maxX = clamp(shape.x + shape.width, 0, size.width);
      const maxY = clamp(shape.y + shape.height, 0, size.height);
      return { kind: "rect", x: minX, y: minY, width: Math.max(0, maxX - minX), height: Math.max(0, maxY - minY) };
    }
    case "polygon":
      return { kind: "polygon", points: shape.points.map((p) => clampPoint(p, size)) };
    case "line":
      return { kind: "line", points: shape.points.map((p) => clampPoint(p, size)), width: Math.min(shape.width, maxLineWidthFor(size)) };
    case "spot": {
      const [x, y] = clampPoint([shape.x, shape.y], size);
      return { kind: "spot", x, y, radius: Math.min(shape.radius, maxSpotRadiusFor(size)) };
    }
  }
}

/**
 * The part of a wished-for move (dx, dy) that keeps `box` inside the image, so dragging a region
 * against an edge slides it along the edge instead of pushing it out.
 */
export function clampTranslation(box: Bounds, dx: number, dy: number, size: ImageSize): { dx: number; dy: number } {
  return {
    dx: clamp(dx, -box.minX, size.width - box.maxX),
    dy: clamp(dy, -box.minY, size.height - box.maxY),
  };
}
