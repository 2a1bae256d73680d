import { z } from "zod";
import { describeShapeProblem } from "@/lib/geometry/degenerate";
import { shapeStructureSchema } from "@/lib/geometry/validate";

export const SUGGESTION_DECISIONS = ["accepted", "dismissed"] as const;

/** POST /api/suggestion-models and POST /api/photos/:id/learned-suggestions: nothing to choose yet; unknown fields are refused. */
export const trainRequestSchema = z.strictObject({});

const decisionSchema = z.strictObject({
  defect: z.string().min(1).max(64),
  shape: shapeStructureSchema.superRefine((value, ctx) => {
    const problem = describeShapeProblem(value);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  }),
  score: z.number().min(0).max(1),
  decision: z.enum(SUGGESTION_DECISIONS, { error: 'decision must be "accepted" or "dismissed"' }),
});

/** POST /api/photos/:id/suggestion-decisions: what the inspector did with learned ghosts, one row each. */
export const decisionsSchema = z.strictObject({
  modelId: z.uuid({ error: "must be the id of the model that made the suggestions" }),
  decisions: z.array(decisionSchema).min(1, "needs at least one decision").max(200, "at most 200 at once"),
});
export type DecisionsInput = z.infer<typeof decisionsSchema>;
export type SuggestionDecision = (typeof SUGGESTION_DECISIONS)[number];
