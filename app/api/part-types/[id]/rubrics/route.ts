import { listVersions, openDraft } from "@/lib/grading/rubric-versions";
import { handler } from "@/lib/http/route";
import { parseId } from "@/lib/validation";

/** Every version of the part type's rubric (newest first) and the part type's lists and labels. */
export const GET = handler({ permission: "rubrics.read" }, async (_req, ctx: RouteContext<"/api/part-types/[id]/rubrics">, user) => {
  const partTypeId = parseId((await ctx.params).id, "That part type");
  return Response.json(await listVersions(user, partTypeId));
});

/** Opens the draft: 201 with a new one copied from the latest version, or 200 with the existing one. */
export const POST = handler({ permission: "rubrics.edit" }, async (_req, ctx: RouteContext<"/api/part-types/[id]/rubrics">, user) => {
  const partTypeId = parseId((await ctx.params).id, "That part type");
  const draft = await openDraft(user, partTypeId);
  return Response.json(draft, { status: draft.created ? 201 : 200 });
});
