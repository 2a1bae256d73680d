/**
 * Per-class thresholds, set on calibration photos the forest did not train on: for each class,
 * every threshold of THRESHOLD_STEPS is tried on the whole pipeline (proposals → shapes → greedy
 * IoU matching against the accepted regions, matching.ts) and the one with the best F1 is kept;
 * on a tie the higher one (fewer ghosts for the same hits). A class with no region on the
 * calibration photos keeps DEFAULT_THRESHOLD.
 */
import type { Shape } from "@/lib/geometry/shape";
import { addCounts, matchPhoto, rates, type MatchCounts } from "./matching";
import type { PreparedPhoto } from "./photo-cells";
import { proposeRegions, type ClassProposalSpec } from "./proposals";

export const DEFAULT_THRESHOLD = 0.5;
export const THRESHOLD_STEPS = Array.from({ length: 16 }, (_, k) => Math.round((0.15 + 0.05 * k) * 100) / 100);
/** IoU at which calibration counts a hit: the evaluation's own. */
export const CALIBRATION_IOU = 0.3;

export type CalibrationPhoto = {
  photo: PreparedPhoto;
  /** Scores per model class (0 = first defect class) per cell. */
  scores: Float32Array[];
  /** Accepted regions in working pixels. */
  truth: { classIndex: number; shape: Shape }[];
};

export type CalibrationResult = { threshold: number; regions: number; recall: number; precision: number } | null;

export function calibrateThresholds(photos: readonly CalibrationPhoto[], specs: readonly ClassProposalSpec[]): CalibrationResult[] {
  return specs.map((_, c) => {
    const regions = photos.reduce((n, p) => n + p.truth.filter((t) => t.classIndex === c).length, 0);
    if (regions === 0) return null;
    let best: { threshold: number; f1: number; recall: number; precision: number } | null = null;
    for (const threshold of THRESHOLD_STEPS) {
      const trial = specs.map((spec, k) => (k === c ? { ...spec, threshold } : spec));
      const total = new Map<string, MatchCounts>();
      for (const { photo, scores, truth } of photos) {
        const found = proposeRegions(photo.grid, scores, photo.active, trial, c).map((p) => ({ defect: String(c), shape: p.shape, score: p.score }));
        const accepted = truth.filter((t) => t.classIndex === c).map((t) => ({ defect: String(c), shape: t.shape }));
        addCounts(total, matchPhoto(photo.image, accepted, found, CALIBRATION_IOU));
      }
      const figures = rates(total.get(String(c)) ?? { accepted: regions, suggested: 0, hits: 0 });
      if (!best || figures.f1 >= best.f1) best = { threshold, ...figures };
    }
    return best && best.f1 > 0 ? { threshold: best.threshold, regions, recall: best.recall, precision: best.precision } : { threshold: DEFAULT_THRESHOLD, regions, recall: 0, precision: 0 };
  });
}
