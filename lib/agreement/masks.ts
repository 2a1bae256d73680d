/**
 * Overlap of two masks: IoU (Jaccard) = |A∩B| / |A∪B| and Dice = 2|A∩B| / (|A| + |B|)
 * (docs/references.md, "Agreement between graders"). A mask is either a flat 0/1 array (one
 * entry per pixel, both of the same length) or a span set from the coverage rasteriser
 * (lib/imaging/raster/spans.ts; both in the same image's pixel coordinates).
 *
 * Decision, empty versus empty: IoU = Dice = 1. Two graders who both marked nothing (of a class,
 * inside the Surface) agree completely; 0 would punish that agreement and NaN would poison every
 * mean it enters. Callers that want to leave such cases out of a mean can test `union === 0`
 * through `maskOverlap`.
 */
import { countIntersection, countSpans, type SpanSet } from "@/lib/imaging/raster/spans";

export type FlatMask = ArrayLike<number>;
export type Mask = FlatMask | SpanSet;
export type MaskOverlap = { a: number; b: number; intersection: number; union: number };

const isSpanSet = (mask: Mask): mask is SpanSet => typeof mask === "object" && mask !== null && "offsets" in mask && "cols" in mask;

/** Pixel counts of both masks, their intersection and their union. */
export function maskOverlap(a: Mask, b: Mask): MaskOverlap {
  if (isSpanSet(a) !== isSpanSet(b)) throw new TypeError("Masks must be of the same kind: both flat 0/1 arrays or both span sets.");
  if (isSpanSet(a) && isSpanSet(b)) {
    const intersection = countIntersection(a, b);
    const countA = countSpans(a);
    const countB = countSpans(b);
    return { a: countA, b: countB, intersection, union: countA + countB - intersection };
  }
  const flatA = a as FlatMask;
  const flatB = b as FlatMask;
  if (flatA.length !== flatB.length) throw new RangeError(`Masks must have the same length (${flatA.length} vs ${flatB.length} pixels).`);
  let countA = 0;
  let countB = 0;
  let intersection = 0;
  for (let index = 0; index < flatA.length; index++) {
    const x = flatA[index];
    const y = flatB[index];
    if ((x !== 0 && x !== 1) || (y !== 0 && y !== 1)) {
      throw new RangeError(`Mask values must be 0 or 1; pixel ${index} has ${x !== 0 && x !== 1 ? x : y}.`);
    }
    countA += x;
    countB += y;
    intersection += x & y;
  }
  return { a: countA, b: countB, intersection, union: countA + countB - intersection };
}

/** Intersection over union; 1 for two empty masks (see the file head). */
export function iou(a: Mask, b: Mask): number {
  return iouOf(maskOverlap(a, b));
}

/** Dice coefficient; 1 for two empty masks (see the file head). */
export function dice(a: Mask, b: Mask): number {
  return diceOf(maskOverlap(a, b));
}

export const iouOf = ({ intersection, union }: MaskOverlap): number => (union === 0 ? 1 : intersection / union);
export const diceOf = ({ a, b, intersection }: MaskOverlap): number => (a + b === 0 ? 1 : (2 * intersection) / (a + b));
