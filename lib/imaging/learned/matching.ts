/**
 * Suggestions scored against accepted regions on one photo, the way the held-out evaluation and
 * the threshold calibration count them. Pure.
 *
 * - IoU of two regions = |A ∩ B| / |A ∪ B| on pixel masks from the project's exact rasteriser
 *   (raster/exact-spans.ts, the pixel-centre rule measureCoverage uses), clipped to the photo.
 * - Matching is one-to-one and greedy, suggestions taken best score first: a suggestion is a hit
 *   when its IoU with a still unmatched accepted region of the same class is >= the threshold
 *   (it takes the one it overlaps most). A second suggestion on an already matched defect is a
 *   miss, so duplicates cost precision. This is the detection-matching rule of the PASCAL VOC
 *   challenge (Everingham et al., 2010, section 4.4; from memory), at IoU 0.3 instead of 0.5.
 */
import type { Shape } from "@/lib/geometry/shape";
import { shapeSpans } from "@/lib/imaging/raster/exact-spans";
import { countIntersection, countSpans, type SpanSet } from "@/lib/imaging/raster/spans";

export type Frame = { width: number; height: number };
export type LabelledRegion = { defect: string; shape: Shape };
export type ScoredRegion = LabelledRegion & { score: number };

/** Per class on one photo (or summed over photos). */
export type MatchCounts = { accepted: number; suggested: number; hits: number };

type Mask = { spans: SpanSet; px: number };

function mask(shape: Shape, frame: Frame): Mask {
  const spans = shapeSpans(shape, frame);
  return { spans, px: countSpans(spans) };
}

function maskIou(a: Mask, b: Mask): number {
  const shared = countIntersection(a.spans, b.spans);
  const union = a.px + b.px - shared;
  return union > 0 ? shared / union : 0;
}

/** IoU of two shapes on the pixel grid of `frame` (0 when both are empty). */
export function regionIou(a: Shape, b: Shape, frame: Frame): number {
  return maskIou(mask(a, frame), mask(b, frame));
}

/** Greedy one-to-one matching on one photo; counts per class named by either side. */
export function matchPhoto(frame: Frame, accepted: readonly LabelledRegion[], suggested: readonly ScoredRegion[], iouThreshold: number): Map<string, MatchCounts> {
  const counts = new Map<string, MatchCounts>();
  const countsOf = (defect: string) => {
    let entry = counts.get(defect);
    if (!entry) counts.set(defect, (entry = { accepted: 0, suggested: 0, hits: 0 }));
    return entry;
  };
  const truth = accepted.map((region) => ({ defect: region.defect, mask: mask(region.shape, frame), taken: false }));
  for (const region of truth) countsOf(region.defect).accepted++;
  const order = suggested.map((_, index) => index).sort((a, b) => suggested[b].score - suggested[a].score);
  for (const index of order) {
    const suggestion = suggested[index];
    const entry = countsOf(suggestion.defect);
    entry.suggested++;
    const candidates = truth.filter((region) => !region.taken && region.defect === suggestion.defect);
    if (candidates.length === 0) continue;
    const own = mask(suggestion.shape, frame);
    let best: (typeof truth)[number] | null = null;
    let bestIou = iouThreshold;
    for (const region of candidates) {
      const iou = maskIou(own, region.mask);
      if (iou >= bestIou) [best, bestIou] = [region, iou];
    }
    if (best) {
      best.taken = true;
      entry.hits++;
    }
  }
  return counts;
}

export function addCounts(into: Map<string, MatchCounts>, from: Map<string, MatchCounts>): void {
  for (const [defect, c] of from) {
    const entry = into.get(defect) ?? { accepted: 0, suggested: 0, hits: 0 };
    into.set(defect, { accepted: entry.accepted + c.accepted, suggested: entry.suggested + c.suggested, hits: entry.hits + c.hits });
  }
}

/** recall = hits / accepted, precision = hits / suggested (0 when the denominator is 0), F1 their harmonic mean. */
export function rates({ accepted, suggested, hits }: MatchCounts): { recall: number; precision: number; f1: number } {
  const recall = accepted > 0 ? hits / accepted : 0;
  const precision = suggested > 0 ? hits / suggested : 0;
  const f1 = recall + precision > 0 ? (2 * recall * precision) / (recall + precision) : 0;
  return { recall, precision, f1 };
}
