/**
 * A calibration set's pass thresholds (the trainer sets them; score-attempt.ts applies them).
 * Shares and IoU are fractions 0–1; the form shows percentages and converts.
 */
import { z } from "zod";

const fraction = (what: string) =>
  z
    .number({ error: `${what} must be a number from 0 to 1.` })
    .min(0, `${what} must be at least 0.`)
    .max(1, `${what} must be at most 1 (100 %).`);

export const calibrationThresholdsSchema = z
  .object({
    /** Share of items graded exactly as the key. */
    minGradeAgreement: fraction("The grade agreement threshold"),
    /** Mean IoU each key class must reach. */
    minMeanIou: fraction("The mean IoU threshold"),
  })
  .strict();
export type CalibrationThresholds = z.infer<typeof calibrationThresholdsSchema>;

/** The example: 80 % of grades exact, mean IoU 0.5 per class (our defaults, c). */
export const DEFAULT_CALIBRATION_THRESHOLDS: CalibrationThresholds = { minGradeAgreement: 0.8, minMeanIou: 0.5 };
