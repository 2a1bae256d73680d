/**
 * measureCoverage — how much of a part's visible surface (and of each inspection zone) each
 * defect class covers, and how many separate defects there are. Contract: docs/contracts.md,
 * "Computation contracts".
 *
 * How it measures (decisions):
 * - Region shapes are rasterised by the exact pixel-centre scanline rasteriser
 *   (raster/exact-spans.ts) by default. It is the faster path on ordinary input (`npm run bench`:
 *   50 forty-vertex polygons on a 12 MP photo in a few ms, against tens of ms through sharp), its
 *   cost is known before it starts (raster/cost.ts) and it checks its deadline inside its loops,
 *   which a native call cannot. `{ regionRaster: "sharp" }` rasterises with sharp (librsvg +
 *   cairo) instead, only inside each shape's own small box (raster/sharp-spans.ts); the tests
 *   keep both paths within cairo's rounding of each other.
 * - Cost bounds (raster/coverage-input.ts): Line widths and Spot radii within their caps for the
 *   photo, and at most MAX_RASTER_ROWS_PER_PHOTO shape rows; `deadline` (epoch ms) stops the work
 *   with DeadlineExceeded from inside the loops.
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
import { assertBeforeDeadline, deadlineCheck } from "@/lib/imaging/deadline";
import { overlappingGroups, regionMasks, surfaceMask, type Frame, type RegionRaster } from "@/lib/imaging/raster/region-masks";
import { countIntersection, countSpans, intersectSpanSets, unionSpanSets } from "@/lib/imaging/raster/spans";

export type CoverageOptions = {
  /** How region shapes become pixels: "exact" (default, see the decisions above) or "sharp". */
  regionRaster?: RegionRaster;
  /** Epoch ms: past it, measuring stops with DeadlineExceeded (checked inside the loops). */
  deadline?: number;
};

export async function measureCoverage(input: CoverageInput, options: CoverageOptions = {}): Promise<CoverageResult> {
  const { width, height, regions, surface = [], zones = [] } = parseCoverageInput(input);
  const frame: Frame = { width, height };
  const check = deadlineCheck(options.deadline);

  const surfaceSpans = surfaceMask(surface, frame, check);
  const surfacePx = countSpans(surfaceSpans);
  const zoneMeasures = zones.map((zone) => {
    const spans = intersectSpanSets(shapeSpans(zone.shape, frame, check), surfaceSpans);
    return { id: zone.id, spans, zonePx: countSpans(spans) };
  });

  const rawRegionSpans = await regionMasks(
    regions.map((region) => region.shape),
    frame,
    options.regionRaster ?? "exact",
    check,
  );
  assertBeforeDeadline(options.deadline);
  const clippedRegionSpans = rawRegionSpans.map((spans) => {
    check();
    return intersectSpanSets(spans, surfaceSpans);
  });

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
    byDefect.push([defect, { px, share: ratio(px, surfacePx), count: overlappingGroups(memberSpans, check).length }]);
    assertBeforeDeadline(options.deadline);
    zoneMeasures.forEach((zone, zoneIndex) => {
      const zonePxOfClass = zone.zonePx === 0 ? 0 : countIntersection(classUnion, zone.spans);
      zoneRows[zoneIndex].push([defect, { px: zonePxOfClass, share: ratio(zonePxOfClass, zone.zonePx) }]);
    });
  }
  return {
    surfacePx,
    byDefect: Object.fromEntries(byDefect),
    byZone: Object.fromEntries(zoneMeasures.map((zone, zoneIndex) => [zone.id, { zonePx: zone.zonePx, byDefect: Object.fromEntries(zoneRows[zoneIndex]) }])),
  };
}

const ratio = (part: number, whole: number) => (whole === 0 ? 0 : part / whole);
