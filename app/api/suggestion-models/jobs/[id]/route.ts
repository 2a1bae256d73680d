import { AppError } from "@/lib/errors";
import { handler } from "@/lib/http/route";
import { suggestionTrainingState } from "@/lib/jobs/suggestion-training";
import { parseId } from "@/lib/validation";

/** A training's state and outcome; another workspace's job answers 404 like a missing one. */
export const GET = handler({ permission: "suggestions.manage" }, async (_req, ctx: RouteContext<"/api/suggestion-models/jobs/[id]">, user) => {
  const jobId = parseId((await ctx.params).id, "That training");
  const job = await suggestionTrainingState(jobId);
  if (!job || job.data.workspaceId !== user.workspaceId) throw new AppError("not_found", "That training was not found.");
  return Response.json({ id: job.id, state: job.state, outcome: job.outcome });
});
