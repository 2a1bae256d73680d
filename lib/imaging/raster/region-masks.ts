/**
 * The masks behind every area figure: the Surface, one mask per region, and the grouping of a
 * class's regions into separate defects. measureCoverage (lib/imaging/coverage.ts) and the
 * region-set comparison (lib/imaging/compare-regions.ts) both build on these, so a pixel counted
 * in one is counted the same way in the other. The pixel rules are in the file heads of
 * exact-spans.ts (surface, zones and regions by default) and sharp-spans.ts (the "sharp" option).
 * `check` is called inside the rasterising loops (a deadline check, lib/imaging/deadline.ts).
 */
import type { Shape } from "@/lib/geometry/shape";
import { shapeSpans } from "@/lib/imaging/raster/exact-spans";
import { sharpShapeSpans } from "@/lib/imaging/raster/sharp-spans";
import { overlappingGroups } from "@/lib/imaging/raster/separate";
import { fullFrameSpanSet, unionSpanSets, type SpanSet } from "@/lib/imaging/raster/spans";

export type Frame = { width: number; height: number };
/**
 * How region shapes become pixels: "exact" (default: the pixel-centre scanline rasteriser, whose
 * cost is known in advance and which checks its deadline inside its loops; lib/imaging/coverage.ts)
 * or "sharp" (librsvg + cairo tiles).
 */
export type RegionRaster = "sharp" | "exact";
const noCheck = () => {};

/** The union of the Surface's shapes, or the whole image when there is none. */
export function surfaceMask(surface: readonly Shape[], frame: Frame, check: () => void = noCheck): SpanSet {
  if (surface.length === 0) return fullFrameSpanSet(frame.width, frame.height);
  return unionSpanSets(surface.map((shape) => shapeSpans(shape, frame, check)));
}

/** One mask per shape, in order, clipped to the image (not yet to the Surface). */
export function regionMasks(shapes: Shape[], frame: Frame, mode: RegionRaster = "exact", check: () => void = noCheck): Promise<SpanSet[]> {
  if (mode === "exact") return Promise.resolve(shapes.map((shape) => shapeSpans(shape, frame, check)));
  return sharpShapeSpans(shapes, frame);
}

/**
 * Groups of masks that share at least one pixel, directly or through a chain, in order of their
 * first member; empty masks belong to no group. One row sweep, not a test of every pair
 * (raster/separate.ts says why).
 */
export { overlappingGroups };
