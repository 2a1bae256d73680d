/** Request bodies of the Recheck API, shared by forms and handlers. */
import { z } from "zod";
import { GRADES } from "@/lib/grading/rubric-schema";
import { saveRegionsSchema } from "@/lib/regions/schemas";
import { isUuid } from "@/lib/validation";

const uuid = (what: string) =>
  z
    .string({ error: `${what} is required.` })
    .refine(isUuid, `${what} is not a valid id.`)
    .transform((value) => value.toLowerCase());

/** A lead or an auditor sends a unit's current grade to recheck. */
export const sendToRecheckSchema = z.strictObject({
  unitId: uuid("The unit"),
  note: z.string().trim().max(500, "Keep the note under 500 characters.").optional(),
});
export type SendToRecheckInput = z.infer<typeof sendToRecheckSchema>;

const reason = z
  .string({ error: (iss) => (iss.input === undefined ? "An override needs a reason." : "must be text") })
  .trim()
  .min(1, "An override needs a reason: say why the proposed grade is wrong.")
  .max(1000, "must be at most 1000 characters");
const grade = z.enum(GRADES, { error: "must be A, B, C or Reject" });

/**
 * The auditor's grade: the proposal of their own measurement accepted, or overridden with a
 * reason. `proposedGrade` is the proposal they saw (POST …/measure): when measuring again now
 * proposes something else (their regions changed since), the submission is refused with 409.
 */
export const submitRecheckSchema = z.discriminatedUnion(
  "decision",
  [z.strictObject({ decision: z.literal("accept"), proposedGrade: grade }), z.strictObject({ decision: z.literal("override"), proposedGrade: grade, finalGrade: grade, reason })],
  { error: 'decision must be "accept" or "override"' },
);
export type SubmitRecheckInput = z.infer<typeof submitRecheckSchema>;

/** Settling a disagreement: which grade stands (or the adjudicator's own), always with a reason. */
export const adjudicateSchema = z.discriminatedUnion(
  "choice",
  [
    z.strictObject({ choice: z.literal("first"), reason: z.string({ error: "Say why this grade stands." }).trim().min(1, "Say why this grade stands.").max(1000, "must be at most 1000 characters") }),
    z.strictObject({
      choice: z.literal("recheck"),
      reason: z.string({ error: "Say why this grade stands." }).trim().min(1, "Say why this grade stands.").max(1000, "must be at most 1000 characters"),
    }),
    z.strictObject({
      choice: z.literal("own"),
      finalGrade: grade,
      reason: z.string({ error: "Say why this grade stands." }).trim().min(1, "Say why this grade stands.").max(1000, "must be at most 1000 characters"),
    }),
  ],
  { error: 'choice must be "first", "recheck" or "own"' },
);
export type AdjudicateInput = z.infer<typeof adjudicateSchema>;

const dateKey = (what: string) =>
  z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, `${what} must be a date like 2026-11-30.`)
    .refine((value) => !Number.isNaN(Date.parse(`${value}T00:00:00Z`)) && new Date(`${value}T00:00:00Z`).toISOString().startsWith(value), `${what} is not a calendar date.`);

/** The scorecards' period: local dates, both included; both optional (default: the last 12 weeks). */
export const scorecardPeriodShape = { from: dateKey("The first day").optional(), to: dateKey("The last day").optional() };

/** The period's rules across its two keys (the API's query and the screen's URL share them): in order, at most a year. */
export function withPeriodRules<T extends z.ZodType<{ from?: string; to?: string }>>(schema: T) {
  return schema
    .refine((q) => !q.from || !q.to || q.from <= q.to, { message: "The period starts after it ends.", path: ["from"] })
    .refine((q) => !q.from || !q.to || (Date.parse(q.to) - Date.parse(q.from)) / 86_400_000 <= 366, { message: "Choose a period of at most a year.", path: ["to"] });
}

export const scorecardQuerySchema = withPeriodRules(z.strictObject(scorecardPeriodShape));
export type ScorecardQuery = z.infer<typeof scorecardQuerySchema>;

/** The auditor's own set on one photo: the Bench's save envelope plus the photo it is for. */
export const saveRecheckRegionsSchema = saveRegionsSchema.extend({ photoId: uuid("The photo") });
