import { handler, parseJson } from "@/lib/http/route";
import { enqueueSuggestionTraining } from "@/lib/jobs/suggestion-training";
import { trainRequestSchema } from "@/lib/suggestions/schemas";
import { suggestionModelHistory } from "@/lib/suggestions/models";

/** The workspace's learned-suggestion models, newest first, with held-out figures and the rules. */
export const GET = handler({ permission: "suggestions.manage" }, async (_req, _ctx, user) => Response.json(await suggestionModelHistory(user.workspaceId)));

/** Train now: queues a training in the job worker (202 with its id; null when one is already waiting). */
export const POST = handler({ permission: "suggestions.manage" }, async (req, _ctx, user) => {
  await parseJson(req, trainRequestSchema, { allowEmpty: true, maxBytes: 256 });
  const { jobId } = await enqueueSuggestionTraining({ workspaceId: user.workspaceId, requestedBy: user.id });
  return Response.json(
    {
      jobId,
      message: jobId ? "Training in the background; the new model appears in the history when it is done." : "A training for this workspace is already waiting; it will use the latest regions.",
    },
    { status: 202 },
  );
});
