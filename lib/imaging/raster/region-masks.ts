/**
 * The masks behind every area figure: the Surface, one mask per region, and the grouping of a
 * class's regions into separate defects. measureCoverage (lib/imaging/coverage.ts) and the
 * region-set comparison (lib/imaging/compare-regions.ts) both build on these, so a pixel counted
 * in one is counted the same way in the other. The pixel rules are in the file heads of
 * exact-spans.ts (surface, zones, "exact" regions) and sharp-spans.ts (regions, the default).
 */
import type { Shape } from "@/lib/geometry/shape";
import { shapeSpans } from "@/lib/imaging/raster/exact-spans";
import { sharpShapeSpans } from "@/lib/imaging/raster/sharp-spans";
import { fullFrameSpanSet, isEmptySpanSet, spanSetsOverlap, unionSpanSets, type SpanSet } from "@/lib/imaging/raster/spans";

export type Frame = { width: number; height: number };
/** How region shapes become pixels: "sharp" (default, per the product design) or "exact". */
export type RegionRaster = "sharp" | "exact";

/** The union of the Surface's shapes, or the whole image when there is none. */
export function surfaceMask(surface: readonly Shape[], frame: Frame): SpanSet {
  if (surface.length === 0) return fullFrameSpanSet(frame.width, frame.height);
  return unionSpanSets(surface.map((shape) => shapeSpans(shape, frame)));
}

/** One mask per shape, in order, clipped to the image (not yet to the Surface). */
export function regionMasks(shapes: Shape[], frame: Frame, mode: RegionRaster = "sharp"): Promise<SpanSet[]> {
  if (mode === "exact") return Promise.resolve(shapes.map((shape) => shapeSpans(shape, frame)));
  return sharpShapeSpans(shapes, frame);
}

/**
 * Groups of masks that share at least one pixel, directly or through a chain (union–find), in
 * order of their first member; empty masks belong to no group. Masks that only touch (adjacent
 * pixels, no shared pixel) stay apart.
 */
export function overlappingGroups(masks: SpanSet[]): number[][] {
  const parent = masks.map((_, index) => index);
  const find = (index: number): number => {
    while (parent[index] !== index) {
      parent[index] = parent[parent[index]];
      index = parent[index];
    }
    return index;
  };
  for (let a = 0; a < masks.length; a++) {
    if (isEmptySpanSet(masks[a])) continue;
    for (let b = a + 1; b < masks.length; b++) {
      // spanSetsOverlap rejects on the bounding boxes first, so far-apart pairs cost nothing.
      if (find(a) !== find(b) && spanSetsOverlap(masks[a], masks[b])) parent[find(a)] = find(b);
    }
  }
  const groups = new Map<number, number[]>();
  masks.forEach((mask, index) => {
    if (isEmptySpanSet(mask)) return;
    const root = find(index);
    const group = groups.get(root) ?? [];
    group.push(index);
    groups.set(root, group);
  });
  return [...groups.values()];
}
