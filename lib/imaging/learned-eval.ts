/**
 * Held-out evaluation of learned suggestions, and the rules the training job applies with it.
 * Pure (the model is run through suggestRegions on buffers the caller loaded).
 *
 * - Split by photo: a photo is a test photo when the hash of its key (FNV-1a, 32 bit, then
 *   murmur3's finaliser) falls in the
 *   lowest `testShare` of the range. The same photo therefore lands on the same side in every
 *   training run, so no model is ever trained on a photo it is judged on, and a new model and the
 *   one in use can be compared on the same test photos.
 * - Counting: per class, suggestions matched one-to-one to accepted regions of the same class at
 *   IoU >= 0.3 (learned/matching.ts); recall = hits / accepted, precision = hits / suggested.
 * - Which classes may be suggested (SUGGESTION_RULE): the model learned the class from at least
 *   30 accepted regions on at least 10 photos, the test photos hold at least 8 of its regions,
 *   and on them recall >= 0.6 and precision >= 0.4. A ghost the inspector dismisses costs a
 *   click, a missed defect costs nothing beyond marking it by hand as today, so recall is asked
 *   more of than precision; below these figures the ghosts would waste more time than they save.
 * - Switching models: the candidate replaces the model in use when its mean F1 over the classes
 *   either model may suggest (a class it may not suggest counts 0) is at least the current one's,
 *   both measured on the same test photos, except that a candidate that may suggest no class
 *   never replaces one on a tie (at 0, the model in use could not be judged on these photos
 *   either); with no model in use, any candidate is switched in.
 */
import type { Shape } from "@/lib/geometry/shape";
import { suggestRegions, type RegionModel } from "./learned";
import { addCounts, matchPhoto, rates, type LabelledRegion, type MatchCounts, type ScoredRegion } from "./learned/matching";

export { regionIou } from "./learned/matching";

export const EVALUATION_IOU = 0.3;

export const SUGGESTION_RULE = { minTrainingRegions: 30, minTrainingPhotos: 10, minTestRegions: 8, minRecall: 0.6, minPrecision: 0.4 } as const;

export type ClassFigures = MatchCounts & { recall: number; precision: number; f1: number };
export type Evaluation = { iouThreshold: number; photos: number; byClass: Record<string, ClassFigures> };
export type EvaluationPhoto = { width: number; height: number; accepted: LabelledRegion[]; suggested: ScoredRegion[] };

/** FNV-1a over the UTF-16 code units of `key`, as an unsigned 32-bit number. */
export function fnv1a(key: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < key.length; i++) {
    hash ^= key.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash >>> 0;
}

/** murmur3's 32-bit finaliser: spreads FNV-1a's bits so keys that differ in one character split evenly. */
function mix(hash: number): number {
  let h = hash >>> 0;
  h = Math.imul(h ^ (h >>> 16), 0x85ebca6b) >>> 0;
  h = Math.imul(h ^ (h >>> 13), 0xc2b2ae35) >>> 0;
  return (h ^ (h >>> 16)) >>> 0;
}

/** Train and test sets by photo key; never the same key on both sides. */
export function splitByPhoto<T>(items: readonly T[], keyOf: (item: T) => string, { testShare = 0.2 }: { testShare?: number } = {}): { train: T[]; test: T[] } {
  if (!(testShare >= 0 && testShare <= 1)) throw new RangeError("testShare must be between 0 and 1.");
  const train: T[] = [];
  const test: T[] = [];
  for (const item of items) (mix(fnv1a(keyOf(item))) / 2 ** 32 < testShare ? test : train).push(item);
  return { train, test };
}

const round = (value: number) => Math.round(value * 1000) / 1000;

/** Per-class figures over photos (each with its accepted regions and the suggestions made on it). */
export function evaluateSuggestions(photos: readonly EvaluationPhoto[], { iouThreshold = EVALUATION_IOU }: { iouThreshold?: number } = {}): Evaluation {
  const total = new Map<string, MatchCounts>();
  for (const photo of photos) addCounts(total, matchPhoto(photo, photo.accepted, photo.suggested, iouThreshold));
  // Object.fromEntries defines own keys, so a class named "__proto__" stays plain data.
  const byClass: Record<string, ClassFigures> = Object.fromEntries(
    [...total]
      .sort(([a], [b]) => a.localeCompare(b))
      .map(([defect, counts]) => {
        const { recall, precision, f1 } = rates(counts);
        return [defect, { ...counts, recall: round(recall), precision: round(precision), f1: round(f1) }];
      }),
  );
  return { iouThreshold, photos: photos.length, byClass };
}

