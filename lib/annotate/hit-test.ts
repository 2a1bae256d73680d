/**
 * What is under the pointer: regions, the selected region's handles and its edges. Tolerances
 * come in as **image** pixels (callers convert from stage pixels with the viewport).
 */
import { closestPointOnPolyline, distanceToSegment } from "@/lib/geometry/distance";
import { distanceToShape } from "@/lib/geometry/hit";
import { polygonArea } from "@/lib/geometry/polygon";
import { distance, polylineLength } from "@/lib/geometry/points";
import type { Point } from "@/lib/geometry/shape";
import type { AnnotationState, Handle, RectHandle, Region, RegionId } from "./types";

export function isRegionVisible(state: AnnotationState, region: Region): boolean {
  return region.role !== "defect" || !state.hiddenDefects.includes(region.defect);
}

export function distanceToRegion(region: Region, p: Point): number {
  if (region.role === "ruler") return distanceToSegment(p, region.ruler.a, region.ruler.b);
  return distanceToShape(region.shape, p);
}

/** Painted area, used to prefer the smaller of two overlapping hits. */
function paintedArea(region: Region): number {
  if (region.role === "ruler") return 0;
  const shape = region.shape;
  switch (shape.kind) {
    case "rect":
      return shape.width * shape.height;
    case "polygon":
      return polygonArea(shape.points);
    case "line":
      return polylineLength(shape.points) * shape.width;
    case "spot":
      return Math.PI * shape.radius * shape.radius;
  }
}

const ROLE_PRIORITY = { ruler: 0, defect: 1, surface: 2 } as const;

/**
 * The visible region under `p`, or null. Rulers win over defects and defects over surfaces (the
 * surface covers the whole part and would otherwise swallow every click); among hits of the same
 * role the smallest painted area wins, so a dust spot inside a large box stays selectable; ties
 * go to the one drawn last (on top).
 */
export function hitTestRegions(state: AnnotationState, p: Point, tolerance: number): RegionId | null {
  let best: { id: RegionId; priority: number; area: number } | null = null;
  for (const region of state.regions) {
    if (!isRegionVisible(state, region) || distanceToRegion(region, p) > tolerance) continue;
    const candidate = { id: region.id, priority: ROLE_PRIORITY[region.role], area: paintedArea(region) };
    if (!best || candidate.priority < best.priority || (candidate.priority === best.priority && candidate.area <= best.area)) {
      best = candidate;
    }
  }
  return best?.id ?? null;
}

const RECT_HANDLES: readonly RectHandle[] = ["nw", "n", "ne", "e", "se", "s", "sw", "w"];

/** The grips of a region and where they sit (image px): for drawing them and for hit-testing. */
export function handlesOf(region: Region): { handle: Handle; point: Point }[] {
  if (region.role === "ruler") {
    return [
      { handle: { kind: "ruler-end", end: "a" }, point: region.ruler.a },
      { handle: { kind: "ruler-end", end: "b" }, point: region.ruler.b },
    ];
  }
  const shape = region.shape;
  switch (shape.kind) {
    case "rect": {
      const { x, y, width, height } = shape;
      const at: Record<RectHandle, Point> = {
        nw: [x, y],
        n: [x + width / 2, y],
        ne: [x + width, y],
        e: [x + width, y + height / 2],
        se: [x + width, y + height],
        s: [x + width / 2, y + height],
        sw: [x, y + height],
        w: [x, y + height / 2],
      };
      return RECT_HANDLES.map((corner) => ({ handle: { kind: "rect", corner }, point: at[corner] }));
    }
    case "polygon":
    case "line":
      return shape.points.map((point, index) => ({ handle: { kind: "vertex", index }, point }));
    case "spot":
      return [{ handle: { kind: "radius" }, point: [shape.x + shape.radius, shape.y] }];
  }
}

/** The nearest handle of `region` within `tolerance` of `p`, or null. */
export function hitTestHandle(region: Region, p: Point, tolerance: number): Handle | null {
  let best: { handle: Handle; distance: number } | null = null;
  for (const { handle, point } of handlesOf(region)) {
    const d = distance(point, p);
    if (d <= tolerance && (!best || d < best.distance)) best = { handle, distance: d };
  }
  return best?.handle ?? null;
}

/** The edge of a polygon or line near `p` (for inserting a vertex there), or null. */
export function hitTestEdge(region: Region, p: Point, tolerance: number): { segmentIndex: number; point: Point } | null {
  if (region.role === "ruler" || (region.shape.kind !== "polygon" && region.shape.kind !== "line")) return null;
  const closed = region.shape.kind === "polygon";
  const hit = closestPointOnPolyline(p, region.shape.points, closed);
  return hit.distance <= tolerance ? { segmentIndex: hit.segmentIndex, point: hit.point } : null;
}
