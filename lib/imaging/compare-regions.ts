/**
 * compareRegionSets — how far two people's regions on the same photo agree, per defect class.
 * Calibration scores a grader's regions (one side) against the key (the other); Recheck compares
 * the first grader's regions with the auditor's blind ones. No I/O; with `regionRaster: "sharp"`
 * it renders through sharp.
 *
 * Decisions:
 * - Masks come from measureCoverage's own rasterisers (raster/region-masks.ts), every region
 *   clipped to the Surface (exact rasteriser; the whole image when absent). Regions default to the
 *   exact pixel-centre rasteriser, measureCoverage's `regionRaster: "exact"`: it is about five
 *   times faster here than sharp's tiles (bench/compare-regions.ts; 20 items on 12 MP photos must
 *   score well under 2 s) and differs from them only by cairo's rounding (well under 0.1 % of the
 *   covered pixels, tests/unit/imaging/raster/spans.test.ts), which does not matter to an
 *   overlap score. With the same `regionRaster`, a class's `aPx` equals the `px` measureCoverage
 *   reports for the same regions (tested for both).
 * - Per class named by a region on either side: pixels of each side's union (aPx, bPx), of their
 *   intersection and union, of "only A" and "only B", and IoU and Dice of the two unions
 *   (lib/agreement/masks.ts; both empty inside the Surface → 1, both agree nothing is there).
 * - Defects: a side's regions of one class that share a pixel (directly or through a chain) are
 *   one defect, as measureCoverage counts them; regions with no pixel inside the Surface are none.
 * - Matching rule: a defect of A and a defect of B of the same class match when their overlap
 *   covers at least half of the smaller one, |a ∩ b| >= ½ · min(|a|, |b|). So a box drawn around a
 *   scratch matches it (the whole scratch lies inside), a scratch marked as three short strokes
 *   matches the one long stroke, and a spot that only grazes another (less than half of the
 *   smaller inside) does not. A defect is "matched" when it matches at least one defect of the
 *   other side, else it is "only A" (missed by B) or "only B" (extra in B).
 * - With `keepAreas`, each class also carries its areas as span sets: only A, only B and both
 *   (what a grader missed, what they added, where they agree), for the after-submit view and the
 *   adjudication overlay. Off by default: the masks can be large and most callers need counts.
 */
import { z } from "zod";
import type { Shape } from "@/lib/geometry/shape";
import { diceOf, iouOf, maskOverlap } from "@/lib/agreement/masks";
import { checkPhotoSize, parseOrRefuse, photoSide, regionListSchema, surfaceSchema } from "@/lib/imaging/raster/coverage-input";
import { overlappingGroups, regionMasks, surfaceMask, type RegionRaster } from "@/lib/imaging/raster/region-masks";
import { subtractSpanSets } from "@/lib/imaging/raster/span-areas";
import { countIntersection, countSpans, intersectSpanSets, unionSpanSets, type SpanSet } from "@/lib/imaging/raster/spans";

/** Share of the smaller defect that must lie inside the other for the two to match. */
export const DEFECT_MATCH_OVERLAP = 0.5;

export type ComparedRegion = { id: string; defect: string; shape: Shape };
export type RegionSetComparisonInput = {
  width: number;
  height: number;
  a: ComparedRegion[];
  b: ComparedRegion[];
  /** The part's own outline(s); the whole image when absent or empty. */
  surface?: Shape[];
};
export type DefectGroup = { regionIds: string[]; px: number; matched: boolean };
export type ClassComparison = {
  aPx: number;
  bPx: number;
  intersectionPx: number;
  unionPx: number;
  onlyAPx: number;
  onlyBPx: number;
  iou: number;
  dice: number;
  /** Separate defects of each side, in the order of their first region. */
  aDefects: DefectGroup[];
  bDefects: DefectGroup[];
  matchedA: number;
  matchedB: number;
  onlyA: number;
  onlyB: number;
  /** Only with `keepAreas` (see the file head). */
  areas?: ClassAreas;
};
export type ClassAreas = { onlyA: SpanSet; onlyB: SpanSet; both: SpanSet };
export type CompareOptions = { regionRaster?: RegionRaster; keepAreas?: boolean };
export type RegionSetComparison = { surfacePx: number; byDefect: Record<string, ClassComparison> };

