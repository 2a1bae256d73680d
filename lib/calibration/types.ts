/**
 * Stored shapes of a calibration attempt (db/schema/calibration.ts types its columns with these).
 * Answers are kept by item position as text ("1" … "50"), as JSON object keys are.
 */
import type { RegionSetPayload } from "@/lib/geometry/validate";
import type { Grade } from "@/lib/grading/rubric-schema";
import type { CalibrationSummary } from "./score-attempt";
import type { CalibrationItemScore } from "./score-item";

export const CALIBRATION_ATTEMPT_STATUSES = ["in_progress", "submitted"] as const;
export type CalibrationAttemptStatus = (typeof CALIBRATION_ATTEMPT_STATUSES)[number];

/** One item's answer: the taker's regions (their Surface outlines are not scored) and grade. */
export type CalibrationAnswer = { grade: Grade | null; regions: RegionSetPayload; savedAt: string };
export type CalibrationAnswers = Record<string, CalibrationAnswer>;

/** What submitting stores: the summary over the set and each item's score, in item order. */
export type StoredAttemptScore = { summary: CalibrationSummary; items: (CalibrationItemScore & { position: number })[] };
