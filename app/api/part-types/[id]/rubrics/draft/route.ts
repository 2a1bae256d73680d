import { getDraftOrThrow, saveDraft } from "@/lib/grading/rubric-versions";
import { updateDraftSchema } from "@/lib/grading/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

export const GET = handler({ permission: "rubrics.read" }, async (_req, ctx: RouteContext<"/api/part-types/[id]/rubrics/draft">, user) => {
  const partTypeId = parseId((await ctx.params).id, "That part type");
  return Response.json({ draft: await getDraftOrThrow(user, partTypeId) });
});

/**
 * Replaces the draft's rules: `{ rubric, version, revision }` naming the draft the editor loaded.
 * A rubric that does not validate is refused whole (400); a draft saved or published since is 409.
 */
export const PATCH = handler({ permission: "rubrics.edit" }, async (req, ctx: RouteContext<"/api/part-types/[id]/rubrics/draft">, user) => {
  const partTypeId = parseId((await ctx.params).id, "That part type");
  const { rubric, ...seen } = await parseJson(req, updateDraftSchema);
  return Response.json(await saveDraft(user, partTypeId, rubric, seen));
});
