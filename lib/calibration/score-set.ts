/**
 * Scoring a submitted attempt: every item of the set scored against its key (score-item.ts), then
 * summed up and judged against the set's thresholds (score-attempt.ts). Plain data in and out, so
 * it runs in a compute thread ("score-calibration", lib/compute/tasks.ts).
 *
 * Decisions:
 * - Each item is clipped to the key's Surface outlines (the whole photo when the key has none); the
 *   taker's own Surface outlines are not scored.
 * - A taker must have graded every item before submitting (lib/calibration/attempts.ts refuses
 *   otherwise), so every item has a grade here; regions may be none (a normal part).
 */
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { Grade } from "@/lib/grading/rubric-schema";
import type { CalibrationThresholds } from "./schemas";
import { summariseAttempt } from "./score-attempt";
import { scoreCalibrationItem } from "./score-item";
import type { StoredAttemptScore } from "./types";

export type ScoreSetInput = {
  thresholds: CalibrationThresholds;
  items: { position: number; width: number; height: number; key: { grade: Grade; regions: RegionSetPayload }; answer: { grade: Grade; regions: RegionSetPayload } }[];
};

const compared = (payload: RegionSetPayload) => payload.regions.map((r) => ({ id: r.id, defect: r.defect, shape: r.shape }));

export async function scoreCalibrationSet(input: ScoreSetInput): Promise<StoredAttemptScore> {
  const items = [];
  for (const item of input.items) {
    const surface = item.key.regions.surfaces.map((s) => s.shape);
    const score = await scoreCalibrationItem({
      itemId: String(item.position),
      width: item.width,
      height: item.height,
      surface: surface.length ? surface : undefined,
      key: { grade: item.key.grade, regions: compared(item.key.regions) },
      attempt: { grade: item.answer.grade, regions: compared(item.answer.regions) },
    });
    items.push({ ...score, position: item.position });
  }
  return { summary: summariseAttempt(items, input.thresholds), items };
}
