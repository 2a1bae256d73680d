/**
 * Request shapes of the grading API, shared by forms and route handlers. The rubric itself is
 * validated by lib/grading/rubric-schema.ts (with the part type's lists) so every message a
 * trainer sees comes from one place.
 */
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { GRADES } from "./rubric-schema";
import { parseRubric, type PartTypeLists, type Rubric } from "./rubric-schema";

export const MAX_REASON_LENGTH = 1000;

/**
 * Which draft the caller saw: its version number and edit revision (both from GET …/draft). Save
 * and publish answer 409 when the draft moved since, so nobody overwrites or publishes rules
 * they have not seen.
 */
const draftSeen = {
  version: z.number({ error: "must be the draft's version number" }).int("must be a whole number").min(1, "must be 1 or more"),
  revision: z.number({ error: "must be the draft's revision (from the draft you opened)" }).int("must be a whole number").min(0, "cannot be negative"),
};
export const updateDraftSchema = z.strictObject({ rubric: z.unknown(), ...draftSeen });
export const publishDraftSchema = z.strictObject(draftSeen);
export type DraftSeen = z.infer<typeof publishDraftSchema>;

const uuid = z.uuid({ error: "must be a measurement id" });
const reason = z
  .string({ error: (iss) => (iss.input === undefined ? "An override needs a reason." : "must be text") })
  .trim()
  .min(1, "An override needs a reason: say why the proposed grade is wrong.")
  .max(MAX_REASON_LENGTH, `must be at most ${MAX_REASON_LENGTH} characters`);
const kind = z.enum(["inspection", "override"], { error: 'must be "inspection" or "override" (rechecks and adjudications are recorded on the Recheck screen)' }).optional();
/** The grade the caller saw as current (null: none yet). An override must name it; lib/grading/grade-rules.ts. */
const expectedCurrentGradeId = z.uuid({ error: "must be the id of the unit's current grade" }).nullable().optional();
/** One key per submission, chosen by the client: a repeated request answers with the row it made. */
const idempotencyKey = z.uuid({ error: "must be a UUID chosen once per submission" }).optional();
const common = { measurementId: uuid.optional(), kind, expectedCurrentGradeId, idempotencyKey };

export const recordGradeSchema = z.discriminatedUnion(
  "decision",
  [
    z.strictObject({ decision: z.literal("accept"), ...common, reason: reason.optional() }),
    z.strictObject({
      decision: z.literal("override"),
      ...common,
      finalGrade: z.enum(GRADES, { error: "must be A, B, C or Reject" }),
      reason,
    }),
  ],
  { error: 'decision must be "accept" or "override"' },
);
export type RecordGradeInput = z.infer<typeof recordGradeSchema>;

export const previewSchema = z.strictObject({
  rubric: z.unknown(),
  photos: z.array(z.unknown()).max(100, "at most 100 sample photos"),
  functionalFailures: z.strictObject({ critical: z.number().int().min(0), major: z.number().int().min(0), minor: z.number().int().min(0) }).optional(),
});

const versionParam = z.coerce.number({ error: "must be a version number" }).int("must be a whole version number").min(1, "must be 1 or more");
const versionOrDraft = z.union([z.literal("draft"), versionParam]);
/** Both optional: `to` defaults to the newest version (the draft if any), `from` to the one it was based on. */
export const diffQuerySchema = z.strictObject({ from: versionOrDraft.optional(), to: versionOrDraft.optional() });
export const gradePreviewQuerySchema = z.strictObject({ rubricVersion: versionParam.optional() });

/** Parses a rubric for a part type or throws 400 with the library's sentences (fields under "rubric."). */
export function rubricOrThrow(input: unknown, lists: PartTypeLists): Rubric {
  const parsed = parseRubric(input, lists);
  if (parsed.ok) return parsed.rubric;
  const fieldErrors = Object.fromEntries(Object.entries(parsed.fieldErrors).map(([key, message]) => [key === "rubric" ? "rubric" : `rubric.${key}`, message]));
  const shown = parsed.errors.slice(0, 5).join(" ");
  const more = parsed.errors.length > 5 ? ` (and ${parsed.errors.length - 5} more)` : "";
  throw new AppError("bad_request", `The rubric is not valid. ${shown}${more}`, { fieldErrors });
}

/** "auto" (default): measure in the request when it fits the time budget, else queue; "queue": always queue. */
export const measureSchema = z.strictObject({ mode: z.enum(["auto", "queue"], { error: 'mode must be "auto" or "queue"' }).optional() });
export const measureQuerySchema = z.strictObject({ jobId: z.uuid({ error: "jobId must be a job id" }).optional() });
/** How long a measurement may run inside the request before it is handed to the job queue. */
export const MEASURE_INLINE_BUDGET_MS = 2000;
/**
 * How long a background measurement may run. A photo at the per-photo work limit measures in
 * well under a second (`npm run bench`), so this is ample for a unit's photos; past it the job
 * ends with a sentence instead of holding a thread.
 */
export const MEASURE_JOB_BUDGET_MS = 60_000;
