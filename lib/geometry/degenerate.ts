/**
 * Checks that tell a real mark from a degenerate one. `describeShapeProblem` is the single source
 * of these rules: the editor uses it to refuse bad edits and the save validation to reject bad
 * input, so both say the same thing in the same words.
 */
import type { ImageSize } from "./clamp";
import { maxLineWidthFor, maxSpotRadiusFor } from "./clamp";
import { COLLINEAR_TOLERANCE, EDGE_TOLERANCE, MAX_POINTS_PER_SHAPE, MIN_POLYGON_AREA } from "./limits";
import { dedupeConsecutive, distance, distinctPointsUpTo, pointsEqual } from "./points";
import { polygonArea } from "./polygon";
import type { Point, Shape } from "./shape";

/**
 * Whether every point lies on one straight line (within `tolerance` px). The reference line runs
 * from the first point to the point farthest from it, so the test is O(n); each point's distance
 * to it is |cross| / |base| (the parallelogram height).
 */
export function areCollinear(points: readonly Point[], tolerance = COLLINEAR_TOLERANCE): boolean {
  if (points.length < 3) return true;
  const origin = points[0];
  let far = origin;
  let farDistance = 0;
  for (const p of points) {
    const d = distance(origin, p);
    if (d > farDistance) {
      far = p;
      farDistance = d;
    }
  }
  if (farDistance === 0) return true;
  const bx = far[0] - origin[0];
  const by = far[1] - origin[1];
  for (const p of points) {
    const height = Math.abs(bx * (p[1] - origin[1]) - by * (p[0] - origin[0])) / farDistance;
    if (height > tolerance) return false;
  }
  return true;
}

/**
 * A line that only goes back and forth between two points, like a → b → a: it paints the same
 * stroke as a → b but would count its length two or more times.
 */
export function isSelfRetracingLine(points: readonly Point[]): boolean {
  const path = dedupeConsecutive(points);
  return path.length > 2 && distinctPointsUpTo(path, 3) === 2;
}

/** Whether the line ends on its start point. */
export function isClosedLine(points: readonly Point[]): boolean {
  return points.length > 1 && pointsEqual(points[0], points[points.length - 1]);
}

const POLYGON_TOO_FEW = "a polygon needs at least 3 points that are not on one line.";

/**
 * What is wrong with a shape's own geometry, as a sentence a person can act on, or null when it is
 * a usable mark. Finite numbers are assumed (the schema checks those first); image bounds are
 * checked separately by describeOutsideImage.
 */
export function describeShapeProblem(shape: Shape): string | null {
  switch (shape.kind) {
    case "rect":
      return shape.width > 0 && shape.height > 0 ? null : "a box needs a width and a height above 0.";
    case "polygon": {
      if (shape.points.length > MAX_POINTS_PER_SHAPE) return `a polygon may have at most ${MAX_POINTS_PER_SHAPE} points.`;
      if (distinctPointsUpTo(shape.points, 3) < 3 || areCollinear(shape.points)) return POLYGON_TOO_FEW;
      if (polygonArea(shape.points) < MIN_POLYGON_AREA) return "the polygon encloses no area (its edges cancel out; does it cross itself?).";
      return null;
    }
    case "line": {
      if (shape.points.length > MAX_POINTS_PER_SHAPE) return `a line may have at most ${MAX_POINTS_PER_SHAPE} points.`;
      if (!(shape.width > 0)) return "a line needs a width above 0.";
      if (distinctPointsUpTo(shape.points, 2) < 2) return "a line needs at least 2 different points.";
      if (isSelfRetracingLine(shape.points)) {
        return "the line only runs back and forth between 2 points (it closes on itself); draw it once from one end to the other.";
      }
      return null;
    }
    case "spot":
      return shape.radius > 0 ? null : "a spot needs a radius above 0.";
  }
}

function pointOutside([x, y]: Point, size: ImageSize): boolean {
  const e = EDGE_TOLERANCE;
  return x < -e || y < -e || x > size.width + e || y > size.height + e;
}

/** Whether a point lies in [0, width] × [0, height] (up to EDGE_TOLERANCE). */
export function pointInsideImage(point: Point, size: ImageSize): boolean {
  return !pointOutside(point, size);
}

/**
 * Why a shape does not fit the photo, or null. Defining points (box corners, vertices, spot
 * centre) must lie in [0, width] × [0, height] (up to the round-off EDGE_TOLERANCE); a spot
 * radius or line width may reach past the edge but stays within its cap (clamp.ts, limits.ts).
 */
export function describeOutsideImage(shape: Shape, size: ImageSize): string | null {
  const where = `outside the ${size.width} × ${size.height} px photo`;
  switch (shape.kind) {
    case "rect": {
      const corners: Point[] = [
        [shape.x, shape.y],
        [shape.x + shape.width, shape.y + shape.height],
      ];
      return corners.some((p) => pointOutside(p, size)) ? `the box reaches ${where}.` : null;
    }
    case "polygon":
    case "line": {
      const index = shape.points.findIndex((p) => pointOutside(p, size));
      if (index >= 0) {
        const [x, y] = shape.points[index];
        return `point ${index + 1} (${x}, ${y}) lies ${where}.`;
      }
      if (shape.kind === "line" && shape.width > maxLineWidthFor(size)) {
        return `the line is ${shape.width} px wide; at most ${maxLineWidthFor(size)} px (5 % of the photo's long edge) is allowed — mark a wider defect with Outline.`;
      }
      return null;
    }
    case "spot": {
      if (pointOutside([shape.x, shape.y], size)) return `the spot's centre (${shape.x}, ${shape.y}) lies ${where}.`;
      if (shape.radius > maxSpotRadiusFor(size)) {
        return `the spot's radius is ${shape.radius} px; at most ${maxSpotRadiusFor(size)} px (10 % of the photo's long edge) is allowed — mark a larger defect with Outline.`;
      }
      return null;
    }
  }
}
