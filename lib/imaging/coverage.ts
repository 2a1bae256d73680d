/**
 * measureCoverage — how much of a part's visible surface (and of each inspection zone) each
 * defect class covers, and how many separate defects there are. Contract: docs/contracts.md,
 * "Computation contracts".
 *
 * How it measures (decisions):
 * - Region shapes are rasterised with sharp, only inside each shape's own small box (see
 *   raster/sharp-spans.ts for the tiling and cairo's pixel rule). `{ regionRaster: "exact" }`
 *   uses the exact pixel-centre rasteriser instead (raster/exact-spans.ts) — same results within
 *   cairo's rounding, no native call.
 * - The surface and the zones are large, so they are never drawn as bitmaps: the exact scanline
 *   rasteriser turns them into run-length rows (cost ~ outline length), which gives surfacePx and
 *   zonePx exactly and lets every region be clipped row by row. Pixel rule: a pixel counts when
 *   its centre is inside (half-open ties: left/top edges in, right/bottom out; nonzero winding).
 * - Lines: polyline ⊕ disc of diameter `width` — round joins and round caps. Spots are discs.
 * - Everything is clipped to the image; the surface is the union of its shapes (whole image when
 *   absent or empty); a zone is clipped to the surface.
 * - `px` of a class is the pixel count of the union of its regions ∩ surface, so overlaps never
 *   count twice. `share = px / surfacePx` (per zone `/ zonePx`), 0 when the denominator is 0.
 * - `count`: regions of one class are merged when their masks, clipped to the surface, share at
 *   least one pixel (union–find, so chains merge too); regions with no pixel inside the surface
 *   are not counted. Regions that only touch (adjacent pixels, no shared pixel) stay separate.
 * - Every defect class named by a region appears in `byDefect` and in each zone's `byDefect`,
 *   with zeros when nothing of it lies inside.
 */
import type { CoverageInput, CoverageResult } from "@/lib/measure/types";
import { parseCoverageInput } from "@/lib/imaging/raster/coverage-input";
import { shapeSpans } from "@/lib/imaging/raster/exact-spans";
import { overlappingGroups, regionMasks, surfaceMask, type Frame, type RegionRaster } from "@/lib/imaging/raster/region-masks";
import { countIntersection, countSpans, intersectSpanSets, unionSpanSets } from "@/lib/imaging/raster/spans";

export type CoverageOptions = {
  /** How region shapes become pixels: "sharp" (default, per the product design) or "exact". */
  regionRaster?: RegionRaster;
};

export async function measureCoverage(input: CoverageInput, options: CoverageOptions = {}): Promise<CoverageResult> {
  const { width, height, regions, surface = [], zones = [] } = parseCoverageInput(input);
  const frame: Frame = { width, height };

  const surfaceSpans = surfaceMask(surface, frame);
  const surfacePx = countSpans(surfaceSpans);
  const zoneMeasures = zones.map((zone) => {
    const spans = intersectSpanSets(shapeSpans(zone.shape, frame), surfaceSpans);
    return { id: zone.id, spans, zonePx: countSpans(spans) };
  });

  const rawRegionSpans = await regionMasks(
    regions.map((region) => region.shape),
    frame,
    options.regionRaster ?? "sharp",
  );
  const clippedRegionSpans = rawRegionSpans.map((spans) => intersectSpanSets(spans, surfaceSpans));

  const membersByDefect = new Map<string, number[]>();
  regions.forEach((region, index) => {
    const members = membersByDefect.get(region.defect) ?? [];
    members.push(index);
    membersByDefect.set(region.defect, members);
  });

  // Object.fromEntries defines own keys, so ids such as "__proto__" stay plain data.
  const byDefect: [string, CoverageResult["byDefect"][string]][] = [];
  const zoneRows = zoneMeasures.map(() => [] as [string, { px: number; share: number }][]);
  for (const [defect, members] of membersByDefect) {
    const memberSpans = members.map((index) => clippedRegionSpans[index]);
    const classUnion = unionSpanSets(memberSpans);
    const px = countSpans(classUnion);
    byDefect.push([defect, { px, share: ratio(px, surfacePx), count: overlappingGroups(memberSpans).length }]);
    zoneMeasures.forEach((zone, zoneIndex) => {
      const zonePxOfClass = zone.zonePx === 0 ? 0 : countIntersection(classUnion, zone.spans);
      zoneRows[zoneIndex].push([defect, { px: zonePxOfClass, share: ratio(zonePxOfClass, zone.zonePx) }]);
    });
  }
  return {
    surfacePx,
    byDefect: Object.fromEntries(byDefect),
    byZone: Object.fromEntries(
      zoneMeasures.map((zone, zoneIndex) => [zone.id, { zonePx: zone.zonePx, byDefect: Object.fromEntries(zoneRows[zoneIndex]) }]),
    ),
  };
}

const ratio = (part: number, whole: number) => (whole === 0 ? 0 : part / whole);