export type TestPhoto = { image: Buffer; width: number; height: number; regions: { defect: string; shape: Shape }[]; surface?: Shape[] };

/** Runs the model on each test photo (one at a time) and evaluates its suggestions. */
export async function evaluateRegionModel(model: RegionModel, photos: readonly TestPhoto[]): Promise<Evaluation> {
  const evaluated: EvaluationPhoto[] = [];
  for (const photo of photos) {
    const suggested = await suggestRegions(model, photo.image, { surface: photo.surface, maxSuggestions: 500 });
    evaluated.push({ width: photo.width, height: photo.height, accepted: photo.regions, suggested });
  }
  return evaluateSuggestions(evaluated);
}

export type ClassDecision = { defect: string; suggest: boolean; reason: string };

/** SUGGESTION_RULE applied to each class the model knows. */
export function suggestableClasses(model: Pick<RegionModel, "classes">, evaluation: Evaluation, rule = SUGGESTION_RULE): ClassDecision[] {
  return model.classes.map(({ defect, regions, photos }) => {
    const held = Object.hasOwn(evaluation.byClass, defect) ? evaluation.byClass[defect] : { accepted: 0, suggested: 0, hits: 0, recall: 0, precision: 0, f1: 0 };
    const problems: string[] = [];
    if (regions < rule.minTrainingRegions) problems.push(`learned from ${regions} regions (needs ${rule.minTrainingRegions})`);
    if (photos < rule.minTrainingPhotos) problems.push(`seen on ${photos} photos (needs ${rule.minTrainingPhotos})`);
    if (held.accepted < rule.minTestRegions) problems.push(`${held.accepted} held-out regions to check it on (needs ${rule.minTestRegions})`);
    else {
      if (held.recall < rule.minRecall) problems.push(`held-out recall ${held.recall} (needs ${rule.minRecall})`);
      if (held.precision < rule.minPrecision) problems.push(`held-out precision ${held.precision} (needs ${rule.minPrecision})`);
    }
    return problems.length === 0
      ? { defect, suggest: true, reason: `held-out recall ${held.recall}, precision ${held.precision} on ${held.accepted} regions` }
      : { defect, suggest: false, reason: problems.join("; ") };
  });
}

export type ModelStanding = { evaluation: Evaluation; suggestable: readonly ClassDecision[] };

/** Mean F1 over `classes`, counting 0 for a class this model may not suggest. */
function meanF1(standing: ModelStanding, classes: readonly string[]): number {
  if (classes.length === 0) return 0;
  const allowed = new Set(standing.suggestable.filter((c) => c.suggest).map((c) => c.defect));
  return classes.reduce((sum, defect) => sum + (allowed.has(defect) ? (standing.evaluation.byClass[defect]?.f1 ?? 0) : 0), 0) / classes.length;
}

/** Whether `candidate` replaces `current` (both evaluated on the same test photos). */
export function compareModels(candidate: ModelStanding, current: ModelStanding | null): { switchIn: boolean; candidateScore: number; currentScore: number | null; reason: string } {
  if (!current)
    return {
      switchIn: true,
      candidateScore: round(
        meanF1(
          candidate,
          candidate.suggestable.filter((c) => c.suggest).map((c) => c.defect),
        ),
      ),
      currentScore: null,
      reason: "The first model of this workspace: nothing was in use before it, so it is switched in.",
    };
  const classes = [...new Set([...candidate.suggestable, ...current.suggestable].filter((c) => c.suggest).map((c) => c.defect))].sort();
  const candidateScore = round(meanF1(candidate, classes));
  const currentScore = round(meanF1(current, classes));
  // A tie switches the fresher model in, unless it may suggest nothing: a tie at 0 (neither can be
  // shown to work on these photos) must not turn suggestions off.
  const candidateSuggests = candidate.suggestable.some((c) => c.suggest);
  const switchIn = candidateScore > currentScore || (candidateScore === currentScore && candidateSuggests);
  const over = classes.length ? `over ${classes.join(", ")}` : "(no class may be suggested by either)";
  return {
    switchIn,
    candidateScore,
    currentScore,
    reason: `Mean held-out F1 ${over}: new ${candidateScore}, in use ${currentScore}; ${switchIn ? "the new model is switched in" : "the model in use stays"}.`,
  };
}