const comparisonSchema = z.object({ width: photoSide, height: photoSide, a: regionListSchema, b: regionListSchema, surface: surfaceSchema.optional() }).superRefine(checkPhotoSize);

type Group = { regionIds: string[]; mask: SpanSet; px: number; matched: boolean };

export async function compareRegionSets(input: RegionSetComparisonInput, options: CompareOptions = {}): Promise<RegionSetComparison> {
  const { width, height, a, b, surface = [] } = parseOrRefuse(comparisonSchema, input, "region comparison input");
  const frame = { width, height };
  const surfaceSpans = surfaceMask(surface, frame);
  // Both sides in one call (with sharp: one render per atlas instead of two).
  const rawMasks = await regionMasks(
    [...a, ...b].map((region) => region.shape),
    frame,
    options.regionRaster ?? "exact",
  );
  const clipped = rawMasks.map((mask) => intersectSpanSets(mask, surfaceSpans));
  const sideA = { regions: a, masks: clipped.slice(0, a.length) };
  const sideB = { regions: b, masks: clipped.slice(a.length) };

  const defects = [...new Set([...a, ...b].map((region) => region.defect))];
  // Object.fromEntries defines own keys, so a class named "__proto__" stays plain data.
  return {
    surfacePx: countSpans(surfaceSpans),
    byDefect: Object.fromEntries(defects.map((defect) => [defect, compareClass(defectGroups(sideA, defect), defectGroups(sideB, defect), options.keepAreas ?? false)])),
  };
}

/** The separate defects of one class on one side. */
function defectGroups(sideRegions: { regions: ComparedRegion[]; masks: SpanSet[] }, defect: string): Group[] {
  const members = sideRegions.regions.flatMap((region, index) => (region.defect === defect ? [index] : []));
  return overlappingGroups(members.map((index) => sideRegions.masks[index])).map((group) => {
    const mask = unionSpanSets(group.map((position) => sideRegions.masks[members[position]]));
    return { regionIds: group.map((position) => sideRegions.regions[members[position]].id), mask, px: countSpans(mask), matched: false };
  });
}

function compareClass(groupsA: Group[], groupsB: Group[], keepAreas: boolean): ClassComparison {
  for (const groupA of groupsA) {
    for (const groupB of groupsB) {
      const shared = countIntersection(groupA.mask, groupB.mask);
      if (shared > 0 && shared >= DEFECT_MATCH_OVERLAP * Math.min(groupA.px, groupB.px)) {
        groupA.matched = true;
        groupB.matched = true;
      }
    }
  }
  const unionA = unionSpanSets(groupsA.map((group) => group.mask));
  const unionB = unionSpanSets(groupsB.map((group) => group.mask));
  const overlap = maskOverlap(unionA, unionB);
  const matchedA = groupsA.filter((group) => group.matched).length;
  const matchedB = groupsB.filter((group) => group.matched).length;
  const publicGroup = ({ regionIds, px, matched }: Group): DefectGroup => ({ regionIds, px, matched });
  return {
    aPx: overlap.a,
    bPx: overlap.b,
    intersectionPx: overlap.intersection,
    unionPx: overlap.union,
    onlyAPx: overlap.a - overlap.intersection,
    onlyBPx: overlap.b - overlap.intersection,
    iou: iouOf(overlap),
    dice: diceOf(overlap),
    aDefects: groupsA.map(publicGroup),
    bDefects: groupsB.map(publicGroup),
    matchedA,
    matchedB,
    onlyA: groupsA.length - matchedA,
    onlyB: groupsB.length - matchedB,
    ...(keepAreas ? { areas: { onlyA: subtractSpanSets(unionA, unionB), onlyB: subtractSpanSets(unionB, unionA), both: intersectSpanSets(unionA, unionB) } } : {}),
  };
}
