/**
 * The active screen area of a screen-view photo, where pixel faults are looked for: inside the
 * photo's Surface (the panel's outline) and inside the view's zones (the display part's active
 * area, stored in 0..1 of the Surface box), an edge band in from their edges. The band is 2 % of
 * the shorter side of the area, at least 16 px: wide enough to clear a phone panel's rounded
 * corners, the lit edge's glow against the bezel and the median window's reach beyond the area
 * (our choice, c). Pure.
 */
import { boundsOfShape } from "@/lib/geometry/bounds";
import type { PolygonShape } from "@/lib/geometry/shape";
import { zonesToPixels } from "@/lib/grading/measure-photo";
import type { PixelSearchArea } from "@/lib/imaging/pixel-search-area";
import type { ZoneDefinition } from "@/lib/part-types/schemas";

export const EDGE_BAND_SHARE = 0.02;
export const MIN_EDGE_BAND_PX = 16;

export type ScreenArea = { area: PixelSearchArea; description: string } | { problem: string };

export function screenSearchArea(input: { surfaces: readonly PolygonShape[]; zones: readonly ZoneDefinition[]; size: { width: number; height: number } }): ScreenArea {
  if (input.surfaces.length === 0) {
    return { problem: "This photo has no Surface yet. Mark the panel's outline with the Surface tool (or Suggest Surface) first: pixel faults are looked for only inside it." };
  }
  const zones = zonesToPixels(
    input.zones.map((z) => ({ id: z.id, polygon: z.polygon })),
    [...input.surfaces],
    input.size,
  );
  const shapes = [...input.surfaces, ...zones.map((z) => z.shape)];
  const boxes = [input.surfaces, zones.map((z) => z.shape)]
    .filter((list) => list.length > 0)
    .map((list) => {
      const bounds = list.map((shape) => boundsOfShape(shape));
      return { minX: Math.min(...bounds.map((b) => b.minX)), minY: Math.min(...bounds.map((b) => b.minY)), maxX: Math.max(...bounds.map((b) => b.maxX)), maxY: Math.max(...bounds.map((b) => b.maxY)) };
    });
  const width = Math.min(...boxes.map((b) => b.maxX)) - Math.max(...boxes.map((b) => b.minX));
  const height = Math.min(...boxes.map((b) => b.maxY)) - Math.max(...boxes.map((b) => b.minY));
  if (!(width > 0 && height > 0) || shapes.length === 0)
    return { problem: "The view's screen zone lies outside the Surface on this photo, so there is no active area to search. Check the Surface outline." };
  const edgeBandPx = Math.max(MIN_EDGE_BAND_PX, Math.round(EDGE_BAND_SHARE * Math.min(width, height)));
  const regions = [{ polygons: input.surfaces.map((s) => s.points) }];
  if (zones.length > 0) regions.push({ polygons: zones.map((z) => z.shape.points) });
  const zoneText = input.zones.length === 0 ? "" : ` and the zone${input.zones.length === 1 ? "" : "s"} ${input.zones.map((z) => z.label).join(", ")}`;
  return { area: { regions, edgeBandPx }, description: `inside the Surface${zoneText}, ${edgeBandPx} px in from ${regions.length === 1 ? "its edge" : "their edges"}` };
}
