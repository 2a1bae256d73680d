import { handler, parseJson } from "@/lib/http/route";
import { recordDecisions } from "@/lib/suggestions/learned-ghosts";
import { decisionsSchema } from "@/lib/suggestions/schemas";
import { parseId } from "@/lib/validation";

/** Records accepted and dismissed learned ghosts (dismissed ones teach "no defect" at the next training). */
export const POST = handler({ permission: "regions.edit" }, async (req, ctx: RouteContext<"/api/photos/[id]/suggestion-decisions">, user) => {
  const photoId = parseId((await ctx.params).id, "That photo");
  const input = await parseJson(req, decisionsSchema, { maxBytes: 256 * 1024 });
  return Response.json(await recordDecisions(user, photoId, input), { status: 201 });
});
