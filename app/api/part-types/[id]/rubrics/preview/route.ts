import { previewRubric, requirePartType } from "@/lib/grading/rubric-versions";
import { previewSchema } from "@/lib/grading/schemas";
import { handler, parseJson } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** Grades sample photo measurements with the given rubric (e.g. an unsaved draft); stores nothing. */
export const POST = handler({ permission: "rubrics.read" }, async (req, ctx: RouteContext<"/api/part-types/[id]/rubrics/preview">, user) => {
  const partTypeId = parseId((await ctx.params).id, "That part type");
  await requirePartType(user, partTypeId);
  const input = await parseJson(req, previewSchema);
  return Response.json({ result: await previewRubric(user, partTypeId, input) });
});
