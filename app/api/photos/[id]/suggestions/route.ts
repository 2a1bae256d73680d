import { handler, parseJson } from "@/lib/http/route";
import { suggestionSchema } from "@/lib/regions/schemas";
import { suggestForPhoto } from "@/lib/regions/suggestions";
import { parseId } from "@/lib/validation";

/** Suggested shapes for the Bench (`{ kind: "surface" | "pixel-candidates" }`), in original pixels; stores nothing. */
export const POST = handler({ permission: "regions.edit" }, async (req, ctx: RouteContext<"/api/photos/[id]/suggestions">, user) => {
  const photoId = parseId((await ctx.params).id, "That photo");
  const { kind } = await parseJson(req, suggestionSchema);
  return Response.json(await suggestForPhoto(user, photoId, kind));
});
