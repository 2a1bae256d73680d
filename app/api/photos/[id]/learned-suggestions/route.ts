import { handler, parseJson } from "@/lib/http/route";
import { learnedSuggestionsForPhoto } from "@/lib/suggestions/learned-ghosts";
import { trainRequestSchema } from "@/lib/suggestions/schemas";
import { parseId } from "@/lib/validation";

/** Learned ghost regions for the Bench from the workspace's model in use, in original pixels; stores nothing. */
export const POST = handler({ permission: "regions.edit" }, async (req, ctx: RouteContext<"/api/photos/[id]/learned-suggestions">, user) => {
  const photoId = parseId((await ctx.params).id, "That photo");
  await parseJson(req, trainRequestSchema, { allowEmpty: true, maxBytes: 256 });
  return Response.json(await learnedSuggestionsForPhoto(user, photoId));
});
