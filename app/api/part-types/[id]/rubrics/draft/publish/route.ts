import { publishDraft } from "@/lib/grading/rubric-versions";
import { publishDraftSchema } from "@/lib/grading/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/**
 * Publishes the draft as the part type's grading rubric: `{ version, revision }` of the draft the
 * lead reviewed (409 when it was saved again since). Leads only; the version is frozen.
 */
export const POST = handler({ permission: "rubrics.publish" }, async (req, ctx: RouteContext<"/api/part-types/[id]/rubrics/draft/publish">, user) => {
  const partTypeId = parseId((await ctx.params).id, "That part type");
  const seen = await parseJson(req, publishDraftSchema);
  return Response.json(await publishDraft(user, partTypeId, seen));
});
