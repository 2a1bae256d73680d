import { diffVersions, requirePartType } from "@/lib/grading/rubric-versions";
import { diffQuerySchema } from "@/lib/grading/schemas";
import { handler, parseQuery } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** ?from=1&to=2 (either may be "draft"): the changes between two versions, one sentence each. */
export const GET = handler({ permission: "rubrics.read" }, async (req, ctx: RouteContext<"/api/part-types/[id]/rubrics/diff">, user) => {
  const partTypeId = parseId((await ctx.params).id, "That part type");
  await requirePartType(user, partTypeId); // 404 before any query error, as for a missing part type
  const { from, to } = parseQuery(req, diffQuerySchema);
  return Response.json(await diffVersions(user, partTypeId, from, to));
});
