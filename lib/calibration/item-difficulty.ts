/**
 * Which items of a calibration set most people get wrong, over many attempts (the trainer's
 * view). Input: the stored item scores of each attempt (score-item.ts). Pass one attempt per
 * person (e.g. each person's latest) to read the figures as "people"; every attempt given counts.
 *
 * Decisions:
 * - An attempt "misses" an item when it leaves at least one of the key's defects unfound
 *   (missed >= 1), and "misgrades" it when its grade is not the key's. An item is got wrong when
 *   either happens; extra marks alone do not make it wrong (they show in `extraAttempts`).
 * - Order: share of attempts that got the item wrong, highest first; then the share that missed a
 *   defect; then the item id, so equal items keep a stable order.
 * - Per class: how many attempts missed at least one key defect of that class, and the mean IoU
 *   over the attempts where the class was in play (key or attempt has it; as score-attempt.ts).
 */
import type { CalibrationItemScore } from "./score-item";

export type ItemDifficulty = {
  itemId: string;
  attempts: number;
  missedAttempts: number;
  misgradedAttempts: number;
  wrongAttempts: number;
  extraAttempts: number;
  wrongShare: number;
  missedShare: number;
  misgradedShare: number;
  byClass: Record<string, { missedAttempts: number; meanIou: number }>;
};

export function itemDifficulty(attempts: readonly { attemptId: string; items: readonly CalibrationItemScore[] }[]): ItemDifficulty[] {
  type Tally = Omit<ItemDifficulty, "wrongShare" | "missedShare" | "misgradedShare" | "byClass"> & { classes: Map<string, { missedAttempts: number; iouSum: number; seen: number }> };
  const tallies = new Map<string, Tally>();
  for (const attempt of attempts) {
    const seen = new Set<string>();
    for (const item of attempt.items) {
      if (seen.has(item.itemId)) throw new RangeError(`Attempt ${attempt.attemptId} scores item ${item.itemId} twice.`);
      seen.add(item.itemId);
      const tally = tallies.get(item.itemId) ?? { itemId: item.itemId, attempts: 0, missedAttempts: 0, misgradedAttempts: 0, wrongAttempts: 0, extraAttempts: 0, classes: new Map() };
      const missed = item.missed > 0;
      const misgraded = !item.grade.exact;
      tally.attempts++;
      if (missed) tally.missedAttempts++;
      if (misgraded) tally.misgradedAttempts++;
      if (missed || misgraded) tally.wrongAttempts++;
      if (item.extra > 0) tally.extraAttempts++;
      for (const [defect, score] of Object.entries(item.classes)) {
        const entry = tally.classes.get(defect) ?? { missedAttempts: 0, iouSum: 0, seen: 0 };
        if (score.missed > 0) entry.missedAttempts++;
        entry.iouSum += score.iou;
        entry.seen++;
        tally.classes.set(defect, entry);
      }
      tallies.set(item.itemId, tally);
    }
  }
  return [...tallies.values()]
    .map(({ classes, ...tally }) => ({
      ...tally,
      wrongShare: tally.wrongAttempts / tally.attempts,
      missedShare: tally.missedAttempts / tally.attempts,
      misgradedShare: tally.misgradedAttempts / tally.attempts,
      byClass: Object.fromEntries([...classes].map(([defect, entry]) => [defect, { missedAttempts: entry.missedAttempts, meanIou: entry.iouSum / entry.seen }])),
    }))
    .sort((a, b) => b.wrongShare - a.wrongShare || b.missedShare - a.missedShare || (a.itemId < b.itemId ? -1 : a.itemId > b.itemId ? 1 : 0));
}
