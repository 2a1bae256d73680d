/**
 * The size of one drawn region, for the defects export (one row per region). Pure.
 *
 * Decisions (c): these are the region's *drawn* figures, before clipping to the Surface and before
 * merging with overlapping regions — what the measurement reports per class (`class_*` columns of
 * the export) is the clipped union, which is what the rubric grades. Area: a rectangle's
 * width × height, a polygon's shoelace area (a, the surveyor's formula; a self-crossing outline
 * counts its signed parts), a spot's π r², a line's centre-line length × its width (the stroke's
 * area without its round caps). Length: a line's centre-line length, otherwise empty.
 * Millimetres divide by the photo's px/mm (area by its square) where the photo was calibrated.
 */
import { polygonArea } from "@/lib/geometry/polygon";
import { distance } from "@/lib/geometry/points";
import type { Shape } from "@/lib/geometry/shape";
import { boundsOfShape } from "@/lib/geometry/bounds";

export type RegionSize = { x: number; y: number; width: number; height: number; areaPx: number; lengthPx: number | null; areaMm2: number | null; lengthMm: number | null };

export function polylineLength(points: readonly [number, number][]): number {
  let total = 0;
  for (let i = 1; i < points.length; i++) total += distance(points[i - 1], points[i]);
  return total;
}

export function regionSize(shape: Shape, pxPerMm: number | null): RegionSize {
  const box = boundsOfShape(shape, { includeStroke: true });
  let areaPx: number;
  let lengthPx: number | null = null;
  switch (shape.kind) {
    case "rect":
      areaPx = shape.width * shape.height;
      break;
    case "polygon":
      areaPx = polygonArea(shape.points);
      break;
    case "spot":
      areaPx = Math.PI * shape.radius * shape.radius;
      break;
    case "line":
      lengthPx = polylineLength(shape.points);
      areaPx = lengthPx * shape.width;
      break;
  }
  const scale = pxPerMm !== null && pxPerMm > 0 ? pxPerMm : null;
  return {
    x: box.minX,
    y: box.minY,
    width: box.maxX - box.minX,
    height: box.maxY - box.minY,
    areaPx,
    lengthPx,
    areaMm2: scale === null ? null : areaPx / (scale * scale),
    lengthMm: scale === null || lengthPx === null ? null : lengthPx / scale,
  };
}
