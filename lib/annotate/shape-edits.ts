/**
 * Edits of one region's geometry, pure and unaware of history. Points handed in are expected to be
 * inside the image already (the tools clamp pointer positions); results that would be degenerate
 * are returned as null so the caller can refuse the edit.
 */
import { boundsOfPoints, boundsOfShape, type Bounds } from "@/lib/geometry/bounds";
import { clamp, clampPoint, clampShapeToImage, clampTranslation, maxLineWidthFor, maxSpotRadiusFor, type ImageSize } from "@/lib/geometry/clamp";
import { describeOutsideImage, describeShapeProblem, pointInsideImage } from "@/lib/geometry/degenerate";
import { checkRulerLength } from "@/lib/geometry/ruler";
import { translatePoint, translateShape } from "@/lib/geometry/transform";
import type { Point, RectShape, Shape } from "@/lib/geometry/shape";
import { MIN_SPOT_RADIUS } from "./constants";
import type { RectHandle, Region } from "./types";

export function regionBounds(region: Region): Bounds {
  return region.role === "ruler" ? boundsOfPoints([region.ruler.a, region.ruler.b]) : boundsOfShape(region.shape);
}

/** Why a region cannot stand as it is (geometry or image bounds), or null. */
export function regionProblem(region: Region, image: ImageSize): string | null {
  if (region.role === "ruler") {
    const { a, b, lengthMm } = region.ruler;
    if (a[0] === b[0] && a[1] === b[1]) return "a ruler needs two different end points.";
    const length = checkRulerLength(lengthMm);
    if (!length.ok) return length.message;
    return pointInsideImage(a, image) && pointInsideImage(b, image) ? null : "the ruler reaches outside the photo.";
  }
  return describeShapeProblem(region.shape) ?? describeOutsideImage(region.shape, image);
}

/**
 * Moves a region by (dx, dy), cut short so it stays inside the image. The result is clamped once
 * more because x + dx can land one ulp past the edge even when dx was cut exactly.
 */
export function translateRegion(region: Region, dx: number, dy: number, image: ImageSize): Region {
  const move = clampTranslation(regionBounds(region), dx, dy, image);
  // Pushing against the edge moves nothing and must not cost an undo step.
  if (move.dx === 0 && move.dy === 0) return region;
  if (region.role === "ruler") {
    const { a, b, lengthMm } = region.ruler;
    const moved = (p: [number, number]) => clampPoint(translatePoint(p, move.dx, move.dy), image);
    return { ...region, ruler: { a: moved(a), b: moved(b), lengthMm } };
  }
  if (region.role === "surface") {
    const points = region.shape.points.map((p) => clampPoint(translatePoint(p, move.dx, move.dy), image));
    return { ...region, shape: { kind: "polygon", points } };
  }
  return { ...region, shape: clampShapeToImage(translateShape(region.shape, move.dx, move.dy), image) };
}

/**
 * The rect with the edges named by `handle` moved to `to` (e.g. "ne" moves the top and right
 * edges). Dragging past the opposite edge flips the rect instead of giving it a negative size;
 * it never gets thinner than `minSize` and stays inside the image.
 */
export function resizeRect(rect: RectShape, handle: RectHandle, to: Point, minSize: number, image: ImageSize): RectShape {
  let left = rect.x;
  let top = rect.y;
  let right = rect.x + rect.width;
  let bottom = rect.y + rect.height;
  if (handle.includes("w")) left = to[0];
  if (handle.includes("e")) right = to[0];
  if (handle.includes("n")) top = to[1];
  if (handle.includes("s")) bottom = to[1];
  const [x, width] = span(Math.min(left, right), Math.abs(right - left), minSize, image.width);
  const [y, height] = span(Math.min(top, bottom), Math.abs(bottom - top), minSize, image.height);
  return { kind: "rect", x, y, width, height };
}

function span(start: number, length: number, minLength: number, limit: number): [number, number] {
  const size = Math.min(limit, Math.max(length, minLength));
  return [clamp(start, 0, limit - size), size];
}

export function withSpotRadius(shape: Shape, radius: number, image: ImageSize): Shape {
  if (shape.kind !== "spot") return shape;
  return { ...shape, radius: clamp(radius, MIN_SPOT_RADIUS, maxSpotRadiusFor(image)) };
}

export function withLineWidth(shape: Shape, width: number, image: ImageSize): Shape {
  if (shape.kind !== "line") return shape;
  return { ...shape, width: clamp(width, 1e-3, maxLineWidthFor(image)) };
}

/** Vertex edits apply to polygons (at least 3 vertices) and lines (at least 2). */
function minVertices(shape: Shape): number {
  return shape.kind === "polygon" ? 3 : 2;
}

export function moveVertex(shape: Shape, index: number, to: Point): Shape | null {
  if ((shape.kind !== "polygon" && shape.kind !== "line") || index < 0 || index >= shape.points.length) return null;
  const points = shape.points.map((p, i) => (i === index ? to : p));
  return { ...shape, points };
}

/**
 * Inserts `at` into segment `segmentIndex` (the segment from vertex i to i + 1; for a polygon,
 * the last index is the closing segment back to vertex 0).
 */
export function insertVertex(shape: Shape, segmentIndex: number, at: Point): Shape | null {
  if (shape.kind !== "polygon" && shape.kind !== "line") return null;
  const segments = shape.kind === "polygon" ? shape.points.length : shape.points.length - 1;
  if (segmentIndex < 0 || segmentIndex >= segments) return null;
  const points = [...shape.points.slice(0, segmentIndex + 1), at, ...shape.points.slice(segmentIndex + 1)];
  return { ...shape, points };
}

/** Removes a vertex unless that would leave too few, or a degenerate shape (then null). */
export function deleteVertex(shape: Shape, index: number): Shape | null {
  if ((shape.kind !== "polygon" && shape.kind !== "line") || index < 0 || index >= shape.points.length) return null;
  if (shape.points.length <= minVertices(shape)) return null;
  const next = { ...shape, points: shape.points.filter((_, i) => i !== index) };
  return describeShapeProblem(next) ? null : next;
}
