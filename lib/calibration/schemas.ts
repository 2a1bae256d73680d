/**
 * A calibration set's pass thresholds (the trainer sets them; score-attempt.ts applies them).
 * Shares and IoU are fractions 0–1; the form shows percentages and converts.
 */
import { z } from "zod";
import { GRADES } from "@/lib/grading/rubric-schema";

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

export const SET_MIN_ITEMS = 5;
export const SET_MAX_ITEMS = 50;

const uuid = (what: string) => z.uuid({ error: `must be the id of ${what} in this workspace` });

/** A new set: a name, 5–50 distinct published gallery items in the order they are taken, thresholds. */
export const createSetSchema = z.strictObject({
  name: z.string({ error: "must be text" }).trim().min(1, "Give the set a name.").max(120, "may be at most 120 characters"),
  itemIds: z
    .array(uuid("a gallery item"), { error: "must be a list of gallery item ids" })
    .min(SET_MIN_ITEMS, `A set needs at least ${SET_MIN_ITEMS} items.`)
    .max(SET_MAX_ITEMS, `A set may hold at most ${SET_MAX_ITEMS} items.`)
    .refine((ids) => new Set(ids).size === ids.length, "Each gallery item can be in a set only once."),
  thresholds: calibrationThresholdsSchema.default(DEFAULT_CALIBRATION_THRESHOLDS),
});
export type CreateSetInput = z.infer<typeof createSetSchema>;

/** A calendar date as YYYY-MM-DD that exists (2026-02-30 does not). */
const dueOn = z
  .string({ error: "Enter the due date as YYYY-MM-DD." })
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Enter the due date as YYYY-MM-DD.")
  .refine((value) => new Date(`${value}T00:00:00Z`).toISOString().startsWith(value), "That due date does not exist.");

/** Assign a set to people (inspectors, or leads) with a due date; assigning again moves the date. */
export const assignSetSchema = z.strictObject({
  userIds: z
    .array(uuid("a person"), { error: "must be a list of people's ids" })
    .min(1, "Choose at least one person.")
    .max(200, "Assign at most 200 people at a time.")
    .refine((ids) => new Set(ids).size === ids.length, "Each person once, please."),
  dueOn,
});
export type AssignSetInput = z.infer<typeof assignSetSchema>;

/** An item's place in its set, 1…50 (from JSON or a query string). */
export const positionSchema = z.coerce.number({ error: "must be an item number" }).int("must be a whole number").min(1, "must be 1 or more").max(SET_MAX_ITEMS, `must be at most ${SET_MAX_ITEMS}`);

/** One item's answer while taking a set: which item, the grade (null until chosen) and the regions (checked against the photo later). */
export const saveAnswerSchema = z.strictObject({
  position: positionSchema,
  grade: z.enum(GRADES, { error: "must be one of A, B, C, Reject" }).nullable(),
  regions: z.unknown(),
});
export type SaveAnswerInput = Omit<z.infer<typeof saveAnswerSchema>, "position">;
